/**
 * The one fitter of flow curves: the models to try (one default list, filtered by material class),
 * the material's held parameters, the AIC ranking (fit/compareModels.ts) and the one verdict
 * (fit/verdict.ts) — for a single curve ({@link fitCurve}) and for every group of a reduction
 * ({@link fitFlowCurves}: the true viscosity η(γ̇_w) of the Rabinowitsch-corrected points).
 * The CLI, the task pane, the results workbook and RHEO.COMPAREFITS all fit through here.
 *
 * Material class (a setting): "melt" (default) or "paste" (pastes, suspensions, gels).
 *   - Yield-stress models (Bingham, Herschel–Bulkley, Casson) are in the default list of a paste
 *     only; a melt gets one only when the user names it.
 *   - A melt's infinite-shear viscosity η∞ is held at 0 in the plateau models (Cross, Carreau,
 *     Carreau–Yasuda): a polymer melt's second Newtonian plateau lies far beyond capillary rates
 *     (common practice, no source; Dealy & Wang 2013, ch. 2, from memory). A paste fits it.
 */
import { RheoError, scoped, warning, type Warning } from "./errors";
import { compareModels, type FailedFit, type RankedFit } from "./fit/compareModels";
import { DEFAULT_VERDICT_OPTIONS, decideVerdict, type Verdict, type VerdictOptions } from "./fit/verdict";
import { DEFAULT_FIT_OPTIONS, type FitOptions, type ResidualSpace } from "./fit/options";
import type { FitData } from "./fit/validate";
import { getModel, MODEL_REGISTRY, type ModelId } from "./models";
import { FAMILY_NAMES, MODEL_FAMILY } from "./models/families";
import { groupLabel } from "./grouping";
import type { ReductionGroup, ReductionResult } from "./reduceTypes";

/** What kind of material the curve belongs to (see the module comment). */
export type MaterialClass = "melt" | "paste";

/** The accepted material classes, in the order surfaces list them. */
export const MATERIAL_CLASSES: readonly MaterialClass[] = Object.freeze(["melt", "paste"]);

/**
 * The one default model list. A melt fits the models without a yield stress; a paste all of them
 * ({@link defaultModels}).
 */
export const DEFAULT_FLOW_CURVE_MODELS: readonly ModelId[] = Object.freeze([
  "newtonian",
  "power-law",
  "cross",
  "carreau",
  "carreau-yasuda",
  "bingham",
  "herschel-bulkley",
  "casson",
] as ModelId[]);

/** What to fit to a curve; every field optional, defaults in {@link DEFAULT_CURVE_FIT_REQUEST}. */
export interface CurveFitRequest {
  /** Model ids the user asked for; empty or absent: the default list of the material. */
  models: readonly string[];
  material: MaterialClass;
  residualSpace: ResidualSpace;
  /** Largest relative standard error of a determined parameter (determination.ts). */
  maxRelativeStandardError: number;
  /** Largest ΔAIC of an adequate model (verdict.ts). */
  maxDeltaAic: VerdictOptions["maxDeltaAic"];
}

/** Defaults of a curve fit; docs and tests import this constant. */
export const DEFAULT_CURVE_FIT_REQUEST: Readonly<CurveFitRequest> = Object.freeze({
  models: [],
  material: "melt",
  residualSpace: DEFAULT_FIT_OPTIONS.residualSpace,
  maxRelativeStandardError: DEFAULT_FIT_OPTIONS.maxRelativeStandardError,
  maxDeltaAic: DEFAULT_VERDICT_OPTIONS.maxDeltaAic,
});

/**
 * The default models of a material class: the default list without yield-stress models for a melt.
 * @example defaultModels("melt") // ["newtonian", "power-law", "cross", "carreau", "carreau-yasuda"]
 */
export function defaultModels(material: MaterialClass): ModelId[] {
  return DEFAULT_FLOW_CURVE_MODELS.filter((id) => material === "paste" || !MODEL_REGISTRY[id].hasYieldStress);
}

