/**
 * Mooney wall-slip analysis (Mooney 1931, J. Rheol. 2, 210; Macosko 1994, ch. 6, from memory; Dealy & Wang
 * 2013, from memory).
 *
 * A liquid that slips at the wall with velocity v_s(τ_w) adds a plug flow πR²v_s to the flow
 * rate, so at one wall stress
 *
 *   γ̇_a = 4Q/(πR³) = γ̇_a,noslip(τ_w) + 4 v_s(τ_w)/R = γ̇_a,noslip + 8 v_s/D.
 *
 * Each die diameter's (end-corrected) flow curve is interpolated log–log to common wall stresses
 * inside the range all diameters cover; at each stress γ̇_a is fitted as a straight line in 1/R:
 * the slope is 4v_s and the intercept the slip-corrected apparent rate, which then goes through
 * the Rabinowitsch correction like any apparent rate. A negative slope is not slip (the melt cannot
 * flow backwards at the wall): that stress is flagged and left uncorrected, its corrected rate the
 * mean of the diameters' rates (the line with v_s = 0). With three or more diameters a line whose
 * R² is below minR2 is flagged (the rates do not follow 1/R: scatter, or a slip or end effect that
 * differs between dies; threshold common practice, no source, as for Bagley lines).
 */
import { RheoError, Warning, warning } from "./errors";
import { fitLine } from "./regression";
import { interpolateLogLog } from "./interpolate";
import { RabinowitschOptions, rabinowitschCorrection } from "./rabinowitsch";

/** One die diameter's flow curve (end-corrected), SI. */
export interface SlipCurve {
  /** D, m */
  dieDiameter: number;
  /** γ̇_a per point, 1/s */
  shearRateApparent: number[];
  /** τ_w per point, Pa */
  wallShearStress: number[];
}

/** Options of {@link mooneySlip}. */
export interface SlipOptions {
  /** number of common stresses, log-spaced over the range every diameter covers */
  stresses: number;
  /** diameters closer than this relative difference are one diameter */
  diameterTolerance: number;
  /** warn when a Mooney line of three or more diameters has R² below this (common practice, no source) */
  minR2: number;
  rabinowitsch: Partial<RabinowitschOptions>;
}

/** Defaults of {@link SlipOptions}. */
export const DEFAULT_SLIP_OPTIONS: Readonly<SlipOptions> = Object.freeze({
  stresses: 8,
  diameterTolerance: 0.005,
  minR2: 0.99,
  rabinowitsch: {},
});

/** The Mooney line at one wall stress. */
export interface SlipRow {
  /** τ_w, Pa */
  wallShearStress: number;
  /** v_s = slope/4 as fitted, m/s (negative: no slip detectable, and not used) */
  slipVelocity: number;
  /** false where the fitted slip velocity is negative and the stress was left uncorrected */
  slipApplied: boolean;
  /** standard error of v_s, m/s (0 with two diameters) */
  slipVelocityStandardError: number;
  /** slip-corrected apparent rate (the intercept; the diameters' mean rate where slipApplied is false), 1/s */
  shearRateApparentCorrected: number;
  /** R² of the line γ̇_a vs 1/R (1 with two diameters) */
  r2: number;
  /** γ̇_a of each diameter at this stress (interpolated), aligned with `diameters` */
  shearRateApparentByDiameter: number[];
  /** n' of the slip-corrected curve, and the true wall rate and viscosity after Rabinowitsch */
  nPrime: number | null;
  shearRateWall: number | null;
  viscosity: number | null;
}

/** Result of {@link mooneySlip}. */
export interface SlipResult {
  /** the diameters used, m, ascending */
  diameters: number[];
  rows: SlipRow[];
  warnings: Warning[];
}

/**
 * Slip velocity of one Mooney line from the apparent rates of several diameters at one stress:
 * least squares of γ̇_a = γ̇_a,corrected + 4 v_s / R.
 * @param dieDiameter D per point, m (at least two different)
 * @param shearRateApparent γ̇_a per point at the same wall stress, 1/s
 * @returns v_s (m/s), the corrected rate (1/s), their standard errors and R²
 * @example mooneyLine([1e-3, 2e-3], [180, 140]) // v_s = 0.005 m/s, corrected rate 100 1/s
 */
