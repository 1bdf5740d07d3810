#!/usr/bin/env node
/**
 * Sideloads the add-in into desktop Excel on Windows or macOS and starts the dev server:
 *
 *   npm run sideload          start (dev server on https://localhost:3000 + Excel with manifest.xml)
 *   npm run sideload -- stop  unregister the add-in and stop the dev server
 *
 * office-addin-debugging is run through npx and is deliberately not a dependency: its keytar
 * peer cannot be installed offline and breaks `npm ci`. Set RHEO_DEBUGGING_VERSION to choose
 * its version. On Linux (no desktop Excel) the script prints the manual steps for Excel on the web.
 */
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import process from "node:process";
import console from "node:console";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const manifest = join(root, "manifest.xml");
const version = process.env.RHEO_DEBUGGING_VERSION || "6";
const action = process.argv[2] === "stop" ? "stop" : "start";

export const WEB_STEPS = `Excel on the web (any OS, including Linux):
  1. npm run dev-server            (serves https://localhost:3000; trust the certificate once:
                                    open https://localhost:3000/taskpane.html in the browser)
  2. Open a workbook in Excel on the web.
  3. Home › Add-ins › More Add-ins › My Add-ins › Upload My Add-in › choose manifest.xml.
  4. The "Flow curves" group appears on the Home tab; type =RHEO. in a cell for the functions.`;

function run(args) {
  const npx = process.platform === "win32" ? "npx.cmd" : "npx";
  const result = spawnSync(npx, ["--yes", `office-addin-debugging@${version}`, ...args], {
    cwd: root,
    stdio: "inherit",
    shell: process.platform === "win32",
  });
  return result.status ?? 1;
}

function main() {
  if (!existsSync(manifest)) {
    console.error(`manifest.xml not found at ${manifest}`);
    return 1;
  }
  if (process.platform !== "win32" && process.platform !== "darwin") {
    console.error(`Desktop Excel sideloading needs Windows or macOS (this is ${process.platform}).\n\n${WEB_STEPS}`);
    return 2;
  }
  if (action === "stop") return run(["stop", manifest]);
  return run([
    "start",
    manifest,
    "desktop",
    "--app",
    "excel",
    "--dev-server",
    "npm run dev-server",
    "--dev-server-port",
    "3000",
  ]);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) process.exit(main());
