/**
 * The planner's options as people write them — a JSON file for `rheoledger plan`, a two-column
 * settings range for RHEO.PLAN — read into the core's SI {@link PlanInput}. One reader for both
 * surfaces, so a key means the same thing everywhere.
 *
 * Dimensional values are "value unit" text ("15 mm", "0.75 g/cm3", "2 g/10min"). A bare number is
 * accepted only where a default unit is given (the worksheet passes {@link PLAN_SHEET_UNITS}) or the
 * quantity is dimensionless. Fractions ("accuracy", "lowFraction", ...) take "0.25 %" or 0.0025.
 */
import { RheoError } from "../core/errors";
import { toSI, type Quantity } from "../core/units";
import { getModel } from "../core/models";
import {
  modelViscosity,
  powerLawFromApparentPoint,
  powerLawFromMeltFlow,
  powerLawViscosity,
  DEFAULT_ASSUMED_FLOW_INDEX,
} from "../core/priorViscosity";
import type { PlanInput, PlannerOptions } from "../core/planner";
import type { ShiftLaw } from "../core/temperature/shiftFactors";
import type { PlanDie, PlanDieKind } from "../core/diePressure";
import type { PlanTransducer } from "../core/transducerChoice";

/** Scalar keys of the options, with their quantity ("count", "text", "fraction", "number" for the rest). */
export const PLAN_SETTING_KEYS = {
  barrelDiameter: "length",
  usableLength: "length",
  usableVolume: "volume",
  density: "density",
  dwellTime: "time",
  compressibility: "inverseStress",
  shearRateMin: "shearRate",
  shearRateMax: "shearRate",
  points: "count",
  rateBasis: "text",
  priorModel: "text",
  priorParameters: "parameters",
  priorTemperature: "temperature",
  testTemperature: "temperature",
  priorActivationEnergy: "molarEnergy",
  priorWlfC1: "number",
  priorWlfC2: "temperatureDifference",
  mfr: "massRate",
  mvr: "volumetricFlow",
  mfrLoad: "mass",
  apparentViscosity: "viscosity",
  apparentShearRate: "shearRate",
  flowIndex: "number",
  endCorrection: "number",
  lowFraction: "fraction",
  highFraction: "fraction",
  settleTolerance: "fraction",
  timePerLoad: "time",
} as const;

/** Keys of a die entry and of a transducer entry. */
export const PLAN_DIE_KEYS = { name: "text", type: "text", diameter: "length", length: "length", width: "length", height: "length", transducer: "text" } as const;
export const PLAN_TRANSDUCER_KEYS = { name: "text", fullScale: "pressure", accuracy: "fraction" } as const;

type Kind = Quantity | "count" | "text" | "fraction" | "number" | "parameters";

/** Default units of bare numbers in worksheet settings (documented with RHEO.PLAN). */
export const PLAN_SHEET_UNITS: Partial<Record<Quantity, string>> = Object.freeze({
  length: "mm",
  volume: "cm3",
  density: "g/cm3",
  time: "s",
  inverseStress: "1/GPa",
  shearRate: "1/s",
  temperature: "C",
  temperatureDifference: "K",
  molarEnergy: "kJ/mol",
  massRate: "g/10min",
  volumetricFlow: "cm3/10min",
  mass: "kg",
  viscosity: "Pa.s",
  pressure: "bar",
});

/** What the reader hands back: the core's input and options. */
export interface ParsedPlanOptions {
  input: PlanInput;
  options: Partial<PlannerOptions>;
  /** How the prior viscosity was built, in words (printed with the plan). */
  priorDescription: string;
}

const NUMBER_UNIT = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$/;

