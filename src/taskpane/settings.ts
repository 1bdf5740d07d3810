/**
 * The pane's reduction settings: the form's state with its defaults, read through the one reader
 * of reduce settings (src/io/reduceOptions.ts) under the same keys as the command line and
 * RHEO.REDUCE, so validation, units and the request for the core are the shared ones. Labels and
 * help come from src/io/reduceSettingWords.ts. Pure: no DOM, no Office.
 */
import { DEFAULT_RABINOWITSCH_OPTIONS, RabinowitschMethod } from "../core/rabinowitsch";
import { DEFAULT_REDUCE_OPTIONS, ReduceOptions } from "../core/reduce";
import { MODEL_REGISTRY, type ModelId } from "../core/models";
import { DEFAULT_UNCERTAINTY_OPTIONS } from "../core/uncertainty";
import { defaultModels, type MaterialClass } from "../core/flowCurveFits";
import { MASTER_MODELS, type MasterModel } from "../core/temperature/masterFit";
import { REDUCE_SETTING_DEFAULTS, collectReduceSettings, reduceSetting, type ReduceRequest, type ReduceSettingSpec, type ReduceSettingsSource } from "../io/reduceOptions";
import { REDUCE_SETTING_WORDS, type ReduceSettingWords } from "../io/reduceSettingWords";
import { detailOf, sentence } from "./panelContract";
import { modelName } from "../io/displayNames";

/** Every setting of one run. Numbers in the units the pane shows (bar for the transducer). */
export interface PaneSettings {
  /** "bagley": end correction over die lengths; "orifice": minus an orifice die's pressure; "none": the longest die as measured */
  endCorrection: ReduceOptions["endCorrection"];
  rabinowitschMethod: RabinowitschMethod;
  /** polynomial degree for the local (1–2) and global (1–3) methods */
  rabinowitschDegree: number;
  /** points per local fit (odd, ≥ 3) */
  rabinowitschWindow: number;
  /** viscosity models fitted to every flow curve, ranked by AIC */
  models: ModelId[];
  /** full-scale range of the pressure transducer in bar, or null when not given */
  transducerRangeBar: number | null;
  /** transducer accuracy in % of full scale (used with the range: ± columns and range checks) */
  transducerAccuracyPercent: number | null;
  /** Schümmer representative-rate viscosity beside the Rabinowitsch result */
  representativeRate: boolean;
  /** Mooney wall-slip analysis (needs two or more die bores at one temperature) */
  slip: boolean;
  /** Cogswell extensional viscosity from the entrance pressure */
  extensional: boolean;
  /** curvature of the Bagley lines: pressure coefficient of viscosity (three or more dies) */
  pressureDependence: boolean;
  /** viscous-heating estimate; the material data below are used only when this is on */
  heating: boolean;
  /** melt density in g/cm³ */
  heatingDensity: number | null;
  /** specific heat in kJ/(kg·K) */
  heatingHeatCapacity: number | null;
  /** thermal conductivity in W/(m·K) */
  heatingConductivity: number | null;
  /** b = −d ln η/dT in 1/K, or null: fitted across the temperatures of the data */
  heatingTemperatureCoefficient: number | null;
  /** temperature shift of the flow curves measured at several temperatures */
  temperatureShift: "none" | "arrhenius" | "wlf";
  /** reference temperature in °C, or null: the middle temperature of the data */
  referenceTemperatureC: number | null;
  /** the model drawn over each group's points on the viscosity chart: "best" (lowest AIC) or one of `models` */
  chartModel: "best" | ModelId;
  /** melt (no yield stress, η∞ held at 0) or paste; the default list of `models` follows it */
  material: MaterialClass;
  /** the fit across temperatures ("none": not asked for); with the temperature shift's law and reference temperature */
  masterModel: "none" | MasterModel;
  /** Cross-WLF's D2 (T*) in °C to hold, or null: fitted */
  crossWlfD2C: number | null;
  /**
   * where the rotational curve to join is: a range or table name in Excel, the demo curve's label
   * in preview mode; null when none is joined
   */
  rotational: string | null;
  /** WLF only: glass transition temperature in °C (the universal C2 when the data cannot fit it), or null */
  glassTransitionTemperatureC: number | null;
  /** with a temperature shift: the melt's volumetric expansion coefficient in 1/K for the vertical shift, or null: none */
  verticalShiftPerK: number | null;
  /** slit dies: the finite-width (edge) correction of the true wall rate */
  slitEdgeCorrection: boolean;
  /** repeated speeds: largest change of pressure, in %, before a repeat counts as drifted; null: the core's default */
  stabilityThresholdPercent: number | null;
}

