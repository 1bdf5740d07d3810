/**
 * The recording panel of the task pane in headless Chromium at 350 px (preview mode, on the
 * invented demo recording workbooks/demo-trace-ladder.csv): the steps found, each die run's trace
 * with its windows shaded and the step left out marked, a step table whose means match the known
 * plateau ladder the recording was generated from (scripts/demo/traceLadder.ts), a moved window
 * that changes the plateau and is recorded in the method lines (and undone again), several bad
 * settings shown at once next to their fields, no sideways scrolling, and no axe-core WCAG 2.1
 * A/AA violation. Screenshots go to test-output/ (untracked).
 */
import { mkdirSync } from "node:fs";
import { join } from "node:path";
import type { Page } from "playwright-core";
import { traceLadderPlateaus } from "../scripts/demo/traceLadder";
import { expectClose } from "./helpers/expectClose";
import { CHROMIUM, OUT, PaneRig, axeViolations, ensureBuild, haveChromium, openPane, startRig } from "./helpers/paneBrowser";

// In CI (.ci/run installs chromium) a missing browser is a failure, never a silent skip.
if (!haveChromium && process.env.CI) throw new Error(`${CHROMIUM} is missing in CI: .ci/run must install chromium`);
if (!haveChromium) console.warn(`pane-trace tests skipped: ${CHROMIUM} is missing (apt-get install -y chromium)`);
const maybe = haveChromium ? describe : describe.skip;

/** The rows of one die run's step table as text: [step, start, end, mean, sd, steady]. */
function stepRows(page: Page, run: number): Promise<string[][]> {
  return page.locator(`table.step-table[data-run="${run}"] tbody tr`).evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("th, td"), (c) => (c.textContent ?? "").trim())));
}

/** Sideways overflow of the page and of every visible table of the panel, px. */
function overflow(page: Page): Promise<{ page: number; tables: { name: string; sideways: number }[] }> {
  return page.evaluate(() => ({
    page: document.documentElement.scrollWidth - document.documentElement.clientWidth,
    tables: Array.from(document.querySelectorAll<HTMLElement>("#trace-section .table-wrap"))
      .filter((w) => w.offsetParent !== null)
      .map((w) => ({ name: w.getAttribute("aria-label") ?? "", sideways: w.scrollWidth - w.clientWidth })),
  }));
}

