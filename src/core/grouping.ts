/**
 * Grouping of raw points for the reduction: each point's apparent quantities, then groups of one
 * temperature and one die bore (or one slit size), and the dies within a group. A group is what
 * one Bagley/Rabinowitsch reduction works on; the label names it the same way on every surface.
 */
import { RheoError, type Warning, requireNonNegative, warning } from "./errors";
import { apparentShearRate, apparentWallShearStress } from "./capillary";
import { slitWallShearStress } from "./slit";
import { apparentSlitShearRate } from "./slitFlow";
import { geometricMean } from "./interpolate";
import type { Measurement, PointRow, ReduceOptions } from "./reduceTypes";

/** A point with its apparent quantities and its temperature (K, or null when not given). */
export type GroupedPoint = PointRow & { temperature: number | null };

/** The points of one reduction group, with its temperature and geometry. */
export interface PointGroup {
  /** K (mean of the group's readings), or null when the data carry no temperature */
  temperature: number | null;
  /** the group's temperature readings (K): how many, lowest, highest; absent without temperatures */
  temperatureReadings?: TemperatureReadings;
  points: GroupedPoint[];
  /** slit width and height (m) of a slit group; absent for a round die */
  slit?: { width: number; height: number };
  /** what the grouping noticed about this group (temperature spread, a close set-point) */
  warnings: Warning[];
}

/** The temperature readings of one group, K. */
export interface TemperatureReadings {
  count: number;
  min: number;
  max: number;
  /** max − min, K */
  spread: number;
}

/**
 * Set-points closer than this (K) are unusual in capillary rheometry: two groups this close are
 * flagged as a possibly split set-point (common practice, no source: set-points are usually
 * 10–20 K apart, rarely under 5 K).
 */
export const SETPOINT_MIN_SPACING = 5;

export function checkMeasurement(m: Measurement, index: number): number {
  const row = m.row ?? index + 1;
  const need = (value: number, name: string, allowZero = false) => {
    if (typeof value !== "number" || !Number.isFinite(value)) {
      throw new RheoError("value", name, "must be a finite number", row, undefined, String(value));
    }
    if (allowZero ? value < 0 : value <= 0) {
      throw new RheoError("domain", name, `must be ${allowZero ? "zero or more" : "greater than zero"}`, row, undefined, String(value));
    }
  };
  if (m.slitWidth !== undefined || m.slitHeight !== undefined) {
    if (m.dieDiameter !== undefined) {
      throw new RheoError("value", "dieDiameter", "is given together with a slit width and height; a row is either a round die or a slit", row);
    }
    if (m.slitWidth === undefined) throw new RheoError("missing", "slitWidth", "a slit needs both its width and its height", row);
    if (m.slitHeight === undefined) throw new RheoError("missing", "slitHeight", "a slit needs both its width and its height", row);
    need(m.slitWidth, "slitWidth");
    need(m.slitHeight, "slitHeight");
  } else {
    if (m.dieDiameter === undefined) throw new RheoError("missing", "dieDiameter", "needs a die diameter, or a slit width and height", row);
    need(m.dieDiameter, "dieDiameter");
  }
  need(m.dieLength, "dieLength");
  need(m.flowRate, "flowRate");
  need(m.pressure, "pressure");
  if (m.pressureStd !== undefined) need(m.pressureStd, "pressureStd", true);
  if (m.temperature !== undefined) need(m.temperature, "temperature");
  return row;
}

/**
 * One point's apparent shear rate and wall stress (round: 32Q/(πD³), ΔP·D/(4L); slit: 6Q/(WH²),
 * ΔP·H/(2L)). Validates the measurement first.
 * @throws RheoError naming the field and row of a non-finite or non-positive value
 */
export function apparentPoint(m: Measurement, index: number): GroupedPoint {
  const row = checkMeasurement(m, index);
  if (m.slitWidth !== undefined && m.slitHeight !== undefined) {
    return {
      row,
      dieDiameter: NaN,
      slitWidth: m.slitWidth,
      slitHeight: m.slitHeight,
      dieLength: m.dieLength,
      flowRate: m.flowRate,
      pressure: m.pressure,
      temperature: m.temperature ?? null,
      shearRateApparent: apparentSlitShearRate(m.flowRate, m.slitWidth, m.slitHeight),
      wallShearStressApparent: slitWallShearStress(m.pressure, m.slitHeight, m.dieLength),
      ...(m.pressureStd !== undefined ? { pressureStd: m.pressureStd } : {}),
    };
  }
  const dieDiameter = m.dieDiameter as number;
  return {
    row,
    dieDiameter,
    dieLength: m.dieLength,
    flowRate: m.flowRate,
    pressure: m.pressure,
    temperature: m.temperature ?? null,
    shearRateApparent: apparentShearRate(m.flowRate, dieDiameter),
    wallShearStressApparent: apparentWallShearStress(m.pressure, dieDiameter, m.dieLength),
    ...(m.pressureStd !== undefined ? { pressureStd: m.pressureStd } : {}),
  };
}