/** Models the pane offers: every isothermal model of the registry (Cross-WLF needs T per point). */
export const PANE_MODELS: readonly ModelId[] = (Object.keys(MODEL_REGISTRY) as ModelId[]).filter(
  (id) => !MODEL_REGISTRY[id].needsTemperature,
);

/** The models the pane fits by default for a material class: the core's default list (isothermal models only). */
export function paneDefaultModels(material: MaterialClass): ModelId[] {
  return defaultModels(material).filter((m) => PANE_MODELS.includes(m));
}

/** The choices of "Fit across temperatures": none, then the core's models of the fit across temperatures. */
export const PANE_MASTER_MODELS: readonly ("none" | MasterModel)[] = Object.freeze(["none", ...MASTER_MODELS]);

/** Defaults of {@link PaneSettings}; the core's own defaults where the core has one. */
export const DEFAULT_PANE_SETTINGS: Readonly<PaneSettings> = Object.freeze({
  endCorrection: DEFAULT_REDUCE_OPTIONS.endCorrection,
  rabinowitschMethod: DEFAULT_RABINOWITSCH_OPTIONS.method,
  rabinowitschDegree: DEFAULT_RABINOWITSCH_OPTIONS.degree,
  rabinowitschWindow: DEFAULT_RABINOWITSCH_OPTIONS.window,
  models: paneDefaultModels("melt"),
  transducerRangeBar: null,
  transducerAccuracyPercent: 0.25,
  representativeRate: false,
  slip: false,
  extensional: false,
  pressureDependence: false,
  heating: false,
  heatingDensity: null,
  heatingHeatCapacity: null,
  heatingConductivity: null,
  heatingTemperatureCoefficient: null,
  temperatureShift: "none",
  referenceTemperatureC: null,
  chartModel: "best",
  material: "melt",
  masterModel: "none",
  crossWlfD2C: null,
  rotational: null,
  glassTransitionTemperatureC: null,
  verticalShiftPerK: null,
  slitEdgeCorrection: false,
  stabilityThresholdPercent: null,
});

/** The fields of the pane a message can be shown next to. */
export type FieldId =
  | "source"
  | "columns"
  | "dies"
  | "endCorrection"
  | "rabinowitschMethod"
  | "rabinowitschDegree"
  | "rabinowitschWindow"
  | "models"
  | "transducerRangeBar"
  | "transducerAccuracyPercent"
  | "checks"
  | "heatingDensity"
  | "heatingHeatCapacity"
  | "heatingConductivity"
  | "heatingTemperatureCoefficient"
  | "temperatureShift"
  | "referenceTemperatureC"
  | "slip"
  | "chartModel"
  | "material"
  | "masterModel"
  | "crossWlfD2C"
  | "rotational"
  | "glassTransitionTemperatureC"
  | "verticalShiftPerK"
  | "slitEdgeCorrection"
  | "stabilityThresholdPercent"
  | "run";

