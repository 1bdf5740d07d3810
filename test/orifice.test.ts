import { reduce, Measurement } from "../src/core/reduce";
import { compareEntrancePressures, isOrificeDie, orificeCorrection, orificeEntrancePressure, orificeLandCorrection, shortestOrificeDie, DEFAULT_ORIFICE_OPTIONS } from "../src/core/orifice";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

/**
 * Newtonian liquid (Hagen–Poiseuille: τ_w = μγ̇_a, ΔP_die = 4τ_w L/D) with an entrance loss that
 * grows as a power of the rate, ΔP_ent = c·γ̇^0.5. An orifice die of length ~0 reads ΔP_ent alone
 * (Bagley 1957; ISO 11443, from memory), so both end corrections must recover τ_w = μγ̇ exactly.
 */
const MU = 500;
const D = 1e-3;
const entrance = (rate: number) => 2e5 * Math.sqrt(rate);
function die(L: number, rates: number[], extra = (_rate: number) => 0): Measurement[] {
  return rates.map((rate) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: entrance(rate) + extra(rate) + (4 * MU * rate * L) / D }));
}
const RATES = [10, 30, 100, 300, 1000];

describe("orifice core functions", () => {
  test("isOrificeDie: L/D below 1 by default", () => {
    expect(DEFAULT_ORIFICE_OPTIONS.maxLengthOverDiameter).toBe(1);
    expect(isOrificeDie(0.25e-3, 1e-3)).toBe(true);
    expect(isOrificeDie(0, 1e-3)).toBe(true);
    expect(isOrificeDie(1e-3, 1e-3)).toBe(false);
    expect(() => isOrificeDie(-1, 1e-3)).toThrow(/dieLength: must be zero or more/);
  });
  test("orificeEntrancePressure interpolates log–log and never extrapolates", () => {
    expectClose(orificeEntrancePressure([10, 1000], [1e5, 1e7], 100) as number, 1e6, { rel: 1e-12 });
    expect(orificeEntrancePressure([10, 1000], [1e5, 1e7], 2000)).toBeUndefined();
    expect(() => orificeEntrancePressure([10, 1000], [1e5], 100)).toThrow(/orificePressure: has 1 values/);
  });
  test("orificeCorrection: τ = (ΔP − ΔP_orifice)·D/(4L), exact on Newtonian data", () => {
    const long = die(20e-3, RATES);
    const r = orificeCorrection(
      { dieDiameter: D, dieLength: 20e-3, shearRateApparent: RATES, pressure: long.map((m) => m.pressure) },
      { shearRateApparent: RATES, pressure: RATES.map(entrance) },
    );
    r.rows.forEach((row) => {
      expectClose(row.wallShearStress, MU * row.shearRateApparent, { rel: 1e-12 });
      expect(row.interpolated).toBe(false);
    });
    expect(r.warnings).toEqual([]);
  });
  test("ORIFICE_RATE_OUTSIDE and ORIFICE_PRESSURE_TOO_HIGH drop points with a warning; none left is an error", () => {
    const r = orificeCorrection(
      { dieDiameter: D, dieLength: 20e-3, shearRateApparent: [5, 50, 100], pressure: [1e6, 1e3, 2e7] },
      { shearRateApparent: [10, 200], pressure: [1e5, 2e6] },
    );
    expect(r.warnings.map((w) => w.code)).toEqual(["ORIFICE_RATE_OUTSIDE", "ORIFICE_PRESSURE_TOO_HIGH"]);
    expect(r.rows.map((x) => x.shearRateApparent)).toEqual([100]);
    expect(() => orificeCorrection({ dieDiameter: D, dieLength: 20e-3, shearRateApparent: [5000], pressure: [1e7] }, { shearRateApparent: [10, 200], pressure: [1e5, 2e6] })).toThrow(
      /orificePressure: no long-die point lies within/,
    );
  });
  test("compareEntrancePressures: ORIFICE_BAGLEY_DISAGREE above 20 % (common practice)", () => {
    const ok = compareEntrancePressures([10, 100], [1.1e5, 1e6], [1e5, 1e6]);
    expect(ok.warnings).toEqual([]);
    expectClose(ok.difference[0] as number, 0.1, { rel: 1e-12 });
    const bad = compareEntrancePressures([10, 100], [1.5e5, null], [1e5, 1e6]);
    expect(bad.warnings.map((w) => w.code)).toEqual(["ORIFICE_BAGLEY_DISAGREE"]);
    expect(bad.difference[1]).toBeNull();
  });
});

