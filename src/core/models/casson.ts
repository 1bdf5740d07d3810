/**
 * Casson: √τ = √τy + √(ηc·γ̇) above the yield stress, η = τ/γ̇ (Casson 1959, in Mill (ed.),
 * Rheology of Disperse Systems, Pergamon; from memory).
 */
import { inside, lineFit, stresses } from "./guess";
import { TAU_Y, parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Shear stress τ (Pa) of a Casson fluid at rate γ̇ (1/s). */
export function cassonStress(tauY: number, etaC: number, rate: number): number {
  const root = Math.sqrt(tauY) + Math.sqrt(etaC * rate);
  return root * root;
}

/** Casson model `casson`: tauY (Pa), etaC (Pa·s). */
export const casson: ModelDefinition = {
  id: "casson",
  description: "Casson: √τ linear in √γ̇ (pigment pastes, chocolate, blood)",
  formula: "√τ = √tauY + √(etaC·γ̇); η = τ/γ̇",
  reference: "Casson, in Rheology of Disperse Systems (Pergamon 1959) 84 (from memory)",
  parameters: [TAU_Y, parameter("etaC", "Pa.s", "Casson viscosity ηc (high-rate limit of η)", 0)],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: true,
  logViscosity: (p, rate) => Math.log(cassonStress(p[0] as number, p[1] as number, rate) / rate),
  logGradient(p, rate, _t, out) {
    const [tauY, etaC] = [p[0] as number, p[1] as number];
    const sqrtY = Math.sqrt(tauY);
    const sqrtC = Math.sqrt(etaC * rate);
    const root = sqrtY + sqrtC;
    // ln η = 2 ln(√τy + √(ηc γ̇)) − ln γ̇
    out[0] = 1 / (root * sqrtY);
    out[1] = sqrtC / (root * etaC);
    return 2 * Math.log(root) - Math.log(rate);
  },
  initialGuess(data: GuessData) {
    const fit = lineFit(data.shearRate.map(Math.sqrt), stresses(data).map(Math.sqrt));
    const minTau = Math.min(...stresses(data));
    const tauY = fit.intercept > 0 ? Math.min(fit.intercept ** 2, 0.99 * minTau) : 0.1 * minTau;
    const etaC = fit.slope > 0 ? fit.slope ** 2 : Math.min(...data.viscosity);
    return [inside(tauY, 0), etaC];
  },
};
