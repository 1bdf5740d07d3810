/**
 * Closed forms of tube and slit flow from the literature, as checks of the forward flow integral
 * (src/core/forwardFlow.ts, slitFlow.ts: Gauss–Legendre quadrature over the rate), of its
 * inversion (the true wall rate for an apparent rate), of the Rabinowitsch factor on fluids that
 * are not power laws, and of the smoothed Rabinowitsch correction on exact data.
 *
 * With φ = τ_0/τ_w and the stress integrals γ̇_a = 4Q/(πR³) = (4/τ_w³)∫₀^τw τ²γ̇(τ)dτ (tube) and
 * γ̇_a = 6Q/(WH²) = (3/τ_w²)∫₀^τw τγ̇(τ)dτ (slit), integrated in closed form:
 *
 * - Bingham in a tube (Buckingham–Reiner):  γ̇_a = (τ_w/μ_p)(1 − 4φ/3 + φ⁴/3)
 * - Bingham in a slit:                      γ̇_a = (τ_w/μ_p)(1 − 3φ/2 + φ³/2)
 * - Herschel–Bulkley, m = 1/n, S = τ_w − τ_0:
 *     tube  γ̇_a = (4/(K^m τ_w³))·[S^(m+3)/(m+3) + 2τ_0 S^(m+2)/(m+2) + τ_0² S^(m+1)/(m+1)]
 *     slit  γ̇_a = (3/(K^m τ_w²))·[S^(m+2)/(m+2) + τ_0 S^(m+1)/(m+1)]
 * - Ellis, γ̇ = (τ/η_0)(1 + (τ/τ_½)^(α−1)):
 *     tube  γ̇_a = (τ_w/η_0)[1 + (4/(α+3))(τ_w/τ_½)^(α−1)]
 *     slit  γ̇_a = (τ_w/η_0)[1 + (3/(α+2))(τ_w/τ_½)^(α−1)]
 * - Newtonian slit (plane Poiseuille, Q = WH³ΔP/(12μL)): γ̇_a = τ_w/μ
 * - power law in a slit:                    γ̇_a = (3n/(2n+1))(τ_w/K)^(1/n)
 */
import { apparentRateFromWallRate, wallRateFromApparentRate } from "../src/core/forwardFlow";
import { apparentSlitRateFromWallRate, wallRateFromApparentSlitRate } from "../src/core/slitFlow";
import { rabinowitschCorrection, rabinowitschFactor } from "../src/core/rabinowitsch";
import { evaluateModel } from "../src/core/models";
import { expectClose } from "./helpers/expectClose";

/** A fluid given both ways: η(γ̇) for the core, and the closed-form apparent rates at τ_w. */
interface Fluid {
  name: string;
  viscosity: (rate: number) => number;
  stress: (rate: number) => number;
  tube: (tauW: number) => number;
  slit: (tauW: number) => number;
}

const bingham = (tau0: number, mu: number): Fluid => ({
  name: `Bingham τ0 = ${tau0} Pa, μp = ${mu} Pa·s`,
  viscosity: (g) => tau0 / g + mu,
  stress: (g) => tau0 + mu * g,
  tube: (t) => (t / mu) * (1 - (4 / 3) * (tau0 / t) + (1 / 3) * (tau0 / t) ** 4),
  slit: (t) => (t / mu) * (1 - 1.5 * (tau0 / t) + 0.5 * (tau0 / t) ** 3),
});

const herschelBulkley = (tau0: number, K: number, n: number): Fluid => {
  const m = 1 / n;
  return {
    name: `Herschel–Bulkley τ0 = ${tau0} Pa, K = ${K} Pa·sⁿ, n = ${n}`,
    viscosity: (g) => tau0 / g + K * g ** (n - 1),
    stress: (g) => tau0 + K * g ** n,
    tube: (t) => {
      const S = t - tau0;
      return (4 / (K ** m * t ** 3)) * (S ** (m + 3) / (m + 3) + (2 * tau0 * S ** (m + 2)) / (m + 2) + (tau0 ** 2 * S ** (m + 1)) / (m + 1));
    },
    slit: (t) => {
      const S = t - tau0;
      return (3 / (K ** m * t ** 2)) * (S ** (m + 2) / (m + 2) + (tau0 * S ** (m + 1)) / (m + 1));
    },
  };
};

/** Ellis through the core's own model (η solved at each rate), closed forms in the stress. */
const ellis = (eta0: number, tauHalf: number, alpha: number): Fluid => {
  const eta = (g: number) => evaluateModel("ellis", { eta0, tauHalf, alpha }, [g])[0] as number;
  return {
    name: `Ellis η0 = ${eta0} Pa·s, τ½ = ${tauHalf} Pa, α = ${alpha}`,
    viscosity: eta,
    stress: (g) => eta(g) * g,
    tube: (t) => (t / eta0) * (1 + (4 / (alpha + 3)) * (t / tauHalf) ** (alpha - 1)),
    slit: (t) => (t / eta0) * (1 + (3 / (alpha + 2)) * (t / tauHalf) ** (alpha - 1)),
  };
};

