/**
 * A smooth flow curve for differentiation: ln τ as a function of x = ln γ̇ whose local slope
 * moves along a logistic step between two plateaus,
 *
 *   n'(x) = n₁ + (n₂ − n₁)·σ(a(x − x₀)),   σ(z) = 1/(1 + e^(−z)),
 *   ln τ(x) = c₀ + n₁x + ((n₂ − n₁)/a)·ln(1 + e^(a(x − x₀))).
 *
 * With n₁ = 1 this is exactly the log–log form of the Carreau–Yasuda law with η∞ = 0 (Yasuda,
 * Armstrong & Cohen 1981, Rheol. Acta 20, 163: n₂ = n, x₀ = −ln λ; Cross 1965 is a = m,
 * n₂ = 1 − m), the physical shape of a melt's flow curve. With n₁ free the same shape follows a
 * yield-stress paste (n' rising from near 0; Herschel–Bulkley is n₁ = 0, a = n₂ = n).
 *
 * Choice (what noise must not decide, see docs/methods.md "Rabinowitsch correction"): both shapes
 * are fitted by the core's Levenberg–Marquardt solver (fit/levenbergMarquardt.ts) with an analytic
 * Jacobian and the bounded parameters mapped through logistic transforms; the one with the lower
 * corrected Akaike criterion (Hurvich & Tsai 1989, Biometrika 76, 297) is kept, n₁ = 1 on a tie.
 * For a melt (n′ falling with rate) a polynomial is never preferred over them by AICc: with 1 %
 * pressure noise that preference picked a quadratic whose own bias at the ends of a melt's range is
 * 3–14 % in the wall rate (measured, scripts/benchSmoothers.ts). Where n′ rises with rate (a
 * paste: the slope of the first three points below that of the last three) a quadratic's bias is
 * small and it is kept when its AICc is lower. Only when neither shape can be fitted does a cubic stand in; below seven points a
 * quadratic, below four a line. Series longer than MAX_FITTED points are fitted to the means of
 * log-rate bins (the slope is then evaluated at every point).
 */
import { levenbergMarquardt } from "./fit/levenbergMarquardt";
import { fitLine, fitPolynomial, polynomialSlope, polynomialValue } from "./regression";

/** Bounds on (n₁, n₂, a, x₀); a ≤ 2 keeps the step no sharper than a Carreau knee (a = 2). */
const MIN = [0.01, 0.01, 0.3, -50];
const MAX = [1.5, 1.5, 2, 50];
/** Slopes are wanted to ~1e-4: a relative cost change of 1e-10 is ample for a melt. */
const SOLVER = { functionTolerance: 1e-10, stepTolerance: 1e-10, gradientTolerance: 1e-10 };
/**
 * A paste's fit is compared with a quadratic by AICc, whose ln(SSR) rewards a fit run to its end
 * on clean data: the former, stricter settings.
 */
const PASTE_SOLVER = { functionTolerance: 1e-12, stepTolerance: 1e-12, gradientTolerance: 1e-12 };

function unbounded(p: number, i: number): number {
  const lo = MIN[i] as number;
  const hi = MAX[i] as number;
  const f = Math.min(1 - 1e-9, Math.max(1e-9, (p - lo) / (hi - lo)));
  return Math.log(f / (1 - f));
}

/**
 * Least-squares fit of the curve to (t, y) from a start (c₀, n₁, n₂, a, x₀); `free` marks the
 * fitted ones. The bounded parameters are p = lo + (hi − lo)·σ(u), fitted in u; residuals and the
 * analytic Jacobian are written in place (no allocation per evaluation).
 */
