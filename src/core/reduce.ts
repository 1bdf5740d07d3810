/**
 * The round-capillary reduction pipeline: raw (die, flow rate, pressure) points to the true flow
 * curve, one group per temperature and die diameter.
 *
 *   1. γ̇_a = 32Q/(πD³) and τ_w,app = ΔP·D/(4L) for every point (capillary.ts);
 *   2. Bagley end correction across the die lengths (bagley.ts), or none on request;
 *   3. Rabinowitsch correction of the corrected flow curve (rabinowitsch.ts);
 *   4. η = τ_w/γ̇_w and η_a = τ_w/γ̇_a.
 *
 * Slit dies (slit.ts) are reduced the same way with γ̇_a = 6Q/(WH²), τ = ΔP·H/(2L), Bagley in L/H
 * and the slit Rabinowitsch factor. Dies with L/D (L/H) below orifice.maxLengthOverDiameter are
 * orifice dies (orifice.ts): never on the Bagley line; their entrance pressure is reported beside
 * Bagley's and is subtracted with endCorrection "orifice". The optional methods (slip,
 * representative rate, uncertainty, heating, extensional viscosity, pressure dependence, melt
 * flow rate) are applied by reduceMethods.ts and add fields; the basic fields never change.
 */
import { RheoError, Warning, warning } from "./errors";
import { apparentShearRate, apparentWallShearStress } from "./capillary";
import { BagleyRow, bagleyCorrection } from "./bagley";
import { rabinowitschCorrection } from "./rabinowitsch";
import { slitWallShearStress, slitWarnings } from "./slit";
import { apparentSlitShearRate } from "./slitFlow";
import { DEFAULT_ORIFICE_OPTIONS, OrificeOptions, compareEntrancePressures, orificeCorrection } from "./orifice";
import { geometricMean, interpolateLogLog } from "./interpolate";
import { bagleyStressUncertainty } from "./uncertainty";
import { meltFlowPoint } from "./meltFlowRate";
import {
  CurveSource,
  applyGroupMethods,
  fittedTemperatureCoefficients,
  slipAcrossGroups,
} from "./reduceMethods";
import {
  DEFAULT_REDUCE_OPTIONS,
  EntrancePressureRow,
  FlowCurveRow,
  Measurement,
  PointRow,
  ReduceOptions,
  ReductionGroup,
  ReductionResult,
} from "./reduceTypes";

export * from "./reduceTypes";

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

function groupLabel(temperature: number | null, diameter: number, slit?: { width: number; height: number }): string {
  const t = temperature === null ? "" : `${Number((temperature - 273.15).toFixed(2))} °C, `;
  return slit ? `${t}slit ${mm(slit.width)} × ${mm(slit.height)}` : `${t}D = ${mm(diameter)}`;
}

