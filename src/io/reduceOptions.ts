/**
 * The reduction's settings as people give them — command-line flags of `rheoledger reduce`, task
 * pane fields, the arguments and settings range of RHEO.REDUCE — read into one {@link ReduceRequest}
 * of SI values for the core (src/core/run.ts). One table, {@link REDUCE_SETTINGS}, says for every
 * setting its key, command-line flag, kind, display unit, plain label and help; the command line
 * builds its flag list from it, the pane its labels and help, the docs their reference. A new reduce
 * option is one entry here plus its use in the core.
 *
 * Values: switches (true/false, yes/no, on/off), choices, whole numbers, numbers, "value unit"
 * quantities ("15 mm", "0,76 g/cm3"; read by src/io/numberText.ts, so "1,000" is refused as
 * ambiguous). A bare number of a dimensional quantity takes the surface's default unit (pane and
 * worksheet: the setting's display unit); on the command line a unit is required unless `si` is on.
 */
import { RheoError } from "../core/errors";
import { acceptedUnits, isUnitOf, quantitiesOfUnit, toSI, type Quantity, QUANTITY_SI_UNIT } from "../core/units";
import { DEFAULT_REDUCE_OPTIONS, type ReduceOptions } from "../core/reduce";
import { DEFAULT_RABINOWITSCH_OPTIONS, type RabinowitschMethod } from "../core/rabinowitsch";
import { DEFAULT_ORIFICE_OPTIONS } from "../core/orifice";
import { DEFAULT_REPEAT_OPTIONS } from "../core/speedSteps";
import { getModel, type ModelId } from "../core/models";
import type { FitRequest } from "../core/run";
import type { StepOptions } from "../core/steps/options";
import { MATERIAL_CLASSES, type MaterialClass } from "../core/flowCurveFits";
import { MASTER_MODELS, type MasterModel } from "../core/temperature/masterFit";
import { excerpt, readNumberText, readQuantityText } from "./numberText";

/** What kind of value a setting takes. */
export type SettingKind =
  | { type: "switch" }
  | { type: "choice"; choices: readonly string[] }
  | { type: "count"; min: number; max: number }
  | { type: "number"; positive: boolean }
  | { type: "quantity"; quantity: Quantity; positive: boolean }
  | { type: "model" }
  | { type: "models" }
  /** compound text ("density=0.76 g/cm3, cp=2.1 kJ/(kg.K), ...") that fills other settings; `true` switches it on */
  | { type: "spec" }
  | { type: "text" };

/** One setting. */
export interface ReduceSettingSpec {
  /** stable key (pane field id, settings-range key, JSON settings key) */
  key: string;
  /** command-line flag without dashes, or null when the command line has none */
  flag: string | null;
  kind: SettingKind;
  /** unit a bare number is read in on the pane and in worksheet settings, one spelling */
  unit?: string;
  /** where the setting belongs, for grouping on screen and in docs */
  section: "input" | "steps" | "reduction" | "checks" | "fits";
}

const RABINOWITSCH_METHODS: readonly RabinowitschMethod[] = ["transition", "local", "global", "difference"];

