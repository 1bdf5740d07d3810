import { barusPressure, fitBarusBagley, pressureDependence, DEFAULT_PRESSURE_DEPENDENCE_OPTIONS } from "../src/core/pressureDependence";
import { reduce, Measurement } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

/**
 * Exact Barus-law die pressures: with η = η0·exp(βp) at fixed flow rate, dp/dz = −(2/R)τ0·exp(βp),
 * integrated from the exit: ΔP_die = −ln(1 − 2βτ0·L/R)/β (Duvdevani & Klein 1967; Laun 2004).
 */
const beta = 20e-9; // 20 GPa⁻¹, within 10–40 GPa⁻¹ of common melts (from memory)
const X = [10, 20, 40, 60];
function line(tau0: number, entrance: number, b = beta) {
  return X.map((x) => ({ lengthOverRadius: x, pressure: entrance - Math.log(1 - b * 2 * tau0 * x) / b }));
}

describe("Barus Bagley curve", () => {
  test("barusPressure → the straight Bagley line as β → 0", () => {
    expectClose(barusPressure(20, 1e6, 2e5, 0), 1e6 + 4e6, { rel: 1e-15 });
    expectClose(barusPressure(20, 1e6, 2e5, 1e-20), 1e6 + 4e6, { rel: 1e-12 });
    expect(barusPressure(20, 0, 2e5, 1)).toBeNaN();
  });
  test("fitBarusBagley recovers β, τ0 and ΔP_ent from exact data", () => {
    const pts = line(1e5, 5e6);
    const f = fitBarusBagley(pts.map((p) => p.lengthOverRadius), pts.map((p) => p.pressure));
    expect(f.converged).toBe(true);
    expectClose(f.pressureCoefficient, beta, { rel: 1e-6 });
    expectClose(f.wallShearStressAtZeroPressure, 1e5, { rel: 1e-7 });
    expectClose(f.entrancePressure, 5e6, { rel: 1e-6 });
  });
  test("fewer than three dies is an error", () => {
    expect(() => fitBarusBagley([10, 20], [1, 2])).toThrow(/dieLength: the curvature of a Bagley line needs at least three die lengths/);
  });
});

describe("pressureDependence(lines) warnings", () => {
  test("straight lines: β ≈ 0 and no warning", () => {
    const r = pressureDependence([{ shearRateApparent: 100, points: X.map((x) => ({ lengthOverRadius: x, pressure: 1e6 + 2e5 * x })) }]);
    expect(Math.abs(r.pressureCoefficient as number)).toBeLessThan(1e-15);
    expect(r.warnings).toEqual([]);
  });
  test("PRESSURE_DEPENDENCE when β·ΔP_max > 0.1 (common practice)", () => {
    expect(DEFAULT_PRESSURE_DEPENDENCE_OPTIONS.maxLogViscosityRise).toBe(0.1);
    const r = pressureDependence([{ shearRateApparent: 100, points: line(1e5, 5e6) }]);
    expect(r.warnings.map((w) => w.code)).toEqual(["PRESSURE_DEPENDENCE"]);
    expectClose(r.rows[0]!.logViscosityRise, beta * Math.max(...line(1e5, 5e6).map((p) => p.pressure)), { rel: 1e-6 });
  });
  test("PRESSURE_CURVATURE_DOWNWARD for lines bending down", () => {
    const r = pressureDependence([{ shearRateApparent: 100, points: line(1e5, 5e6, -20e-9) }]);
    expect(r.warnings.map((w) => w.code)).toEqual(["PRESSURE_CURVATURE_DOWNWARD"]);
    expectClose(r.pressureCoefficient as number, -20e-9, { rel: 1e-5 });
  });
  test("PRESSURE_FEW_DIES with two dies; PRESSURE_FIT_NOT_CONVERGED when iterations run out", () => {
    expect(pressureDependence([{ shearRateApparent: 100, points: line(1e5, 5e6).slice(0, 2) }]).warnings.map((w) => w.code)).toEqual(["PRESSURE_FEW_DIES"]);
    expect(pressureDependence([{ shearRateApparent: 100, points: line(1e5, 5e6) }], { maxIterations: 1 }).warnings.map((w) => w.code)).toContain("PRESSURE_FIT_NOT_CONVERGED");
  });
});

