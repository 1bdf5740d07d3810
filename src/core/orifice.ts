/**
 * Orifice-die (zero-length) end correction: a die of (nearly) zero land length measures the
 * entrance pressure ΔP_ent directly; at the same apparent shear rate it is subtracted from a long
 * die's pressure, τ_w = (ΔP_long − ΔP_orifice)·D/(4L) (ISO 11443 permits the method; from
 * memory. Macosko 1994, ch. 6, from memory; Dealy & Wang 2013, from memory). The orifice must have the long die's
 * diameter and entry angle; the orifice's pressure is interpolated log–log to the long die's rates
 * (never extrapolated).
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

/** One long-die point corrected with the orifice pressure. */
export interface OrificeRow {
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** long-die pressure ΔP, Pa */
  pressure: number;
  /** orifice pressure at the same apparent rate, Pa */
  entrancePressureOrifice: number;
  /** τ_w = (ΔP − ΔP_orifice)·D/(4L), Pa */
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
 * interpolation between its measured points); undefined outside the measured range.
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
 * @param orifice the orifice die's γ̇_a (1/s) and ΔP (Pa) per point
 * @throws RheoError("missing") when no long-die point can be corrected; ("domain") for
 *   non-positive input; ("value") for unequal lengths.
 * @example orificeCorrection({dieDiameter: 1e-3, dieLength: 20e-3, shearRateApparent: [100], pressure: [1.2e7]}, {shearRateApparent: [50, 200], pressure: [1e6, 4e6]})
 */
export function orificeCorrection(
  long: { dieDiameter: number; dieLength: number; shearRateApparent: number[]; pressure: number[] },
  orifice: { shearRateApparent: number[]; pressure: number[] },
): OrificeResult {
  requirePositive(long.dieDiameter, "dieDiameter");
  requirePositive(long.dieLength, "dieLength");
  checkSeries(long.shearRateApparent, long.pressure, "long");
  checkSeries(orifice.shearRateApparent, orifice.pressure, "orifice");
  if (orifice.shearRateApparent.length === 0) throw new RheoError("missing", "orificePressure", "the orifice die has no points");
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
    rows.push({
      shearRateApparent: rate,
      pressure,
      entrancePressureOrifice: pOrifice,
      wallShearStress: ((pressure - pOrifice) * long.dieDiameter) / (4 * long.dieLength),
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
 * above maxDisagreement at some rate).
 * @returns the relative differences, aligned with the inputs (null where either is missing)
 */
export function compareEntrancePressures(
  shearRateApparent: number[],
  bagley: (number | null)[],
  orifice: (number | null)[],
  maxDisagreement = DEFAULT_ORIFICE_OPTIONS.maxDisagreement,
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
            `The orifice die and the Bagley plot give entrance pressures more than ${Math.round(maxDisagreement * 100)} % apart at ${bad.map(fmt).join(", ")} 1/s: suspect pressure dependence, slip or a mismatched orifice entry.`,
          ),
        ]
      : [];
  return { difference, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
