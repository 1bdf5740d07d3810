/**
 * Sisko model: η = η∞ + K·γ̇^(n−1) (Sisko, Ind. Eng. Chem. 50 (1958) 1789; from memory).
 */
import { lineFit, logPoints } from "./guess";
import { CONSISTENCY, ETA_INF, N_INDEX } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Sisko model `sisko`: etaInf (Pa·s), K (Pa·s^n), n (1). */
export const sisko: ModelDefinition = {
  id: "sisko",
  description: "Sisko: power law plus an infinite-shear plateau (greases, suspensions)",
  formula: "η = etaInf + K·γ̇^(n−1)",
  reference: "Sisko, Ind. Eng. Chem. 50 (1958) 1789 (from memory)",
  parameters: [ETA_INF, CONSISTENCY, N_INDEX],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity: (p, rate) => Math.log((p[0] as number) + (p[1] as number) * Math.pow(rate, (p[2] as number) - 1)),
  logGradient(p, rate, _t, out) {
    const lnRate = Math.log(rate);
    const power = (p[1] as number) * Math.exp(((p[2] as number) - 1) * lnRate);
    const eta = (p[0] as number) + power;
    out[0] = 1 / eta;
    out[1] = power / (p[1] as number) / eta;
    out[2] = (power * lnRate) / eta;
    return Math.log(eta);
  },
  initialGuess(data: GuessData) {
    const etaInf = 0.5 * Math.min(...data.viscosity);
    const excess = { ...data, viscosity: data.viscosity.map((v) => v - etaInf) };
    const { x, y } = logPoints(excess);
    const fit = lineFit(x, y);
    return [etaInf, Math.exp(fit.intercept), Math.min(0.95, Math.max(0.05, 1 + fit.slope))];
  },
};
