/**
 * Which pressure transducer suits a die's predicted pressures.
 *
 * Rule (common practice, no source): a reading is trusted between a few percent of full scale
 * (below, the zero drift and the ±accuracy·FS error dominate) and about 90 % of full scale (a
 * margin for the prediction's uncertainty, overshoot at a speed change, and the transducer's
 * overload rating). The suggestion is the smallest full scale that keeps every step inside
 * [lowFraction·FS, highFraction·FS]; failing that, the one covering most steps without any
 * step above full scale; failing that, the largest.
 */
import { RheoError, requirePositive } from "./errors";

/** A pressure transducer (SI). */
export interface PlanTransducer {
  name: string;
  /** Full scale, Pa. */
  fullScale: number;
  /** Accuracy as a fraction of full scale (0.0025 for ±0.25 % FS); optional. */
  accuracy?: number;
}

/** How a predicted pressure sits in a transducer's range. */
export type RangeFlag = "ok" | "low" | "high" | "over";

/** Flag of one pressure: over (> FS), high (> highFraction·FS), low (< lowFraction·FS) or ok. */
export function rangeFlag(pressure: number, fullScale: number, lowFraction: number, highFraction: number): RangeFlag {
  const f = pressure / fullScale;
  if (f > 1) return "over";
  if (f > highFraction) return "high";
  if (f < lowFraction) return "low";
  return "ok";
}

/** Checks the transducer list: names unique, full scale > 0, accuracy in [0, 1). */
export function validateTransducers(transducers: readonly PlanTransducer[], argument = "transducers"): void {
  if (transducers.length === 0) throw new RheoError("missing", argument, "give at least one transducer (name and full scale)");
  const seen = new Set<string>();
  for (const t of transducers) {
    if (seen.has(t.name)) throw new RheoError("value", argument, `the name "${t.name}" is used twice`);
    seen.add(t.name);
    requirePositive(t.fullScale, `${argument} "${t.name}" fullScale`);
    if (t.accuracy !== undefined && !(t.accuracy >= 0 && t.accuracy < 1)) {
      throw new RheoError("domain", `${argument} "${t.name}" accuracy`, `must be a fraction of full scale from 0 to below 1 (e.g. 0.0025 for 0.25 %), got ${t.accuracy}`);
    }
  }
}

/**
 * The suggested transducer for a list of predicted pressures (Pa); see the module rule.
 * @returns the transducer and whether every step is inside the trusted band
 * @example suggestTransducer([2e6, 8e6], [{ name: "a", fullScale: 1e7 }, { name: "b", fullScale: 5e7 }], 0.05, 0.9)
 *   // { transducer: { name: "a", ... }, coversAll: true }
 */
export function suggestTransducer(
  pressures: readonly number[],
  transducers: readonly PlanTransducer[],
  lowFraction: number,
  highFraction: number,
): { transducer: PlanTransducer; coversAll: boolean } {
  const sorted = [...transducers].sort((a, b) => a.fullScale - b.fullScale);
  const okCount = (t: PlanTransducer) => pressures.filter((p) => rangeFlag(p, t.fullScale, lowFraction, highFraction) === "ok").length;
  const full = sorted.find((t) => okCount(t) === pressures.length);
  if (full) return { transducer: full, coversAll: true };
  const maxP = Math.max(...pressures);
  const safe = sorted.filter((t) => maxP <= t.fullScale);
  let best: PlanTransducer | undefined;
  for (const t of safe) if (best === undefined || okCount(t) > okCount(best)) best = t;
  return { transducer: best ?? (sorted[sorted.length - 1] as PlanTransducer), coversAll: false };
}
