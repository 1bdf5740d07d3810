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
    logLevel: "warning",
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await buildCli();
}
