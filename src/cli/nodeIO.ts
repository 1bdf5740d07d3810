/**
 * The command line's surroundings in a real process: files through node:fs, every output through
 * safeWrite.ts. Every path read is remembered, so no output can land on a file the command read,
 * whichever option named it.
 */
import { closeSync, openSync, readFileSync, readSync } from "node:fs";
import type { CliIO, OutputOptions } from "./io";
import { checkOutput, safeWriteFile } from "./safeWrite";
import { sha256 } from "./sha256";

/** Size of the chunks an input file is streamed in. */
const CHUNK_BYTES = 1 << 20;

function* readChunks(path: string): Generator<Uint8Array> {
  const fd = openSync(path, "r");
  try {
    for (;;) {
      const buffer = new Uint8Array(CHUNK_BYTES);
      const n = readSync(fd, buffer, 0, CHUNK_BYTES, null);
      if (n === 0) return;
      yield n === CHUNK_BYTES ? buffer : buffer.subarray(0, n);
    }
  } finally {
    closeSync(fd);
  }
}

export function nodeIO(streams: Pick<CliIO, "stdout" | "stderr"> = { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) }): CliIO {
  const read: string[] = [];
  const withReads = (o: OutputOptions): OutputOptions => ({ ...o, inputs: [...o.inputs, ...read] });
  return {
    readFile: (path) => {
      read.push(path);
      return readFileSync(path, "utf8");
    },
    readChunks: (path) => {
      read.push(path);
      return readChunks(path);
    },
    ...streams,
    // RHEOLEDGER_TIMING=1: phase times on standard error (npm run bench reads them)
    timing: process.env.RHEOLEDGER_TIMING ? (phase, ms) => process.stderr.write(`timing ${phase} ${ms.toFixed(3)} ms\n`) : undefined,
    writeFile: (path, data, options) => safeWriteFile(path, data, withReads(options)),
    checkOutput: (path, options) => checkOutput(path, withReads(options)),
    fileDigest: (path) => fileDigest(path),
  };
}

/** SHA-256 and size of a file's bytes, read in 1 MiB chunks (any size). */
export function fileDigest(path: string): { sha256: string; bytes: number } {
  const hash = sha256();
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
