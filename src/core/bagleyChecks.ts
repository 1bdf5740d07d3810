/**
 * Checks of the Bagley lines that look for what biases the result, judged against the scatter of
 * the pressure readings themselves:
 *
 * 1. Scatter: the relative scatter σ of one reading, from how smoothly each die's pressure follows
 *    the rate: disjoint windows of five neighbouring steps, each fitted with a quadratic in
 *    (ln γ̇_a, ln ΔP) (two degrees of freedom a window); σ² from the median of the windows' sums
 *    of squares (robust to a kink at one rate); never below a floor.
 * 2. Curvature (three or more dies): at each rate, ΔP = b₀ + b₁x + b₂x² (x = L/R) by weighted
 *    least squares with the known variances (σ·ΔP_i)²; z = b₂/se(b₂); over the rates, Stouffer's
 *    Z = Σz/√m (Stouffer et al. 1949; Whitlock 2005, J. Evol. Biol. 18, 1368; from memory), judged as a t. An upward-bending
 *    line is the mark of a pressure-dependent viscosity (Laun 2004, Rheol. Acta 43, 509; Dealy &
 *    Wang 2013, from memory): a straight line through it overstates τ_w at low pressure. It is reported
 *    when |Z| is significant and the local slope changes between the shortest and the longest die
 *    by more than a practical limit (relative change 2b₂(x_max − x_min)/b₁,line).
 * 3. Scatter of e: e = b₀/b₁ of each weighted line, its standard error by the delta method, and a
 *    smooth trend of e with ln γ̇_a (a weighted polynomial of degree 1, or 2 from six rates: e
 *    normally rises with rate). A rate stands out when its deviation from the trend exceeds the
 *    two-sided Student-t bound at `significance` shared among the rates (Bonferroni) times its
 *    standard error, and changes the shortest die's corrected pressure by more than a practical
 *    limit. χ² = Σ((e − trend)/se)² is kept for the record.
 * Both tests use Student's t with one degree of freedom per window of the scatter estimate (a
 * median-based σ is less certain than a pooled one).
 * Limits: common practice, no source. A dense ladder (thousands of speeds) is checked on at most
 * MAX_CHECKED lines and scatter windows per die, spread evenly over it.
 */
import { inverseSpd } from "./fit/linearAlgebra";
import { tQuantile } from "./fit/studentT";
import { Warning, warning } from "./errors";
import type { BagleyRow } from "./bagley";
import { LadderDie } from "./rateLadder";

/** Dense ladders are checked on at most this many lines (and scatter windows per die), spread evenly. */
const MAX_CHECKED = 400;

/** Options of the checks (all fractions). */
export interface BagleyCheckOptions {
  /** significance level (two-sided) of the curvature and the e-scatter tests */
  significance: number;
  /** smallest relative change of the local Bagley slope across the dies worth reporting */
  minCurvatureEffect: number;
  /** smallest change of the shortest die's corrected pressure, as a fraction, that an irregular e must make */
  minScatterEffect: number;
  /** the relative scatter of one reading is taken as at least this (transducer resolution) */
  noiseFloor: number;
}

/** Defaults of {@link BagleyCheckOptions} (common practice, no source). */
export const DEFAULT_BAGLEY_CHECK_OPTIONS: Readonly<BagleyCheckOptions> = Object.freeze({
  significance: 0.01,
  minCurvatureEffect: 0.02,
  minScatterEffect: 0.01,
  noiseFloor: 0.001,
});

/** The scatter of one reading, relative, and its degrees of freedom. */
export interface ScatterEstimate {
  sigma: number;
  dof: number;
}

/** One line's points for the checks: L/R and pressure per die. */
export interface CheckLine {
  shearRateApparent: number;
  points: { lengthOverRadius: number; pressure: number }[];
}

/** Result of the curvature test. */
export interface CurvatureResult {
  /** per line (aligned with the input): relative change of the local slope across the dies, or null with fewer than three dies */
  effect: (number | null)[];
  /** per line: b₂/se(b₂), or null */
  z: (number | null)[];
  /** Stouffer's Z over the lines with three or more dies */
  combined: number;
  /** true when the curvature is significant and material */
  curved: boolean;
  /** lines tested */
  tested: number;
}