function fitCurve(t: number[], y: number[], start: number[], free: boolean[], maxIterations: number, tolerances: typeof SOLVER): { p: number[]; ssr: number; k: number } {
  const m = t.length;
  const column = new Int32Array(5).fill(-1);
  let k = 0;
  free.forEach((f, j) => {
    if (f) column[j] = k++;
  });
  const u = Float64Array.from([start[0] as number, ...[1, 2, 3, 4].map((j) => unbounded(start[j] as number, j - 1))]);
  const p = new Float64Array(5);
  const dp = new Float64Array(5);
  const startU = new Float64Array(k);
  for (let j = 0; j < 5; j++) if ((column[j] as number) >= 0) startU[column[j] as number] = u[j] as number;
  const toParams = (v: ArrayLike<number>) => {
    for (let j = 0; j < 5; j++) if ((column[j] as number) >= 0) u[j] = v[column[j] as number] as number;
    p[0] = u[0] as number;
    dp[0] = 1;
    for (let j = 1; j < 5; j++) {
      const lo = MIN[j - 1] as number;
      const span = (MAX[j - 1] as number) - lo;
      const g = logistic(u[j] as number);
      p[j] = lo + span * g;
      dp[j] = span * g * (1 - g);
    }
  };
  const result = levenbergMarquardt(
    {
      residualCount: m,
      parameterCount: k,
      evaluate(v, residuals, jac) {
        toParams(v);
        const c0 = p[0] as number;
        const n1 = p[1] as number;
        const n2 = p[2] as number;
        const a = p[3] as number;
        const x0 = p[4] as number;
        const d = n2 - n1;
        for (let i = 0; i < m; i++) {
          const ti = t[i] as number;
          const z = a * (ti - x0);
          const sp = softplus(z);
          const r = c0 + n1 * ti + (d / a) * sp - (y[i] as number);
          if (!Number.isFinite(r)) return false;
          residuals[i] = r;
          if (jac) {
            const g = logistic(z);
            const row = i * k;
            // ∂/∂(c₀, n₁, n₂, a, x₀) times dp/du
            if ((column[0] as number) >= 0) jac[row + (column[0] as number)] = 1;
            if ((column[1] as number) >= 0) jac[row + (column[1] as number)] = (ti - sp / a) * (dp[1] as number);
            if ((column[2] as number) >= 0) jac[row + (column[2] as number)] = (sp / a) * (dp[2] as number);
            if ((column[3] as number) >= 0) jac[row + (column[3] as number)] = d * (-sp / (a * a) + ((ti - x0) * g) / a) * (dp[3] as number);
            if ((column[4] as number) >= 0) jac[row + (column[4] as number)] = -d * g * (dp[4] as number);
          }
        }
        return true;
      },
    },
    startU,
    { ...tolerances, maxIterations },
  );
  toParams(result.u);
  return { p: Array.from(p), ssr: 2 * result.cost, k };
}

function softplus(z: number): number {
  return z > 30 ? z : Math.log1p(Math.exp(z));
}

