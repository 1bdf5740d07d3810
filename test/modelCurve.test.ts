/**
 * The whole-curve fast path (ModelDefinition.logCurve) used by the fitter must give the values of
 * the per-point functions (logViscosity, logGradient), which models.test.ts checks against the
 * defining formulas and central differences and fit.test.ts against scipy. Reference here: those
 * per-point functions; the tolerance allows for rounding only (ln λ + ln γ̇ instead of ln(λγ̇),
 * products with reciprocals instead of quotients).
 */
import { MODEL_IDS, getModel } from "../src/core/models";
import { fitModel } from "../src/core/fit";
import { expectClose } from "./helpers/expectClose";

/** Parameter sets per model: ordinary, η∞ = 0, and steep or gentle transitions. */
const SAMPLES: Record<string, number[][]> = {
  "power-law": [[2e4, 0.35], [3, 1.2]],
  cross: [[5e3, 2, 0.08, 0.7], [800, 0, 3, 0.95]],
  carreau: [[8e3, 1.5, 0.3, 0.35], [1e5, 0, 20, 0.2]],
  "carreau-yasuda": [[2e4, 3, 0.5, 0.3, 0.7], [3000, 0, 0.25, 0.35, 2.5], [50, 0.1, 1e-3, 0.8, 0.2]],
};
/** From far below to far above the transitions (both branches of the overflow-safe forms). */
const RATES = [1e-6, 0.05, 1, 3, 700, 2e4, 1e9];
const TEMPERATURE = 493;

describe("logCurve(p, ln γ̇, T) matches logViscosity and logGradient point by point", () => {
  test("the models with a fast path are the four listed here", () => {
    expect(MODEL_IDS.filter((id) => getModel(id).logCurve !== undefined).sort()).toEqual(Object.keys(SAMPLES).sort());
  });
  for (const [id, sets] of Object.entries(SAMPLES)) {
    test(id, () => {
      const m = getModel(id);
      const curve = m.logCurve;
      if (!curve) throw new Error(`${id} has no logCurve`);
      const k = m.parameters.length;
      const logRate = Float64Array.from(RATES, Math.log);
      const temperature = new Float64Array(RATES.length).fill(TEMPERATURE);
      for (const set of sets) {
        const p = Float64Array.from(set);
        const logEta = new Float64Array(RATES.length);
        const gradient = new Float64Array(RATES.length * k);
        curve(p, logRate, temperature, logEta, gradient);
        const valuesOnly = new Float64Array(RATES.length);
        curve(p, logRate, temperature, valuesOnly, null);
        const pointGradient = new Float64Array(k);
        RATES.forEach((rate, i) => {
          const expected = m.logGradient(p, rate, TEMPERATURE, pointGradient);
          const where = `${id} [${set.join(", ")}] at ${rate} 1/s`;
          expectClose(logEta[i] as number, expected, { rel: 1e-13, abs: 1e-13 }, `${where}: ln η`);
          expectClose(valuesOnly[i] as number, m.logViscosity(p, rate, TEMPERATURE), { rel: 1e-13, abs: 1e-13 }, `${where}: ln η without gradient`);
          pointGradient.forEach((g, j) => {
            // abs: a few ulps of the largest term of the column (1/λ, 1/η0 ... set the scale)
            expectClose(gradient[i * k + j] as number, g, { rel: 1e-12, abs: 1e-14 / Math.abs(set[j] as number) }, `${where}: ∂/∂${m.parameters[j]?.name}`);
          });
        });
      }
    });
  }
});

describe("fitModel with some parameters held uses the fast path over the free ones", () => {
  // Invented curve from known Carreau–Yasuda parameters without noise: the fit must return them.
  const truth = { eta0: 3000, etaInf: 0, lambda: 0.25, n: 0.35, a: 0.7 };
  const shearRate = Array.from({ length: 25 }, (_, i) => Math.pow(10, -1 + (5 * i) / 24));
  const viscosity = shearRate.map((rate) => truth.eta0 * Math.pow(1 + Math.pow(truth.lambda * rate, truth.a), (truth.n - 1) / truth.a));
  test("carreau-yasuda with etaInf held at 0 recovers the generating parameters (closed form)", () => {
    const fit = fitModel("carreau-yasuda", { shearRate, viscosity }, { fixed: { etaInf: 0 } });
    expect(fit.converged).toBe(true);
    expect(fit.parameters.etaInf).toBe(0);
    for (const name of ["eta0", "lambda", "n", "a"] as const) expectClose(fit.parameters[name] as number, truth[name], { rel: 1e-8 }, name);
  });
  test("carreau-yasuda with a held at 0.7 recovers the others", () => {
    const fit = fitModel("carreau-yasuda", { shearRate, viscosity }, { fixed: { a: 0.7 } });
    expect(fit.converged).toBe(true);
    for (const name of ["eta0", "lambda", "n"] as const) expectClose(fit.parameters[name] as number, truth[name], { rel: 1e-8 }, name);
    expectClose(fit.parameters.etaInf as number, 0, { abs: 1e-6 }, "etaInf");
  });
});