function reduceGroup(
  points: PointRow[],
  temperature: number | null,
  opt: ReduceOptions,
  slit?: { width: number; height: number },
): { group: ReductionGroup; sources: CurveSource[] } {
  const geometry = slit ? "slit" : "round";
  const dieDiameter = slit ? NaN : geometricMean(points.map((p) => p.dieDiameter));
  const label = groupLabel(temperature, dieDiameter, slit);
  // x of the Bagley plot: L/R for round dies, L/H for slits (ΔP = ΔP_ent + 2τ_w·x in both).
  const xOf = (length: number) => (slit ? length / slit.height : (2 * length) / dieDiameter);
  // τ = ΔP·g with g = D/(4L) (round) or H/(2L) (slit)
  const stressFactor = (length: number) => (slit ? slit.height / (2 * length) : dieDiameter / (4 * length));
  const orificeOpt: OrificeOptions = { ...DEFAULT_ORIFICE_OPTIONS, ...opt.orifice };
  const isOrifice = (length: number) => length / (slit ? slit.height : dieDiameter) < orificeOpt.maxLengthOverDiameter;
  const byLength = cluster(points, (p) => p.dieLength, (a, b) => Math.abs(a - b) <= 1e-6 * a);
  const dies = byLength.map((g) => {
    const dieLength = (g[0] as PointRow).dieLength;
    const die: ReductionGroup["dies"][number] = { dieLength, lengthOverRadius: xOf(dieLength), label: `L=${mm(dieLength)}`, points: g.length };
    if (isOrifice(dieLength)) die.orifice = true;
    return die;
  });
  const longDies = byLength.filter((g) => !isOrifice((g[0] as PointRow).dieLength));
  const orificePoints = points.filter((p) => isOrifice(p.dieLength)).sort((a, b) => a.shearRateApparent - b.shearRateApparent);
  const warnings: Warning[] = slit ? slitWarnings(slit.width, slit.height) : [];
  const ratioName = slit ? "L/H" : "L/D";
  if (longDies.length === 0) {
    throw new RheoError("missing", "dieLength", `${label} has only orifice dies (${ratioName} < ${orificeOpt.maxLengthOverDiameter}); a long die is needed too`);
  }
  if (orificePoints.length > 0 && opt.endCorrection !== "orifice") {
    warnings.push(
      warning("ORIFICE_DIE_NOT_ON_BAGLEY", `The die of ${ratioName} < ${orificeOpt.maxLengthOverDiameter} (L = ${mm((orificePoints[0] as PointRow).dieLength)}) is treated as an orifice die: it is kept off the Bagley line and its entrance pressure is listed beside Bagley's.`),
    );
  }
  if (opt.endCorrection === "orifice" && orificePoints.length === 0) {
    throw new RheoError("missing", "dieLength", `${label} has no orifice die (${ratioName} < ${orificeOpt.maxLengthOverDiameter}); the orifice end correction needs one, or choose bagley or none`);
  }
  const orificeRates = orificePoints.map((p) => p.shearRateApparent);
  const orificePressures = orificePoints.map((p) => p.pressure);
  const orificeAt = (rate: number) => (orificePoints.length > 0 ? (interpolateLogLog(orificeRates, orificePressures, rate) ?? null) : null);
  let bagley: BagleyRow[] = [];
  const wantBagley = opt.endCorrection === "bagley" || (opt.endCorrection === "orifice" && longDies.length >= 2);
  if (wantBagley) {
    if (longDies.length < 2) {
      throw new RheoError(
        "missing",
        "dieLength",
        `${label} has a single die length (${mm(longDies[0]?.[0]?.dieLength ?? 0)}); the Bagley correction needs two or more (or choose no end correction)`,
      );
    }
    const result = bagleyCorrection(
      longDies.flat().map((p) => ({
        die: `L=${mm(p.dieLength)}`,
        lengthOverRadius: xOf(p.dieLength),
        shearRateApparent: p.shearRateApparent,
        pressure: p.pressure,
      })),
      opt.bagley,
    );
    bagley = result.rows;
    warnings.push(...result.warnings);
  }
  let curve: { rate: number; stress: number; source: CurveSource }[];
  const longest = longDies[longDies.length - 1] as PointRow[];
  const longestLength = (longest[0] as PointRow).dieLength;
  if (opt.endCorrection === "bagley") {
    curve = bagley.map((r) => ({
      rate: r.shearRateApparent,
      stress: r.wallShearStress,
      source: {
        pressure: Math.max(...r.points.map((p) => p.pressure)),
        entrancePressure: r.entrancePressure,
        stressUncertainty: (uP: number) => bagleyStressUncertainty(r.points.map((p) => p.lengthOverRadius), uP, r.slopeStandardError),
        bagleyPoints: r.points.map((p) => ({ lengthOverRadius: p.lengthOverRadius, pressure: p.pressure })),
      },
    }));
  } else if (opt.endCorrection === "orifice") {
    // For a slit, a "diameter" of 2H makes D/(4L) equal H/(2L).
    const corrected = orificeCorrection(
      {
        dieDiameter: slit ? 2 * slit.height : dieDiameter,
        dieLength: longestLength,
        shearRateApparent: longest.map((p) => p.shearRateApparent),
        pressure: longest.map((p) => p.pressure),
      },
      { shearRateApparent: orificeRates, pressure: orificePressures },
    );
    warnings.push(...corrected.warnings);
    const g = stressFactor(longestLength);
    curve = corrected.rows
      .map((r) => ({
        rate: r.shearRateApparent,
        stress: r.wallShearStress,
        source: { pressure: r.pressure, entrancePressure: r.entrancePressureOrifice, stressUncertainty: (uP: number) => Math.SQRT2 * uP * g, bagleyPoints: null },
      }))
      .sort((a, b) => a.rate - b.rate);
  } else {
    warnings.push(
      warning("END_CORRECTION_NONE", `No end correction: the wall stress of the longest die (${mm(longestLength)}) includes its entrance loss and is overestimated.`),
    );
    const g = stressFactor(longestLength);
    curve = longest
      .map((p) => ({
        rate: p.shearRateApparent,
        stress: p.wallShearStressApparent,
        source: { pressure: p.pressure, entrancePressure: orificeAt(p.shearRateApparent), stressUncertainty: (uP: number) => uP * g, bagleyPoints: null },
      }))
      .sort((a, b) => a.rate - b.rate);
  }
  let entrancePressures: EntrancePressureRow[] | undefined;
  if (orificePoints.length > 0 && (bagley.length > 0 || opt.endCorrection !== "bagley")) {
    const rates = bagley.length > 0 ? bagley.map((r) => r.shearRateApparent) : curve.map((c) => c.rate);
    const fromBagley = rates.map((rate) => bagley.find((r) => r.shearRateApparent === rate)?.entrancePressure ?? null);
    const fromOrifice = rates.map(orificeAt);
    const cmp = compareEntrancePressures(rates, fromBagley, fromOrifice, orificeOpt.maxDisagreement);
    warnings.push(...cmp.warnings);
    entrancePressures = rates.map((rate, i) => ({
      shearRateApparent: rate,
      entrancePressure: fromBagley[i] ?? null,
      entrancePressureOrifice: fromOrifice[i] ?? null,
      difference: cmp.difference[i] ?? null,
    }));
  }
  const rab = rabinowitschCorrection(
    curve.map((c) => c.rate),
    curve.map((c) => c.stress),
    { ...opt.rabinowitsch, geometry },
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
  const group: ReductionGroup = { temperature, dieDiameter, geometry, dies, points, bagley, flowCurve, warnings };
  if (slit) {
    group.slitWidth = slit.width;
    group.slitHeight = slit.height;
  }
  if (entrancePressures) group.entrancePressures = entrancePressures;
  return { group, sources: curve.map((c) => c.source) };
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
  if (opt.endCorrection !== "bagley" && opt.endCorrection !== "none" && opt.endCorrection !== "orifice") {
    throw new RheoError("value", "endCorrection", `unknown end correction "${String(opt.endCorrection)}"; accepted: bagley, none, orifice`);
  }
  if (measurements.length === 0) throw new RheoError("missing", "measurements", "no data rows");
  const points: (PointRow & { temperature: number | null })[] = measurements.map((m, i) => {
    const row = checkMeasurement(m, i);
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
  });
  const withoutT = points.filter((p) => p.temperature === null);
  const withT = points.filter((p) => p.temperature !== null);
  const tGroups = cluster(withT, (p) => p.temperature as number, (a, b) => Math.abs(a - b) <= opt.temperatureTolerance);
  if (withoutT.length > 0) tGroups.push(withoutT);
  const reduced: { group: ReductionGroup; sources: CurveSource[] }[] = [];
  const close = (a: number, b: number) => Math.abs(a - b) <= opt.diameterTolerance * a;
  for (const tg of tGroups) {
    const temps = tg.map((p) => p.temperature).filter((t): t is number => t !== null);
    const temperature = temps.length === 0 ? null : temps.every((t) => t === temps[0]) ? (temps[0] as number) : temps.reduce((s, t) => s + t, 0) / temps.length;
    const round = tg.filter((p) => p.slitWidth === undefined);
    for (const dg of cluster(round, (p) => p.dieDiameter, close)) {
      reduced.push(reduceGroup(dg, temperature, opt));
    }
    for (const wg of cluster(tg.filter((p) => p.slitWidth !== undefined), (p) => p.slitWidth as number, close)) {
      for (const hg of cluster(wg, (p) => p.slitHeight as number, close)) {
        const mean = (f: (p: PointRow) => number) => geometricMean(hg.map(f));
        reduced.push(reduceGroup(hg, temperature, opt, { width: mean((p) => p.slitWidth as number), height: mean((p) => p.slitHeight as number) }));
      }
    }
  }
  const groups = reduced.map((r) => r.group);
  const fitted = opt.heating && opt.heating.temperatureCoefficient === undefined ? fittedTemperatureCoefficients(groups) : null;
  const warnings: Warning[] = [];
  for (const { group, sources } of reduced) {
    const given = opt.heating?.temperatureCoefficient;
    const b = given !== undefined ? { value: given, source: "given" as const } : group.temperature !== null && fitted?.has(group.temperature) ? { value: fitted.get(group.temperature) as number, source: "fitted" as const } : null;
    const radius = group.geometry === "slit" ? (group.slitHeight as number) / 2 : group.dieDiameter / 2;
    const methods = applyGroupMethods(group, sources, group.geometry, radius, opt, b);
    Object.assign(group, methods.results);
    group.warnings.push(...methods.warnings);
    const slit = group.geometry === "slit" ? { width: group.slitWidth as number, height: group.slitHeight as number } : undefined;
    const label = groupLabel(group.temperature, group.dieDiameter, slit);
    warnings.push(...group.warnings.map((w) => ({ code: w.code, message: `${label}: ${w.message}` })));
  }
  const result: ReductionResult = { groups, warnings };
  if (opt.slip !== false) {
    const slip = slipAcrossGroups(groups, opt.slip === true ? { rabinowitsch: opt.rabinowitsch } : { rabinowitsch: opt.rabinowitsch, ...opt.slip });
    result.slip = slip.rows;
    warnings.push(...slip.warnings);
  }
  if (opt.meltFlowRate) {
    const { load, ...flow } = opt.meltFlowRate;
    result.meltFlowRate = meltFlowPoint(flow, load);
    warnings.push(...result.meltFlowRate.warnings);
  }
  return result;
}
