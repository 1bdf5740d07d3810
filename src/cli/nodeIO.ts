/**
 * The command line's surroundings in a real process: files through node:fs, every output through
 * safeWrite.ts. Every path read is remembered, so no output can land on a file the command read,
 * whichever option named it.
 */
import { createHash } from "node:crypto";
import { closeSync, openSync, readFileSync, readSync } from "node:fs";
import type { CliIO, OutputOptions } from "./io";
import { checkOutput, safeWriteFile } from "./safeWrite";

export function nodeIO(streams: Pick<CliIO, "stdout" | "stderr"> = { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) }): CliIO {
  const read: string[] = [];
  const withReads = (o: OutputOptions): OutputOptions => ({ ...o, inputs: [...o.inputs, ...read] });
  return {
    readFile: (path) => {
      read.push(path);
      return readFileSync(path, "utf8");
    },
    ...streams,
    writeFile: (path, data, options) => safeWriteFile(path, data, withReads(options)),
    checkOutput: (path, options) => checkOutput(path, withReads(options)),
    fileDigest: (path) => fileDigest(path),
  };
}

/** SHA-256 and size of a file's bytes, read in 1 MiB chunks (any size). */
export function fileDigest(path: string): { sha256: string; bytes: number } {
  const hash = createHash("sha256");
  const buffer = Buffer.alloc(1 << 20);
  const fd = openSync(path, "r");
  let bytes = 0;
  try {
    for (let n = readSync(fd, buffer, 0, buffer.length, null); n > 0; n = readSync(fd, buffer, 0, buffer.length, null)) {
      hash.update(buffer.subarray(0, n));
      bytes += n;
    }
  } finally {
    closeSync(fd);
  }
  return { sha256: hash.digest("hex"), bytes };
}
