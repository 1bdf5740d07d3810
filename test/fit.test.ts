import { DEFAULT_FIT_OPTIONS, compareModels, fitModel, type FitData } from "../src/core/fit";
import { MODEL_IDS, evaluateModel, getModel, type ModelId } from "../src/core/models";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";
import reference from "./fixtures/scipy-fits.json";

interface ReferenceCase {
  name: string;
  model: string;
  residualSpace: "log" | "linear";
  fixed: Record<string, number>;
  data: FitData;
  parameters: Record<string, number>;
  standardErrors: Record<string, number>;
  ssr: number;
}

function thrown(fn: () => unknown): RheoError {
  try {
    fn();
  } catch (e) {
    if (e instanceof RheoError) return e;
    throw e;
  }
  throw new Error("expected a RheoError");
}

/** The committed scipy reference cases (JSON types widened to the shape written by the script). */
const CASES = reference.cases as unknown as ReferenceCase[];

const rates = (lo: number, hi: number, count: number) => Array.from({ length: count }, (_, i) => lo * Math.pow(hi / lo, i / (count - 1)));

// Source: scripts/scipy_fit_reference.py → test/fixtures/scipy-fits.json (scipy.optimize.least_squares,
// trf, tolerances 1e-15, 3-point Jacobian; standard errors s²(JᵀJ)⁻¹ from the same Jacobian).
describe("fitModel(model, data) against scipy.optimize.least_squares", () => {
  for (const c of CASES) {
    test(`${c.name}: same optimum to 1e-5, same standard errors to 1e-3`, () => {
      const fit = fitModel(c.model, c.data, { residualSpace: c.residualSpace, fixed: c.fixed });
      expect(fit.converged).toBe(true);
      // @check fit/fitModel, fit/residuals, fit/setup, fit/statistics, fit/transforms, fit/linearAlgebra | every model fitted to invented noisy data: parameters, standard errors and SSR of 11 cases | scipy fitter fixture (test/fixtures/scipy-fits.json, scripts/scipy_fit_reference.py, scipy 1.10 least_squares) | rel 1e-5 (parameters), 1e-3 (standard errors), 1e-8 (SSR) | 83
      for (const [name, value] of Object.entries(c.parameters)) expectClose(fit.parameters[name] as number, value, { rel: 1e-5 }, name);
      for (const [name, se] of Object.entries(c.standardErrors)) expectClose(fit.standardErrors[name] as number, se, { rel: 1e-3 }, `SE ${name}`);
      expectClose(fit.ssr, c.ssr, { rel: 1e-8 }, "SSR");
    });
  }
  // Interval in ln p for a positive parameter (delta method, Bates & Watts 1988 §3.5):
  // ln p ± t·SE/p, so [p·e^(−t·SE/p), p·e^(t·SE/p)]; t from scipy.stats.t.ppf.
  test("confidence intervals of positive parameters are p·exp(±t(0.975, n − p)·SE/p) (t from scipy.stats.t.ppf)", () => {
    const c = CASES[0] as ReferenceCase;
    const fit = fitModel(c.model, c.data, { fixed: c.fixed });
    const dof = c.data.shearRate.length - Object.keys(c.parameters).length; // 40 − 4 = 36
    const t = 2.028094000980452; // scipy.stats.t.ppf(0.975, 36), scipy 1.10.1
    expect(dof).toBe(36);
    for (const name of Object.keys(c.parameters)) {
      const p = fit.parameters[name] as number;
      const se = fit.standardErrors[name] as number;
      const [lo, hi] = fit.confidenceIntervals[name] as [number, number];
      // @check fit/intervals, fit/parameterReport | 95 % intervals of 4 positive parameters taken in ln p: p·exp(±t·SE/p) | Bates & Watts, Nonlinear Regression Analysis and Its Applications (1988), ch. 3 (delta method; from memory); t from scipy.stats.t.ppf | rel 1e-6 | 8
      expectClose(lo, p * Math.exp((-t * se) / p), { rel: 1e-6 }, `${name} low`);
      expectClose(hi, p * Math.exp((t * se) / p), { rel: 1e-6 }, `${name} high`);
      expect(lo).toBeGreaterThan(0);
    }
  });
  test("a positive parameter with a standard error larger than its value keeps a positive lower limit", () => {
    // three points barely bent: Cross's eta0 and lambda are poorly determined
    const fit = fitModel("cross", { shearRate: [10, 100, 1000, 3000], viscosity: [900, 420, 130, 60] }, { fixed: { etaInf: 0 } });
    for (const [name, [lo, hi]] of Object.entries(fit.confidenceIntervals)) {
      expect(lo).toBeGreaterThan(0);
      expect(hi).toBeGreaterThan(lo);
      expect(Number.isFinite(fit.standardErrors[name] as number)).toBe(true);
    }
    expect(fit.wellDetermined).toBe(false);
  });
});

