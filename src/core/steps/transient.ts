/**
 * The transient after a speed change, excluded before the steady window is sought: a first-order
 * approach p(t) = p_ss + (p_0 − p_ss)·exp(−t/τ) is within a fraction ε of its final change after
 * ln(1/ε)·τ (compressionTime.ts; ε is the planner's settleTolerance).
 *
 * τ, in order of preference:
 *   1. given (setting timeConstant);
 *   2. the planner's compressibility estimate τ = β·V_melt·ΔP/Q (settings compressibility and
 *      meltVolume; ΔP the step's final level, Q its flow rate);
 *   3. read off the step: the time the pressure takes to cover 1 − 1/e of its change from the
 *      step's first sample to its final level (median of the last fifth of the step), which is τ
 *      for a first-order response. A change below 3 noise standard deviations counts as no
 *      visible transient (τ = 0). Common practice, no source.
 * The drift test of the steady window (plateau.ts) guards against a short guess.
 */
import { compressionTimeConstant, settlingTime } from "../compressionTime";
import { median, whiteNoise } from "./robust";

/** Where τ came from. */
export type TimeConstantSource = "given" | "compressibility" | "step";

/** The transient of one step. */
export interface Transient {
  /** τ, s */
  timeConstant: number;
  source: TimeConstantSource;
  /** excluded time after the step's first sample, ln(1/ε)·τ, s */
  exclusion: number;
}

/** Inputs of {@link stepTransient} besides the samples. */
export interface TransientSettings {
  settleTolerance: number;
  timeConstant?: number;
  compressibility?: number;
  meltVolume?: number;
  /** the step's flow rate Q, m³/s (for the compressibility estimate) */
  flowRate?: number;
}

/**
 * τ read off the samples [from, to] (rule 3 of the module comment).
 * @returns τ, s (0 when no transient is visible; the step's duration when the 1 − 1/e level is
 *   never reached)
 */
export function timeConstantFromStep(time: ArrayLike<number>, pressure: ArrayLike<number>, from: number, to: number): number {
  const n = to - from + 1;
  if (n < 5) return 0;
  const tail: number[] = [];
  for (let i = to - Math.max(2, Math.floor(n / 5)) + 1; i <= to; i++) tail.push(pressure[i] as number);
  const final = median(tail);
  const first = pressure[from] as number;
  const change = final - first;
  if (Math.abs(change) <= 3 * whiteNoise(pressure, from, to)) return 0;
  const level = 1 - Math.exp(-1);
  for (let i = from; i <= to; i++) {
    if (((pressure[i] as number) - first) / change >= level) return (time[i] as number) - (time[from] as number);
  }
  return (time[to] as number) - (time[from] as number);
}

/**
 * The transient of the step [from, to] (see the module comment).
 * @example stepTransient(t, p, 0, 99, { settleTolerance: 0.01, timeConstant: 2 }).exclusion // 9.21 s
 */
export function stepTransient(time: ArrayLike<number>, pressure: ArrayLike<number>, from: number, to: number, s: TransientSettings): Transient {
  let timeConstant: number;
  let source: TimeConstantSource;
  if (s.timeConstant !== undefined) {
    timeConstant = s.timeConstant;
    source = "given";
  } else if (s.compressibility !== undefined && s.meltVolume !== undefined && s.flowRate !== undefined && s.flowRate > 0) {
    const tail: number[] = [];
    for (let i = Math.max(from, to - 9); i <= to; i++) tail.push(pressure[i] as number);
    const level = median(tail);
    timeConstant = level > 0 ? compressionTimeConstant(s.compressibility, s.meltVolume, level, s.flowRate) : 0;
    source = "compressibility";
  } else {
    timeConstant = timeConstantFromStep(time, pressure, from, to);
    source = "step";
  }
  return { timeConstant, source, exclusion: settlingTime(timeConstant, s.settleTolerance) };
}
