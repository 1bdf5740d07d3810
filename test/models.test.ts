import { MODEL_IDS, MODEL_REGISTRY, evaluateModel, getModel, ellisViscosityFromStress, binghamStress, herschelBulkleyStress, cassonStress } from "../src/core/models";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

const ALLOWED_NAMES = ["mu", "eta0", "etaInf", "lambda", "n", "a", "m", "K", "tauY", "tauHalf", "alpha", "muP", "etaC", "D1", "A1", "A2", "Tstar", "tauStar"];

describe("MODEL_REGISTRY", () => {
  test("lists the eleven models under their stable ids", () => {
    expect(MODEL_IDS).toEqual(["newtonian", "power-law", "cross", "carreau", "carreau-yasuda", "sisko", "ellis", "bingham", "herschel-bulkley", "casson", "cross-wlf"]);
  });
  for (const id of Object.keys(MODEL_REGISTRY)) {
    test(`${id}: documented, one name per parameter, SI unit and bounds`, () => {
      const m = getModel(id);
      expect(m.id).toBe(id);
      for (const text of [m.description, m.formula, m.reference]) expect(text.length).toBeGreaterThan(5);
      const names = m.parameters.map((p) => p.name);
      expect(new Set(names).size).toBe(names.length);
      for (const p of m.parameters) {
        expect(ALLOWED_NAMES).toContain(p.name);
        expect(p.unit.length).toBeGreaterThan(0);
        expect(p.max).toBeGreaterThan(p.min);
      }
    });
  }
});

describe("model formulas at defining points", () => {
  const rate = [0.01, 1, 100, 1e4];
  // Each check follows from the model's defining formula (reference in the model's JSDoc).
  test("power law: η = K·γ̇^(n−1) (Ostwald–de Waele)", () => {
    expectClose(evaluateModel("power-law", { K: 1e4, n: 0.4 }, [10])[0] as number, 1e4 * Math.pow(10, -0.6), { rel: 1e-14 });
  });
  test("Cross at λγ̇ = 1 gives (η0 + η∞)/2 (Cross 1965)", () => {
    expectClose(evaluateModel("cross", { eta0: 1000, etaInf: 10, lambda: 0.5, m: 0.7 }, [2])[0] as number, 505, { rel: 1e-14 });
  });
  test("Carreau–Yasuda with a = 2 is Carreau (Yasuda et al. 1981)", () => {
    const cy = evaluateModel("carreau-yasuda", { eta0: 5e3, etaInf: 1, lambda: 0.2, n: 0.3, a: 2 }, rate);
    const c = evaluateModel("carreau", { eta0: 5e3, etaInf: 1, lambda: 0.2, n: 0.3 }, rate);
    cy.forEach((v, i) => expectClose(v, c[i] as number, { rel: 1e-13 }));
  });
  test("Carreau with n = 1 is Newtonian at η0", () => {
    for (const v of evaluateModel("carreau", { eta0: 42, etaInf: 0, lambda: 3, n: 1 }, rate)) expectClose(v, 42, { rel: 1e-14 });
  });
  test("Carreau high-rate limit: η → η0·(λγ̇)^(n−1) (Bird, Armstrong & Hassager 1987)", () => {
    expectClose(evaluateModel("carreau", { eta0: 1e4, etaInf: 0, lambda: 1, n: 0.4 }, [1e6])[0] as number, 1e4 * Math.pow(1e6, -0.6), { rel: 1e-9 });
  });
  test("Sisko: η∞ + K·γ̇^(n−1)", () => {
    expectClose(evaluateModel("sisko", { etaInf: 0.5, K: 20, n: 0.5 }, [100])[0] as number, 0.5 + 20 * 0.1, { rel: 1e-14 });
  });
  test("Ellis: η = η0/2 where τ = τ½, and the solved η(γ̇) satisfies the stress form", () => {
    const eta0 = 3000;
    const tauHalf = 2e4;
    const [atHalf] = evaluateModel("ellis", { eta0, tauHalf, alpha: 2.5 }, [tauHalf / (eta0 / 2)]);
    expectClose(atHalf as number, eta0 / 2, { rel: 1e-13 });
    const etas = evaluateModel("ellis", { eta0, tauHalf, alpha: 2.5 }, rate);
    etas.forEach((eta, i) => expectClose(eta, ellisViscosityFromStress(eta0, tauHalf, 2.5, eta * (rate[i] as number)), { rel: 1e-13 }));
  });
  test("yield-stress models: τ(γ̇) and η = τ/γ̇; Herschel–Bulkley with n = 1 is Bingham", () => {
    expect(binghamStress(10, 0.5, 4)).toBe(12);
    expect(herschelBulkleyStress(10, 0.5, 1, 4)).toBe(12);
    expectClose(cassonStress(4, 1, 1), 9, { rel: 1e-15 }); // (√4 + √1)² = 9
    expectClose(evaluateModel("bingham", { tauY: 10, muP: 0.5 }, [4])[0] as number, 3, { rel: 1e-15 });
    expectClose(evaluateModel("casson", { tauY: 4, etaC: 1 }, [1])[0] as number, 9, { rel: 1e-14 });
    expectClose(evaluateModel("herschel-bulkley", { tauY: 10, K: 0.5, n: 1 }, [4])[0] as number, 3, { rel: 1e-14 });
  });
  test("Cross-WLF: η0 = D1 at T = T* and η = η0/2 where η0γ̇ = τ* (Hieber & Shen 1980)", () => {
    const p = { D1: 1e12, A1: 30, A2: 51.6, Tstar: 373, tauStar: 5e4, n: 0.3 };
    expectClose(evaluateModel("cross-wlf", p, [1e-25], 373)[0] as number, 1e12, { rel: 1e-9 });
    const eta0 = 1e12 * Math.exp((-30 * 100) / 151.6);
    expectClose(evaluateModel("cross-wlf", p, [5e4 / eta0], 473)[0] as number, eta0 / 2, { rel: 1e-12 });
  });
});

