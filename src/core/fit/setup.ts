/**
 * Turns a model, its data and the resolved options into the pieces the solver needs: which
 * parameters are free, their transforms and start values, and the points with positive weight.
 */
import { RheoError, warning, type Warning } from "../errors";
import { checkParameterValue, type ModelDefinition } from "../models";
import { inside } from "../models/guess";
import { DEFAULT_FIT_OPTIONS, type FitOptions } from "./options";
import type { FitData } from "./validate";

export interface FitSetup {
  /** All parameter values (fixed ones set, free ones at their start). */
  start: Float64Array;
  freeIndex: number[];
  fixedNames: string[];
  rates: Float64Array;
  /** ln γ̇ of each point (for models with a whole-curve fast path). */
  logRate: Float64Array;
  logViscosity: Float64Array;
  viscosity: Float64Array;
  temperature: Float64Array;
  sqrtWeight: Float64Array;
  weight: Float64Array;
  warnings: Warning[];
}

/** Fills defaults and checks every option against the model. */
export function resolveFitOptions(model: ModelDefinition, options: Partial<FitOptions>): FitOptions {
  const resolved: FitOptions = { ...DEFAULT_FIT_OPTIONS, ...stripUndefined(options) };
  if (resolved.residualSpace !== "log" && resolved.residualSpace !== "linear") {
    throw new RheoError("value", "options.residualSpace", `must be "log" or "linear", got "${String(resolved.residualSpace)}"`);
  }
  for (const key of ["maxIterations", "functionTolerance", "stepTolerance", "gradientTolerance"] as const) {
    const v = resolved[key];
    if (!(typeof v === "number" && v > 0 && Number.isFinite(v))) throw new RheoError("value", `options.${key}`, `must be a finite number greater than zero, got ${String(v)}`);
  }
  if (!(typeof resolved.maxRelativeStandardError === "number" && resolved.maxRelativeStandardError > 0 && Number.isFinite(resolved.maxRelativeStandardError))) {
    throw new RheoError("value", "options.maxRelativeStandardError", `must be a finite number greater than zero, got ${String(resolved.maxRelativeStandardError)}`);
  }
  if (!(resolved.confidenceLevel > 0 && resolved.confidenceLevel < 1)) {
    throw new RheoError("domain", "options.confidenceLevel", `must be between 0 and 1, got ${resolved.confidenceLevel}`);
  }
  for (const [name, value] of Object.entries(resolved.fixed)) checkParameterValue(model, name, value, `options.fixed.${name}`);
  for (const [name, value] of Object.entries(resolved.initial)) {
    checkParameterValue(model, name, value, `options.initial.${name}`);
    const spec = model.parameters.find((p) => p.name === name);
    if (spec && value <= spec.min) throw new RheoError("domain", `options.initial.${name}`, `must be greater than ${spec.min} (a start on the bound cannot move), got ${value}`);
  }
  for (const name of resolved.free) {
    if (!(name in model.defaultFixed)) {
      const held = Object.keys(model.defaultFixed);
      throw new RheoError("value", "options.free", `"${name}" is not held fixed by default in ${model.id}; ${held.length ? `only ${held.join(", ")} can be freed` : "all its parameters are already fitted"}`);
    }
  }
  return resolved;
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** Builds the free-parameter layout, start values and the weighted points. */
export function setupFit(model: ModelDefinition, data: FitData, options: FitOptions): FitSetup {
  const warnings: Warning[] = [];
  const { weights } = data;
  const pick = (a: readonly number[]): number[] => (weights ? a.filter((_, i) => (weights[i] as number) > 0) : a.slice());
  const rateList = pick(data.shearRate);
  const viscosityList = pick(data.viscosity);
  const n = rateList.length;
  // One store for the seven per-point arrays (each above V8's 64-byte limit for on-heap typed arrays).
  const buffer = new Float64Array(7 * n);
  const column = (c: number) => buffer.subarray(c * n, (c + 1) * n);
  const [rates, viscosity, logViscosity, weight, sqrtWeight, temperature, logRate] = [0, 1, 2, 3, 4, 5, 6].map(column) as [
    Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array,
  ];
  rates.set(rateList);
  viscosity.set(viscosityList);
  if (weights) weight.set(pick(weights));
  else weight.fill(1);

  if (model.needsTemperature) {
    if (!data.temperature) throw new RheoError("missing", "temperature", `${model.id} needs one temperature (K) per point`);
    temperature.set(pick(data.temperature));
  } else {
    if (data.temperature) warnings.push(warning("TEMPERATURE_IGNORED", `${model.id} does not depend on temperature; the temperature column was not used`));
    temperature.fill(NaN);
  }
  for (let i = 0; i < n; i++) {
    logViscosity[i] = Math.log(viscosity[i] as number);
    logRate[i] = Math.log(rates[i] as number);
    sqrtWeight[i] = Math.sqrt(weight[i] as number);
  }

  const fixedValues: Record<string, number> = { ...model.defaultFixed };
  for (const name of options.free) delete fixedValues[name];
  Object.assign(fixedValues, options.fixed);
  const fixedNames = model.parameters.map((p) => p.name).filter((n) => n in fixedValues);
  const freeIndex = model.parameters.map((_, j) => j).filter((j) => !((model.parameters[j]?.name as string) in fixedValues));

  if (freeIndex.length === 0) throw new RheoError("value", "options.fixed", `holds every parameter of ${model.id}; nothing is left to fit`);
  if (rates.length <= freeIndex.length) {
    throw new RheoError(
      "missing",
      "shearRate",
      `${rates.length} point${rates.length === 1 ? "" : "s"} with positive weight cannot determine ${freeIndex.length} free parameters of ${model.id}; at least ${freeIndex.length + 1} are needed`,
    );
  }
  if (model.needsTemperature) checkTemperatureLevels(model, temperature, freeIndex);

  const guessData = { shearRate: rateList, viscosity: viscosityList, temperature: model.needsTemperature ? Array.from(temperature) : undefined };
  const guess = model.initialGuess(guessData);
  const start = Float64Array.from(model.parameters, (spec, j) => {
    if (spec.name in fixedValues) return fixedValues[spec.name] as number;
    const given = options.initial[spec.name];
    return given !== undefined ? given : inside(guess[j] as number, spec.min, spec.max);
  });
  return { start, freeIndex, fixedNames, rates, logRate, viscosity, logViscosity, temperature, weight, sqrtWeight, warnings };
}

/** ln η0(T) of Cross-WLF takes one value per temperature: need as many levels as free T-parameters. */
function checkTemperatureLevels(model: ModelDefinition, temperature: Float64Array, freeIndex: number[]): void {
  const tParams = ["D1", "A1", "A2", "Tstar"].filter((name) => freeIndex.some((j) => model.parameters[j]?.name === name));
  if (tParams.includes("A2") && tParams.includes("Tstar")) {
    // ln η0 = ln D1 − A1 + A1·A2/(T + A2 − T*): only the difference A2 − T* is determined.
    throw new RheoError("value", "options.free", `${model.id} cannot fit both A2 and Tstar: η0(T) depends on them only through A2 − Tstar; hold Tstar fixed (options.fixed)`);
  }
  const levels = new Set(temperature).size;
  if (levels < tParams.length) {
    throw new RheoError(
      "missing",
      "temperature",
      `${model.id} with free ${tParams.join(", ")} needs at least ${tParams.length} distinct temperatures, got ${levels}; hold some fixed (options.fixed)`,
    );
  }
}
