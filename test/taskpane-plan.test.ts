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
import { fieldOfError, runReduction, toFieldError } from "../src/taskpane/runReduction";
import { PaneFieldError } from "../src/taskpane/panelContract";
import { recommendedFit } from "../src/taskpane/recommendedFit";
import { groupLabel } from "../src/core/grouping";
import { modelName } from "../src/io/displayNames";
import { DEFAULT_PANE_SETTINGS, parseNumberField, readPaneSettings, validateSettings } from "../src/taskpane/settings";
import { a1, blockLayout, columnLetters, findBlock, seriesPoints } from "../src/taskpane/sheetPlan";
import { compareLot } from "../src/core/lotComparison";
import { planTest } from "../src/core/planner";
import { readPlanOptions } from "../src/io/planOptions";
import { planStepTable } from "../src/io/planTables";
import { buildLotPlan, runLotCheck } from "../src/taskpane/panels/lot/check";
import { plannerFormFromSettings } from "../src/taskpane/panels/planner/form";
import { buildPlannerPlan, readTransducerLines, runPlanner } from "../src/taskpane/panels/planner/plan";
import { matchingRule } from "../src/taskpane/sheetPlan";
import { expectClose } from "./helpers/expectClose";

const demo = parseCsv(readFileSync(join(__dirname, "../workbooks/demo-film-grade.csv"), "utf8")).lines.map((l) => l.cells);
const META = { version: "0.0.0-test", date: "2025-01-02T03:04:05.000Z", names: { results: "Rheo results", method: "Rheo method" } };

