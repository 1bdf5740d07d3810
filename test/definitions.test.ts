/**
 * Each viscosity model against its defining equation as published, coded here independently of
 * src/core/models (the model's paper is the source), plus the piston flow rate of the standard
 * melt-flow-rate test, log–log interpolation of a power law, and the Barus die pressure against a
 * numerical integration of its differential equation.
 */
import { evaluateModel } from "../src/core/models";
import { flowRateFromPiston } from "../src/core/flow";
import { interpolateLogLog } from "../src/core/interpolate";
import { barusPressure } from "../src/core/pressureDependence";
import { reduce } from "../src/core/reduce";
import { fitFlowCurves } from "../src/core/flowCurveFits";
import { runReduction } from "../src/core/run";
import { expectClose } from "./helpers/expectClose";

const RATES = [0.03, 2, 150];
const at = (model: string, p: Record<string, number>, T?: number) => evaluateModel(model, p, RATES, T);

describe("viscosity models against their defining equations", () => {
  test("Newtonian, power law, Cross, Carreau, Carreau–Yasuda, Sisko", () => {
    // @check models/newtonian | η = μ at 3 rates | Newton, Principia (1687); Macosko, Rheology (1994), ch. 2 (from memory) | rel 1e-14 | 3
    at("newtonian", { mu: 12.5 }).forEach((v) => expectClose(v, 12.5, { rel: 1e-14 }));
    // @check models/powerLaw | η = Kγ̇^(n−1) at 3 rates | Ostwald, Kolloid-Z. 36 (1925) 99; de Waele, J. Oil Colour Chem. Assoc. 6 (1923) 33 (from memory) | rel 1e-13 | 3
    at("power-law", { K: 8000, n: 0.42 }).forEach((v, i) => expectClose(v, 8000 * (RATES[i] as number) ** -0.58, { rel: 1e-13 }));
    // @check models/cross | η = η∞ + (η0 − η∞)/(1 + (λγ̇)^m) at 3 rates | Cross, J. Colloid Sci. 20 (1965) 417 | rel 1e-13 | 3
    at("cross", { eta0: 5000, etaInf: 2, lambda: 0.3, m: 0.75 }).forEach((v, i) => expectClose(v, 2 + 4998 / (1 + (0.3 * (RATES[i] as number)) ** 0.75), { rel: 1e-13 }));
    // @check models/carreau | η = η∞ + (η0 − η∞)[1 + (λγ̇)²]^((n−1)/2) at 3 rates | Carreau, Trans. Soc. Rheol. 16 (1972) 99 | rel 1e-13 | 3
    at("carreau", { eta0: 5000, etaInf: 2, lambda: 0.3, n: 0.35 }).forEach((v, i) => expectClose(v, 2 + 4998 * (1 + (0.3 * (RATES[i] as number)) ** 2) ** (-0.65 / 2), { rel: 1e-13 }));
    // @check models/carreauYasuda | η = η∞ + (η0 − η∞)[1 + (λγ̇)^a]^((n−1)/a) at 3 rates | Yasuda, Armstrong & Cohen, Rheol. Acta 20 (1981) 163 | rel 1e-13 | 3
    at("carreau-yasuda", { eta0: 5000, etaInf: 2, lambda: 0.3, n: 0.35, a: 0.6 }).forEach((v, i) => expectClose(v, 2 + 4998 * (1 + (0.3 * (RATES[i] as number)) ** 0.6) ** (-0.65 / 0.6), { rel: 1e-13 }));
    // @check models/sisko | η = η∞ + Kγ̇^(n−1) at 3 rates | Sisko, Ind. Eng. Chem. 50 (1958) 1789 (from memory) | rel 1e-13 | 3
    at("sisko", { etaInf: 0.8, K: 40, n: 0.3 }).forEach((v, i) => expectClose(v, 0.8 + 40 * (RATES[i] as number) ** -0.7, { rel: 1e-13 }));
  });

  test("yield-stress models: Bingham, Herschel–Bulkley, Casson", () => {
    // @check models/bingham | τ = τ_y + μ_pγ̇, so η = τ_y/γ̇ + μ_p, at 3 rates | Bingham, Fluidity and Plasticity (1922) | rel 1e-13 | 3
    at("bingham", { tauY: 150, muP: 3 }).forEach((v, i) => expectClose(v, 150 / (RATES[i] as number) + 3, { rel: 1e-13 }));
    // @check models/herschelBulkley | τ = τ_y + Kγ̇ⁿ at 3 rates | Herschel & Bulkley, Kolloid-Z. 39 (1926) 291 | rel 1e-13 | 3
    at("herschel-bulkley", { tauY: 150, K: 20, n: 0.6 }).forEach((v, i) => expectClose(v * (RATES[i] as number), 150 + 20 * (RATES[i] as number) ** 0.6, { rel: 1e-13 }));
    // @check models/casson | √τ = √τ_y + √(η_cγ̇) at 3 rates | Casson, in Rheology of Disperse Systems (Pergamon 1959) 84 (from memory) | rel 1e-13 | 3
    at("casson", { tauY: 150, etaC: 3 }).forEach((v, i) => expectClose(Math.sqrt(v * (RATES[i] as number)), Math.sqrt(150) + Math.sqrt(3 * (RATES[i] as number)), { rel: 1e-13 }));
  });

  test("Ellis: η = η0/(1 + (τ/τ½)^(α−1)) holds at the returned η, τ = ηγ̇", () => {
    at("ellis", { eta0: 5000, tauHalf: 2e4, alpha: 2.6 }).forEach((v, i) => {
      const tau = v * (RATES[i] as number);
      // @check models/ellis | η = η0/(1 + (τ/τ½)^(α−1)) satisfied at 3 rates | Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1, 2nd ed. (1987), ch. 4 (from memory); Matsuhisa & Bird, AIChE J. 11 (1965) 588 | rel 1e-12 | 3
      expectClose(v, 5000 / (1 + (tau / 2e4) ** 1.6), { rel: 1e-12 });
    });
  });

  test("Cross-WLF: η0 = D1·exp(−A1(T − T*)/(A2 + T − T*)), η = η0/(1 + (η0γ̇/τ*)^(1−n))", () => {
    const p = { D1: 4e12, A1: 28, A2: 51.6, Tstar: 373.15, tauStar: 3e4, n: 0.3 };
    const T = 493.15;
    const eta0 = 4e12 * Math.exp((-28 * (T - 373.15)) / (51.6 + T - 373.15));
    // @check models/crossWlf | Cross-WLF viscosity at 3 rates and 493 K | Hieber & Shen, J. Non-Newt. Fluid Mech. 7 (1980) 1 | rel 1e-12 | 3
    at("cross-wlf", p, T).forEach((v, i) => expectClose(v, eta0 / (1 + ((eta0 * (RATES[i] as number)) / 3e4) ** 0.7), { rel: 1e-12 }));
  });
});