/** Reads one value of `kind`; `field` names it in messages. */
export function readPlanValue(raw: unknown, kind: Kind, field: string, defaultUnits?: Partial<Record<Quantity, string>>): unknown {
  if (kind === "text") {
    if (typeof raw !== "string" || raw.trim() === "") throw new RheoError("value", field, `must be text, got ${JSON.stringify(raw)}`);
    return raw.trim();
  }
  if (kind === "parameters") return readParameters(raw, field);
  if (kind === "count" || kind === "number") {
    const v = typeof raw === "string" && NUMBER_UNIT.test(raw) && NUMBER_UNIT.exec(raw)?.[2] === "" ? Number(raw) : raw;
    if (typeof v !== "number" || !Number.isFinite(v)) throw new RheoError("value", field, `must be a number, got ${JSON.stringify(raw)}`);
    if (kind === "count" && !Number.isInteger(v)) throw new RheoError("value", field, `must be a whole number, got ${v}`);
    return v;
  }
  const quantity: Quantity = kind === "fraction" ? "ratio" : kind;
  if (typeof raw === "number") {
    if (!Number.isFinite(raw)) throw new RheoError("value", field, `must be a finite number, got ${raw}`);
    if (quantity === "ratio" || quantity === "shearRate") return raw;
    const unit = defaultUnits?.[quantity];
    if (unit === undefined) throw new RheoError("value", field, `needs a unit, e.g. "${raw} ${exampleUnit(quantity)}"`);
    return toSI(raw, unit, quantity, field);
  }
  if (typeof raw !== "string") throw new RheoError("value", field, `must be "value unit" text such as "15 mm", got ${JSON.stringify(raw)}`);
  const m = NUMBER_UNIT.exec(raw);
  if (!m) throw new RheoError("value", field, `must start with a number, e.g. "15 mm", got "${raw}"`);
  const value = Number(m[1]);
  const unit = m[2] ?? "";
  if (unit === "") return readPlanValue(value, kind, field, defaultUnits);
  return toSI(value, unit, quantity, field);
}

function exampleUnit(q: Quantity): string {
  return PLAN_SHEET_UNITS[q] ?? "SI";
}

/** Model parameters: an object {name: number} or text "K=1e4, n=0.4" (SI values). */
export function readParameters(raw: unknown, field: string): Record<string, number> {
  const out: Record<string, number> = {};
  if (typeof raw === "string") {
    for (const part of raw.split(/[,;]/).map((p) => p.trim()).filter((p) => p !== "")) {
      const m = /^([A-Za-z][A-Za-z0-9_]*)\s*=\s*(\S+)$/.exec(part);
      const v = m ? Number(m[2]) : NaN;
      if (!m || !Number.isFinite(v)) throw new RheoError("value", field, `expected name=value pairs in SI units such as "K=10000, n=0.4", got "${part}"`);
      out[m[1] as string] = v;
    }
  } else if (typeof raw === "object" && raw !== null && !Array.isArray(raw)) {
    for (const [k, v] of Object.entries(raw)) {
      if (typeof v !== "number" || !Number.isFinite(v)) throw new RheoError("value", `${field}.${k}`, `must be a number in SI units, got ${JSON.stringify(v)}`);
      out[k] = v;
    }
  } else throw new RheoError("value", field, `must be an object of SI numbers or "name=value, ..." text, got ${JSON.stringify(raw)}`);
  if (Object.keys(out).length === 0) throw new RheoError("missing", field, "has no parameters");
  return out;
}

function readEntry<K extends Record<string, Kind>>(raw: unknown, keys: K, field: string, units?: Partial<Record<Quantity, string>>): Partial<Record<keyof K, unknown>> {
  if (typeof raw !== "object" || raw === null || Array.isArray(raw)) throw new RheoError("value", field, `must be an object, got ${JSON.stringify(raw)}`);
  const out: Partial<Record<keyof K, unknown>> = {};
  for (const [k, v] of Object.entries(raw)) {
    if (!(k in keys)) throw new RheoError("value", field, `unknown key "${k}"; accepted: ${Object.keys(keys).join(", ")}`);
    if (v === null || v === undefined || v === "") continue;
    out[k as keyof K] = readPlanValue(v, keys[k] as Kind, `${field}.${k}`, units);
  }
  return out;
}

function readList(raw: unknown, field: string): unknown[] {
  if (!Array.isArray(raw) || raw.length === 0) throw new RheoError("missing", field, "must be a non-empty list");
  return raw;
}