describe("settings", () => {
  test("validateSettings(DEFAULT_PANE_SETTINGS) finds nothing wrong", () => {
    expect(validateSettings(DEFAULT_PANE_SETTINGS)).toEqual([]);
  });
  test("validateSettings names the field of each bad value", () => {
    const bad = validateSettings({ ...DEFAULT_PANE_SETTINGS, rabinowitschMethod: "local", rabinowitschDegree: 3, rabinowitschWindow: 4, transducerRangeBar: -5 });
    expect([...new Set(bad.map((e) => e.field))].sort()).toEqual(["rabinowitschDegree", "rabinowitschWindow", "transducerRangeBar"]);
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
    // the slip check's need of two bores marks the slip box, whatever the wording
    expect(fieldOfError(new RheoError("missing", "dieDiameter", "any words at all"))).toBe("slip");
    // a row of the data goes to the source, by the error's row field
    expect(fieldOfError(new RheoError("domain", "pressure", "must be greater than zero", 7))).toBe("source");
  });
  test("the message next to a field is the error's detail (the label names the field), with its row", () => {
    const e = toFieldError(new RheoError("domain", "fullScale", "must be greater than zero, got -3"));
    expect(e.problems).toEqual([{ field: "transducerRangeBar", message: "Must be greater than zero, got -3." }]);
    expect(toFieldError(new RheoError("domain", "pressure", "must be greater than zero", 7)).problems[0]?.message).toBe("Row 7: must be greater than zero.");
  });
  test("several invalid settings are reported together, each at its field", () => {
    const problems = validateSettings({ ...DEFAULT_PANE_SETTINGS, rabinowitschMethod: "local", rabinowitschWindow: 4, transducerRangeBar: -1, heating: true, heatingDensity: null, heatingHeatCapacity: 2, heatingConductivity: 0.2 });
    expect(problems.map((p) => p.field).sort()).toEqual(["heatingDensity", "rabinowitschWindow", "transducerRangeBar"]);
    expect(new PaneFieldError(problems).problems).toHaveLength(3);
  });
  test("runReduction with one die length and Bagley fails on the end-correction field", async () => {
    const oneDie = demo.filter((r, i) => i === 0 || r[2] === "10");
    await expect(runReduction({ cells: oneDie, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "x" }, { ...DEFAULT_PANE_SETTINGS, models: [] })).rejects.toMatchObject({ field: "endCorrection" });
    await expect(runReduction({ cells: oneDie, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "x" }, { ...DEFAULT_PANE_SETTINGS, models: [] })).rejects.toBeInstanceOf(PaneFieldError);
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

  test("the viscosity chart shows each group's points and its best model by default, every model on request", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const chart = plan.charts.find((c) => c.id === "viscosity");
    const groupsFitted = run.fits.filter((f) => f.curves.length > 0).length;
    expect(chart?.series).toHaveLength(run.result.groups.length + groupsFitted);
    run.fits.forEach((f, i) => {
      const rec = recommendedFit(f)?.fit.model as string;
      const label = groupLabel(run.result.groups[i] as never);
      const points = chart?.series.find((x) => x.name === label && x.style === "markers");
      expect(chart?.series.filter((x) => x.name === `${label}, ${modelName(rec)} (recommended)` && x.colour === points?.colour)).toHaveLength(1);
    });
    // a chosen model replaces the best one: still one curve per fitted group, in the group's colour, never two series alike
    const chosen = buildWorkbookPlan({ ...run, settings: { ...run.settings, chartModel: "cross" } }, META).results.charts.find((c) => c.id === "viscosity");
    expect(chosen?.series).toHaveLength(run.result.groups.length + groupsFitted);
    expect(chosen?.series.filter((x) => x.style !== "markers").every((x) => x.name.includes("Cross"))).toBe(true);
    const looks = (chosen?.series ?? []).map((x) => `${x.colour}|${x.style}|${x.marker ?? ""}`);
    expect(new Set(looks).size).toBe(looks.length);
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

describe("optional checks and the temperature shift", () => {
  const ALL = {
    ...DEFAULT_PANE_SETTINGS,
    models: ["power-law" as const],
    transducerRangeBar: 1000,
    transducerAccuracyPercent: 0.25,
    representativeRate: true,
    extensional: true,
    pressureDependence: true,
    heating: true,
    heatingDensity: 0.75,
    heatingHeatCapacity: 2.1,
    heatingConductivity: 0.18,
    heatingTemperatureCoefficient: null,
    temperatureShift: "arrhenius" as const,
    referenceTemperatureC: null,
  };
  let run: Awaited<ReturnType<typeof runReduction>>;
  beforeAll(async () => {
    run = await runReduction({ cells: demo, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "Data!A1:F82" }, ALL);
  });

  test("validateSettings checks every new field and names it", () => {
    expect(validateSettings(ALL)).toEqual([]);
    const bad = validateSettings({ ...ALL, transducerAccuracyPercent: null, heatingDensity: 0, heatingHeatCapacity: null, heatingConductivity: NaN, heatingTemperatureCoefficient: -1, temperatureShift: "vft" as never, referenceTemperatureC: -300 });
    expect([...new Set(bad.map((e) => e.field))].sort()).toEqual(["heatingConductivity", "heatingDensity", "heatingHeatCapacity", "heatingTemperatureCoefficient", "referenceTemperatureC", "temperatureShift", "transducerAccuracyPercent"]);
    // heating data are not asked for while heating is off
    expect(validateSettings({ ...DEFAULT_PANE_SETTINGS, heatingDensity: null })).toEqual([]);
  });

  test("the pane's settings go through the shared reader, bare numbers in the display units (NIST SP 811: 1 bar = 1e5 Pa, 1 g/cm3 = 1000 kg/m3)", () => {
    const { request, problems } = readPaneSettings(ALL);
    expect(problems).toEqual([]);
    const o = request.options;
    expect(o.transducer).toEqual({ fullScale: 1000e5, accuracy: 0.0025 });
    expectClose(o.heating?.density as number, 750, { rel: 1e-12 });
    expectClose(o.heating?.heatCapacity as number, 2100, { rel: 1e-12 });
    expect(o.heating?.temperatureCoefficient).toBeUndefined();
    expect(readPaneSettings(DEFAULT_PANE_SETTINGS).request.options).toEqual({ endCorrection: "bagley", rabinowitsch: expect.any(Object) });
  });

  test("the transducer check is the core's (one warning list, no copy of its own)", () => {
    expect(run.warnings.map((w) => w.code)).toContain("TRANSDUCER_LOW_READING");
    expect(run.warnings.filter((w) => w.code === "TRANSDUCER_LOW_READING")).toHaveLength(run.result.groups.length);
    expect(run.warnings.map((w) => w.code)).not.toContain("TRANSDUCER_LOW_RANGE");
  });

  test("± stress without end correction: the core budget's U (k = 2), whose zero-offset part is k·u_P·D/(4L), u_P = a·FS/√3 (JCGM 100:2008 §4.3.7)", async () => {
    const none = await runReduction({ cells: demo, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "x" }, { ...DEFAULT_PANE_SETTINGS, models: [], endCorrection: "none", transducerRangeBar: 1000, transducerAccuracyPercent: 0.25 });
    const plan = buildWorkbookPlan(none, META).results;
    const flow = findBlock(plan, "flow-1");
    const col = (flow.header ?? []).indexOf("± wall shear stress [kPa]");
    expect(col).toBe(7);
    const uP = (0.0025 * 1000e5) / Math.sqrt(3);
    const budget = none.result.groups[0]!.uncertaintyBudget!;
    flow.rows.forEach((row, i) => {
      expectClose(row[col] as number, budget[i]!.expanded.wallShearStress / 1e3, { rel: 1e-9 });
      // on a single die the zero offset does not cancel: its share is u_P·D/(4L) (D = 1 mm, longest L = 30 mm)
      expectClose(budget[i]!.contributions.find((c) => c.source === "zero")!.wallShearStress, uP / (4 * 30), { rel: 1e-9 });
    });
  });

  test("the Schümmer column places τ_w/γ̇_a at (π/4)·γ̇_a (Schümmer & Worthoff 1978)", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const flow = findBlock(plan, "flow-1");
    const h = flow.header ?? [];
    const rate = h.indexOf("Schümmer shear rate [1/s]");
    const visc = h.indexOf("Schümmer viscosity [Pa·s]");
    expect(rate).toBeGreaterThan(0);
    flow.rows.forEach((r) => {
      expectClose(r[rate] as number, (Math.PI / 4) * (r[0] as number), { rel: 1e-12 });
      expectClose(r[visc] as number, ((r[1] as number) * 1e3) / (r[0] as number), { rel: 1e-12 });
    });
  });

  test("the extensional, heating and pressure-dependence tables copy the core's rows", () => {
    const plan = buildWorkbookPlan(run, META).results;
    run.result.groups.forEach((g, i) => {
      const ext = findBlock(plan, `extensional-${i + 1}`);
      expect(ext.rows).toHaveLength(g.extensional?.length ?? -1);
      g.extensional?.forEach((e, r) => expect(ext.rows[r]?.[4]).toBe(e.extensionalViscosity));
      const heat = findBlock(plan, `heating-${i + 1}`);
      // adiabatic rise ΔT = ΔP/(ρ·c_p) (Macosko 1994, ch. 6, from memory), from the pressure the table shows
      heat.rows.forEach((r) => expectClose(r[2] as number, ((r[1] as number) * 1e5) / (750 * 2100), { rel: 1e-9 }));
      expect(findBlock(plan, `pressure-${i + 1}`).title).toMatch(/median β/);
    });
  });

  test("the shift block gives the core's Ea and aT = exp[(Ea/R)(1/T − 1/Tref)] per temperature (Arrhenius; R = 8.314462618 J/(mol·K), CODATA 2018)", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const shift = run.shift;
    if (!shift || shift.fit.law !== "arrhenius") throw new Error("no Arrhenius shift");
    const constants = findBlock(plan, "shift").rows;
    expect(constants.find((r) => r[0] === "activation energy Ea [kJ/mol]")?.[1]).toBe(shift.fit.activationEnergy / 1e3);
    expect(constants.find((r) => r[0] === "reference temperature [°C]")?.[1]).toBeCloseTo(210, 9); // middle of 190, 210, 230 °C
    const factors = findBlock(plan, "shift-factors").rows;
    expect(factors.map((r) => r[0])).toEqual([190, 210, 230].map((t) => expect.closeTo(t, 9)));
    for (const r of factors) {
      const T = (r[0] as number) + 273.15;
      expectClose(r[1] as number, Math.exp((shift.fit.activationEnergy / 8.314462618) * (1 / T - 1 / 483.15)), { rel: 1e-9 });
    }
    const master = plan.charts.find((c) => c.id === "master");
    expect(master?.series).toHaveLength(3);
    expect(master?.series.reduce((n, x) => n + seriesPoints(plan, x).length, 0)).toBe(run.result.groups.reduce((n, g) => n + g.flowCurve.filter((f) => f.viscosity !== null).length, 0));
  });

  test("with wide tables the charts move right of them and the chart data right of the charts", () => {
    const plan = buildWorkbookPlan(run, META).results;
    const tableRight = Math.max(...plan.blocks.filter((b) => b.role !== "chartData" && b.col === 0).map((b) => blockLayout(b).width));
    expect(tableRight).toBeGreaterThan(9);
    for (const c of plan.charts) expect(c.anchor.col).toBeGreaterThanOrEqual(tableRight);
    const dataLeft = Math.min(...plan.blocks.filter((b) => b.role === "chartData").map((b) => b.col));
    for (const c of plan.charts) expect(c.anchor.col + c.anchor.cols).toBeLessThanOrEqual(dataLeft);
  });

  test("the method record lists every new setting and the equations of the checks used", () => {
    const plan = buildWorkbookPlan(run, META).method;
    const settings = findBlock(plan, "method-settings").rows.map((r) => r[0]);
    expect(settings).toEqual(expect.arrayContaining(["Transducer accuracy", "Schümmer cross-check", "Wall slip (Mooney)", "Extensional viscosity (Cogswell)", "Pressure dependence (curved Bagley lines)", "Viscous heating", "Temperature shift", "Reference temperature", "Viscosity chart"]));
    const steps = findBlock(plan, "method-equations").rows.map((r) => r[0]);
    expect(steps).toEqual(expect.arrayContaining(["Uncertainty (± columns)", "Schümmer cross-check", "Extensional viscosity", "Viscous heating", "Pressure dependence", "Temperature shift", "Master curve"]));
  });

  test("errors of the new checks go next to their field", async () => {
    const input = { cells: demo, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "x" };
    await expect(runReduction(input, { ...DEFAULT_PANE_SETTINGS, models: [], slip: true })).rejects.toMatchObject({ field: "slip" });
    const one = demo.filter((r, i) => i === 0 || r[0] === "190");
    await expect(runReduction({ ...input, cells: one }, { ...DEFAULT_PANE_SETTINGS, models: [], temperatureShift: "wlf" })).rejects.toMatchObject({ field: "temperatureShift" });
    await expect(runReduction({ ...input, cells: one }, { ...DEFAULT_PANE_SETTINGS, models: [], endCorrection: "orifice" })).rejects.toMatchObject({ field: "endCorrection" });
  });
});

describe("planner panel", () => {
  const demoPlanJson = JSON.parse(readFileSync(join(__dirname, "../workbooks/demo-plan.json"), "utf8")) as Record<string, unknown>;
  const form = plannerFormFromSettings(demoPlanJson);

  test("the demo form holds the demo file's values in the panel's units", () => {
    expect(form.barrelDiameter).toBe("15");
    expect(form.timePerLoad).toBe("8");
    expect(form.dies.split("\n")).toEqual(["L20, capillary, 1, 20", "L10, capillary, 1, 10", "orifice, orifice, 1"]);
    expect(form.transducers.split("\n")[0]).toBe("P50, 50, 0.25");
    expect(form.prior).toBe("model");
  });

  test("runPlanner(form) plans exactly what the command line plans from the same file", () => {
    const pane = runPlanner(form).plan;
    const parsed = readPlanOptions(demoPlanJson);
    const cli = planTest(parsed.input, parsed.options);
    expect(pane.dies.map((d) => d.transducer.name)).toEqual(cli.dies.map((d) => d.transducer.name));
    pane.dies.forEach((d, i) => d.steps.forEach((st, k) => expectClose(st.pressure, cli.dies[i]?.steps[k]?.pressure as number, { rel: 1e-12 })));
    expectClose(pane.totalDuration, cli.totalDuration, { rel: 1e-12 });
  });

  test("the plan sheet holds the shared step table and flags out-of-range steps with conditional formats", () => {
    const out = runPlanner(form);
    const plan = buildPlannerPlan(out, { name: "Rheo plan", version: "0", date: META.date });
    const steps = findBlock(plan, "plan-steps");
    expect(steps.rows).toEqual(planStepTable(out.plan).rows);
    const rangeCol = (steps.header ?? []).indexOf("range");
    const cf = plan.conditionalFormats?.find((c) => c.column === rangeCol);
    expect(cf?.rowCount).toBe(steps.rows.length);
    // every step the core flags is coloured; "ok" steps are not
    out.plan.dies.flatMap((d) => d.steps).forEach((st, r) => expect(matchingRule(cf as never, steps.rows[r]?.[rangeCol] ?? null) !== null).toBe(st.flag !== "ok"));
  });

  test("with one small transducer the high steps are flagged OVER FULL SCALE, and only those are coloured", () => {
    const out = runPlanner({ ...form, transducers: "P50, 50, 0.25" });
    const plan = buildPlannerPlan(out, { name: "Rheo plan", version: "0", date: META.date });
    const steps = findBlock(plan, "plan-steps");
    const rangeCol = (steps.header ?? []).indexOf("range");
    const cf = plan.conditionalFormats?.find((c) => c.column === rangeCol);
    const all = out.plan.dies.flatMap((d) => d.steps);
    const over = all.filter((st) => st.flag === "over").length;
    expect(over).toBeGreaterThan(0);
    all.forEach((st, r) => expect(matchingRule(cf as never, steps.rows[r]?.[rangeCol] ?? null)?.tone ?? "none").toBe(st.flag === "over" ? "fail" : st.flag === "ok" ? "none" : "caution"));
    const html = sheetPlanHtml(plan);
    expect((html.match(/class="[^"]*\bflag flag-fail"/g) ?? []).length).toBeGreaterThanOrEqual(over);
  });

  test("bad planner input names its field", () => {
    expect(() => runPlanner({ ...form, dies: "L20, pipe, 1, 20" })).toThrow(expect.objectContaining({ field: "planDies" }));
    expect(() => runPlanner({ ...form, barrelDiameter: "" })).toThrow(expect.objectContaining({ field: "planBarrel" }));
    expect(() => runPlanner({ ...form, transducers: "P1, lots" })).toThrow(expect.objectContaining({ field: "planTransducers" }));
    expect(() => runPlanner({ ...form, prior: "power-law", powerLawK: "1e4", powerLawN: "" })).toThrow(expect.objectContaining({ field: "planN" }));
    expect(() => runPlanner({ ...form, priorParameters: "eta0=x" })).toThrow(expect.objectContaining({ field: "planParameters" }));
    expect(() => runPlanner({ ...form, shearRateMax: "2 bar" })).toThrow(expect.objectContaining({ field: "planRateMax" }));
  });

  test("a bare transducer accuracy is read as a percentage", () => {
    expect(readTransducerLines("P1, 200, 0.5")).toEqual([{ name: "P1", fullScale: "200", accuracy: "0.5 %" }]);
  });
});

describe("lot check panel", () => {
  const cells = (f: string) => parseCsv(readFileSync(join(__dirname, `../workbooks/${f}`), "utf8")).lines.map((l) => l.cells);
  const lot = { kind: "cells" as const, cells: cells("demo-lot-new.csv"), label: "lot" };
  const reference = { kind: "table" as const, cells: cells("demo-lot-reference.csv"), label: "ref" };

  test("runLotCheck gives the core's comparison of the demo lot", () => {
    const out = runLotCheck(lot, reference, "10");
    const core = compareLot({ kind: "table", shearRate: [20, 50, 100, 200, 500, 1000, 2000], viscosity: [2467, 1404, 913.9, 594.7, 337, 219.3, 142.7] }, { shearRate: [25, 60, 120, 250, 600, 1200, 2500], viscosity: [2238, 1317, 840.7, 512.7, 288.9, 182.1, 111.8] }, { tolerance: 0.1 });
    expect(out.comparison.points).toEqual(core.points);
    expect(out.comparison.verdict).toBe(core.verdict);
  });

  test("the lot sheet: verdict, per-rate table, PASS/FAIL formats on the status column, lot over the band", () => {
    const out = runLotCheck(lot, reference, "10");
    const plan = buildLotPlan(out, { name: "Rheo lot check", version: "0", date: META.date });
    const points = findBlock(plan, "lot-points");
    const status = (points.header ?? []).indexOf("status");
    const cf = plan.conditionalFormats?.find((c) => c.blockId === "lot-points");
    expect(cf?.column).toBe(status);
    expect(cf?.rules.map((r) => r.text)).toEqual(["FAIL", "PASS", "NOT COMPARED"]);
    out.comparison.points.forEach((p, r) => expect(matchingRule(cf as never, points.rows[r]?.[status] ?? null)?.tone).toBe(p.status === "pass" ? "pass" : p.status === "fail" ? "fail" : "caution"));
    expect(findBlock(plan, "lot-verdict").rows[0]).toEqual(["verdict", out.comparison.verdict === "pass" ? "PASS" : out.comparison.verdict === "fail" ? "FAIL" : "NOT COMPARED"]);
    const chart = plan.charts[0];
    expect(chart?.series.map((x) => x.name)).toEqual(["reference", "reference −10 %", "reference +10 %", "lot"]);
    const [refS, lowS, upS, lotS] = (chart?.series ?? []).map((x) => seriesPoints(plan, x));
    refS?.forEach((p, i) => {
      expectClose(lowS?.[i]?.y as number, p.y * 0.9, { rel: 1e-12 });
      expectClose(upS?.[i]?.y as number, p.y * 1.1, { rel: 1e-12 });
    });
    expect(lotS?.map((p) => p.x)).toEqual([25, 60, 120, 250, 600, 1200, 2500]);
    expect(chart?.xLog && chart.yLog).toBe(true);
  });

  test("a tight tolerance fails points, and errors name their field", () => {
    const out = runLotCheck(lot, reference, "1 %");
    expect(out.comparison.failed).toBeGreaterThan(0);
    expect(() => runLotCheck(lot, reference, "ten")).toThrow(expect.objectContaining({ field: "lotTolerance" }));
    expect(() => runLotCheck({ ...lot, cells: [["rate", "eta"], [1, 2]] }, reference, "10")).toThrow(expect.objectContaining({ field: "lotRange" }));
    expect(() => runLotCheck(lot, { kind: "model", model: "power-law", parameters: "K=abc", label: "m" }, "10")).toThrow(expect.objectContaining({ field: "refParameters" }));
    expect(() => runLotCheck(lot, { kind: "model", model: "", parameters: "K=1", label: "m" }, "10")).toThrow(expect.objectContaining({ field: "refModel" }));
  });
});
