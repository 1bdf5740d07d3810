/**
 * The task pane in headless Chromium for browser tests: build dist/ when a pane source is newer,
 * serve it on 127.0.0.1 (office.js from the local @microsoft/office-js copy, every other outside
 * request refused and recorded), open the pane at a width in preview mode, and run axe-core
 * (WCAG 2.1 A/AA). The same steps as test/pane-preview.test.ts, for the panels' own suites.
 */
import { execFileSync } from "node:child_process";
import { existsSync, readFileSync, readdirSync, statSync } from "node:fs";
import { createServer, Server } from "node:http";
import { AddressInfo } from "node:net";
import { extname, join, resolve } from "node:path";
import type { Browser, Page } from "playwright-core";
import { chromium } from "playwright-core";

export const CHROMIUM = "/usr/bin/chromium";
export const ROOT = resolve(__dirname, "..", "..");
export const DIST = join(ROOT, "dist");
export const OUT = join(ROOT, "test-output");
const OFFICE_DIST = join(ROOT, "node_modules/@microsoft/office-js/dist");
const AXE = require.resolve("axe-core/axe.min.js");
/** Axe rules of WCAG 2.0/2.1 levels A and AA (axe-core's own tags). */
const WCAG_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];

export const haveChromium = existsSync(CHROMIUM);

function newestMtime(dir: string): number {
  return Math.max(...readdirSync(dir, { recursive: true, withFileTypes: true }).filter((d) => d.isFile()).map((d) => statSync(join(d.parentPath, d.name)).mtimeMs));
}

/** Rebuilds dist/ when a pane source (or the demo data it bundles) is newer than dist/taskpane.js. */
export function ensureBuild(): void {
  const js = join(DIST, "taskpane.js");
  const stale = !existsSync(js) || !existsSync(join(DIST, "taskpane.css")) || statSync(js).mtimeMs < Math.max(newestMtime(join(ROOT, "src/taskpane")), newestMtime(join(ROOT, "workbooks")));
  if (!stale) return;
  try {
    execFileSync(process.execPath, [join(ROOT, "node_modules/webpack-cli/bin/cli.js"), "--mode", "production"], { cwd: ROOT, stdio: "pipe" });
  } catch (error) {
    // webpack exits 1 on a size budget of the functions bundle but still emits the pane
    const stdout = String((error as { stdout?: Buffer }).stdout ?? "");
    if (!existsSync(js) || /ERROR in (?!asset size limit|entrypoint size limit|webpack performance)/.test(stdout)) throw error;
  }
}

const TYPES: Record<string, string> = { ".html": "text/html", ".js": "text/javascript", ".css": "text/css", ".png": "image/png", ".json": "application/json", ".map": "application/json" };

/** A browser and a server of dist/ for one suite. */
export interface PaneRig {
  browser: Browser;
  server: Server;
  origin: string;
  /** outside requests the pages made (refused) */
  outside: string[];
  close(): Promise<void>;
}

/** A local server of dist/ (and of the accessibility checker at /__axe.js, same origin so the page's CSP allows it). */
export async function serveDist(): Promise<Server> {
  const server = createServer((req, res) => {
    if (req.url === "/__axe.js") {
      res.writeHead(200, { "content-type": "text/javascript" }).end(readFileSync(AXE));
      return;
    }
    const path = join(DIST, decodeURIComponent((req.url ?? "/").split("?")[0] as string));
    if (!path.startsWith(DIST) || !existsSync(path) || statSync(path).isDirectory()) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { "content-type": TYPES[extname(path)] ?? "application/octet-stream" }).end(readFileSync(path));
  });
  await new Promise<void>((ok) => server.listen(0, "127.0.0.1", () => ok()));
  return server;
}

/** Starts the server and the browser. */
export async function startRig(): Promise<PaneRig> {
  const server = await serveDist();
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
  });
  return {
    browser,
    server,
    origin,
    outside: [],
    async close() {
      await browser.close();
      await new Promise((ok) => server.close(ok));
    },
  };
}

/** A page of the pane at `width` px in preview mode (office.js answered locally). */
export async function openPane(rig: PaneRig, width: number): Promise<{ page: Page; errors: string[] }> {
  const page = await rig.browser.newPage({ viewport: { width, height: 900 } });
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(String(e)));
  await page.route("**/*", (route) => {
    const url = route.request().url();
    if (url.startsWith(rig.origin)) return route.continue();
    const script = /^https:\/\/appsforoffice\.microsoft\.com\/lib\/1\/hosted\/([\w.-]+\.js)$/.exec(url);
    if (script && existsSync(join(OFFICE_DIST, script[1] as string))) {
      return route.fulfill({ status: 200, contentType: "text/javascript", body: readFileSync(join(OFFICE_DIST, script[1] as string)) });
    }
    rig.outside.push(url);
    return route.abort();
  });
  await page.goto(`${rig.origin}/taskpane.html`, { waitUntil: "commit" });
  await page.waitForSelector("body[data-mode=preview]", { timeout: 15_000 });
  return { page, errors };
}

/**
 * Loads the accessibility checker into the page from the local server (same origin, allowed by
 * the page's CSP), waiting for its script to load. Not page.addScriptTag: that fails on any CSP
 * report the page raises while the script loads, whatever caused it.
 */
export async function loadAxe(page: Page, origin: string): Promise<void> {
  if (await page.evaluate(() => "axe" in window)) return;
  await page.evaluate(
    (src) =>
      new Promise<void>((resolve, reject) => {
        const script = document.createElement("script");
        script.src = src;
        script.onload = () => resolve();
        script.onerror = () => reject(new Error(`the accessibility checker did not load from ${src}`));
        document.head.appendChild(script);
      }),
    `${origin}/__axe.js`,
  );
}

/** Runs axe-core on the page (WCAG 2.1 A and AA) and returns the violations, one line each. */
export async function axeViolations(rig: PaneRig, page: Page, state: string): Promise<string[]> {
  await loadAxe(page, rig.origin);
  const found = await page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const r = await axe.run(document, { runOnly: { type: "tag", values: tags } });
    return r.violations.map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(" ")).slice(0, 5).join(", ")}`);
  }, WCAG_TAGS);
  return found.map((f) => `${state}: ${f}`);
}
