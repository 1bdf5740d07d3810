/**
 * Unit conversions resolved once per (quantity, unit text) instead of once per cell.
 *
 * The core's toSI/fromSI look the unit up in the table on every call; per cell, that lookup was
 * most of the time of a 10 000-row column (`npm run bench`). Here a unit without an offset
 * converts as v·factor + 0 and v/factor with factor = toSI(1, unit) — bit for bit what toSI and
 * fromSI compute (1·f + 0 = f exactly). A unit with an offset (°C, °F) keeps the core's
 * per-value call, so the results never differ from the core's.
 */
import { Quantity, fromSI, isUnitOf, toSI } from "../../core/units";

/** Conversions of one unit of one quantity to and from SI. */
export interface UnitScale {
  toSI(value: number): number;
  fromSI(value: number): number;
  /** toSI(1) for a unit without an offset (then toSI(v) = v·factor + 0, fromSI(v) = v/factor); undefined for °C, °F */
  readonly factor: number | undefined;
}

/** Entries kept per quantity before its cache is emptied (unit texts are few; this only bounds memory). */
const MAX_ENTRIES = 256;
/** Per quantity, per unit text: no key strings built per call (a per-row formula calls this for every cell). */
const scales = new Map<Quantity, Map<string, UnitScale>>();
const known = new Map<Quantity, Map<string, boolean>>();
/**
 * The last few (quantity, unit) pairs asked for, scanned by identity before any keyed lookup: a
 * per-row formula asks for the same three or four pairs for every cell, and a short scan of string
 * comparisons costs a fraction of a Map or property lookup keyed by a varying string.
 */
const RECENT = 8;
const recentQuantity: (Quantity | undefined)[] = new Array(RECENT).fill(undefined);
const recentUnit: (string | undefined)[] = new Array(RECENT).fill(undefined);
const recentScale: (UnitScale | undefined)[] = new Array(RECENT).fill(undefined);
let recentNext = 0;

function remember(quantity: Quantity, unit: string, scale: UnitScale): void {
  recentQuantity[recentNext] = quantity;
  recentUnit[recentNext] = unit;
  recentScale[recentNext] = scale;
  recentNext = (recentNext + 1) % RECENT;
}

function recent(quantity: Quantity, unit: string): UnitScale | undefined {
  for (let i = 0; i < RECENT; i++) if (recentUnit[i] === unit && recentQuantity[i] === quantity) return recentScale[i];
  return undefined;
}

function cacheOf<T>(caches: Map<Quantity, Map<string, T>>, quantity: Quantity): Map<string, T> {
  let cache = caches.get(quantity);
  if (!cache) caches.set(quantity, (cache = new Map()));
  else if (cache.size >= MAX_ENTRIES) cache.clear();
  return cache;
}

/**
 * The conversions of `unit` (a `quantity` unit) to and from SI.
 * @throws RheoError("value") naming `argument` for an unknown unit, as toSI does (not cached).
 */
export function unitScale(quantity: Quantity, unit: string, argument: string): UnitScale {
  const seen = recent(quantity, unit);
  if (seen !== undefined) return seen;
  const cached = scales.get(quantity)?.get(unit);
  if (cached !== undefined) {
    remember(quantity, unit, cached);
    return cached;
  }
  const factor = toSI(1, unit, quantity, argument);
  const scale: UnitScale =
    toSI(0, unit, quantity, argument) === 0
      ? { toSI: (v) => v * factor + 0, fromSI: (v) => v / factor, factor }
      : { toSI: (v) => toSI(v, unit, quantity, argument), fromSI: (v) => fromSI(v, unit, quantity, argument), factor: undefined };
  cacheOf(scales, quantity).set(unit, scale);
  remember(quantity, unit, scale);
  return scale;
}

/** isUnitOf(quantity, unit), remembered. */
export function isKnownUnit(quantity: Quantity, unit: string): boolean {
  if (recent(quantity, unit) !== undefined) return true;
  const cached = known.get(quantity)?.get(unit);
  if (cached !== undefined) return cached;
  const answer = isUnitOf(quantity, unit);
  cacheOf(known, quantity).set(unit, answer);
  return answer;
}
