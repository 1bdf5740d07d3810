/**
 * The steady window of one step and its plateau.
 *
 * Criterion (common practice, no source; the line fit is ordinary least squares, windowFit.ts):
 * over a window of duration T the least-squares line of pressure against time has slope b with
 * standard error SE(b) and residual standard deviation s (the noise). The drift D = b·T* with
 * T* = max(T, τ): over the window, or over one time constant τ of the step when that is longer,
 * since a first-order approach still has p − p_ss = −τ·dp/dt to go (compressionTime.ts) — a
 * window short against τ must not hide it. The window is steady when
 *
 *   |D| ≤ max(k·s, f·|p̄|) + 2·SE(b)·T*,
 *
 * i.e. the drift is not significantly (about 95 %) larger than k noise standard deviations
 * (driftLimit k), with a floor of a fraction f of the plateau (driftFloor) for very quiet signals.
 * The window must last at least minWindowTime, hold minWindowSamples samples, and span at least
 * half of the step left after the transient — so a slow drift through the step cannot hide in a
 * short window.
 *
 * Search: the window ends at the step's last sample and starts after the transient exclusion
 * (transient.ts); while it fails the test its start moves later by a tenth of its length, down to
 * the shortest admissible window. The first window that passes is the steady window. If none
 * passes, or the step is too short for the shortest window, the step is not steady and its
 * plateau is reported over the shortest admissible window (or, for a step cut short, the part
 * after the transient, else its last half), flagged.
 *
 * Plateau: mean p̄ and sample standard deviation of the window's samples (the standard deviation
 * of the readings, not of their mean).
 */
import { WindowFit, WindowSums } from "./windowFit";

/** Share of the step after the transient that the window spans at least. */
export const MIN_WINDOW_SHARE = 0.5;
/** Coverage factor of the drift's standard error (about 95 % for many samples). */
export const DRIFT_COVERAGE = 2;

/** Limits of {@link steadyWindow}. */
export interface WindowLimits {
  minWindowTime: number;
  minWindowSamples: number;
  driftLimit: number;
  driftFloor: number;
  /** τ of the step, s (0 when unknown): the drift is taken over max(window, τ) */
  timeConstant?: number;
}

/** The window chosen in one step. */
export interface WindowChoice {
  startIndex: number;
  endIndex: number;
  fit: WindowFit;
  /** signed drift b·max(T, τ), Pa */
  drift: number;
  /** largest accepted |drift|, Pa */
  driftAllowed: number;
  steady: boolean;
  /** why the step is not steady ("cut short", "drifting"), or null */
  reason: string | null;
}

/** Drift of a fitted window and the test of the module comment (τ in s, 0 when unknown). */
export function driftTest(fit: WindowFit, limits: Pick<WindowLimits, "driftLimit" | "driftFloor">, timeConstant = 0): { drift: number; driftAllowed: number; steady: boolean } {
  const span = Math.max(fit.end - fit.start, timeConstant);
  const drift = fit.slope * span;
  const driftAllowed = Math.max(limits.driftLimit * fit.noise, limits.driftFloor * Math.abs(fit.mean)) + DRIFT_COVERAGE * (Number.isFinite(fit.slopeError) ? fit.slopeError : 0) * span;
  return { drift, driftAllowed, steady: Math.abs(drift) <= driftAllowed };
}

/** The chosen window as a choice record. */
function choice(sums: WindowSums, a: number, b: number, limits: WindowLimits, steadyOverride?: boolean, reason: string | null = null): WindowChoice {
  const fit = sums.fit(a, b);
  const t = driftTest(fit, limits, limits.timeConstant);
  const steady = steadyOverride ?? t.steady;
  return { startIndex: a, endIndex: b, fit, drift: t.drift, driftAllowed: t.driftAllowed, steady, reason: steady ? null : reason };
}

