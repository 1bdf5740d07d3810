/**
 * Pressure oscillation within a step (stick–slip flow): the pressure saws between a build-up and
 * a sudden drop instead of settling (Hatzikiriakos & Dealy, J. Rheol. 36 (1992) 845; from memory).
 *
 * Detection (common practice, no source): about the least-squares line of the part of the step
 * after the transient, count swings between the bands ±h,
 *   h = max(limit·|p̄|/4, 3σ_w),
 * σ_w the white-noise level from successive differences (robust.ts), which a slow oscillation
 * barely raises. A full cycle is a swing up and back down. An oscillation is reported when there
 * are at least `minCycles` cycles and the peak-to-peak amplitude (5th to 95th percentile of the
 * residuals) is at least limit·|p̄| and at least 6σ_w (white noise alone spans about 3.3σ).
 * The period is the span of the counted swings divided by the number of cycles.
 */
import { percentile, whiteNoise } from "./robust";

/** A detected oscillation. SI units. */
export interface Oscillation {
  /** peak-to-peak amplitude (5th–95th percentile of the detrended pressure), Pa */
  amplitude: number;
  /** amplitude / plateau */
  relativeAmplitude: number;
  /** mean period, s */
  period: number;
  /** full cycles counted */
  cycles: number;
}

/**
 * Looks for an oscillation in samples [from, to] (see the module comment).
 * @param line the least-squares line of the same samples: mean p̄ (Pa) and slope (Pa/s); it passes
 *   through (t̄, p̄)
 * @param limit peak-to-peak fraction of the plateau; @param minCycles cycles needed
 * @returns the oscillation, or null
 */
export function detectOscillation(
  time: ArrayLike<number>,
  pressure: ArrayLike<number>,
  from: number,
  to: number,
  line: { mean: number; slope: number },
  limit: number,
  minCycles: number,
): Oscillation | null {
  const n = to - from + 1;
  if (n < 8) return null;
  let tMean = 0;
  for (let i = from; i <= to; i++) tMean += time[i] as number;
  tMean /= n;
  const residuals: number[] = new Array(n);
  for (let i = from; i <= to; i++) residuals[i - from] = (pressure[i] as number) - line.mean - line.slope * ((time[i] as number) - tMean);
  const noise = whiteNoise(pressure, from, to);
  const level = Math.abs(line.mean);
  const h = Math.max((limit * level) / 4, 3 * noise);
  if (!(h > 0)) return null;
  let state = 0;
  let swings = 0;
  let firstSwing = NaN;
  let lastSwing = NaN;
  for (let k = 0; k < n; k++) {
    const r = residuals[k] as number;
    const next = r > h ? 1 : r < -h ? -1 : 0;
    if (next !== 0 && next !== state) {
      if (state !== 0) {
        swings++;
        const t = time[from + k] as number;
        if (swings === 1) firstSwing = t;
        lastSwing = t;
      }
      state = next;
    }
  }
  const cycles = Math.floor(swings / 2);
  if (cycles < minCycles) return null;
  const amplitude = percentile(residuals, 0.95) - percentile(residuals, 0.05);
  if (amplitude < limit * level || amplitude < 6 * noise) return null;
  const period = swings > 1 ? (2 * (lastSwing - firstSwing)) / (swings - 1) : NaN;
  return { amplitude, relativeAmplitude: level > 0 ? amplitude / level : NaN, period, cycles };
}