/** Every reduce setting, in the order they are shown (their words: src/io/reduceSettingWords.ts). */
export const REDUCE_SETTINGS: readonly ReduceSettingSpec[] = Object.freeze<ReduceSettingSpec[]>([
  { key: "barrelDiameter", flag: "barrel-diameter", kind: { type: "quantity", quantity: "length", positive: true }, unit: "mm", section: "input" },
  { key: "density", flag: "density", kind: { type: "quantity", quantity: "density", positive: true }, unit: "g/cm³", section: "input" },
  { key: "temperatureTolerance", flag: "temperature-tolerance", kind: { type: "quantity", quantity: "temperatureDifference", positive: false }, unit: "K", section: "input" },
  { key: "unsteady", flag: "unsteady", kind: { type: "choice", choices: ["exclude", "keep"] }, section: "steps" },
  { key: "speedTolerance", flag: "speed-tolerance", kind: { type: "quantity", quantity: "ratio", positive: true }, unit: "%", section: "steps" },
  { key: "minWindowTime", flag: "min-window", kind: { type: "quantity", quantity: "time", positive: true }, unit: "s", section: "steps" },
  { key: "driftLimit", flag: "drift-limit", kind: { type: "number", positive: true }, section: "steps" },
  { key: "timeConstant", flag: "time-constant", kind: { type: "quantity", quantity: "time", positive: true }, unit: "s", section: "steps" },
  { key: "compressibility", flag: "compressibility", kind: { type: "quantity", quantity: "inverseStress", positive: true }, unit: "1/GPa", section: "steps" },
  { key: "meltVolume", flag: "melt-volume", kind: { type: "quantity", quantity: "volume", positive: true }, unit: "cm³", section: "steps" },
  { key: "oscillationLimit", flag: "oscillation-limit", kind: { type: "quantity", quantity: "ratio", positive: true }, unit: "%", section: "steps" },
  { key: "thermalCheckLimit", flag: "thermal-limit", kind: { type: "quantity", quantity: "ratio", positive: true }, unit: "%", section: "steps" },
  { key: "endCorrection", flag: "end-correction", kind: { type: "choice", choices: ["bagley", "orifice", "none"] }, section: "reduction" },
  { key: "orifice", flag: "orifice", kind: { type: "switch" }, section: "reduction" },
  { key: "orificeMaxLengthOverDiameter", flag: "orifice-max-ld", kind: { type: "number", positive: true }, section: "reduction" },
  { key: "rabinowitschMethod", flag: "method", kind: { type: "choice", choices: RABINOWITSCH_METHODS }, section: "reduction" },
  { key: "rabinowitschDegree", flag: "degree", kind: { type: "count", min: 1, max: 3 }, section: "reduction" },
  { key: "rabinowitschWindow", flag: "window", kind: { type: "count", min: 3, max: 99 }, section: "reduction" },
  { key: "stabilityThreshold", flag: "stability-threshold", kind: { type: "quantity", quantity: "ratio", positive: true }, unit: "%", section: "reduction" },
  { key: "slitEdgeCorrection", flag: "slit-edge", kind: { type: "switch" }, section: "reduction" },
  { key: "transducer", flag: "transducer", kind: { type: "spec" }, section: "checks" },
  { key: "transducerFullScale", flag: null, kind: { type: "quantity", quantity: "pressure", positive: true }, unit: "bar", section: "checks" },
  { key: "transducerAccuracy", flag: null, kind: { type: "quantity", quantity: "ratio", positive: true }, unit: "%", section: "checks" },
  { key: "transducerZeroOffset", flag: "zero-offset", kind: { type: "quantity", quantity: "pressure", positive: false }, unit: "bar", section: "checks" },
  { key: "transducerGainError", flag: "gain-error", kind: { type: "quantity", quantity: "ratio", positive: false }, unit: "%", section: "checks" },
  { key: "dieBoreTolerance", flag: "bore-tolerance", kind: { type: "quantity", quantity: "length", positive: false }, unit: "mm", section: "checks" },
  { key: "dieLengthTolerance", flag: "length-tolerance", kind: { type: "quantity", quantity: "length", positive: false }, unit: "mm", section: "checks" },
  { key: "meltTemperatureTolerance", flag: "melt-tolerance", kind: { type: "quantity", quantity: "temperatureDifference", positive: false }, unit: "K", section: "checks" },
  { key: "pistonSpeedTolerance", flag: "piston-speed-tolerance", kind: { type: "quantity", quantity: "ratio", positive: false }, unit: "%", section: "checks" },
  { key: "representativeRate", flag: "representative", kind: { type: "switch" }, section: "checks" },
  { key: "slip", flag: "slip", kind: { type: "switch" }, section: "checks" },
  { key: "extensional", flag: "extensional", kind: { type: "switch" }, section: "checks" },
  { key: "cogswellShearRate", flag: "cogswell-rate", kind: { type: "choice", choices: ["apparent", "wall"] }, section: "checks" },
  { key: "pressureDependence", flag: "pressure", kind: { type: "switch" }, section: "checks" },
  { key: "heating", flag: "heating", kind: { type: "spec" }, section: "checks" },
  { key: "heatingDensity", flag: null, kind: { type: "quantity", quantity: "density", positive: true }, unit: "g/cm³", section: "checks" },
  { key: "heatingHeatCapacity", flag: null, kind: { type: "quantity", quantity: "heatCapacity", positive: true }, unit: "kJ/(kg·K)", section: "checks" },
  { key: "heatingConductivity", flag: null, kind: { type: "quantity", quantity: "thermalConductivity", positive: true }, unit: "W/(m·K)", section: "checks" },
  { key: "heatingTemperatureCoefficient", flag: null, kind: { type: "quantity", quantity: "inverseTemperature", positive: true }, unit: "1/K", section: "checks" },
  { key: "meltFlowRate", flag: "mfr", kind: { type: "text" }, section: "checks" },
  { key: "model", flag: "model", kind: { type: "model" }, section: "fits" },
  { key: "compare", flag: "compare", kind: { type: "models" }, section: "fits" },
  { key: "shift", flag: "shift", kind: { type: "choice", choices: ["none", "arrhenius", "wlf"] }, section: "fits" },
  { key: "referenceTemperature", flag: "tref", kind: { type: "quantity", quantity: "temperature", positive: true }, unit: "°C", section: "fits" },
  { key: "glassTransitionTemperature", flag: "tg", kind: { type: "quantity", quantity: "temperature", positive: true }, unit: "°C", section: "fits" },
  { key: "verticalShift", flag: "vertical-shift", kind: { type: "quantity", quantity: "inverseTemperature", positive: false }, unit: "1/K", section: "fits" },
  { key: "material", flag: "material", kind: { type: "choice", choices: MATERIAL_CLASSES }, section: "fits" },
  { key: "master", flag: "master", kind: { type: "choice", choices: MASTER_MODELS }, section: "fits" },
  { key: "crossWlfD2", flag: "d2", kind: { type: "quantity", quantity: "temperature", positive: true }, unit: "°C", section: "fits" },
  { key: "rotational", flag: "rotational", kind: { type: "text" }, section: "fits" },
  { key: "si", flag: "si", kind: { type: "switch" }, section: "input" },
]);

