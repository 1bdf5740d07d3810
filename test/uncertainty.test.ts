import { bagleyStressUncertainty, pressureStandardUncertainty, transducerWarnings, DEFAULT_UNCERTAINTY_OPTIONS } from "../src/core/uncertainty";
import { reduce, Measurement } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

describe("uncertainty propagation (JCGM 100:2008, GUM)", () => {
  // GUM §4.3.7: a bound ±a with no stated confidence is rectangular, u = a/√3;
  // ±0.25 % of 1000 bar = ±2.5 bar → u = 1.4434 bar
  test("pressureStandardUncertainty: a·FS/√3", () => {
    // @check uncertainty | rectangular bound ±a of a transducer: u = a/√3 | JCGM 100:2008 (GUM), 4.3.7 | rel 1e-15 | 1
    expectClose(pressureStandardUncertainty({ fullScale: 1000e5, accuracy: 0.0025 }), 2.5e5 / Math.sqrt(3), { rel: 1e-15 });
    expect(() => pressureStandardUncertainty({ fullScale: 1000e5, accuracy: 1.5 })).toThrow(/accuracy: is a fraction of full scale/);
  });
  // slope of a least-squares line: Var(b) = σ²/Sxx (Draper & Smith 1998, ch. 1, from memory); x = 10, 20, 30 → Sxx = 200
  test("bagleyStressUncertainty = ½√(u_P²/Sxx + SE²)", () => {
    // @check uncertainty | standard error of a least-squares slope, Var(b) = σ²/Sxx, propagated to τ_w = b/2 | Draper & Smith, Applied Regression Analysis, 3rd ed. (1998), ch. 1 (from memory); JCGM 100:2008 (GUM), 5.1 | rel 1e-15 | 2
    expectClose(bagleyStressUncertainty([10, 20, 30], 1000, 0), 0.5 * 1000 / Math.sqrt(200), { rel: 1e-15 });
    expectClose(bagleyStressUncertainty([10, 20, 30], 1000, 30), 0.5 * Math.sqrt(1000 ** 2 / 200 + 900), { rel: 1e-15 });
    expect(() => bagleyStressUncertainty([10, 10], 1, 0)).toThrow(/must have different lengths/);
  });
  test("TRANSDUCER_LOW_READING below 5 % of full scale (common practice); TRANSDUCER_OVER_RANGE above it", () => {
    expect(DEFAULT_UNCERTAINTY_OPTIONS).toEqual({ coverageFactor: 2, minFractionOfFullScale: 0.05 });
    const t = { fullScale: 1000e5, accuracy: 0.0025 };
    expect(transducerWarnings([100e5, 500e5], t)).toEqual([]);
    expect(transducerWarnings([20e5, 1200e5], t).map((w) => w.code)).toEqual(["TRANSDUCER_LOW_READING", "TRANSDUCER_OVER_RANGE"]);
  });
});

describe("reduce(…, { transducer })", () => {
  const D = 1e-3;
  const data: Measurement[] = [10e-3, 20e-3, 30e-3].flatMap((L) => [10, 100, 1000].map((rate) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: 1e6 + 4 * 300 * rate * (L / D) })));
  test("± columns aligned with the flow curve: the budget's expanded uncertainties (uncertaintyBudget.test.ts)", () => {
    const t = { fullScale: 700e5, accuracy: 0.0025 };
    const g = reduce(data, { transducer: t }).groups[0]!;
    expect(g.uncertainty).toHaveLength(g.flowCurve.length);
    g.uncertainty!.forEach((u, i) => expectClose(u.wallShearStress, g.uncertaintyBudget![i]!.expanded.wallShearStress, { rel: 1e-15 }));
  });
  test("low readings are flagged", () => {
    expect(reduce(data, { transducer: { fullScale: 2000e5, accuracy: 0.0025 } }).warnings.map((w) => w.code)).toContain("TRANSDUCER_LOW_READING");
  });
});
