/**
 * What the command line needs from its surroundings, so tests can run it in-process.
 */
import { RheoError } from "../core/errors";

export interface CliIO {
  readFile(path: string): string;
  stdout(text: string): void;
  stderr(text: string): void;
  /** writes a binary file (creating its folder); needed by `reduce --out` */
  writeFile?(path: string, data: Uint8Array): void;
}

/**
 * Reads an input file through `io`.
 * @throws RheoError("value") naming the file: `data.csv: cannot be read: ENOENT: …`
 */
export function readInputFile(io: CliIO, file: string): string {
  try {
    return io.readFile(file);
  } catch (e) {
    throw new RheoError("value", file, `cannot be read: ${(e as Error).message}`);
  }
}