describe("flow rate from the piston of the melt-flow-rate test", () => {
  test("ISO 1133 method B: MVR = A·l/t with A = 0.711 cm², the mean of barrel and piston-head areas", () => {
    // barrel 9.550 mm, piston head 9.474 mm (ISO 1133-1, from memory); 1 mm/s of piston travel
    const mean = (flowRateFromPiston(1e-3, 9.55e-3) + flowRateFromPiston(1e-3, 9.474e-3)) / 2;
    // @check flow | Q = v_p·πD_b²/4: the mean barrel and piston-head area of the MFR apparatus is the printed 0.711 cm² | ISO 1133-1 (method B, A = 0.711 cm²; from memory) | rel 1e-3 | 1
    expectClose(mean / 1e-3, 0.711e-4, { rel: 1e-3 });
  });
});

describe("log–log interpolation", () => {
  test("is exact on a power law, the shape of flow curves between points", () => {
    const xs = [1, 10, 100, 1000];
    const ys = xs.map((x) => 3e4 * x ** 0.38);
    // @check interpolate | log–log interpolation of a power law τ = Kγ̇ⁿ is exact at 3 rates between the points | Ostwald–de Waele power law, as in Bird, Armstrong & Hassager 1987, ch. 4 (from memory) | rel 1e-12 | 3
    [2.5, 47, 640].forEach((x) => expectClose(interpolateLogLog(xs, ys, x) as number, 3e4 * x ** 0.38, { rel: 1e-12 }));
  });
});