/**
 * The orifice's own land: Bagley's line through two dies (Bagley 1957), ΔP = ΔP_ent + 2τ_w·L/R for
 * both the long die and the orifice, so τ_w = (ΔP_long − ΔP_o)/(2(x_long − x_o)) and
 * ΔP_ent = ΔP_o − 2τ_w·x_o. Ignoring a land of L/D 0.9 on a 10 mm long, 1 mm die biases τ_w low by
 * L_o/L = 9 % (the figure of the review that asked for the change).
 */
describe("orifice land subtraction", () => {
  test("orificeLandCorrection(10.5e6, 20, 1.4e6, 1.8): τ_w = 2.5e5 Pa, ΔP_ent = 0.5e6 Pa (by hand)", () => {
    const r = orificeLandCorrection(10.5e6, 20, 1.4e6, 1.8);
    // @check orifice | two-die Bagley line: τ_w = ΔΔP/(2Δx) and ΔP_ent = ΔP_o − 2τ_w·x_o by hand | Bagley, J. Appl. Phys. 28 (1957) 624 | rel 1e-15 | 2
    expectClose(r.wallShearStress, 9.1e6 / 36.4, { rel: 1e-15 });
    expectClose(r.entrancePressure, 1.4e6 - 2 * (9.1e6 / 36.4) * 1.8, { rel: 1e-15 });
    expect(() => orificeLandCorrection(1e7, 20, 1e6, 20)).toThrow(/orificeLengthOverRadius: must be below the long die's \(20\)/);
    expect(() => orificeLandCorrection(1e7, 20, 1e6, -1)).toThrow(/orificeLengthOverRadius: must be zero or more/);
  });
  test("orificeCorrection with a 0.9 mm land on a 10 mm die: exact τ_w (the land-blind value is 9 % low)", () => {
    const long = die(10e-3, RATES);
    const orifice = die(0.9e-3, RATES);
    const r = orificeCorrection(
      { dieDiameter: D, dieLength: 10e-3, shearRateApparent: RATES, pressure: long.map((m) => m.pressure) },
      { shearRateApparent: RATES, pressure: orifice.map((m) => m.pressure), dieLength: 0.9e-3 },
    );
    r.rows.forEach((row) => {
// @check orifice | L/D 0.9 orifice on Hagen–Poiseuille data: τ_w = μγ̇, the entrance loss and the orifice reading exact at 5 rates | Hagen–Poiseuille; Bagley, J. Appl. Phys. 28 (1957) 624 | rel 1e-12 | 15
      expectClose(row.wallShearStress, MU * row.shearRateApparent, { rel: 1e-12 });
      expectClose(row.entrancePressureOrifice, entrance(row.shearRateApparent), { rel: 1e-12 });
      expectClose(row.orificePressure, entrance(row.shearRateApparent) + 4 * MU * row.shearRateApparent * 0.9, { rel: 1e-12 });
    });
    const blind = orificeCorrection(
      { dieDiameter: D, dieLength: 10e-3, shearRateApparent: RATES, pressure: long.map((m) => m.pressure) },
      { shearRateApparent: RATES, pressure: orifice.map((m) => m.pressure) },
    );
// @check orifice | ignoring the land biases τ_w by −L_o/L (−9 %) at 5 rates | Hagen–Poiseuille; Bagley, J. Appl. Phys. 28 (1957) 624 | rel 1e-12 | 5
    blind.rows.forEach((row) => expectClose(row.wallShearStress / (MU * row.shearRateApparent), 1 - 0.9 / 10, { rel: 1e-12 }));
    expect(() => orificeCorrection({ dieDiameter: D, dieLength: 10e-3, shearRateApparent: [10], pressure: [1e7] }, { shearRateApparent: [10], pressure: [1e6], dieLength: 10e-3 })).toThrow(/orificeLength: must be shorter than the long die/);
  });
  test("shortestOrificeDie keeps the shortest orifice and names the others", () => {
    const pts = [...die(0.5e-3, [100, 10]), ...die(0.2e-3, [30, 3])].map((m) => ({ dieLength: m.dieLength, shearRateApparent: m.flowRate }));
    const s = shortestOrificeDie(pts)!;
    expect(s.dieLength).toBe(0.2e-3);
    expect(s.points.map((p) => p.dieLength)).toEqual([0.2e-3, 0.2e-3]);
    expect(s.points[0]!.shearRateApparent).toBeLessThan(s.points[1]!.shearRateApparent);
    expect(s.otherLengths).toEqual([0.5e-3]);
    expect(shortestOrificeDie([])).toBeNull();
  });
  const data = [...die(10e-3, RATES), ...die(20e-3, RATES), ...die(30e-3, RATES), ...die(0.9e-3, RATES)];
  test("reduce, Bagley: the orifice's entrance pressure is its reading less 2τ_w·x_o and agrees with Bagley's", () => {
    const r = reduce(data);
    const e = r.groups[0]!.entrancePressures!;
    e.forEach((x) => {
      expectClose(x.entrancePressureOrifice as number, entrance(x.shearRateApparent), { rel: 1e-9 });
      expectClose(x.difference as number, 0, { abs: 1e-9 });
    });
    expect(r.warnings.map((w) => w.code)).not.toContain("ORIFICE_BAGLEY_DISAGREE");
  });
  test("reduce, orifice: τ_w = μγ̇ exactly; Cogswell gets the land-free entrance pressure", () => {
    const r = reduce(data, { endCorrection: "orifice", extensional: true });
    const g = r.groups[0]!;
    g.flowCurve.forEach((f) => expectClose(f.wallShearStress, MU * f.shearRateApparent, { rel: 1e-12 }));
// @check orifice, reduceGroup | through reduce with the orifice correction: τ_w = μγ̇ and the land-free entrance loss handed to Cogswell, 5 rates | Hagen–Poiseuille; Bagley, J. Appl. Phys. 28 (1957) 624 | rel 1e-12 | 10
    g.extensional!.forEach((x) => expectClose(x.entrancePressure, entrance(x.shearRateApparent), { rel: 1e-12 }));
  });
  test("reduce, none: the entrance pressure handed to Cogswell pairs the longest die with the orifice", () => {
    const r = reduce(data, { endCorrection: "none", extensional: true });
    r.groups[0]!.extensional!.forEach((x) => expectClose(x.entrancePressure, entrance(x.shearRateApparent), { rel: 1e-12 }));
  });
  test("ORIFICE_BAGLEY_DISAGREE names the land as a possible cause", () => {
    const off = [...die(10e-3, RATES), ...die(20e-3, RATES), ...die(0.9e-3, RATES, (rate) => entrance(rate))];
    const w = reduce(off).warnings.find((x) => x.code === "ORIFICE_BAGLEY_DISAGREE")!;
    expect(w.message).toMatch(/orifice's own land \(L\/D = 0\.9/);
  });
});

describe("reduce() with an orifice die", () => {
  // orifice run at rates between the long dies' rates: its pressure is interpolated
  const orificeRates = [8, 20, 60, 200, 600, 1200];
  const data = [...die(10e-3, RATES), ...die(20e-3, RATES), ...die(30e-3, RATES), ...die(1e-6, orificeRates)];

  test("default (Bagley): the orifice die stays off the Bagley line; both entrance pressures side by side", () => {
    const r = reduce(data);
    const g = r.groups[0]!;
    expect(g.dies.filter((d) => d.orifice).map((d) => d.dieLength)).toEqual([1e-6]);
    g.bagley.forEach((b) => {
      expect(b.diesUsed).toBe(3);
      expectClose(b.entrancePressure, entrance(b.shearRateApparent), { rel: 1e-9 });
    });
    expect(r.warnings.map((w) => w.code)).toContain("ORIFICE_DIE_NOT_ON_BAGLEY");
    const e = g.entrancePressures!;
    expect(e).toHaveLength(RATES.length);
    e.forEach((x, i) => {
      expectClose(x.shearRateApparent, RATES[i] as number, { rel: 1e-12 });
      expectClose(x.entrancePressure as number, entrance(x.shearRateApparent), { rel: 1e-9 });
      // √rate is a straight line in log–log; the orifice's own 1 µm land (4μγ̇·L/D, up to 3.2e-4 of
      // its reading) bends it slightly, so the log–log interpolation is good to ~1e-6, and the land
      // is subtracted with the Bagley τ_w
      expectClose(x.entrancePressureOrifice as number, entrance(x.shearRateApparent), { rel: 1e-5 });
      expectClose(x.orificePressure as number, entrance(x.shearRateApparent) + (4 * MU * x.shearRateApparent * 1e-6) / D, { rel: 1e-5 });
    });
  });

  test("endCorrection orifice: τ_w = μγ̇ from the longest die minus the orifice; Bagley still reported", () => {
    const r = reduce(data, { endCorrection: "orifice" });
    const g = r.groups[0]!;
    expect(g.bagley.length).toBe(RATES.length);
    g.flowCurve.forEach((f) => {
      expectClose(f.wallShearStress, MU * f.shearRateApparent, { rel: 1e-3 });
      expectClose(f.viscosity as number, MU, { rel: 2e-3 });
    });
    expect(r.warnings.map((w) => w.code)).not.toContain("ORIFICE_DIE_NOT_ON_BAGLEY");
  });

  test("ORIFICE_BAGLEY_DISAGREE when the orifice reads a different entrance loss", () => {
    const off = [...die(10e-3, RATES), ...die(20e-3, RATES), ...die(1e-6, RATES, (rate) => entrance(rate))];
    const r = reduce(off);
    expect(r.warnings.map((w) => w.code)).toContain("ORIFICE_BAGLEY_DISAGREE");
    r.groups[0]!.entrancePressures!.forEach((x) => expectClose(x.difference as number, -0.5, { rel: 1e-3 }));
  });

  test("orifice with a single long die; errors without an orifice die or without a long die", () => {
    const r = reduce([...die(20e-3, RATES), ...die(0.2e-3, RATES)], { endCorrection: "orifice" });
    expect(r.groups[0]!.bagley).toEqual([]);
    expect(r.groups[0]!.entrancePressures!.map((x) => x.entrancePressure)).toEqual(RATES.map(() => null));
    expect(() => reduce(die(20e-3, RATES), { endCorrection: "orifice" })).toThrow(/has no orifice die/);
    expect(() => reduce(die(0.2e-3, RATES))).toThrow(/has only orifice dies/);
    expect(() => reduce(die(20e-3, RATES), { endCorrection: "bogus" as "none" })).toThrow(/accepted: bagley, none, orifice/);
  });

  test("orifice.maxLengthOverDiameter moves the threshold", () => {
    const r = reduce([...die(10e-3, RATES), ...die(20e-3, RATES), ...die(2e-3, RATES)], { orifice: { maxLengthOverDiameter: 3 } });
    expect(r.groups[0]!.dies.filter((d) => d.orifice).map((d) => d.dieLength)).toEqual([2e-3]);
  });
});
