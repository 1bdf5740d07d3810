/**
 * Cross-WLF (Hieber & Shen, J. Non-Newt. Fluid Mech. 7 (1980) 1):
 *   η = η0/(1 + (η0·γ̇/τ*)^(1−n)),   η0(T) = D1·exp(−A1·(T − T*)/(A2 + T − T*)).
 * T* is commonly the glass transition; A2 is commonly held at 51.6 K, the "universal" WLF C2
 * (Williams, Landel & Ferry, J. Am. Chem. Soc. 77 (1955) 3701). A2 + T − T* must stay positive.
 */
import { highRateIndex, lineFit, plateauViscosity, rateAtViscosity } from "./guess";
import { sigmoid, softplus } from "./numerics";
import { parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** The WLF-type constant A2 (K) held fixed by default: 51.6 K (Williams, Landel & Ferry 1955). */
export const CROSS_WLF_DEFAULT_A2 = 51.6;

/** ln η0(T) of Cross-WLF; NaN where A2 + T − T* ≤ 0 (outside the model's range). */
export function crossWlfLogZeroShear(D1: number, A1: number, A2: number, Tstar: number, temperature: number): number {
  const dT = temperature - Tstar;
  const den = A2 + dT;
  return den > 0 ? Math.log(D1) - (A1 * dT) / den : NaN;
}

/** Parameter order: D1, A1, A2, Tstar, tauStar, n. */
export const crossWlf: ModelDefinition = {
  id: "cross-wlf",
  description: "Cross-WLF: Cross shear thinning with a WLF-type temperature-dependent η0",
  formula: "η = η0/(1 + (η0·γ̇/tauStar)^(1−n)), η0 = D1·exp(−A1(T − Tstar)/(A2 + T − Tstar))",
  reference: "Hieber & Shen, J. Non-Newt. Fluid Mech. 7 (1980) 1",
  parameters: [
    parameter("D1", "Pa.s", "zero-shear viscosity at T = T*", 0),
    parameter("A1", "1", "WLF-type constant A1", 0),
    parameter("A2", "K", "WLF-type constant A2 (held at 51.6 K unless freed)", 0),
    parameter("Tstar", "K", "reference temperature T* (commonly the glass transition)", 0),
    parameter("tauStar", "Pa", "critical stress τ* at the onset of shear thinning", 0),
    parameter("n", "1", "flow index n (0 < n < 1)", 0, { max: 1 }),
  ],
  needsTemperature: true,
  defaultFixed: { A2: CROSS_WLF_DEFAULT_A2 },
  hasYieldStress: false,
  logViscosity(p, rate, temperature) {
    const lnEta0 = crossWlfLogZeroShear(p[0] as number, p[1] as number, p[2] as number, p[3] as number, temperature);
    const [tauStar, n] = [p[4] as number, p[5] as number];
    return lnEta0 - softplus((1 - n) * (lnEta0 + Math.log(rate / tauStar)));
  },
  logGradient(p, rate, temperature, out) {
    const [D1, A1, A2, Tstar, tauStar, n] = [p[0] as number, p[1] as number, p[2] as number, p[3] as number, p[4] as number, p[5] as number];
    const lnEta0 = crossWlfLogZeroShear(D1, A1, A2, Tstar, temperature);
    const lnY = lnEta0 + Math.log(rate / tauStar); // ln(η0 γ̇/τ*)
    const q = sigmoid((1 - n) * lnY);
    const viaEta0 = 1 - (1 - n) * q; // ∂ln η/∂ln η0
    const dT = temperature - Tstar;
    const den = A2 + dT;
    out[0] = viaEta0 / D1;
    out[1] = (-viaEta0 * dT) / den;
    out[2] = (viaEta0 * A1 * dT) / (den * den);
    out[3] = (viaEta0 * A1 * A2) / (den * den);
    out[4] = ((1 - n) * q) / tauStar;
    out[5] = q * lnY;
    return lnEta0 - softplus((1 - n) * lnY);
  },
  /**
   * T* = lowest temperature − 100 K and A2 = 51.6 K (common practice, no source); D1 and A1 from a
   * straight line of ln η0(T) against 1/(A2 + T − T*) over the per-temperature plateaus;
   * n from the high-rate slope; τ* = η0·γ̇½ (where η = η0/2).
   */
  initialGuess(data: GuessData) {
    const temps = data.temperature ?? data.shearRate.map(() => 473.15);
    const groups = new Map<number, { shearRate: number[]; viscosity: number[] }>();
    temps.forEach((t, i) => {
      const g = groups.get(t) ?? { shearRate: [], viscosity: [] };
      g.shearRate.push(data.shearRate[i] as number);
      g.viscosity.push(data.viscosity[i] as number);
      groups.set(t, g);
    });
    const A2 = CROSS_WLF_DEFAULT_A2;
    const Tstar = Math.min(...temps) - 100;
    const xs: number[] = [];
    const ys: number[] = [];
    let sumLnTau = 0;
    let sumN = 0;
    for (const [t, g] of groups) {
      const eta0 = plateauViscosity(g);
      xs.push(1 / (A2 + t - Tstar));
      ys.push(Math.log(eta0));
      sumLnTau += Math.log(eta0 * rateAtViscosity(g, eta0 / 2));
      sumN += g.shearRate.length >= 2 ? highRateIndex(g) : 0.3;
    }
    const line = xs.length >= 2 ? lineFit(xs, ys) : { slope: 20 * A2, intercept: (ys[0] as number) - 20 * A2 * (xs[0] as number) };
    const A1 = line.slope > 0 ? line.slope / A2 : 20;
    const intercept = line.slope > 0 ? line.intercept : (ys[0] as number) - A1 * A2 * (xs[0] as number);
    return [Math.exp(intercept + A1), A1, A2, Tstar, Math.exp(sumLnTau / groups.size), sumN / groups.size];
  },
};
