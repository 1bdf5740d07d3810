/**
 * Bagley end correction (Bagley 1957, J. Appl. Phys. 28, 624).
 *
 * At one apparent wall shear rate, dies of one diameter and several lengths give
 * ΔP = 2τ_w (L/R + e): a straight line in L/R whose slope is 2τ_w, whose intercept is the
 * entrance (plus exit) pressure ΔP_ent, and which crosses ΔP = 0 at L/R = −e, e = ΔP_ent/slope.
 * When the dies were not run at identical rates, each die's ln ΔP vs ln γ̇_a is interpolated to
 * common rates first (Macosko 1994, ch. 6, from memory; Dealy & Wang 2013, from memory).
 */
import { RheoError, Warning, warning } from "./errors";
import { fitLine } from "./regression";
import { geometricMean, interpolateLogLog } from "./interpolate";

/** One measured point of one die, SI. */
export interface BagleyPoint {
  /** a label unique to the die (e.g. "L=20mm") */
  die: string;
  /** L/R of that die (2L/D), dimensionless, > 0 */
  lengthOverRadius: number;
  /** apparent wall shear rate, 1/s */
  shearRateApparent: number;
  /** measured pressure drop, Pa */
  pressure: number;
}

/** One row of the Bagley table: the straight line at one apparent rate. */
export interface BagleyRow {
  /** apparent wall shear rate the line belongs to, 1/s */
  shearRateApparent: number;
  /** corrected wall shear stress τ_w = slope/2, Pa */
  wallShearStress: number;
  /** ΔP_ent = intercept, Pa */
  entrancePressure: number;
  /** e = intercept/slope, in die radii */
  endCorrection: number;
  /** coefficient of determination of the line */
  r2: number;
  /** slope 2τ_w, Pa */
  slope: number;
  /** standard errors of slope and intercept (0 with two dies), Pa */
  slopeStandardError: number;
  interceptStandardError: number;
  /** number of dies on the line */
  diesUsed: number;
  /** the (L/R, ΔP) points the line was fitted to; `interpolated` marks a value brought to this rate */
  points: { die: string; lengthOverRadius: number; pressure: number; interpolated: boolean }[];
}

/** Options of {@link bagleyCorrection}. */
export interface BagleyOptions {
  /** dies' rates closer than this relative difference count as the same rate */
  rateTolerance: number;
  /** warn when R² of a line is below this (common practice, no source) */
  minR2: number;
  /** warn when the end corrections' relative spread (max−min)/|median| exceeds this (common practice) */
  maxEndCorrectionSpread: number;
  /** minimum number of dies for a line */
  minDies: number;
}

/** Defaults of {@link BagleyOptions}. */
export const DEFAULT_BAGLEY_OPTIONS: Readonly<BagleyOptions> = Object.freeze({
  rateTolerance: 0.02,
  minR2: 0.99,
  maxEndCorrectionSpread: 1.0,
  minDies: 2,
});

/** Result of {@link bagleyCorrection}. */
export interface BagleyResult {
  rows: BagleyRow[];
  warnings: Warning[];
}

interface DieSeries {
  die: string;
  lengthOverRadius: number;
  rates: number[];
  pressures: number[];
}

/** Clusters sorted rates whose neighbours lie within the tolerance; returns the geometric means. */
function commonRates(allRates: number[], tolerance: number): number[] {
  const sorted = [...allRates].sort((a, b) => a - b);
  const clusters: number[][] = [];
  for (const r of sorted) {
    const current = clusters[clusters.length - 1];
    if (current && r <= (current[0] as number) * (1 + tolerance)) current.push(r);
    else clusters.push([r]);
  }
  return clusters.map(geometricMean);
}

function groupByDie(points: BagleyPoint[]): DieSeries[] {
  const byDie = new Map<string, DieSeries>();
  points.forEach((p, i) => {
    const row = i + 1;
    if (!(p.lengthOverRadius > 0) || !Number.isFinite(p.lengthOverRadius)) {
      throw new RheoError("domain", "lengthOverRadius", `must be greater than zero, got ${p.lengthOverRadius}`, row);
    }
    if (!(p.shearRateApparent > 0) || !Number.isFinite(p.shearRateApparent)) {
      throw new RheoError("domain", "shearRateApparent", `must be greater than zero, got ${p.shearRateApparent}`, row);
    }
    if (!(p.pressure > 0) || !Number.isFinite(p.pressure)) {
      throw new RheoError("domain", "pressure", `must be greater than zero, got ${p.pressure}`, row);
    }
    let s = byDie.get(p.die);
    if (!s) {
      s = { die: p.die, lengthOverRadius: p.lengthOverRadius, rates: [], pressures: [] };
      byDie.set(p.die, s);
    } else if (Math.abs(s.lengthOverRadius - p.lengthOverRadius) > 1e-9 * s.lengthOverRadius) {
      throw new RheoError("value", "die", `"${p.die}" appears with two different L/R values`, row);
    }
    s.rates.push(p.shearRateApparent);
    s.pressures.push(p.pressure);
  });
  return [...byDie.values()].sort((a, b) => a.lengthOverRadius - b.lengthOverRadius);
}

/** Pressure of a die at `rate`: the measured value within tolerance, else log–log interpolation. */
function pressureAt(series: DieSeries, rate: number, tolerance: number) {
  let best = -1;
  let bestGap = Infinity;
  series.rates.forEach((r, i) => {
    const gap = Math.abs(r - rate) / rate;
    if (gap < bestGap) {
      bestGap = gap;
      best = i;
    }
  });
  if (best >= 0 && bestGap <= tolerance) return { pressure: series.pressures[best] as number, interpolated: false };
  const p = interpolateLogLog(series.rates, series.pressures, rate);
  return p === undefined ? undefined : { pressure: p, interpolated: true };
}