/** The reduce setting key (src/io/reduceOptions.ts) behind each pane field that reads one. */
export const SETTING_KEY_OF_FIELD = Object.freeze({
  endCorrection: "endCorrection",
  rabinowitschMethod: "rabinowitschMethod",
  rabinowitschDegree: "rabinowitschDegree",
  rabinowitschWindow: "rabinowitschWindow",
  models: "compare",
  transducerRangeBar: "transducerFullScale",
  transducerAccuracyPercent: "transducerAccuracy",
  representativeRate: "representativeRate",
  slip: "slip",
  extensional: "extensional",
  pressureDependence: "pressureDependence",
  heating: "heating",
  heatingDensity: "heatingDensity",
  heatingHeatCapacity: "heatingHeatCapacity",
  heatingConductivity: "heatingConductivity",
  heatingTemperatureCoefficient: "heatingTemperatureCoefficient",
  temperatureShift: "shift",
  referenceTemperatureC: "referenceTemperature",
  material: "material",
  masterModel: "master",
  crossWlfD2C: "crossWlfD2",
  rotational: "rotational",
  glassTransitionTemperatureC: "glassTransitionTemperature",
  verticalShiftPerK: "verticalShift",
  slitEdgeCorrection: "slitEdgeCorrection",
  stabilityThresholdPercent: "stabilityThreshold",
} as const satisfies Partial<Record<keyof PaneSettings, string>>);

/** The pane field of a reduce setting key (the reverse of {@link SETTING_KEY_OF_FIELD}). */
export const FIELD_OF_SETTING_KEY: Readonly<Record<string, FieldId>> = Object.freeze(
  Object.fromEntries(Object.entries(SETTING_KEY_OF_FIELD).map(([field, key]) => [key, field === "representativeRate" || field === "extensional" || field === "pressureDependence" || field === "heating" ? "checks" : field])) as Record<string, FieldId>,
);

const words = (key: string) => REDUCE_SETTING_WORDS[key] as ReduceSettingWords;
const help = (key: string) => sentence(words(key).help);
const choices = <K extends string>(key: string) => (words(key).choiceHelp ?? {}) as Readonly<Record<K, string>>;

/** One-line explanation of each choice, shown under its control (the shared words of each setting). */
export const SETTING_HELP = {
  endCorrection: choices<"bagley" | "orifice" | "none">("endCorrection"),
  rabinowitschMethod: choices<RabinowitschMethod>("rabinowitschMethod"),
  rabinowitschDegree: help("rabinowitschDegree"),
  rabinowitschWindow: help("rabinowitschWindow"),
  models: "Viscosity models fitted to each corrected flow curve; they are ranked by AIC (lower is better).",
  transducerRangeBar: help("transducerFullScale"),
  transducerAccuracyPercent: help("transducerAccuracy"),
  representativeRate: help("representativeRate"),
  slip: help("slip"),
  extensional: help("extensional"),
  pressureDependence: help("pressureDependence"),
  // the shared help gives the command line's compound syntax; the pane has a field per input
  heating: "Adiabatic temperature rise and Nahme number in the die, from the melt's density, specific heat and conductivity.",
  heatingDensity: help("heatingDensity"),
  heatingHeatCapacity: help("heatingHeatCapacity"),
  heatingConductivity: help("heatingConductivity"),
  heatingTemperatureCoefficient: help("heatingTemperatureCoefficient"),
  temperatureShift: choices<"none" | "arrhenius" | "wlf">("shift"),
  referenceTemperatureC: help("referenceTemperature"),
  chartModel: "The model drawn through each group's points on the viscosity chart: the recommended one (lowest AIC among those the data determine) or one you choose. The sheet lists every fitted model.",
  material: choices<MaterialClass>("material"),
  masterModel: { none: "No fit across temperatures: each temperature is fitted on its own.", ...choices<MasterModel>("master") } as Readonly<Record<"none" | MasterModel, string>>,
  crossWlfD2C: help("crossWlfD2"),
  // the shared help speaks of a CSV file; the pane reads a range or table
  rotational:
    "A range or table holding a rotational-rheometer curve at one of the test temperatures: angular_frequency [rad/s] with complex_viscosity [Pa.s] (joined by the Cox–Merz rule), or shear_rate [1/s] with viscosity [Pa.s]; optionally temperature [C]. It is joined to the capillary curve of its temperature and the joined curve is fitted.",
  glassTransitionTemperatureC: help("glassTransitionTemperature"),
  verticalShiftPerK: help("verticalShift"),
  slitEdgeCorrection: help("slitEdgeCorrection"),
  stabilityThresholdPercent: help("stabilityThreshold"),
} as const;