/** Result of the e-scatter test. */
export interface EndScatterResult {
  /** indices of the lines whose e stands out from the trend */
  outliers: number[];
  /** χ² of the deviations from the trend and its degrees of freedom (for the record) */
  chiSquare: number;
  dof: number;
  /** true when some line stands out */
  irregular: boolean;
}

/**
 * Relative scatter of one reading from the dies' smoothness (see the module comment), or null when
 * the dies have too few steps (fewer than three degrees of freedom in all).
 */
export function readingScatter(dies: readonly LadderDie[], floor: number): ScatterEstimate | null {
  const windows: number[] = [];
  for (const die of dies) {
    // at most MAX_CHECKED windows a die, spread evenly over a dense ladder
    const count = Math.floor(die.rates.length / 5);
    const stride = Math.max(1, Math.ceil(count / MAX_CHECKED));
    for (let start = 0; start + 5 <= die.rates.length; start += 5 * stride) {
      const x = die.rates.slice(start, start + 5).map(Math.log);
      const y = die.pressures.slice(start, start + 5).map(Math.log);
      const fit = weightedPolynomial(x, y, x.map(() => 1), 2);
      if (fit) windows.push(fit.ssr);
    }
  }
  const dof = 2 * windows.length;
  if (dof < 3) return null;
  // SSR/σ² ~ χ²(2) per window, whose median is 2·ln 2: the median keeps a kink at one rate from inflating σ.
  windows.sort((a, b) => a - b);
  const mid = windows.length >> 1;
  const median = windows.length % 2 ? (windows[mid] as number) : ((windows[mid - 1] as number) + (windows[mid] as number)) / 2;
  return { sigma: Math.max(Math.sqrt(median / (2 * Math.LN2)), floor), dof };
}

/** The curvature test over the lines (see the module comment). */
export function curvatureTest(lines: readonly CheckLine[], scatter: ScatterEstimate, opt: BagleyCheckOptions): CurvatureResult {
  const sigma = scatter.sigma;
  const effect: (number | null)[] = [];
  const z: (number | null)[] = [];
  let sum = 0;
  let tested = 0;
  for (const line of lines) {
    const xs = line.points.map((p) => p.lengthOverRadius);
    if (new Set(xs).size < 3) {
      effect.push(null);
      z.push(null);
      continue;
    }
    const ps = line.points.map((p) => p.pressure);
    const w = ps.map((p) => 1 / (sigma * p) ** 2);
    const quad = weightedPolynomial(xs, ps, w, 2);
    const straight = weightedPolynomial(xs, ps, w, 1);
    if (!quad || !straight) {
      effect.push(null);
      z.push(null);
      continue;
    }
    const span = Math.max(...xs) - Math.min(...xs);
    // In the scaled abscissa u = (x − x̄)/scale: d²ΔP/dx² = 2c₂/scale², line slope c₁/scale.
    const c2 = quad.coefficients[2] as number;
    const zi = c2 / Math.sqrt(quad.covariance[8] as number);
    effect.push((2 * c2 * span) / quad.scale ** 2 / ((straight.coefficients[1] as number) / straight.scale));
    z.push(zi);
    sum += zi;
    tested++;
  }
  const combined = tested > 0 ? sum / Math.sqrt(tested) : 0;
  const sizes = effect.filter((e): e is number => e !== null).map(Math.abs).sort((a, b) => a - b);
  const median = sizes.length > 0 ? (sizes[(sizes.length - 1) >> 1] as number) : 0;
  // Student's t with the scatter's degrees of freedom (counted as one per window: σ is a median)
  const critical = tQuantile(1 - opt.significance / 2, Math.max(1, scatter.dof / 2));
  const curved = tested > 0 && Math.abs(combined) >= critical && median >= opt.minCurvatureEffect;
  return { effect, z, combined, curved, tested };
}

