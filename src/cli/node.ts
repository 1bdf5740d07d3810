/** Process entry of the command line (bundled to dist/cli.cjs by scripts/build-cli.mjs). */
import { readFileSync } from "node:fs";
import { main } from "./main";

process.exitCode = main(process.argv.slice(2), {
  readFile: (path) => readFileSync(path, "utf8"),
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
});