/**
 * Parameters a material holds in a model: η∞ = 0 in the plateau models for a melt.
 * @example materialFixed("melt", "cross") // { etaInf: 0 }
 */
export function materialFixed(material: MaterialClass, model: ModelId): Record<string, number> {
  const names = getModel(model).parameters.map((p) => p.name);
  return material === "melt" && names.includes("eta0") && names.includes("etaInf") ? { etaInf: 0 } : {};
}

/** A request with its defaults filled in and its model ids read. */
export type ResolvedCurveFitRequest = Omit<CurveFitRequest, "models"> & { models: ModelId[] };

/**
 * Resolves a request: material and numbers checked, model ids read (case-insensitive; spaces
 * and underscores as hyphens), duplicates dropped, the default list filled in.
 * @throws RheoError naming the field: an unknown material, unknown model (listing the accepted
 *   ones), a temperature-dependent model (cross-wlf needs the fit across temperatures), limits
 *   that are not positive numbers.
 */
export function resolveCurveFitRequest(request: Partial<CurveFitRequest> = {}): ResolvedCurveFitRequest {
  const r: CurveFitRequest = { ...DEFAULT_CURVE_FIT_REQUEST, ...Object.fromEntries(Object.entries(request).filter(([, v]) => v !== undefined)) };
  if (!MATERIAL_CLASSES.includes(r.material)) {
    throw new RheoError("value", "material", `unknown material class "${String(r.material)}"; accepted: ${MATERIAL_CLASSES.join(", ")}`);
  }
  for (const key of ["maxRelativeStandardError", "maxDeltaAic"] as const) {
    if (!(typeof r[key] === "number" && r[key] > 0 && Number.isFinite(r[key]))) throw new RheoError("value", key, `must be a number greater than zero, got ${String(r[key])}`);
  }
  if (!Array.isArray(r.models)) throw new RheoError("value", "models", "must be a list of model ids");
  const ids = r.models.map((m) => {
    const def = readModel(m);
    if (def.needsTemperature) {
      throw new RheoError("value", "models", `${def.id} depends on temperature: it is fitted across the temperatures of a test (the fit across temperatures), not to one curve`);
    }
    return def.id;
  });
  return { ...r, models: ids.length > 0 ? [...new Set(ids)] : defaultModels(r.material) };
}

/** A model id as a user writes it (any case; spaces and underscores as hyphens), as argument "models". */
function readModel(id: unknown) {
  try {
    return getModel(String(id).trim().toLowerCase().replace(/[\s_]+/g, "-"));
  } catch (e) {
    if (e instanceof RheoError) throw e.retarget({ argument: "models" });
    throw e;
  }
}

/** The fits of one curve and the verdict on them. */
export interface CurveFits {
  /** the models tried, in the order asked */
  models: ModelId[];
  material: MaterialClass;
  /** points used */
  pointCount: number;
  /** converged fits, best (lowest AIC) first */
  ranked: RankedFit[];
  /** models that could not be fitted, with the reason */
  failed: FailedFit[];
  /** the one verdict (verdict.ts) */
  verdict: Verdict;
  /**
   * What the run should report about these fits: a group with too few points (FIT_SKIPPED),
   * models that failed (FIT_FAILED), the verdict's warning and the recommended fit's warnings.
   */
  warnings: Warning[];
}

/**
 * Fits the requested (or default) models to one curve and decides the verdict.
 * @throws RheoError for a bad request (see {@link resolveCurveFitRequest}) and for invalid data
 *   (non-finite or non-positive values, naming the argument and row).
 * @example fitCurve({ shearRate, viscosity }).verdict.recommended // e.g. "cross"
 */
