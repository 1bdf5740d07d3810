/**
 * Orifice-die end correction: a die of short land length L_o (L/D below
 * {@link DEFAULT_ORIFICE_OPTIONS}.maxLengthOverDiameter) measures the entrance pressure plus the
 * pressure of its own land; at the same apparent shear rate (hence the same wall stress in fully
 * developed flow) it is subtracted from a long die's pressure (ISO 11443 permits the method; from
 * memory. Macosko 1994, ch. 6, from memory; Dealy & Wang 2013, from memory). With x = L/R (L/H for a slit):
 *
 *   ΔP_long = ΔP_ent + 2τ_w·x_long,   ΔP_orifice = ΔP_ent + 2τ_w·x_o
 *   ⇒ τ_w = (ΔP_long − ΔP_orifice)/(2(x_long − x_o)) = (ΔP_long − ΔP_orifice)·D/(4(L − L_o)),
 *      ΔP_ent = ΔP_orifice − 2τ_w·x_o.
 *
 * This is Bagley's straight line (Bagley 1957) through two dies; ignoring the land (L_o = 0) biases
 * τ_w low by L_o/L and ΔP_ent high by the land pressure. The land subtraction assumes developed
 * flow in the land, which a very short land only approaches. The orifice must have the long die's
 * diameter and entry angle; the orifice's pressure is interpolated log–log to the long die's rates
 * (never extrapolated). When a group has orifice dies of several lengths the shortest is used.
 */
import { RheoError, Warning, requirePositive, warning } from "./errors";
import { interpolateLogLog } from "./interpolate";

/** Options of the orifice method. */
export interface OrificeOptions {
  /** a die with L/D below this is an orifice die, not a point on the Bagley line (common practice, no source) */
  maxLengthOverDiameter: number;
  /** warn when the orifice and Bagley entrance pressures differ by more than this fraction (common practice, no source) */
  maxDisagreement: number;
}

/** Defaults of {@link OrificeOptions}. */
export const DEFAULT_ORIFICE_OPTIONS: Readonly<OrificeOptions> = Object.freeze({
  maxLengthOverDiameter: 1,
  maxDisagreement: 0.2,
});

/**
 * True when a die counts as an orifice (zero-length) die: L/D < maxLengthOverDiameter.
 * @example isOrificeDie(0.2e-3, 1e-3) // true
 */
export function isOrificeDie(dieLength: number, dieDiameter: number, maxLengthOverDiameter = DEFAULT_ORIFICE_OPTIONS.maxLengthOverDiameter): boolean {
  requirePositive(dieDiameter, "dieDiameter");
  if (!(dieLength >= 0) || !Number.isFinite(dieLength)) {
    throw new RheoError("domain", "dieLength", `must be zero or more, got ${dieLength}`);
  }
  return dieLength / dieDiameter < maxLengthOverDiameter;
}

/**
 * Two-die (long die and orifice die) estimate at one apparent rate (module comment):
 * τ_w = (ΔP_long − ΔP_o)/(2(x_long − x_o)), ΔP_ent = ΔP_o − 2τ_w·x_o, x = L/R (L/H for a slit).
 * @param longPressure ΔP of the long die, Pa; longLengthOverRadius its x
 * @param orificePressure ΔP of the orifice die at the same rate, Pa; orificeLengthOverRadius its x (≥ 0, below the long die's)
 * @returns τ_w (Pa) and the land-corrected entrance pressure ΔP_ent (Pa)
 * @throws RheoError("domain") when the orifice is not shorter than the long die or a value is not finite
 * @example orificeLandCorrection(10.5e6, 20, 1.4e6, 1.8) // τ_w = 2.5e5 Pa, ΔP_ent = 0.5e6 Pa
 */
export function orificeLandCorrection(
  longPressure: number,
  longLengthOverRadius: number,
  orificePressure: number,
  orificeLengthOverRadius: number,
): { wallShearStress: number; entrancePressure: number } {
  requirePositive(longLengthOverRadius, "longLengthOverRadius");
  if (!(orificeLengthOverRadius >= 0) || !Number.isFinite(orificeLengthOverRadius)) {
    throw new RheoError("domain", "orificeLengthOverRadius", `must be zero or more, got ${orificeLengthOverRadius}`);
  }
  if (!(orificeLengthOverRadius < longLengthOverRadius)) {
    throw new RheoError("domain", "orificeLengthOverRadius", `must be below the long die's (${longLengthOverRadius}), got ${orificeLengthOverRadius}`);
  }
  if (!Number.isFinite(longPressure) || !Number.isFinite(orificePressure)) {
    throw new RheoError("domain", "pressure", `must be finite, got ${longPressure} and ${orificePressure}`);
  }
  const wallShearStress = (longPressure - orificePressure) / (2 * (longLengthOverRadius - orificeLengthOverRadius));
  return { wallShearStress, entrancePressure: orificePressure - 2 * wallShearStress * orificeLengthOverRadius };
}