/** A drift as a percentage of the plateau (the unit-free way the messages give it). */
function percentOf(value: number, c: WindowChoice): string {
  const m = Math.abs(c.fit.mean);
  return m > 0 ? `${Number(((100 * value) / m).toPrecision(2))} %` : `${Number(value.toPrecision(3))}`;
}
const driftText = (c: WindowChoice) => percentOf(c.drift, c);
const allowedText = (c: WindowChoice) => percentOf(c.driftAllowed, c);
/** "the last 20.0 s" or "one time constant (31.0 s)" — the span the drift was taken over. */
function spanText(c: WindowChoice, limits: WindowLimits, window?: string): string {
  const span = c.fit.end - c.fit.start;
  const tau = limits.timeConstant ?? 0;
  if (tau > span) return `one time constant (${tau.toPrecision(3)} s)`;
  return window ?? `the last ${span.toPrecision(3)} s`;
}

/** First index in [from, to] whose time is at least `t` (to + 1 when none). */
export function indexAtOrAfter(time: ArrayLike<number>, from: number, to: number, t: number): number {
  let lo = from;
  let hi = to + 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((time[mid] as number) < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Finds the steady window of the step [from, to] (see the module comment).
 * @param sums running sums of the step
 * @param exclusion transient time excluded after the step's first sample, s
 */
export function steadyWindow(sums: WindowSums, time: ArrayLike<number>, from: number, to: number, exclusion: number, limits: WindowLimits): WindowChoice {
  const t0 = time[from] as number;
  const tEnd = time[to] as number;
  const s0 = indexAtOrAfter(time, from, to, t0 + exclusion);
  const long = (a: number) => to - a + 1 >= limits.minWindowSamples && tEnd - (time[a] as number) >= limits.minWindowTime;
  // Latest admissible start: the shortest window of minWindowTime, minWindowSamples and half of
  // the post-transient part.
  const afterTransient = tEnd - (time[Math.min(s0, to)] as number);
  const latestByTime = tEnd - Math.max(limits.minWindowTime, MIN_WINDOW_SHARE * afterTransient);
  let latest = Math.min(to - limits.minWindowSamples + 1, indexAtOrAfter(time, from, to, latestByTime + 1e-9 * Math.abs(latestByTime)) - 1);
  if (s0 > to || !long(s0) || latest < s0) {
    const remaining = to - Math.min(s0, to) + 1;
    const a = remaining >= 3 && s0 <= to ? s0 : Math.max(from, to - Math.max(2, Math.floor((to - from + 1) / 2)) + 1);
    const have = tEnd - (time[a] as number);
    const why = s0 > to ? "the step ends within its transient" : `${have.toPrecision(3)} s of the step is left after the transient, ${limits.minWindowTime} s and ${limits.minWindowSamples} samples are needed`;
    return choice(sums, a, to, limits, false, `cut short: ${why}`);
  }
  latest = Math.max(latest, s0);
  let a = s0;
  for (;;) {
    const c = choice(sums, a, to, limits);
    if (c.steady) return c;
    if (a >= latest) break;
    a = Math.min(latest, a + Math.max(1, Math.floor((to - a + 1) / 10)));
  }
  const last = choice(sums, latest, to, limits, false);
  last.reason = `drifting: ${driftText(last)} over ${spanText(last, limits)}, ${allowedText(last)} allowed`;
  return last;
}

/**
 * The plateau over a hand-set window [start, end] (s) of the step [from, to]; the drift test is
 * still applied and reported.
 * @returns null when the window holds fewer than 3 of the step's samples
 */
export function windowAt(sums: WindowSums, time: ArrayLike<number>, from: number, to: number, start: number, end: number, limits: WindowLimits): WindowChoice | null {
  const a = indexAtOrAfter(time, from, to, start);
  const b = indexAtOrAfter(time, from, to, end + 1e-12 * Math.abs(end)) - 1;
  if (b - a + 1 < 3) return null;
  const c = choice(sums, a, b, limits);
  if (!c.steady) c.reason = `drifting: ${driftText(c)} over ${spanText(c, limits, "the set window")}, ${allowedText(c)} allowed`;
  return c;
}
