/**
 * What the command line needs from its surroundings, so tests can run it in-process.
 */
import { RheoError } from "../core/errors";
import { type ByteSource, bytesSource } from "../io/rawInput";
import { decodeBytes } from "../io/textDecode";
import type { Warning } from "../core/errors";
import type { OutputOptions } from "./safeWrite";

export type { OutputOptions } from "./safeWrite";

export interface CliIO {
  readFile(path: string): string;
  /**
   * reads a file's bytes in chunks, from the start on every call (input tables are streamed
   * through this, so a large file is never held whole); without it, `readFile`'s text is used
   */
  readChunks?(path: string): Iterable<Uint8Array>;
  stdout(text: string): void;
  stderr(text: string): void;
  /** receives the wall time of a phase (ms): "read", "reduce" (the core), "run" (the command); optional */
  timing?(phase: string, ms: number): void;
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
    throw cannotRead(file, e);
  }
}

function cannotRead(file: string, e: unknown): RheoError {
  const code = (e as { code?: unknown }).code;
  const why = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a folder" : code === "EACCES" ? "permission denied" : (e as Error).message;
  return new RheoError("value", file, `cannot be read: ${why}`, undefined, "FILE_UNREADABLE");
}

/**
 * The bytes of an input file as a {@link ByteSource} (streamed when `io` can, else `readFile`'s
 * text as UTF-8). Read errors name the file.
 */
export function inputSource(io: CliIO, file: string): ByteSource {
  const readChunks = io.readChunks;
  if (!readChunks) return bytesSource(new TextEncoder().encode(readInputFile(io, file)));
  return {
    *chunks() {
      let iterator: Iterator<Uint8Array>;
      try {
        iterator = readChunks.call(io, file)[Symbol.iterator]();
      } catch (e) {
        throw cannotRead(file, e);
      }
      for (;;) {
        let step: IteratorResult<Uint8Array>;
        try {
          step = iterator.next();
        } catch (e) {
          throw cannotRead(file, e);
        }
        if (step.done) return;
        yield step.value;
      }
    },
  };
}

/**
 * A small text input file (a reference curve, a lot) decoded like a data table: byte-order mark,
 * UTF-8, else Windows-1252 (named in the warnings); a non-text file is refused with what it is.
 */
export function readInputText(io: CliIO, file: string): { text: string; warnings: Warning[] } {
  if (!io.readChunks) return { text: readInputFile(io, file), warnings: [] };
  const parts: Uint8Array[] = [];
  for (const c of inputSource(io, file).chunks()) parts.push(c.slice());
  const bytes = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    bytes.set(p, at);
    at += p.length;
  }
  const { text, warnings } = decodeBytes(bytes, file);
  return { text, warnings };
}