/**
 * Bagley end correction over dies of one diameter (and one temperature).
 *
 * For each common apparent rate, fits ΔP = slope·(L/R) + ΔP_ent by least squares
 * (regression.ts) and reports τ_w = slope/2, ΔP_ent, e = ΔP_ent/slope and R².
 * Rates where fewer than `minDies` dies have a value (measured, or interpolated inside the die's
 * measured range; never extrapolated) are left out with a warning.
 *
 * Warning codes: BAGLEY_FEW_DIES, BAGLEY_LOW_R2, BAGLEY_NEGATIVE_END_CORRECTION,
 * BAGLEY_END_CORRECTION_SCATTER, BAGLEY_RATES_INTERPOLATED, BAGLEY_RATE_DROPPED,
 * BAGLEY_NONPOSITIVE_SLOPE.
 *
 * @throws RheoError("missing") with fewer than two dies; ("domain") for non-positive input.
 * @example bagleyCorrection(points).rows[0].endCorrection
 */
export function bagleyCorrection(points: BagleyPoint[], options: Partial<BagleyOptions> = {}): BagleyResult {
  const opt: BagleyOptions = { ...DEFAULT_BAGLEY_OPTIONS, ...options };
  const dies = groupByDie(points);
  if (dies.length < 2) {
    throw new RheoError(
      "missing",
      "dieLength",
      `the Bagley correction needs dies of at least two lengths at one diameter, got ${dies.length}`,
    );
  }
  const warnings: Warning[] = [];
  if (dies.length < 3) {
    warnings.push(
      warning("BAGLEY_FEW_DIES", `Only ${dies.length} die lengths: the straightness of the Bagley lines cannot be checked; three or more are recommended.`),
    );
  }
  const rates = commonRates(dies.flatMap((d) => d.rates), opt.rateTolerance);
  const rows: BagleyRow[] = [];
  let interpolatedCount = 0;
  const dropped: number[] = [];
  for (const rate of rates) {
    const linePoints: BagleyRow["points"] = [];
    for (const d of dies) {
      const at = pressureAt(d, rate, opt.rateTolerance);
      if (at) linePoints.push({ die: d.die, lengthOverRadius: d.lengthOverRadius, ...at });
    }
    if (linePoints.length < Math.max(2, opt.minDies)) {
      dropped.push(rate);
      continue;
    }
    interpolatedCount += linePoints.filter((p) => p.interpolated).length;
    const line = fitLine(
      linePoints.map((p) => p.lengthOverRadius),
      linePoints.map((p) => p.pressure),
    );
    if (!(line.slope > 0)) {
      warnings.push(
        warning("BAGLEY_NONPOSITIVE_SLOPE", `At ${fmt(rate)} 1/s the pressure does not rise with die length (slope ${fmt(line.slope)} Pa); this rate is left out.`),
      );
      continue;
    }
    rows.push({
      shearRateApparent: rate,
      wallShearStress: line.slope / 2,
      entrancePressure: line.intercept,
      endCorrection: line.intercept / line.slope,
      r2: line.r2,
      slope: line.slope,
      slopeStandardError: line.slopeStandardError,
      interceptStandardError: line.interceptStandardError,
      diesUsed: linePoints.length,
      points: linePoints,
    });
  }
  if (rows.length === 0) {
    throw new RheoError("missing", "shearRateApparent", "no apparent rate is covered by two or more dies; check that the dies were run over overlapping rates");
  }
  if (dropped.length > 0) {
    warnings.push(
      warning("BAGLEY_RATE_DROPPED", `${dropped.length} rate(s) reached by fewer than two dies were left out (${dropped.map(fmt).join(", ")} 1/s).`),
    );
  }
  if (interpolatedCount > 0) {
    warnings.push(
      warning("BAGLEY_RATES_INTERPOLATED", `The dies were not run at identical rates: ${interpolatedCount} pressure(s) were interpolated (log–log) to common rates.`),
    );
  }
  const lowR2 = rows.filter((r) => r.diesUsed >= 3 && r.r2 < opt.minR2);
  if (lowR2.length > 0) {
    warnings.push(
      warning("BAGLEY_LOW_R2", `Bagley lines are not straight (R² < ${opt.minR2}) at ${lowR2.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: check the data, or pressure dependence of viscosity.`),
    );
  }
  const negative = rows.filter((r) => r.endCorrection < 0);
  if (negative.length > 0) {
    warnings.push(
      warning("BAGLEY_NEGATIVE_END_CORRECTION", `Negative end correction at ${negative.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: physically the entrance loss is positive; suspect slip, pressure readings or die dimensions.`),
    );
  }
  const spread = endCorrectionSpread(rows.map((r) => r.endCorrection));
  if (rows.length >= 3 && spread > opt.maxEndCorrectionSpread) {
    warnings.push(
      warning("BAGLEY_END_CORRECTION_SCATTER", `The end correction e scatters widely between rates (spread ${(spread * 100).toFixed(0)} % of its median): the lines' zero crossings disagree.`),
    );
  }
  return { rows, warnings };
}

/** (max − min)/|median| of the end corrections; Infinity when the median is 0. */
export function endCorrectionSpread(values: number[]): number {
  if (values.length === 0) return 0;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  const median = sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
  const range = (sorted[sorted.length - 1] as number) - (sorted[0] as number);
  return median === 0 ? (range === 0 ? 0 : Infinity) : range / Math.abs(median);
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
