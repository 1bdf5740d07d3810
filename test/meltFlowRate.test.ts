import { meltFlowPoint, meltFlowPressure, COMMON_MELT_FLOW_LOADS } from "../src/core/meltFlowRate";
import { DEFAULT_MFR_GEOMETRY } from "../src/core/priorViscosity";
import { reduce } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

/**
 * Standard geometry from memory (ISO 1133-1 / ASTM D1238): die 2.095 mm × 8.000 mm, barrel
 * 9.550 mm; standard gravity 9.80665 m/s² (CGPM 1901). Hand arithmetic:
 * 2.16 kg → 2.16·9.80665/(π·0.004775²) = 295 718.03 Pa;
 * MVR 10 cm³/10 min = 1.6667e-8 m³/s → γ̇_a = 32Q/(πD³) = 18.4628 1/s, τ = ΔP·D/(4L) = 19 360.29 Pa,
 * η_a = 1048.61 Pa·s.
 */
describe("melt-flow-rate point", () => {
  test("geometry constants", () => expect(DEFAULT_MFR_GEOMETRY).toEqual({ dieDiameter: 2.095e-3, dieLength: 8.0e-3, barrelDiameter: 9.55e-3 }));
  test("meltFlowPressure(2.16 kg) = 295 718 Pa", () => expectClose(meltFlowPressure(2.16), 295718.02851648256, { rel: 1e-12 }));
  test("MVR 10 cm³/10 min at 2.16 kg", () => {
    const p = meltFlowPoint({ volumeRate: 10e-6 / 600 }, 2.16);
    expectClose(p.shearRateApparent, 18.462766336971537, { rel: 1e-12 });
    expectClose(p.wallShearStressApparent, 19360.28967943847, { rel: 1e-12 });
    expectClose(p.viscosityApparent, 1048.612614495892, { rel: 1e-12 });
    expectClose(p.flowRate, 10e-6 / 600, { rel: 1e-12 });
    expect(p.warnings.map((w) => w.code)).toEqual(["MFR_APPARENT_POINT"]);
  });
  test("MFR 7.5 g/10 min at density 750 kg/m³ is the same flow as MVR 10 cm³/10 min", () => {
    const p = meltFlowPoint({ massRate: 7.5e-3 / 600, density: 750 }, 2.16);
    expectClose(p.shearRateApparent, 18.462766336971537, { rel: 1e-12 });
  });
  test("MFR_UNUSUAL_LOAD for a load not in the common list; errors name the argument", () => {
    expect(COMMON_MELT_FLOW_LOADS).toContain(2.16);
    expect(meltFlowPoint({ volumeRate: 1e-8 }, 2.5).warnings.map((w) => w.code)).toEqual(["MFR_APPARENT_POINT", "MFR_UNUSUAL_LOAD"]);
    expect(() => meltFlowPoint({ massRate: 1e-5 }, 2.16)).toThrow(/density/);
    expect(() => meltFlowPoint({ volumeRate: 1e-8, massRate: 1e-5 }, 2.16)).toThrow(/not both/);
    expect(() => meltFlowPressure(0)).toThrow(/load: must be greater than zero/);
  });
  test("reduce(…, { meltFlowRate }) adds the point at the top level", () => {
    const data = [10e-3, 20e-3].flatMap((L) => [10, 100].map((rate) => ({ dieDiameter: 1e-3, dieLength: L, flowRate: flowRateForApparentShearRate(rate, 1e-3), pressure: 4 * 300 * rate * (L / 1e-3) })));
    const r = reduce(data, { meltFlowRate: { volumeRate: 10e-6 / 600, load: 2.16 } });
    expectClose(r.meltFlowRate!.viscosityApparent, 1048.612614495892, { rel: 1e-12 });
    expect(r.warnings.map((w) => w.code)).toContain("MFR_APPARENT_POINT");
  });
});
