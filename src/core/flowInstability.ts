/**
 * Flow instabilities in a rate-controlled capillary test: spurt, stick–slip and the onset of gross
 * melt fracture make the pressure fall or stall as the piston speed rises, where a stable melt's
 * pressure rises smoothly (Denn 2001, Annu. Rev. Fluid Mech. 33, 265; Hatzikiriakos & Migler,
 * Polymer Processing Instabilities, 2005, ch. 2; from memory). Such a branch must not be smoothed
 * together with the stable one: the Rabinowitsch slope across it is meaningless.
 *
 * Test (a change-point test on y = ln ΔP or ln τ_w against x = ln γ̇_a): one or more series (the
 * dies of a group: the instability sets in at a critical wall stress, which all dies of one bore
 * reach at the same apparent rate) share a break at x_c. For each candidate x_c, every series d
 * gets its own low-order polynomial p_d(x) (cubic from 8 points, quadratic from 6, else a line)
 * and all share one step Δ above x_c, fitted by least squares:
 *
 *   y_di = p_d(x_di) + Δ·[x_di ≥ x_c] + ε_di.
 *
 * x_c is a break when the step is downward and material (e^Δ − 1 ≤ −minJump), significant
 * (|Δ|/se(Δ) above the two-sided Student-t quantile at `significance` divided among the
 * candidates, a Bonferroni bound), and shows as a fall or a stall: the local slope into the first
 * flagged point, averaged over the series, is below `stallRatio` times the mean slope of the last
 * three intervals below it (so the bend of a smooth shear-thinning curve, which the polynomial
 * may extrapolate badly, is not taken for a break). A pressure that jumps up is not tested. se(Δ) uses the pooled residual scatter, never below `noiseFloor`. By the
 * Frisch–Waugh–Lovell theorem Δ = Σ⟨r_s, r_y⟩/Σ‖r_s‖², with r_s and r_y the step column's and
 * the data's residuals after each polynomial (Davidson & MacKinnon, Econometric Theory and
 * Methods, 2004, from memory); with an orthonormal basis of the polynomial both come from suffix sums,
 * so all candidates cost O(n). Long series (dense ladders) are tested on the means of at most
 * MAX_TESTED log-rate bins.
 *
 * A reading below any break that falls below the one before it by more than three standard
 * deviations of a difference (σ from the median absolute residual of the smooth fits) is reported
 * as an isolated fall and kept.
 *
 * Melt-fracture onset for polyolefins is commonly met at wall stresses of about 0.1–0.3 MPa
 * (common practice, no source): given as a note, not as an error.
 */
import { Warning, warning } from "./errors";
import { tQuantile } from "./fit/studentT";

/** Options of {@link findFlowBreak}. */
export interface InstabilityOptions {
  /** smallest step of a branch against the continuation of the one below, as a fraction (common practice, no source) */
  minJump: number;
  /** family-wise significance level of the step test over all candidate positions */
  significance: number;
  /** the local slope into a break is below this fraction of the slope below it (a fall or a stall; common practice, no source) */
  stallRatio: number;
  /** smallest relative scatter of one reading assumed (transducer resolution; common practice, no source) */
  noiseFloor: number;
  /** the wall-stress range (Pa) where melt fracture of polyolefins commonly begins (common practice, no source) */
  meltFractureStress: [number, number];
}

/** Defaults of {@link InstabilityOptions}. */
export const DEFAULT_INSTABILITY_OPTIONS: Readonly<InstabilityOptions> = Object.freeze({
  minJump: 0.05,
  significance: 0.01,
  stallRatio: 0.6,
  noiseFloor: 0.002,
  meltFractureStress: [0.1e6, 0.3e6] as [number, number],
});

/** One series of a break test: ascending x = ln γ̇_a and y = ln ΔP or ln τ_w. */
export interface BreakSeries {
  x: readonly number[];
  y: readonly number[];
}

/** A break shared by the series: the points at x ≥ x_c lie off the continuation of those below. */
export interface FlowBreak {
  /** ln γ̇_a of the break: the smallest x of a flagged point */
  x: number;
  /** per series, the index of its first flagged point (its length when none is flagged) */
  firstFlagged: number[];
  /**
   * the first flagged reading against the straight continuation of the two readings below it, as a
   * fraction (−0.15: 15 % lower), averaged over the series (the fitted step is the test, this the
   * plain measure a reader can check)
   */
  jump: number;
  /** true when some series' first flagged value is below the value before it (a fall, not a stall) */
  falls: boolean;
}

