/**
 * Bagley end correction (Bagley 1957, J. Appl. Phys. 28, 624).
 *
 * At one apparent wall shear rate, dies of one diameter and several lengths give
 * ΔP = 2τ_w (L/R + e): a straight line in L/R whose slope is 2τ_w, whose intercept is the
 * entrance (plus exit) pressure ΔP_ent, and which crosses ΔP = 0 at L/R = −e, e = ΔP_ent/slope.
 * The lines are drawn at one ladder of rates per group (rateLadder.ts: the longest die's rates,
 * extended by the shorter dies' beyond its range); a die not run at a ladder rate has its
 * ln ΔP vs ln γ̇_a interpolated there (Macosko 1994, ch. 6, from memory; Dealy & Wang 2013,
 * from memory), never
 * extrapolated beyond its range. Repeated readings of a die are compared and merged first
 * (speedSteps.ts). The lines are then checked for curvature and for an irregular e against the
 * scatter of the readings (bagleyChecks.ts); R² is reported but no longer judged: a curved line
 * can have R² above 0.99 and still bias τ_w by ten per cent.
 */
import { RheoError, Warning, warning } from "./errors";
import { fitLine } from "./regression";
import { DEFAULT_REPEAT_OPTIONS, RepeatOptions, repeatWarnings, speedSteps } from "./speedSteps";
import { LadderDie, pressureOnLadder, rateLadder } from "./rateLadder";
import { BagleyCheckOptions, bagleyLineChecks } from "./bagleyChecks";

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
  /** coefficient of determination of the line (reported, not judged) */
  r2: number;
  /** slope 2τ_w, Pa */
  slope: number;
  /** standard errors of slope and intercept (0 with two dies), Pa */
  slopeStandardError: number;
  interceptStandardError: number;
  /** number of dies on the line */
  diesUsed: number;
  /**
   * relative change of the local slope dΔP/d(L/R) between the shortest and the longest die
   * (positive: the line bends upwards), from a weighted quadratic; null with fewer than three dies,
   * before the checks ran, or for a line a dense ladder's checks skipped
   */
  curvature: number | null;
  /**
   * the (L/R, ΔP) points the line was fitted to; `interpolated` marks a value brought to this rate,
   * `extrapolated` one continued beyond its die's measured range (by at most the edge tolerance)
   */
  points: { die: string; lengthOverRadius: number; pressure: number; interpolated: boolean; extrapolated?: boolean }[];
}

/** Options of {@link bagleyCorrection}. */
export interface BagleyOptions {
  /** which readings of one die share a speed, and when a repeat has drifted (speedSteps.ts) */
  repeats: Partial<RepeatOptions>;
  /**
   * a die's pressure may be continued beyond its measured range by at most this relative rate: the
   * spread of measured speeds about one set-point and of die bores of one nominal size (common
   * practice, no source); further out a die is left off the line
   */
  edgeTolerance: number;
  /** limits of the curvature and e-scatter checks */
  checks: Partial<BagleyCheckOptions>;
  /** minimum number of dies for a line */
  minDies: number;
}

/** Defaults of {@link BagleyOptions}. */
export const DEFAULT_BAGLEY_OPTIONS: Readonly<BagleyOptions> = Object.freeze({
  repeats: {},
  edgeTolerance: 0.03,
  checks: {},
  minDies: 2,
});

/** Result of {@link bagleyCorrection}. */
export interface BagleyResult {
  rows: BagleyRow[];
  warnings: Warning[];
}

/** One die's steps (ascending rate) for {@link bagleyLines}. */
export interface BagleyDie extends LadderDie {
  die: string;
  lengthOverRadius: number;
}

/** Result of {@link bagleyLines}: the lines, and per line which steps of which die it used. */
export interface BagleyLines extends BagleyResult {
  /** per row, the steps used: die index (into the input) and step indices */
  rowSteps: { die: number; steps: number[] }[][];
  /** ladder rates left without a line: fewer than minDies dies reach them */
  dropped: number[];
  /** ladder rates whose line does not rise with L/R */
  nonRising: number[];
}

