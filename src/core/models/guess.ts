/**
 * Data summaries behind the automatic initial guesses: low-rate plateau, high-rate power-law
 * slope, half-viscosity rate, yield stress from the low-rate stress. Heuristics (common practice,
 * no source): they only need to land in the basin of the least-squares optimum.
 */
import type { GuessData } from "./types";

/** Least-squares straight line y = intercept + slope·x through the points from..to−1. */
export function lineFit(x: readonly number[], y: readonly number[], from = 0, to = x.length): { slope: number; intercept: number } {
  const n = to - from;
  let sx = 0;
  let sy = 0;
  for (let i = from; i < to; i++) {
    sx += x[i] as number;
    sy += y[i] as number;
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = from; i < to; i++) {
    const dx = (x[i] as number) - mx;
    sxx += dx * dx;
    sxy += dx * ((y[i] as number) - my);
  }
  const slope = sxx > 0 ? sxy / sxx : 0;
  return { slope, intercept: my - slope * mx };
}

/** logPoints of the data objects seen (the guesses of one model ask for them several times). */
const LOG_POINTS = new WeakMap<GuessData, { x: number[]; y: number[] }>();

/** The points as (ln γ̇, ln η) sorted by rate (the arrays are shared: do not modify them). */
export function logPoints(data: GuessData): { x: number[]; y: number[] } {
  const seen = LOG_POINTS.get(data);
  if (seen && seen.x.length === data.shearRate.length) return seen;
  const points = sortedLogPoints(data);
  LOG_POINTS.set(data, points);
  return points;
}

/** True when a[i − 1] ≤ a[i] throughout (the stable sort by rate would then keep data order). */
function isAscending(a: readonly number[]): boolean {
  for (let i = 1; i < a.length; i++) if (!((a[i - 1] as number) <= (a[i] as number))) return false;
  return true;
}

function sortedLogPoints(data: GuessData): { x: number[]; y: number[] } {
  if (isAscending(data.shearRate)) {
    return { x: data.shearRate.map((rate) => Math.log(rate)), y: data.viscosity.map((eta) => Math.log(eta)) };
  }
  const order = data.shearRate.map((_, i) => i).sort((a, b) => (data.shearRate[a] as number) - (data.shearRate[b] as number));
  return {
    x: order.map((i) => Math.log(data.shearRate[i] as number)),
    y: order.map((i) => Math.log(data.viscosity[i] as number)),
  };
}

/** Zero-shear plateau estimate: the largest viscosity seen. */
export function plateauViscosity(data: GuessData): number {
  return Math.max(...data.viscosity);
}

/** Power-law fit ln η = c + s·ln γ̇ over the upper third of the rates (at least 2 points). */
export function highRatePowerLaw(data: GuessData): { slope: number; intercept: number } {
  const { x, y } = logPoints(data);
  const count = Math.max(2, Math.ceil(x.length / 3));
  return lineFit(x.slice(-count), y.slice(-count));
}

/**
 * Steepest local slope of ln η against ln γ̇: straight lines through sliding windows of
 * max(3, n/5) neighbouring points. Equals the power-law slope n − 1 whether the curve ends in a
 * power law or levels off again into a second plateau.
 */
export function steepestSlope(data: GuessData): number {
  const { x, y } = logPoints(data);
  const width = Math.min(x.length, Math.max(3, Math.ceil(x.length / 5)));
  if (x.length > FAST_WINDOWS_FROM) return steepestSlopeSliding(x, y, width);
  let steepest = Infinity;
  for (let i = 0; i + width <= x.length; i++) {
    steepest = Math.min(steepest, lineFit(x, y, i, i + width).slope);
  }
  return Number.isFinite(steepest) ? steepest : 0;
}

/** Above this many points the windows' slopes come from running sums (O(n) instead of O(n²)). */
const FAST_WINDOWS_FROM = 200;

/**
 * {@link steepestSlope} for long curves: each window's slope from running sums about the first
 * point (slope = (wΣxy − ΣxΣy)/(wΣxx − (Σx)²)), then the steepest window refitted with
 * {@link lineFit} (two-pass) so the value carries no running-sum rounding.
 */
function steepestSlopeSliding(x: readonly number[], y: readonly number[], width: number): number {
  const x0 = x[0] as number;
  const y0 = y[0] as number;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  const add = (i: number, sign: number) => {
    const dx = (x[i] as number) - x0;
    const dy = (y[i] as number) - y0;
    sx += sign * dx;
    sy += sign * dy;
    sxx += sign * dx * dx;
    sxy += sign * dx * dy;
  };
  for (let i = 0; i < width; i++) add(i, 1);
  let best = -1;
  let steepest = Infinity;
  for (let i = 0; i + width <= x.length; i++) {
    if (i > 0) {
      add(i - 1, -1);
      add(i + width - 1, 1);
    }
    const d = width * sxx - sx * sx;
    const slope = d > 0 ? (width * sxy - sx * sy) / d : 0;
    if (slope < steepest) {
      steepest = slope;
      best = i;
    }
  }
  return best < 0 ? 0 : lineFit(x, y, best, best + width).slope;
}

/** Flow index n = 1 + steepest slope, kept within [low, high]. */
export function highRateIndex(data: GuessData, low = 0.05, high = 0.95): number {
  return Math.min(high, Math.max(low, 1 + steepestSlope(data)));
}

/**
 * Rate (1/s) at which η first falls to `target`, interpolated in log–log; extrapolated with the
 * high-rate power law when the data never get there.
 */
export function rateAtViscosity(data: GuessData, target: number): number {
  const { x, y } = logPoints(data);
  const lt = Math.log(target);
  for (let i = 1; i < x.length; i++) {
    const y0 = y[i - 1] as number;
    const y1 = y[i] as number;
    if (y0 > lt && y1 <= lt) {
      const x0 = x[i - 1] as number;
      const x1 = x[i] as number;
      return Math.exp(x0 + ((lt - y0) * (x1 - x0)) / (y1 - y0));
    }
  }
  const fit = highRatePowerLaw(data);
  const last = x[x.length - 1] as number;
  if (fit.slope < -1e-3) return Math.exp(Math.min((lt - fit.intercept) / fit.slope, last + 10));
  return Math.exp(last);
}

/** Shear stresses τ = η·γ̇ (Pa). */
export function stresses(data: GuessData): number[] {
  return data.viscosity.map((eta, i) => eta * (data.shearRate[i] as number));
}

/** Clamps a guess into the open interval (min, max) with a small margin. */
export function inside(value: number, min: number, max = Infinity): number {
  if (!Number.isFinite(value)) return min > 0 ? min * 10 : min + 1;
  const lo = min === 0 ? Number.MIN_VALUE * 1e10 : min + Math.abs(min) * 1e-6 + 1e-12;
  const hi = Number.isFinite(max) ? max - (max - min) * 1e-6 : Infinity;
  return Math.min(hi, Math.max(lo, value));
}