describe("logGradient matches central differences of logViscosity for every model", () => {
  const samples: Record<string, number[]> = {
    newtonian: [12],
    "power-law": [2e4, 0.35],
    cross: [5e3, 2, 0.08, 0.7],
    carreau: [8e3, 1.5, 0.3, 0.35],
    "carreau-yasuda": [2e4, 3, 0.5, 0.3, 0.7],
    sisko: [0.8, 40, 0.3],
    ellis: [3e3, 2e4, 2.5],
    bingham: [15, 0.4],
    "herschel-bulkley": [20, 3, 0.55],
    casson: [8, 0.05],
    "cross-wlf": [3e12, 28, 51.6, 373, 3e4, 0.28],
  };
  for (const id of MODEL_IDS) {
    test(id, () => {
      const m = getModel(id);
      const p = Float64Array.from(samples[id] as number[]);
      const grad = new Float64Array(p.length);
      for (const rate of [0.05, 3, 700, 2e4]) {
        m.logGradient(p, rate, 493, grad);
        p.forEach((v, j) => {
          const h = 1e-6 * Math.abs(v);
          const up = Float64Array.from(p);
          const down = Float64Array.from(p);
          up[j] = v + h;
          down[j] = v - h;
          const numeric = (m.logViscosity(up, rate, 493) - m.logViscosity(down, rate, 493)) / (2 * h);
          expectClose(grad[j] as number, numeric, { rel: 1e-6, abs: 1e-9 / Math.abs(v) }, `${id} ∂/∂${m.parameters[j]?.name} at ${rate}`);
        });
      }
    });
  }
});

describe("evaluateModel errors", () => {
  const err = (fn: () => unknown) => {
    try {
      fn();
    } catch (e) {
      return e as RheoError;
    }
    throw new Error("no error");
  };
  test("unknown model lists accepted ids", () => {
    expect(err(() => evaluateModel("bird", {}, [1])).message).toBe(`model: unknown model "bird"; accepted: ${MODEL_IDS.join(", ")}`);
  });
  test("missing parameter lists the needed names", () => {
    const e = err(() => evaluateModel("carreau", { eta0: 1, etaInf: 0, n: 0.5 }, [1]));
    expect(e.kind).toBe("missing");
    expect(e.message).toBe("parameters: carreau needs eta0, etaInf, lambda, n; missing: lambda");
  });
  test("unknown parameter name", () => {
    expect(err(() => evaluateModel("power-law", { K: 1, n: 0.5, k: 2 }, [1])).message).toBe('parameters: unknown parameter "k" for power-law; accepted: K, n');
  });
  test("out-of-bounds and non-finite parameter values", () => {
    expect(err(() => evaluateModel("power-law", { K: -1, n: 0.5 }, [1])).message).toBe("parameters.K: must be greater than 0 for power-law, got -1");
    expect(err(() => evaluateModel("cross-wlf", { D1: 1, A1: 1, A2: 51.6, Tstar: 300, tauStar: 1, n: 1.2 }, [1], 400)).message).toBe("parameters.n: must be less than 1 for cross-wlf, got 1.2");
    expect(err(() => evaluateModel("power-law", { K: NaN, n: 0.5 }, [1])).message).toBe("parameters.K: must be a finite number, got NaN");
  });
  test("non-positive shear rate names the row", () => {
    expect(err(() => evaluateModel("power-law", { K: 1, n: 0.5 }, [1, 0])).message).toBe("shearRates: row 2 must be greater than zero, got 0");
  });
  test("Cross-WLF temperatures: missing, wrong length, outside the model's range", () => {
    const p = { D1: 1e12, A1: 30, A2: 51.6, Tstar: 373, tauStar: 5e4, n: 0.3 };
    expect(err(() => evaluateModel("cross-wlf", p, [1])).message).toBe("temperatures: cross-wlf needs a temperature (K)");
    expect(err(() => evaluateModel("cross-wlf", p, [1, 2], [400])).message).toBe("temperatures: has 1 values but shearRates has 2");
    expect(err(() => evaluateModel("cross-wlf", p, [1], 300)).message).toBe("temperatures: row 1 is outside the range of cross-wlf (A2 + T − Tstar must be > 0), got 300 K");
  });
});