describe("reduce(…, { pressureDependence: true })", () => {
  test("recovers β from four dies at each rate of a Newtonian Barus liquid", () => {
    const D = 1e-3;
    const mu = 200;
    const rates = [30, 100, 300];
    const data: Measurement[] = X.flatMap((x) =>
      rates.map((rate) => ({ dieDiameter: D, dieLength: (x * D) / 2, flowRate: flowRateForApparentShearRate(rate, D), pressure: 2e6 - Math.log(1 - beta * 2 * mu * rate * x) / beta })),
    );
    const r = reduce(data, { pressureDependence: true });
    const pd = r.groups[0]!.pressureDependence!;
    expect(pd.rows).toHaveLength(rates.length);
    expectClose(pd.pressureCoefficient as number, beta, { rel: 1e-5 });
    expect(r.warnings.map((w) => w.code)).toContain("PRESSURE_DEPENDENCE");
  });
});

/**
 * Against scipy (scripts/scipy_barus_reference.py → test/fixtures/scipy-barus.json): Bagley lines
 * of four dies of liquids obeying time–pressure superposition, a_p = exp(β·p) with the
 * constant-stress β = 15 GPa⁻¹, the die pressure integrated along the die with solve_ivp; each
 * line fitted by scipy.optimize.curve_fit. For a power law the curvature coefficient at the held
 * rate is exactly n·β (Laun 2004; derivation in the module comment).
 */
import barus from "./fixtures/scipy-barus.json";

interface BarusLine {
  shearRateApparent: number;
  pressure: number[];
  wallShearStressAtZeroPressure: number;
  nPrimeAtZeroPressure: number;
  fit: { entrancePressure: number; tau0: number; betaRate: number; seEntrancePressure: number; seTau0: number; seBetaRate: number };
}
const sets = barus.datasets as { name: string; dieDiameter: number; lengthOverRadius: number[]; pressureCoefficient: number; noise: number; lines: BarusLine[] }[];
const set = (name: string) => sets.find((d) => d.name === name)!;
function measurements(name: string): Measurement[] {
  const d = set(name);
  return d.lines.flatMap((l) =>
    d.lengthOverRadius.map((x, k) => ({ dieDiameter: d.dieDiameter, dieLength: (x * d.dieDiameter) / 2, flowRate: flowRateForApparentShearRate(l.shearRateApparent, d.dieDiameter), pressure: l.pressure[k] as number })),
  );
}

describe("Barus fit against scipy curve_fit", () => {
  test.each(["power-law", "cross", "cross-noisy"])("%s: β_γ, τ0 and ΔP_ent as curve_fit", (name) => {
    const d = set(name);
    for (const l of d.lines) {
      const f = fitBarusBagley(d.lengthOverRadius, l.pressure);
      expect(f.converged).toBe(true);
      expect(f.degreesOfFreedom).toBe(1);
      // curve_fit stops on its own tolerances: agreement to 1e-6 of the value, or of the standard error where β is noise
// @check pressureDependence | Barus fit of a Bagley line (β_γ, τ_0, ΔP_ent), 3 data sets × 5 rates | scipy.optimize.curve_fit (scripts/scipy_barus_reference.py) | rel 1e-6 | 45
      expectClose(f.pressureCoefficient, l.fit.betaRate, { rel: 1e-6, abs: 1e-3 * l.fit.seBetaRate }, `β_γ at ${l.shearRateApparent}`);
      expectClose(f.wallShearStressAtZeroPressure, l.fit.tau0, { rel: 1e-6 }, `τ0 at ${l.shearRateApparent}`);
      expectClose(f.entrancePressure, l.fit.entrancePressure, { rel: 1e-6 }, `ΔP_ent at ${l.shearRateApparent}`);
    }
  });
  test("cross-noisy: standard errors s²(JᵀJ)⁻¹ as curve_fit's pcov (one degree of freedom)", () => {
    for (const l of set("cross-noisy").lines) {
      const f = fitBarusBagley(set("cross-noisy").lengthOverRadius, l.pressure);
      // scipy's Jacobian is a forward difference: its covariance is good to ~1e-4
// @check pressureDependence | standard errors s²(JᵀJ)⁻¹ of β_γ, τ_0 and ΔP_ent, 5 rates | scipy.optimize.curve_fit pcov (scripts/scipy_barus_reference.py) | rel 2e-3 | 15
      expectClose(f.pressureCoefficientStandardError as number, l.fit.seBetaRate, { rel: 2e-3 }, `SE β at ${l.shearRateApparent}`);
      expectClose(f.wallShearStressAtZeroPressureStandardError as number, l.fit.seTau0, { rel: 2e-3 }, `SE τ0 at ${l.shearRateApparent}`);
      expectClose(f.entrancePressureStandardError as number, l.fit.seEntrancePressure, { rel: 2e-3 }, `SE ΔP_ent at ${l.shearRateApparent}`);
    }
  });
});