interface DieSeries {
  die: string;
  lengthOverRadius: number;
  readings: { rate: number; pressure: number; row: number }[];
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
      s = { die: p.die, lengthOverRadius: p.lengthOverRadius, readings: [] };
      byDie.set(p.die, s);
    } else if (Math.abs(s.lengthOverRadius - p.lengthOverRadius) > 1e-9 * s.lengthOverRadius) {
      throw new RheoError("value", "die", `"${p.die}" appears with two different L/R values`, row);
    }
    s.readings.push({ rate: p.shearRateApparent, pressure: p.pressure, row });
  });
  return [...byDie.values()].sort((a, b) => a.lengthOverRadius - b.lengthOverRadius);
}

/**
 * Bagley end correction over dies of one diameter (and one temperature), from raw points.
 *
 * Each die's readings become speed steps (repeats within the stability threshold averaged, a
 * drifted repeat left out, the first reading kept; speedSteps.ts); then {@link bagleyLines} and
 * bagleyLineChecks (bagleyChecks.ts). reduce() also lists every repeat in its stability table.
 *
 * @throws RheoError("missing") with fewer than two dies or no rate reached by two; ("domain") for
 *   non-positive input.
 * @example bagleyCorrection(points).rows[0].endCorrection
 */
export function bagleyCorrection(points: BagleyPoint[], options: Partial<BagleyOptions> = {}): BagleyResult {
  const opt = resolve(options);
  const series = groupByDie(points);
  const repeatOptions = { ...DEFAULT_REPEAT_OPTIONS, ...opt.repeats };
  const stepped = series.map((s) => ({ die: s.die, readings: s.readings, ladder: speedSteps(s.readings, repeatOptions) }));
  const dies: BagleyDie[] = stepped.map((s, i) => ({
    die: s.die,
    lengthOverRadius: (series[i] as DieSeries).lengthOverRadius,
    rates: s.ladder.steps.map((t) => t.rate),
    pressures: s.ladder.steps.map((t) => t.pressure),
  }));
  const lines = bagleyLines(dies, opt);
  const checked = bagleyLineChecks(lines.rows, dies, opt.checks);
  return { rows: lines.rows, warnings: [...repeatWarnings(stepped, repeatOptions.stabilityThreshold), ...lines.warnings, ...checked] };
}

function resolve(options: Partial<BagleyOptions>): BagleyOptions {
  return { ...DEFAULT_BAGLEY_OPTIONS, ...options };
}

/**
 * The Bagley lines of dies already reduced to speed steps: one line per ladder rate
 * (rateLadder.ts), fitted ΔP = slope·(L/R) + ΔP_ent by least squares (regression.ts), with
 * τ_w = slope/2, ΔP_ent, e = ΔP_ent/slope and R². Ladder rates reached by fewer than `minDies`
 * dies are left out with a warning. The checks are separate (bagleyLineChecks in bagleyChecks.ts)
 * so a caller can drop lines first.
 *
 * Warning codes: BAGLEY_FEW_DIES, BAGLEY_RATES_INTERPOLATED, BAGLEY_LINE_PARTIAL,
 * BAGLEY_RATE_DROPPED, BAGLEY_NONPOSITIVE_SLOPE, BAGLEY_NEGATIVE_END_CORRECTION.
 * @param dies steps in ascending rate per die (any order of dies)
 * @throws RheoError("missing") with fewer than two dies or no line at all
 */
