/**
 * The task pane in a plain browser (preview mode on the bundled demo data), driven by
 * playwright-core with Debian's chromium: the rendered tables are compared with the core's own
 * reduction of the same file, the charts carry the right series, the layout holds at 320 and
 * 350 px (results first, key columns visible without sideways scrolling, the run button within
 * three Tab presses of any field), several invalid fields show several messages, a hanging
 * office.js still gives the preview within 5 s, and axe-core finds no WCAG 2.1 A/AA violation.
 * Screenshots of each step go to test-output/ (untracked).
 *
 * The pane is served from dist/ by a tiny HTTP server on 127.0.0.1; office.js is answered from
 * the local @microsoft/office-js copy and every other outside request is refused and recorded.
 * dist/ is rebuilt first when a pane source is newer than dist/taskpane.js.
 */
import { existsSync, mkdirSync, readFileSync } from "node:fs";
import type { Server } from "node:http";
import { AddressInfo } from "node:net";
import { join } from "node:path";
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
import { fitCurve } from "../src/core/flowCurveFits";
import { runReduction as coreRunReduction } from "../src/core/run";
import { readRotationalTable } from "../src/io/rotationalTable";
import { modelName } from "../src/io/displayNames";
import { CHROMIUM, OUT, ROOT, ensureBuild, haveChromium, loadAxe, serveDist } from "./helpers/paneBrowser";

const OFFICE_DIST = join(ROOT, "node_modules/@microsoft/office-js/dist");
// In CI (.ci/run installs chromium) a missing browser is a failure, never a silent skip.
if (!haveChromium && process.env.CI) throw new Error(`${CHROMIUM} is missing in CI: .ci/run must install chromium`);
if (!haveChromium) console.warn(`pane-preview tests skipped: ${CHROMIUM} is missing (apt-get install -y chromium; .ci/run installs it)`);
const maybe = haveChromium ? describe : describe.skip;

/** The demo file reduced by the core with the pane's defaults: what the preview must show. */
function coreReference() {
  const text = readFileSync(join(ROOT, "workbooks/demo-film-grade.csv"), "utf8");
  const raw = readRawTable(parseCsv(text).lines.map((l) => l.cells));
  const result = reduce(raw.measurements, readPaneSettings(DEFAULT_PANE_SETTINGS).request.options);
  return { raw, result };
}

/** Reads a preview number (as displayed, 4 significant digits). */
const shown = (t: string) => Number(t.trim());


/** Axe rules of WCAG 2.0/2.1 levels A and AA (axe-core's own tags). */
const WCAG_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];

/** What the focused element is: its id, the words that label it, and its focus outline. */
async function focused(page: Page): Promise<{ id: string; name: string; outline: string } | null> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return null;
    const labelled = (el as HTMLInputElement).labels?.length ? Array.from((el as HTMLInputElement).labels ?? [], (l) => l.textContent ?? "").join(" ") : (el.getAttribute("aria-label") ?? el.textContent ?? "");
    const style = getComputedStyle(el);
    return { id: el.id || el.tagName, name: labelled.trim(), outline: `${style.outlineStyle} ${style.outlineWidth}` };
  });
}