/** Groups items whose key lies within `tol` of the group's first key (keys sorted). */
export function cluster<T>(items: T[], key: (t: T) => number, close: (a: number, b: number) => boolean): T[][] {
  const sorted = [...items].sort((a, b) => key(a) - key(b));
  const groups: T[][] = [];
  for (const it of sorted) {
    const g = groups[groups.length - 1];
    if (g && close(key(g[0] as T), key(it))) g.push(it);
    else groups.push([it]);
  }
  return groups;
}

/** A temperature for a message: "190.07 °C". */
function celsius(kelvin: number): string {
  return `${Number((kelvin - 273.15).toFixed(2))} °C`;
}

/** A temperature difference for a message: "1.2 K". */
function kelvins(difference: number): string {
  return `${Number(difference.toFixed(2))} K`;
}

/**
 * Groups temperature readings by set-point: sorted, a new set-point starts where two neighbouring
 * readings differ by more than `tolerance` (K). Jittered readings of one set-point (190.3, 189.8,
 * 190.1 °C) form one group, whatever their number; set-points further apart than the tolerance
 * are separated. A slow drift within a series never splits it silently: the group keeps it and
 * reports its spread (see {@link groupPoints}).
 * @returns the indices of `temperatures` in each group, groups in rising temperature
 * @example groupTemperatures([463.45, 462.95, 483.2, 463.25], 1) // [[1, 3, 0], [2]]
 */
export function groupTemperatures(temperatures: readonly number[], tolerance: number): number[][] {
  const order = temperatures.map((_, i) => i).sort((a, b) => (temperatures[a] as number) - (temperatures[b] as number));
  const groups: number[][] = [];
  let last = -Infinity;
  for (const i of order) {
    const t = temperatures[i] as number;
    const g = groups[groups.length - 1];
    if (g && t - last <= tolerance) g.push(i);
    else groups.push([i]);
    last = t;
  }
  return groups;
}

/** The die a point was measured on, for naming a die's series: "D 1 mm, L 20 mm". */
function dieOf(p: GroupedPoint): string {
  const bore = p.slitWidth !== undefined ? `slit ${millimetres(p.slitWidth)} × ${millimetres(p.slitHeight as number)}` : `D ${millimetres(p.dieDiameter)}`;
  return `${bore}, L ${millimetres(p.dieLength)}`;
}

/** Warnings of one temperature group whose readings spread more than the tolerance. */
function spreadWarnings(points: GroupedPoint[], readings: TemperatureReadings, tolerance: number): Warning[] {
  if (readings.spread <= tolerance) return [];
  const byDie = new Map<string, GroupedPoint[]>();
  for (const p of points) {
    const key = dieOf(p);
    const list = byDie.get(key);
    if (list) list.push(p);
    else byDie.set(key, [p]);
  }
  let widest: { die: string; spread: number; low: GroupedPoint; high: GroupedPoint } | null = null;
  for (const [die, list] of byDie) {
    let low = list[0] as GroupedPoint;
    let high = low;
    for (const p of list) {
      if ((p.temperature as number) < (low.temperature as number)) low = p;
      if ((p.temperature as number) > (high.temperature as number)) high = p;
    }
    const spread = (high.temperature as number) - (low.temperature as number);
    if (!widest || spread > widest.spread) widest = { die, spread, low, high };
  }
  const mean = points.reduce((s, p) => s + (p.temperature as number), 0) / points.length;
  const series = widest && widest.spread > tolerance
    ? ` The die ${widest.die} alone spans ${kelvins(widest.spread)} (row ${widest.low.row} at ${celsius(widest.low.temperature as number)}, row ${widest.high.row} at ${celsius(widest.high.temperature as number)}): the melt temperature drifted during its series.`
    : " Each die's own series stays within the tolerance: the dies were run at slightly different temperatures.";
  return [
    warning(
      "TEMPERATURE_SPREAD",
      `The temperature readings span ${kelvins(readings.spread)} (${celsius(readings.min)} to ${celsius(readings.max)}), more than the tolerance of ${kelvins(tolerance)}; they are kept as one set-point and reported at their mean, ${celsius(mean)}.${series} Check the temperature control, or give a larger tolerance if this spread is expected.`,
    ),
  ];
}

/**
 * Groups points by temperature set-point ({@link groupTemperatures} with `temperatureTolerance`,
 * K) and die bore or slit size (within `diameterTolerance`, relative). Points without a
 * temperature form their own groups. Each group is reported at the mean of its readings, with
 * their count, range and spread (max − min); a spread above the tolerance is a
 * TEMPERATURE_SPREAD warning naming the die whose series drifted, and two set-points closer than
 * {@link SETPOINT_MIN_SPACING} a TEMPERATURE_GROUPS_CLOSE warning, so that no split and no merge
 * is silent.
 * @throws RheoError("domain") for a negative or non-finite tolerance
 */
