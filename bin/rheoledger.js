#!/usr/bin/env node
// npm bin entry: (re)builds dist/cli.cjs from src/ when it is missing or older than the sources,
// then runs it. esbuild takes well under a second, so `npx rheoledger` works on a fresh clone.
"use strict";
const fs = require("node:fs");
const path = require("node:path");

const root = path.join(__dirname, "..");
const bundle = path.join(root, "dist", "cli.cjs");

function newestSource(dir) {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(full));
    else if (entry.name.endsWith(".ts")) newest = Math.max(newest, fs.statSync(full).mtimeMs);
  }
  return newest;
}

const stale = !fs.existsSync(bundle) || fs.statSync(bundle).mtimeMs < newestSource(path.join(root, "src"));
if (stale) {
  require("esbuild").buildSync({
    entryPoints: [path.join(root, "src", "cli", "node.ts")],
    bundle: true,
    platform: "node",
    target: "node20",
    format: "cjs",
    outfile: bundle,
    external: ["exceljs", "jszip"],
    logLevel: "warning",
  });
}
require(bundle);
