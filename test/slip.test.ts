import { mooneyLine, mooneySlip, SlipCurve, DEFAULT_SLIP_OPTIONS } from "../src/core/slip";
import { reduce, Measurement } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

/**
 * Exact synthetic data with a known slip law (Mooney 1931; Macosko 1994, ch. 6, from memory): a power-law
 * liquid τ = K γ̇^n (no-slip apparent rate γ̇_a,ns = (4n/(3n+1))(τ/K)^(1/n), Macosko 1994, ch. 6, from memory)
 * slipping with v_s = α τ^m adds 8v_s/D to the apparent rate of a die of diameter D.
 * The stresses of every diameter are the analysis grid, so interpolation is exact.
 */
const K = 3000;
const n = 0.5;
const alpha = 1e-12;
const m = 2;
const slipVelocity = (tau: number) => alpha * tau ** m;
const noSlipApparent = (tau: number) => ((4 * n) / (3 * n + 1)) * Math.pow(tau / K, 1 / n);
const STRESSES = Array.from({ length: DEFAULT_SLIP_OPTIONS.stresses }, (_, k) => 2e4 * Math.pow(10, k / (DEFAULT_SLIP_OPTIONS.stresses - 1)));
function curve(D: number, slip = slipVelocity): SlipCurve {
  return { dieDiameter: D, wallShearStress: STRESSES, shearRateApparent: STRESSES.map((t) => noSlipApparent(t) + (8 * slip(t)) / D) };
}

describe("mooneyLine(dieDiameter, shearRateApparent)", () => {
  test("two diameters by hand: 180 and 140 1/s at D = 1 and 2 mm give v_s = 10 mm/s and 100 1/s", () => {
    // γ̇_a = γ̇_c + 4v_s/R (Mooney 1931): 180 = γ̇_c + 4v/0.5e-3 and 140 = γ̇_c + 4v/1e-3 give 4000v = 40, v = 0.01 m/s, γ̇_c = 100
    const r = mooneyLine([1e-3, 2e-3], [180, 140]);
    expectClose(r.slipVelocity, 0.01, { rel: 1e-12 });
    expectClose(r.shearRateApparentCorrected, 100, { rel: 1e-12 });
    expect(r.slipVelocityStandardError).toBe(0);
  });
  test("errors name the argument", () => {
    expect(() => mooneyLine([1e-3, 1e-3], [10, 20])).toThrow(/dieDiameter: the Mooney analysis needs at least two different die diameters/);
    expect(() => mooneyLine([1e-3, 2e-3], [10])).toThrow(/shearRateApparent: has 1 values/);
    expect(() => mooneyLine([1e-3, 0], [10, 20])).toThrow(/dieDiameter: row 2 must be greater than zero/);
  });
});

describe("mooneySlip(curves) on exact data with a known slip law", () => {
  const r = mooneySlip([curve(0.5e-3), curve(1e-3), curve(2e-3)]);
  test("recovers v_s = ατ^m and the no-slip apparent rate at every stress", () => {
    expect(r.rows).toHaveLength(STRESSES.length);
    r.rows.forEach((row) => {
      expectClose(row.slipVelocity, slipVelocity(row.wallShearStress), { rel: 1e-9 });
      expectClose(row.shearRateApparentCorrected, noSlipApparent(row.wallShearStress), { rel: 1e-9 });
      expectClose(row.r2, 1, { abs: 1e-12 });
    });
  });
  test("the Rabinowitsch correction of the slip-corrected curve gives the liquid's own viscosity", () => {
    r.rows.forEach((row) => {
      expectClose(row.nPrime as number, n, { rel: 1e-6 });
      const wall = Math.pow(row.wallShearStress / K, 1 / n);
      expectClose(row.shearRateWall as number, wall, { rel: 1e-6 });
      expectClose(row.viscosity as number, K * Math.pow(wall, n - 1), { rel: 1e-6 });
    });
    expect(r.warnings).toEqual([]);
  });
});