/**
 * The label of a pane field that reads one reduce setting: the shared plain label
 * (src/io/reduceSettingWords.ts) with the unit a bare number is read in, e.g.
 * "Glass transition temperature [°C]".
 */
export function settingLabel(field: keyof typeof SETTING_KEY_OF_FIELD): string {
  const key = SETTING_KEY_OF_FIELD[field];
  const unit = reduceSetting(key).unit;
  return unit ? `${words(key).label} [${unit}]` : words(key).label;
}

/**
 * How the pane gives its values to the shared reader: by key, bare numbers in the display units,
 * the reference temperature optional; messages name a setting by its label in quotes
 * ("“Temperature shift”"), the words on screen, never by its key.
 */
export const PANE_SETTINGS_SOURCE: ReduceSettingsSource = Object.freeze({
  nameOf: (spec: ReduceSettingSpec) => `“${words(spec.key).label}”`,
  bareNumbersInDisplayUnits: true,
  requireReferenceTemperature: false,
});

/** The setting key of a name {@link PANE_SETTINGS_SOURCE} gives (a compound part: "“Viscous heating” density" → heating). */
function keyOfPaneName(name: string): string {
  for (const [key, w] of Object.entries(REDUCE_SETTING_WORDS)) {
    const quoted = `“${w.label}”`;
    if (name === quoted || name.startsWith(`${quoted} `)) return key;
  }
  return name;
}

/** A message meant for one field of the pane. */
export interface FieldError {
  field: FieldId;
  message: string;
}

/**
 * The form's values under the reduce setting keys, as the shared reader takes them (bare numbers
 * in the settings' display units). Settings the form does not use now are left out: the degree
 * and window unless the method takes them, the transducer accuracy without a full scale, the
 * heating inputs with heating off, the reference temperature without a shift.
 */
export function settingsRecord(s: PaneSettings): Record<string, unknown> {
  const r: Record<string, unknown> = { endCorrection: s.endCorrection, rabinowitschMethod: s.rabinowitschMethod };
  if (usesDegree(s.rabinowitschMethod)) r.rabinowitschDegree = s.rabinowitschDegree;
  if (s.rabinowitschMethod === "local") r.rabinowitschWindow = s.rabinowitschWindow;
  if (s.models.length > 0) r.compare = s.models.join(",");
  if (s.transducerRangeBar !== null) {
    r.transducerFullScale = s.transducerRangeBar;
    // a blank accuracy is a missing value the reader names; the display unit of a bare number is %
    r.transducerAccuracy = s.transducerAccuracyPercent ?? "";
  }
  for (const k of ["representativeRate", "slip", "extensional", "pressureDependence"] as const) if (s[k]) r[k] = true;
  if (s.heating) {
    r.heating = true;
    for (const k of ["heatingDensity", "heatingHeatCapacity", "heatingConductivity", "heatingTemperatureCoefficient"] as const) if (s[k] !== null) r[k] = s[k];
  }
  if (s.temperatureShift !== "none") {
    r.shift = s.temperatureShift;
    if (s.referenceTemperatureC !== null) r.referenceTemperature = s.referenceTemperatureC;
    if (s.temperatureShift === "wlf" && s.glassTransitionTemperatureC !== null) r.glassTransitionTemperature = s.glassTransitionTemperatureC;
    if (s.verticalShiftPerK !== null) r.verticalShift = s.verticalShiftPerK;
  }
  r.material = s.material;
  if (s.masterModel !== "none") {
    r.master = s.masterModel;
    if (s.masterModel === "cross-wlf" && s.crossWlfD2C !== null) r.crossWlfD2 = s.crossWlfD2C;
  }
  if (s.slitEdgeCorrection) r.slitEdgeCorrection = true;
  if (s.stabilityThresholdPercent !== null) r.stabilityThreshold = s.stabilityThresholdPercent;
  if (s.rotational !== null && s.rotational.trim() !== "") r.rotational = s.rotational;
  return r;
}

