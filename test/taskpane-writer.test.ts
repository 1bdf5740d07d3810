/**
 * The pane's Excel writer and "copy as values" against office-addin-mock objects (see
 * helpers/fakeExcel.ts): new uniquely named sheets only, existing cells untouched, tables where
 * the plan puts them, charts with the right series ranges, the method sheet listing every
 * setting, and no partial sheet left when a step fails.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { parseCsv } from "../src/io/csv";
import { detectColumns } from "../src/taskpane/columns";
import { SHEET_BASE_NAMES, pairedSheetNames, uniqueSheetName, writeNewSheet, writeWorkbookPlan } from "../src/taskpane/excelWriter";
import { buildLotPlan, runLotCheck } from "../src/taskpane/panels/lot/check";
import { plannerFormFromSettings } from "../src/taskpane/panels/planner/form";
import { buildPlannerPlan, runPlanner } from "../src/taskpane/panels/planner/plan";
import { conditionalFormatAddress } from "../src/taskpane/sheetPlan";
import { buildWorkbookPlan } from "../src/taskpane/plan";
import { RunOutput, runReduction } from "../src/taskpane/runReduction";
import { DEFAULT_PANE_SETTINGS, describeSettings } from "../src/taskpane/settings";
import { a1, blockLayout, findBlock, seriesAddresses } from "../src/taskpane/sheetPlan";
import { copySheetAsValues, valuesCopyGrid } from "../src/taskpane/panels/share/values";
import { FakeExcel } from "./helpers/fakeExcel";

const META = { version: "9.9.9", date: "2025-01-02T03:04:05.000Z" };
let run: RunOutput;

beforeAll(async () => {
  const cells = parseCsv(readFileSync(join(__dirname, "../workbooks/demo-film-grade.csv"), "utf8")).lines.map((l) => l.cells);
  // one model keeps the suite fast; the plan tests cover several
  run = await runReduction({ cells, columns: detectColumns(cells[0] ?? []), dies: [], sourceLabel: "Data!A1:F82" }, { ...DEFAULT_PANE_SETTINGS, models: ["cross"] });
});

function withData(options = {}) {
  const fake = new FakeExcel(options);
  fake.addSheet("Data");
  fake.addSheet("Rheo results"); // a previous run
  return fake;
}

describe("uniqueSheetName / pairedSheetNames", () => {
  test("uniqueSheetName(base, existing) counts up past taken names, ignoring case", () => {
    expect(uniqueSheetName("Rheo results", [])).toBe("Rheo results");
    expect(uniqueSheetName("Rheo results", ["rheo RESULTS", "Rheo results 2"])).toBe("Rheo results 3");
  });
  test("uniqueSheetName keeps Excel's 31-character limit", () => {
    const long = "A sheet with a rather long name indeed";
    expect(uniqueSheetName(`${long} values`, []).length).toBe(31);
    expect(uniqueSheetName(long.slice(0, 31), [long.slice(0, 31)])).toMatch(/ 2$/);
  });
  test("pairedSheetNames gives results and method sheets one shared number", () => {
    expect(pairedSheetNames(["Rheo method"])).toEqual({ results: "Rheo results 2", method: "Rheo method 2" });
  });
});

describe("writeWorkbookPlan(batch, makePlan)", () => {
  test("creates two new sheets with unique names and never writes to existing sheets", async () => {
    const fake = withData();
    const names = await writeWorkbookPlan(fake.batch, (n) => buildWorkbookPlan(run, { ...META, names: n }));
    expect(names).toEqual({ results: "Rheo results 2", method: "Rheo method 2" });
    expect(fake.names()).toEqual(["Data", "Rheo results", "Rheo results 2", "Rheo method 2"]);
    expect(fake.sheet("Data").ranges).toEqual([]);
    expect(fake.sheet("Rheo results").ranges).toEqual([]);
    expect(fake.sheet("Rheo results").charts).toEqual([]);
  });

  test("tables land where the plan puts them, with the core's numbers", async () => {
    const fake = withData();
    let plan = buildWorkbookPlan(run, { ...META, names: { results: "", method: "" } });
    await writeWorkbookPlan(fake.batch, (n) => (plan = buildWorkbookPlan(run, { ...META, names: n })));
    const cells = fake.written("Rheo results 2");
    const flow = findBlock(plan.results, "flow-1");
    const lay = blockLayout(flow);
    expect(cells.get(a1(lay.titleRow as number, flow.col))).toBe("Flow curve (Rabinowitsch-corrected)");
    expect(cells.get(a1(lay.headerRow as number, flow.col + 5))).toBe("viscosity [Pa·s]");
    const g = run.result.groups[0];
    g?.flowCurve.forEach((f, i) => {
      expect(cells.get(a1(lay.firstDataRow + i, flow.col))).toBe(f.shearRateApparent);
      expect(cells.get(a1(lay.firstDataRow + i, flow.col + 1))).toBe(f.wallShearStress / 1e3);
      expect(cells.get(a1(lay.firstDataRow + i, flow.col + 5))).toBe(f.viscosity);
    });
    const bagley = findBlock(plan.results, "bagley-1");
    expect(cells.get(a1(blockLayout(bagley).firstDataRow, bagley.col + 4))).toBe(g?.bagley[0]?.endCorrection);
    expect(cells.get("A1")).toBe("Rheoledger results");
  });

  test("charts get the right series: one per group on the flow curve, Bagley lines from zero pressure", async () => {
    const fake = withData();
    let plan = buildWorkbookPlan(run, { ...META, names: { results: "", method: "" } });
    await writeWorkbookPlan(fake.batch, (n) => (plan = buildWorkbookPlan(run, { ...META, names: n })));
    const charts = fake.sheet("Rheo results 2").charts;
    expect(charts.map((c) => c.mock.name)).toEqual(plan.results.charts.map((c) => `Rheo ${c.id}`));
    const flow = charts[0];
    const spec = plan.results.charts[0];
    expect(flow?.series).toHaveLength(run.result.groups.length);
    flow?.series.forEach((s, i) => {
      const want = seriesAddresses(plan.results, spec?.series[i] as never);
      expect([s.x, s.y]).toEqual([want.x, want.y]);
    });
    expect(flow?.mock.axes.categoryAxis.logBase).toBe(10);
    expect(flow?.mock.axes.valueAxis.logBase).toBe(10);
    const bagley = charts.find((c) => c.mock.name === "Rheo bagley-1");
    const g = run.result.groups[0];
    expect(bagley?.series).toHaveLength(2 * (g?.bagley.length ?? 0));
    expect(bagley?.mock.axes.valueAxis.minimum).toBe(0);
    // the first line series starts at L/R = -e, zero pressure
    const cells = fake.written("Rheo results 2");
    const line = bagley?.series[1];
    const first = (line?.x as string).split(":")[0] as string;
    expect(cells.get(first)).toBeCloseTo(-(g?.bagley[0]?.endCorrection as number), 12);
    expect(cells.get((line?.y as string).split(":")[0] as string)).toBe(0);
    expect(line?.mock.chartType).toBe("XYScatterLinesNoMarkers");
  });

  test("the method sheet lists every setting, the version, the date and the warnings", async () => {
    const fake = withData();
    await writeWorkbookPlan(fake.batch, (n) => buildWorkbookPlan(run, { ...META, names: n }));
    const text = [...fake.written("Rheo method 2").values()].map(String);
    for (const [label, value] of describeSettings(run.settings)) {
      expect(text).toContain(label);
      expect(text).toContain(value);
    }
    expect(text).toContain("9.9.9");
    expect(text).toContain(META.date);
    expect(text).toContain("Rheo results 2");
    for (const w of run.warnings) expect(text).toContain(w.message);
  });

  test("a failure while adding charts leaves no new sheet behind and rethrows", async () => {
    const fake = withData({ failAtChart: 2 });
    await expect(writeWorkbookPlan(fake.batch, (n) => buildWorkbookPlan(run, { ...META, names: n }))).rejects.toThrow(/chart could not be created/);
    expect(fake.names()).toEqual(["Data", "Rheo results"]);
    expect(fake.batches).toBe(2); // the cleanup runs in a batch of its own
  });

  test("a failing sync after the cells were written also removes the new sheets", async () => {
    const fake = withData({ failAtSync: 2 });
    await expect(writeWorkbookPlan(fake.batch, (n) => buildWorkbookPlan(run, { ...META, names: n }))).rejects.toThrow(/sync failed/);
    expect(fake.names()).toEqual(["Data", "Rheo results"]);
  });

  test("a plan that cannot be built creates nothing", async () => {
    const fake = withData();
    await expect(
      writeWorkbookPlan(fake.batch, () => {
        throw new Error("plan failed");
      }),
    ).rejects.toThrow(/plan failed/);
    expect(fake.names()).toEqual(["Data", "Rheo results"]);
  });
});

/** Leading characters that make Excel read a typed value as a formula or an entry command (CSV-injection lists add tab and CR). */
const HOSTILE = ['=HYPERLINK("http://example.invalid","x")', "+5", "-L20", "@P50", "\tL10 tab", "\rL30 cr", "=1+1"];

