/**
 * Carreau–Yasuda model: η = η∞ + (η0 − η∞)·[1 + (λγ̇)^a]^((n−1)/a)
 * (Yasuda, Armstrong & Cohen, Rheol. Acta 20 (1981) 163). With a = 2 it is the Carreau model.
 */
import { highRateIndex, inside, plateauViscosity, rateAtViscosity } from "./guess";
import { ETA0, ETA_INF, LAMBDA, N_INDEX, parameter } from "./parameterSpec";
import type { GuessData, ModelDefinition } from "./types";

/**
 * ln η of Carreau–Yasuda and, when `out` is given, ∂ln η/∂(eta0, etaInf, lambda, n, a) written
 * at out[0..4] (out[4] only when `withA`).
 */
export function carreauYasudaLog(
  eta0: number,
  etaInf: number,
  lambda: number,
  n: number,
  a: number,
  rate: number,
  out?: Float64Array,
  withA = true,
): number {
  const lnX = Math.log(lambda * rate);
  const x = a * lnX;
  // ln(1 + (λγ̇)^a) and (λγ̇)^a/(1 + (λγ̇)^a) share e^−|x|: the same values as softplus(x) and sigmoid(x).
  const e = Math.exp(-Math.abs(x));
  const lnB = (x > 0 ? x : 0) + Math.log1p(e);
  const f = Math.exp(((n - 1) / a) * lnB); // [1 + (λγ̇)^a]^((n−1)/a)
  const eta = etaInf + (eta0 - etaInf) * f;
  if (out) {
    const q = x >= 0 ? 1 / (1 + e) : e / (1 + e);
    const scale = ((eta0 - etaInf) * f) / eta;
    out[0] = f / eta;
    out[1] = (1 - f) / eta;
    out[2] = (scale * (n - 1) * q) / lambda;
    out[3] = (scale * lnB) / a;
    if (withA) out[4] = scale * (n - 1) * ((q * lnX) / a - lnB / (a * a));
  }
  return Math.log(eta);
}

/**
 * {@link carreauYasudaLog} over a whole curve, given ln γ̇ (γ̇ in 1/s): ln η_i into `logEta` and,
 * when `gradient` is given, ∂ln η_i/∂(eta0, etaInf, lambda, n, a) at gradient[i·stride + 0..4]
 * (the a-column only when `withA`). ln λ, (n − 1)/a and the reciprocals are taken once per call;
 * ln(λγ̇) = ln λ + ln γ̇. Same formulas and values (to rounding) as the per-point function.
 */
export function carreauYasudaCurve(
  eta0: number,
  etaInf: number,
  lambda: number,
  n: number,
  a: number,
  logRate: Float64Array,
  logEta: Float64Array,
  gradient: Float64Array | null,
  stride: number,
  withA: boolean,
): void {
  const lnLambda = Math.log(lambda);
  const exponent = (n - 1) / a;
  const span = eta0 - etaInf;
  const nMinus1 = n - 1;
  const invLambda = 1 / lambda;
  const invA = 1 / a;
  for (let i = 0; i < logRate.length; i++) {
    const lnX = lnLambda + (logRate[i] as number);
    const x = a * lnX;
    const e = Math.exp(-Math.abs(x));
    const lnB = (x > 0 ? x : 0) + Math.log1p(e);
    const f = Math.exp(exponent * lnB);
    const eta = etaInf + span * f;
    logEta[i] = Math.log(eta);
    if (gradient) {
      const invEta = 1 / eta;
      const q = x >= 0 ? 1 / (1 + e) : e / (1 + e);
      const scale = span * f * invEta;
      const row = i * stride;
      gradient[row] = f * invEta;
      gradient[row + 1] = (1 - f) * invEta;
      gradient[row + 2] = scale * nMinus1 * q * invLambda;
      gradient[row + 3] = scale * lnB * invA;
      if (withA) gradient[row + 4] = scale * nMinus1 * invA * (q * lnX - lnB * invA);
    }
  }
}

/** λ at which a Carreau–Yasuda curve with exponent a and index n halves η0 at rate `half`. */
export function lambdaFromHalfRate(half: number, n: number, a: number): number {
  return Math.pow(Math.pow(2, a / (1 - n)) - 1, 1 / a) / half;
}

/** Carreau–Yasuda guesses: plateau, high-rate slope, half-viscosity rate; a = 1. */
export function carreauYasudaGuess(data: GuessData, a: number): number[] {
  const eta0 = plateauViscosity(data);
  const n = highRateIndex(data);
  const half = rateAtViscosity(data, eta0 / 2);
  return [eta0, inside(0.3 * Math.min(...data.viscosity), 0), lambdaFromHalfRate(half, n, a), n, a];
}

/** Carreau–Yasuda model `carreau-yasuda`: eta0, etaInf (Pa·s), lambda (s), n, a (1). */
export const carreauYasuda: ModelDefinition = {
  id: "carreau-yasuda",
  description: "Carreau–Yasuda: Carreau with an adjustable transition sharpness a",
  formula: "η = etaInf + (eta0 − etaInf)·[1 + (lambda·γ̇)^a]^((n−1)/a)",
  reference: "Yasuda, Armstrong & Cohen, Rheol. Acta 20 (1981) 163",
  parameters: [ETA0, ETA_INF, LAMBDA, N_INDEX, parameter("a", "1", "Yasuda transition exponent a", 0)],
  needsTemperature: false,
  defaultFixed: {},
  hasYieldStress: false,
  logViscosity: (p, rate) =>
    carreauYasudaLog(p[0] as number, p[1] as number, p[2] as number, p[3] as number, p[4] as number, rate),
  logGradient: (p, rate, _t, out) =>
    carreauYasudaLog(p[0] as number, p[1] as number, p[2] as number, p[3] as number, p[4] as number, rate, out),
  logCurve: (p, logRate, _t, logEta, gradient) =>
    carreauYasudaCurve(p[0] as number, p[1] as number, p[2] as number, p[3] as number, p[4] as number, logRate, logEta, gradient, 5, true),
  initialGuess: (data) => carreauYasudaGuess(data, 1),
};
