/**
 * One die's readings as a ladder of piston-speed steps. Readings at the same speed are one step:
 * a repeat (the first speed run again at the end of the ladder is the usual check that the melt
 * did not degrade or drift in temperature while it sat in the barrel) is compared with the first
 * reading at that speed, never silently swapped for it.
 *
 *   change = (ΔP_repeat − ΔP_first)/ΔP_first
 *
 * |change| ≤ stabilityThreshold: the readings are averaged into the step (arithmetic mean of the
 * pressures, geometric mean of the rates). Above it the repeat has drifted: the first reading
 * stands for the step alone and the repeat is left out. A reading identical in every column to an
 * earlier one is an exact duplicate (a copied row) and is counted once.
 *
 * Which readings share a speed: readings whose rates lie within `speedTolerance` (relative) of
 * each other form one step when the whole cluster spans no more than that tolerance; a chain of
 * readings each within the tolerance of the next but wider overall is a dense ladder, and each of
 * its distinct rates is a step of its own (so a ladder of closely spaced speeds is never merged).
 * Thresholds are common practice, no source: a few per cent for thermal stability (ISO 11443 asks
 * for a check of thermal stability but leaves the limit to the user; from memory).
 */
import { Warning, warning } from "./errors";
import { geometricMean } from "./interpolate";

/** Options of {@link speedSteps}. */
export interface RepeatOptions {
  /** readings of one die whose rates differ by less than this fraction are one speed (see the module comment) */
  speedTolerance: number;
  /** a repeat whose pressure differs from the first reading by more than this fraction has drifted */
  stabilityThreshold: number;
}

/** Defaults of {@link RepeatOptions} (common practice, no source). */
export const DEFAULT_REPEAT_OPTIONS: Readonly<RepeatOptions> = Object.freeze({
  speedTolerance: 0.01,
  stabilityThreshold: 0.03,
});

/** One reading of a die, SI. */
export interface StepReading {
  /** apparent wall shear rate (or any quantity proportional to the piston speed), 1/s, > 0 */
  rate: number;
  /** measured pressure, Pa, > 0 */
  pressure: number;
  /** source row (1-based) for the record; readings are taken in row order */
  row: number;
  /** readings with equal keys are exact duplicates (default: rate and pressure) */
  key?: string;
}

/** One step of the ladder. Indices refer to the input array. */
export interface SpeedStep {
  /** rate of the step: the geometric mean of the readings used, 1/s */
  rate: number;
  /** pressure of the step: the arithmetic mean of the readings used, Pa */
  pressure: number;
  /** readings whose pressures make up the step (the first one first) */
  used: number[];
  /** exact duplicates of a reading of this step, counted once */
  duplicates: number[];
  /** repeats left out because they drifted beyond the stability threshold */
  drifted: number[];
}

/** One repeat compared with the first reading at its speed. */
export interface RepeatComparison {
  /** rate of the first reading, 1/s */
  rate: number;
  /** indices (into the input) of the first reading and of the repeat */
  first: number;
  repeat: number;
  firstRow: number;
  firstPressure: number;
  repeatRow: number;
  repeatPressure: number;
  /** (repeat − first)/first */
  change: number;
  /** "mean": the repeat was averaged into the step; "first": it drifted and the first reading stands alone */
  used: "mean" | "first";
}

/** Result of {@link speedSteps}. */
export interface SpeedLadder {
  /** steps in ascending rate */
  steps: SpeedStep[];
  /** every repeat (not the exact duplicates), in ascending rate */
  repeats: RepeatComparison[];
  /** pairs [earlier, duplicate] of input indices of exact duplicates */
  duplicates: [number, number][];
}

/**
 * Groups one die's readings into speed steps and compares repeats (see the module comment).
 * O(n log n); the input is not modified.
 * @example speedSteps([{rate: 10, pressure: 1e6, row: 1}, {rate: 10, pressure: 1.01e6, row: 9}]).steps[0].pressure // 1.005e6
 */
export function speedSteps(readings: readonly StepReading[], options: Partial<RepeatOptions> = {}): SpeedLadder {
  const opt: RepeatOptions = { ...DEFAULT_REPEAT_OPTIONS, ...options };
  const order = readings.map((_, i) => i).sort((a, b) => rateOf(readings, a) - rateOf(readings, b) || rowOf(readings, a) - rowOf(readings, b));
  const steps: SpeedStep[] = [];
  const repeats: RepeatComparison[] = [];
  const duplicates: [number, number][] = [];
  for (const members of speedClusters(order, readings, Math.log1p(opt.speedTolerance))) {
    members.sort((a, b) => rowOf(readings, a) - rowOf(readings, b) || a - b);
    const step: SpeedStep = { rate: NaN, pressure: NaN, used: [], duplicates: [], drifted: [] };
    const seen = new Map<string, number>();
    const compared: RepeatComparison[] = [];
    for (const i of members) {
      const r = readings[i] as StepReading;
      const key = r.key ?? `${r.rate}|${r.pressure}`;
      const earlier = seen.get(key);
      if (earlier !== undefined) {
        step.duplicates.push(i);
        duplicates.push([earlier, i]);
        continue;
      }
      seen.set(key, i);
      const first = step.used[0];
      if (first === undefined) {
        step.used.push(i);
        continue;
      }
      const f = readings[first] as StepReading;
      const change = (r.pressure - f.pressure) / f.pressure;
      const stable = Math.abs(change) <= opt.stabilityThreshold;
      (stable ? step.used : step.drifted).push(i);
      compared.push({ rate: f.rate, first, repeat: i, firstRow: f.row, firstPressure: f.pressure, repeatRow: r.row, repeatPressure: r.pressure, change, used: stable ? "mean" : "first" });
    }
    if (step.drifted.length > 0) {
      // A drifted repeat means the melt changed: keep the first reading alone, leave the others out.
      step.drifted.push(...step.used.slice(1));
      step.drifted.sort((a, b) => rowOf(readings, a) - rowOf(readings, b));
      step.used = step.used.slice(0, 1);
      for (const c of compared) c.used = "first";
    }
    repeats.push(...compared);
    step.rate = geometricMean(step.used.map((i) => rateOf(readings, i)));
    step.pressure = step.used.reduce((s, i) => s + (readings[i] as StepReading).pressure, 0) / step.used.length;
    steps.push(step);
  }
  return { steps, repeats, duplicates };
}

