/**
 * Cross model: η = η∞ + (η0 − η∞)/(1 + (λγ̇)^m) (Cross, J. Colloid Sci. 20 (1965) 417).
 */
import { highRateIndex, inside, plateauViscosity, rateAtViscosity } from "./guess";
import { sigmoid } from "./numerics";
import { ETA0, ETA_INF, LAMBDA, parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/** Cross model `cross`: eta0 (Pa·s), etaInf (Pa·s), lambda (s), m (1). */
export const cross: ModelDefinition = {
  id: "cross",
  description: "Cross: two Newtonian plateaus joined by a power-law region",
  formula: "η = etaInf + (eta0 − etaInf)/(1 + (lambda·γ̇)^m)",
  reference: "Cross, J. Colloid Sci. 20 (1965) 417",
  parameters: [ETA0, ETA_INF, LAMBDA, parameter("m", "1", "Cross rate exponent m (high-rate slope of log η is −m)", 0)],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity(p, rate) {
    const [eta0, etaInf, lambda, m] = [p[0] as number, p[1] as number, p[2] as number, p[3] as number];
    const q = sigmoid(-m * Math.log(lambda * rate)); // 1/(1 + x), x = (λγ̇)^m
    return Math.log(etaInf + (eta0 - etaInf) * q);
  },
  logGradient(p, rate, _t, out) {
    const [eta0, etaInf, lambda, m] = [p[0] as number, p[1] as number, p[2] as number, p[3] as number];
    const lnX = Math.log(lambda * rate);
    const q = sigmoid(-m * lnX);
    const eta = etaInf + (eta0 - etaInf) * q;
    const dq = -(eta0 - etaInf) * q * (1 - q); // (η0 − η∞)·d(1/(1+x))/d ln x, per unit of ln x
    out[0] = q / eta;
    out[1] = (1 - q) / eta;
    out[2] = (dq * m) / lambda / eta;
    out[3] = (dq * lnX) / eta;
    return Math.log(eta);
  },
  logCurve(p, logRate, _t, logEta, gradient) {
    const [eta0, etaInf, lambda, m] = [p[0] as number, p[1] as number, p[2] as number, p[3] as number];
    const lnLambda = Math.log(lambda);
    const span = eta0 - etaInf;
    const mOverLambda = m / lambda;
    for (let i = 0; i < logRate.length; i++) {
      const lnX = lnLambda + (logRate[i] as number);
      const q = sigmoid(-m * lnX);
      const eta = etaInf + span * q;
      logEta[i] = Math.log(eta);
      if (gradient) {
        const invEta = 1 / eta;
        const dq = -span * q * (1 - q);
        const row = 4 * i;
        gradient[row] = q * invEta;
        gradient[row + 1] = (1 - q) * invEta;
        gradient[row + 2] = dq * mOverLambda * invEta;
        gradient[row + 3] = dq * lnX * invEta;
      }
    }
  },
  initialGuess(data: GuessData) {
    const eta0 = plateauViscosity(data);
    const m = 1 - highRateIndex(data);
    const half = rateAtViscosity(data, eta0 / 2);
    return [eta0, inside(0.3 * Math.min(...data.viscosity), 0), 1 / half, m];
  },
};