maybe("task pane: steps of a pressure recording (chromium, 350 px)", () => {
  let rig: PaneRig;

  beforeAll(async () => {
    ensureBuild();
    mkdirSync(OUT, { recursive: true });
    rig = await startRig();
  }, 240_000);

  afterAll(async () => {
    await rig?.close();
  });

  async function findSteps(page: Page): Promise<void> {
    await page.click("#traceRun");
    await page.waitForSelector(".trace-run");
  }

  test("the demo recording: traces with windows shaded, the cut-short step marked, plateaus of the known ladder, no sideways scroll, no axe violation", async () => {
    const { page, errors } = await openPane(rig, 350);
    expect(await page.locator("#traceSource").inputValue()).toMatch(/invented demo recording/);
    await findSteps(page);
    expect(await page.locator("#trace-status").textContent()).toMatch(/^Preview ready: 3 die run\(s\), 18 step\(s\), 1 not steady; flow curve of 1 group\(s\)/);
    // one chart per die run, one shaded window per step, the step left out crossed
    expect(await page.locator(".trace-run svg.trace-chart").count()).toBe(3);
    for (const run of [1, 2, 3]) expect(await page.locator(`.trace-run[data-run="${run}"] rect.window`).count()).toBe(6);
    expect(await page.locator('.trace-run[data-run="3"] rect.window.rejected[data-step="5"]').count()).toBe(1);
    expect(await page.locator('.trace-run[data-run="3"] path.rejected-mark[data-step="5"]').count()).toBe(1);
    expect(await page.locator(".trace-run path.rejected-mark").count()).toBe(1);
    expect(await page.locator('.trace-run[data-run="1"] rect.window.check[data-step="6"]').count()).toBe(1);
    // the not-steady step is marked in its table, with its reason below
    const run3 = await stepRows(page, 3);
    expect(run3[4]).toEqual(["5", expect.any(String), expect.any(String), expect.any(String), expect.any(String), "no ✕"]);
    expect(await page.locator('table.step-table[data-run="3"] tr[data-step="5"]').getAttribute("class")).toMatch(/not-steady/);
    expect(await page.locator('.trace-run[data-run="3"] .step-notes li[data-step="5"]').textContent()).toMatch(/^Step 5: not steady: cut short/);
    // the means are the ladder's plateaus (generating law of the demo: scripts/demo/traceLadder.ts,
    // invented data); 4 significant digits shown, 0.4 % noise over ≥ 20 samples: within 0.3 %
    const ladder = traceLadderPlateaus();
    for (const run of [1, 2, 3]) {
      const rows = await stepRows(page, run);
      expect(rows).toHaveLength(6);
      rows.forEach((row, k) => {
        const plateau = ladder[(run - 1) * 6 + k]!;
        if (!plateau.reached) return;
        expect(row[5]).toBe("yes");
        expectClose(Number(row[3]), plateau.pressure / 1e5, { rel: 0.004 }, `die run ${run} step ${k + 1} mean [bar]`);
        expect(Number(row[2])).toBeGreaterThan(Number(row[1]));
      });
    }
    // warnings as the reduction shows them: grouped by severity, plain titles, codes kept
    const severities = await page.locator("#trace-results details.warnings").evaluateAll((ds) => ds.map((d) => d.getAttribute("data-severity")));
    expect(severities).toContain("caution");
    await page.locator('#trace-results details.warnings[data-severity="caution"] summary').click();
    const item = page.locator('#trace-results details.warnings[data-severity="caution"] li').first();
    expect(await item.locator(".warning-title").textContent()).not.toMatch(/^[A-Z_]+$/);
    expect(await item.locator(".warning-code").textContent()).toBe("STEP_NOT_STEADY");
    // the sheets: steps with their start, end, mean, sd and steady; the flow curve of the plateaus
    const stepsHeader = await page.locator('#trace-results table[data-block="steps"] thead th').allTextContents();
    expect(stepsHeader.join(" | ")).toMatch(/Window start \[s\].*Window end \[s\].*Pressure \[bar\].*Pressure sd \[bar\].*Steady/);
    expect(await page.locator('#trace-results table[data-block="flow-1"] tbody tr').count()).toBeGreaterThanOrEqual(4);
    // narrow enough: nothing scrolls sideways at 350 px, the sheets' tables opened too
    await page.locator("#trace-results details.tables > summary").evaluateAll((ss) => ss.forEach((s) => ((s.parentElement as HTMLDetailsElement).open = true)));
    const o = await overflow(page);
    expect(o.page).toBeLessThanOrEqual(0);
    for (const t of o.tables) expect(t).toEqual({ name: t.name, sideways: 0 });
    expect(o.tables.length).toBeGreaterThanOrEqual(5);
    await page.locator('.trace-run[data-run="3"]').screenshot({ path: join(OUT, "pane-trace-350-1-run3.png") });
    await page.locator("#trace-section").screenshot({ path: join(OUT, "pane-trace-350-2-panel.png") });
    expect(await axeViolations(rig, page, "steps shown")).toEqual([]);
    expect(errors.filter((e) => !/CustomFunctions/.test(e))).toEqual([]);
    expect(rig.outside).toEqual([]);
    await page.close();
  });

  test("moving a window changes the plateau and is recorded in the method lines; the detected window comes back", async () => {
    const { page } = await openPane(rig, 350);
    await findSteps(page);
    expect(await page.locator("#trace-move").isVisible()).toBe(true);
    const before = (await stepRows(page, 2))[0]!;
    // die run 2 (L 20 mm), step 1: the window moved back into the approach from zero (τ = 3 s: 4 s
    // in, the pressure is still 26 % below its plateau; over 4–29 s the mean is ~3 % low), so the mean falls
    await page.selectOption("#traceStep", "2:1");
    expect(Number(await page.locator("#traceEnd").inputValue())).toBeCloseTo(Number(before[2]), 6);
    await page.fill("#traceStart", "4");
    await page.fill("#traceEnd", "29");
    await page.click("#traceMove");
    await page.waitForSelector('table.step-table[data-run="2"] tr[data-step="1"] th:has-text("✎")');
    const after = (await stepRows(page, 2))[0]!;
    expect(after[0]).toBe("1 ✎");
    expect(after.slice(1, 3)).toEqual(["4", "29"]);
    expect(Number(after[3])).toBeLessThan(Number(before[3]) * 0.98);
    await page.locator("#trace-results details.method-record > summary").click();
    const lines = await page.locator("#trace-results .method-lines li").allTextContents();
    expect(lines.at(-1)).toMatch(/^Die run 2 \(210 °C, D 1 mm, L 20 mm\), step 1: window set by hand to 4\.000–29\.00 s \(detected \d+\.?\d*–29\.00 s\)\.$/);
    // the steps sheet's method block carries the same line
    expect(await page.locator('#trace-results table[data-block="steps-method"]').textContent()).toContain("step 1: window set by hand to 4.000–29.00 s");
    expect(await page.locator("#trace-summary").textContent()).toMatch(/1 window set by hand/);
    expect(await page.locator("#traceStep").inputValue()).toBe("2:1");
    await page.locator('.trace-run[data-run="2"]').screenshot({ path: join(OUT, "pane-trace-350-3-moved.png") });
    // the moved window stays for the next run, until the detected window is asked for again
    await page.click("#traceRun");
    await page.waitForSelector("#trace-status:has-text('Preview ready')");
    expect((await stepRows(page, 2))[0]![0]).toBe("1 ✎");
    expect(await page.locator("#traceReset").isDisabled()).toBe(false);
    await page.click("#traceReset");
    await page.waitForSelector('table.step-table[data-run="2"] tr[data-step="1"] th:text-is("1")');
    expect((await stepRows(page, 2))[0]).toEqual(before);
    expect(await page.locator("#trace-results .method-lines li").allTextContents()).not.toContainEqual(expect.stringMatching(/set by hand/));
    expect(await axeViolations(rig, page, "window moved and reset")).toEqual([]);
    await page.close();
  });

  test("bad settings and a bad window show every message at once, next to their fields (350 px)", async () => {
    const { page } = await openPane(rig, 350);
    await findSteps(page);
    await page.selectOption("#traceStep", "1:3");
    await page.fill("#traceStart", "100");
    await page.fill("#traceEnd", "90");
    await page.click("#traceMove");
    await page.waitForSelector("#traceEnd-error:not([hidden])");
    expect(await page.locator("#traceEnd-error").textContent()).toMatch(/must end after it starts/);
    expect(await page.locator("#traceEnd").getAttribute("aria-invalid")).toBe("true");
    expect(await page.locator("#trace-status").textContent()).toMatch(/nothing was written/);
    // a window outside its step: the detector's message, next to the window
    await page.fill("#traceStart", "500");
    await page.fill("#traceEnd", "600");
    await page.click("#traceMove");
    await page.waitForSelector("#traceStart-error:not([hidden])");
    expect(await page.locator("#traceStart-error").textContent()).toMatch(/step 3: the window 500–600 s holds fewer than 3 samples/);
    // settings: several problems at once, in the field's own words
    await page.locator("#trace-settings-fold > summary").click();
    await page.fill("#trace-minWindowTime", "abc");
    await page.fill("#trace-speedTolerance", "150");
    await page.fill("#trace-compressibility", "1.1");
    await page.click("#traceRun");
    await page.waitForSelector("#trace-minWindowTime-error:not([hidden])");
    const shown = await page.locator("#trace-section p.error:not([hidden])").evaluateAll((ps) => ps.map((p) => p.id).sort());
    expect(shown).toEqual(["trace-meltVolume-error", "trace-minWindowTime-error", "trace-speedTolerance-error"]);
    for (const id of ["trace-minWindowTime", "trace-speedTolerance", "trace-meltVolume"]) expect(await page.locator(`#${id}`).getAttribute("aria-invalid")).toBe("true");
    for (const text of await page.locator("#trace-section p.error:not([hidden])").allTextContents()) expect(text).not.toMatch(/minWindowTime|speedTolerance|meltVolume|--/);
    expect(await page.locator("#trace-speedTolerance-error").textContent()).toMatch(/below 100 %/);
    await page.locator("#trace-settings-fold").screenshot({ path: join(OUT, "pane-trace-350-4-errors.png") });
    expect(await axeViolations(rig, page, "errors shown")).toEqual([]);
    const o = await overflow(page);
    expect(o.page).toBeLessThanOrEqual(0);
    await page.close();
  });
});