// Exact synthetic data (invented parameter sets, typical of each material class), automatic guesses.
const TRUTH: Record<ModelId, Record<string, number>> = {
  newtonian: { mu: 12.5 },
  "power-law": { K: 2e4, n: 0.35 },
  cross: { eta0: 5e3, etaInf: 2, lambda: 0.08, m: 0.7 },
  carreau: { eta0: 8e3, etaInf: 1.5, lambda: 0.3, n: 0.35 },
  "carreau-yasuda": { eta0: 2e4, etaInf: 3, lambda: 0.5, n: 0.3, a: 0.7 },
  sisko: { etaInf: 0.8, K: 40, n: 0.3 },
  ellis: { eta0: 3e3, tauHalf: 2e4, alpha: 2.5 },
  bingham: { tauY: 15, muP: 0.4 },
  "herschel-bulkley": { tauY: 20, K: 3, n: 0.55 },
  casson: { tauY: 8, etaC: 0.05 },
  "cross-wlf": { D1: 3e12, A1: 28, A2: 51.6, Tstar: 373, tauStar: 3e4, n: 0.28 },
};

describe("fitModel recovers the parameters of exact synthetic data from its automatic guesses", () => {
  for (const id of MODEL_IDS) {
    test(id, () => {
      const temps = id === "cross-wlf" ? [473.15, 493.15, 513.15] : [473.15];
      const shearRate = temps.flatMap(() => rates(0.1, 1e4, 30));
      const temperature = temps.flatMap((t) => new Array<number>(30).fill(t));
      const viscosity = evaluateModel(id, TRUTH[id], shearRate, temperature);
      const fit = fitModel(id, { shearRate, viscosity, temperature: getModel(id).needsTemperature ? temperature : undefined });
      expect(fit.converged).toBe(true);
      for (const [name, value] of Object.entries(TRUTH[id])) expectClose(fit.parameters[name] as number, value, { rel: 1e-4 }, name);
      if (id !== "newtonian") expect(fit.r2).toBeGreaterThan(1 - 1e-12); // constant data: R² undefined (NaN)
    });
  }
  test("melt with no second plateau: etaInf ends exactly on its bound 0 with a warning", () => {
    const shearRate = rates(0.1, 1e4, 40);
    const viscosity = evaluateModel("carreau-yasuda", { ...TRUTH["carreau-yasuda"], etaInf: 0 }, shearRate);
    const fit = fitModel("carreau-yasuda", { shearRate, viscosity });
    expect(fit.parameters.etaInf).toBe(0);
    expect(fit.warnings.map((w) => w.code)).toContain("PARAMETER_AT_BOUND");
    expectClose(fit.parameters.lambda as number, 0.5, { rel: 1e-6 });
    expect((fit.confidenceIntervals.etaInf as [number, number])[0]).toBe(0);
  });
  test("a second Cross plateau far from the guesses (η0/η∞ = 25) is still found", () => {
    const shearRate = rates(0.1, 1e4, 30);
    const truth = { eta0: 50, etaInf: 2, lambda: 1, m: 0.9 };
    const fit = fitModel("cross", { shearRate, viscosity: evaluateModel("cross", truth, shearRate) });
    for (const [name, value] of Object.entries(truth)) expectClose(fit.parameters[name] as number, value, { rel: 1e-4 }, name);
  });
});

