/** Process entry of the command line (bundled to dist/cli.cjs by scripts/build-cli.mjs). */
import { main } from "./main";
import { nodeIO } from "./nodeIO";

void Promise.resolve(main(process.argv.slice(2), nodeIO())).then((code) => {
  process.exitCode = code;
});
