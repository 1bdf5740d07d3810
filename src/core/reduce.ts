/**
 * The round-capillary reduction pipeline: raw (die, flow rate, pressure) points to the true flow
 * curve, one group per temperature and die diameter.
 *
 *   1. γ̇_a = 32Q/(πD³) and τ_w,app = ΔP·D/(4L) for every point (capillary.ts);
 *   2. Bagley end correction across the die lengths (bagley.ts), or none on request;
 *   3. Rabinowitsch correction of the corrected flow curve (rabinowitsch.ts);
 *   4. η = τ_w/γ̇_w and η_a = τ_w/γ̇_a.
 */
import { RheoError, Warning, warning } from "./errors";
import { apparentShearRate, apparentWallShearStress } from "./capillary";
import { BagleyOptions, BagleyRow, bagleyCorrection } from "./bagley";
import { RabinowitschOptions, rabinowitschCorrection } from "./rabinowitsch";

/** One raw measurement, SI. */
export interface Measurement {
  /** die bore D, m */
  dieDiameter: number;
  /** die land length L, m */
  dieLength: number;
  /** volumetric flow rate Q, m³/s */
  flowRate: number;
  /** measured pressure drop ΔP (includes entrance and exit losses), Pa */
  pressure: number;
  /** melt temperature, K (optional; points without one form their own group) */
  temperature?: number;
  /** the source row (1-based), carried into error messages */
  row?: number;
}

/** Options of {@link reduce}. */
export interface ReduceOptions {
  /** "bagley": end correction across die lengths (needs ≥ 2 lengths); "none": apparent stress of the longest die */
  endCorrection: "bagley" | "none";
  bagley: Partial<BagleyOptions>;
  rabinowitsch: Partial<RabinowitschOptions>;
  /** temperatures closer than this (K) form one group */
  temperatureTolerance: number;
  /** diameters closer than this relative difference count as one diameter */
  diameterTolerance: number;
}

/** Defaults of {@link ReduceOptions}. */
export const DEFAULT_REDUCE_OPTIONS: Readonly<ReduceOptions> = Object.freeze({
  endCorrection: "bagley",
  bagley: {},
  rabinowitsch: {},
  temperatureTolerance: 0.5,
  diameterTolerance: 0.005,
});

/** A raw point with its apparent quantities. */
export interface PointRow {
  row: number;
  dieDiameter: number;
  dieLength: number;
  flowRate: number;
  pressure: number;
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** τ_w,app = ΔP·D/(4L), Pa */
  wallShearStressApparent: number;
}

/** One point of the corrected flow curve. */
export interface FlowCurveRow {
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** end-corrected τ_w, Pa */
  wallShearStress: number;
  /** d ln τ_w / d ln γ̇_a */
  nPrime: number;
  /** true wall shear rate γ̇_w, 1/s (null where n' ≤ 0) */
  shearRateWall: number | null;
  /** η = τ_w/γ̇_w, Pa·s (null where γ̇_w is) */
  viscosity: number | null;
  /** η_a = τ_w/γ̇_a, Pa·s */
  viscosityApparent: number;
}

/** The reduction of one temperature and die diameter. */
export interface ReductionGroup {
  /** K, or null when the data carry no temperature */
  temperature: number | null;
  /** m */
  dieDiameter: number;
  dies: { dieLength: number; lengthOverRadius: number; label: string; points: number }[];
  points: PointRow[];
  bagley: BagleyRow[];
  flowCurve: FlowCurveRow[];
  warnings: Warning[];
}

/** Result of {@link reduce}. */
export interface ReductionResult {
  groups: ReductionGroup[];
  /** every group's warnings, each prefixed with its group */
  warnings: Warning[];
}

function checkMeasurement(m: Measurement, index: number): number {
  const row = m.row ?? index + 1;
  const need = (value: number, name: string, allowZero = false) => {
    if (typeof value !== "number" || !Number.isFinite(value)) {
      throw new RheoError("value", name, `must be a finite number, got ${String(value)}`, row);
    }
    if (allowZero ? value < 0 : value <= 0) {
      throw new RheoError("domain", name, `must be ${allowZero ? "zero or more" : "greater than zero"}, got ${value}`, row);
    }
  };
  need(m.dieDiameter, "dieDiameter");
  need(m.dieLength, "dieLength");
  need(m.flowRate, "flowRate");
  need(m.pressure, "pressure");
  if (m.temperature !== undefined) need(m.temperature, "temperature");
  return row;
}

/** Groups items whose key lies within `tol` of the group's first key (keys sorted). */
function cluster<T>(items: T[], key: (t: T) => number, close: (a: number, b: number) => boolean): T[][] {
  const sorted = [...items].sort((a, b) => key(a) - key(b));
  const groups: T[][] = [];
  for (const it of sorted) {
    const g = groups[groups.length - 1];
    if (g && close(key(g[0] as T), key(it))) g.push(it);
    else groups.push([it]);
  }
  return groups;
}

function mm(x: number): string {
  return `${Number((x * 1e3).toPrecision(4))} mm`;
}

function groupLabel(temperature: number | null, diameter: number): string {
  const t = temperature === null ? "" : `${Number((temperature - 273.15).toFixed(2))} °C, `;
  return `${t}D = ${mm(diameter)}`;
}