const powerLaw = (K: number, n: number): Fluid => ({
  name: `power law K = ${K} Pa·sⁿ, n = ${n}`,
  viscosity: (g) => K * g ** (n - 1),
  stress: (g) => K * g ** n,
  tube: (t) => ((4 * n) / (3 * n + 1)) * (t / K) ** (1 / n),
  slit: (t) => ((3 * n) / (2 * n + 1)) * (t / K) ** (1 / n),
});

const newtonian = (mu: number): Fluid => ({
  name: `Newtonian μ = ${mu} Pa·s`,
  viscosity: () => mu,
  stress: (g) => mu * g,
  tube: (t) => t / mu,
  slit: (t) => t / mu,
});

/**
 * Wall rates of the forward checks. Near the yield stress (φ → 1) the closed forms lose digits to
 * cancellation (1 − 4φ/3 + φ⁴/3 → 0), so the yield-stress fluids start where φ ≤ 0.9.
 */
const wallRates = (fluid: Fluid) => (fluid.name.startsWith("Bingham") ? [5, 50, 500, 5000] : [0.5, 5, 50, 500]);

describe("forward flow integral against closed forms (tube)", () => {
  const cases: [Fluid, string][] = [
    // @check forwardFlow | Bingham tube flow γ̇_a at 4 wall rates (Buckingham–Reiner equation) | Buckingham, Proc. ASTM 21 (1921) 1154; Reiner 1926 (from memory) | rel 1e-9 | 4
    [bingham(2000, 50), "Buckingham 1921"],
    // @check forwardFlow | Herschel–Bulkley tube flow γ̇_a at 4 wall rates | Herschel & Bulkley, Kolloid-Z. 39 (1926) 291; closed form as in Chhabra & Richardson, Non-Newtonian Flow and Applied Rheology, 2nd ed. (2008), ch. 3 (from memory) | rel 1e-9 | 4
    [herschelBulkley(1500, 800, 0.45), "Herschel–Bulkley 1926"],
    // @check forwardFlow | Ellis tube flow γ̇_a at 4 wall rates | Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1, 2nd ed. (1987), ch. 4 (from memory); Matsuhisa & Bird, AIChE J. 11 (1965) 588 | rel 1e-9 | 4
    [ellis(5000, 2e4, 2.6), "Ellis"],
  ];
  for (const [fluid] of cases) {
    test(`${fluid.name}: (4/τw³)∫τ²γ̇dτ by quadrature equals the closed form`, () => {
      for (const w of wallRates(fluid)) {
        expectClose(apparentRateFromWallRate(fluid.viscosity, w), fluid.tube(fluid.stress(w)), { rel: 1e-9 }, `γ̇w = ${w}`);
      }
    });
  }
});

describe("forward flow integral against closed forms (slit)", () => {
  const cases: Fluid[] = [
    // @check slitFlow | Newtonian slit: γ̇_a = γ̇_w at 4 wall rates (plane Poiseuille, Q = WH³ΔP/(12μL)) | Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. (2002), ch. 2, flow in a narrow slit (from memory) | rel 1e-9 | 4
    newtonian(300),
    // @check slitFlow | power-law slit: γ̇_a = (3n/(2n+1))(τ_w/K)^(1/n) at 4 wall rates | Macosko, Rheology (1994), ch. 6, slit rheometry (from memory) | rel 1e-9 | 4
    powerLaw(1.2e4, 0.35),
    // @check slitFlow | Bingham slit: γ̇_a = (τ_w/μ_p)(1 − 3φ/2 + φ³/2) at 4 wall rates | Bird, Dai & Yarusso, Rev. Chem. Eng. 1 (1983) 1 (from memory) | rel 1e-9 | 4
    bingham(2000, 50),
    // @check slitFlow | Herschel–Bulkley slit γ̇_a at 4 wall rates | Chhabra & Richardson, Non-Newtonian Flow and Applied Rheology, 2nd ed. (2008), ch. 3 (from memory) | rel 1e-9 | 4
    herschelBulkley(1500, 800, 0.45),
    // @check slitFlow | Ellis slit γ̇_a at 4 wall rates, stress integral in closed form | Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1, 2nd ed. (1987), ch. 4 (from memory) | rel 1e-9 | 4
    ellis(5000, 2e4, 2.6),
  ];
  for (const fluid of cases) {
    test(`${fluid.name}: (3/τw²)∫τγ̇dτ by quadrature equals the closed form`, () => {
      for (const w of wallRates(fluid)) {
        expectClose(apparentSlitRateFromWallRate(fluid.viscosity, w), fluid.slit(fluid.stress(w)), { rel: 1e-9 }, `γ̇w = ${w}`);
      }
    });
  }
});

