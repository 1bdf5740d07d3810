// Bundles the command line (src/cli/node.ts and everything it imports) into dist/cli.cjs.
import { build } from "esbuild";
import path from "node:path";
import { fileURLToPath } from "node:url";
import cliBuildOptions from "./cliBuildOptions.cjs";

export async function buildCli() {
  await build(cliBuildOptions(path.join(path.dirname(fileURLToPath(import.meta.url)), "..")));
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await buildCli();
}
