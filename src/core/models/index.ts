/**
 * Generalized-Newtonian viscosity models: the registry and their evaluation.
 *
 * | id | parameters (SI) | reference |
 * |---|---|---|
 * | `newtonian` | mu (Pa·s) | Macosko 1994 |
 * | `power-law` | K (Pa·s^n), n | Ostwald–de Waele; Bird et al. 1987 |
 * | `cross` | eta0, etaInf (Pa·s), lambda (s), m | Cross 1965 |
 * | `carreau` | eta0, etaInf (Pa·s), lambda (s), n | Carreau 1972 |
 * | `carreau-yasuda` | eta0, etaInf (Pa·s), lambda (s), n, a | Yasuda, Armstrong & Cohen 1981 |
 * | `sisko` | etaInf (Pa·s), K (Pa·s^n), n | Sisko 1958 |
 * | `ellis` | eta0 (Pa·s), tauHalf (Pa), alpha | Ellis; Bird et al. 1987 (η solved at each γ̇) |
 * | `bingham` | tauY (Pa), muP (Pa·s) | Bingham 1922 |
 * | `herschel-bulkley` | tauY (Pa), K (Pa·s^n), n | Herschel & Bulkley 1926 |
 * | `casson` | tauY (Pa), etaC (Pa·s) | Casson 1959 |
 * | `cross-wlf` | D1 (Pa·s), A1, A2 (K), Tstar (K), tauStar (Pa), n | Hieber & Shen 1980 |
 */
import { RheoError, requireFinite, requirePositive } from "../errors";
import { bingham } from "./bingham";
import { carreau } from "./carreau";
import { carreauYasuda } from "./carreauYasuda";
import { casson } from "./casson";
import { cross } from "./cross";
import { crossWlf } from "./crossWlf";
import { ellis } from "./ellis";
import { herschelBulkley } from "./herschelBulkley";
import { newtonian } from "./newtonian";
import { powerLaw } from "./powerLaw";
import { sisko } from "./sisko";
import type { ModelDefinition, ModelId } from "./types";

export type { GuessData, ModelDefinition, ModelId, ParameterSpec } from "./types";
export { binghamStress } from "./bingham";
export { cassonStress } from "./casson";
export { herschelBulkleyStress } from "./herschelBulkley";
export { ellisViscosityFromStress } from "./ellis";
export { CROSS_WLF_DEFAULT_A2 } from "./crossWlf";

/** Every model, keyed by its stable id. */
export const MODEL_REGISTRY: Readonly<Record<ModelId, ModelDefinition>> = {
  newtonian,
  "power-law": powerLaw,
  cross,
  carreau,
  "carreau-yasuda": carreauYasuda,
  sisko,
  ellis,
  bingham,
  "herschel-bulkley": herschelBulkley,
  casson,
  "cross-wlf": crossWlf,
};

/** The model ids in registry order. */
export const MODEL_IDS = Object.keys(MODEL_REGISTRY) as ModelId[];

/**
 * The definition of model `id`.
 * @throws RheoError(kind "value", argument "model") for an unknown id, listing the accepted ones.
 * @example getModel("carreau").parameters.map((p) => p.name) // ["eta0", "etaInf", "lambda", "n"]
 */
export function getModel(id: string): ModelDefinition {
  if (!Object.prototype.hasOwnProperty.call(MODEL_REGISTRY, id)) {
    throw new RheoError("value", "model", `unknown model "${id}"; accepted: ${MODEL_IDS.join(", ")}`);
  }
  return MODEL_REGISTRY[id as ModelId];
}

/**
 * Checks a parameter record against a model and returns the values in the model's order.
 * @throws RheoError naming `argument.name`: unknown or missing names (listing the accepted ones),
 *   non-finite values (`value`), values outside the physical bounds (`domain`).
 */
export function parameterVector(model: ModelDefinition, parameters: Record<string, number>, argument = "parameters"): Float64Array {
  const names = model.parameters.map((p) => p.name);
  for (const key of Object.keys(parameters)) {
    if (!names.includes(key)) {
      throw new RheoError("value", argument, `unknown parameter "${key}" for ${model.id}; accepted: ${names.join(", ")}`);
    }
  }
  const missing = names.filter((n) => parameters[n] === undefined);
  if (missing.length > 0) {
    throw new RheoError("missing", argument, `${model.id} needs ${names.join(", ")}; missing: ${missing.join(", ")}`);
  }
  return Float64Array.from(model.parameters, (spec) => checkParameterValue(model, spec.name, parameters[spec.name] as number, `${argument}.${spec.name}`));
}

/** Checks one parameter value against the model's physical bounds; returns it. */
export function checkParameterValue(model: ModelDefinition, name: string, value: number, argument: string): number {
  const spec = model.parameters.find((p) => p.name === name);
  if (!spec) throw new RheoError("value", argument, `unknown parameter "${name}" for ${model.id}; accepted: ${model.parameters.map((p) => p.name).join(", ")}`);
  requireFinite(value, argument);
  if (spec.minInclusive ? value < spec.min : value <= spec.min) {
    throw new RheoError("domain", argument, `must be ${spec.minInclusive ? "at least" : "greater than"} ${spec.min} for ${model.id}, got ${value}`);
  }
  if (value >= spec.max) throw new RheoError("domain", argument, `must be less than ${spec.max} for ${model.id}, got ${value}`);
  return value;
}

/**
 * Viscosity η (Pa·s) of a model at each shear rate γ̇ (1/s) and, for `cross-wlf`, temperature T (K,
 * one value for all rates or one per rate).
 * @throws RheoError for an unknown model, unknown/missing/out-of-bounds parameters (listing the
 *   accepted names), non-positive shear rates or temperatures, a missing temperature for
 *   `cross-wlf`, a temperature array of the wrong length, or T outside Cross-WLF's range
 *   (A2 + T − T* ≤ 0).
 * @example evaluateModel("power-law", { K: 1e4, n: 0.4 }, [10]) // [1e4 · 10^−0.6 ≈ 2511.9]
 */
export function evaluateModel(
  model: string,
  parameters: Record<string, number>,
  shearRates: readonly number[],
  temperatures?: number | readonly number[],
): number[] {
  const def = getModel(model);
  const p = parameterVector(def, parameters);
  const temps = temperatureList(def, shearRates.length, temperatures);
  return shearRates.map((rate, i) => {
    requirePositive(rate, "shearRates", i + 1);
    const t = temps[i] as number;
    const eta = Math.exp(def.logViscosity(p, rate, t));
    if (!Number.isFinite(eta)) {
      throw new RheoError("domain", "temperatures", `is outside the range of ${def.id} (A2 + T − Tstar must be > 0), got ${t} K`, i + 1);
    }
    return eta;
  });
}

function temperatureList(def: ModelDefinition, count: number, temperatures?: number | readonly number[]): number[] {
  if (temperatures === undefined) {
    if (def.needsTemperature) throw new RheoError("missing", "temperatures", `${def.id} needs a temperature (K)`);
    return new Array<number>(count).fill(NaN);
  }
  if (typeof temperatures === "number") {
    requirePositive(temperatures, "temperatures");
    return new Array<number>(count).fill(temperatures);
  }
  if (temperatures.length !== count) {
    throw new RheoError("value", "temperatures", `has ${temperatures.length} values but shearRates has ${count}`);
  }
  return temperatures.map((t, i) => requirePositive(t, "temperatures", i + 1));
}