export function bagleyLines(dies: readonly BagleyDie[], options: Partial<BagleyOptions> = {}): BagleyLines {
  const opt = resolve(options);
  const withSteps = dies.map((d, i) => ({ d, i })).filter(({ d }) => d.rates.length > 0);
  if (withSteps.length < 2) {
    throw new RheoError("missing", "dieLength", `the Bagley correction needs dies of at least two lengths at one diameter, got ${withSteps.length}`);
  }
  const warnings: Warning[] = [];
  if (withSteps.length < 3) {
    warnings.push(warning("BAGLEY_FEW_DIES", `Only ${withSteps.length} die lengths: the straightness of the Bagley lines cannot be checked; three or more are recommended.`));
  }
  // Longest die first (ties: more steps), then the others from long to short.
  const byLength = [...withSteps].sort((a, b) => b.d.lengthOverRadius - a.d.lengthOverRadius || b.d.rates.length - a.d.rates.length);
  const ladder = rateLadder(dies, (byLength[0] as { i: number }).i, byLength.slice(1).map((e) => e.i), opt.edgeTolerance);
  const rows: BagleyRow[] = [];
  const rowSteps: { die: number; steps: number[] }[][] = [];
  const dropped: number[] = [];
  const nonRising: number[] = [];
  let interpolated = 0;
  let extrapolated = 0;
  const partial = new Map<string, number>();
  for (const rate of ladder) {
    const linePoints: BagleyRow["points"] = [];
    const used: { die: number; steps: number[] }[] = [];
    for (const { d, i } of withSteps) {
      const at = pressureOnLadder(d, rate, opt.edgeTolerance);
      if (!at) {
        partial.set(d.die, (partial.get(d.die) ?? 0) + 1);
        continue;
      }
      const point: BagleyRow["points"][number] = { die: d.die, lengthOverRadius: d.lengthOverRadius, pressure: at.pressure, interpolated: at.interpolated };
      if (at.extrapolated) point.extrapolated = true;
      linePoints.push(point);
      used.push({ die: i, steps: at.steps });
    }
    if (linePoints.length < Math.max(2, opt.minDies)) {
      dropped.push(rate);
      continue;
    }
    const line = fitLine(
      linePoints.map((p) => p.lengthOverRadius),
      linePoints.map((p) => p.pressure),
    );
    if (!(line.slope > 0)) {
      nonRising.push(rate);
      continue;
    }
    interpolated += linePoints.filter((p) => p.interpolated).length;
    extrapolated += linePoints.filter((p) => p.extrapolated).length;
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
      curvature: null,
      points: linePoints,
    });
    rowSteps.push(used);
  }
  if (rows.length === 0) {
    throw new RheoError("missing", "shearRateApparent", "no apparent rate is covered by two or more dies; check that the dies were run over overlapping rates");
  }
  if (nonRising.length > 0) {
    warnings.push(warning("BAGLEY_NONPOSITIVE_SLOPE", `At ${list(nonRising)} 1/s the pressure does not rise with die length; ${nonRising.length === 1 ? "this rate is" : "these rates are"} left out.`));
  }
  if (dropped.length > 0) {
    warnings.push(warning("BAGLEY_RATE_DROPPED", `${dropped.length} rate(s) reached by fewer than two dies were left out (${list(dropped)} 1/s).`));
  }
  if (interpolated > 0) {
    const beyond = extrapolated > 0 ? `; ${extrapolated} of them lie beyond their die's measured rates by at most ${pct(opt.edgeTolerance)} and were continued from its end interval` : "";
    warnings.push(warning("BAGLEY_RATES_INTERPOLATED", `The dies were not run at identical rates: ${interpolated} pressure(s) were interpolated (log–log) to the rates of the longest die${beyond}.`));
  }
  const partialLines = [...partial.entries()].filter(([, count]) => count > 0 && count < ladder.length);
  if (partialLines.length > 0) {
    warnings.push(
      warning(
        "BAGLEY_LINE_PARTIAL",
        `Some Bagley lines lack a die whose measured rates do not reach them (never extrapolated): ${partialLines.map(([die, count]) => `${die} at ${count} rate(s)`).join(", ")}.`,
      ),
    );
  }
  const negative = rows.filter((r) => r.endCorrection < 0);
  if (negative.length > 0) {
    warnings.push(
      warning("BAGLEY_NEGATIVE_END_CORRECTION", `Negative end correction at ${list(negative.map((r) => r.shearRateApparent))} 1/s: physically the entrance loss is positive; suspect slip, pressure readings or die dimensions.`),
    );
  }
  return { rows, warnings, rowSteps, dropped, nonRising };
}

function list(rates: number[]): string {
  const shown = rates.slice(0, 8).map(fmt).join(", ");
  return rates.length > 8 ? `${shown} and ${rates.length - 8} more` : shown;
}

function pct(x: number, digits = 0): string {
  return `${(x * 100).toFixed(digits)} %`;
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