/** Result of {@link findFlowBreak}. */
export interface FlowBreakResult {
  /** the break, or null when the series are smooth within their scatter */
  break: FlowBreak | null;
  /** per series, the indices (below any break) of isolated readings that fall below the one before */
  falls: number[][];
}

/** Series longer than this are tested on bin means. */
const MAX_TESTED = 120;

interface Prepared {
  x: readonly number[];
  y: readonly number[];
  /** the data's residual after the polynomial */
  ry: number[];
  /** suffix sums from index b: of each orthonormal basis column, of it times x, and of ry */
  basisTail: Float64Array[];
  basisXTail: Float64Array[];
  residualTail: Float64Array;
  /** suffix sums of x, x² and x·ry */
  tails: { x: Float64Array; xx: Float64Array; xr: Float64Array };
  dof: number;
  first: number;
  degree: number;
}

/**
 * Looks for a break shared by the series (see the module comment).
 * @example findFlowBreak([{ x: lnRates, y: lnPressures }]).break?.firstFlagged[0]
 */
export function findFlowBreak(series: readonly BreakSeries[], options: Partial<InstabilityOptions> = {}): FlowBreakResult {
  const opt: InstabilityOptions = { ...DEFAULT_INSTABILITY_OPTIONS, ...options };
  if (series.some((s) => s.x.length > MAX_TESTED)) return binned(series, opt);
  const prepared = series.map(prepare);
  const dof = prepared.reduce((s, p) => s + p.dof, 0) - 1;
  const ssrSmooth = prepared.reduce((s, p) => s + dot(p.ry, p.ry), 0);
  const candidates = candidateBreaks(prepared);
  let best: { c: number; delta: number; score: number } | null = null;
  if (dof >= 1 && candidates.length > 0) {
    const critical = tQuantile(1 - opt.significance / (2 * candidates.length), Math.max(1, dof - 1));
    for (const c of candidates) {
      const fit = stepAndHinge(prepared, c, ssrSmooth, dof, opt.noiseFloor);
      if (!fit) continue;
      const score = Math.abs(fit.delta) / fit.standardError;
      if (Math.expm1(fit.delta) <= -opt.minJump && score >= critical && (!best || score > best.score) && stalls(prepared, c, opt.stallRatio)) best = { c, delta: fit.delta, score };
    }
  } else {
    // Too few points for a fitted step: only a fall of at least minJump between neighbours counts.
    for (const c of [...new Set(prepared.flatMap((p) => p.x.slice(1)))].sort((a, b) => a - b)) {
      const fall = prepared.some((p) => {
        const b = firstAtOrAbove(p.x, c);
        return b >= 1 && b < p.x.length && Math.expm1((p.y[b] as number) - (p.y[b - 1] as number)) <= -opt.minJump;
      });
      if (fall) {
        best = { c, delta: Math.log(1 - opt.minJump), score: Infinity };
        break;
      }
    }
  }
  let flowBreak: FlowBreak | null = null;
  if (best) {
    const c = best.c;
    const firstFlagged = prepared.map((p) => firstAtOrAbove(p.x, c));
    const falls = prepared.some((p, d) => {
      const b = firstFlagged[d] as number;
      return b >= 1 && b < p.x.length && (p.y[b] as number) < (p.y[b - 1] as number);
    });
    flowBreak = { x: c, firstFlagged, jump: localJump(prepared, firstFlagged), falls };
  }
  // the scatter of one reading: median absolute residual over all series (×1.4826, the normal
  // consistency factor), so one wild reading does not hide itself
  const absolute = prepared.flatMap((p) => p.ry.map(Math.abs)).sort((a, b) => a - b);
  const scatter = Math.max(1.4826 * ((absolute[absolute.length >> 1] as number | undefined) ?? 0), opt.noiseFloor);
  const falls = prepared.map((p, d) => {
    const end = flowBreak ? (flowBreak.firstFlagged[d] as number) : p.x.length;
    const out: number[] = [];
    for (let i = 1; i < end; i++) if ((p.y[i] as number) - (p.y[i - 1] as number) < -3 * Math.SQRT2 * scatter) out.push(i);
    return out;
  });
  return { break: flowBreak, falls };
}

/**
 * The step Δ at c and a change of slope γ beyond it, fitted with every series' polynomial, by the
 * Frisch–Waugh–Lovell theorem on the residual columns of s = [x ≥ c] and h = (x − c)·[x ≥ c]:
 * every inner product is a suffix sum (no pass over the data per candidate). γ lets a stall (the
 * branch flattens) be told from a smooth bend without the polynomial absorbing it; with a single
 * flagged point h is zero and the step is fitted alone. Returns Δ and its standard error.
 */
