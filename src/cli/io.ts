/**
 * What the command line needs from its surroundings, so tests can run it in-process.
 */
import { RheoError } from "../core/errors";
import type { OutputOptions } from "./safeWrite";

export type { OutputOptions } from "./safeWrite";

export interface CliIO {
  readFile(path: string): string;
  stdout(text: string): void;
  stderr(text: string): void;
  /**
   * Writes a file by the rules of safeWrite.ts: never over an existing file without `force`,
   * never through a symlink or onto an input, never into a missing folder, all or nothing.
   * Needed by `reduce --out` and `--report`.
   */
  writeFile?(path: string, data: Uint8Array | string, options: OutputOptions): void;
  /** Checks an output path by the same rules before the work starts (optional: writeFile checks again). */
  checkOutput?(path: string, options: OutputOptions): void;
  /** SHA-256 (hex) and size of a file's bytes, for the method record (optional: else the text read is hashed). */
  fileDigest?(path: string): { sha256: string; bytes: number };
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