const BY_KEY = new Map(REDUCE_SETTINGS.map((s) => [s.key, s]));
const BY_FLAG = new Map(REDUCE_SETTINGS.filter((s) => s.flag !== null).map((s) => [s.flag as string, s]));

/** The setting of `key`. @throws RheoError("value") for an unknown key. */
export function reduceSetting(key: string): ReduceSettingSpec {
  const s = BY_KEY.get(key);
  if (!s) throw new RheoError("value", key, `unknown setting; accepted: ${REDUCE_SETTINGS.map((x) => x.key).join(", ")}`, undefined, "UNKNOWN_SETTING");
  return s;
}

/** The setting of a command-line flag (without dashes), or undefined. */
export function reduceSettingOfFlag(flag: string): ReduceSettingSpec | undefined {
  return BY_FLAG.get(flag);
}

/** What the reader hands back: the core's options, the reading options, the fits, the step detection's settings. */
export interface ReduceRequest {
  options: Partial<ReduceOptions>;
  /**
   * defaults for the table reader when a column is absent, SI; `rotational`: where the rotational
   * curve is (a file path on the command line, a range on the pane), read by the surface
   */
  input: { barrelDiameter?: number; density?: number; rotational?: string };
  fits: FitRequest;
  /** step detection of a pressure recording (src/core/steps/options.ts), SI; empty when none given */
  steps: Partial<StepOptions>;
}

/** The keys of the step-detection settings (section "steps"): they apply to pressure recordings only. */
export const STEP_SETTING_KEYS: readonly (keyof StepOptions)[] = Object.freeze(
  ["unsteady", "speedTolerance", "minWindowTime", "driftLimit", "timeConstant", "compressibility", "meltVolume", "oscillationLimit", "thermalCheckLimit"] as const,
);

/** How a surface gives its values. */
export interface ReduceSettingsSource {
  /** the name of a setting in messages: "--heating" on the command line, a field or argument name elsewhere */
  nameOf: (spec: ReduceSettingSpec) => string;
  /** bare numbers of dimensional quantities take the setting's display unit (pane, worksheet) */
  bareNumbersInDisplayUnits: boolean;
  /** the command line requires --tref with --shift; the pane takes the middle temperature */
  requireReferenceTemperature: boolean;
}

/** The command line's source: flags named "--flag", units required unless --si. */
export const CLI_SETTINGS_SOURCE: ReduceSettingsSource = { nameOf: (s) => (s.flag ? `--${s.flag}` : s.key), bareNumbersInDisplayUnits: false, requireReferenceTemperature: true };

/** Pane and worksheet: named by key, bare numbers in display units, reference temperature optional. */
export const KEYED_SETTINGS_SOURCE: ReduceSettingsSource = { nameOf: (s) => s.key, bareNumbersInDisplayUnits: true, requireReferenceTemperature: false };

const isBlank = (v: unknown) => v === null || v === undefined || (typeof v === "string" && v.trim() === "");

function readSwitch(raw: unknown, name: string): boolean {
  if (typeof raw === "boolean") return raw;
  if (typeof raw === "number" && (raw === 0 || raw === 1)) return raw === 1;
  const t = String(raw).trim().toLowerCase();
  if (["true", "yes", "on", "1"].includes(t)) return true;
  if (["false", "no", "off", "0"].includes(t)) return false;
  throw new RheoError("value", name, `expected true or false (yes/no, on/off), got "${excerpt(String(raw))}"`);
}

/** Reads a choice: case-insensitive; spaces and underscores read as hyphens. */
function readChoice(raw: unknown, name: string, choices: readonly string[]): string {
  const t = String(raw).trim().toLowerCase().replace(/[\s_]+/g, "-");
  if (!choices.includes(t)) throw new RheoError("value", name, `unknown choice "${excerpt(String(raw))}"; accepted: ${choices.join(", ")}`);
  return t;
}

