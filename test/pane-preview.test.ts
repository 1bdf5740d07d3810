/**
 * The task pane in a plain browser (preview mode on the bundled demo data), driven by
 * playwright-core with Debian's chromium: the rendered tables are compared with the core's own
 * reduction of the same file, the charts carry the right series, the layout holds at 320 px,
 * and the whole flow works from the keyboard. Screenshots go to test-output/ (untracked).
 *
 * The pane is served from dist/ by a tiny HTTP server on 127.0.0.1; office.js is answered from
 * the local @microsoft/office-js copy and every other outside request is refused and recorded.
 * dist/ is rebuilt first when a pane source is newer than dist/taskpane.js.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, readdirSync, statSync } from "node:fs";
import { createServer, Server } from "node:http";
import { AddressInfo } from "node:net";
import { join, extname, resolve } from "node:path";
import type { Browser, Page } from "playwright-core";
import { chromium } from "playwright-core";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import { reduce } from "../src/core/reduce";
import { compareModels } from "../src/core/fit";
import { DEFAULT_PANE_SETTINGS, readPaneSettings } from "../src/taskpane/settings";
import { planTest } from "../src/core/planner";
import { compareLot } from "../src/core/lotComparison";
import { readPlanOptions } from "../src/io/planOptions";
import { readFlowCurveTable } from "../src/io/flowCurveTable";
import { expectClose } from "./helpers/expectClose";

const CHROMIUM = "/usr/bin/chromium";
const ROOT = resolve(__dirname, "..");
const DIST = join(ROOT, "dist");
const OUT = join(ROOT, "test-output");
const OFFICE_DIST = join(ROOT, "node_modules/@microsoft/office-js/dist");
const haveChromium = existsSync(CHROMIUM);
// In CI (.ci/run installs chromium) a missing browser is a failure, never a silent skip.
if (!haveChromium && process.env.CI) throw new Error(`${CHROMIUM} is missing in CI: .ci/run must install chromium`);
if (!haveChromium) console.warn(`pane-preview tests skipped: ${CHROMIUM} is missing (apt-get install -y chromium; .ci/run installs it)`);
const maybe = haveChromium ? describe : describe.skip;

function newestMtime(dir: string): number {
  return Math.max(...readdirSync(dir).map((f) => statSync(join(dir, f)).mtimeMs));
}

function ensureBuild(): void {
  const js = join(DIST, "taskpane.js");
  const stale = !existsSync(js) || !existsSync(join(DIST, "taskpane.css")) || statSync(js).mtimeMs < newestMtime(join(ROOT, "src/taskpane"));
  if (!stale) return;
  try {
    execFileSync(process.execPath, [join(ROOT, "node_modules/webpack-cli/bin/cli.js"), "--mode", "production"], { cwd: ROOT, stdio: "pipe" });
  } catch (error) {
    // webpack exits 1 on a size budget of the functions bundle but still emits the pane
    const stderr = String((error as { stdout?: Buffer }).stdout ?? "");
    if (!existsSync(js) || /ERROR in (?!asset size limit|entrypoint size limit|webpack performance)/.test(stderr)) throw error;
  }
}

const TYPES: Record<string, string> = { ".html": "text/html", ".js": "text/javascript", ".css": "text/css", ".png": "image/png", ".json": "application/json", ".map": "application/json" };

function serve(dir: string): Promise<Server> {
  const server = createServer((req, res) => {
    const path = join(dir, decodeURIComponent((req.url ?? "/").split("?")[0] as string));
    if (!path.startsWith(dir) || !existsSync(path) || statSync(path).isDirectory()) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { "content-type": TYPES[extname(path)] ?? "application/octet-stream" }).end(readFileSync(path));
  });
  return new Promise((ok) => server.listen(0, "127.0.0.1", () => ok(server)));
}

/** The demo file reduced by the core with the pane's defaults: what the preview must show. */
function coreReference() {
  const text = readFileSync(join(ROOT, "workbooks/demo-film-grade.csv"), "utf8");
  const raw = readRawTable(parseCsv(text).lines.map((l) => l.cells));
  const result = reduce(raw.measurements, readPaneSettings(DEFAULT_PANE_SETTINGS).request.options);
  return { raw, result };
}

/** Reads a preview number (as displayed, 4 significant digits). */
const shown = (t: string) => Number(t.trim());