describe("fitModel options", () => {
  const shearRate = rates(0.1, 1e4, 25);
  const viscosity = evaluateModel("carreau", TRUTH.carreau, shearRate);
  test("DEFAULT_FIT_OPTIONS: log residuals, 95 % intervals, 200 iterations", () => {
    expect(DEFAULT_FIT_OPTIONS.residualSpace).toBe("log");
    expect(DEFAULT_FIT_OPTIONS.confidenceLevel).toBe(0.95);
    expect(DEFAULT_FIT_OPTIONS.maxIterations).toBe(200);
    expect(fitModel("carreau", { shearRate, viscosity }).residualSpace).toBe(DEFAULT_FIT_OPTIONS.residualSpace);
  });
  test("fixed parameters are held, listed, and carry no standard error", () => {
    const fit = fitModel("carreau", { shearRate, viscosity }, { fixed: { etaInf: 1.5 } });
    expect(fit.parameters.etaInf).toBe(1.5);
    expect(fit.fixed).toEqual(["etaInf"]);
    expect(fit.standardErrors.etaInf).toBeUndefined();
    expect(fit.parameterCount).toBe(3);
  });
  test("Cross-WLF holds A2 at 51.6 K by default; options.free fits it", () => {
    const temperature = [473.15, 493.15, 513.15, 533.15].flatMap((t) => new Array<number>(20).fill(t));
    const rate = [0, 1, 2, 3].flatMap(() => rates(1, 1e4, 20));
    const eta = evaluateModel("cross-wlf", { ...TRUTH["cross-wlf"], A2: 60 }, rate, temperature);
    const held = fitModel("cross-wlf", { shearRate: rate, viscosity: eta, temperature });
    expect(held.fixed).toEqual(["A2"]);
    expect(held.parameters.A2).toBe(51.6);
    const freed = fitModel("cross-wlf", { shearRate: rate, viscosity: eta, temperature }, { free: ["A2"], fixed: { Tstar: 373 } });
    expectClose(freed.parameters.A2 as number, 60, { rel: 1e-4 });
    // ln η0 = ln D1 − A1 + A1·A2/(T + A2 − T*) (algebra on Hieber & Shen's form): A2 and T* only as A2 − T*.
    expect(() => fitModel("cross-wlf", { shearRate: rate, viscosity: eta, temperature }, { free: ["A2"] })).toThrow(
      "options.free: cross-wlf cannot fit both A2 and Tstar: η0(T) depends on them only through A2 − Tstar; hold Tstar fixed (options.fixed)",
    );
  });
  test("initial guesses from the caller are used", () => {
    const fit = fitModel("carreau", { shearRate, viscosity }, { initial: { eta0: 1e4, lambda: 1 } });
    expectClose(fit.parameters.eta0 as number, 8e3, { rel: 1e-6 });
  });
  test("weights: a zero weight drops a point (an outlier then does not matter)", () => {
    const spoiled = [...viscosity];
    spoiled[5] = (spoiled[5] as number) * 3;
    const weights = spoiled.map((_, i) => (i === 5 ? 0 : 1));
    const fit = fitModel("carreau", { shearRate, viscosity: spoiled, weights });
    expect(fit.pointCount).toBe(24);
    expectClose(fit.parameters.n as number, 0.35, { rel: 1e-6 });
  });
  test("a temperature column for an isothermal model is reported, not silently used", () => {
    const fit = fitModel("carreau", { shearRate, viscosity, temperature: shearRate.map(() => 473) });
    expect(fit.warnings.map((w) => w.code)).toContain("TEMPERATURE_IGNORED");
  });
  test("maxIterations 2 → converged false, stopReason max-iterations, NOT_CONVERGED warning", () => {
    const fit = fitModel("carreau-yasuda", (CASES[1] as ReferenceCase).data, { maxIterations: 2 });
    expect(fit.converged).toBe(false);
    expect(fit.stopReason).toBe("max-iterations");
    expect(fit.iterations).toBeLessThanOrEqual(4); // at most 2 with η∞ held on its bound, then 2 with it free
    expect(fit.warnings.map((w) => w.code)).toContain("NOT_CONVERGED");
  });
  test("throwOnNonConvergence turns it into RheoError(convergence)", () => {
    const e = thrown(() => fitModel("carreau-yasuda", (CASES[1] as ReferenceCase).data, { maxIterations: 2, throwOnNonConvergence: true }));
    expect(e.kind).toBe("convergence");
    expect(e.message).toMatch(/^model: carreau-yasuda fit did not converge after \d+ iterations \(max-iterations\)$/);
  });
});

