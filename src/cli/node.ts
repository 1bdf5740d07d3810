/** Process entry of the command line (bundled to dist/cli.cjs by scripts/build-cli.mjs). */
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { dirname } from "node:path";
import { main } from "./main";

void Promise.resolve(
  main(process.argv.slice(2), {
    readFile: (path) => readFileSync(path, "utf8"),
    stdout: (text) => process.stdout.write(text),
    stderr: (text) => process.stderr.write(text),
    writeFile: (path, data) => {
      mkdirSync(dirname(path), { recursive: true });
      writeFileSync(path, data);
    },
  }),
).then((code) => {
  process.exitCode = code;
});