/** The e-scatter test over the lines (see the module comment); needs four or more lines. */
export function endCorrectionScatterTest(lines: readonly CheckLine[], scatter: ScatterEstimate, opt: BagleyCheckOptions): EndScatterResult | null {
  const sigma = scatter.sigma;
  const e: number[] = [];
  const se: number[] = [];
  const shortest: number[] = [];
  const x: number[] = [];
  for (const line of lines) {
    const xs = line.points.map((p) => p.lengthOverRadius);
    const ps = line.points.map((p) => p.pressure);
    const fit = weightedPolynomial(xs, ps, ps.map((p) => 1 / (sigma * p) ** 2), 1);
    if (!fit) continue;
    // back from the scaled abscissa: ΔP = a + b·x with b = c₁/scale, a = c₀ − b·x̄
    const b = (fit.coefficients[1] as number) / fit.scale;
    const a = (fit.coefficients[0] as number) - b * fit.centre;
    const va = (fit.covariance[0] as number) - (2 * fit.centre * (fit.covariance[1] as number)) / fit.scale + (fit.centre ** 2 * (fit.covariance[3] as number)) / fit.scale ** 2;
    const vb = (fit.covariance[3] as number) / fit.scale ** 2;
    const cab = (fit.covariance[1] as number) / fit.scale - (fit.centre * (fit.covariance[3] as number)) / fit.scale ** 2;
    const ei = a / b;
    e.push(ei);
    se.push(Math.sqrt(Math.max(va - 2 * ei * cab + ei * ei * vb, 0)) / Math.abs(b));
    shortest.push(Math.min(...xs));
    x.push(Math.log(line.shearRateApparent));
  }
  const m = e.length;
  if (m < 4) return null;
  const degree = m >= 6 ? 2 : 1;
  const trend = weightedPolynomial(x, e, se.map((s) => 1 / Math.max(s, 1e-12) ** 2), degree);
  if (!trend) return null;
  const dof = m - degree - 1;
  const residual = e.map((ei, i) => ei - (trend.predict(x[i] as number) as number));
  const chiSquare = residual.reduce((s, r, i) => s + (r / Math.max(se[i] as number, 1e-12)) ** 2, 0);
  // an outlier: beyond the Bonferroni t bound over the m lines and material for the shortest die
  const critical = tQuantile(1 - opt.significance / (2 * m), Math.max(1, scatter.dof / 2));
  const outliers = residual
    .map((r, i) => ({ r, i }))
    .filter(({ r, i }) => Math.abs(r) > critical * (se[i] as number) && Math.abs(r) / ((shortest[i] as number) + (e[i] as number)) > opt.minScatterEffect)
    .map(({ i }) => i);
  const irregular = outliers.length > 0;
  return { outliers, chiSquare, dof, irregular };
}

/**
 * The curvature and e-scatter checks of the Bagley lines (see the module comment), judged against the scatter of
 * the dies' readings. Sets each row's `curvature`.
 *
 * Warning codes: BAGLEY_CURVED, BAGLEY_END_CORRECTION_SCATTER, BAGLEY_CHECKS_LIMITED.
 * (BAGLEY_LOW_R2 is no longer raised: R² missed curvature that mattered.)
 */
