/** Process entry of the command line (bundled to dist/cli.cjs by scripts/build-cli.mjs). */
import { closeSync, mkdirSync, openSync, readFileSync, readSync, writeFileSync } from "node:fs";
import { dirname } from "node:path";
import { main } from "./main";

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

void Promise.resolve(
  main(process.argv.slice(2), {
    readFile: (path) => readFileSync(path, "utf8"),
    readChunks,
    stdout: (text) => process.stdout.write(text),
    stderr: (text) => process.stderr.write(text),
    // RHEOLEDGER_TIMING=1: phase times on standard error (npm run bench reads them)
    timing: process.env.RHEOLEDGER_TIMING ? (phase, ms) => process.stderr.write(`timing ${phase} ${ms.toFixed(3)} ms\n`) : undefined,
    writeFile: (path, data) => {
      mkdirSync(dirname(path), { recursive: true });
      writeFileSync(path, data);
    },
  }),
).then((code) => {
  process.exitCode = code;
});
