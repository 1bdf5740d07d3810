/**
 * The pane's fit settings (material class, fit across temperatures, rotational join, WLF's glass
 * transition temperature, vertical shift, slit edge correction, repeat stability limit): each field reaches the reduce
 * request through the shared reader in SI (NIST SP 811: T/K = t/°C + 273.15), each error goes to
 * its field in the words of its label, and a run on the demo data shows the core's master fit and
 * join. The demo data are generated (scripts/demo/filmGrade.ts) from a Carreau–Yasuda law with
 * η0 = 6000 Pa·s at 210 °C and Ea = 55 kJ/mol: the fit across temperatures and the join must find
 * those again (invented data with a known truth, as in test/cli-master.test.ts).
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { RheoError } from "../src/core/errors";
import { defaultModels } from "../src/core/flowCurveFits";
import { evaluateModel } from "../src/core/models";
import { modelName } from "../src/io/displayNames";
import { runReduction as coreRunReduction } from "../src/core/run";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import { readRotationalTable } from "../src/io/rotationalTable";
import { REDUCE_SETTING_WORDS } from "../src/io/reduceSettingWords";
import { detectColumns } from "../src/taskpane/columns";
import { buildWorkbookPlan } from "../src/taskpane/plan";
import { fieldOfError, runReduction, toFieldError, type RunOutput } from "../src/taskpane/runReduction";
import { DEFAULT_PANE_SETTINGS, PANE_MODELS, paneDefaultModels, readPaneSettings, settingLabel, type PaneSettings } from "../src/taskpane/settings";
import { findBlock } from "../src/taskpane/sheetPlan";
import { applicability } from "../src/taskpane/panels/reduce/applicability";
import { joinedCard, masterFitCard } from "../src/taskpane/panels/reduce/fitCards";
import { resultsHtml } from "../src/taskpane/panels/reduce/resultsView";
import { FILM_GRADE, filmGradeViscosity } from "../scripts/demo/filmGrade";
import { expectClose } from "./helpers/expectClose";

const demo = parseCsv(readFileSync(join(__dirname, "../workbooks/demo-film-grade.csv"), "utf8")).lines.map((l) => l.cells);
// the pane's preview joins this committed file (src/taskpane/panels/reduce/demoRotational.ts includes it at build time)
const demoRotationalCells = () => parseCsv(readFileSync(join(__dirname, "../workbooks/demo-film-grade-rotational.csv"), "utf8")).lines.map((l) => l.cells);
const DEMO_ROTATIONAL_LABEL = "demo-film-grade-rotational.csv";
const META = { version: "0.0.0-test", date: "2025-01-02 03:04", names: { results: "Rheo results", method: "Rheo method" } };
const input = { cells: demo, columns: detectColumns(demo[0] ?? []), dies: [], sourceLabel: "Data!A1:F82" };
const K = 273.15; // NIST SP 811 §4.2.1.1: T/K = t/°C + 273.15
const settings = (s: Partial<PaneSettings>): PaneSettings => ({ ...DEFAULT_PANE_SETTINGS, ...s });

describe("fit settings → the reduce request (the shared reader)", () => {
  test("the material class goes to fits.material, and the default model list is the core's for that class", () => {
    expect(readPaneSettings(settings({ material: "paste" })).request.fits.material).toBe("paste");
    expect(readPaneSettings(DEFAULT_PANE_SETTINGS).request.fits.material).toBe("melt");
    expect(DEFAULT_PANE_SETTINGS.models).toEqual(defaultModels("melt").filter((m) => PANE_MODELS.includes(m)));
    expect(paneDefaultModels("paste")).toEqual(expect.arrayContaining(["herschel-bulkley", "bingham", "casson"]));
    expect(paneDefaultModels("melt")).not.toContain("herschel-bulkley");
  });

  test("the fit across temperatures takes the shift's law and reference temperature (°C → K)", () => {
    const { request, problems } = readPaneSettings(settings({ masterModel: "carreau-yasuda", temperatureShift: "arrhenius", referenceTemperatureC: 210 }));
    expect(problems).toEqual([]);
    expect(request.fits.master?.model).toBe("carreau-yasuda");
    expect(request.fits.master?.law).toBe("arrhenius");
    expectClose(request.fits.master?.referenceTemperature as number, 210 + K, { rel: 1e-12 });
    // without a reference temperature: null (the middle temperature of the data)
    expect(readPaneSettings(settings({ masterModel: "cross", temperatureShift: "wlf" })).request.fits.master).toEqual({ model: "cross", law: "wlf", referenceTemperature: null });
  });

  test("Cross-WLF needs no shift; its D2 is optional and read in °C", () => {
    expect(readPaneSettings(settings({ masterModel: "cross-wlf" })).request.fits.master).toEqual({ model: "cross-wlf", law: null, referenceTemperature: null });
    const d2 = readPaneSettings(settings({ masterModel: "cross-wlf", crossWlfD2C: -20 })).request.fits.master?.D2 as number;
    expectClose(d2, -20 + K, { rel: 1e-12 });
    // D2 belongs to Cross-WLF only: with another model the form does not send it
    expect(readPaneSettings(settings({ masterModel: "cross", temperatureShift: "arrhenius", crossWlfD2C: -20 })).request.fits.master?.D2).toBeUndefined();
  });

  test("glass transition temperature (WLF only) and vertical shift go to the shift", () => {
    const { request, problems } = readPaneSettings(settings({ temperatureShift: "wlf", glassTransitionTemperatureC: -30, verticalShiftPerK: 7e-4 }));
    expect(problems).toEqual([]);
    expectClose(request.fits.shift?.glassTransitionTemperature as number, -30 + K, { rel: 1e-12 });
    expect(request.fits.shift?.verticalShift).toEqual({ thermalExpansion: 7e-4 });
    // with Arrhenius the glass transition temperature is not used (its field is disabled with a reason)
    expect(readPaneSettings(settings({ temperatureShift: "arrhenius", glassTransitionTemperatureC: -30 })).request.fits.shift?.glassTransitionTemperature).toBeUndefined();
    // without a shift neither is sent
    expect(readPaneSettings(settings({ glassTransitionTemperatureC: -30, verticalShiftPerK: 7e-4 })).request.fits.shift).toBeUndefined();
  });

  test("slit edge correction and the rotational range", () => {
    expect(readPaneSettings(settings({ slitEdgeCorrection: true })).request.options.slitEdgeCorrection).toBe(true);
    expect(readPaneSettings(DEFAULT_PANE_SETTINGS).request.options.slitEdgeCorrection).toBeUndefined();
    expect(readPaneSettings(settings({ rotational: "Rotational!A1:B20" })).request.input.rotational).toBe("Rotational!A1:B20");
    expect(readPaneSettings(settings({ rotational: null })).request.input.rotational).toBeUndefined();
  });

  test("the repeat stability limit is read in % (3 → 0.03); empty leaves the core's default", () => {
    const { request, problems } = readPaneSettings(settings({ stabilityThresholdPercent: 3 }));
    expect(problems).toEqual([]);
    expectClose(request.options.repeats?.stabilityThreshold as number, 0.03, { rel: 1e-12 });
    expect(readPaneSettings(DEFAULT_PANE_SETTINGS).request.options.repeats).toBeUndefined();
  });

  test("each field's label is the shared label of its setting, with the unit a bare number is read in", () => {
    expect(settingLabel("glassTransitionTemperatureC")).toBe(`${REDUCE_SETTING_WORDS.glassTransitionTemperature?.label} [°C]`);
    expect(settingLabel("verticalShiftPerK")).toBe(`${REDUCE_SETTING_WORDS.verticalShift?.label} [1/K]`);
    expect(settingLabel("crossWlfD2C")).toBe(`${REDUCE_SETTING_WORDS.crossWlfD2?.label} [°C]`);
    expect(settingLabel("masterModel")).toBe(REDUCE_SETTING_WORDS.master?.label);
    expect(settingLabel("material")).toBe(REDUCE_SETTING_WORDS.material?.label);
    expect(settingLabel("stabilityThresholdPercent")).toBe(`${REDUCE_SETTING_WORDS.stabilityThreshold?.label} [%]`);
  });
});

describe("fit settings: errors go to their field, in the label's words", () => {
  test("a fit across temperatures that needs a law without one marks the temperature shift, naming the setting by its label", () => {
    const { problems } = readPaneSettings(settings({ masterModel: "carreau" }));
    expect(problems.map((p) => p.field)).toEqual(["temperatureShift"]);
    expect(problems[0]?.message).toContain("“Fit across temperatures”");
    expect(problems[0]?.message).not.toMatch(/\bmaster\b|--/);
  });

  test("text or out-of-range numbers mark their own fields, all at once", () => {
    const { problems } = readPaneSettings(settings({ temperatureShift: "wlf", masterModel: "cross-wlf", glassTransitionTemperatureC: NaN, verticalShiftPerK: -1e-4, crossWlfD2C: -300 }));
    expect(problems.map((p) => p.field).sort()).toEqual(["crossWlfD2C", "glassTransitionTemperatureC", "verticalShiftPerK"]);
    for (const p of problems) expect(p.message).not.toMatch(/crossWlfD2|glassTransitionTemperature|verticalShift\b/);
  });

  test("a repeat stability limit of 100 % or more, or text, marks its field", () => {
    expect(readPaneSettings(settings({ stabilityThresholdPercent: 100 })).problems).toEqual([{ field: "stabilityThresholdPercent", message: "Must be below 100 %, got 100 %." }]);
    expect(readPaneSettings(settings({ stabilityThresholdPercent: NaN })).problems.map((p) => p.field)).toEqual(["stabilityThresholdPercent"]);
    expect(readPaneSettings(settings({ stabilityThresholdPercent: -2 })).problems.map((p) => p.field)).toEqual(["stabilityThresholdPercent"]);
  });

  test("core and reader errors of the new settings map to their fields by argument", () => {
    expect(fieldOfError(new RheoError("value", "master", "any words"))).toBe("masterModel");
    expect(fieldOfError(new RheoError("value", "crossWlfD2", "any words"))).toBe("crossWlfD2C");
    expect(fieldOfError(new RheoError("value", "glassTransitionTemperature", "any words"))).toBe("glassTransitionTemperatureC");
    expect(fieldOfError(new RheoError("value", "verticalShift", "any words"))).toBe("verticalShiftPerK");
    expect(fieldOfError(new RheoError("value", "slitEdgeCorrection", "any words"))).toBe("slitEdgeCorrection");
    expect(fieldOfError(new RheoError("value", "material", "any words"))).toBe("material");
    // the rotational table's columns and cells go to the rotational field, not to the data source
    expect(fieldOfError(new RheoError("value", "rotational column 2", "any words"))).toBe("rotational");
    expect(fieldOfError(new RheoError("value", "rotational complex_viscosity [Pa.s] (column 2)", "row 4 is text", 4))).toBe("rotational");
  });

  test("a bad rotational table is reported at the rotational field with its column", async () => {
    const bad = [["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], [0.1, 5000], [1, "n/a"]];
    const e = await runReduction({ ...input, rotational: { cells: bad, label: "R!A1:B3" } }, settings({ rotational: "R!A1:B3" })).catch((x: unknown) => x);
    expect((e as { problems: { field: string; message: string }[] }).problems).toEqual([{ field: "rotational", message: expect.stringMatching(/^Complex_viscosity \[Pa\.s\] \(column 2\): row 3 is text "n\/a", not a number\.$/) }]);
    const noUnits = toFieldError(new RheoError("missing", "rotational", 'needs "angular_frequency [rad/s]" with "complex_viscosity [Pa.s]"'));
    expect(noUnits.problems).toEqual([{ field: "rotational", message: 'Needs "angular_frequency [rad/s]" with "complex_viscosity [Pa.s]".' }]);
  });
});

describe("what the data allow", () => {
  const measurements = readRawTable(demo).measurements;
  test("three temperatures: the fit across temperatures and Cross-WLF apply; no slit die: no edge correction", () => {
    const a = applicability(measurements);
    expect(a.master.ok).toBe(true);
    expect(a.crossWlf.ok).toBe(true);
    expect(a.slitEdgeCorrection).toEqual({ ok: false, reason: "needs a slit die; the data have round dies only" });
  });
  test("one temperature: neither fit across temperatures; two: Cross-WLF not (three constants in η0(T))", () => {
    const at = (temps: string[]) => readRawTable(demo.filter((r, i) => i === 0 || temps.includes(String(r[0])))).measurements;
    expect(applicability(at(["190"])).master.ok).toBe(false);
    expect(applicability(at(["190", "210"])).master.ok).toBe(true);
    expect(applicability(at(["190", "210"])).crossWlf.reason).toMatch(/three or more temperatures; the data have 2/);
  });
});

describe("the demo rotational curve", () => {
  test("is the committed demo file the command line joins (workbooks/demo-film-grade-rotational.csv), read by the shared reader", () => {
    const { curve } = readRotationalTable(demoRotationalCells());
    expect(curve.kind).toBe("oscillatory");
    expectClose(curve.temperature as number, FILM_GRADE.referenceTemperature, { rel: 1e-12 }, "210 °C in K");
    // Cox–Merz (Cox & Merz 1958): |η*|(ω) = η(γ̇ = ω) of the generating law, within the file's 1 % noise (4 σ)
    const eta = filmGradeViscosity(FILM_GRADE.referenceTemperature);
    curve.rate.forEach((w, i) => expectClose(curve.viscosity[i] as number, eta(w), { rel: 0.04 }, `|η*| at ${w} rad/s`));
  });
});

describe("a run with the fit across temperatures and the demo rotational join", () => {
  let run: RunOutput;
  const s = settings({ masterModel: "carreau-yasuda", temperatureShift: "arrhenius", referenceTemperatureC: 210, rotational: DEMO_ROTATIONAL_LABEL });
  beforeAll(async () => {
    run = await runReduction({ ...input, rotational: { cells: demoRotationalCells(), label: DEMO_ROTATIONAL_LABEL } }, s);
  }, 60_000);

  test("is the core's run on the same request (nothing recomputed in the pane)", () => {
    const raw = readRawTable(demo);
    const { request } = readPaneSettings(s);
    const core = coreRunReduction(raw.measurements, request.options, { ...request.fits, compare: s.models, rotational: readRotationalTable(demoRotationalCells()).curve });
    expect(run.master?.parameters).toEqual(core.master?.parameters);
    expect(run.master?.activationEnergy).toBe(core.master?.activationEnergy);
    expect(run.joined?.join.overlap).toEqual(core.joined?.join.overlap);
  });

  test("the fit across temperatures finds the generator's truth: Ea within 2 %, n within 3 %; η0 beyond the capillary rates is a lower bound below the truth (scripts/demo/filmGrade.ts)", () => {
    const m = run.master;
    expect(m?.converged).toBe(true);
    expectClose(m?.activationEnergy as number, FILM_GRADE.activationEnergy, { rel: 0.02 }, "Ea");
    expectClose(m?.parameters.n as number, FILM_GRADE.n, { rel: 0.03 }, "n");
    // the demo's capillary rates never reach the plateau: η0 is not determined, and the bound the data support holds the truth
    const u = m?.undetermined.eta0;
    expect(u?.outsideData).toBe(true);
    expect(u?.bound?.side).toBe("lower");
    expect(u?.bound?.value).toBeLessThanOrEqual(FILM_GRADE.eta0);
  });

  test("the join overlaps within the tolerance (both curves from one law) and the joined fit finds η0 within 3 %", () => {
    const j = run.joined;
    expect(j?.join.overlap?.withinTolerance).toBe(true);
    expectClose(j?.join.overlap?.ratio as number, 1, { rel: 0.05 }, "overlap ratio rotational/capillary");
    expect(j?.fits.verdict.recommended).not.toBeNull();
    const fit = j?.fits.verdict.fit;
    if (fit && "eta0" in fit.parameters) expectClose(fit.parameters.eta0 as number, FILM_GRADE.eta0, { rel: 0.03 }, "η0 of the joined curve");
    else throw new Error(`the joined curve's recommended model ${String(fit?.model)} has no η0`);
  });

  test("the master card shows the model, the law, Ea in kJ/mol with its standard error, and what the data do not determine", () => {
    const html = masterFitCard(run);
    const text = html.replace(/<[^>]+>/g, " ");
    expect(text).toContain("Carreau–Yasuda × Arrhenius");
    const ea = /Ea \[kJ\/mol\]\s+([\d.]+) ± ([\d.e-]+)/.exec(text);
    expect(ea).not.toBeNull();
    expectClose(Number(ea?.[1]), (run.master?.activationEnergy as number) / 1e3, { rel: 6e-4 }, "Ea shown (4 digits)");
    expectClose(Number(ea?.[2]), (run.master?.standardErrors.activationEnergy as number) / 1e3, { rel: 6e-4 }, "SE of Ea shown");
    expect(text).toMatch(/n\s+[\d.]+ ± [\d.e-]+/);
    // η0 and λ lie beyond the capillary rates: shown as the bound the data support, and listed as not determined
    expect(text).toMatch(/η₀ \[Pa·s\]\s+≥ [\d.]+ \(not determined by the data\)/);
    expect(text).toMatch(/Not determined by the data\s+η₀: ≥ [\d.]+ Pa·s \(not determined by the data\); λ: ≥ [\d.]+ s/);
  });

  test("the join card shows the overlap ratio, the tolerance and the joined curve's verdict", () => {
    const text = joinedCard(run).replace(/<[^>]+>/g, " ").replace(/&#39;/g, "'");
    const ratio = /rotational\/capillary ([\d.]+)/.exec(text);
    expectClose(Number(ratio?.[1]), run.joined?.join.overlap?.ratio as number, { rel: 6e-4 }, "ratio shown");
    expect(text).toMatch(/Within tolerance\s+yes \(± 15 %\)/);
    expect(text).toMatch(/Joined curve's verdict\s+Carreau–Yasuda \(well determined\): η₀ = [\d.]+ Pa·s ± /);
  });

  test("the results sheet holds the shared tables of the master fit and the join, with their notes", () => {
    const plan = buildWorkbookPlan(run, META);
    const master = findBlock(plan.results, "masterfit");
    const eaRow = master.rows.find((r) => r[0] === "Ea");
    expectClose(eaRow?.[2] as number, run.master?.activationEnergy as number, { rel: 1e-12 }, "Ea on the sheet (SI, J/mol)");
    expect(master.keyColumns?.map((c) => master.header?.[c])).toEqual(["Parameter", "Unit (SI)", "Value", "Determined by the data"]);
    expect(findBlock(plan.results, "masterfit-notes").rows[0]?.[0]).toMatch(/Carreau–Yasuda × Arrhenius/);
    expect(findBlock(plan.results, "masterfit-factors").rows).toHaveLength(3);
    expect(findBlock(plan.results, "rotational-join-notes").rows.map((r) => r[0]).join(" ")).toMatch(/Overlap .* rotational\/capillary .* within the tolerance/);
    const settingsRows = findBlock(plan.method, "method-settings").rows.map((r) => r[0]);
    expect(settingsRows).toEqual(expect.arrayContaining(["Material class", "Fit across temperatures", "Rotational data", "Glass transition temperature", "Vertical shift (melt expansion)", "Slit edge correction", "Repeat stability limit"]));
    // and the pane shows both cards beside the groups'
    const html = resultsHtml(run, plan, null);
    expect(html).toContain('data-card="masterfit"');
    expect(html).toContain('data-card="rotational"');
  });

  test("the results sheet and the pane draw the joined curve: both data sets as the join holds them, and the joined curve's recommended model through them", () => {
    const plan = buildWorkbookPlan(run, META);
    const j = run.joined as NonNullable<RunOutput["joined"]>;
    const chart = plan.results.charts.find((c) => c.id === "rotational");
    expect(chart?.xLog && chart?.yLog).toBe(true);
    expect(chart?.series.map((x) => [x.name, x.style])).toEqual([
      ["capillary data", "markers"],
      ["rotational data", "markers"],
      [`${modelName(j.fits.verdict.recommended as string)} (recommended)`, "line"],
    ]);
    const data = findBlock(plan.results, chart?.series[0]?.blockId as string);
    const rowsOf = (k: number) => {
      const sr = chart?.series[k] as NonNullable<typeof chart>["series"][number];
      return data.rows.slice(sr.firstRow, sr.firstRow + sr.rowCount);
    };
    for (const [k, source] of [[0, "capillary"], [1, "rotational"]] as const) {
      const expected = j.join.shearRate.map((rate, i) => [source, rate, j.join.viscosity[i]]).filter((_, i) => j.join.source[i] === source);
      expect(rowsOf(k)).toEqual(expected);
    }
    // the model line spans the joined rates and is the recommended fit evaluated there
    const line = rowsOf(2);
    expect(line[0]?.[1]).toBeCloseTo(Math.min(...j.join.shearRate), 10);
    expect(line[line.length - 1]?.[1]).toBeCloseTo(Math.max(...j.join.shearRate), 6);
    const fit = j.fits.verdict.fit as NonNullable<typeof j.fits.verdict.fit>;
    const eta = evaluateModel(fit.model, fit.parameters, line.map((r) => r[1] as number));
    line.forEach((r, i) => expectClose(r[2] as number, eta[i] as number, { rel: 1e-12 }, `model line at ${String(r[1])} 1/s`));
    // and the line passes through the joined data (the demo's curves come from one law)
    j.join.shearRate.forEach((rate, i) => expectClose(evaluateModel(fit.model, fit.parameters, [rate])[0] as number, j.join.viscosity[i] as number, { rel: 0.1 }, `joined point at ${rate} 1/s`));
    expect(resultsHtml(run, plan, null)).toContain("Rotational and capillary viscosity joined");
  });
});