/** The number fields of the form: a text that is not a number is reported at its field before the shared reader runs. */
const NUMBER_FIELDS = [
  "rabinowitschDegree",
  "rabinowitschWindow",
  "transducerRangeBar",
  "transducerAccuracyPercent",
  "heatingDensity",
  "heatingHeatCapacity",
  "heatingConductivity",
  "heatingTemperatureCoefficient",
  "referenceTemperatureC",
  "crossWlfD2C",
  "glassTransitionTemperatureC",
  "verticalShiftPerK",
  "stabilityThresholdPercent",
] as const;

/**
 * Reads the settings through the shared reader and checks what only the pane has (the chart's
 * model); returns the request for the core and every problem, each for its field, all at once.
 */
export function readPaneSettings(s: PaneSettings): { request: ReduceRequest; problems: FieldError[] } {
  const problems: FieldError[] = [];
  for (const k of NUMBER_FIELDS) {
    if (typeof s[k] === "number" && Number.isNaN(s[k])) problems.push({ field: k, message: "Give a number (a decimal point or comma), or leave it empty." });
  }
  const bad = new Set(problems.map((p) => SETTING_KEY_OF_FIELD[p.field as keyof typeof SETTING_KEY_OF_FIELD] as string));
  const record = Object.fromEntries(Object.entries(settingsRecord(s)).filter(([k]) => !bad.has(k)));
  const { request, errors } = collectReduceSettings(record, PANE_SETTINGS_SOURCE);
  const typedBadly = new Set(problems.map((p) => p.field));
  for (const e of errors) {
    // the reader names a setting by its label in quotes; the key behind the label gives the field
    const field = FIELD_OF_SETTING_KEY[keyOfPaneName(e.argument)] ?? "run";
    if (typedBadly.has(field)) continue; // "not a number" already says it; the reader saw the field as empty
    problems.push({ field, message: field === "run" ? sentence(e.message) : detailOf(e) });
  }
  if (s.heating) {
    for (const k of ["heatingDensity", "heatingHeatCapacity", "heatingConductivity"] as const) {
      if (s[k] === null && !problems.some((p) => p.field === k)) problems.push({ field: k, message: `The heating check needs the ${words(SETTING_KEY_OF_FIELD[k]).label.toLowerCase()}.` });
    }
  }
  if (s.chartModel !== "best" && !s.models.includes(s.chartModel)) {
    problems.push({ field: "chartModel", message: `${modelName(s.chartModel)} is not among the models to fit: tick it there, or chart the recommended model.` });
  }
  return { request, problems };
}

/** Every problem of the settings, each for its field (empty when all is well). */
export function validateSettings(s: PaneSettings): FieldError[] {
  return readPaneSettings(s).problems;
}

/** True when the slope method takes a polynomial degree. */
export function usesDegree(method: RabinowitschMethod): boolean {
  return method === "local" || method === "global";
}

/**
 * Reads a number field as typed: "" → null; a number (a decimal comma accepted) → the number;
 * anything else → NaN, which {@link validateSettings} reports.
 */
export function parseNumberField(text: string): number | null {
  const t = text.trim();
  if (t === "") return null;
  if (!/^[-+]?(\d+[.,]?\d*|[.,]\d+)([eE][-+]?\d+)?$/.test(t)) return NaN;
  return Number(t.replace(",", "."));
}

