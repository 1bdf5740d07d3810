// Runs a TypeScript script: bundles it with esbuild into .cache/ and imports it.
// Usage: node scripts/run-ts.mjs scripts/some-script.ts [args...]
import { build } from "esbuild";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";

const [entry, ...rest] = process.argv.slice(2);
if (!entry) {
  console.error("usage: node scripts/run-ts.mjs FILE.ts [args...]");
  process.exit(2);
}
mkdirSync(".cache", { recursive: true });
const outfile = path.resolve(".cache", path.basename(entry).replace(/\.ts$/, "") + ".cjs");
await build({ entryPoints: [entry], bundle: true, platform: "node", target: "node20", format: "cjs", outfile, external: ["exceljs", "hyperformula"], logLevel: "warning" });
process.argv = [process.argv[0], outfile, ...rest];
await import(pathToFileURL(outfile).href);