maybe("task pane preview mode (chromium)", () => {
  let server: Server;
  let browser: Browser;
  let origin: string;
  const outside: string[] = [];

  beforeAll(async () => {
    ensureBuild();
    mkdirSync(OUT, { recursive: true });
    server = await serveDist();
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

  /**
   * A page of the pane at `width` px. office.js is answered from the local copy, or (`office:
   * "hang"`) never answered at all; every other outside request is refused and recorded.
   */
  async function openPane(width: number, office: "local" | "hang" = "local"): Promise<{ page: Page; errors: string[]; previewMs: number }> {
    const page = await browser.newPage({ viewport: { width, height: 900 } });
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(String(e)));
    await page.route("**/*", (route) => {
      const url = route.request().url();
      if (url.startsWith(origin)) return route.continue();
      const script = /^https:\/\/appsforoffice\.microsoft\.com\/lib\/1\/hosted\/([\w.-]+\.js)$/.exec(url);
      if (script && office === "hang") return; // the request stays open: no answer, no error
      if (script && existsSync(join(OFFICE_DIST, script[1] as string))) {
        return route.fulfill({ status: 200, contentType: "text/javascript", body: readFileSync(join(OFFICE_DIST, script[1] as string)) });
      }
      outside.push(url);
      return route.abort();
    });
    const started = Date.now();
    await page.goto(`${origin}/taskpane.html`, { waitUntil: "commit" });
    await page.waitForSelector("body[data-mode=preview]", { timeout: 15_000 });
    return { page, errors, previewMs: Date.now() - started };
  }

  /** Runs the reduction and waits for the results. */
  async function reduceDemo(page: Page): Promise<void> {
    await page.click("#run");
    await page.waitForSelector(".group-card");
  }

  /** Runs axe-core on the page (WCAG 2.1 A and AA) and returns the violations, one line each. */
  async function axeViolations(page: Page, state: string): Promise<string[]> {
    await loadAxe(page, origin);
    const found = await page.evaluate(async (tags) => {
      const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe;
      const r = await axe.run(document, { runOnly: { type: "tag", values: tags } });
      return r.violations.map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(" ")).slice(0, 5).join(", ")}`);
    }, WCAG_TAGS);
    return found.map((f) => `${state}: ${f}`);
  }

  test("preview mode renders the core's Bagley table, flow curve and fits for the demo data (500 px)", async () => {
    const { page, errors } = await openPane(500);
    expect(await page.locator("#mode-banner").isVisible()).toBe(true);
    await reduceDemo(page);
    const { result } = coreReference();
    expect(await page.locator(".group-card").count()).toBe(result.groups.length);
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
      // the lowest AIC is the core's for the same points; the card recommends the lowest AIC whose parameters the data determine
      const pts = g.flowCurve.filter((f) => f.viscosity !== null);
      const compare = compareModels(DEFAULT_PANE_SETTINGS.models, { shearRate: pts.map((f) => f.shearRateWall as number), viscosity: pts.map((f) => f.viscosity as number) });
      const firstModel = await page.locator(`table[data-block="ranking-${i + 1}"] tbody tr:first-child td:first-child`).textContent();
      expect(firstModel).toBe(compare.ranked[0]?.model);
      // the card's recommendation is the core's one verdict on the same points and models
      const recommended = fitCurve({ shearRate: pts.map((f) => f.shearRateWall as number), viscosity: pts.map((f) => f.viscosity as number) }, { models: DEFAULT_PANE_SETTINGS.models }).verdict.recommended as string;
      expect(await page.locator(`.group-card[data-group="${i + 1}"]`).textContent()).toContain(`Recommended model${modelName(recommended)}:`);
    }
    // charts: one flow-curve series per group with one marker per point; one Bagley chart per group
    const flowSeries = page.locator('svg[data-chart="flowcurve"] g.series');
    expect(await flowSeries.count()).toBe(result.groups.length);
    expect(await flowSeries.nth(0).locator("circle").count()).toBe(result.groups[0]?.flowCurve.length);
    expect(await page.locator('svg[data-chart^="bagley-"]').count()).toBe(result.groups.length);
    const bagleyLines = page.locator('svg[data-chart="bagley-1"] g.series.line polyline');
    expect(await bagleyLines.count()).toBe(result.groups[0]?.bagley.length);
    // no two series of a chart look alike (colour, line style, marker)
    for (const chart of ["flowcurve", "viscosity", "nprime"]) {
      const looks = await page.locator(`svg[data-chart="${chart}"] g.series`).evaluateAll((gs) => gs.map((g) => `${g.getAttribute("stroke")}|${g.getAttribute("class")}|${g.firstElementChild?.tagName}`));
      expect(new Set(looks).size).toBe(looks.length);
    }
    // the method record lists the settings
    const settings = await page.locator('table[data-block="method-settings"]').textContent();
    expect(settings).toContain("Rabinowitsch slope method");
    expect(settings).toContain(DEFAULT_PANE_SETTINGS.rabinowitschMethod);
    await page.locator(".charts").screenshot({ path: join(OUT, "pane-preview-500-charts.png") });
    expect(errors.filter((e) => !/CustomFunctions/.test(e))).toEqual([]);
    expect(outside).toEqual([]);
    await page.close();
  });

  test("at 350 px the results come first: each group's summary and the first chart within the first two screens", async () => {
    const { page, errors } = await openPane(350);
    await page.screenshot({ path: join(OUT, "pane-350-1-start.png") });
    await reduceDemo(page);
    await page.evaluate(() => window.scrollTo(0, 0));
    const bottomOf = (selector: string) => page.locator(selector).evaluate((el) => el.getBoundingClientRect().bottom + window.scrollY);
    const screens = 2 * 900;
    const cards = await page.locator(".group-card").count();
    expect(cards).toBe(coreReference().result.groups.length);
    expect(await bottomOf(`.group-card[data-group="${cards}"]`)).toBeLessThanOrEqual(screens);
    expect(await bottomOf('figure[data-figure="flowcurve"]')).toBeLessThanOrEqual(screens);
    // each card gives the rate and viscosity ranges with units, the recommended model with units, the warnings by severity
    const card = (await page.locator('.group-card[data-group="1"]').textContent()) ?? "";
    expect(card).toMatch(/Wall shear rate[\d.e+-]+ to [\d.e+-]+ 1\/s/);
    expect(card).toMatch(/Viscosity[\d.e+-]+ to [\d.e+-]+ Pa·s/);
    expect(card).toMatch(/Recommended model[^:]+: .*η₀ = [\d.e+-]+ Pa·s/);
    expect(card).toMatch(/Warnings(none|\d+ (serious|caution|info))/);
    // the tables wait in folded sections, the warnings too (grouped by severity, the code kept)
    expect(await page.locator("details.tables[open]").count()).toBe(0);
    expect(await page.locator("details.warnings[open]").count()).toBe(0);
    expect(await page.locator('table[data-block="flow-1"]').isVisible()).toBe(false);
    await page.screenshot({ path: join(OUT, "pane-350-2-results.png") });
    await page.evaluate(() => window.scrollTo(0, 900));
    await page.screenshot({ path: join(OUT, "pane-350-3-charts.png") });
    const severities = await page.locator("details.warnings").evaluateAll((ds) => ds.map((d) => d.getAttribute("data-severity")));
    expect(severities.length).toBeGreaterThan(0);
    expect(severities).toEqual(["serious", "caution", "info"].filter((s) => severities.includes(s)));
    await page.locator("details.warnings summary").first().click();
    const item = page.locator("details.warnings li").first();
    expect(await item.locator(".warning-title").textContent()).not.toMatch(/^[A-Z_]+$/);
    expect(await item.locator(".warning-code").textContent()).toMatch(/^[A-Z][A-Z_]+$/);
    await page.locator(".warnings-block").screenshot({ path: join(OUT, "pane-350-4-warnings.png") });
    expect(errors.filter((e) => !/CustomFunctions/.test(e))).toEqual([]);
    await page.close();
  });

  test("at 350 px every table shows its key columns without sideways scrolling; all columns on request", async () => {
    const { page } = await openPane(350);
    await page.fill("#transducerRangeBar", "1000");
    await page.check("#check-representativeRate");
    await reduceDemo(page);
    await page.locator("details.tables > summary").evaluateAll((ss) => ss.forEach((s) => (s.parentElement as HTMLDetailsElement).open = true));
    await page.click("#planRun");
    await page.waitForSelector('table[data-block="plan-steps"]');
    await page.click("#lotRun");
    await page.waitForSelector('table[data-block="lot-points"]');
    const tables = await page.locator(".table-wrap.narrowable").evaluateAll((wraps) =>
      wraps
        .filter((w) => (w as HTMLElement).offsetParent !== null)
        .map((w) => ({
          id: w.querySelector("table")?.getAttribute("data-block") ?? "",
          keys: Array.from(w.querySelectorAll("th.col-key"), (th) => ({ text: th.textContent ?? "", shown: (th as HTMLElement).offsetWidth > 0 && th.getBoundingClientRect().right <= w.getBoundingClientRect().right + 1 })),
          sideways: w.scrollWidth - w.clientWidth,
        })),
    );
    expect(tables.map((t) => t.id)).toEqual(expect.arrayContaining(["flow-1", "bagley-1", "ranking-1", "parameters-1", "plan-steps", "lot-points"]));
    for (const t of tables) {
      expect({ id: t.id, hidden: t.keys.filter((k) => !k.shown).map((k) => k.text) }).toEqual({ id: t.id, hidden: [] });
      expect({ id: t.id, sideways: t.sideways }).toEqual({ id: t.id, sideways: 0 });
    }
    // the operator's columns of the speed ladder and the lot's verdict column are among the keys
    const keysOf = (id: string) => tables.find((t) => t.id === id)?.keys.map((k) => k.text) ?? [];
    expect(keysOf("plan-steps").join(" | ")).toMatch(/piston speed.*pressure.*range/);
    expect(keysOf("lot-points").join(" | ")).toMatch(/deviation.*status/);
    expect(keysOf("flow-1").join(" | ")).toMatch(/viscosity \[Pa·s\]/);
    await page.locator('table[data-block="flow-1"]').screenshot({ path: join(OUT, "pane-350-5-flow-table.png") });
    await page.locator('table[data-block="plan-steps"]').screenshot({ path: join(OUT, "pane-350-6-plan-table.png") });
    // "All columns" shows the rest (then the table may scroll sideways)
    const flowWrap = page.locator(".table-wrap", { has: page.locator('table[data-block="flow-1"]') });
    expect(await flowWrap.locator("th.col-more").first().isVisible()).toBe(false);
    await flowWrap.locator("button.all-columns").click();
    expect(await flowWrap.locator("th.col-more").first().isVisible()).toBe(true);
    expect(await flowWrap.locator("button.all-columns").getAttribute("aria-pressed")).toBe("true");
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.close();
  });

  test("the run button is within three Tab presses of every field (350 px), and every stop is labelled and visibly focused", async () => {
    const { page } = await openPane(350);
    await page.check("#check-heating"); // shows the heating fields too
    // and the folds of the models to fit and the column mapping (opened without a pointer: a click
    // just before would leave the bar in place, as it must for a mouse user)
    await page.evaluate(() => ["field-models", "field-columns"].forEach((id) => ((document.getElementById(id) as HTMLDetailsElement).open = true)));
    await page.waitForTimeout(1000);
    const panels: [string, string][] = [
      ["#reduce-form", "run"],
      ["#planner-section", "planRun"],
      ["#lot-section", "lotRun"],
    ];
    const far: string[] = [];
    let checked = 0;
    for (const [scope, run] of panels) {
      const ids = await page.locator(`${scope} :is(input, select, textarea, summary)`).evaluateAll((els) =>
        els.filter((e) => !(e as HTMLInputElement).disabled && e.checkVisibility() && !(e as HTMLElement).closest(".action-bar")).map((e, i) => (e.id ? `#${e.id}` : `${e.tagName.toLowerCase()}:nth-match-${i}`)),
      );
      for (const id of ids.filter((x) => x.startsWith("#"))) {
        await page.focus(id);
        let presses = 0;
        let reached = false;
        while (presses < 3 && !reached) {
          await page.keyboard.press("Tab");
          presses++;
          reached = (await focused(page))?.id === run;
        }
        checked++;
        if (!reached) far.push(`${id} → ${run}`);
      }
    }
    expect(checked).toBeGreaterThan(25);
    expect(far).toEqual([]);
    await page.screenshot({ path: join(OUT, "pane-350-7-keyboard.png") });
    // the whole page from the keyboard: every stop labelled and visibly focused, on to the lot check
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    const stops: { id: string; name: string; outline: string }[] = [];
    for (let i = 0; i < 500; i++) {
      await page.keyboard.press("Tab");
      const info = await focused(page);
      if (!info) continue;
      stops.push(info);
      if (info.id === "lotRun") break;
    }
    expect(stops.map((s) => s.id)).toEqual(expect.arrayContaining(["run", "rabinowitschMethod", "check-heating", "temperatureShift", "chartModel", "planBarrel", "planDies", "planRun", "lotSource", "lotRun"]));
    // tabbing straight through, the run button comes after each group of at most three controls
    const runs = stops.map((s, i) => (s.id === "run" ? i : -1)).filter((i) => i >= 0);
    runs.slice(1).forEach((at, k) => expect(at - (runs[k] as number)).toBeLessThanOrEqual(4));
    for (const s of stops) {
      expect({ id: s.id, named: s.name.length > 0 }).toEqual({ id: s.id, named: true });
      expect(s.outline).not.toMatch(/^none/);
    }
    // Enter on the run button runs (heating off again: it would need the melt's data); the safety caution opens from its link
    await page.uncheck("#check-heating");
    await page.focus("#run");
    await page.keyboard.press("Enter");
    await page.waitForSelector(".group-card");
    expect(await page.locator("#status").textContent()).toMatch(/Preview ready/);
    await page.focus("#safety-link");
    await page.keyboard.press("Enter");
    expect(await page.locator("#safety").getAttribute("open")).not.toBeNull();
    expect(await page.locator("#safety").textContent()).toMatch(/let the manual, not a predicted pressure, decide/i);
    await page.close();
  });

  test("several invalid fields show several messages at once, each next to its field and marked invalid (350 px)", async () => {
    const { page } = await openPane(350);
    await page.selectOption("#rabinowitschMethod", "local");
    await page.fill("#rabinowitschWindow", "4");
    await page.fill("#transducerRangeBar", "-5");
    await page.check("#check-heating");
    await page.fill("#heatingHeatCapacity", "2.1");
    await page.fill("#heatingConductivity", "abc");
    await page.click("#run");
    await page.waitForSelector("#rabinowitschWindow-error:not([hidden])");
    const shownErrors = await page.locator("p.error:not([hidden])").evaluateAll((ps) => ps.map((p) => ({ id: p.id, text: p.textContent ?? "" })));
    expect(shownErrors.map((e) => e.id).sort()).toEqual(["heatingConductivity-error", "heatingDensity-error", "rabinowitschWindow-error", "transducerRangeBar-error"]);
    for (const id of ["rabinowitschWindow", "transducerRangeBar", "heatingDensity", "heatingConductivity"]) expect(await page.locator(`#${id}`).getAttribute("aria-invalid")).toBe("true");
    // messages speak of the value, not of internal names (the label beside them names the field)
    for (const e of shownErrors) expect(e.text).not.toMatch(/transducerFullScale|rabinowitschWindow|heatingDensity|BarrelDiameter|--/);
    expect(await page.locator('table[data-block="flow-1"]').count()).toBe(0);
    expect(await page.locator("#status").textContent()).toMatch(/nothing was written/);
    await page.screenshot({ path: join(OUT, "pane-350-8-errors.png"), fullPage: false });
    expect(await axeViolations(page, "errors shown")).toEqual([]);
    await page.close();
  });

  test("a check the data cannot support is switched off with its reason, and the run goes on (slip with one bore)", async () => {
    const { page } = await openPane(350);
    await page.waitForSelector("#slip-reason:not([hidden])");
    expect(await page.locator("#check-slip").isDisabled()).toBe(true);
    expect(await page.locator("#slip-reason").textContent()).toMatch(/two or more round die bores/);
    expect(await page.locator("#end-orifice").isDisabled()).toBe(true);
    expect(await page.locator("#end-orifice-help").textContent()).toMatch(/Not available: needs an orifice die/);
    // disabled looks disabled: greyed, dashed, not the live controls' look
    const look = (sel: string) => page.locator(sel).evaluate((el) => ({ cursor: getComputedStyle(el).cursor, opacity: getComputedStyle(el).opacity }));
    expect(await look("#check-slip")).not.toEqual(await look("#check-extensional"));
    await page.locator("#field-checks").screenshot({ path: join(OUT, "pane-350-9-disabled-check.png") });
    await reduceDemo(page);
    expect(await page.locator('table[data-block="slip"]').count()).toBe(0);
    await page.close();
  });

  test("a hanging office.js request still gives the preview within 5 s, with a visible waiting state first", async () => {
    const { page, previewMs } = await openPane(350, "hang");
    expect(previewMs).toBeLessThan(5000);
    expect(await page.locator("#mode-banner").textContent()).toMatch(/Preview mode \(Office\.js did not load in time\)/);
    await page.screenshot({ path: join(OUT, "pane-350-0-office-hangs.png") });
    await reduceDemo(page);
    await page.close();
    // the waiting state is in the page itself, painted before any script runs (here: none at all)
    const still = await browser.newPage({ viewport: { width: 350, height: 900 }, javaScriptEnabled: false });
    await still.goto(`${origin}/taskpane.html`, { waitUntil: "commit" });
    await still.waitForSelector("#mode-banner.waiting");
    expect(await still.locator("#mode-banner").isVisible()).toBe(true);
    expect(await still.locator("#mode-banner").textContent()).toMatch(/^Connecting to Excel…/);
    await still.screenshot({ path: join(OUT, "pane-350-0-waiting.png") });
    await still.close();
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
    await page.waitForSelector('table[data-block="shift-factors"]', { state: "attached" });
    expect(await page.locator('table[data-block="flow-1"] thead th').allTextContents()).toEqual(expect.arrayContaining(["± wall shear stress [kPa]", "Schümmer viscosity [Pa·s]"]));
    expect(await page.locator('table[data-block="extensional-1"]').count()).toBe(1);
    expect(await page.locator('svg[data-chart="master"] g.series').count()).toBe(3);
    expect(await page.locator('table[data-block="method-settings"]').textContent()).toContain("Arrhenius");
    await page.locator("figure.chart-figure", { hasText: "Master curve" }).screenshot({ path: join(OUT, "pane-master-500.png") });
    await page.close();
  });

  test("fit settings at 350 px: paste and melt, a fit across temperatures (card with the model and Ea) and the demo rotational join (overlap ratio), no sideways scroll, no axe violation", async () => {
    const { page, errors } = await openPane(350);
    // fields that cannot apply are disabled, look it, and say why
    await page.waitForSelector("#slitEdgeCorrection-reason:not([hidden])");
    for (const [id, reason] of [
      ["slitEdgeCorrection", /needs a slit die/],
      ["glassTransitionTemperatureC", /WLF shift only/],
      ["verticalShiftPerK", /with a temperature shift/],
      ["crossWlfD2C", /Cross-WLF/],
      ["rotational", /preview mode has no workbook/],
    ] as const) {
      expect({ id, disabled: await page.locator(`#${id}`).isDisabled() }).toEqual({ id, disabled: true });
      expect(await page.locator(`#${id}-reason`).textContent()).toMatch(reason);
    }
    const look = (sel: string) => page.locator(sel).evaluate((el) => ({ background: getComputedStyle(el).backgroundColor, border: getComputedStyle(el).borderStyle }));
    expect(await look("#glassTransitionTemperatureC")).not.toEqual(await look("#heatingDensity"));
    expect(await look("#glassTransitionTemperatureC")).toEqual({ background: "rgb(236, 238, 237)", border: "dashed" });
    // the labels are the shared words of each setting
    expect(await page.locator("#material-label").textContent()).toBe("Material class");
    expect(await page.locator("#masterModel-label").textContent()).toBe("Fit across temperatures");
    // paste: the model list follows the class (yield-stress models added), and the run fits them
    await page.check("#material-paste");
    expect(await page.locator("#models-summary").textContent()).toMatch(/Herschel–Bulkley/);
    await reduceDemo(page);
    expect(await page.locator('table[data-block="ranking-1"] tbody').textContent()).toContain("herschel-bulkley");
    expect(await page.locator('table[data-block="method-settings"]').textContent()).toContain("paste");
    // melt again: the yield-stress models leave the list and the ranking
    await page.locator("#reduce-form > summary").click();
    await page.check("#material-melt");
    expect(await page.locator("#models-summary").textContent()).not.toMatch(/Herschel–Bulkley/);
    await page.selectOption("#temperatureShift", "arrhenius");
    expect(await page.locator("#verticalShiftPerK").isDisabled()).toBe(false);
    expect(await page.locator("#glassTransitionTemperatureC").isDisabled()).toBe(true);
    await page.selectOption("#masterModel", "carreau-yasuda");
    await page.fill("#referenceTemperatureC", "210");
    await page.check("#rotational-demo");
    await page.locator("#field-glassTransitionTemperatureC").evaluate((el) => el.closest(".field")?.scrollIntoView());
    await page.screenshot({ path: join(OUT, "pane-350-10-fit-settings.png") });
    await page.click("#run");
    // the run fits every group, the fit across temperatures and the join in the page: give it time on a loaded machine
    await page.waitForSelector('[data-card="masterfit"]', { timeout: 100_000 });
    expect(await page.locator('table[data-block="ranking-1"] tbody').textContent()).not.toContain("herschel-bulkley");
    // the core's run on the same settings: what the cards must show
    const text = readFileSync(join(ROOT, "workbooks/demo-film-grade.csv"), "utf8");
    const raw = readRawTable(parseCsv(text).lines.map((l) => l.cells));
    const settings = { ...DEFAULT_PANE_SETTINGS, temperatureShift: "arrhenius" as const, referenceTemperatureC: 210, masterModel: "carreau-yasuda" as const };
    const request = readPaneSettings(settings).request;
    const core = coreRunReduction(raw.measurements, request.options, { ...request.fits, compare: settings.models, rotational: readRotationalTable(parseCsv(readFileSync(join(ROOT, "workbooks/demo-film-grade-rotational.csv"), "utf8")).lines.map((l) => l.cells)).curve });
    const master = (await page.locator('[data-card="masterfit"]').textContent()) ?? "";
    expect(master).toContain("Carreau–Yasuda × Arrhenius");
    const ea = /Ea \[kJ\/mol\]([\d.]+) ± /.exec(master);
    expectClose(Number(ea?.[1]), (core.master?.activationEnergy as number) / 1e3, { rel: 6e-4 }, "Ea on the card, kJ/mol");
    expect(master).toMatch(/Not determined by the data/);
    const joined = (await page.locator('[data-card="rotational"]').textContent()) ?? "";
    const ratio = /rotational\/capillary ([\d.]+)/.exec(joined);
    expectClose(Number(ratio?.[1]), core.joined?.join.overlap?.ratio as number, { rel: 6e-4 }, "overlap ratio on the card");
    expect(joined).toMatch(/Within tolerance\s*yes/);
    // the shared tables of both, folded with the other tables; key columns without sideways scrolling
    await page.locator("details.tables > summary").evaluateAll((ss) => ss.forEach((s) => ((s.parentElement as HTMLDetailsElement).open = true)));
    for (const id of ["masterfit", "rotational-join"]) {
      const wrap = page.locator(".table-wrap", { has: page.locator(`table[data-block="${id}"]`) });
      expect({ id, sideways: await wrap.evaluate((w) => w.scrollWidth - w.clientWidth) }).toEqual({ id, sideways: 0 });
    }
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.locator('[data-card="masterfit"]').screenshot({ path: join(OUT, "pane-350-11-master-card.png") });
    await page.locator('[data-card="rotational"]').screenshot({ path: join(OUT, "pane-350-12-rotational-card.png") });
    await page.locator('table[data-block="masterfit"]').screenshot({ path: join(OUT, "pane-350-13-master-table.png") });
    // the joined curve's chart: both data sets and the recommended model, legend in words
    const joinedFigure = page.locator('figure[data-figure="rotational"]');
    expect(await joinedFigure.locator("figcaption").textContent()).toBe("Rotational and capillary viscosity joined");
    expect(await joinedFigure.locator(".legend li").allTextContents()).toEqual(["capillary data", "rotational data", expect.stringMatching(/ \(recommended\)$/)]);
    expect(await joinedFigure.evaluate((f) => f.scrollWidth - f.clientWidth)).toBeLessThanOrEqual(0);
    await joinedFigure.screenshot({ path: join(OUT, "pane-350-14-joined-chart.png") });
    await page.evaluate(() => document.querySelectorAll("details").forEach((d) => ((d as HTMLDetailsElement).open = true)));
    expect(await axeViolations(page, "fit across temperatures and rotational join")).toEqual([]);
    // an error of the new settings shows next to its field: a law-needing model without a law
    await page.selectOption("#temperatureShift", "none");
    await page.selectOption("#masterModel", "cross");
    await page.fill("#stabilityThresholdPercent", "150");
    await page.click("#run");
    await page.waitForSelector("#temperatureShift-error:not([hidden])");
    expect(await page.locator("#stabilityThresholdPercent-error").textContent()).toMatch(/below 100 %/);
    expect(await page.locator("#stabilityThresholdPercent-label").textContent()).toBe("Repeat stability limit [%]");
    expect(await page.locator("#temperatureShift-error").textContent()).toMatch(/“Fit across temperatures”/);
    expect(await page.locator("#temperatureShift").getAttribute("aria-invalid")).toBe("true");
    expect(errors.filter((e) => !/CustomFunctions/.test(e))).toEqual([]);
    await page.close();
  }, 240_000);

  test("axe-core finds no WCAG 2.1 A/AA violation: start, results with every fold open, planner and lot results (350 px)", async () => {
    const { page } = await openPane(350);
    const found: string[] = [...(await axeViolations(page, "start"))];
    await reduceDemo(page);
    await page.evaluate(() => document.querySelectorAll("details").forEach((d) => ((d as HTMLDetailsElement).open = true)));
    found.push(...(await axeViolations(page, "results, folds open")));
    await page.click("#planRun");
    await page.waitForSelector('table[data-block="plan-steps"]');
    await page.click("#lotRun");
    await page.waitForSelector('table[data-block="lot-points"]');
    found.push(...(await axeViolations(page, "planner and lot results")));
    expect(found).toEqual([]);
    await page.close();
  });
});