export function mooneyLine(dieDiameter: number[], shearRateApparent: number[]) {
  if (dieDiameter.length !== shearRateApparent.length) {
    throw new RheoError("value", "shearRateApparent", `has ${shearRateApparent.length} values but dieDiameter has ${dieDiameter.length}`);
  }
  dieDiameter.forEach((d, i) => {
    if (!(d > 0) || !Number.isFinite(d)) throw new RheoError("domain", "dieDiameter", `must be greater than zero, got ${d}`, i + 1);
  });
  shearRateApparent.forEach((r, i) => {
    if (!(r > 0) || !Number.isFinite(r)) throw new RheoError("domain", "shearRateApparent", `must be greater than zero, got ${r}`, i + 1);
  });
  const inverseRadius = dieDiameter.map((d) => 2 / d);
  const distinct = new Set(dieDiameter.map((d) => d.toPrecision(6))).size;
  if (distinct < 2) throw new RheoError("missing", "dieDiameter", `the Mooney analysis needs at least two different die diameters, got ${distinct}`);
  const line = fitLine(inverseRadius, shearRateApparent);
  return {
    slipVelocity: line.slope / 4,
    slipVelocityStandardError: line.slopeStandardError / 4,
    shearRateApparentCorrected: line.intercept,
    shearRateApparentCorrectedStandardError: line.interceptStandardError,
    r2: line.r2,
  };
}

function checkCurve(c: SlipCurve, i: number): void {
  const name = `curves[${i}]`;
  if (!(c.dieDiameter > 0) || !Number.isFinite(c.dieDiameter)) throw new RheoError("domain", `${name}.dieDiameter`, `must be greater than zero, got ${c.dieDiameter}`);
  if (c.shearRateApparent.length !== c.wallShearStress.length) {
    throw new RheoError("value", `${name}.wallShearStress`, `has ${c.wallShearStress.length} values but shearRateApparent has ${c.shearRateApparent.length}`);
  }
  if (c.shearRateApparent.length < 2) throw new RheoError("missing", `${name}.shearRateApparent`, `needs at least 2 points, got ${c.shearRateApparent.length}`);
  c.shearRateApparent.forEach((v, r) => {
    if (!(v > 0) || !Number.isFinite(v)) throw new RheoError("domain", `${name}.shearRateApparent`, `must be greater than zero, got ${v}`, r + 1);
  });
  c.wallShearStress.forEach((v, r) => {
    if (!(v > 0) || !Number.isFinite(v)) throw new RheoError("domain", `${name}.wallShearStress`, `must be greater than zero, got ${v}`, r + 1);
  });
}

/**
 * Mooney slip analysis over the flow curves of two or more die diameters (module comment).
 *
 * Warning codes: SLIP_FEW_DIAMETERS (two diameters: the straightness of the Mooney lines cannot
 * be checked), SLIP_NEGATIVE_VELOCITY (a negative slope: no slip detectable within the scatter;
 * those stresses are left uncorrected), SLIP_LOW_R2 (a line of three or more diameters with
 * R² below minR2),
 * SLIP_CORRECTED_RATE_NONPOSITIVE (the intercept is not positive: those stresses are left out),
 * SLIP_STRESS_OVERLAP_NARROW (the diameters' stress ranges overlap over less than a factor 1.5),
 * plus the Rabinowitsch warnings of the corrected curve.
 *
 * @throws RheoError("missing") with fewer than two diameters or no common stress range.
 * @example mooneySlip([{dieDiameter: 1e-3, ...}, {dieDiameter: 2e-3, ...}]).rows[0].slipVelocity
 */