function logistic(z: number): number {
  return 1 / (1 + Math.exp(-z));
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

/** Which smooth curve was used, for the record. */
export type TransitionChoice = "transition" | "transition-free" | "cubic" | "quadratic" | "line";

/** Series longer than this are fitted to bin means. */
const MAX_FITTED = 200;

/** A fitted logistic-slope curve: parameters (c₀, n₁, n₂, a, x₀) on the centred abscissa, SSR, free-parameter count. */
interface ShapeFit {
  p: number[];
  ssr: number;
  k: number;
}

/** Best fit of the curve from the given starts (a₀, x₀), or from full parameter vectors; `newtonian` holds n₁ = 1. */
function fitShape(t: number[], y: number[], newtonian: boolean, starts: number[][], maxIterations = 100, tolerances = SOLVER): ShapeFit | undefined {
  const free = [true, !newtonian, true, true, true];
  let best: ShapeFit | undefined;
  for (const start of starts) {
    const fit = fitCurve(t, y, start, free, maxIterations, tolerances);
    if (Number.isFinite(fit.ssr) && (!best || fit.ssr < best.ssr)) best = { p: fit.p, ssr: fit.ssr, k: fit.k };
  }
  return best;
}

function best(a: ShapeFit | undefined, b: ShapeFit | undefined): ShapeFit | undefined {
  return !a ? b : !b ? a : a.ssr <= b.ssr ? a : b;
}

/** A start (c₀, n₁, n₂, a₀, x₀) from the end slopes of the data. */
function startFrom(t: number[], y: number[], n1: number | null, a0: number, x0: number): number[] {
  const n = t.length;
  const k = 3;
  const n2 = clamp(fitLine(t.slice(n - k), y.slice(n - k)).slope, 0.02, 1.4);
  const low = n1 ?? clamp(fitLine(t.slice(0, k), y.slice(0, k)).slope, 0.02, 1.4);
  return [(y[0] as number) - low * (t[0] as number), low, n2, a0, x0];
}

/**
 * Slopes dy/dx of a smooth curve through (x, y) at every x (see the module comment for the choice).
 * @param x ascending abscissae (ln γ̇), at least 2
 * @param y ordinates (ln τ)
 * @returns the slopes, the curve used and why
 */
export function transitionSlopes(x: number[], y: number[]): { slopes: number[]; choice: TransitionChoice; reason: string } {
  const n = x.length;
  const xm = x.reduce((s, v) => s + v, 0) / n;
  const t = x.map((v) => v - xm);
  if (n < 4) {
    const line = fitLine(t, y);
    return { slopes: t.map(() => line.slope), choice: "line", reason: `${n} points: a straight line` };
  }
  const polynomial = (degree: number, choice: TransitionChoice, reason: string) => {
    const c = fitPolynomial(t, y, degree, 0);
    return { slopes: t.map((ti) => polynomialSlope(c, ti)), choice, reason };
  };
  if (n < 7) return polynomial(2, "quadratic", `${n} points: too few for the transition curve (7 needed)`);
  const fitted = n > MAX_FITTED ? binMeans(t, y, MAX_FITTED / 2) : { t, y };
  const m = fitted.t.length;
  const ft = fitted.t;
  const fy = fitted.y;
  // n₁ = 1 from two starts (knee at the first point, gentle; knee mid-range, sharp)
  const melt = fitShape(ft, fy, true, [startFrom(ft, fy, 1, 1, ft[0] as number), startFrom(ft, fy, 1, 1.8, 0)]);
  // n₁ free: refined from the melt shape (a short run: a flat valley means n₁ is not determined),
  // and from the data's own low-rate slope when n′ rises with rate (a paste)
  const rising = fitLine(ft.slice(0, 3), fy.slice(0, 3)).slope < fitLine(ft.slice(-3), fy.slice(-3)).slope;
  const paste = best(melt ? fitShape(ft, fy, false, [melt.p], 40) : undefined, rising || !melt ? fitShape(ft, fy, false, [startFrom(ft, fy, null, 1, 0)], 200, PASTE_SOLVER) : undefined);
  const useFree = paste && (!melt || aicc(paste.ssr, m, paste.k) < aicc(melt.ssr, m, melt.k));
  const chosen = useFree ? paste : melt;
  if (rising && chosen) {
    // A paste: n′ rises with rate, where a quadratic's bias is small; it may win by AICc.
    const q = fitPolynomial(ft, fy, 2, 0);
    const ssrQuadratic = ft.reduce((acc, ti, i) => acc + (polynomialValue(q, ti) - (fy[i] as number)) ** 2, 0);
    if (aicc(ssrQuadratic, m, 3) < aicc(chosen.ssr, m, chosen.k)) return polynomial(2, "quadratic", "n′ rises with rate (a paste) and a quadratic had the lower AICc");
  }
  if (!chosen) return polynomial(3, "cubic", "the transition curve could not be fitted (no finite fit); a cubic was used");
  const [, b1, b2, a, x0] = chosen.p as [number, number, number, number, number];
  return {
    slopes: t.map((ti) => b1 + (b2 - b1) * logistic(a * (ti - x0))),
    choice: useFree ? "transition-free" : "transition",
    reason: useFree
      ? `logistic-slope curve with a free low-rate slope (n′ from ${b1.toFixed(2)} to ${b2.toFixed(2)}; lower AICc than n′ → 1)`
      : `logistic-slope curve with n′ → 1 at low rates (n′ to ${b2.toFixed(2)})${paste ? "; a free low-rate slope did not lower AICc" : ""}`,
  };
}

/** Means of t and y over `bins` equal-width bins of t (t ascending). */
function binMeans(t: number[], y: number[], bins: number): { t: number[]; y: number[] } {
  const lo = t[0] as number;
  const width = ((t[t.length - 1] as number) - lo) / bins || 1;
  const outT: number[] = [];
  const outY: number[] = [];
  let current = -1;
  let st = 0;
  let sy = 0;
  let count = 0;
  const flush = () => {
    if (count > 0) {
      outT.push(st / count);
      outY.push(sy / count);
    }
  };
  t.forEach((ti, i) => {
    const bin = Math.min(bins - 1, Math.floor((ti - lo) / width));
    if (bin !== current) {
      flush();
      current = bin;
      st = 0;
      sy = 0;
      count = 0;
    }
    st += ti;
    sy += y[i] as number;
    count++;
  });
  flush();
  return { t: outT, y: outY };
}
