/** Process entry of the command line (bundled to dist/cli.cjs by scripts/build-cli.mjs). */
import { main } from "./main";
import { nodeIO } from "./nodeIO";

void Promise.resolve(main(process.argv.slice(2), nodeIO())).then((code) => {
  process.exitCode = code;
  // Leave once standard output and error are flushed: ending by itself, Node first frees the whole
  // heap piece by piece (some 30 ms after a 40,000-row file). Should a stream never report its
  // flush, the process still ends by itself with the same code.
  afterFlush(process.stdout, () => afterFlush(process.stderr, () => process.exit(code)));
});

/** Calls `then` when everything written to `stream` so far has been handed to the system. */
function afterFlush(stream: NodeJS.WriteStream, then: () => void): void {
  stream.write("", () => then());
}