describe("inversion: the true wall rate for a closed-form apparent rate", () => {
  const fluids = [bingham(2000, 50), herschelBulkley(1500, 800, 0.45), ellis(5000, 2e4, 2.6)];
  for (const fluid of fluids) {
    test(`${fluid.name}: tube and slit`, () => {
      // γ̇_w/γ̇_a must lie in the documented bracket 0.5–10: Bingham from φ ≈ 0.8 up
      for (const w of fluid.name.startsWith("Bingham") ? [10, 100, 1000] : [1, 20, 400]) {
        const tau = fluid.stress(w);
        // @check forwardFlow | inversion recovers γ̇_w from the closed-form tube γ̇_a (Bingham, HB, Ellis; 3 rates each) | Buckingham 1921; Herschel & Bulkley 1926; Bird, Armstrong & Hassager 1987 (from memory) | rel 1e-8 | 9
        expectClose(wallRateFromApparentRate(fluid.viscosity, fluid.tube(tau)), w, { rel: 1e-8 }, `tube γ̇w = ${w}`);
        // @check slitFlow | inversion recovers γ̇_w from the closed-form slit γ̇_a (Bingham, HB, Ellis; 3 rates each) | Bird, Dai & Yarusso 1983; Chhabra & Richardson 2008 (from memory) | rel 1e-8 | 9
        expectClose(wallRateFromApparentSlitRate(fluid.viscosity, fluid.slit(tau)), w, { rel: 1e-8 }, `slit γ̇w = ${w}`);
      }
    });
  }
});

/** n' = d ln τ_w / d ln γ̇_a of a closed form γ̇_a(τ_w), by a central difference in ln τ_w. */
function nPrimeOf(apparent: (tau: number) => number, tau: number): number {
  const h = 1e-5;
  const up = Math.log(apparent(tau * Math.exp(h)));
  const down = Math.log(apparent(tau * Math.exp(-h)));
  return (2 * h) / (up - down);
}

describe("Rabinowitsch factor on fluids that are not power laws", () => {
  const fluids = [bingham(2000, 50), herschelBulkley(1500, 800, 0.45), ellis(5000, 2e4, 2.6)];
  for (const fluid of fluids) {
    test(`${fluid.name}: γ̇_a·factor(n') with n' from the closed form is the true wall rate, tube and slit`, () => {
      for (const w of [2, 30, 600]) {
        const tau = fluid.stress(w);
        // @check rabinowitsch | tube: γ̇_a(3n'+1)/(4n') with n' of the closed forms equals γ̇(τ_w) (Bingham, HB, Ellis; 3 stresses each) | Rabinowitsch, Z. Phys. Chem. A145 (1929) 1; closed forms of Buckingham 1921, Herschel & Bulkley 1926 and Bird, Armstrong & Hassager 1987 | rel 1e-6 | 9
        expectClose(fluid.tube(tau) * rabinowitschFactor(nPrimeOf(fluid.tube, tau)), w, { rel: 1e-6 }, `tube at γ̇w = ${w}`);
        // @check rabinowitsch | slit: γ̇_a(2n'+1)/(3n') with n' of the closed forms equals γ̇(τ_w) (Bingham, HB, Ellis; 3 stresses each) | Macosko, Rheology (1994), ch. 6 (from memory); closed forms of Bird, Dai & Yarusso 1983 and Chhabra & Richardson 2008 | rel 1e-6 | 9
        expectClose(fluid.slit(tau) * rabinowitschFactor(nPrimeOf(fluid.slit, tau), "slit"), w, { rel: 1e-6 }, `slit at γ̇w = ${w}`);
      }
    });
  }
});

describe("smoothed Rabinowitsch correction on exact closed-form flow curves", () => {
  // 10 wall stresses over a decade and a half; the transition curve is the default smoother.
  const cases: [Fluid, number][] = [
    [herschelBulkley(1500, 800, 0.45), 0.01],
    [ellis(5000, 2e4, 2.6), 0.01],
    [bingham(2000, 50), 0.02],
  ];
  // a Bingham curve bends hardest near the yield stress: its curve starts at φ ≈ 0.44
  const lowest = (fluid: Fluid) => (fluid.name.startsWith("Bingham") ? 50 : 5);
  for (const [fluid, tol] of cases) {
    test(`${fluid.name}: true wall rates within ${tol * 100} % (tube) and (slit)`, () => {
      const wall = Array.from({ length: 10 }, (_, i) => lowest(fluid) * Math.pow(100, i / 9));
      const tau = wall.map(fluid.stress);
      for (const geometry of ["round", "slit"] as const) {
        const apparent = tau.map(geometry === "round" ? fluid.tube : fluid.slit);
        const r = rabinowitschCorrection(apparent, tau, { geometry });
        // @check rabinowitsch, transitionCurve | default smoothed correction (transition curve) on exact Bingham/HB/Ellis curves, tube and slit (10 points each) | Buckingham 1921; Herschel & Bulkley 1926; Bird, Armstrong & Hassager 1987 (closed forms); tolerance measured here | rel 0.01–0.02 | 60
        r.shearRateWall.forEach((g, i) => expectClose(g as number, wall[i] as number, { rel: tol }, `${geometry} point ${i}`));
      }
    });
  }
});