/** Every string written to a sheet that Excel could read as a formula, and the format in force on its cell. */
function formulaLikeCells(fake: FakeExcel, sheet: string, property: "values" | "formulas" = "values"): { cell: string; value: string; format: unknown }[] {
  const formats = fake.formats(sheet);
  return [...fake.written(sheet, property)].filter(([, v]) => typeof v === "string" && /^[=+\-@\t\r]/.test(v)).map(([cell, v]) => ({ cell, value: v as string, format: formats.get(cell) }));
}

describe("text stays text (no cell becomes a formula)", () => {
  test("user text in the results and method sheets (source label, die labels, column headers) is written in the Text format", async () => {
    const hostileRun: RunOutput = {
      ...run,
      input: {
        ...run.input,
        sourceLabel: HOSTILE[0] as string,
        dies: HOSTILE.map((label, i) => ({ label, diameterMm: 1, lengthMm: 10 * (i + 1) })),
        columns: run.input.columns.map((c, i) => ({ ...c, header: HOSTILE[i % HOSTILE.length] as string })),
      },
    };
    const fake = new FakeExcel();
    const names = await writeWorkbookPlan(fake.batch, (n) => buildWorkbookPlan(hostileRun, { ...META, names: n }));
    const found = [...formulaLikeCells(fake, names.results), ...formulaLikeCells(fake, names.method)];
    // every hostile label is there, each as text
    for (const h of HOSTILE) expect(found.some((f) => f.value.includes(h))).toBe(true);
    expect(found.filter((f) => f.format !== "@")).toEqual([]);
    // numbers keep their number formats (the flow curve's rate column)
    const plan = buildWorkbookPlan(hostileRun, { ...META, names }).results;
    const flow = findBlock(plan, "flow-1");
    const first = a1(blockLayout(flow).firstDataRow, flow.col);
    expect(fake.formats(names.results).get(first)).toBe("0.00");
  });

  test("the plan sheet: die and transducer names typed by the user stay text", async () => {
    const demoPlan = JSON.parse(readFileSync(join(__dirname, "../workbooks/demo-plan.json"), "utf8")) as Record<string, unknown>;
    const form = plannerFormFromSettings(demoPlan);
    // the die list is comma-separated and trimmed, so its names carry no comma and no leading blank
    const names = ["=1+1", "+5", "-L20", "@P50"];
    const out = runPlanner({ ...form, dies: form.dies.split("\n").map((l, i) => l.replace(/^[^,]+/, names[i % names.length] as string)).join("\n"), transducers: form.transducers.replace(/^[^,]+/, "@P50") });
    const fake = new FakeExcel();
    const name = await writeNewSheet(fake.batch, SHEET_BASE_NAMES.plan, (n) => buildPlannerPlan(out, { ...META, name: n }));
    const found = formulaLikeCells(fake, name);
    expect(found.length).toBeGreaterThanOrEqual(3);
    expect(found.filter((f) => f.format !== "@")).toEqual([]);
  });

  test("the Share fallback list (no notes, no comments) writes the replaced formulas as text", async () => {
    const fake = new FakeExcel();
    const formulas = [["label", "value"], ["-L20", "=RHEO.WALLSTRESS(A2,1,20)"], ["=not a formula", 3]];
    const values = [["label", "value"], ["-L20", 12.5], ["=not a formula", 3]];
    fake.addSheet("Lab", { formulas, values, rowIndex: 0, columnIndex: 0 });
    const done = await copySheetAsValues(fake.batch, "Lab", () => false);
    expect(done.keeper).toBe("list");
    const listed = formulaLikeCells(fake, "Lab values", "values");
    expect(listed.map((f) => f.value)).toEqual(["=RHEO.WALLSTRESS(A2,1,20)"]);
    expect(listed.filter((f) => f.format !== "@")).toEqual([]);
    // text cells of the copied range that read like formulas get the Text format before the grid is written back
    const formats = fake.formats("Lab values");
    expect(formats.get("A2")).toBe("@");
    expect(formats.get("A3")).toBe("@");
  });

  test("valuesCopyGrid names the text cells that read like formulas, for every leading character", () => {
    const f = [HOSTILE.map((h) => h), ["ok", "=RHEO.FLOWRATE(A1,B1)"]];
    const v = [HOSTILE.map((h) => h), ["ok", "-3 (text result)"]];
    const { text } = valuesCopyGrid(f, v);
    expect(text).toEqual([...HOSTILE.map((_, col) => ({ row: 0, col })), { row: 1, col: 1 }]);
  });
});

