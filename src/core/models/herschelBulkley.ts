/**
 * Herschel–Bulkley: τ = τy + K·γ̇^n above the yield stress, η = τ/γ̇
 * (Herschel & Bulkley, Kolloid-Z. 39 (1926) 291; from memory).
 */
import { lineFit, stresses } from "./guess";
import { CONSISTENCY, N_INDEX, TAU_Y } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Shear stress τ (Pa) of a Herschel–Bulkley fluid at rate γ̇ (1/s). */
export function herschelBulkleyStress(tauY: number, K: number, n: number, rate: number): number {
  return tauY + K * Math.pow(rate, n);
}

/** Herschel–Bulkley model `herschel-bulkley`: tauY (Pa), K (Pa·s^n), n (1). */
export const herschelBulkley: ModelDefinition = {
  id: "herschel-bulkley",
  description: "Herschel–Bulkley: yield stress plus power-law stress",
  formula: "τ = tauY + K·γ̇^n; η = τ/γ̇",
  reference: "Herschel & Bulkley, Kolloid-Z. 39 (1926) 291 (from memory)",
  parameters: [TAU_Y, CONSISTENCY, N_INDEX],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: true,
  logViscosity: (p, rate) => Math.log(herschelBulkleyStress(p[0] as number, p[1] as number, p[2] as number, rate) / rate),
  logGradient(p, rate, _t, out) {
    const power = (p[1] as number) * Math.pow(rate, p[2] as number);
    const tau = (p[0] as number) + power;
    out[0] = 1 / tau;
    out[1] = power / (p[1] as number) / tau;
    out[2] = (power * Math.log(rate)) / tau;
    return Math.log(tau / rate);
  },
  /** Tries yield stresses 0.1–0.9 of the lowest stress; keeps the straightest log(τ − τy) line. */
  initialGuess(data: GuessData) {
    const tau = stresses(data);
    const minTau = Math.min(...tau);
    const x = data.shearRate.map(Math.log);
    let best = { sse: Infinity, guess: [0.1 * minTau, 1, 0.5] };
    for (const fraction of [0.1, 0.3, 0.5, 0.7, 0.9]) {
      const tauY = fraction * minTau;
      const y = tau.map((t) => Math.log(t - tauY));
      const fit = lineFit(x, y);
      const sse = y.reduce((s, v, i) => s + (v - fit.intercept - fit.slope * (x[i] as number)) ** 2, 0);
      if (sse < best.sse && fit.slope > 0) best = { sse, guess: [tauY, Math.exp(fit.intercept), fit.slope] };
    }
    return best.guess;
  },
};
