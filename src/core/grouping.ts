/**
 * Grouping of raw points for the reduction: each point's apparent quantities, then groups of one
 * temperature and one die bore (or one slit size), and the dies within a group. A group is what
 * one Bagley/Rabinowitsch reduction works on; the label names it the same way on every surface.
 */
import { RheoError } from "./errors";
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
  points: GroupedPoint[];
  /** slit width and height (m) of a slit group; absent for a round die */
  slit?: { width: number; height: number };
}

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

/**
 * Groups points by temperature (within `temperatureTolerance`, K) and die bore or slit size
 * (within `diameterTolerance`, relative). Points without a temperature form their own groups.
 */
export function groupPoints(points: GroupedPoint[], opt: Pick<ReduceOptions, "temperatureTolerance" | "diameterTolerance">): PointGroup[] {
  const withoutT = points.filter((p) => p.temperature === null);
  const withT = points.filter((p) => p.temperature !== null);
  const tGroups = cluster(withT, (p) => p.temperature as number, (a, b) => Math.abs(a - b) <= opt.temperatureTolerance);
  if (withoutT.length > 0) tGroups.push(withoutT);
  const close = (a: number, b: number) => Math.abs(a - b) <= opt.diameterTolerance * a;
  const out: PointGroup[] = [];
  for (const tg of tGroups) {
    const temps = tg.map((p) => p.temperature).filter((t): t is number => t !== null);
    const temperature = temps.length === 0 ? null : temps.every((t) => t === temps[0]) ? (temps[0] as number) : temps.reduce((s, t) => s + t, 0) / temps.length;
    const round = tg.filter((p) => p.slitWidth === undefined);
    for (const dg of cluster(round, (p) => p.dieDiameter, close)) out.push({ temperature, points: dg });
    for (const wg of cluster(tg.filter((p) => p.slitWidth !== undefined), (p) => p.slitWidth as number, close)) {
      for (const hg of cluster(wg, (p) => p.slitHeight as number, close)) {
        const mean = (f: (p: PointRow) => number) => geometricMean(hg.map(f));
        out.push({ temperature, points: hg, slit: { width: mean((p) => p.slitWidth as number), height: mean((p) => p.slitHeight as number) } });
      }
    }
  }
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