function readModelId(raw: string, name: string): ModelId {
  const id = raw.trim().toLowerCase().replace(/[\s_]+/g, "-");
  try {
    return getModel(id).id;
  } catch (e) {
    if (e instanceof RheoError) throw e.retarget({ argument: name });
    throw e;
  }
}

function readNumberValue(raw: unknown, name: string): number {
  if (typeof raw === "number") {
    if (!Number.isFinite(raw)) throw new RheoError("value", name, `must be a finite number, got ${raw}`);
    return raw;
  }
  return readNumberText(String(raw), name);
}

/** Reads a quantity as SI. */
function readQuantityValue(raw: unknown, spec: ReduceSettingSpec, quantity: Quantity, name: string, src: ReduceSettingsSource, si: boolean): number {
  let value: number;
  let unit: string;
  if (typeof raw === "number") {
    value = readNumberValue(raw, name);
    unit = "";
  } else ({ value, unit } = readQuantityText(String(raw), name));
  if (unit === "") {
    if (quantity === "ratio") unit = src.bareNumbersInDisplayUnits && spec.unit ? spec.unit : "1";
    else if (src.bareNumbersInDisplayUnits && spec.unit) unit = spec.unit;
    else if (si) unit = QUANTITY_SI_UNIT[quantity];
    else {
      throw new RheoError("value", name, `needs a unit, e.g. "${value} ${spec.unit ?? QUANTITY_SI_UNIT[quantity]}" (or give --si to read bare numbers as SI)`, undefined, "UNIT_REQUIRED");
    }
  }
  if (!isUnitOf(quantity, unit)) {
    const other = quantitiesOfUnit(unit);
    throw new RheoError("value", name, `"${excerpt(unit)}" is not a ${quantity} unit${other.length ? ` (it is a ${other.join("/")} unit)` : ""}; accepted: ${acceptedUnits(quantity).join(", ")}`, undefined, "UNKNOWN_UNIT");
  }
  const v = toSI(value, unit, quantity, name);
  const positive = spec.kind.type === "quantity" && spec.kind.positive;
  if (positive && !(v > 0)) throw new RheoError("domain", name, `must be greater than zero, got ${value}${unit === "1" ? "" : ` ${unit}`}`);
  return v;
}

/** Splits "a, b" or "k=v, k=v" text at commas outside parentheses. */
function splitList(text: string): string[] {
  const parts: string[] = [];
  let depth = 0;
  let cur = "";
  for (const ch of text) {
    if (ch === "(") depth++;
    if (ch === ")") depth--;
    if ((ch === "," || ch === ";") && depth === 0) {
      parts.push(cur);
      cur = "";
    } else cur += ch;
  }
  parts.push(cur);
  return parts.map((p) => p.trim()).filter((p) => p !== "");
}

const HEATING_PARTS: Readonly<Record<string, string>> = { density: "heatingDensity", cp: "heatingHeatCapacity", k: "heatingConductivity", b: "heatingTemperatureCoefficient" };

/** Expands a compound setting's text into the settings it fills. */
function expandSpec(key: string, text: string, name: string): Record<string, { part: string; text: string }> {
  const out: Record<string, { part: string; text: string }> = {};
  if (key === "heating") {
    for (const part of splitList(text)) {
      const m = /^([A-Za-z_]+)\s*=\s*(.+)$/.exec(part);
      const target = m ? HEATING_PARTS[(m[1] as string).toLowerCase()] : undefined;
      if (!m || !target) throw new RheoError("value", name, `expected key=value pairs with keys ${Object.keys(HEATING_PARTS).join(", ")}, got "${excerpt(part)}"`);
      if (out[target] !== undefined) throw new RheoError("value", name, `gives ${(m[1] as string).toLowerCase()}= twice`, undefined, "DUPLICATE_KEY");
      out[target] = { part: (m[1] as string).toLowerCase(), text: (m[2] as string).trim() };
    }
    return out;
  }
  // transducer: "full scale, accuracy"
  const parts = splitList(text);
  if (parts.length !== 2) throw new RheoError("value", name, `expected "full scale, accuracy", e.g. "1000 bar, 0.25 %", got "${excerpt(text)}"`);
  return { transducerFullScale: { part: "full scale", text: parts[0] as string }, transducerAccuracy: { part: "accuracy", text: parts[1] as string } };
}

/** The result of {@link collectReduceSettings}: the request, and every error found. */
export interface CollectedSettings {
  request: ReduceRequest;
  errors: RheoError[];
}

/**
 * Reads every setting and collects every error (the pane shows them all at once). Unknown keys,
 * a compound setting given together with one of its parts, and contradictions are errors too.
 * @param raw settings by key (blank values mean "not given")
 */