/** Every setting as (label, value) lines for the method record. */
export function describeSettings(s: PaneSettings): [string, string][] {
  return [
    ["End correction", s.endCorrection === "bagley" ? "Bagley (pressure vs L/R per rate)" : s.endCorrection === "orifice" ? "orifice die (longest die minus the orifice die's pressure)" : "none (longest die as measured)"],
    ["Rabinowitsch slope method", s.rabinowitschMethod],
    ["Rabinowitsch polynomial degree", usesDegree(s.rabinowitschMethod) ? String(s.rabinowitschDegree) : "not used by this method"],
    ["Rabinowitsch local window (points)", s.rabinowitschMethod === "local" ? String(s.rabinowitschWindow) : "not used by this method"],
    ["Models fitted", s.models.length > 0 ? s.models.map(modelName).join(", ") : "none"],
    ["Transducer full scale", s.transducerRangeBar === null ? "not given" : `${s.transducerRangeBar} bar`],
    ["Transducer accuracy", s.transducerRangeBar === null ? "not used (no full scale given)" : `${s.transducerAccuracyPercent} % of full scale (± columns with k = ${DEFAULT_UNCERTAINTY_OPTIONS.coverageFactor})`],
    ["Schümmer cross-check", onOff(s.representativeRate)],
    ["Wall slip (Mooney)", onOff(s.slip)],
    ["Extensional viscosity (Cogswell)", onOff(s.extensional)],
    ["Pressure dependence (curved Bagley lines)", onOff(s.pressureDependence)],
    [
      "Viscous heating",
      s.heating
        ? `on: density ${s.heatingDensity} g/cm³, specific heat ${s.heatingHeatCapacity} kJ/(kg·K), conductivity ${s.heatingConductivity} W/(m·K), b ${s.heatingTemperatureCoefficient === null ? "fitted across temperatures" : `${s.heatingTemperatureCoefficient} 1/K`}`
        : "off",
    ],
    ["Temperature shift", s.temperatureShift === "none" ? "none" : s.temperatureShift === "arrhenius" ? "Arrhenius" : "WLF"],
    ["Reference temperature", s.temperatureShift === "none" ? "not used" : s.referenceTemperatureC === null ? "middle temperature of the data" : `${s.referenceTemperatureC} °C`],
    ["Viscosity chart", s.chartModel === "best" ? "recommended model per group (lowest AIC among well-determined fits)" : `${modelName(s.chartModel)} for every group`],
    [words("material").label, s.material],
    [words("glassTransitionTemperature").label, s.temperatureShift !== "wlf" ? "not used (WLF shift only)" : s.glassTransitionTemperatureC === null ? "not given (C2 fitted)" : `${s.glassTransitionTemperatureC} °C`],
    [words("verticalShift").label, s.temperatureShift === "none" ? "not used (no temperature shift)" : s.verticalShiftPerK === null ? "off" : `${s.verticalShiftPerK} 1/K`],
    [
      words("master").label,
      s.masterModel === "none"
        ? "none"
        : s.masterModel === "cross-wlf"
          ? `Cross-WLF (its own WLF law); D2 ${s.crossWlfD2C === null ? "fitted" : `${s.crossWlfD2C} °C`}`
          : `${modelName(s.masterModel)} × ${s.temperatureShift === "arrhenius" ? "Arrhenius" : s.temperatureShift === "wlf" ? "WLF" : "no law given"}`,
    ],
    [words("rotational").label, s.rotational ?? "none"],
    [words("slitEdgeCorrection").label, onOff(s.slitEdgeCorrection)],
    [words("stabilityThreshold").label, s.stabilityThresholdPercent === null ? `default (${REDUCE_SETTING_DEFAULTS.stabilityThreshold} %)` : `${s.stabilityThresholdPercent} %`],
  ];
}

function onOff(v: boolean): string {
  return v ? "on" : "off";
}