export function bagleyLineChecks(rows: BagleyRow[], dies: readonly LadderDie[], options: Partial<BagleyCheckOptions> = {}): Warning[] {
  const checks: BagleyCheckOptions = { ...DEFAULT_BAGLEY_CHECK_OPTIONS, ...options };
  const scatter = readingScatter(dies, checks.noiseFloor);
  if (!scatter) {
    return rows.length >= 2
      ? [warning("BAGLEY_CHECKS_LIMITED", "The dies have too few speeds (fewer than five each) to estimate the scatter of the readings: the Bagley lines were not checked for curvature or an irregular end correction.")]
      : [];
  }
  // a dense ladder is checked on at most MAX_CHECKED lines spread evenly over it
  const stride = Math.max(1, Math.ceil(rows.length / MAX_CHECKED));
  const checked = rows.filter((_, i) => i % stride === 0);
  const lines: CheckLine[] = checked.map((r) => ({ shearRateApparent: r.shearRateApparent, points: r.points }));
  const warnings: Warning[] = [];
  const curvature = curvatureTest(lines, scatter, checks);
  checked.forEach((r, i) => (r.curvature = curvature.effect[i] ?? null));
  if (curvature.curved) {
    const effects = curvature.effect.filter((e): e is number => e !== null);
    const upward = curvature.combined > 0;
    const worst = effects.reduce((m, e) => (Math.abs(e) > Math.abs(m) ? e : m), 0);
    warnings.push(
      warning(
        "BAGLEY_CURVED",
        `The Bagley lines bend ${upward ? "upwards" : "downwards"} beyond the scatter of the readings (${pct(scatter.sigma, 2)}): the local slope changes by up to ${pct(Math.abs(worst))} between the shortest and the longest die (combined z = ${curvature.combined.toFixed(1)} over ${curvature.tested} rates). ${
          upward
            ? "A pressure-dependent viscosity bends them up; the straight-line τ_w then belongs to no single pressure (see the pressure-dependence option)."
            : "Downward bending is not pressure dependence: look for slip, viscous heating or a die-length error."
        }`,
      ),
    );
  }
  const scatterTest = endCorrectionScatterTest(lines, scatter, checks);
  if (scatterTest?.irregular) {
    warnings.push(
      warning(
        "BAGLEY_END_CORRECTION_SCATTER",
        `The end correction e departs from its smooth trend with rate beyond the scatter of the readings at ${list(scatterTest.outliers.map((i) => (checked[i] as BagleyRow).shearRateApparent))} 1/s (χ² = ${scatterTest.chiSquare.toFixed(1)} on ${scatterTest.dof} degrees of freedom): check those readings.`,
      ),
    );
  }
  return warnings;
}

interface WeightedFit {
  /** coefficients in the scaled abscissa u = (x − centre)/scale */
  coefficients: number[];
  /** their covariance (k×k, row-major) with the weights as inverse variances */
  covariance: Float64Array;
  /** Σ w·(y − ŷ)² */
  ssr: number;
  centre: number;
  scale: number;
  predict: (x: number) => number;
}

/** Weighted least-squares polynomial of the given degree in the scaled abscissa; undefined when singular. */
function weightedPolynomial(x: readonly number[], y: readonly number[], w: readonly number[], degree: number): WeightedFit | undefined {
  const k = degree + 1;
  if (x.length < k) return undefined;
  const centre = x.reduce((s, v) => s + v, 0) / x.length;
  const scale = x.reduce((s, v) => Math.max(s, Math.abs(v - centre)), 0) || 1;
  const normal = new Float64Array(k * k);
  const rhs = new Float64Array(k);
  x.forEach((xi, i) => {
    const u = (xi - centre) / scale;
    const wi = w[i] as number;
    for (let a = 0; a < k; a++) {
      rhs[a] = (rhs[a] as number) + wi * u ** a * (y[i] as number);
      for (let b = 0; b < k; b++) normal[a * k + b] = (normal[a * k + b] as number) + wi * u ** (a + b);
    }
  });
  const covariance = inverseSpd(normal, k);
  if (!covariance) return undefined;
  const coefficients = Array.from({ length: k }, (_, a) => {
    let s = 0;
    for (let b = 0; b < k; b++) s += (covariance[a * k + b] as number) * (rhs[b] as number);
    return s;
  });
  const predict = (xv: number) => {
    const u = (xv - centre) / scale;
    return coefficients.reduce((s, c, a) => s + c * u ** a, 0);
  };
  const ssr = x.reduce((s, xi, i) => s + (w[i] as number) * ((y[i] as number) - predict(xi)) ** 2, 0);
  return { coefficients, covariance, ssr, centre, scale, predict };
}

function list(rates: number[]): string {
  const shown = rates.slice(0, 8).map((x) => Number(x.toPrecision(4)).toString()).join(", ");
  return rates.length > 8 ? `${shown} and ${rates.length - 8} more` : shown;
}

function pct(x: number, digits = 0): string {
  return `${(x * 100).toFixed(digits)} %`;
}
