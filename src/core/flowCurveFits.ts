/**
 * Model fits to the reduced flow curves: for each group of a reduction, the true viscosity
 * η(γ̇_w) of the Rabinowitsch-corrected points is fitted with several generalized-Newtonian models
 * (fit/compareModels.ts) and the fits are ranked by AIC (Akaike 1974).
 */
import { RheoError } from "./errors";
import { compareModels, type FailedFit, type RankedFit } from "./fit";
import type { ReductionGroup, ReductionResult } from "./reduce";

/** The models fitted by default: shear-thinning melts (power law to Carreau–Yasuda) and a yield-stress paste. */
export const DEFAULT_FLOW_CURVE_MODELS: readonly string[] = Object.freeze(["power-law", "cross", "carreau", "carreau-yasuda", "herschel-bulkley"]);

/** The fits of one group. */
export interface GroupFits {
  /** K, or null */
  temperature: number | null;
  /** m */
  dieDiameter: number;
  /** points used (those with a true wall rate) */
  pointCount: number;
  /** converged fits, best (lowest AIC) first */
  ranked: RankedFit[];
  /** models that could not be fitted, with the reason */
  failed: FailedFit[];
}

function fitGroup(g: ReductionGroup, models: readonly string[]): GroupFits {
  const points = g.flowCurve.filter((p) => p.shearRateWall !== null && p.viscosity !== null);
  const base = { temperature: g.temperature, dieDiameter: g.dieDiameter, pointCount: points.length };
  try {
    const { ranked, failed } = compareModels(models, {
      shearRate: points.map((p) => p.shearRateWall as number),
      viscosity: points.map((p) => p.viscosity as number),
    });
    return { ...base, ranked, failed };
  } catch (e) {
    if (!(e instanceof RheoError)) throw e;
    return { ...base, ranked: [], failed: models.map((model) => ({ model, reason: e.message })) };
  }
}

/**
 * Fits `models` (ids of the model registry) to the true viscosity curve of every group.
 * A group whose data no model accepts gets every model under `failed` with the reason.
 * @throws RheoError("value") for an unknown model id.
 * @example fitFlowCurves(reduce(measurements))[0].ranked[0].model // e.g. "carreau-yasuda"
 */
export function fitFlowCurves(result: ReductionResult, models: readonly string[] = DEFAULT_FLOW_CURVE_MODELS): GroupFits[] {
  return result.groups.map((g) => fitGroup(g, models));
}