describe("copy as values", () => {
  const formulas = [
    ["rate [1/s]", "stress [kPa]", "double"],
    [10, "=RHEO.WALLSTRESS(A2,1,20)", "=B2*2"],
    [20, "=_xldudf_RHEO.WALLSTRESS(A3,1,20)", "=B3*2"],
  ];
  const values = [
    ["rate [1/s]", "stress [kPa]", "double"],
    [10, 12.5, 25],
    [20, 17.25, 34.5],
  ];

  test("valuesCopyGrid replaces only the add-in's formulas and reports where they were", () => {
    const { grid, replaced } = valuesCopyGrid(formulas, values);
    expect(grid).toEqual([
      ["rate [1/s]", "stress [kPa]", "double"],
      [10, 12.5, "=B2*2"],
      [20, 17.25, "=B3*2"],
    ]);
    expect(replaced.map((r) => [r.row, r.col])).toEqual([
      [1, 1],
      [2, 1],
    ]);
  });

  test("copySheetAsValues writes a new sheet and keeps each formula in a note (ExcelApi 1.18)", async () => {
    const fake = new FakeExcel();
    fake.addSheet("Lab", { formulas, values, rowIndex: 2, columnIndex: 1 });
    const done = await copySheetAsValues(fake.batch, "Lab", () => true);
    expect(done).toEqual({ name: "Lab values", replaced: 2, keeper: "notes" });
    const cells = fake.written("Lab values", "formulas");
    expect(cells.get("C4")).toBe(12.5);
    expect(cells.get("D4")).toBe("=B2*2");
    expect(fake.sheet("Lab values").notes).toEqual([
      { address: "C4", text: "Value of the Rheoledger formula =RHEO.WALLSTRESS(A2,1,20)" },
      { address: "C5", text: "Value of the Rheoledger formula =_xldudf_RHEO.WALLSTRESS(A3,1,20)" },
    ]);
    expect(fake.sheet("Lab").ranges).toEqual([]);
  });

  test("without notes (ExcelApi 1.10 only) the formulas go to comments", async () => {
    const fake = new FakeExcel();
    fake.addSheet("Lab", { formulas, values, rowIndex: 0, columnIndex: 0 });
    const done = await copySheetAsValues(fake.batch, "Lab", (v) => Number(v.split(".")[1]) <= 10);
    expect(done.keeper).toBe("comments");
    expect(fake.comments.map((c) => c.address)).toEqual(["'Lab values'!B2", "'Lab values'!B3"]);
  });

  test("a failure while copying removes the half-made copy", async () => {
    const fake = new FakeExcel({ failAtSync: 2 });
    fake.addSheet("Lab", { formulas, values, rowIndex: 0, columnIndex: 0 });
    await expect(copySheetAsValues(fake.batch, "Lab", () => true)).rejects.toThrow(/sync failed/);
    expect(fake.names()).toEqual(["Lab"]);
  });
});

