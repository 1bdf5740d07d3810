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
import { RheoError, Warning, scoped, warning } from "./errors";
import { meltFlowPoint } from "./meltFlowRate";
import { applyGroupMethods, fittedTemperatureCoefficients, slipAcrossGroups } from "./reduceMethods";
import { DEFAULT_REDUCE_OPTIONS, Measurement, ReduceOptions, ReductionResult } from "./reduceTypes";
import { apparentPoint, groupLabel, groupPoints } from "./grouping";
import { reduceGroup } from "./reduceGroup";
import { checkPlausible, optionFindings, plausibilityText } from "./plausibility";
import { addRowAccounts } from "./rowAccount";

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
  const reduced = groupPoints(points, opt).map((g) => {
    const r = reduceGroup(g.points, g.temperature, opt, g.slit);
    if (g.temperatureReadings) {
      const { count, min, max, spread } = g.temperatureReadings;
      r.group.temperatureSpread = spread;
      r.group.temperatureReadings = { count, min, max };
    }
    r.group.warnings.unshift(...g.warnings);
    return r;
  });
  const groups = reduced.map((r) => r.group);
  // b for the heating estimate and the uncertainty budget's temperature term, fitted when not given
  const fitted = (opt.heating || opt.transducer) && opt.heating?.temperatureCoefficient === undefined ? fittedTemperatureCoefficients(groups) : null;
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
  warnings.push(...plausibilityWarnings(opt, groups));
  const result: ReductionResult = { groups, rows: addRowAccounts(groups.map((g) => g.rows)), warnings };
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

/**
 * IMPLAUSIBLE_VALUE warnings for settings outside their usual range (heating inputs, transducer
 * full scale, melt-flow density) and for a group whose viscosities fall outside the usual range
 * (a unit slip in the input somewhere): see plausibility.ts.
 */
function plausibilityWarnings(opt: ReduceOptions, groups: ReductionResult["groups"]): Warning[] {
  const findings = optionFindings({
    density: opt.heating?.density,
    heatCapacity: opt.heating?.heatCapacity,
    thermalConductivity: opt.heating?.conductivity,
    temperatureCoefficient: opt.heating?.temperatureCoefficient,
    transducerFullScale: opt.transducer?.fullScale,
  }).map((text) => warning("IMPLAUSIBLE_VALUE", `Setting ${text}.`, "input"));
  for (const g of groups) {
    const etas = g.flowCurve.map((f) => f.viscosityApparent).filter((v) => Number.isFinite(v) && v > 0);
    if (etas.length === 0) continue;
    const finding = checkPlausible("viscosity", Math.min(...etas), Math.max(...etas), "Pa.s");
    if (finding) {
      findings.push(scoped(warning("IMPLAUSIBLE_VALUE", `apparent viscosity ${plausibilityText("viscosity", finding, "Pa.s")}: look for a unit slip in the input columns (die size, length, speed, pressure).`), groupLabel(g)));
    }
  }
  return findings;
}
