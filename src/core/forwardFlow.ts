/**
 * Forward model of round-capillary flow: the apparent wall shear rate a generalised-Newtonian
 * liquid gives at a known wall stress, from the flow integral (Macosko 1994, ch. 6, from memory;
 * Bird, Armstrong & Hassager 1987, vol. 1, ch. 4, from memory):
 *
 *   γ̇_a = 4Q/(πR³) = (4/τ_w³) ∫₀^τw τ² γ̇(τ) dτ.
 *
 * Written over the rate g with τ = f(g) = η(g)·g:  γ̇_a = (4/τ_w³) ∫₀^γ̇w f(g)² g f'(g) dg.
 * Used to predict pressures (test planning) and to make synthetic data whose true wall rate is
 * known independently of the Rabinowitsch formula.
 */
import { RheoError } from "./errors";

const GL_NODES = [
  0.0950125098376374, 0.2816035507792589, 0.4580167776572274, 0.6178762444026438, 0.755404408355003,
  0.8656312023878318, 0.9445750230732326, 0.9894009349916499,
];
const GL_WEIGHTS = [
  0.1894506104550685, 0.1826034150449236, 0.1691565193950025, 0.1495959888165767, 0.1246289712555339,
  0.0951585116824928, 0.0622535239386479, 0.0271524594117541,
];

/** ∫ fn over (upper·1e-12, upper] by 16-point Gauss–Legendre on log-spaced panels (shared with slitFlow.ts). */
export function integrateLogPanels(fn: (g: number) => number, upper: number, panels: number): number {
  const lower = upper * 1e-12;
  let total = 0;
  for (let k = 0; k < panels; k++) {
    const a = lower * Math.pow(upper / lower, k / panels);
    const b = lower * Math.pow(upper / lower, (k + 1) / panels);
    const mid = (a + b) / 2;
    const half = (b - a) / 2;
    let s = 0;
    for (let i = 0; i < GL_NODES.length; i++) {
      const x = GL_NODES[i] as number;
      s += (GL_WEIGHTS[i] as number) * (fn(mid - half * x) + fn(mid + half * x));
    }
    total += s * half;
  }
  return total;
}

/** Throws unless `value` (a rate, 1/s) is finite and > 0. */
function requireRate(value: number, argument: string): void {
  if (!(value > 0) || !Number.isFinite(value)) {
    throw new RheoError("domain", argument, `must be greater than zero, got ${value}`);
  }
}

/**
 * The flow integral shared by round and slit dies, over the rate g with the stress f(g) = η(g)·g:
 *   I_k = ∫₀^γ̇w f(g)^k · g · f'(g) dg   (k = 2: round capillary, k = 1: slit),
 * f' by a central difference (step 1e-6·g). Returns I_k and the wall stress τ_w = f(γ̇_w), Pa.
 * Round: γ̇_a = 4·I₂/τ_w³ (below); slit: γ̇_a = 3·I₁/τ_w² (slitFlow.ts).
 * @param viscosity η(γ̇) in Pa·s; wallRate γ̇_w in 1/s (> 0); power k; panels of {@link integrateLogPanels}
 */
export function wallStressMoment(viscosity: (rate: number) => number, wallRate: number, power: number, panels: number): { integral: number; wallStress: number } {
  requireRate(wallRate, "wallRate");
  const stress = (g: number) => viscosity(g) * g;
  const slope = (g: number) => {
    const h = g * 1e-6;
    return (stress(g + h) - stress(g - h)) / (2 * h);
  };
  const integral = integrateLogPanels((g) => stress(g) ** power * g * slope(g), wallRate, panels);
  return { integral, wallStress: stress(wallRate) };
}

/**
 * Apparent wall shear rate 4Q/(πR³) of a liquid with viscosity function η(γ̇) at true wall rate
 * `wallRate` (1/s). The stress must rise with rate (η(g)·g increasing).
 * @param viscosity η(γ̇) in Pa·s
 * @param panels quadrature panels (default 60: relative error below 1e-9 for power laws)
 * @example apparentRateFromWallRate((g) => 10, 100) // 100 (Newtonian: Hagen–Poiseuille)
 */
export function apparentRateFromWallRate(viscosity: (rate: number) => number, wallRate: number, panels = 60): number {
  const { integral, wallStress } = wallStressMoment(viscosity, wallRate, 2, panels);
  return (4 / wallStress ** 3) * integral;
}