/**
 * Splits indices sorted by rate into speed clusters: gaps wider than `tolerance` (in ln rate)
 * separate clusters; a cluster wider than `tolerance` overall is a dense ladder and splits into its
 * distinct rates (equal to 1e-12 relative).
 */
function speedClusters(order: number[], readings: readonly StepReading[], tolerance: number): number[][] {
  const out: number[][] = [];
  let start = 0;
  const logRate = (k: number) => Math.log(rateOf(readings, order[k] as number));
  for (let k = 1; k <= order.length; k++) {
    if (k < order.length && logRate(k) - logRate(k - 1) <= tolerance) continue;
    const chunk = order.slice(start, k);
    if (logRate(k - 1) - logRate(start) <= tolerance) out.push(chunk);
    else {
      let s = 0;
      for (let j = 1; j <= chunk.length; j++) {
        if (j < chunk.length && Math.abs(logRate(start + j) - logRate(start + j - 1)) <= 1e-12) continue;
        out.push(chunk.slice(s, j));
        s = j;
      }
    }
    start = k;
  }
  return out;
}

function rateOf(readings: readonly StepReading[], i: number): number {
  return (readings[i] as StepReading).rate;
}

function rowOf(readings: readonly StepReading[], i: number): number {
  return (readings[i] as StepReading).row;
}

/** One die's ladder for {@link repeatWarnings}: its label, its readings and their steps. */
export interface DieRepeats {
  die: string;
  readings: readonly StepReading[];
  ladder: SpeedLadder;
}

/**
 * The warnings of repeated readings across a group's dies.
 * Warning codes: DUPLICATE_ROWS (exact duplicates, counted once), REPEATS_AVERAGED (repeats within
 * the stability threshold, averaged), REPEAT_DRIFT (a repeat beyond it: the first reading is used).
 */
export function repeatWarnings(dies: readonly DieRepeats[], stabilityThreshold: number): Warning[] {
  const warnings: Warning[] = [];
  const pairs = dies.flatMap((d) => d.ladder.duplicates.map(([a, b]) => `rows ${rowAt(d, a)} and ${rowAt(d, b)} (${d.die})`));
  if (pairs.length > 0) {
    warnings.push(warning("DUPLICATE_ROWS", `${pairs.length} row(s) repeat an earlier row exactly (same die, speed and pressure): ${listed(pairs)}. Each was counted once; check for a copied row.`));
  }
  const all = dies.flatMap((d) => d.ladder.repeats.map((r) => ({ die: d.die, ...r })));
  const averaged = all.filter((r) => r.used === "mean");
  if (averaged.length > 0) {
    warnings.push(
      warning(
        "REPEATS_AVERAGED",
        `${averaged.length} repeated reading(s) agree with the first reading at their speed within ${percent(stabilityThreshold)} and were averaged into it: ${listed(averaged.map((r) => `${r.die} at ${fmt(r.rate)} 1/s ${signed(r.change)} (row ${r.repeatRow} vs ${r.firstRow})`))}.`,
      ),
    );
  }
  const drifted = all.filter((r) => Math.abs(r.change) > stabilityThreshold);
  if (drifted.length > 0) {
    warnings.push(
      warning(
        "REPEAT_DRIFT",
        `Stability check: ${listed(drifted.map((r) => `${r.die} at ${fmt(r.rate)} 1/s, row ${r.repeatRow} reads ${signed(r.change)} against row ${r.firstRow}`))}, beyond the ${percent(stabilityThreshold)} limit: the melt may have degraded or its temperature drifted. At ${drifted.length === 1 ? "that speed" : "those speeds"} the first reading alone was used; the repeat(s) were left out of the Bagley lines and the interpolation.`,
      ),
    );
  }
  return warnings;
}

function rowAt(d: DieRepeats, index: number): number {
  return (d.readings[index] as StepReading).row;
}

function listed(items: string[]): string {
  return items.length > 6 ? `${items.slice(0, 6).join("; ")}; and ${items.length - 6} more` : items.join("; ");
}

function percent(x: number): string {
  return `${Number((x * 100).toPrecision(3))} %`;
}

function signed(x: number): string {
  return `${x >= 0 ? "+" : "−"}${(Math.abs(x) * 100).toFixed(1)} %`;
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
