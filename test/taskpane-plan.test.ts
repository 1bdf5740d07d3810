/**
 * The pane's pure parts: settings validation, column recognition and mapping (die list), the
 * field an error is shown next to, and the sheet plan built from a run. Reference values are the
 * core's own results for the same data (the plan must copy them, converted to the display
 * units by the factors of NIST SP 811: 1 kPa = 1e3 Pa, 1 bar = 1e5 Pa).
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { RheoError } from "../src/core/errors";
import { parseCsv } from "../src/io/csv";
import { applyColumnChoices, detectColumns, mappingProblems } from "../src/taskpane/columns";
import { buildWorkbookPlan } from "../src/taskpane/plan";
import { formatCell, sheetPlanHtml } from "../src/taskpane/preview";
import { PaneError, fieldOfError, runReduction, transducerWarnings } from "../src/taskpane/runReduction";
import { DEFAULT_PANE_SETTINGS, parseNumberField, validateSettings } from "../src/taskpane/settings";
import { a1, blockLayout, columnLetters, findBlock, seriesPoints } from "../src/taskpane/sheetPlan";
import { expectClose } from "./helpers/expectClose";

const demo = parseCsv(readFileSync(join(__dirname, "../workbooks/demo-film-grade.csv"), "utf8")).lines.map((l) => l.cells);
const META = { version: "0.0.0-test", date: "2025-01-02T03:04:05.000Z", names: { results: "Rheo results", method: "Rheo method" } };

describe("settings", () => {
  test("validateSettings(DEFAULT_PANE_SETTINGS) finds nothing wrong", () => {
    expect(validateSettings(DEFAULT_PANE_SETTINGS)).toEqual([]);
  });
  test("validateSettings names the field of each bad value", () => {
    const bad = validateSettings({ ...DEFAULT_PANE_SETTINGS, rabinowitschMethod: "local", rabinowitschDegree: 3, rabinowitschWindow: 4, transducerRangeBar: -5 });
    expect(bad.map((e) => e.field)).toEqual(["rabinowitschDegree", "rabinowitschWindow", "transducerRangeBar"]);
  });
  test("parseNumberField reads blanks as null, decimal commas, and flags text as NaN", () => {
    expect(parseNumberField(" ")).toBeNull();
    expect(parseNumberField("1,5")).toBe(1.5);
    expect(parseNumberField("2e3")).toBe(2000);
    expect(parseNumberField("500 bar")).toBeNaN();
  });
});

describe("columns", () => {
  test("detectColumns recognises quantity [unit] headers and die label columns; others are left to map", () => {
    const cols = detectColumns(["pressure [bar]", "Die", "speed", "temperature"]);
    expect(cols.map((c) => [c.role, c.unit, c.recognised])).toEqual([
      ["pressure", "bar", true],
      ["die", null, true],
      ["ignore", null, false],
      ["temperature", null, false],
    ]);
  });
  test("applyColumnChoices looks dies up in the die list and rewrites the header for the shared reader", () => {
    const cells = [
      ["Die", "Q", "p"],
      ["short", 10, 50],
      ["long", 10, 90],
    ];
    const cols = detectColumns(cells[0] as string[]);
    const mapped = cols.map((c) => (c.index === 1 ? { ...c, role: "flow_rate" as const, unit: "mm3/s" } : c.index === 2 ? { ...c, role: "pressure" as const, unit: "bar" } : c));
    const out = applyColumnChoices(cells, mapped, [
      { label: "short", diameterMm: 1, lengthMm: 10 },
      { label: "long", diameterMm: 1, lengthMm: 30 },
    ]);
    expect(out).toEqual([
      ["", "flow_rate [mm3/s]", "pressure [bar]", "die_diameter [mm]", "die_length [mm]"],
      ["short", 10, 50, 1, 10],
      ["long", 10, 90, 1, 30],
    ]);
    expect(() => applyColumnChoices([...cells, ["odd", 1, 2]], mapped, [{ label: "short", diameterMm: 1, lengthMm: 10 }])).toThrow(/"long" in row 3 is not in the die list/);
  });
  test("mappingProblems reports a quantity without a unit and a quantity used twice", () => {
    const cols = detectColumns(["pressure [bar]", "pressure [psi]", "temperature"]);
    const withRole = cols.map((c) => (c.index === 2 ? { ...c, role: "temperature" as const, unit: null } : c));
    const problems = mappingProblems(withRole, []);
    expect(problems.join(" ")).toMatch(/Columns 1 and 2 are both pressure/);
    expect(problems.join(" ")).toMatch(/choose a unit for temperature/);
  });
  test("a table without die columns needs exactly one listed die", () => {
    const cells = [["flow_rate [mm3/s]", "pressure [bar]"], [1, 2]];
    expect(() => applyColumnChoices(cells, detectColumns(cells[0] as string[]), [])).toThrow(RheoError);
    expect(applyColumnChoices(cells, detectColumns(cells[0] as string[]), [{ label: "D1", diameterMm: 1, lengthMm: 20 }])[1]).toEqual([1, 2, 1, 20]);
  });
});

describe("errors go next to their field", () => {
  test("fieldOfError maps the reader's and core's arguments to pane fields", () => {
    expect(fieldOfError(new RheoError("value", "pressure [bar] (column 6)", "row 5 is text \"n/a\", not a number"))).toBe("source");
    expect(fieldOfError(new RheoError("missing", "die_length", "no \"die_length [unit]\" column"))).toBe("columns");
    expect(fieldOfError(new RheoError("missing", "dieLength", "190 °C, D = 1 mm has a single die length (10 mm); the Bagley correction needs two or more"))).toBe("endCorrection");
    expect(fieldOfError(new RheoError("value", "dies", "die 1 needs a bore"))).toBe("dies");
  });
  test("runReduction with one die length and Bagley fails on the end-correction field", async () => {
    const oneDie = demo.filter((r, i) => i === 0 || r[2] === "10");
    await expect(runReduction({ cells: oneDie, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "x" }, { ...DEFAULT_PANE_SETTINGS, models: [] })).rejects.toMatchObject({ field: "endCorrection" });
    await expect(runReduction({ cells: oneDie, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "x" }, { ...DEFAULT_PANE_SETTINGS, models: [] })).rejects.toBeInstanceOf(PaneError);
  });
  test("transducerWarnings flags readings above full scale and in the bottom 2 % (common practice, no source)", () => {
    expect(transducerWarnings([1e5, 50e5, 120e5], 100).map((w) => w.code)).toEqual(["TRANSDUCER_OVER_RANGE", "TRANSDUCER_LOW_RANGE"]);
    expect(transducerWarnings([10e5], 100)).toEqual([]);
    expect(transducerWarnings([1e9], null)).toEqual([]);
  });
});

describe("buildWorkbookPlan(run, meta)", () => {
  let run: Awaited<ReturnType<typeof runReduction>>;
  const progress: number[] = [];
  beforeAll(async () => {
    run = await runReduction({ cells: demo, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "Data!A1:F82" }, { ...DEFAULT_PANE_SETTINGS, models: ["power-law", "cross"] }, (_s, f) => progress.push(f));
  });

  test("progress is reported in order and ends at 90 % (the writer does the rest)", () => {
    expect(progress).toEqual([...progress].sort((a, b) => a - b));
    expect(progress[progress.length - 1]).toBe(0.9);
  });

  test("the flow-curve block holds the core's values in kPa and Pa·s; the std. error is half the Bagley slope's", () => {
    const plan = buildWorkbookPlan(run, META).results;
    run.result.groups.forEach((g, i) => {
      const flow = findBlock(plan, `flow-${i + 1}`);
      expect(flow.rows).toHaveLength(g.flowCurve.length);
      g.flowCurve.forEach((f, r) => {
        const row = flow.rows[r] ?? [];
        expectClose(row[1] as number, f.wallShearStress / 1e3, { rel: 1e-12 });
        expectClose(row[2] as number, (g.bagley[r]?.slopeStandardError as number) / 2 / 1e3, { rel: 1e-12 });
        expect(row[5]).toBe(f.viscosity);
      });
    });
  });

  test("blocks never overlap, and charts sit clear of the tables", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const cells = new Set<string>();
    for (const b of plan.blocks) {
      const lay = blockLayout(b);
      for (let r = 0; r < lay.rowCount; r++) {
        for (let c = 0; c < lay.width; c++) {
          const key = a1(b.row + r, b.col + c);
          expect(cells.has(key)).toBe(false);
          cells.add(key);
        }
      }
    }
    const tableRight = Math.max(...plan.blocks.filter((b) => b.role !== "chartData" && b.col === 0).map((b) => b.col + blockLayout(b).width));
    const dataLeft = Math.min(...plan.blocks.filter((b) => b.role === "chartData").map((b) => b.col));
    for (const c of plan.charts) {
      expect(c.anchor.col).toBeGreaterThanOrEqual(tableRight);
      expect(c.anchor.col + c.anchor.cols).toBeLessThanOrEqual(dataLeft);
    }
  });

  test("each Bagley line runs from (−e, 0) to the longest die on the fitted line", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const chart = plan.charts.find((c) => c.id === "bagley-1");
    const g = run.result.groups[0];
    const lines = chart?.series.filter((s) => s.style === "line") ?? [];
    expect(lines).toHaveLength(g?.bagley.length ?? -1);
    lines.forEach((s, k) => {
      const b = g?.bagley[k];
      const [p0, p1] = seriesPoints(plan, s);
      expectClose(p0?.x as number, -(b?.endCorrection as number), { rel: 1e-12 });
      expect(p0?.y).toBe(0);
      const maxLR = Math.max(...(g?.dies.map((d) => d.lengthOverRadius) ?? []));
      expectClose(p1?.x as number, maxLR, { rel: 1e-12 });
      expectClose(p1?.y as number, ((b?.slope as number) * maxLR + (b?.entrancePressure as number)) / 1e5, { rel: 1e-12 });
    });
  });

  test("the viscosity chart has each group's points and one curve per fitted model", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const chart = plan.charts.find((c) => c.id === "viscosity");
    const fitted = run.fits.reduce((s, f) => s + f.curves.length, 0);
    expect(chart?.series).toHaveLength(run.result.groups.length + fitted);
  });

  test("the method record names the equations of the steps used", () => {
    const plan = buildWorkbookPlan(run, META).method;
    const steps = findBlock(plan, "method-equations").rows.map((r) => r[0]);
    expect(steps).toEqual(expect.arrayContaining(["Flow rate", "Bagley end correction", "Rabinowitsch correction", "Model cross", "Model power-law", "Model ranking"]));
  });

  test("sheetPlanHtml escapes text and shows numbers to 4 significant digits", () => {
    const plan = buildWorkbookPlan({ ...run, input: { ...run.input, sourceLabel: "<b>x</b>" } }, META).results;
    const html = sheetPlanHtml(plan);
    expect(html).toContain("&lt;b&gt;x&lt;/b&gt;");
    expect(html).not.toContain("<b>x</b>");
    expect(formatCell(1234.5678)).toBe("1235");
    expect(formatCell(0.000123456)).toBe("1.235e-4");
    expect(formatCell(null)).toBe("");
  });
});

test("columnLetters(n) follows Excel's column names", () => {
  expect([0, 25, 26, 27, 701, 702].map(columnLetters)).toEqual(["A", "Z", "AA", "AB", "ZZ", "AAA"]);
});