maybe("task pane preview mode (chromium)", () => {
  let server: Server;
  let browser: Browser;
  let origin: string;
  const outside: string[] = [];

  beforeAll(async () => {
    ensureBuild();
    mkdirSync(OUT, { recursive: true });
    server = await serve(DIST);
    origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
      // playwright gives every launch a fresh temporary profile (it refuses --user-data-dir here)
    });
  }, 240_000);

  afterAll(async () => {
    await browser?.close();
    if (server) await new Promise((ok) => server.close(ok));
  });

  async function openPane(width: number): Promise<{ page: Page; errors: string[] }> {
    const page = await browser.newPage({ viewport: { width, height: 900 } });
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(String(e)));
    await page.route("**/*", (route) => {
      const url = route.request().url();
      if (url.startsWith(origin)) return route.continue();
      const office = /^https:\/\/appsforoffice\.microsoft\.com\/lib\/1\/hosted\/([\w.-]+\.js)$/.exec(url);
      if (office && existsSync(join(OFFICE_DIST, office[1] as string))) {
        return route.fulfill({ status: 200, contentType: "text/javascript", body: readFileSync(join(OFFICE_DIST, office[1] as string)) });
      }
      outside.push(url);
      return route.abort();
    });
    await page.goto(`${origin}/taskpane.html`);
    await page.waitForSelector("body[data-mode=preview]", { timeout: 15_000 });
    return { page, errors };
  }

  test("preview mode renders the core's Bagley table, flow curve and fits for the demo data (500 px)", async () => {
    const { page, errors } = await openPane(500);
    expect(await page.locator("#mode-banner").count()).toBe(1);
    expect(await page.locator("#mode-banner").isVisible()).toBe(true);
    await page.click("#run");
    await page.waitForSelector('table[data-block="flow-1"]');
    const { result } = coreReference();
    expect(await page.locator('h4.group-heading').count()).toBe(result.groups.length);
    for (const [i, g] of result.groups.entries()) {
      const flowRows = await page.locator(`table[data-block="flow-${i + 1}"] tbody tr`).evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td"), (td) => td.textContent ?? "")));
      expect(flowRows).toHaveLength(g.flowCurve.length);
      g.flowCurve.forEach((f, r) => {
        const row = flowRows[r] as string[];
        const tol = { rel: 6e-4 }; // 4 significant digits shown
        expectClose(shown(row[0] as string), f.shearRateApparent, tol, `group ${i + 1} row ${r + 1} rate`);
        expectClose(shown(row[1] as string), f.wallShearStress / 1e3, tol, `group ${i + 1} row ${r + 1} stress kPa`);
        expectClose(shown(row[3] as string), f.nPrime, tol, `n'`);
        expectClose(shown(row[4] as string), f.shearRateWall as number, tol, `wall rate`);
        expectClose(shown(row[5] as string), f.viscosity as number, tol, `viscosity`);
      });
      const bagleyRows = await page.locator(`table[data-block="bagley-${i + 1}"] tbody tr`).evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td"), (td) => td.textContent ?? "")));
      expect(bagleyRows).toHaveLength(g.bagley.length);
      g.bagley.forEach((b, r) => {
        const row = bagleyRows[r] as string[];
        expectClose(shown(row[3] as string), b.entrancePressure / 1e5, { rel: 6e-4 }, "entrance pressure bar");
        expectClose(shown(row[4] as string), b.endCorrection, { rel: 6e-4 }, "end correction");
      });
      // the best model by AIC is the core's best for the same points
      const pts = g.flowCurve.filter((f) => f.viscosity !== null);
      const best = compareModels(DEFAULT_PANE_SETTINGS.models, { shearRate: pts.map((f) => f.shearRateWall as number), viscosity: pts.map((f) => f.viscosity as number) }).ranked[0];
      const firstModel = await page.locator(`table[data-block="ranking-${i + 1}"] tbody tr:first-child td:first-child`).textContent();
      expect(firstModel).toBe(best?.model);
    }
    // charts: one flow-curve series per group with one marker per point; one Bagley chart per group
    const flowSeries = page.locator('svg[data-chart="flowcurve"] g.series');
    expect(await flowSeries.count()).toBe(result.groups.length);
    expect(await flowSeries.nth(0).locator("circle").count()).toBe(result.groups[0]?.flowCurve.length);
    expect(await page.locator('svg[data-chart^="bagley-"]').count()).toBe(result.groups.length);
    const bagleyLines = page.locator('svg[data-chart="bagley-1"] g.series.line polyline');
    expect(await bagleyLines.count()).toBe(result.groups[0]?.bagley.length);
    // the method record lists the settings
    const settings = await page.locator('table[data-block="method-settings"]').textContent();
    expect(settings).toContain("Rabinowitsch slope method");
    expect(settings).toContain(DEFAULT_PANE_SETTINGS.rabinowitschMethod);
    await page.screenshot({ path: join(OUT, "pane-preview-500.png"), fullPage: true });
    await page.locator(".charts").screenshot({ path: join(OUT, "pane-preview-500-charts.png") });
    expect(errors.filter((e) => !/CustomFunctions/.test(e))).toEqual([]);
    expect(outside).toEqual([]);
    await page.close();
  });

  test("at 320 px nothing overflows sideways and the results still render", async () => {
    const { page } = await openPane(320);
    await page.screenshot({ path: join(OUT, "pane-preview-320-top.png") });
    await page.click("#run");
    await page.waitForSelector('table[data-block="flow-1"]');
    await page.locator("figure.chart-figure").nth(1).screenshot({ path: join(OUT, "pane-preview-320-chart.png") });
    await page.locator('table[data-block="flow-1"]').screenshot({ path: join(OUT, "pane-preview-320-table.png") });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.screenshot({ path: join(OUT, "pane-preview-320.png"), fullPage: true });
    await page.close();
  });

  test("keyboard only: every stop is labelled and visibly focused, Enter runs, the caution opens", async () => {
    const { page } = await openPane(320);
    const stops: { id: string; name: string; outline: string }[] = [];
    for (let i = 0; i < 120; i++) {
      await page.keyboard.press("Tab");
      const info = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null;
        if (!el || el === document.body) return null;
        const labelled = (el as HTMLInputElement).labels?.length ? Array.from((el as HTMLInputElement).labels ?? [], (l) => l.textContent ?? "").join(" ") : (el.getAttribute("aria-label") ?? el.textContent ?? "");
        const style = getComputedStyle(el);
        return { id: el.id || el.tagName, name: labelled.trim(), outline: `${style.outlineStyle} ${style.outlineWidth}` };
      });
      if (!info) continue;
      stops.push(info);
      if (info.id === "run") break;
    }
    expect(stops.map((s) => s.id)).toContain("run");
    expect(stops.map((s) => s.id)).toContain("rabinowitschMethod");
    expect(stops.map((s) => s.id)).toEqual(expect.arrayContaining(["check-heating", "temperatureShift", "chartAllModels"]));
    await page.keyboard.press("Enter");
    await page.waitForSelector('table[data-block="flow-1"]');
    expect(await page.locator("#status").textContent()).toMatch(/Preview ready/);
    // on past the results to the Planner and the Lot check, and run both from the keyboard
    for (const target of ["planRun", "lotRun"]) {
      for (let i = 0; i < 400; i++) {
        await page.keyboard.press("Tab");
        const info = await page.evaluate(() => {
          const el = document.activeElement as HTMLElement | null;
          if (!el || el === document.body) return null;
          const labelled = (el as HTMLInputElement).labels?.length ? Array.from((el as HTMLInputElement).labels ?? [], (l) => l.textContent ?? "").join(" ") : (el.getAttribute("aria-label") ?? el.textContent ?? "");
          const style = getComputedStyle(el);
          return { id: el.id || el.tagName, name: labelled.trim(), outline: `${style.outlineStyle} ${style.outlineWidth}` };
        });
        if (!info) continue;
        stops.push(info);
        if (info.id === target) break;
      }
      expect(stops[stops.length - 1]?.id).toBe(target);
      await page.keyboard.press("Enter");
      await page.waitForSelector(target === "planRun" ? 'table[data-block="plan-steps"]' : 'table[data-block="lot-points"]');
    }
    expect(stops.map((s) => s.id)).toEqual(expect.arrayContaining(["planBarrel", "planDies", "planPrior", "lotSource", "refKind", "lotTolerance"]));
    for (const s of stops) {
      expect(s.name.length).toBeGreaterThan(0);
      expect(s.outline).not.toMatch(/^none/);
    }
    // the safety caution is reachable: the header link opens it
    await page.focus("#safety-link");
    await page.keyboard.press("Enter");
    expect(await page.locator("#safety").getAttribute("open")).not.toBeNull();
    await page.close();
  });

  test("the Planner and Lot check panels render the core's plan and comparison of the demo inputs (500 and 320 px)", async () => {
    const plan = JSON.parse(readFileSync(join(ROOT, "workbooks/demo-plan.json"), "utf8")) as unknown;
    // at 320 px the plan uses one small transducer, so that steps are flagged over its full scale
    const corePlan = (small: boolean) => {
      const parsed = readPlanOptions(small ? { ...(plan as object), transducers: [{ name: "P50", fullScale: "50 bar", accuracy: "0.25 %" }] } : plan);
      return planTest(parsed.input, parsed.options);
    };
    const curve = (f: string) => readFlowCurveTable(parseCsv(readFileSync(join(ROOT, "workbooks", f), "utf8")).lines.map((l) => l.cells), { argument: f, rowWord: "line" }).table;
    const lot = compareLot({ kind: "table", ...curve("demo-lot-reference.csv") }, curve("demo-lot-new.csv"));
    for (const width of [500, 320]) {
      const { page, errors } = await openPane(width);
      const core = corePlan(width === 320);
      if (width === 320) await page.fill("#planTransducers", "P50, 50, 0.25");
      await page.click("#planRun");
      await page.waitForSelector('table[data-block="plan-steps"]');
      const rows = await page.locator('table[data-block="plan-steps"] tbody tr').evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td"), (td) => ({ text: td.textContent ?? "", flag: td.className.includes("flag") }))));
      const steps = core.dies.flatMap((d) => d.steps.map((st) => ({ die: d.die.name, st })));
      expect(rows).toHaveLength(steps.length);
      steps.forEach(({ die, st }, r) => {
        const row = rows[r] ?? [];
        expect(row[0]?.text).toBe(die);
        expectClose(shown(row[8]?.text ?? ""), st.pressure / 1e5, { rel: 6e-4 }, `plan step ${r + 1} pressure bar`);
        expectClose(shown(row[6]?.text ?? ""), st.pistonSpeed * 6e4, { rel: 6e-4 }, `plan step ${r + 1} piston speed mm/min`);
        expect(row[11]?.flag).toBe(st.flag !== "ok"); // the range column is coloured exactly where the core flags
      });
      if (width === 320) expect(rows.some((r) => r[11]?.flag)).toBe(true);
      await page.locator("#planner-section").screenshot({ path: join(OUT, `pane-planner-${width}.png`) });
      await page.click("#lotRun");
      await page.waitForSelector('table[data-block="lot-points"]');
      const lotRows = await page.locator('table[data-block="lot-points"] tbody tr').evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td"), (td) => ({ text: td.textContent ?? "", cls: td.className }))));
      expect(lotRows).toHaveLength(lot.points.length);
      lot.points.forEach((p, r) => {
        const row = lotRows[r] ?? [];
        if (p.deviation !== null) expectClose(shown(row[5]?.text ?? ""), p.deviation * 100, { rel: 6e-4, abs: 1e-3 }, `lot deviation % at ${p.shearRate}`);
        expect(row[6]?.cls).toContain(p.status === "pass" ? "flag-pass" : p.status === "fail" ? "flag-fail" : "flag-caution");
      });
      expect(await page.locator("#lot-status").textContent()).toMatch(lot.verdict === "pass" ? /^PASS/ : lot.verdict === "fail" ? /^FAIL/ : /^NOT JUDGED/);
      expect(await page.locator('svg[data-chart="lot"] g.series').count()).toBe(4);
      expect(await page.locator('svg[data-chart="lot"] g.series.markers circle').count()).toBe(7);
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await page.locator("#lot-section").screenshot({ path: join(OUT, `pane-lot-${width}.png`) });
      expect(errors.filter((e) => !/CustomFunctions/.test(e))).toEqual([]);
      await page.close();
    }
  });

  test("optional checks and the temperature shift render in the preview (500 px)", async () => {
    const { page } = await openPane(500);
    await page.fill("#transducerRangeBar", "1000");
    await page.check("#check-representativeRate");
    await page.check("#check-extensional");
    await page.selectOption("#temperatureShift", "arrhenius");
    await page.click("#run");
    await page.waitForSelector('table[data-block="shift-factors"]');
    expect(await page.locator('table[data-block="flow-1"] thead th').allTextContents()).toEqual(expect.arrayContaining(["± wall shear stress [kPa]", "Schümmer viscosity [Pa.s]"]));
    expect(await page.locator('table[data-block="extensional-1"]').count()).toBe(1);
    expect(await page.locator('svg[data-chart="master"] g.series').count()).toBe(3);
    expect(await page.locator('table[data-block="method-settings"]').textContent()).toContain("Arrhenius");
    await page.locator('table[data-block="flow-1"]').screenshot({ path: join(OUT, "pane-checks-500-flow.png") });
    await page.locator("figure.chart-figure", { hasText: "Master curve" }).screenshot({ path: join(OUT, "pane-master-500.png") });
    await page.close();
  });

  test("an invalid setting is reported next to its field, in words, and nothing is rendered", async () => {
    const { page } = await openPane(500);
    await page.selectOption("#rabinowitschMethod", "local");
    await page.fill("#rabinowitschWindow", "4");
    await page.click("#run");
    await page.waitForSelector("#rabinowitschWindow-error:not([hidden])");
    expect(await page.locator("#rabinowitschWindow-error").textContent()).toMatch(/odd whole number/);
    expect(await page.locator("#rabinowitschWindow").getAttribute("aria-invalid")).toBe("true");
    expect(await page.locator('table[data-block="flow-1"]').count()).toBe(0);
    await page.close();
  });
});
