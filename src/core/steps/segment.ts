/**
 * Segmentation of a die run into constant-speed steps, tolerant to speed jitter.
 *
 * Criterion (common practice, no source): a step's speed level is the running mean of the samples
 * accepted into it; a sample departs when |v − level| > max(tol·|level|, v_floor). A new step
 * starts at the first of `hold` consecutive departing samples (shorter excursions are jitter and
 * are not averaged in). Segments with fewer than `minStepSamples` samples are speed transitions
 * (a ramp, a pause too short to matter) and join the following step as its lead-in, where the
 * transient exclusion drops them. Segments whose level is at or below v_floor (piston at rest or
 * retracting) are idle: they are not steps. v_floor = 1e-4 of the run's highest speed level.
 * O(n).
 */

/** One constant-speed segment: samples [startIndex, endIndex] inclusive. */
export interface SpeedSegment {
  startIndex: number;
  endIndex: number;
  /** mean speed of the accepted samples, m/s (same unit as the input) */
  level: number;
  /** true for a piston at rest or retracting */
  idle: boolean;
}

/** Fraction of the highest speed level below which a segment is idle. */
export const IDLE_SPEED_FRACTION = 1e-4;

function rawSegments(speed: ArrayLike<number>, tol: number, hold: number, floor: number): SpeedSegment[] {
  const out: SpeedSegment[] = [];
  const n = speed.length;
  let start = 0;
  let sum = speed[0] as number;
  let count = 1;
  let pending = -1;
  for (let i = 1; i < n; i++) {
    const v = speed[i] as number;
    const level = sum / count;
    if (Math.abs(v - level) <= Math.max(tol * Math.abs(level), floor)) {
      sum += v;
      count++;
      pending = -1;
      continue;
    }
    if (pending < 0) pending = i;
    if (i - pending + 1 >= hold) {
      out.push({ startIndex: start, endIndex: pending - 1, level, idle: false });
      start = pending;
      sum = 0;
      count = 0;
      for (let k = pending; k <= i; k++) sum += speed[k] as number;
      count = i - pending + 1;
      pending = -1;
    }
  }
  out.push({ startIndex: start, endIndex: n - 1, level: sum / count, idle: false });
  return out;
}

/**
 * Splits a speed record into constant-speed segments (see the module comment).
 * @param speed piston speed per sample (any unit; SI m/s in the core)
 * @param tolerance relative change that starts a new step, e.g. 0.05
 * @param hold consecutive departing samples needed (≥ 1)
 * @param minStepSamples shorter segments join the following one
 * @returns segments covering every sample in order
 * @example segmentBySpeed([1, 1, 1, 2, 2, 2], 0.05, 2, 2).map((s) => s.level) // [1, 2]
 */
export function segmentBySpeed(speed: ArrayLike<number>, tolerance: number, hold: number, minStepSamples: number): SpeedSegment[] {
  if (speed.length === 0) return [];
  let top = 0;
  for (let i = 0; i < speed.length; i++) top = Math.max(top, Math.abs(speed[i] as number));
  const floor = IDLE_SPEED_FRACTION * top;
  const raw = rawSegments(speed, tolerance, hold, floor);
  const maxLevel = raw.reduce((m, s) => Math.max(m, s.level), 0);
  const idleBelow = IDLE_SPEED_FRACTION * maxLevel;
  // Short segments join the following one (the last short one joins its predecessor).
  const merged: SpeedSegment[] = [];
  let leadIn = -1;
  for (const s of raw) {
    const samples = s.endIndex - s.startIndex + 1;
    if (samples < minStepSamples) {
      if (leadIn < 0) leadIn = s.startIndex;
      continue;
    }
    merged.push({ ...s, startIndex: leadIn >= 0 ? leadIn : s.startIndex });
    leadIn = -1;
  }
  if (leadIn >= 0) {
    const last = merged[merged.length - 1];
    if (last) last.endIndex = speed.length - 1;
    else merged.push({ startIndex: 0, endIndex: speed.length - 1, level: raw.reduce((a, s) => a + s.level * (s.endIndex - s.startIndex + 1), 0) / speed.length, idle: false });
  }
  // Neighbours at the same level (split by an over-long excursion) stay separate: each is a step.
  for (const s of merged) s.idle = !(s.level > idleBelow);
  return merged;
}
