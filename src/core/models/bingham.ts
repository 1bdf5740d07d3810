/**
 * Bingham plastic: τ = τy + μp·γ̇ above the yield stress, so η = τ/γ̇ = τy/γ̇ + μp
 * (Bingham, Fluidity and Plasticity (1922); Macosko 1994, ch. 2).
 */
import { inside, lineFit, stresses } from "./guess";
import { TAU_Y, parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Shear stress τ (Pa) of a Bingham plastic at rate γ̇ (1/s). */
export function binghamStress(tauY: number, muP: number, rate: number): number {
  return tauY + muP * rate;
}

/** Bingham model `bingham`: tauY (Pa), muP (Pa·s). */
export const bingham: ModelDefinition = {
  id: "bingham",
  description: "Bingham plastic: yield stress plus constant plastic viscosity",
  formula: "τ = tauY + muP·γ̇; η = τ/γ̇",
  reference: "Bingham, Fluidity and Plasticity (1922); Macosko, Rheology (1994), ch. 2",
  parameters: [TAU_Y, parameter("muP", "Pa.s", "plastic viscosity μp", 0)],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: true,
  logViscosity: (p, rate) => Math.log(binghamStress(p[0] as number, p[1] as number, rate) / rate),
  logGradient(p, rate, _t, out) {
    const tau = binghamStress(p[0] as number, p[1] as number, rate);
    out[0] = 1 / tau;
    out[1] = rate / tau;
    return Math.log(tau / rate);
  },
  initialGuess(data: GuessData) {
    const tau = stresses(data);
    const fit = lineFit([...data.shearRate], tau);
    const minTau = Math.min(...tau);
    const tauY = fit.intercept > 0 ? Math.min(fit.intercept, 0.99 * minTau) : 0.1 * minTau;
    const muP = fit.slope > 0 ? fit.slope : Math.min(...data.viscosity);
    return [inside(tauY, 0), muP];
  },
};