describe("mooneySlip warnings and errors", () => {
  test("SLIP_FEW_DIAMETERS with two diameters", () => {
    expect(mooneySlip([curve(1e-3), curve(2e-3)]).warnings.map((w) => w.code)).toEqual(["SLIP_FEW_DIAMETERS"]);
  });
  test("SLIP_NEGATIVE_VELOCITY when the small die flows slower; such stresses are never corrected with it", () => {
    const back = (t: number) => -0.2 * slipVelocity(t);
    const r = mooneySlip([curve(1e-3, back), curve(2e-3, back), curve(4e-3, back)]);
    expect(r.warnings.map((x) => x.code)).toContain("SLIP_NEGATIVE_VELOCITY");
    expect(r.warnings.find((x) => x.code === "SLIP_NEGATIVE_VELOCITY")!.message).toMatch(/left uncorrected \(v_s = 0\)/);
    expect(r.rows.length).toBe(STRESSES.length);
    r.rows.forEach((row) => {
      expect(row.slipApplied).toBe(false);
      expect(row.slipVelocity).toBeLessThan(0);
      // v_s = 0: the corrected rate is the diameters' mean rate, never the intercept above it
      const mean = row.shearRateApparentByDiameter.reduce((a, b) => a + b, 0) / 3;
      expectClose(row.shearRateApparentCorrected, mean, { rel: 1e-12 });
      expect(row.shearRateApparentCorrected).toBeLessThan(mooneyLine([1e-3, 2e-3, 4e-3], row.shearRateApparentByDiameter).shearRateApparentCorrected);
    });
    // the positive slip of the exact data is applied
    expect(mooneySlip([curve(1e-3), curve(2e-3), curve(4e-3)]).rows.every((row) => row.slipApplied)).toBe(true);
  });
  test("SLIP_LOW_R2 below 0.99 with three or more diameters (common practice, as for Bagley lines)", () => {
    expect(DEFAULT_SLIP_OPTIONS.minR2).toBe(0.99);
    // the middle bore's rate 8 % high: a bent Mooney line
    const bent = { ...curve(1e-3), shearRateApparent: curve(1e-3).shearRateApparent.map((g) => g * 1.08) };
    const r = mooneySlip([curve(0.5e-3), bent, curve(2e-3)]);
    const low = r.rows.filter((row) => row.r2 < 0.99);
    expect(low.length).toBeGreaterThan(0);
    expect(r.warnings.map((x) => x.code)).toContain("SLIP_LOW_R2");
    expect(r.warnings.find((x) => x.code === "SLIP_LOW_R2")!.message).toContain(`R² down to ${Math.min(...low.map((x) => x.r2)).toFixed(3)}`);
    expect(mooneySlip([curve(0.5e-3), curve(1e-3), curve(2e-3)]).warnings.map((x) => x.code)).not.toContain("SLIP_LOW_R2");
    expect(() => mooneySlip([curve(1e-3), curve(2e-3)], { minR2: 2 })).toThrow(/minR2: must be between 0 and 1/);
  });
  test("SLIP_CORRECTED_RATE_NONPOSITIVE when the lines extrapolate below zero", () => {
    const c1 = { dieDiameter: 1e-3, wallShearStress: STRESSES, shearRateApparent: STRESSES.map((t) => 100 * noSlipApparent(t)) };
    const c2 = { dieDiameter: 2e-3, wallShearStress: STRESSES, shearRateApparent: STRESSES.map((t) => 10 * noSlipApparent(t)) };
    const r = mooneySlip([c1, c2]);
    expect(r.warnings.map((x) => x.code)).toContain("SLIP_CORRECTED_RATE_NONPOSITIVE");
    expect(r.rows).toEqual([]);
  });
  test("SLIP_STRESS_OVERLAP_NARROW; no overlap is an error", () => {
    const a = curve(1e-3);
    const b = { ...curve(2e-3), wallShearStress: STRESSES.map((t) => t * 8) };
    expect(mooneySlip([a, b]).warnings.map((x) => x.code)).toContain("SLIP_STRESS_OVERLAP_NARROW");
    const c = { ...curve(2e-3), wallShearStress: STRESSES.map((t) => t * 100) };
    expect(() => mooneySlip([a, c])).toThrow(/wallShearStress: the die diameters' wall-stress ranges do not overlap/);
  });
  test("one diameter, repeated diameters and bad points are refused", () => {
    expect(() => mooneySlip([curve(1e-3)])).toThrow(/needs flow curves of at least two die diameters, got 1/);
    expect(() => mooneySlip([curve(1e-3), curve(1e-3)])).toThrow(/two flow curves have the same diameter/);
    expect(() => mooneySlip([curve(1e-3), { dieDiameter: 2e-3, wallShearStress: [1, 2], shearRateApparent: [1, -2] }])).toThrow(/curves\[1\].shearRateApparent: row 2/);
    expect(() => mooneySlip([curve(1e-3), curve(2e-3)], { stresses: 1 })).toThrow(/stresses: must be a whole number of at least 2/);
  });
});

describe("reduce(measurements, { slip: true })", () => {
  // one long die per diameter, no entrance loss, endCorrection none: τ_app is the wall stress exactly
  function raw(D: number, temperature: number): Measurement[] {
    const L = 40 * D;
    return STRESSES.map((t) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(noSlipApparent(t) + (8 * slipVelocity(t)) / D, D), pressure: (4 * t * L) / D, temperature }));
  }
  test("top-level slip rows carry the temperature and the known slip velocity", () => {
    const r = reduce([...raw(0.5e-3, 473.15), ...raw(1e-3, 473.15), ...raw(2e-3, 473.15)], { endCorrection: "none", slip: true });
    expect(r.slip).toHaveLength(STRESSES.length);
    r.slip!.forEach((s) => {
      expect(s.temperature).toBeCloseTo(473.15, 9);
      expectClose(s.slipVelocity, slipVelocity(s.wallShearStress), { rel: 1e-6 });
      expectClose(s.shearRateApparentCorrected, noSlipApparent(s.wallShearStress), { rel: 1e-6 });
    });
  });
  test("SLIP_ONE_DIAMETER for a temperature with one diameter; an error when none has two", () => {
    const r = reduce([...raw(1e-3, 473.15), ...raw(2e-3, 473.15), ...raw(1e-3, 493.15)], { endCorrection: "none", slip: true });
    expect(r.warnings.map((w) => w.code)).toContain("SLIP_ONE_DIAMETER");
    expect(() => reduce(raw(1e-3, 473.15), { endCorrection: "none", slip: true })).toThrow(/slip analysis needs round dies of two or more diameters/);
  });
  test("off by default: no slip key", () => {
    expect(reduce([...raw(1e-3, 473.15), ...raw(2e-3, 473.15)], { endCorrection: "none" }).slip).toBeUndefined();
  });
});
