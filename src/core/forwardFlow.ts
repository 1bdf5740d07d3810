/**
 * Forward model of round-capillary flow: the apparent wall shear rate a generalised-Newtonian
 * liquid gives at a known wall stress, from the flow integral (Macosko 1994, eq. 6.2.12;
 * Bird, Armstrong & Hassager 1987, vol. 1, §4.2):
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

/**
 * Apparent wall shear rate 4Q/(πR³) of a liquid with viscosity function η(γ̇) at true wall rate
 * `wallRate` (1/s). The stress must rise with rate (η(g)·g increasing).
 * @param viscosity η(γ̇) in Pa·s
 * @param panels quadrature panels (default 60: relative error below 1e-9 for power laws)
 * @example apparentRateFromWallRate((g) => 10, 100) // 100 (Newtonian: Hagen–Poiseuille)
 */
export function apparentRateFromWallRate(viscosity: (rate: number) => number, wallRate: number, panels = 60): number {
  if (!(wallRate > 0) || !Number.isFinite(wallRate)) {
    throw new RheoError("domain", "wallRate", `must be greater than zero, got ${wallRate}`);
  }
  const stress = (g: number) => viscosity(g) * g;
  const slope = (g: number) => {
    const h = g * 1e-6;
    return (stress(g + h) - stress(g - h)) / (2 * h);
  };
  const tauW = stress(wallRate);
  const integral = integrateLogPanels((g) => stress(g) ** 2 * g * slope(g), wallRate, panels);
  return (4 / tauW ** 3) * integral;
}

/**
 * True wall rate at which the liquid gives the apparent rate `apparentRate` (inverse of
 * {@link apparentRateFromWallRate}, by bisection in ln γ̇; the ratio γ̇_w/γ̇_a lies in (0.5, 10)
 * for any shear-thinning or mildly thickening liquid with n > 0.1).
 * @returns γ̇_w in 1/s
 */
export function wallRateFromApparentRate(viscosity: (rate: number) => number, apparentRate: number): number {
  if (!(apparentRate > 0) || !Number.isFinite(apparentRate)) {
    throw new RheoError("domain", "apparentRate", `must be greater than zero, got ${apparentRate}`);
  }
  let lo = Math.log(apparentRate * 0.5);
  let hi = Math.log(apparentRate * 10);
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (apparentRateFromWallRate(viscosity, Math.exp(mid)) < apparentRate) lo = mid;
    else hi = mid;
  }
  return Math.exp((lo + hi) / 2);
}
