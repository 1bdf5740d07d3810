/**
 * Power law (Ostwald–de Waele): η = K·γ̇^(n−1) (Ostwald 1925; Bird, Armstrong & Hassager 1987,
 * vol. 1, ch. 4, from memory).
 */
import { lineFit, logPoints } from "./guess";
import { CONSISTENCY, N_INDEX } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Power-law model `power-law`: parameters K (Pa·s^n), n (1). */
export const powerLaw: ModelDefinition = {
  id: "power-law",
  description: "power law (Ostwald–de Waele), no plateau",
  formula: "η = K·γ̇^(n−1)",
  reference: "Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1 (1987), ch. 4 (from memory)",
  parameters: [CONSISTENCY, N_INDEX],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity: (p, rate) => Math.log(p[0] as number) + ((p[1] as number) - 1) * Math.log(rate),
  logGradient(p, rate, _t, out) {
    const lnRate = Math.log(rate);
    out[0] = 1 / (p[0] as number);
    out[1] = lnRate;
    return Math.log(p[0] as number) + ((p[1] as number) - 1) * lnRate;
  },
  logCurve(p, logRate, _t, logEta, gradient) {
    const lnK = Math.log(p[0] as number);
    const slope = (p[1] as number) - 1;
    const invK = 1 / (p[0] as number);
    for (let i = 0; i < logRate.length; i++) {
      const lnRate = logRate[i] as number;
      logEta[i] = lnK + slope * lnRate;
      if (gradient) {
        gradient[2 * i] = invK;
        gradient[2 * i + 1] = lnRate;
      }
    }
  },
  initialGuess(data: GuessData) {
    const { x, y } = logPoints(data);
    const fit = lineFit(x, y);
    return [Math.exp(fit.intercept), Math.max(0.01, 1 + fit.slope)];
  },
};
