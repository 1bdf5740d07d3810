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
}

/** Entries kept before a cache is emptied (unit texts are few; this only bounds memory). */
const MAX_ENTRIES = 256;
const scales = new Map<string, UnitScale>();
const known = new Map<string, boolean>();

function remember<T>(cache: Map<string, T>, key: string, value: T): T {
  if (cache.size >= MAX_ENTRIES) cache.clear();
  cache.set(key, value);
  return value;
}

/**
 * The conversions of `unit` (a `quantity` unit) to and from SI.
 * @throws RheoError("value") naming `argument` for an unknown unit, as toSI does (not cached).
 */
export function unitScale(quantity: Quantity, unit: string, argument: string): UnitScale {
  const key = `${quantity}\u0000${unit}`;
  const cached = scales.get(key);
  if (cached) return cached;
  const factor = toSI(1, unit, quantity, argument);
  const scale: UnitScale =
    toSI(0, unit, quantity, argument) === 0
      ? { toSI: (v) => v * factor + 0, fromSI: (v) => v / factor }
      : { toSI: (v) => toSI(v, unit, quantity, argument), fromSI: (v) => fromSI(v, unit, quantity, argument) };
  return remember(scales, key, scale);
}

/** isUnitOf(quantity, unit), remembered. */
export function isKnownUnit(quantity: Quantity, unit: string): boolean {
  const key = `${quantity}\u0000${unit}`;
  const cached = known.get(key);
  return cached !== undefined ? cached : remember(known, key, isUnitOf(quantity, unit));
}
