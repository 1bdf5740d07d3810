/**
 * The settings, JSON keys and result tables of the secondary corrections: slit edge correction,
 * Cogswell's shear rate, the uncertainty budget's tolerances, WLF's glass transition temperature and
 * the vertical shift. Unit factors: NIST SP 811 (2008) appendix B (1 bar = 1e5 Pa, 1 mm = 1e-3 m).
 */
import { readFileSync } from "fs";
import path from "path";
import { CLI_SETTINGS_SOURCE, KEYED_SETTINGS_SOURCE, readReduceSettings } from "../src/io/reduceOptions";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import { runReduction } from "../src/core/run";
import { resultTables } from "../src/io/resultTables";
import { main } from "../src/cli/main";
import { expectClose } from "./helpers/expectClose";

const DEMO = path.join(__dirname, "..", "workbooks", "demo-film-grade.csv");

describe("reduce settings of the secondary corrections", () => {
  test("the budget's tolerances read as SI on the command line and from keyed settings (bare numbers in display units)", () => {
    const cli = readReduceSettings(
      { transducer: "700 bar, 0.25 %", transducerZeroOffset: "0.5 bar", transducerGainError: "0.1 %", dieBoreTolerance: "7 um", dieLengthTolerance: "0.02 mm", meltTemperatureTolerance: "0.5 K", pistonSpeedTolerance: "0.2 %" },
      CLI_SETTINGS_SOURCE,
    );
    const keyed = readReduceSettings(
      { transducerFullScale: 700, transducerAccuracy: 0.25, transducerZeroOffset: 0.5, transducerGainError: 0.1, dieBoreTolerance: 0.007, dieLengthTolerance: 0.02, meltTemperatureTolerance: 0.5, pistonSpeedTolerance: 0.2 },
      KEYED_SETTINGS_SOURCE,
    );
    for (const r of [cli, keyed]) {
      const u = r.options.uncertainty!;
      expectClose(u.zeroOffset as number, 0.5e5, { rel: 1e-12 });
      expectClose(u.gainError as number, 0.001, { rel: 1e-12 });
      expectClose(u.dieBoreTolerance as number, 7e-6, { rel: 1e-12 });
      expectClose(u.dieLengthTolerance as number, 2e-5, { rel: 1e-12 });
      expectClose(u.meltTemperatureTolerance as number, 0.5, { rel: 1e-12 });
      expectClose(u.pistonSpeedTolerance as number, 0.002, { rel: 1e-12 });
    }
    expect(() => readReduceSettings({ dieBoreTolerance: "-5 um" }, CLI_SETTINGS_SOURCE)).toThrow(/^--bore-tolerance: is a tolerance \(±\) and must be zero or more/);
  });
  test("slit edge correction, Cogswell's shear rate (with --extensional only)", () => {
    expect(readReduceSettings({ slitEdgeCorrection: true }, CLI_SETTINGS_SOURCE).options.slitEdgeCorrection).toBe(true);
    expect(readReduceSettings({ extensional: true, cogswellShearRate: "wall" }, CLI_SETTINGS_SOURCE).options.extensional).toEqual({ shearRate: "wall" });
    expect(() => readReduceSettings({ cogswellShearRate: "wall" }, CLI_SETTINGS_SOURCE)).toThrow(/^--cogswell-rate: sets the shear rate of the extensional analysis; give --extensional too/);
    expect(() => readReduceSettings({ extensional: true, cogswellShearRate: "true" }, CLI_SETTINGS_SOURCE)).toThrow(/^--cogswell-rate: unknown choice "true"; accepted: apparent, wall/);
  });
  test("WLF glass transition temperature and the vertical shift belong to the shift", () => {
    const r = readReduceSettings({ shift: "wlf", referenceTemperature: "210 C", glassTransitionTemperature: "100 C", verticalShift: "7e-4 1/K" }, CLI_SETTINGS_SOURCE);
    expectClose(r.fits.shift!.glassTransitionTemperature as number, 373.15, { rel: 1e-12 });
    expectClose(r.fits.shift!.verticalShift!.thermalExpansion, 7e-4, { rel: 1e-12 });
    expect(() => readReduceSettings({ shift: "arrhenius", referenceTemperature: "210 C", glassTransitionTemperature: "100 C" }, CLI_SETTINGS_SOURCE)).toThrow(/^--tg: is used by the WLF shift only/);
    expect(() => readReduceSettings({ glassTransitionTemperature: "100 C" }, CLI_SETTINGS_SOURCE)).toThrow(/^--tg: belongs to the temperature shift; give --shift too/);
  });
});

