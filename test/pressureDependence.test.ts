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
