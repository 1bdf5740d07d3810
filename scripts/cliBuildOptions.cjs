// The esbuild options of the command-line bundle (dist/cli.cjs), shared by scripts/build-cli.mjs
// and bin/rheoledger.js (which rebuilds a missing or stale bundle before running it).
"use strict";
const path = require("node:path");

/** esbuild options bundling src/cli/node.ts of the checkout at `root` into dist/cli.cjs. */
module.exports = function cliBuildOptions(root) {
  return {
    entryPoints: [path.join(root, "src", "cli", "node.ts")],
    bundle: true,
    platform: "node",
    target: "node20",
    format: "cjs",
    outfile: path.join(root, "dist", "cli.cjs"),
    external: ["exceljs", "jszip"],
    // import() of the workbook library becomes require() inside a promise: bin/rheoledger.js runs
    // the bundle through node:vm, where import() has no module loader
    supported: { "dynamic-import": false },
    logLevel: "warning",
  };
};