export function fitCurve(data: FitData, request: Partial<CurveFitRequest> = {}): CurveFits {
  const r = resolveCurveFitRequest(request);
  const pointCount = data.shearRate.length;
  const shared: Partial<FitOptions> = { residualSpace: r.residualSpace, maxRelativeStandardError: r.maxRelativeStandardError };
  const perModel = Object.fromEntries(r.models.map((id) => [id, { fixed: materialFixed(r.material, id) }]));
  const { ranked, failed } = compareModels(r.models, data, { shared, perModel });
  const verdict = decideVerdict({ ranked, failed }, { maxDeltaAic: r.maxDeltaAic });
  const warnings: Warning[] = [];
  if (ranked.length === 0) warnings.push(warning("FIT_SKIPPED", `no model could be fitted to the ${pointCount} point${pointCount === 1 ? "" : "s"} (${failed.map((f) => `${f.model}: ${f.reason}`).join("; ")})`));
  else for (const f of failed) warnings.push(warning("FIT_FAILED", `${f.model} was not fitted: ${f.reason}`));
  warnings.push(...verdict.warnings);
  if (verdict.fit) warnings.push(...verdict.fit.warnings.map((w) => ({ ...w, message: `${verdict.recommended}: ${w.message}` })));
  return { models: r.models, material: r.material, pointCount, ranked, failed, verdict, warnings };
}

/** The fits of one reduction group. */
export interface GroupFits extends CurveFits {
  /** K, or null */
  temperature: number | null;
  /** m (the slit height for a slit group) */
  dieDiameter: number;
  /** the group's label, as every surface prints it */
  label: string;
}

/** The points of a group's true flow curve: those with a Rabinowitsch-corrected rate and viscosity. */
export function trueFlowCurve(group: ReductionGroup): { shearRate: number[]; viscosity: number[] } {
  const points = group.flowCurve.filter((p) => p.shearRateWall !== null && p.viscosity !== null && p.shearRateWall > 0 && p.viscosity > 0);
  return { shearRate: points.map((p) => p.shearRateWall as number), viscosity: points.map((p) => p.viscosity as number) };
}

/**
 * Fits one group's true flow curve; warnings are scoped with the group's label. A curve no model
 * accepts (too few points) gets FIT_SKIPPED, never an exception.
 * @throws RheoError for a bad request.
 */
export function fitGroup(group: ReductionGroup, request: Partial<CurveFitRequest> = {}): GroupFits {
  const label = groupLabel(group);
  const base = { temperature: group.temperature, dieDiameter: group.dieDiameter, label };
  const r = resolveCurveFitRequest(request);
  const fits = fitCurve(trueFlowCurve(group), r);
  return { ...base, ...fits, warnings: fits.warnings.map((w) => scoped(w, label)) };
}

/**
 * Fits every group of a reduction. `request` is the request, or (as before) a list of model ids.
 * @throws RheoError("value") for an unknown model id or a bad request.
 * @example fitFlowCurves(reduce(measurements))[0].verdict.recommended // e.g. "cross"
 */
export function fitFlowCurves(result: ReductionResult, request: Partial<CurveFitRequest> | readonly string[] = {}): GroupFits[] {
  const r = resolveCurveFitRequest(Array.isArray(request) ? { models: request as readonly string[] } : (request as Partial<CurveFitRequest>));
  return result.groups.map((g) => fitGroup(g, r));
}

/**
 * Do the groups' verdicts name models of one family? When they do not, the warning says which
 * groups differ and why (each verdict's reason), so the reader can tell a material effect from a
 * data window that determines different things at different temperatures.
 * @returns VERDICT_FAMILIES_DIFFER, or nothing when every recommending group agrees
 */
export function verdictAgreement(groups: readonly GroupFits[]): Warning[] {
  const recommending = groups.filter((g) => g.verdict.recommended !== null);
  const families = new Set(recommending.map((g) => MODEL_FAMILY[g.verdict.recommended as ModelId]));
  if (families.size <= 1) return [];
  const lines = recommending.map((g) => `${g.label}: ${g.verdict.recommended} (${FAMILY_NAMES[MODEL_FAMILY[g.verdict.recommended as ModelId]]}; ${g.verdict.reason})`);
  return [warning("VERDICT_FAMILIES_DIFFER", `the groups are described by different model families — ${lines.join(" | ")}`)];
}