function readDie(raw: unknown, i: number, units?: Partial<Record<Quantity, string>>): PlanDie {
  const field = `dies[${i + 1}]`;
  const e = readEntry(raw, PLAN_DIE_KEYS, field, units);
  const type = (e.type ?? "capillary") as string;
  if (!["capillary", "orifice", "slit"].includes(type)) throw new RheoError("value", `${field}.type`, `unknown die type "${type}"; accepted: capillary, orifice, slit`);
  const die: PlanDie = { name: (e.name as string | undefined) ?? `die ${i + 1}`, kind: type as PlanDieKind };
  for (const k of ["diameter", "length", "width", "height"] as const) if (e[k] !== undefined) die[k] = e[k] as number;
  if (e.transducer !== undefined) die.transducer = e.transducer as string;
  return die;
}

function readTransducer(raw: unknown, i: number, units?: Partial<Record<Quantity, string>>): PlanTransducer {
  const field = `transducers[${i + 1}]`;
  const e = readEntry(raw, PLAN_TRANSDUCER_KEYS, field, units);
  if (e.fullScale === undefined) throw new RheoError("missing", `${field}.fullScale`, 'is required, e.g. "500 bar"');
  const t: PlanTransducer = { name: (e.name as string | undefined) ?? `transducer ${i + 1}`, fullScale: e.fullScale as number };
  if (e.accuracy !== undefined) t.accuracy = e.accuracy as number;
  return t;
}

function need<T>(s: Record<string, unknown>, key: string, hint: string): T {
  if (s[key] === undefined) throw new RheoError("missing", key, `is required, e.g. ${hint}`);
  return s[key] as T;
}

function readPrior(s: Record<string, unknown>): { viscosity: PlanInput["viscosity"]; description: string } {
  const ways = [s.priorModel !== undefined, s.mfr !== undefined || s.mvr !== undefined, s.apparentViscosity !== undefined].filter(Boolean).length;
  if (ways !== 1) {
    throw new RheoError("missing", "priorModel", "give exactly one prior viscosity: priorModel with priorParameters, or mfr/mvr with mfrLoad, or apparentViscosity with apparentShearRate");
  }
  const n = (s.flowIndex as number | undefined) ?? DEFAULT_ASSUMED_FLOW_INDEX;
  if (s.priorModel !== undefined) {
    const model = getModel(s.priorModel as string).id;
    const parameters = need<Record<string, number>>(s, "priorParameters", '{"K": 10000, "n": 0.4}');
    // a model with its own temperature law (cross-wlf) is evaluated at the test's temperature
    const own = getModel(model).needsTemperature;
    const t = own ? ((s.testTemperature ?? s.priorTemperature) as number | undefined) : (s.priorTemperature as number | undefined);
    const viscosity = modelViscosity(model, parameters, t, "priorParameters");
    return { viscosity, description: `${model} ${Object.entries(parameters).map(([k, v]) => `${k}=${v}`).join(", ")} (SI)` };
  }
  const pl =
    s.apparentViscosity !== undefined
      ? powerLawFromApparentPoint(need<number>(s, "apparentShearRate", '"100 1/s"'), s.apparentViscosity as number, n)
      : powerLawFromMeltFlow({
          massRate: s.mfr as number | undefined,
          volumeRate: s.mvr as number | undefined,
          load: need<number>(s, "mfrLoad", '"2.16 kg"'),
          density: s.density as number | undefined,
          flowIndex: n,
        });
  const source = s.apparentViscosity !== undefined ? "one apparent-viscosity point" : "an MFR/MVR point";
  return { viscosity: powerLawViscosity(pl.K, pl.n), description: `power law K=${pl.K.toPrecision(5)} Pa.s^n, n=${pl.n} (assumed) from ${source}` };
}

/**
 * The law that moves the prior from priorTemperature (its reference) to testTemperature:
 * Arrhenius with priorActivationEnergy, or WLF with priorWlfC1 and priorWlfC2 (at priorTemperature).
 */