function stepAndHinge(prepared: Prepared[], c: number, ssrSmooth: number, dof: number, floor: number): { delta: number; standardError: number } | null {
  let sss = 0;
  let shh = 0;
  let ssh = 0;
  let ssy = 0;
  let shy = 0;
  for (const p of prepared) {
    const b = firstAtOrAbove(p.x, c);
    const count = p.x.length - b;
    if (count === 0) continue;
    const t = p.tails;
    let qs2 = 0;
    let qh2 = 0;
    let qsh = 0;
    for (let k = 0; k < p.basisTail.length; k++) {
      const qs = (p.basisTail[k] as Float64Array)[b] as number;
      const qh = ((p.basisXTail[k] as Float64Array)[b] as number) - c * qs;
      qs2 += qs * qs;
      qh2 += qh * qh;
      qsh += qs * qh;
    }
    const sumX = t.x[b] as number;
    sss += count - qs2;
    shh += (t.xx[b] as number) - 2 * c * sumX + c * c * count - qh2;
    ssh += sumX - c * count - qsh;
    ssy += p.residualTail[b] as number;
    shy += (t.xr[b] as number) - c * (p.residualTail[b] as number);
  }
  if (sss < 1e-12) return null;
  const det = sss * shh - ssh * ssh;
  if (shh < 1e-12 || det < 1e-9 * sss * shh) {
    const delta = ssy / sss;
    const s2 = Math.max((ssrSmooth - delta * ssy) / dof, floor ** 2);
    return { delta, standardError: Math.sqrt(s2 / sss) };
  }
  const delta = (shh * ssy - ssh * shy) / det;
  const gamma = (sss * shy - ssh * ssy) / det;
  const s2 = Math.max((ssrSmooth - delta * ssy - gamma * shy) / Math.max(1, dof - 1), floor ** 2);
  return { delta, standardError: Math.sqrt((s2 * shh) / det) };
}

/** Per series: an orthonormal basis of its polynomial (modified Gram–Schmidt, twice), the data's residual, suffix sums. */
function prepare(s: BreakSeries): Prepared {
  const n = s.x.length;
  const degree = n >= 8 ? 3 : n >= 6 ? 2 : n >= 3 ? 1 : 0;
  const t = centred(s.x);
  const basis: Float64Array[] = [];
  for (let k = 0; k <= degree && n > 0; k++) {
    const q = new Float64Array(n);
    for (let i = 0; i < n; i++) q[i] = (t[i] as number) ** k;
    for (let pass = 0; pass < 2; pass++) {
      for (const e of basis) {
        const c = dot(q, e);
        for (let i = 0; i < n; i++) q[i] = (q[i] as number) - c * (e[i] as number);
      }
    }
    const norm = Math.sqrt(dot(q, q));
    if (norm < 1e-12) continue;
    for (let i = 0; i < n; i++) q[i] = (q[i] as number) / norm;
    basis.push(q);
  }
  const ry = [...s.y];
  for (const e of basis) {
    const c = dot(ry, e);
    for (let i = 0; i < n; i++) ry[i] = (ry[i] as number) - c * (e[i] as number);
  }
  const tail = (v: ArrayLike<number>) => {
    const out = new Float64Array(n + 1);
    for (let i = n - 1; i >= 0; i--) out[i] = (out[i + 1] as number) + (v[i] as number);
    return out;
  };
  const times = (v: ArrayLike<number>) => {
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = (s.x[i] as number) * (v[i] as number);
    return out;
  };
  return {
    x: s.x,
    y: s.y,
    ry,
    basisTail: basis.map(tail),
    basisXTail: basis.map((q) => tail(times(q))),
    residualTail: tail(ry),
    tails: { x: tail(s.x), xx: tail(times(s.x)), xr: tail(times(ry)) },
    dof: Math.max(0, n - basis.length),
    first: Math.max(3, degree + 1),
    degree,
  };
}