function demoRun() {
  const csv = parseCsv(readFileSync(DEMO, "utf8"));
  const raw = readRawTable(csv.lines.map((l) => l.cells), { rowWord: "line", rowNumbers: csv.lines.map((l) => l.line), headerNumber: 1, decimalMark: csv.delimiter === "," ? "." : undefined });
  return runReduction(
    raw.measurements,
    { representativeRate: true, extensional: true, pressureDependence: true, transducer: { fullScale: 7e7, accuracy: 0.0025 }, heating: { density: 760, heatCapacity: 2300, conductivity: 0.25 } },
    { shift: { law: "arrhenius", referenceTemperature: 483.15, verticalShift: { thermalExpansion: 7e-4 } } },
    raw.warnings,
  );
}

describe("result tables of the secondary corrections (demo film grade)", () => {
  const run = demoRun();
  const tables = resultTables(run);
  test("the uncertainty budget table: contributions in % of η, u_c their root sum of squares, U = 2·u_c", () => {
    const t = tables.find((x) => x.id === "uncertaintyBudget")!;
    const keys = t.columns.map((c) => c.key);
    expect(keys).toEqual(expect.arrayContaining(["zero", "gain", "scatter", "dieBore", "dieLength", "pistonSpeed", "temperature", "combined", "expanded"]));
    const at = (row: (string | number | boolean | null)[], key: string) => row[keys.indexOf(key)] as number;
    for (const row of t.rows) {
      const rss = Math.sqrt(["zero", "gain", "scatter", "dieBore", "dieLength", "pistonSpeed", "temperature"].reduce((s, k) => s + at(row, k) ** 2, 0));
      expectClose(at(row, "combined"), rss, { rel: 1e-9 });
      expectClose(at(row, "expanded"), 2 * rss, { rel: 1e-9 });
    }
  });
  test("heating, pressure dependence, extensional and shift tables carry the new columns", () => {
    const cols = (id: string) => tables.find((x) => x.id === id)!.columns.map((c) => c.key);
    expect(cols("heating")).toEqual(expect.arrayContaining(["nahmeGriffithNumber", "brinkmanNumber", "graetzNumber"]));
    expect(cols("pressureDependence")).toEqual(expect.arrayContaining(["pressureCoefficientConstantStress", "pressureCoefficientConstantRate", "nPrime", "significant"]));
    expect(cols("extensional")).toEqual(expect.arrayContaining(["shearRate", "shearRateApparent"]));
    expect(cols("flowCurve")).toEqual(expect.arrayContaining(["representativeExpectedDeviation", "representativeDeviationCorrected"]));
    const shift = tables.find((x) => x.id === "shift")!;
    expect(shift.columns.map((c) => c.key)).toEqual(["temperature", "aT", "bT"]);
    expect(shift.notes!.join(" ")).toMatch(/Vertical shift bT/);
  });
});

describe("rheoledger reduce --json: additive keys", () => {
  async function run(args: string[]) {
    let stdout = "";
    const code = await main(["reduce", DEMO, ...args], { stdout: (s) => (stdout += s), stderr: () => undefined, readFile: (p) => readFileSync(p, "utf8") });
    return { code, json: JSON.parse(stdout) };
  }
  test("uncertaintyBudget per group, the representative bias, Cogswell's basis, the heating numbers; old keys kept", async () => {
    const { code, json } = await run(["--json", "--transducer", "700 bar, 0.25 %", "--representative", "--extensional", "--heating", "density=0.76 g/cm3, cp=2.3 kJ/(kg.K), k=0.25 W/(m.K)", "--bore-tolerance", "0.01 mm"]);
    expect(code).toBe(0);
    const g = json.groups[0];
    expect(g.uncertaintyBudget).toHaveLength(g.flowCurve.length);
    expect(g.uncertaintyBudget[0].contributions.map((c: { source: string }) => c.source)).toContain("dieBore");
    expect(g.flowCurve[0]).toEqual(expect.objectContaining({ viscosityUncertainty: g.uncertaintyBudget[0].expanded.viscosity, representativeExpectedDeviation: expect.any(Number) }));
    // γ̇* of the middle points lies inside the Rabinowitsch curve: deviation and corrected deviation exist
    expect(g.flowCurve[4]).toEqual(expect.objectContaining({ representativeDeviation: expect.any(Number), representativeDeviationCorrected: expect.any(Number) }));
    expect(g.extensional[0]).toEqual(expect.objectContaining({ shearRateBasis: "apparent", troutonRatio: expect.any(Number) }));
    expect(g.heating.rows[0]).toEqual(expect.objectContaining({ nahmeNumber: expect.any(Number), nahmeGriffithNumber: expect.any(Number), graetzNumber: expect.any(Number) }));
  });
});