describe("writeNewSheet(batch, base, makePlan): the plan and lot-check sheets", () => {
  const csv = (f: string) => parseCsv(readFileSync(join(__dirname, `../workbooks/${f}`), "utf8")).lines.map((l) => l.cells);
  const lot = runLotCheck({ kind: "cells", cells: csv("demo-lot-new.csv"), label: "Lot!A1:B8" }, { kind: "table", cells: csv("demo-lot-reference.csv"), label: "Ref!A1:B8" }, "10");
  const planned = runPlanner(plannerFormFromSettings(JSON.parse(readFileSync(join(__dirname, "../workbooks/demo-plan.json"), "utf8"))));
  const lotPlan = (name: string) => buildLotPlan(lot, { ...META, name });
  const planPlan = (name: string) => buildPlannerPlan(planned, { ...META, name });

  test("the lot check goes to a new uniquely named sheet; PASS/FAIL formats sit on the status column", async () => {
    const fake = withData();
    fake.addSheet("Rheo lot check");
    const name = await writeNewSheet(fake.batch, SHEET_BASE_NAMES.lot, lotPlan);
    expect(name).toBe("Rheo lot check 2");
    expect(fake.names()).toEqual(["Data", "Rheo results", "Rheo lot check", "Rheo lot check 2"]);
    expect(fake.sheet("Rheo lot check").ranges).toEqual([]);
    const plan = lotPlan(name);
    const status = plan.conditionalFormats?.[0];
    const formats = fake.sheet(name).conditionalFormats;
    expect(formats.filter((f) => f.address === conditionalFormatAddress(plan, status as never)).map((f) => [f.type, f.format.textComparison.rule?.operator, f.format.textComparison.rule?.text])).toEqual([
      ["ContainsText", "Contains", "FAIL"],
      ["ContainsText", "Contains", "PASS"],
      ["ContainsText", "Contains", "NOT COMPARED"],
    ]);
    // the formatted cells hold the status words
    const cells = fake.written(name);
    const [start] = conditionalFormatAddress(plan, status as never).split(":");
    expect(["PASS", "FAIL", "NOT COMPARED"]).toContain(cells.get(start as string));
    expect(formats.find((f) => f.format.textComparison.rule?.text === "FAIL")?.format.textComparison.format.fill.color).toBe("#F6D4D0");
  });

  test("the lot chart is an XY chart with the reference, both band edges and the lot, read from the sheet", async () => {
    const fake = withData();
    const name = await writeNewSheet(fake.batch, SHEET_BASE_NAMES.lot, lotPlan);
    const plan = lotPlan(name);
    const [chart] = fake.sheet(name).charts;
    expect(chart?.type).toBe("XYScatter");
    expect(chart?.series.map((x) => x.mock.name)).toEqual(["reference", "reference −10 %", "reference +10 %", "lot"]);
    chart?.series.forEach((x, i) => {
      const want = seriesAddresses(plan, plan.charts[0]?.series[i] as never);
      expect([x.x, x.y]).toEqual([want.x, want.y]);
    });
    expect(chart?.series[1]?.mock.format.line.lineStyle).toBe("Dash");
    expect(chart?.series[3]?.mock.markerStyle).toBe("Circle");
    expect(chart?.mock.axes.valueAxis.logBase).toBe(10);
  });

  test("the plan goes to a new \"Rheo plan\" sheet with its out-of-range steps formatted", async () => {
    const fake = withData();
    const name = await writeNewSheet(fake.batch, SHEET_BASE_NAMES.plan, planPlan);
    expect(name).toBe("Rheo plan");
    const plan = planPlan(name);
    const formats = fake.sheet(name).conditionalFormats;
    expect(formats.map((f) => f.format.textComparison.rule?.text)).toEqual(["OVER FULL SCALE", "HIGH", "LOW", "NO"]);
    expect(formats[0]?.address).toBe(conditionalFormatAddress(plan, plan.conditionalFormats?.[0] as never));
    expect(fake.sheet(name).charts).toEqual([]);
  });

  test("a failing chart or sync leaves no new sheet behind", async () => {
    const fake = withData({ failAtChart: 1 });
    await expect(writeNewSheet(fake.batch, SHEET_BASE_NAMES.lot, lotPlan)).rejects.toThrow(/chart could not be created/);
    expect(fake.names()).toEqual(["Data", "Rheo results"]);
    const again = withData({ failAtSync: 2 });
    await expect(writeNewSheet(again.batch, SHEET_BASE_NAMES.plan, planPlan)).rejects.toThrow(/sync failed/);
    expect(again.names()).toEqual(["Data", "Rheo results"]);
  });
});