export function mooneySlip(curves: SlipCurve[], options: Partial<SlipOptions> = {}): SlipResult {
  const opt: SlipOptions = { ...DEFAULT_SLIP_OPTIONS, ...options };
  if (!(opt.minR2 >= 0 && opt.minR2 <= 1)) throw new RheoError("domain", "minR2", `must be between 0 and 1, got ${opt.minR2}`);
  if (!Number.isInteger(opt.stresses) || opt.stresses < 2) {
    throw new RheoError("value", "stresses", `must be a whole number of at least 2, got ${opt.stresses}`);
  }
  curves.forEach(checkCurve);
  const sorted = [...curves].sort((a, b) => a.dieDiameter - b.dieDiameter);
  const merged: SlipCurve[] = [];
  for (const c of sorted) {
    const last = merged[merged.length - 1];
    if (last && Math.abs(c.dieDiameter - last.dieDiameter) <= opt.diameterTolerance * last.dieDiameter) {
      throw new RheoError("value", "dieDiameter", `two flow curves have the same diameter ${c.dieDiameter} m; give one curve per diameter`);
    }
    merged.push(c);
  }
  if (merged.length < 2) {
    throw new RheoError("missing", "dieDiameter", `the Mooney slip analysis needs flow curves of at least two die diameters, got ${merged.length}`);
  }
  const lo = Math.max(...merged.map((c) => Math.min(...c.wallShearStress)));
  const hi = Math.min(...merged.map((c) => Math.max(...c.wallShearStress)));
  if (!(hi > lo)) {
    throw new RheoError("missing", "wallShearStress", "the die diameters' wall-stress ranges do not overlap; slip is compared at equal stress");
  }
  const warnings: Warning[] = [];
  if (merged.length < 3) {
    warnings.push(warning("SLIP_FEW_DIAMETERS", "Only two die diameters: the Mooney lines cannot be checked for straightness; three or more are recommended."));
  }
  if (hi / lo < 1.5) {
    warnings.push(warning("SLIP_STRESS_OVERLAP_NARROW", `The diameters share only a narrow wall-stress range (${fmt(lo)}–${fmt(hi)} Pa): slip is found over that range alone.`));
  }
  const diameters = merged.map((c) => c.dieDiameter);
  const stresses = Array.from({ length: opt.stresses }, (_, k) => lo * Math.pow(hi / lo, k / (opt.stresses - 1)));
  const lines: Omit<SlipRow, "nPrime" | "shearRateWall" | "viscosity">[] = [];
  const negative: number[] = [];
  const nonPositive: number[] = [];
  for (const tau of stresses) {
    const rates = merged.map((c) => interpolateLogLog(c.wallShearStress, c.shearRateApparent, tau) as number);
    const line = mooneyLine(diameters, rates);
    const applied = line.slipVelocity >= 0;
    if (!applied) negative.push(tau);
    const corrected = applied ? line.shearRateApparentCorrected : rates.reduce((s, r) => s + r, 0) / rates.length;
    if (!(corrected > 0)) {
      nonPositive.push(tau);
      continue;
    }
    lines.push({
      wallShearStress: tau,
      slipVelocity: line.slipVelocity,
      slipApplied: applied,
      slipVelocityStandardError: line.slipVelocityStandardError,
      shearRateApparentCorrected: corrected,
      r2: line.r2,
      shearRateApparentByDiameter: rates,
    });
  }
  if (negative.length > 0) {
    warnings.push(
      warning("SLIP_NEGATIVE_VELOCITY", `The slip velocity comes out negative at ${negative.map(fmt).join(", ")} Pa: the smaller dies do not give higher apparent rates, so no slip is detectable there (scatter or end-correction error); those stresses are left uncorrected (v_s = 0).`),
    );
  }
  const crooked = merged.length >= 3 ? lines.filter((l) => l.slipApplied && l.r2 < opt.minR2) : [];
  if (crooked.length > 0) {
    warnings.push(
      warning(
        "SLIP_LOW_R2",
        `The Mooney lines are not straight in 1/R at ${crooked.map((l) => fmt(l.wallShearStress)).join(", ")} Pa (R² down to ${Math.min(...crooked.map((l) => l.r2)).toFixed(3)}, below ${opt.minR2}): the slip velocity there is uncertain; look for scatter, a die whose entrance or surface differs, or slip that is not a wall property.`,
      ),
    );
  }
  if (nonPositive.length > 0) {
    warnings.push(
      warning("SLIP_CORRECTED_RATE_NONPOSITIVE", `At ${nonPositive.map(fmt).join(", ")} Pa the slip-corrected rate is zero or negative (the flow would be all slip); those stresses are left out.`),
    );
  }
  let nPrime: (number | null)[] = lines.map(() => null);
  let wall: (number | null)[] = lines.map(() => null);
  if (lines.length >= 2) {
    const rab = rabinowitschCorrection(
      lines.map((l) => l.shearRateApparentCorrected),
      lines.map((l) => l.wallShearStress),
      opt.rabinowitsch,
    );
    nPrime = rab.nPrime;
    wall = rab.shearRateWall;
    warnings.push(...rab.warnings);
  }
  const rows: SlipRow[] = lines.map((l, i) => {
    const w = wall[i] ?? null;
    return { ...l, nPrime: nPrime[i] ?? null, shearRateWall: w, viscosity: w === null ? null : l.wallShearStress / w };
  });
  return { diameters, rows, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
