/**
 * Ellis model, stress-based: η = η0/(1 + (τ/τ½)^(α−1)) with τ = η·γ̇ (Ellis 1927, see Bird,
 * Armstrong & Hassager 1987 vol. 1, ch. 4 and Matsuhisa & Bird, AIChE J. 11 (1965) 588; from memory).
 *
 * Rheoledger fits η against γ̇ like every other model: η(γ̇) is the root of
 * G(L) = L − ln η0 + ln(1 + exp((α−1)(L + ln γ̇ − ln τ½))) = 0 in L = ln η, found by Newton's
 * method. G is increasing and convex in L for α > 1, and G(ln η0) ≥ 0, so Newton's method from
 * L = ln η0 descends monotonically to the unique root. The gradient follows by implicit
 * differentiation: ∂L/∂p = −(∂G/∂p)/(∂G/∂L).
 */
import { highRateIndex, plateauViscosity, rateAtViscosity } from "./guess";
import { sigmoid, softplus } from "./numerics";
import { ETA0, parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** η (Pa·s) of the Ellis model at shear stress τ (Pa): the defining, explicit form. */
export function ellisViscosityFromStress(eta0: number, tauHalf: number, alpha: number, stress: number): number {
  return eta0 / (1 + Math.pow(stress / tauHalf, alpha - 1));
}

/** ln η of the Ellis model at shear rate γ̇, solved from the stress form (see module comment). */
export function ellisLogViscosity(eta0: number, tauHalf: number, alpha: number, rate: number): number {
  const target = Math.log(eta0);
  const shift = Math.log(rate) - Math.log(tauHalf);
  let lnEta = target;
  for (let i = 0; i < 200; i++) {
    const arg = (alpha - 1) * (lnEta + shift);
    const g = lnEta + softplus(arg) - target;
    const step = g / (1 + (alpha - 1) * sigmoid(arg));
    lnEta -= step;
    if (Math.abs(step) <= 1e-15 * Math.max(1, Math.abs(lnEta))) break;
  }
  return lnEta;
}

/** Ellis model `ellis`: eta0 (Pa·s), tauHalf (Pa), alpha (1, > 1 for shear thinning). */
export const ellis: ModelDefinition = {
  id: "ellis",
  description: "Ellis (stress-based), solved for η(γ̇): plateau, then power law in the stress",
  formula: "η = eta0/(1 + (τ/tauHalf)^(alpha−1)), τ = η·γ̇ (solved for η at each γ̇)",
  reference: "Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1 (1987), ch. 4 (from memory)",
  parameters: [
    ETA0,
    parameter("tauHalf", "Pa", "shear stress τ½ at which η = η0/2", 0),
    parameter("alpha", "1", "Ellis exponent α (> 1; high-stress slope of log η vs log τ is 1 − α)", 1),
  ],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity: (p, rate) => ellisLogViscosity(p[0] as number, p[1] as number, p[2] as number, rate),
  logGradient(p, rate, _t, out) {
    const [eta0, tauHalf, alpha] = [p[0] as number, p[1] as number, p[2] as number];
    const lnEta = ellisLogViscosity(eta0, tauHalf, alpha, rate);
    const lnRatio = lnEta + Math.log(rate) - Math.log(tauHalf); // ln(τ/τ½)
    const q = sigmoid((alpha - 1) * lnRatio);
    const dG = 1 + (alpha - 1) * q;
    out[0] = 1 / (eta0 * dG);
    out[1] = ((alpha - 1) * q) / (tauHalf * dG);
    out[2] = (-q * lnRatio) / dG;
    return lnEta;
  },
  initialGuess(data: GuessData) {
    const eta0 = plateauViscosity(data);
    const n = highRateIndex(data);
    const half = rateAtViscosity(data, eta0 / 2);
    return [eta0, (eta0 / 2) * half, 1 / n];
  },
};