describe("Barus die pressure", () => {
  test("ΔP = ΔP_ent − ln(1 − β·2τ0·x)/β equals the integral of dp/dx = 2τ0·exp(βp) (RK4)", () => {
    const tau0 = 1e5;
    const beta = 2e-8; // 20 GPa⁻¹
    const entrance = 3e6;
    const rk4 = (x: number) => {
      const steps = 2000;
      const h = x / steps;
      let p = 0;
      const f = (q: number) => 2 * tau0 * Math.exp(beta * q);
      for (let i = 0; i < steps; i++) {
        const k1 = f(p);
        const k2 = f(p + (h * k1) / 2);
        const k3 = f(p + (h * k2) / 2);
        const k4 = f(p + h * k3);
        p += (h * (k1 + 2 * k2 + 2 * k3 + k4)) / 6;
      }
      return entrance + p;
    };
    for (const x of [10, 40, 80]) {
      // @check pressureDependence | Barus die pressure at L/R = 10, 40, 80 against RK4 integration of the momentum balance with η ∝ exp(βp) | Barus, Am. J. Sci. 45 (1893) 87 (from memory); Duvdevani & Klein, SPE J. 23 (1967) 41 | rel 1e-10 | 3
      expectClose(barusPressure(x, entrance, 2 * tau0, beta), rk4(x), { rel: 1e-10 }, `x = ${x}`);
    }
  });
});

describe("fitting every group of a reduction", () => {
  test("water at 20 °C through three capillaries: the power-law fit of the flow curve is Newtonian with μ = 1.0016 mPa·s", () => {
    const mu = 1.0016e-3;
    const D = 0.3e-3;
    const data = [30, 60, 90].flatMap((ld) =>
      [1e3, 3e3, 1e4, 3e4].map((rate) => ({ dieDiameter: D, dieLength: ld * D, flowRate: (rate * Math.PI * D ** 3) / 32, pressure: 2 * mu * rate * (2 * ld + 1.178) })),
    );
    const [group] = fitFlowCurves(reduce(data), ["power-law"]);
    const fit = group?.ranked[0];
    expect(fit?.model).toBe("power-law");
    // @check flowCurveFits | power-law fit of a reduced Hagen–Poiseuille flow curve of water: K = μ = 1.0016 mPa·s, n = 1 | IAPWS 2008 viscosity of water at 20 °C (1.0016 mPa·s); Hagen–Poiseuille | rel 1e-6 | 2
    expectClose(fit?.result.parameters.K as number, mu, { rel: 1e-6 });
    expectClose(fit?.result.parameters.n as number, 1, { rel: 1e-6 });
    const run = runReduction(data, {}, { model: "power-law" });
    // @check run | one run (reduction and the model fit asked for) on water's Hagen–Poiseuille data: K = μ = 1.0016 mPa·s, n = 1 | IAPWS 2008 viscosity of water at 20 °C (1.0016 mPa·s); Hagen–Poiseuille | rel 1e-6 | 2
    expectClose(run.modelFits?.[0]?.parameters.K as number, mu, { rel: 1e-6 });
    expectClose(run.modelFits?.[0]?.parameters.n as number, 1, { rel: 1e-6 });
  });
});