function reduceGroup(points: PointRow[], temperature: number | null, opt: ReduceOptions): ReductionGroup {
  const dieDiameter = Math.exp(points.reduce((s, p) => s + Math.log(p.dieDiameter), 0) / points.length);
  const byLength = cluster(points, (p) => p.dieLength, (a, b) => Math.abs(a - b) <= 1e-6 * a);
  const dies = byLength.map((g) => {
    const dieLength = (g[0] as PointRow).dieLength;
    return { dieLength, lengthOverRadius: (2 * dieLength) / dieDiameter, label: `L=${mm(dieLength)}`, points: g.length };
  });
  const warnings: Warning[] = [];
  let bagley: BagleyRow[] = [];
  let curve: { rate: number; stress: number }[];
  if (opt.endCorrection === "bagley") {
    if (dies.length < 2) {
      throw new RheoError(
        "missing",
        "dieLength",
        `${groupLabel(temperature, dieDiameter)} has a single die length (${mm(dies[0]?.dieLength ?? 0)}); the Bagley correction needs two or more (or choose no end correction)`,
      );
    }
    const result = bagleyCorrection(
      points.map((p) => ({
        die: `L=${mm(p.dieLength)}`,
        lengthOverRadius: (2 * p.dieLength) / dieDiameter,
        shearRateApparent: p.shearRateApparent,
        pressure: p.pressure,
      })),
      opt.bagley,
    );
    bagley = result.rows;
    warnings.push(...result.warnings);
    curve = bagley.map((r) => ({ rate: r.shearRateApparent, stress: r.wallShearStress }));
  } else {
    const longest = byLength[byLength.length - 1] as PointRow[];
    warnings.push(
      warning("END_CORRECTION_NONE", `No end correction: the wall stress of the longest die (${mm((longest[0] as PointRow).dieLength)}) includes its entrance loss and is overestimated.`),
    );
    curve = longest.map((p) => ({ rate: p.shearRateApparent, stress: p.wallShearStressApparent })).sort((a, b) => a.rate - b.rate);
  }
  const rab = rabinowitschCorrection(
    curve.map((c) => c.rate),
    curve.map((c) => c.stress),
    opt.rabinowitsch,
  );
  warnings.push(...rab.warnings);
  const flowCurve: FlowCurveRow[] = curve.map((c, i) => {
    const wall = rab.shearRateWall[i] ?? null;
    return {
      shearRateApparent: c.rate,
      wallShearStress: c.stress,
      nPrime: rab.nPrime[i] as number,
      shearRateWall: wall,
      viscosity: wall === null ? null : c.stress / wall,
      viscosityApparent: c.stress / c.rate,
    };
  });
  return { temperature, dieDiameter, dies, points, bagley, flowCurve, warnings };
}

/**
 * Reduces raw capillary measurements to true flow curves (see the module comment).
 *
 * Points are grouped by temperature (within `temperatureTolerance`) and die diameter (within
 * `diameterTolerance`); each group is reduced on its own.
 *
 * @throws RheoError naming the argument and row for non-finite or non-positive input; ("missing")
 *   when a group has one die length and the Bagley correction is asked for, or no data at all.
 * @example reduce(measurements).groups[0].flowCurve[0].viscosity
 */
export function reduce(measurements: Measurement[], options: Partial<ReduceOptions> = {}): ReductionResult {
  const opt: ReduceOptions = { ...DEFAULT_REDUCE_OPTIONS, ...options };
  if (opt.endCorrection !== "bagley" && opt.endCorrection !== "none") {
    throw new RheoError("value", "endCorrection", `unknown end correction "${String(opt.endCorrection)}"; accepted: bagley, none`);
  }
  if (measurements.length === 0) throw new RheoError("missing", "measurements", "no data rows");
  const points: (PointRow & { temperature: number | null })[] = measurements.map((m, i) => {
    const row = checkMeasurement(m, i);
    return {
      row,
      dieDiameter: m.dieDiameter,
      dieLength: m.dieLength,
      flowRate: m.flowRate,
      pressure: m.pressure,
      temperature: m.temperature ?? null,
      shearRateApparent: apparentShearRate(m.flowRate, m.dieDiameter),
      wallShearStressApparent: apparentWallShearStress(m.pressure, m.dieDiameter, m.dieLength),
    };
  });
  const withoutT = points.filter((p) => p.temperature === null);
  const withT = points.filter((p) => p.temperature !== null);
  const tGroups = cluster(withT, (p) => p.temperature as number, (a, b) => Math.abs(a - b) <= opt.temperatureTolerance);
  if (withoutT.length > 0) tGroups.push(withoutT);
  const groups: ReductionGroup[] = [];
  const warnings: Warning[] = [];
  for (const tg of tGroups) {
    const temps = tg.map((p) => p.temperature).filter((t): t is number => t !== null);
    const temperature = temps.length ? temps.reduce((s, t) => s + t, 0) / temps.length : null;
    for (const dg of cluster(tg, (p) => p.dieDiameter, (a, b) => Math.abs(a - b) <= opt.diameterTolerance * a)) {
      const group = reduceGroup(dg, temperature, opt);
      groups.push(group);
      const label = groupLabel(group.temperature, group.dieDiameter);
      warnings.push(...group.warnings.map((w) => ({ code: w.code, message: `${label}: ${w.message}` })));
    }
  }
  return { groups, warnings };
}