function readPriorShift(s: Record<string, unknown>): ShiftLaw | undefined {
  const arrhenius = s.priorActivationEnergy !== undefined;
  const wlf = s.priorWlfC1 !== undefined || s.priorWlfC2 !== undefined;
  if (!arrhenius && !wlf) return undefined;
  if (arrhenius && wlf) throw new RheoError("value", "priorActivationEnergy", "give either an Arrhenius activation energy or the WLF constants priorWlfC1 and priorWlfC2, not both");
  const reference = need<number>(s, "priorTemperature", '"190 C" (the temperature the prior belongs to)');
  if (arrhenius) return { law: "arrhenius", referenceTemperature: reference, activationEnergy: s.priorActivationEnergy as number };
  return { law: "wlf", referenceTemperature: reference, C1: need<number>(s, "priorWlfC1", "4.5"), C2: need<number>(s, "priorWlfC2", '"150 K"') };
}

/**
 * Reads planner options (a parsed JSON object, or the worksheet's settings turned into one).
 * @param defaultUnits units of bare numbers (the worksheet's defaults); omitted: units required
 * @throws RheoError naming the key (dies[2].length, transducers[1].fullScale, ...).
 */
export function readPlanOptions(raw: unknown, defaultUnits?: Partial<Record<Quantity, string>>): ParsedPlanOptions {
  if (typeof raw !== "object" || raw === null || Array.isArray(raw)) throw new RheoError("value", "options", "must be a JSON object of settings");
  const s: Record<string, unknown> = {};
  let dies: PlanDie[] | undefined;
  let transducers: PlanTransducer[] | undefined;
  for (const [key, value] of Object.entries(raw as Record<string, unknown>)) {
    if (key === "dies") dies = readList(value, "dies").map((d, i) => readDie(d, i, defaultUnits));
    else if (key === "transducers") transducers = readList(value, "transducers").map((t, i) => readTransducer(t, i, defaultUnits));
    else if (key in PLAN_SETTING_KEYS) {
      if (value === null || value === undefined || value === "") continue;
      s[key] = readPlanValue(value, PLAN_SETTING_KEYS[key as keyof typeof PLAN_SETTING_KEYS], key, defaultUnits);
    } else if (key !== "comment" && !key.startsWith("_")) {
      throw new RheoError("value", key, `unknown setting; accepted: ${[...Object.keys(PLAN_SETTING_KEYS), "dies", "transducers"].join(", ")}`);
    }
  }
  if (!dies) throw new RheoError("missing", "dies", 'is required: a list such as [{"name": "L20", "type": "capillary", "diameter": "1 mm", "length": "20 mm"}]');
  if (!transducers) throw new RheoError("missing", "transducers", 'is required: a list such as [{"name": "P500", "fullScale": "500 bar"}]');
  const basis = s.rateBasis ?? "apparent";
  if (basis !== "apparent" && basis !== "wall") throw new RheoError("value", "rateBasis", `must be "apparent" or "wall", got "${String(basis)}"`);
  const prior = readPrior(s);
  const input: PlanInput = {
    barrelDiameter: need(s, "barrelDiameter", '"15 mm"'),
    usableLength: s.usableLength as number | undefined,
    usableVolume: s.usableVolume as number | undefined,
    dies,
    transducers,
    shearRateMin: need(s, "shearRateMin", '"10 1/s"'),
    shearRateMax: need(s, "shearRateMax", '"5000 1/s"'),
    points: need(s, "points", "8"),
    rateBasis: basis,
    viscosity: prior.viscosity,
    density: need(s, "density", '"0.75 g/cm3"'),
    dwellTime: need(s, "dwellTime", '"60 s"'),
    compressibility: s.compressibility as number | undefined,
  };
  const shift = readPriorShift(s);
  if (shift) input.priorShift = shift;
  const ownLaw = s.priorModel !== undefined && getModel(s.priorModel as string).needsTemperature;
  if (s.priorTemperature !== undefined && !ownLaw) input.priorTemperature = s.priorTemperature as number;
  if (s.testTemperature !== undefined && !ownLaw) input.testTemperature = s.testTemperature as number;
  const options: Partial<PlannerOptions> = {};
  for (const k of ["endCorrection", "lowFraction", "highFraction", "settleTolerance", "timePerLoad"] as const) {
    if (s[k] !== undefined) options[k] = s[k] as number;
  }
  return { input, options, priorDescription: prior.description };
}