/**
 * Where the inversion looks for the true wall rate, as multiples of the apparent rate: γ̇_w/γ̇_a
 * lies in (0.5, 10) for any shear-thinning or mildly thickening liquid with n > 0.1 (power law:
 * (3n+1)/(4n) round, (2n+1)/(3n) slit; a Newtonian liquid gives 1).
 */
export const DEFAULT_INVERSION_BRACKET: Readonly<{ low: number; high: number }> = { low: 0.5, high: 10 };

/** Default accuracy of {@link invertApparentRate}: |ln(forward(γ̇_w)/γ̇_a)| at the returned rate. */
export const DEFAULT_INVERSION_TOLERANCE = 1e-12;

/** Tuning and message context of {@link invertApparentRate}. */
export interface InversionOptions {
  /** stop when |ln(forward/target)| ≤ tolerance (default {@link DEFAULT_INVERSION_TOLERANCE}) */
  tolerance?: number;
  /** appended to the rate in messages, e.g. ` in die "A"` (default none) */
  where?: string;
  /** appended to the out-of-bracket message, e.g. `; this prior cannot be planned with` (default none) */
  consequence?: string;
}

/**
 * True wall rate γ̇_w at which a forward flow model gives the apparent rate `apparentRate`: the root
 * of ln forward(e^x) − ln γ̇_a on x ∈ [ln(low·γ̇_a), ln(high·γ̇_a)] by the Illinois variant of
 * regula falsi (Dowell & Jarratt 1971), about ten to fifteen flow integrals where bisection to
 * full precision needs sixty. `forward` must rise with the wall rate. A root outside the bracket
 * is an error, never clipped to the bracket's edge.
 * @param forward γ̇_w ↦ γ̇_a, both 1/s (e.g. `(w) => apparentRateFromWallRate(eta, w)`)
 * @param apparentRate γ̇_a in 1/s (> 0)
 * @param bracket multiples of γ̇_a to search (default {@link DEFAULT_INVERSION_BRACKET})
 * @returns γ̇_w in 1/s
 * @throws RheoError("domain", "apparentRate") for a rate ≤ 0; RheoError("convergence", "viscosity")
 *   when the root lies outside the bracket or the iteration does not settle.
 * @example invertApparentRate((w) => apparentRateFromWallRate(() => 10, w), 100) // 100 (Newtonian)
 */
export function invertApparentRate(
  forward: (wallRate: number) => number,
  apparentRate: number,
  bracket: Readonly<{ low: number; high: number }> = DEFAULT_INVERSION_BRACKET,
  options: InversionOptions = {},
): number {
  requireRate(apparentRate, "apparentRate");
  const { tolerance = DEFAULT_INVERSION_TOLERANCE, where = "", consequence = "" } = options;
  const f = (x: number) => Math.log(forward(Math.exp(x)) / apparentRate);
  let a = Math.log(bracket.low * apparentRate);
  let b = Math.log(bracket.high * apparentRate);
  let fa = f(a);
  let fb = f(b);
  if (!(fa <= 0 && fb >= 0)) {
    throw new RheoError(
      "convergence",
      "viscosity",
      `at ${apparentRate.toPrecision(4)} 1/s${where} the true wall rate lies outside ${bracket.low}–${bracket.high} × the apparent rate (a very strong yield stress or thickening?)${consequence}`,
    );
  }
  let side = 0;
  for (let i = 0; i < 100; i++) {
    const c = (a * fb - b * fa) / (fb - fa);
    const fc = f(c);
    if (Math.abs(fc) <= tolerance || b - a <= 1e-14) return Math.exp(c);
    if (fc < 0) {
      a = c;
      fa = fc;
      if (side === -1) fb /= 2;
      side = -1;
    } else {
      b = c;
      fb = fc;
      if (side === 1) fa /= 2;
      side = 1;
    }
  }
  throw new RheoError("convergence", "viscosity", `the wall rate at ${apparentRate.toPrecision(4)} 1/s${where} did not converge`);
}

/**
 * True wall rate at which the liquid gives the apparent rate `apparentRate` (inverse of
 * {@link apparentRateFromWallRate} by {@link invertApparentRate} over γ̇_w/γ̇_a in (0.5, 10)).
 * @returns γ̇_w in 1/s
 * @throws RheoError("convergence") when γ̇_w/γ̇_a lies outside (0.5, 10)
 * @example wallRateFromApparentRate((g) => 1e4 * g ** -0.5, 100) // 125 = 100·(3n+1)/(4n), n = 0.5
 */
export function wallRateFromApparentRate(viscosity: (rate: number) => number, apparentRate: number): number {
  return invertApparentRate((wall) => apparentRateFromWallRate(viscosity, wall), apparentRate);
}
