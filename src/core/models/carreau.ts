/**
 * Carreau model: η = η∞ + (η0 − η∞)·[1 + (λγ̇)²]^((n−1)/2) (Carreau, Trans. Soc. Rheol. 16 (1972) 99).
 */
import { carreauYasudaCurve, carreauYasudaGuess, carreauYasudaLog } from "./carreauYasuda";
import { ETA0, ETA_INF, LAMBDA, N_INDEX } from "./parameterSpec";
import type { ModelDefinition } from "./types";

/** Carreau model `carreau`: eta0, etaInf (Pa·s), lambda (s), n (1). */
export const carreau: ModelDefinition = {
  id: "carreau",
  description: "Carreau: smooth plateau-to-power-law transition",
  formula: "η = etaInf + (eta0 − etaInf)·[1 + (lambda·γ̇)²]^((n−1)/2)",
  reference: "Carreau, Trans. Soc. Rheol. 16 (1972) 99",
  parameters: [ETA0, ETA_INF, LAMBDA, N_INDEX],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity: (p, rate) => carreauYasudaLog(p[0] as number, p[1] as number, p[2] as number, p[3] as number, 2, rate),
  logGradient: (p, rate, _t, out) =>
    carreauYasudaLog(p[0] as number, p[1] as number, p[2] as number, p[3] as number, 2, rate, out, false),
  logCurve: (p, logRate, _t, logEta, gradient) =>
    carreauYasudaCurve(p[0] as number, p[1] as number, p[2] as number, p[3] as number, 2, logRate, logEta, gradient, 4, false),
  initialGuess: (data) => carreauYasudaGuess(data, 2).slice(0, 4),
};