describe("constant-rate and constant-stress coefficients", () => {
  test("power law: the curvature gives n·β (5.25 GPa⁻¹), reduce reports β = 15 GPa⁻¹ at constant stress", () => {
    const pd = reduce(measurements("power-law"), { pressureDependence: true }).groups[0]!.pressureDependence!;
    expect(pd.rows).toHaveLength(5);
    pd.rows.forEach((r) => {
// @check pressureDependence, reduceMethods | power law with time–pressure superposition: curvature n·β and β back, 5 rates | scipy solve_ivp die pressures (scripts/scipy_barus_reference.py); Laun, Rheol. Acta 43 (2004) 509 (from memory) | rel 1e-5 | 10
      expectClose(r.pressureCoefficientConstantRate, 0.35 * 15e-9, { rel: 1e-6 });
      expect(r.pressureCoefficient).toBe(r.pressureCoefficientConstantRate);
      expectClose(r.nPrime as number, 0.35, { rel: 1e-6 });
      expectClose(r.pressureCoefficientConstantStress as number, 15e-9, { rel: 1e-5 });
    });
    expectClose(pd.pressureCoefficientConstantStress as number, 15e-9, { rel: 1e-5 });
  });
  test("Cross liquid: β_γ/n′ is β within 0.4 % with the exact n′ (local power law along the die)", () => {
    const d = set("cross");
    const pd = reduce(measurements("cross"), { pressureDependence: true }).groups[0]!.pressureDependence!;
// @check pressureDependence | Cross liquid: β_γ/n′ = β within 0.4 % at 5 rates | scipy solve_ivp die pressures (scripts/scipy_barus_reference.py) | rel 4e-3 | 5
    pd.rows.forEach((r, i) => expectClose(r.pressureCoefficientConstantRate / d.lines[i]!.nPrimeAtZeroPressure, 15e-9, { rel: 0.004 }, `β at ${r.shearRateApparent}`));
  });
  test("Cross liquid through reduce: β within 7 %, limited by n′ of five rates over two decades (6 % at the ends)", () => {
    const d = set("cross");
    const pd = reduce(measurements("cross"), { pressureDependence: true }).groups[0]!.pressureDependence!;
    pd.rows.forEach((r, i) => {
      expectClose(r.nPrime as number, d.lines[i]!.nPrimeAtZeroPressure, { rel: 0.065 }, `n' at ${r.shearRateApparent}`);
      expectClose(r.pressureCoefficientConstantStress as number, 15e-9, { rel: 0.07 }, `β at ${r.shearRateApparent}`);
    });
    expectClose(pd.pressureCoefficientConstantStress as number, 15e-9, { rel: 0.01 });
  });
  test("noisy lines: a negative β is never quoted as a rise; insignificant curvature raises no warning", () => {
    const r = reduce(measurements("cross-noisy"), { pressureDependence: true });
    const pd = r.groups[0]!.pressureDependence!;
    const negative = pd.rows.find((x) => x.pressureCoefficientConstantRate < 0)!;
    expect(negative.significant).toBe(false);
    expect(r.warnings.map((w) => w.code)).not.toContain("PRESSURE_CURVATURE_DOWNWARD");
    for (const w of r.warnings.filter((x) => x.code === "PRESSURE_DEPENDENCE")) {
      expect(w.message).not.toMatch(/−|-\d/);
      expect(w.message).not.toContain(String(Number((negative.shearRateApparent).toPrecision(3))) + " 1/s");
    }
  });
  test("three dies: PRESSURE_EXACT_FIT, no standard error, significance unknown", () => {
    const r = pressureDependence([{ shearRateApparent: 100, points: line(1e5, 5e6).slice(0, 3), nPrime: 0.5 }]);
    expect(r.warnings.map((w) => w.code)).toEqual(["PRESSURE_EXACT_FIT", "PRESSURE_DEPENDENCE"]);
    expect(r.rows[0]!.pressureCoefficientConstantRateStandardError).toBeNull();
    expect(r.rows[0]!.significant).toBeNull();
    expect(r.rows[0]!.degreesOfFreedom).toBe(0);
    // one rate: n' from the flow curve converts the coefficient
    expectClose(r.rows[0]!.pressureCoefficientConstantStress as number, beta / 0.5, { rel: 1e-5 });
  });
});