/** Index of the first x ≥ c in ascending x (x.length when none). */
function firstAtOrAbove(x: readonly number[], c: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((x[mid] as number) < c) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Mean over the series of y_b against the line through (x_{b−2}, y_{b−2}) and (x_{b−1}, y_{b−1}), as e^d − 1. */
function localJump(prepared: Prepared[], firstFlagged: number[]): number {
  let sum = 0;
  let count = 0;
  prepared.forEach((p, d) => {
    const b = firstFlagged[d] as number;
    if (b < 2 || b >= p.x.length) return;
    const slope = ((p.y[b - 1] as number) - (p.y[b - 2] as number)) / ((p.x[b - 1] as number) - (p.x[b - 2] as number));
    sum += (p.y[b] as number) - ((p.y[b - 1] as number) + slope * ((p.x[b] as number) - (p.x[b - 1] as number)));
    count++;
  });
  return count > 0 ? Math.expm1(sum / count) : 0;
}

/** True when the mean local slope into the first point at x ≥ c is below `ratio` times the mean slope of the three intervals below it. */
function stalls(prepared: Prepared[], c: number, ratio: number): boolean {
  let into = 0;
  let below = 0;
  let count = 0;
  const slope = (p: Prepared, i: number) => ((p.y[i] as number) - (p.y[i - 1] as number)) / ((p.x[i] as number) - (p.x[i - 1] as number));
  for (const p of prepared) {
    const b = firstAtOrAbove(p.x, c);
    if (b < 2 || b >= p.x.length) continue;
    const from = Math.max(1, b - 3);
    let sum = 0;
    for (let i = from; i < b; i++) sum += slope(p, i);
    into += slope(p, b);
    below += sum / (b - from);
    count++;
  }
  return count > 0 && into < ratio * below;
}

/** Candidate break positions: x values with at least `first` points of some series below and some above. */
function candidateBreaks(prepared: Prepared[]): number[] {
  const values = new Set<number>();
  for (const p of prepared) for (let b = p.first; b < p.x.length; b++) values.add(p.x[b] as number);
  return [...values].sort((a, b) => a - b);
}

/** The test on the means of equal-width bins in x; a break is mapped to the first point of its bin. */
function binned(series: readonly BreakSeries[], opt: InstabilityOptions): FlowBreakResult {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) {
    for (const v of s.x) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  const width = (hi - lo) / MAX_TESTED || 1;
  const binnedSeries = series.map((s) => {
    const bins: { bin: number; start: number; sx: number; sy: number; count: number }[] = [];
    s.x.forEach((xi, i) => {
      const bin = Math.min(MAX_TESTED - 1, Math.floor((xi - lo) / width));
      const last = bins[bins.length - 1];
      if (last && last.bin === bin) {
        last.sx += xi;
        last.sy += s.y[i] as number;
        last.count++;
      } else bins.push({ bin, start: i, sx: xi, sy: s.y[i] as number, count: 1 });
    });
    return bins;
  });
  const result = findFlowBreak(
    binnedSeries.map((bins) => ({ x: bins.map((b) => b.sx / b.count), y: bins.map((b) => b.sy / b.count) })),
    opt,
  );
  const at = (d: number, k: number) => {
    const bins = binnedSeries[d] as { start: number }[];
    return k < bins.length ? (bins[k] as { start: number }).start : (series[d] as BreakSeries).x.length;
  };
  let flowBreak: FlowBreak | null = null;
  if (result.break) {
    const firstFlagged = result.break.firstFlagged.map((k, d) => at(d, k));
    const x = Math.min(...firstFlagged.map((b, d) => (series[d] as BreakSeries).x[b] ?? Infinity));
    flowBreak = { ...result.break, x, firstFlagged };
  }
  return {
    break: flowBreak,
    falls: result.falls.map((f, d) => f.map((k) => at(d, k))),
  };
}

function centred(x: readonly number[]): number[] {
  if (x.length === 0) return [];
  const mean = x.reduce((s, v) => s + v, 0) / x.length;
  const half = x.reduce((m, v) => Math.max(m, Math.abs(v - mean)), 0) || 1;
  return x.map((v) => (v - mean) / half);
}

function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] as number) * (b[i] as number);
  return s;
}

/**
 * The informative note on melt fracture (code MELT_FRACTURE_STRESS) when the highest wall stress
 * of a flow curve reaches the lower end of the range where polyolefins commonly begin to fracture
 * (common practice, no source); null below it.
 * @param wallStress the highest wall stress, Pa; rate the apparent rate where it is reached, 1/s
 */
export function meltFractureNote(wallStress: number, rate: number, options: Partial<InstabilityOptions> = {}): Warning | null {
  const [low, high] = { ...DEFAULT_INSTABILITY_OPTIONS, ...options }.meltFractureStress;
  if (!(wallStress >= low)) return null;
  const mpa = (x: number) => Number((x / 1e6).toPrecision(2)).toString();
  return warning(
    "MELT_FRACTURE_STRESS",
    `The wall stress reaches ${mpa(wallStress)} MPa (at ${Number(rate.toPrecision(3))} 1/s). For polyolefins, melt fracture commonly sets in at about ${mpa(low)}–${mpa(high)} MPa (common practice, no source): look at the extrudate for a rough or distorted surface before trusting the top rates.`,
  );
}