/**
 * The orifice die of a group: the points of the shortest die among those given (all of them
 * orifice dies), sorted by rate, and the other lengths that were passed over.
 * @param points orifice-die points: L (m), γ̇_a (1/s), ΔP (Pa)
 * @returns null when there is no point
 */
export function shortestOrificeDie<T extends { dieLength: number; shearRateApparent: number }>(points: T[]): { dieLength: number; points: T[]; otherLengths: number[] } | null {
  if (points.length === 0) return null;
  const lengths = [...new Set(points.map((p) => p.dieLength))].sort((a, b) => a - b);
  const shortest = lengths[0] as number;
  const same = (a: number, b: number) => Math.abs(a - b) <= 1e-6 * Math.max(a, b);
  const chosen = points.filter((p) => same(p.dieLength, shortest)).sort((a, b) => a.shearRateApparent - b.shearRateApparent);
  return { dieLength: shortest, points: chosen, otherLengths: lengths.filter((l) => !same(l, shortest)) };
}

/** One long-die point corrected with the orifice pressure. */
export interface OrificeRow {
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** long-die pressure ΔP, Pa */
  pressure: number;
  /** the orifice die's reading at the same apparent rate (entrance plus its land), Pa */
  orificePressure: number;
  /** entrance pressure: the orifice reading minus its land, ΔP_o − 2τ_w·x_o, Pa */
  entrancePressureOrifice: number;
  /** τ_w = (ΔP − ΔP_o)·D/(4(L − L_o)), Pa */
  wallShearStress: number;
  /** true when the orifice pressure was interpolated rather than measured at this rate */
  interpolated: boolean;
}

/** Result of {@link orificeCorrection}. */
export interface OrificeResult {
  rows: OrificeRow[];
  warnings: Warning[];
}

function checkSeries(rates: number[], pressures: number[], what: string): void {
  if (rates.length !== pressures.length) {
    throw new RheoError("value", `${what}Pressure`, `has ${pressures.length} values but ${what}ShearRate has ${rates.length}`);
  }
  rates.forEach((r, i) => requirePositive(r, `${what}ShearRate`, i + 1));
  pressures.forEach((p, i) => requirePositive(p, `${what}Pressure`, i + 1));
}

/**
 * Entrance pressure read off an orifice die's curve at `shearRateApparent` (log–log
 * interpolation between its measured points); undefined outside the measured range. This is the
 * orifice's reading: it includes the pressure of the orifice's land (see {@link orificeLandCorrection}).
 * @param orificeShearRate γ̇_a of the orifice points, 1/s
 * @param orificePressure ΔP of the orifice points, Pa
 * @example orificeEntrancePressure([10, 1000], [1e5, 1e7], 100) // 1e6 Pa
 */
export function orificeEntrancePressure(orificeShearRate: number[], orificePressure: number[], shearRateApparent: number): number | undefined {
  checkSeries(orificeShearRate, orificePressure, "orifice");
  requirePositive(shearRateApparent, "shearRateApparent");
  return interpolateLogLog(orificeShearRate, orificePressure, shearRateApparent);
}

/**
 * Corrects one long die's points with an orifice die of the same diameter (module comment).
 *
 * Warning codes: ORIFICE_RATE_OUTSIDE (long-die rates outside the orifice's measured range are
 * left out), ORIFICE_PRESSURE_TOO_HIGH (the orifice pressure reaches the long die's: that point
 * is left out).
 *
 * @param long the long die: D and L (m), γ̇_a (1/s) and ΔP (Pa) per point
 * @param orifice the orifice die's γ̇_a (1/s) and ΔP (Pa) per point, and its land length L_o (m;
 *   default 0, a die of zero length)
 * @throws RheoError("missing") when no long-die point can be corrected; ("domain") for
 *   non-positive input or an orifice not shorter than the long die; ("value") for unequal lengths.
 * @example orificeCorrection({dieDiameter: 1e-3, dieLength: 20e-3, shearRateApparent: [100], pressure: [1.2e7]}, {shearRateApparent: [50, 200], pressure: [1e6, 4e6], dieLength: 0.5e-3})
 */
