#!/usr/bin/env node
// npm bin entry: (re)builds dist/cli.cjs from src/ when it is missing or older than the sources,
// then runs it. esbuild takes well under a second, so `rheoledger` works on a fresh clone.
//
// Start-up: compiling the 0.7 MB bundle is the largest part of a short command's own time, so the
// bundle runs through V8's code cache (node:vm cachedData). The first real command after a build
// (reduce, steps, plan, compare) writes the cache beside the bundle when it exits: every function
// that command compiled, so later runs skip parsing and compiling them. The cache file's name
// carries the bundle's size and modification time and this Node's version and architecture, so a
// rebuilt bundle or another Node never reads an old cache (V8 also refuses a cache it did not make
// for this source and these flags: the bundle is then compiled as usual and the cache rewritten).
// A folder that cannot be written (an installed copy) only means no cache. RHEOLEDGER_CODE_CACHE=0
// runs without it (npm run bench times both).
"use strict";
const fs = require("node:fs");
const path = require("node:path");

const root = path.join(__dirname, "..");
const dist = path.join(root, "dist");
const bundle = path.join(dist, "cli.cjs");

function newestSource(dir) {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(full));
    else if (entry.name.endsWith(".ts")) newest = Math.max(newest, fs.statSync(full).mtimeMs);
  }
  return newest;
}

let stat = fs.statSync(bundle, { throwIfNoEntry: false });
const sources = path.join(root, "src");
if (!stat || (fs.existsSync(sources) && stat.mtimeMs < newestSource(sources))) {
  require("esbuild").buildSync(require(path.join(root, "scripts", "cliBuildOptions.cjs"))(root));
  stat = fs.statSync(bundle);
}

const COMMANDS = new Set(["reduce", "steps", "plan", "compare"]);
if (process.env.RHEOLEDGER_CODE_CACHE === "0") require(bundle);
else runCached(bundle, stat);

/** Runs the CommonJS bundle as require() would, with V8's code cache for its compiled functions. */
function runCached(file, bundleStat) {
  const vm = require("node:vm");
  const Module = require("node:module");
  const stamp = `${bundleStat.size}-${Math.round(bundleStat.mtimeMs)}-${process.version}-${process.arch}`;
  const cacheFile = path.join(path.dirname(file), `.cli.${stamp}.v8cache`);
  let cachedData;
  try {
    cachedData = fs.readFileSync(cacheFile);
  } catch {
    cachedData = undefined; // none yet
  }
  const script = new vm.Script(Module.wrap(fs.readFileSync(file, "utf8")), { filename: file, cachedData });
  const state = cachedData === undefined ? "none" : script.cachedDataRejected ? "rejected" : "used";
  const write = state !== "used" && COMMANDS.has(process.argv[2]);
  if (process.env.RHEOLEDGER_TIMING) process.stderr.write(`code cache ${state}${write ? ", written at exit" : ""}\n`);
  if (write) process.once("exit", () => writeCache(script, cacheFile));
  const mod = new Module(file, module);
  mod.filename = file;
  mod.paths = Module._nodeModulePaths(path.dirname(file));
  require.cache[file] = mod;
  script.runInThisContext().call(mod.exports, mod.exports, Module.createRequire(file), mod, file, path.dirname(file));
  mod.loaded = true;
}

/** Writes the code cache through a temporary file and a rename; removes caches of older bundles. */
function writeCache(script, cacheFile) {
  const folder = path.dirname(cacheFile);
  const temporary = `${cacheFile}.${process.pid}.tmp`;
  try {
    fs.writeFileSync(temporary, script.createCachedData(), { flag: "wx" });
    fs.renameSync(temporary, cacheFile);
    for (const name of fs.readdirSync(folder)) {
      const other = path.join(folder, name);
      if (name.startsWith(".cli.") && name.endsWith(".v8cache") && other !== cacheFile) fs.rmSync(other, { force: true });
    }
  } catch {
    // a read-only installation: run without a cache
    try {
      fs.rmSync(temporary, { force: true });
    } catch {
      // nothing was written
    }
  }
}
