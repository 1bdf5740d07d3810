/**
 * A smooth flow curve for differentiation: ln τ as a function of x = ln γ̇ whose local slope
 * moves along a logistic step between two plateaus,
 *
 *   n'(x) = n₁ + (n₂ − n₁)·σ(a(x − x₀)),   σ(z) = 1/(1 + e^(−z)),
 *   ln τ(x) = c₀ + n₁x + ((n₂ − n₁)/a)·ln(1 + e^(a(x − x₀))).
 *
 * This is the log–log form of the Carreau–Yasuda law (Yasuda, Armstrong & Cohen 1981,
 * Rheol. Acta 20, 163: n₁ = 1, n₂ = n, x₀ = −ln λ), with the low-rate slope n₁ left free so the
 * same shape follows a yield-stress paste (n' rising from near 0) as well as a melt (n' falling
 * from 1). It is fitted by the core's Levenberg–Marquardt solver (fit/levenbergMarquardt.ts) with
 * an analytic Jacobian, the bounded parameters mapped through logistic transforms, and is compared with a quadratic by the corrected Akaike criterion
 * (Hurvich & Tsai 1989, Biometrika 76, 297) so that noise on a near-power-law curve is not
 * mistaken for a transition.
 */
import { levenbergMarquardt } from "./fit/levenbergMarquardt";
import { fitLine, fitPolynomial, polynomialSlope } from "./regression";

/** Bounds on (n₁, n₂, a, x₀); a ≤ 3 keeps the step no sharper than a Carreau knee (a = 2). */
const MIN = [0.01, 0.01, 0.3, -50];
const MAX = [1.5, 1.5, 3, 50];
const SOLVER = { maxIterations: 200, functionTolerance: 1e-12, stepTolerance: 1e-12, gradientTolerance: 1e-12 };

/** Bounded parameter p = lo + (hi − lo)·σ(u) and its derivative dp/du. */
function bounded(u: number, i: number): [number, number] {
  const lo = MIN[i] as number;
  const hi = MAX[i] as number;
  const g = logistic(u);
  return [lo + (hi - lo) * g, (hi - lo) * g * (1 - g)];
}

function unbounded(p: number, i: number): number {
  const lo = MIN[i] as number;
  const hi = MAX[i] as number;
  const f = Math.min(1 - 1e-9, Math.max(1e-9, (p - lo) / (hi - lo)));
  return Math.log(f / (1 - f));
}

/** Least-squares fit of the curve to (t, y) from a start (c₀, n₁, n₂, a, x₀); returns parameters and SSR. */
function fitCurve(t: number[], y: number[], start: number[]): { p: number[]; ssr: number } {
  const m = t.length;
  const toParams = (u: ArrayLike<number>) => [u[0] as number, ...[1, 2, 3, 4].map((j) => bounded(u[j] as number, j - 1)[0])];
  const result = levenbergMarquardt(
    {
      residualCount: m,
      parameterCount: 5,
      evaluate(u, residuals, jac) {
        const p = toParams(u);
        const f = curve(p);
        const J = jacobian(p);
        const scale = [1, ...[1, 2, 3, 4].map((j) => bounded(u[j] as number, j - 1)[1])];
        for (let i = 0; i < m; i++) {
          const ti = t[i] as number;
          const r = f(ti) - (y[i] as number);
          if (!Number.isFinite(r)) return false;
          residuals[i] = r;
          if (jac) {
            const row = J(ti);
            for (let j = 0; j < 5; j++) jac[i * 5 + j] = (row[j] as number) * (scale[j] as number);
          }
        }
        return true;
      },
    },
    [start[0] as number, ...[1, 2, 3, 4].map((j) => unbounded(start[j] as number, j - 1))],
    SOLVER,
  );
  return { p: toParams(result.u), ssr: 2 * result.cost };
}

function softplus(z: number): number {
  return z > 30 ? z : Math.log1p(Math.exp(z));
}

function logistic(z: number): number {
  return 1 / (1 + Math.exp(-z));
}

function curve(p: number[]): (t: number) => number {
  const [c0, n1, n2, a, x0] = p as [number, number, number, number, number];
  return (t) => c0 + n1 * t + ((n2 - n1) / a) * softplus(a * (t - x0));
}

function jacobian(p: number[]): (t: number) => number[] {
  const [, n1, n2, a, x0] = p as [number, number, number, number, number];
  return (t) => {
    const z = a * (t - x0);
    const s = softplus(z);
    const g = logistic(z);
    const d = n2 - n1;
    return [1, t - s / a, s / a, d * (-s / (a * a) + ((t - x0) * g) / a), -d * g];
  };
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}

/** Small-sample corrected AIC of a least-squares fit with k parameters on n points. */
function aicc(ssr: number, n: number, k: number): number {
  const denominator = n - k - 1;
  const correction = denominator > 0 ? (2 * k * (k + 1)) / denominator : Infinity;
  return n * Math.log(Math.max(ssr, 1e-300) / n) + 2 * k + correction;
}

/** Which smooth curve was chosen, for the record. */
export type TransitionChoice = "transition" | "quadratic" | "line";

/**
 * Slopes dy/dx of a smooth curve through (x, y) at every x: the logistic-slope curve when it
 * beats a quadratic by AICc (needs ≥ 7 points), else a quadratic (≥ 4 points), else a line.
 * @param x ascending abscissae (ln γ̇), at least 2
 * @param y ordinates (ln τ)
 */
export function transitionSlopes(x: number[], y: number[]): { slopes: number[]; choice: TransitionChoice } {
  const n = x.length;
  const xm = x.reduce((s, v) => s + v, 0) / n;
  const t = x.map((v) => v - xm);
  if (n < 4) {
    const line = fitLine(t, y);
    return { slopes: t.map(() => line.slope), choice: "line" };
  }
  const quad = fitPolynomial(t, y, 2, 0);
  const ssrQuad = t.reduce((acc, ti, i) => acc + ((quad[0] as number) + (quad[1] as number) * ti + (quad[2] as number) * ti * ti - (y[i] as number)) ** 2, 0);
  const quadSlopes = t.map((ti) => polynomialSlope(quad, ti));
  if (n < 7) return { slopes: quadSlopes, choice: "quadratic" };

  const k = 3;
  const n1 = clamp(fitLine(t.slice(0, k), y.slice(0, k)).slope, 0.02, 1.4);
  const n2 = clamp(fitLine(t.slice(n - k), y.slice(n - k)).slope, 0.02, 1.4);
  const c0 = (y[0] as number) - n1 * (t[0] as number);
  let best: number[] | undefined;
  let bestSsr = Infinity;
  for (const a0 of [1, 2.5]) {
    const { p, ssr } = fitCurve(t, y, [c0, n1, n2, a0, 0]);
    if (Number.isFinite(ssr) && ssr < bestSsr) {
      bestSsr = ssr;
      best = p;
    }
  }
  if (!best || aicc(ssrQuad, n, 3) <= aicc(bestSsr, n, 5)) return { slopes: quadSlopes, choice: "quadratic" };
  const [, b1, b2, a, x0] = best as [number, number, number, number, number];
  return { slopes: t.map((ti) => b1 + (b2 - b1) * logistic(a * (ti - x0))), choice: "transition" };
}