export function collectReduceSettings(raw: Readonly<Record<string, unknown>>, src: ReduceSettingsSource): CollectedSettings {
  const errors: RheoError[] = [];
  const values = new Map<string, unknown>();
  const nameOfKey = (key: string) => src.nameOf(reduceSetting(key));
  const attempt = (call: () => void) => {
    try {
      call();
    } catch (e) {
      if (e instanceof RheoError) errors.push(e);
      else throw e;
    }
  };
  const given: [string, unknown][] = Object.entries(raw).filter(([, v]) => !isBlank(v));
  const fromSpec = new Map<string, { parent: string; part: string }>();
  for (const [key, value] of given) {
    attempt(() => {
      const spec = BY_KEY.get(key);
      if (spec && spec.kind.type === "spec" && typeof value === "string" && !/^(true|false|yes|no|on|off)$/i.test(value.trim())) {
        for (const [target, { part, text }] of Object.entries(expandSpec(key, value, src.nameOf(spec)))) {
          fromSpec.set(target, { parent: key, part });
          values.set(target, text);
        }
        values.set(key, true);
      }
    });
  }
  const si = (() => {
    const v = raw.si;
    if (isBlank(v)) return false;
    try {
      return readSwitch(v, nameOfKey("si"));
    } catch {
      return false;
    }
  })();
  for (const [key, value] of given) {
    attempt(() => {
      const spec = reduceSetting(key);
      const name = src.nameOf(spec);
      if (fromSpec.has(key)) {
        throw new RheoError("value", name, `is given twice: alone and inside ${nameOfKey((fromSpec.get(key) as { parent: string }).parent)}`, undefined, "DUPLICATE_KEY");
      }
      if (spec.kind.type === "spec" && values.has(key)) return;
      values.set(key, readValue(spec, value, name, src, si));
    });
  }
  for (const [target, { parent, part }] of fromSpec) {
    attempt(() => {
      values.set(target, readValue(reduceSetting(target), values.get(target), `${nameOfKey(parent)} ${part}`, src, si));
    });
  }
  const failed = new Set(errors.map((e) => e.argument));
  const request = buildRequest(values, src, nameOfKey, errors, raw, (key) => failed.has(nameOfKey(key)));
  return { request, errors };
}

function readValue(spec: ReduceSettingSpec, value: unknown, name: string, src: ReduceSettingsSource, si: boolean): unknown {
  const k = spec.kind;
  switch (k.type) {
    case "switch":
    case "spec":
      return readSwitch(value, name);
    case "choice":
      return readChoice(value, name, k.choices);
    case "count": {
      const v = readNumberValue(value, name);
      if (!Number.isInteger(v) || v < k.min || v > k.max) throw new RheoError("value", name, `must be a whole number from ${k.min} to ${k.max}, got ${excerpt(String(value))}`);
      return v;
    }
    case "number": {
      const v = readNumberValue(value, name);
      if (k.positive && !(v > 0)) throw new RheoError("domain", name, `must be greater than zero, got ${v}`);
      return v;
    }
    case "quantity":
      return readQuantityValue(value, spec, k.quantity, name, src, si);
    case "model":
      return readModelId(String(value), name);
    case "models": {
      const list = Array.isArray(value) ? value.map(String) : splitList(String(value));
      if (list.length === 0) throw new RheoError("missing", name, "names no model");
      return list.map((id) => readModelId(id, name));
    }
    case "text":
      return String(value).trim();
  }
}