export function groupPoints(points: GroupedPoint[], opt: Pick<ReduceOptions, "temperatureTolerance" | "diameterTolerance">): PointGroup[] {
  requireNonNegative(opt.temperatureTolerance, "temperatureTolerance");
  requireNonNegative(opt.diameterTolerance, "diameterTolerance");
  const withoutT = points.filter((p) => p.temperature === null);
  const withT = points.filter((p) => p.temperature !== null);
  const tGroups = groupTemperatures(withT.map((p) => p.temperature as number), opt.temperatureTolerance).map((g) => g.map((i) => withT[i] as GroupedPoint));
  const close = (a: number, b: number) => Math.abs(a - b) <= opt.diameterTolerance * a;
  const out: PointGroup[] = [];
  let previous: { mean: number; readings: TemperatureReadings } | null = null;
  const groupsOf = (tg: GroupedPoint[], temperature: number | null, readings: TemperatureReadings | undefined, warnings: Warning[]) => {
    const round = tg.filter((p) => p.slitWidth === undefined);
    const made: PointGroup[] = [];
    for (const dg of cluster(round, (p) => p.dieDiameter, close)) made.push({ temperature, points: dg, warnings: [] });
    for (const wg of cluster(tg.filter((p) => p.slitWidth !== undefined), (p) => p.slitWidth as number, close)) {
      for (const hg of cluster(wg, (p) => p.slitHeight as number, close)) {
        const mean = (f: (p: PointRow) => number) => geometricMean(hg.map(f));
        made.push({ temperature, points: hg, slit: { width: mean((p) => p.slitWidth as number), height: mean((p) => p.slitHeight as number) }, warnings: [] });
      }
    }
    for (const g of made) {
      if (readings) {
        // each bore's own readings (a group of several bores shares the set-point)
        const own = g.points.map((p) => p.temperature as number);
        const min = Math.min(...own);
        const max = Math.max(...own);
        g.temperatureReadings = { count: own.length, min, max, spread: max - min };
        g.warnings.push(...spreadWarnings(g.points, g.temperatureReadings, opt.temperatureTolerance), ...warnings);
      }
      out.push(g);
    }
  };
  for (const tg of tGroups) {
    const temps = tg.map((p) => p.temperature as number);
    let min = temps[0] as number;
    let max = min;
    let sum = 0;
    for (const t of temps) {
      if (t < min) min = t;
      if (t > max) max = t;
      sum += t;
    }
    // exact when every reading is the same value (no rounding of a repeated set-point)
    const temperature = min === max ? min : sum / temps.length;
    const readings: TemperatureReadings = { count: temps.length, min, max, spread: max - min };
    const warnings: Warning[] = [];
    if (previous && temperature - previous.mean < SETPOINT_MIN_SPACING) {
      warnings.push(
        warning(
          "TEMPERATURE_GROUPS_CLOSE",
          `Its temperature readings (${celsius(min)} to ${celsius(max)}) and those at ${celsius(previous.readings.min)} to ${celsius(previous.readings.max)} are ${kelvins(min - previous.readings.max)} apart, more than the tolerance of ${kelvins(opt.temperatureTolerance)}, so they form two groups ${kelvins(temperature - previous.mean)} apart. If they are one set-point, give a temperature tolerance of at least ${kelvins(Math.ceil((min - previous.readings.max) * 10) / 10)}.`,
        ),
      );
    }
    groupsOf(tg, temperature, readings, warnings);
    previous = { mean: temperature, readings };
  }
  if (withoutT.length > 0) groupsOf(withoutT, null, undefined, []);
  return out;
}

/** A length in millimetres with four significant figures: "1.5 mm". */
export function millimetres(x: number): string {
  return `${Number((x * 1e3).toPrecision(4))} mm`;
}

/**
 * The one label of a reduction group on every surface: "190 °C, D 1 mm", "slit 20 mm × 1 mm",
 * "210 °C, slit 20 mm × 1 mm" (no temperature part when the data carry none).
 * @example groupLabel({ temperature: 463.15, geometry: "round", dieDiameter: 0.001 }) // "190 °C, D 1 mm"
 */
export function groupLabel(g: { temperature: number | null; geometry?: "round" | "slit"; dieDiameter: number; slitWidth?: number; slitHeight?: number }): string {
  const t = g.temperature === null ? "" : `${Number((g.temperature - 273.15).toFixed(2))} °C, `;
  if (g.geometry === "slit" || (g.slitWidth !== undefined && g.slitHeight !== undefined)) {
    return `${t}slit ${millimetres(g.slitWidth ?? NaN)} × ${millimetres(g.slitHeight ?? NaN)}`;
  }
  return `${t}D ${millimetres(g.dieDiameter)}`;
}
