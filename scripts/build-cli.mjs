// Bundles the command line (src/cli/node.ts and everything it imports) into dist/cli.cjs.
import { build } from "esbuild";

export async function buildCli() {
  await build({
    entryPoints: ["src/cli/node.ts"],
    bundle: true,
    platform: "node",
    target: "node20",
    format: "cjs",
    outfile: "dist/cli.cjs",
    external: ["exceljs", "jszip"],
    // import() of the workbook library becomes require() inside a promise (bin/rheoledger.js runs
    // the bundle through node:vm, where import() has no module loader); keep in step with the bin
    supported: { "dynamic-import": false },
    logLevel: "warning",
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await buildCli();
}