function buildRequest(
  v: Map<string, unknown>,
  src: ReduceSettingsSource,
  nameOfKey: (key: string) => string,
  errors: RheoError[],
  raw: Readonly<Record<string, unknown>>,
  alreadyFailed: (key: string) => boolean,
): ReduceRequest {
  const o: Partial<ReduceOptions> = {};
  const input: ReduceRequest["input"] = {};
  const fits: FitRequest = {};
  const steps: Partial<StepOptions> = {};
  const fail = (e: RheoError) => errors.push(e);
  const get = <T>(key: string) => v.get(key) as T | undefined;
  for (const key of STEP_SETTING_KEYS) {
    const value = get<StepOptions[typeof key]>(key);
    if (value !== undefined) (steps as Record<string, unknown>)[key] = value;
  }
  if ((steps.compressibility === undefined) !== (steps.meltVolume === undefined)) {
    const missing = steps.compressibility === undefined ? "compressibility" : "meltVolume";
    if (!alreadyFailed(missing)) fail(new RheoError("missing", nameOfKey(missing), `is needed with ${nameOfKey(missing === "compressibility" ? "meltVolume" : "compressibility")}: the time constant τ = β·V·ΔP/Q takes both`));
  }
  if (steps.speedTolerance !== undefined && !(steps.speedTolerance < 1)) fail(new RheoError("domain", nameOfKey("speedTolerance"), `must be below 100 %, got ${steps.speedTolerance * 100} %`));
  const end = get<ReduceOptions["endCorrection"]>("endCorrection");
  if (end !== undefined) o.endCorrection = end;
  if (get<boolean>("orifice")) {
    if (end !== undefined && end !== "orifice") fail(new RheoError("value", nameOfKey("orifice"), `contradicts ${nameOfKey("endCorrection")} ${end}`));
    else o.endCorrection = "orifice";
  }
  const maxLd = get<number>("orificeMaxLengthOverDiameter");
  if (maxLd !== undefined) o.orifice = { maxLengthOverDiameter: maxLd };
  const rab: NonNullable<ReduceOptions["rabinowitsch"]> = {};
  const method = get<RabinowitschMethod>("rabinowitschMethod");
  const degree = get<number>("rabinowitschDegree");
  const window = get<number>("rabinowitschWindow");
  if (method !== undefined) rab.method = method;
  if (degree !== undefined) rab.degree = degree;
  if (window !== undefined) rab.window = window;
  const m = method ?? DEFAULT_RABINOWITSCH_OPTIONS.method;
  const maxDegree = m === "global" ? 3 : 2;
  if (degree !== undefined && degree > maxDegree) fail(new RheoError("value", nameOfKey("rabinowitschDegree"), `must be a whole number from 1 to ${maxDegree} for the ${m} method, got ${degree}`));
  if (window !== undefined && window % 2 === 0) fail(new RheoError("value", nameOfKey("rabinowitschWindow"), `must be an odd whole number of at least 3 (the point and its neighbours on each side), got ${window}`));
  if (m === "local" && window !== undefined && window < (degree ?? DEFAULT_RABINOWITSCH_OPTIONS.degree) + 2) {
    fail(new RheoError("value", nameOfKey("rabinowitschWindow"), `must hold at least degree + 2 = ${(degree ?? DEFAULT_RABINOWITSCH_OPTIONS.degree) + 2} points so the local fit is smoothed, got ${window}`));
  }
  o.rabinowitsch = rab;
  const stability = get<number>("stabilityThreshold");
  if (stability !== undefined) {
    if (!(stability < 1)) fail(new RheoError("domain", nameOfKey("stabilityThreshold"), `must be below 100 %, got ${stability * 100} %`));
    else o.repeats = { stabilityThreshold: stability };
  }
  if (get<boolean>("slitEdgeCorrection")) o.slitEdgeCorrection = true;
  const barrel = get<number>("barrelDiameter");
  if (barrel !== undefined) input.barrelDiameter = barrel;
  const density = get<number>("density");
  if (density !== undefined) input.density = density;
  const tolerance = get<number>("temperatureTolerance");
  if (tolerance !== undefined) {
    if (!(tolerance >= 0)) fail(new RheoError("domain", nameOfKey("temperatureTolerance"), `must not be negative, got ${tolerance} K`));
    else o.temperatureTolerance = tolerance;
  }
  for (const [key, option] of [["slip", "slip"], ["representativeRate", "representativeRate"], ["extensional", "extensional"], ["pressureDependence", "pressureDependence"]] as const) {
    if (get<boolean>(key)) o[option] = true;
  }
  const cogswellRate = get<"apparent" | "wall">("cogswellShearRate");
  if (cogswellRate !== undefined) {
    if (!get<boolean>("extensional")) fail(new RheoError("value", nameOfKey("cogswellShearRate"), `sets the shear rate of the extensional analysis; give ${nameOfKey("extensional")} too`));
    else o.extensional = { shearRate: cogswellRate };
  }
  // tolerances of the uncertainty budget (half-widths, zero or more)
  const budget: NonNullable<ReduceOptions["uncertainty"]> = {};
  for (const [key, option] of [
    ["transducerZeroOffset", "zeroOffset"],
    ["transducerGainError", "gainError"],
    ["dieBoreTolerance", "dieBoreTolerance"],
    ["dieLengthTolerance", "dieLengthTolerance"],
    ["meltTemperatureTolerance", "meltTemperatureTolerance"],
    ["pistonSpeedTolerance", "pistonSpeedTolerance"],
  ] as const) {
    const value = get<number>(key);
    if (value === undefined) continue;
    if (!(value >= 0)) fail(new RheoError("domain", nameOfKey(key), `is a tolerance (±) and must be zero or more, got ${value}`));
    else budget[option] = value;
  }
  if (Object.keys(budget).length > 0) o.uncertainty = budget;
  const fullScale = get<number>("transducerFullScale");
  const accuracy = get<number>("transducerAccuracy");
  // the full scale switches the transducer check on; an accuracy alone (a form's default) is not used
  if (get<boolean>("transducer") !== false && (fullScale !== undefined || get<boolean>("transducer"))) {
    if (fullScale === undefined) fail(new RheoError("missing", nameOfKey("transducerFullScale"), 'is needed for the transducer check, e.g. "700 bar"'));
    else if (accuracy === undefined) fail(new RheoError("missing", nameOfKey("transducerAccuracy"), 'is needed with the transducer full scale, e.g. "0.25 %"'));
    else if (!(accuracy < 1)) fail(new RheoError("domain", nameOfKey("transducerAccuracy"), `must be below 100 % of full scale, got ${accuracy * 100} %`));
    else o.transducer = { fullScale, accuracy };
  }
  if (get<boolean>("heating")) {
    const d = get<number>("heatingDensity");
    const cp = get<number>("heatingHeatCapacity");
    const k = get<number>("heatingConductivity");
    const b = get<number>("heatingTemperatureCoefficient");
    const missing = [
      [d, "heatingDensity", "density", '"0.76 g/cm3"'],
      [cp, "heatingHeatCapacity", "cp", '"2.1 kJ/(kg.K)"'],
      [k, "heatingConductivity", "k", '"0.18 W/(m.K)"'],
    ].filter(([value, key]) => value === undefined && !alreadyFailed(key as string));
    for (const [, key, part, example] of missing) {
      const fromText = typeof raw.heating === "string" && !/^(true|false|yes|no|on|off)$/i.test(raw.heating.trim());
      fail(new RheoError("missing", fromText ? nameOfKey("heating") : nameOfKey(key as string), fromText ? `needs ${part}= , e.g. ${part}=${(example as string).slice(1, -1)}` : `is needed for the heating check, e.g. ${example}`));
    }
    if (d !== undefined && cp !== undefined && k !== undefined) {
      o.heating = { density: d as number, heatCapacity: cp as number, conductivity: k as number };
      if (b !== undefined) o.heating.temperatureCoefficient = b;
    }
  }
  const mfr = get<string>("meltFlowRate");
  if (mfr !== undefined) {
    try {
      o.meltFlowRate = readMeltFlow(mfr, nameOfKey("meltFlowRate"), density, nameOfKey("density"), src);
    } catch (e) {
      if (e instanceof RheoError) fail(e);
      else throw e;
    }
  }
  const model = get<ModelId>("model");
  let master = get<MasterModel>("master");
  if (model !== undefined) {
    if (model === "cross-wlf") {
      // Cross-WLF carries its own temperature law: --model cross-wlf is its fit across temperatures.
      if (master !== undefined && master !== "cross-wlf") fail(new RheoError("value", nameOfKey("model"), `cross-wlf is fitted across temperatures, and ${nameOfKey("master")} asks for ${master}; give one of them`));
      else master = "cross-wlf";
    } else if (getModel(model).needsTemperature) fail(new RheoError("value", nameOfKey("model"), `${model} needs a temperature per point; fit each group with an isothermal model, or use a temperature shift`));
    else fits.model = model;
  }
  const compare = get<ModelId[]>("compare");
  if (compare !== undefined) fits.compare = compare;
  const shift = get<string>("shift");
  const tref = get<number>("referenceTemperature");
  const tg = get<number>("glassTransitionTemperature");
  const vertical = get<number>("verticalShift");
  if (shift !== undefined && shift !== "none") {
    if (tref === undefined && src.requireReferenceTemperature) fail(new RheoError("missing", nameOfKey("referenceTemperature"), `is required with ${nameOfKey("shift")}, e.g. "210 C"`));
    else {
      fits.shift = { law: shift as "arrhenius" | "wlf", referenceTemperature: tref ?? null };
      if (tg !== undefined) {
        if (shift !== "wlf") fail(new RheoError("value", nameOfKey("glassTransitionTemperature"), `is used by the WLF shift only; give ${nameOfKey("shift")} wlf, or leave it out`));
        else fits.shift.glassTransitionTemperature = tg;
      }
      if (vertical !== undefined) {
        if (!(vertical >= 0)) fail(new RheoError("domain", nameOfKey("verticalShift"), `is the melt's volumetric expansion coefficient and must be zero or more, got ${vertical}`));
        else fits.shift.verticalShift = { thermalExpansion: vertical };
      }
    }
  } else {
    if (tref !== undefined && src.requireReferenceTemperature) {
      fail(new RheoError("value", nameOfKey("referenceTemperature"), `is the reference temperature of ${nameOfKey("shift")}; give ${nameOfKey("shift")} arrhenius or wlf too${master === "cross-wlf" ? ` (Cross-WLF's own reference temperature is D2: ${nameOfKey("crossWlfD2")})` : ""}`));
    }
    for (const key of ["glassTransitionTemperature", "verticalShift"] as const) {
      if (get<number>(key) !== undefined && src.requireReferenceTemperature) fail(new RheoError("value", nameOfKey(key), `belongs to the temperature shift; give ${nameOfKey("shift")} too`));
    }
  }
  const material = get<MaterialClass>("material");
  if (material !== undefined) fits.material = material;
  const d2 = get<number>("crossWlfD2");
  if (d2 !== undefined && master !== "cross-wlf") fail(new RheoError("value", nameOfKey("crossWlfD2"), `is Cross-WLF's D2 (T*); it goes with ${nameOfKey("master")} cross-wlf`));
  if (master === "cross-wlf") fits.master = { model: master, law: null, referenceTemperature: null, ...(d2 !== undefined ? { D2: d2 } : {}) };
  else if (master !== undefined) {
    if (shift === undefined || shift === "none") {
      fail(new RheoError("missing", nameOfKey("shift"), `is the temperature law of ${nameOfKey("master")} ${master}: arrhenius or wlf (only cross-wlf carries its own)`));
    } else fits.master = { model: master, law: shift as "arrhenius" | "wlf", referenceTemperature: tref ?? null };
  }
  const rotational = get<string>("rotational");
  if (rotational !== undefined) input.rotational = rotational;
  return { options: o, input, fits, steps };
}

/** Reads "12 g/10min, 2.16 kg" (MFR: needs a density) or "16 cm3/10min, 2.16 kg" (MVR). */
function readMeltFlow(text: string, name: string, density: number | undefined, densityName: string, src: ReduceSettingsSource): NonNullable<ReduceOptions["meltFlowRate"]> {
  const parts = splitList(text);
  if (parts.length !== 2) throw new RheoError("value", name, `expected "value unit, load", e.g. "12 g/10min, 2.16 kg", got "${excerpt(text)}"`);
  const rate = readQuantityText(parts[0] as string, name);
  const loadText = readQuantityText(parts[1] as string, `${name} load`);
  const loadUnit = loadText.unit === "" ? (src.bareNumbersInDisplayUnits ? "kg" : "") : loadText.unit;
  if (loadUnit === "") throw new RheoError("value", `${name} load`, `needs a unit, e.g. "${loadText.value} kg"`, undefined, "UNIT_REQUIRED");
  const load = toSI(loadText.value, loadUnit, "mass", `${name} load`);
  if (isUnitOf("volumetricFlow", rate.unit)) return { volumeRate: toSI(rate.value, rate.unit, "volumetricFlow", name), load };
  if (isUnitOf("massRate", rate.unit)) {
    if (density === undefined) throw new RheoError("missing", densityName, `an MFR in mass per time needs the melt density: add ${densityName}, e.g. "0.76 g/cm3"`);
    return { massRate: toSI(rate.value, rate.unit, "massRate", name), density, load };
  }
  const known = quantitiesOfUnit(rate.unit);
  throw new RheoError("value", name, `"${excerpt(rate.unit)}" is not a mass rate (g/10min) or volume rate (cm3/10min) unit${known.length ? ` (it is a ${known.join("/")} unit)` : ""}`);
}

/**
 * Reads the settings (see {@link collectReduceSettings}) and throws the first error.
 * @throws RheoError naming the setting as the surface calls it
 * @example readReduceSettings({ endCorrection: "bagley", transducer: "700 bar, 0.25 %" }, CLI_SETTINGS_SOURCE).options.transducer
 *   // { fullScale: 7e7, accuracy: 0.0025 }
 */
export function readReduceSettings(raw: Readonly<Record<string, unknown>>, src: ReduceSettingsSource): ReduceRequest {
  const { request, errors } = collectReduceSettings(raw, src);
  if (errors[0]) throw errors[0];
  return request;
}

/** The defaults a surface shows before the user changes anything (display units), by key. */
export const REDUCE_SETTING_DEFAULTS: Readonly<Record<string, string | boolean>> = Object.freeze({
  endCorrection: DEFAULT_REDUCE_OPTIONS.endCorrection,
  rabinowitschMethod: DEFAULT_RABINOWITSCH_OPTIONS.method,
  rabinowitschDegree: String(DEFAULT_RABINOWITSCH_OPTIONS.degree),
  rabinowitschWindow: String(DEFAULT_RABINOWITSCH_OPTIONS.window),
  orificeMaxLengthOverDiameter: String(DEFAULT_ORIFICE_OPTIONS.maxLengthOverDiameter),
  stabilityThreshold: String(DEFAULT_REPEAT_OPTIONS.stabilityThreshold * 100),
  transducerAccuracy: "0.25",
  shift: "none",
});