import { equationsUsed } from "../src/io/methodEquations";
import { reduce, type Measurement } from "../src/core/reduce";

describe("equationsUsed(inputs): the method record follows the geometry", () => {
  // Newtonian slit data (plane Poiseuille: ΔP = 12μQL/(WH³)) with a constant entrance loss
  const slit: Measurement[] = [10e-3, 20e-3, 40e-3].flatMap((L) =>
    [10, 100].map((rate) => {
      const Q = (rate * 10e-3 * 1e-6) / 6;
      return { slitWidth: 10e-3, slitHeight: 1e-3, dieLength: L, flowRate: Q, pressure: 2e5 + (12 * 500 * Q * L) / (10e-3 * 1e-9) };
    }),
  );
  test("a slit run states the slit formulas, not the round ones; the edge correction when applied", () => {
    const result = reduce(slit, { slitEdgeCorrection: true });
    const eq = equationsUsed({ result, endCorrection: "bagley", rabinowitschMethod: "transition", flowSource: "flow_rate", fittedModels: [], shiftLaw: null });
    const formulas = eq.map((l) => l[1]).join(" | ");
    expect(formulas).toContain("γ̇_a = 6Q/(W·H²)");
    expect(formulas).toContain("τ_app = ΔP·H/(2L)");
    expect(formulas).toContain("γ̇_w = γ̇_a·(2n' + 1)/(3n')");
    expect(formulas).not.toContain("32Q/(π·D³)");
    expect(eq.map((l) => l[0])).toContain("Slit edge correction");
  });
  test("a round run states the round formulas only", () => {
    const result = reduce(slit.map(({ slitWidth: _w, slitHeight: _h, ...m }) => ({ ...m, dieDiameter: 1e-3 })));
    const formulas = equationsUsed({ result, endCorrection: "bagley", rabinowitschMethod: "transition", flowSource: null, fittedModels: [], shiftLaw: null }).map((l) => l[1]).join(" | ");
    expect(formulas).toContain("32Q/(π·D³)");
    expect(formulas).not.toContain("6Q/(W·H²)");
  });
  test("fits: the verdict's rule with fitted models; the fit across temperatures and the rotational join when used", () => {
    const result = reduce(slit.map(({ slitWidth: _w, slitHeight: _h, ...m }) => ({ ...m, dieDiameter: 1e-3 })));
    const base = { result, endCorrection: "bagley" as const, rabinowitschMethod: "transition", flowSource: null, shiftLaw: null };
    const steps = (eq: ReturnType<typeof equationsUsed>) => eq.map((l) => l[0]);
    expect(steps(equationsUsed({ ...base, fittedModels: [] }))).not.toContain("Recommended model");
    const fitted = equationsUsed({ ...base, fittedModels: ["cross"], master: { model: "cross", law: "arrhenius" }, joined: { kind: "oscillatory" } });
    expect(steps(fitted)).toEqual(expect.arrayContaining(["Model cross", "Recommended model", "Fit across temperatures", "Rotational data joined"]));
    const line = (step: string) => fitted.find((l) => l[0] === step) as [string, string, string];
    expect(line("Fit across temperatures")[1]).toContain("a_T = exp[(Ea/R)(1/T − 1/T_ref)]");
    expect(line("Rotational data joined")[1]).toMatch(/^Cox–Merz rule/);
    expect(line("Rotational data joined")[2]).toBe("Cox & Merz, J. Polym. Sci. 28 (1958) 619");
    const crossWlf = equationsUsed({ ...base, fittedModels: [], master: { model: "cross-wlf", law: null }, joined: { kind: "steady" } });
    expect(crossWlf.find((l) => l[0] === "Fit across temperatures")?.[2]).toMatch(/^Hieber & Shen/);
    expect(crossWlf.find((l) => l[0] === "Rotational data joined")?.[1]).not.toMatch(/Cox–Merz/);
  });
});
