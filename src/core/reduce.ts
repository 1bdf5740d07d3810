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
import { RheoError, Warning, scoped } from "./errors";
import { meltFlowPoint } from "./meltFlowRate";
import { applyGroupMethods, fittedTemperatureCoefficients, slipAcrossGroups } from "./reduceMethods";
import { DEFAULT_REDUCE_OPTIONS, Measurement, ReduceOptions, ReductionResult } from "./reduceTypes";
import { apparentPoint, groupLabel, groupPoints } from "./grouping";
import { reduceGroup } from "./reduceGroup";

export * from "./reduceTypes";
export { groupLabel } from "./grouping";

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
  const points = measurements.map(apparentPoint);
  const reduced = groupPoints(points, opt).map((g) => reduceGroup(g.points, g.temperature, opt, g.slit));
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
    const label = groupLabel(group);
    warnings.push(...group.warnings.map((w) => scoped(w, label)));
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
