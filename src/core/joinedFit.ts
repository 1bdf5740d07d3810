/**
 * A rotational curve joined to the capillary flow curve of a reduction at the same temperature,
 * and the one fitter (flowCurveFits.ts) run on the joined curve: the fit that pins down η0 when the
 * capillary rates alone never reach the zero-shear plateau.
 *
 * Which capillary points: the true flow curves (Rabinowitsch-corrected) of every group at the
 * rotational curve's temperature (within JoinOptions.temperatureTolerance). Without a temperature
 * in the rotational data, the capillary data must hold one temperature (or none).
 */
import { RheoError, scoped, type Warning } from "./errors";
import { fitCurve, trueFlowCurve, type CurveFitRequest, type CurveFits } from "./flowCurveFits";
import { DEFAULT_JOIN_OPTIONS, joinRotational, type JoinedCurve, type JoinOptions, type RotationalCurve } from "./rotationalJoin";
import type { ReductionGroup, ReductionResult } from "./reduceTypes";
import { groupLabel } from "./grouping";

/** The joined curve of one temperature and its fits. */
export interface JoinedFit {
  /** K, or null when neither data set gives one */
  temperature: number | null;
  /** labels of the capillary groups joined */
  groups: string[];
  join: JoinedCurve;
  fits: CurveFits;
  /** the join's warnings and the fits' (scoped "rotational + capillary, T") */
  warnings: Warning[];
}

const celsius = (k: number) => `${Number((k - 273.15).toPrecision(4))} °C`;

/** The capillary groups the rotational curve belongs with (see the module comment). */
export function groupsForRotational(result: ReductionResult, temperature: number | undefined, tolerance = DEFAULT_JOIN_OPTIONS.temperatureTolerance): ReductionGroup[] {
  const withT = result.groups.filter((g) => g.temperature !== null);
  const temps = [...new Set(withT.map((g) => g.temperature as number))].sort((a, b) => a - b);
  if (temperature === undefined) {
    if (temps.length > 1) {
      throw new RheoError("missing", "rotational", `the capillary data hold ${temps.length} temperatures (${temps.map(celsius).join(", ")}); add a "temperature [C]" column to the rotational data to say which one it belongs with`);
    }
    return result.groups;
  }
  if (temps.length === 0) return result.groups;
  const match = withT.filter((g) => Math.abs((g.temperature as number) - temperature) <= tolerance);
  if (match.length === 0) {
    throw new RheoError("value", "rotational", `its temperature ${celsius(temperature)} matches no capillary temperature (${temps.map(celsius).join(", ")}) within ${tolerance} K`);
  }
  return match;
}

/**
 * Joins `rotational` to the capillary curve of its temperature and fits the joined curve.
 * @throws RheoError("missing"/"value", "rotational") when no capillary temperature matches, the
 *   errors of joinRotational for bad data, and those of fitCurve for a bad request.
 * @example fitJoinedCurve(reduce(measurements), rotational).fits.verdict.recommended
 */
export function fitJoinedCurve(result: ReductionResult, rotational: RotationalCurve, request: Partial<CurveFitRequest> = {}, options: Partial<JoinOptions> = {}): JoinedFit {
  const tolerance = options.temperatureTolerance ?? DEFAULT_JOIN_OPTIONS.temperatureTolerance;
  const groups = groupsForRotational(result, rotational.temperature, tolerance);
  const capillary = { shearRate: [] as number[], viscosity: [] as number[] };
  for (const g of groups) {
    const c = trueFlowCurve(g);
    capillary.shearRate.push(...c.shearRate);
    capillary.viscosity.push(...c.viscosity);
  }
  if (capillary.shearRate.length === 0) throw new RheoError("missing", "rotational", "the capillary groups at its temperature have no corrected points to join");
  const join = joinRotational(capillary, rotational, options);
  const fits = fitCurve({ shearRate: join.shearRate, viscosity: join.viscosity }, request);
  const temperature = rotational.temperature ?? (groups[0]?.temperature ?? null);
  const scope = `rotational + capillary${temperature === null ? "" : `, ${celsius(temperature)}`}`;
  return { temperature, groups: groups.map(groupLabel), join, fits, warnings: [...join.warnings, ...fits.warnings].map((w) => scoped(w, scope)) };
}
