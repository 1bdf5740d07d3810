/**
 * Newtonian liquid: η = μ (Newton 1687; e.g. Macosko 1994, ch. 2).
 */
import { parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Newtonian model `newtonian`: constant viscosity μ (Pa·s). */
export const newtonian: ModelDefinition = {
  id: "newtonian",
  description: "constant viscosity",
  formula: "η = mu",
  reference: "Macosko, Rheology (1994), ch. 2",
  parameters: [parameter("mu", "Pa.s", "Newtonian viscosity μ", 0)],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity: (p) => Math.log(p[0] as number),
  logGradient(p, _rate, _t, out) {
    const mu = p[0] as number;
    out[0] = 1 / mu;
    return Math.log(mu);
  },
  initialGuess(data: GuessData) {
    const meanLog = data.viscosity.reduce((s, v) => s + Math.log(v), 0) / data.viscosity.length;
    return [Math.exp(meanLog)];
  },
};