export function orificeCorrection(
  long: { dieDiameter: number; dieLength: number; shearRateApparent: number[]; pressure: number[] },
  orifice: { shearRateApparent: number[]; pressure: number[]; dieLength?: number },
): OrificeResult {
  requirePositive(long.dieDiameter, "dieDiameter");
  requirePositive(long.dieLength, "dieLength");
  checkSeries(long.shearRateApparent, long.pressure, "long");
  checkSeries(orifice.shearRateApparent, orifice.pressure, "orifice");
  const landLength = orifice.dieLength ?? 0;
  if (!(landLength >= 0) || !Number.isFinite(landLength)) throw new RheoError("domain", "orificeLength", `must be zero or more, got ${landLength}`);
  if (!(landLength < long.dieLength)) {
    throw new RheoError("domain", "orificeLength", `must be shorter than the long die (${long.dieLength} m), got ${landLength} m`);
  }
  if (orifice.shearRateApparent.length === 0) throw new RheoError("missing", "orificePressure", "the orifice die has no points");
  const xLong = (2 * long.dieLength) / long.dieDiameter;
  const xOrifice = (2 * landLength) / long.dieDiameter;
  const rows: OrificeRow[] = [];
  const outside: number[] = [];
  const tooHigh: number[] = [];
  long.shearRateApparent.forEach((rate, i) => {
    const pressure = long.pressure[i] as number;
    const pOrifice = interpolateLogLog(orifice.shearRateApparent, orifice.pressure, rate);
    if (pOrifice === undefined) {
      outside.push(rate);
      return;
    }
    if (pOrifice >= pressure) {
      tooHigh.push(rate);
      return;
    }
    const measured = orifice.shearRateApparent.some((r) => Math.abs(r - rate) <= 1e-9 * rate);
    const pair = orificeLandCorrection(pressure, xLong, pOrifice, xOrifice);
    rows.push({
      shearRateApparent: rate,
      pressure,
      orificePressure: pOrifice,
      entrancePressureOrifice: pair.entrancePressure,
      wallShearStress: pair.wallShearStress,
      interpolated: !measured,
    });
  });
  const warnings: Warning[] = [];
  if (outside.length > 0) {
    warnings.push(
      warning("ORIFICE_RATE_OUTSIDE", `${outside.length} long-die point(s) lie outside the rates the orifice die was run at (${outside.map(fmt).join(", ")} 1/s) and were left out: the orifice pressure is never extrapolated.`),
    );
  }
  if (tooHigh.length > 0) {
    warnings.push(
      warning("ORIFICE_PRESSURE_TOO_HIGH", `At ${tooHigh.map(fmt).join(", ")} 1/s the orifice pressure is as high as the long die's; those points were left out. Check that both dies have the same diameter and entry.`),
    );
  }
  if (rows.length === 0) {
    throw new RheoError("missing", "orificePressure", "no long-die point lies within the orifice die's rate range; run the orifice over the same rates");
  }
  return { rows, warnings };
}

/**
 * Compares the two estimates of the entrance pressure at common rates.
 * Warning code: ORIFICE_BAGLEY_DISAGREE (relative difference |ΔP_orifice − ΔP_Bagley|/ΔP_orifice
 * above maxDisagreement at some rate; the message names the orifice's land as a possible cause
 * when its L/D, `orificeLengthOverDiameter`, is above zero).
 * @returns the relative differences, aligned with the inputs (null where either is missing)
 */
export function compareEntrancePressures(
  shearRateApparent: number[],
  bagley: (number | null)[],
  orifice: (number | null)[],
  maxDisagreement = DEFAULT_ORIFICE_OPTIONS.maxDisagreement,
  orificeLengthOverDiameter = 0,
): { difference: (number | null)[]; warnings: Warning[] } {
  const bad: number[] = [];
  const difference = shearRateApparent.map((rate, i) => {
    const b = bagley[i];
    const o = orifice[i];
    if (b === null || b === undefined || o === null || o === undefined || !(o > 0)) return null;
    const d = (b - o) / o;
    if (Math.abs(d) > maxDisagreement) bad.push(rate);
    return d;
  });
  const warnings =
    bad.length > 0
      ? [
          warning(
            "ORIFICE_BAGLEY_DISAGREE",
            `The orifice die and the Bagley plot give entrance pressures more than ${Math.round(maxDisagreement * 100)} % apart at ${bad.map(fmt).join(", ")} 1/s: suspect pressure dependence, slip, a mismatched orifice entry${
              orificeLengthOverDiameter > 0 ? `, or the orifice's own land (L/D = ${fmt(orificeLengthOverDiameter)}; its pressure was subtracted as developed flow, 2τ_w·L/R, which a short land only approaches)` : ""
            }.`,
          ),
        ]
      : [];
  return { difference, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
