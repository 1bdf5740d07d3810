/**
 * Synthetic capillary runs with a known answer, for tests and `npm run bench` (invented data, no
 * real material). For a generalized-Newtonian melt η(γ̇) and a round die of bore D:
 *
 *   true wall rate γ̇_w at each apparent rate γ̇_a: the flow integral inverted
 *     (src/core/forwardFlow.ts; Macosko 1994, ch. 6, from memory), τ_w = η(γ̇_w)·γ̇_w;
 *   pressure of a die of L/R = x: ΔP = 2τ_w·(x + e(γ̇_a)) (Bagley 1957), or, with a pressure
 *     coefficient β (η ∝ exp(βp), Barus 1893; Laun 2004, Rheol. Acta 43, 509), the land's pressure
 *     from dp/dz = (2/R)·τ_w·e^(βp): p(L) = −ln(1 − 2βτ_w·x)/β, plus the entrance loss 2τ_w·e·e^(βp).
 * Relative Gaussian noise (seeded, src/core/random.ts) multiplies each pressure.
 */
import { wallRateFromApparentRate } from "../../src/core/forwardFlow";
import { flowRateForApparentShearRate } from "../../src/core/capillary";
import { gaussian, seededRandom } from "../../src/core/random";
import type { Measurement } from "../../src/core/reduce";

/** Carreau–Yasuda η0[1 + (λγ̇)^a]^((n−1)/a) (Yasuda, Armstrong & Cohen 1981). */
export const carreauYasuda = (eta0: number, lambda: number, a: number, n: number) => (g: number) => eta0 * Math.pow(1 + (lambda * g) ** a, (n - 1) / a);

/** Cross η0/(1 + (λγ̇)^m) (Cross 1965). */
export const cross = (eta0: number, lambda: number, m: number) => (g: number) => eta0 / (1 + (lambda * g) ** m);

/** The benchmark melts of issue 12: shear-thinning with the knee inside or below the range. */
export const BENCH_MELTS = Object.freeze({
  "Carreau–Yasuda": carreauYasuda(5000, 0.2, 0.7, 0.3),
  Cross: cross(3000, 0.05, 0.7),
});

/** The true flow curve at the given apparent rates. */
export interface TrueCurve {
  rates: number[];
  wallRates: number[];
  stresses: number[];
}

/** γ̇_w and τ_w at each apparent rate (1/s) of a melt η(γ̇) (Pa·s). */
export function trueCurve(viscosity: (rate: number) => number, rates: number[]): TrueCurve {
  const wallRates = rates.map((r) => wallRateFromApparentRate(viscosity, r));
  return { rates, wallRates, stresses: wallRates.map((w) => viscosity(w) * w) };
}

/** Log-spaced apparent rates. */
export function logRates(lo: number, hi: number, count: number): number[] {
  return Array.from({ length: count }, (_, i) => lo * Math.pow(hi / lo, i / (count - 1)));
}

/** Options of {@link capillaryRun}. */
export interface RunOptions {
  /** die bore, m (default 1 mm) */
  dieDiameter?: number;
  /** L/D of the dies (default 5, 10, 20, 30) */
  lengthsOverDiameter?: number[];
  /** Bagley end correction e(γ̇_a) in radii (default 2 + 1.5·log10(γ̇_a/10)) */
  endCorrection?: (rate: number) => number;
  /** relative pressure noise (default 0) and its seed */
  noise?: number;
  seed?: number;
  /** pressure coefficient of viscosity β, 1/Pa (default 0) */
  pressureCoefficient?: number;
  /** multiplies the pressure of a die at a rate (a spurt, a drift) */
  distort?: (rate: number, lengthOverDiameter: number) => number;
}

/** Raw measurements of a run over `curve.rates` on every die (rows numbered die by die). */
export function capillaryRun(curve: TrueCurve, options: RunOptions = {}): Measurement[] {
  const D = options.dieDiameter ?? 1e-3;
  const e = options.endCorrection ?? ((r: number) => 2 + 1.5 * Math.log10(r / 10));
  const beta = options.pressureCoefficient ?? 0;
  const random = seededRandom(options.seed ?? 1);
  const out: Measurement[] = [];
  for (const ld of options.lengthsOverDiameter ?? [5, 10, 20, 30]) {
    curve.rates.forEach((rate, i) => {
      const tau = curve.stresses[i] as number;
      const x = 2 * ld;
      const land = beta === 0 ? 2 * tau * x : -Math.log(1 - 2 * beta * tau * x) / beta;
      const clean = land + 2 * tau * e(rate) * Math.exp(beta * land);
      const pressure = clean * (options.distort?.(rate, ld) ?? 1) * (1 + (options.noise ?? 0) * gaussian(random));
      out.push({ dieDiameter: D, dieLength: ld * D, flowRate: flowRateForApparentShearRate(rate, D), pressure, row: out.length + 2 });
    });
  }
  return out;
}

/** Largest |γ̇_w,reduced/γ̇_w,true − 1| over the points of a flow curve that lie on the true curve's rates. */
export function worstWallRateError(curve: TrueCurve, flowCurve: { shearRateApparent: number; shearRateWall: number | null }[]): number {
  let worst = 0;
  for (const f of flowCurve) {
    const i = curve.rates.findIndex((r) => Math.abs(r / f.shearRateApparent - 1) < 1e-9);
    if (i < 0) continue;
    const w = f.shearRateWall === null ? Infinity : Math.abs(f.shearRateWall / (curve.wallRates[i] as number) - 1);
    worst = Math.max(worst, w);
  }
  return worst;
}