describe("fitModel error messages", () => {
  const shearRate = [1, 10, 100, 1000, 10000];
  const viscosity = [1000, 800, 300, 80, 20];
  test("unknown model lists the accepted ones", () => {
    expect(thrown(() => fitModel("carreu", { shearRate, viscosity })).message).toBe(`model: unknown model "carreu"; accepted: ${MODEL_IDS.join(", ")}`);
  });
  test("non-positive viscosity names the argument and row", () => {
    const e = thrown(() => fitModel("cross", { shearRate, viscosity: [1000, 800, -2, 80, 20] }));
    expect(e.message).toBe("viscosity: row 3 must be greater than zero, got -2");
    expect(e.kind).toBe("domain");
  });
  test("non-finite shear rate", () => {
    expect(thrown(() => fitModel("cross", { shearRate: [1, NaN, 100, 1000, 1e4], viscosity })).message).toBe("shearRate: row 2 must be a finite number, got NaN");
  });
  test("length mismatch", () => {
    expect(thrown(() => fitModel("cross", { shearRate, viscosity: [1, 2] })).message).toBe("viscosity: has 2 values but shearRate has 5");
  });
  test("weights of the wrong length are an error, never patched", () => {
    expect(thrown(() => fitModel("power-law", { shearRate, viscosity, weights: [1, 1] })).message).toBe("weights: has 2 values but shearRate has 5");
  });
  test("negative weight", () => {
    expect(thrown(() => fitModel("power-law", { shearRate, viscosity, weights: [1, 1, -1, 1, 1] })).message).toBe("weights: row 3 must not be negative, got -1");
  });
  test("too few points for the free parameters", () => {
    const e = thrown(() => fitModel("carreau-yasuda", { shearRate, viscosity }));
    expect(e.kind).toBe("missing");
    expect(e.message).toBe("shearRate: 5 points with positive weight cannot determine 5 free parameters of carreau-yasuda; at least 6 are needed");
  });
  test("unknown fixed parameter lists the accepted names", () => {
    expect(thrown(() => fitModel("cross", { shearRate, viscosity }, { fixed: { lamda: 1 } })).message).toBe('options.fixed.lamda: unknown parameter "lamda" for cross; accepted: eta0, etaInf, lambda, m');
  });
  test("fixed value outside the physical bounds", () => {
    expect(thrown(() => fitModel("cross", { shearRate, viscosity }, { fixed: { etaInf: -1 } })).message).toBe("options.fixed.etaInf: must be at least 0 for cross, got -1");
  });
  test("unknown residual space", () => {
    expect(thrown(() => fitModel("cross", { shearRate, viscosity }, { residualSpace: "ln" as "log" })).message).toBe('options.residualSpace: must be "log" or "linear", got "ln"');
  });
  test("options.free only for default-held parameters", () => {
    expect(thrown(() => fitModel("cross", { shearRate, viscosity }, { free: ["eta0"] })).message).toBe('options.free: "eta0" is not held fixed by default in cross; all its parameters are already fitted');
  });
  test("Cross-WLF without temperatures, or with too few levels", () => {
    expect(thrown(() => fitModel("cross-wlf", { shearRate, viscosity })).message).toBe("temperature: cross-wlf needs one temperature (K) per point");
    expect(thrown(() => fitModel("cross-wlf", { shearRate: [...shearRate, ...shearRate], viscosity: [...viscosity, ...viscosity], temperature: [473, 473, 473, 473, 473, 493, 493, 493, 493, 493] })).message).toBe(
      "temperature: cross-wlf with free D1, A1, Tstar needs at least 3 distinct temperatures, got 2; hold some fixed (options.fixed)",
    );
  });
  test("every parameter fixed", () => {
    expect(thrown(() => fitModel("power-law", { shearRate, viscosity }, { fixed: { K: 1, n: 0.5 } })).message).toBe("options.fixed: holds every parameter of power-law; nothing is left to fit");
  });
});

describe("compareModels(models, data)", () => {
  const c = CASES[1] as ReferenceCase; // noisy Carreau–Yasuda data with a second plateau
  test("ranks by AIC with ΔAIC and Akaike weights summing to 1; failures listed with reasons", () => {
    const result = compareModels(["power-law", "cross", "carreau-yasuda", "carreau", "bingham"], c.data, { perModel: { bingham: { maxIterations: 1 } } });
    expect(result.ranked[0]?.deltaAic).toBe(0);
    expect(result.ranked.map((r) => r.aic)).toEqual([...result.ranked.map((r) => r.aic)].sort((a, b) => a - b));
    expectClose(result.ranked.reduce((s, r) => s + r.akaikeWeight, 0), 1, { rel: 1e-12 });
    expect(result.ranked[0]?.model).toBe("carreau-yasuda");
    expect(result.failed).toEqual([expect.objectContaining({ model: "bingham", reason: "did not converge (max-iterations)" })]);
    // Burnham & Anderson (2002), ch. 2 (from memory): w = exp(−Δ/2)/Σ
    const second = result.ranked[1];
    // @check fit/compareModels | Akaike weight of the second model, w = exp(−ΔAIC/2)/Σexp(−ΔAIC_j/2) | Burnham & Anderson, Model Selection and Multimodel Inference, 2nd ed. (2002), ch. 2 (from memory) | rel 1e-10 | 1
    expectClose(second?.akaikeWeight as number, Math.exp(-(second?.deltaAic as number) / 2) * (result.ranked[0]?.akaikeWeight as number), { rel: 1e-10 });
  });
  test("per-model errors are listed, data errors thrown", () => {
    const few = { shearRate: [1, 10, 100, 1000], viscosity: [100, 90, 50, 20] };
    const result = compareModels(["power-law", "carreau-yasuda"], few);
    expect(result.failed[0]?.reason).toMatch(/^shearRate: 4 points with positive weight cannot determine 5 free parameters/);
    expect(() => compareModels(["power-law"], { shearRate: [1, 2, 3], viscosity: [1, 0, 1] })).toThrow("viscosity: row 2 must be greater than zero, got 0");
    expect(() => compareModels([], few)).toThrow("models: lists no model");
    expect(() => compareModels(["power-law"], few, { shared: { fixed: {} } as never })).toThrow("options.shared.fixed: belongs to one model; give it in options.perModel");
  });
});
