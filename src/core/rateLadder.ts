/**
 * One ladder of apparent shear rates per group for the Bagley lines: the rates measured on the
 * longest die, extended beyond its range by the rates of the shorter dies (longest first) where
 * those were run further (a long die often reaches the transducer's range first). Each die's
 * pressure is brought to a ladder rate by log–log interpolation between its two neighbouring
 * steps (ISO 11443 permits interpolation between neighbouring measurements; from memory); a rate
 * outside a die's measured range is never extrapolated, except by at most `edgeTolerance` (the
 * spread of measured speeds about one set-point and of die bores of one nominal size: 3 % by
 * default), and then it is counted and said.
 * So there is one flow-curve point per ladder rate and no doubling when the dies' rates differ
 * slightly.
 */

/** One die's steps in ascending rate, SI. */
export interface LadderDie {
  /** apparent wall shear rates of the steps, 1/s, ascending */
  rates: readonly number[];
  /** pressures of the steps, Pa */
  pressures: readonly number[];
}

/** A die's pressure at one ladder rate and the steps it came from. */
export interface LadderPressure {
  /** Pa */
  pressure: number;
  /** false when the rate is one of the die's own steps */
  interpolated: boolean;
  /** true when the rate lies beyond the die's range (by at most the edge tolerance) */
  extrapolated: boolean;
  /** indices of the die's steps the value came from (one or two) */
  steps: number[];
}

/** Relative rate difference below which a ladder rate is a die's own step. */
const SAME_RATE = 1e-9;

/**
 * The group's ladder (ascending rates): the steps of `dies[reference]`, then, in the order of
 * `extension`, every rate of another die lying more than `edgeTolerance` beyond the ladder so far.
 * @param reference index of the die whose rates form the ladder (the longest die)
 * @param extension indices of the other dies, in the order they may extend it (longest first)
 * @param edgeTolerance relative rate margin (e.g. 0.03)
 */
export function rateLadder(dies: readonly LadderDie[], reference: number, extension: readonly number[], edgeTolerance: number): number[] {
  const ladder = [...(dies[reference] as LadderDie).rates];
  for (const d of extension) {
    if (ladder.length === 0) break;
    const lo = ladder[0] as number;
    const hi = ladder[ladder.length - 1] as number;
    for (const r of (dies[d] as LadderDie).rates) {
      if (r < lo / (1 + edgeTolerance) || r > hi * (1 + edgeTolerance)) ladder.push(r);
    }
    ladder.sort((a, b) => a - b);
  }
  return ladder;
}

/**
 * A die's pressure at `rate` (see the module comment): its own step, a log–log interpolation
 * between the bracketing steps, or, within `edgeTolerance` beyond its first or last step, the
 * log–log continuation of its end interval. Undefined further out. O(log n).
 */
export function pressureOnLadder(die: LadderDie, rate: number, edgeTolerance: number): LadderPressure | undefined {
  const { rates, pressures } = die;
  const n = rates.length;
  if (n === 0) return undefined;
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((rates[mid] as number) < rate) lo = mid + 1;
    else hi = mid;
  }
  // lo: first step with rate ≥ `rate` (or n − 1)
  for (const i of [lo, lo - 1]) {
    if (i >= 0 && i < n && Math.abs((rates[i] as number) - rate) <= SAME_RATE * rate) {
      return { pressure: pressures[i] as number, interpolated: false, extrapolated: false, steps: [i] };
    }
  }
  const first = rates[0] as number;
  const last = rates[n - 1] as number;
  if (rate > first && rate < last) return logLog(die, lo - 1, lo, rate, false);
  const beyond = rate < first ? first / rate - 1 : rate / last - 1;
  if (beyond > edgeTolerance) return undefined;
  if (n === 1) return { pressure: pressures[0] as number, interpolated: true, extrapolated: true, steps: [0] };
  return rate < first ? logLog(die, 0, 1, rate, true) : logLog(die, n - 2, n - 1, rate, true);
}

function logLog(die: LadderDie, i: number, j: number, rate: number, extrapolated: boolean): LadderPressure {
  const xi = Math.log(die.rates[i] as number);
  const xj = Math.log(die.rates[j] as number);
  const t = (Math.log(rate) - xi) / (xj - xi);
  const pressure = Math.exp(Math.log(die.pressures[i] as number) * (1 - t) + Math.log(die.pressures[j] as number) * t);
  return { pressure, interpolated: true, extrapolated, steps: [i, j] };
}
