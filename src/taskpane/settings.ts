/**
 * The pane's reduction settings: one record with its defaults defined once, a one-line
 * explanation of every choice (shown beside the control), strict validation that names the field
 * at fault, and the translation into the core's options. Pure: no DOM, no Office.
 */
import { DEFAULT_RABINOWITSCH_OPTIONS, RabinowitschMethod } from "../core/rabinowitsch";
import { DEFAULT_REDUCE_OPTIONS, ReduceOptions } from "../core/reduce";
import { MODEL_REGISTRY, type ModelId } from "../core/models";
import { DEFAULT_UNCERTAINTY_OPTIONS } from "../core/uncertainty";
import { toSI } from "../core/units";
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
}

/** Models the pane offers: every isothermal model of the registry (Cross-WLF needs T per point). */
export const PANE_MODELS: readonly ModelId[] = (Object.keys(MODEL_REGISTRY) as ModelId[]).filter(
  (id) => !MODEL_REGISTRY[id].needsTemperature,
);

/** Defaults of {@link PaneSettings}; the core's own defaults where the core has one. */
export const DEFAULT_PANE_SETTINGS: Readonly<PaneSettings> = Object.freeze({
  endCorrection: DEFAULT_REDUCE_OPTIONS.endCorrection,
  rabinowitschMethod: DEFAULT_RABINOWITSCH_OPTIONS.method,
  rabinowitschDegree: DEFAULT_RABINOWITSCH_OPTIONS.degree,
  rabinowitschWindow: DEFAULT_RABINOWITSCH_OPTIONS.window,
  models: ["power-law", "cross", "carreau", "carreau-yasuda"] as ModelId[],
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
  | "run";

/** One-line explanation of each choice, shown under its control. */
export const SETTING_HELP = {
  endCorrection: {
    bagley: "Fits pressure against L/R over dies of one bore at each rate and removes the entrance loss (needs two or more die lengths).",
    orifice: "Subtracts the pressure of an orifice die (L/D below 1) at the same rate from the longest die: one long die is enough.",
    none: "Uses the longest die as measured: quick, but the wall stress still includes the entrance loss and reads high.",
  },
  rabinowitschMethod: {
    transition: "Smooth S-shaped curve through log stress vs log rate, differentiated exactly; the most accurate on melt data (default).",
    local: "A low-order polynomial over a few neighbouring points at each rate; follows local bends.",
    global: "One polynomial of degree 1–3 through all points; simple, but biased at the ends of the range.",
    difference: "Slopes between neighbouring points; no smoothing, so noise shows through. For comparison.",
  },
  rabinowitschDegree: "Polynomial degree of the local (1–2) or global (1–3) slope fit.",
  rabinowitschWindow: "How many neighbouring points each local fit uses (odd, at least 3).",
  models: "Viscosity models fitted to each corrected flow curve; they are ranked by AIC (lower is better).",
  transducerRangeBar: `Full scale of the pressure transducer; readings above it, or below ${DEFAULT_UNCERTAINTY_OPTIONS.minFractionOfFullScale * 100} % of it, are flagged, and the flow curve gets ± columns.`,
  transducerAccuracyPercent: "Accuracy in % of full scale from the transducer's certificate; gives the ± columns (k = 2, about 95 %).",
  representativeRate: "Schümmer cross-check: the apparent viscosity placed at π/4 of the apparent rate, compared with the Rabinowitsch result.",
  slip: "Mooney wall-slip analysis: compares flow curves of two or more die bores at one temperature.",
  extensional: "Cogswell estimate of the extensional viscosity and Trouton ratio from the entrance pressure.",
  pressureDependence: "Fits the bend of the Bagley lines (three or more dies) to get the pressure coefficient of viscosity.",
  heating: "Adiabatic temperature rise and Nahme number in the die, from the melt's density, specific heat and conductivity.",
  heatingDensity: "Melt density at test temperature, g/cm³.",
  heatingHeatCapacity: "Specific heat of the melt, kJ/(kg·K).",
  heatingConductivity: "Thermal conductivity of the melt, W/(m·K).",
  heatingTemperatureCoefficient: "b = −d ln η/dT in 1/K; leave empty to fit it across the temperatures of the data.",
  temperatureShift: {
    none: "No shift: each temperature is reported on its own.",
    arrhenius: "Arrhenius shift aT = exp[(Ea/R)(1/T − 1/Tref)]: fits the activation energy Ea; suits melts well above Tg.",
    wlf: "WLF shift log aT = −C1(T − Tref)/(C2 + T − Tref): fits C1 and C2; suits melts within about 100 K of Tg.",
  },
  referenceTemperatureC: "Temperature the flow curves are shifted to, in °C; leave empty for the middle temperature of the data.",
  chartModel: "The model drawn through each group's points on the viscosity chart: the recommended one (lowest AIC among those the data determine) or one you choose. The sheet lists every fitted model.",
} as const;

/** A message meant for one field of the pane. */
export interface FieldError {
  field: FieldId;
  message: string;
}

const METHODS: readonly RabinowitschMethod[] = ["transition", "local", "global", "difference"];

/**
 * Checks every setting; returns one plain-language message per field at fault (empty when all
 * is well). Nothing is corrected silently.
 */
export function validateSettings(s: PaneSettings): FieldError[] {
  const errors: FieldError[] = [];
  if (s.endCorrection !== "bagley" && s.endCorrection !== "none" && s.endCorrection !== "orifice") {
    errors.push({ field: "endCorrection", message: `Choose Bagley, orifice die or no end correction (got "${String(s.endCorrection)}").` });
  }
  if (!METHODS.includes(s.rabinowitschMethod)) {
    errors.push({ field: "rabinowitschMethod", message: `Unknown slope method "${String(s.rabinowitschMethod)}".` });
  }
  const maxDegree = s.rabinowitschMethod === "global" ? 3 : 2;
  if (usesDegree(s.rabinowitschMethod) && !(Number.isInteger(s.rabinowitschDegree) && s.rabinowitschDegree >= 1 && s.rabinowitschDegree <= maxDegree)) {
    errors.push({ field: "rabinowitschDegree", message: `Give a whole number from 1 to ${maxDegree} for the ${s.rabinowitschMethod} method.` });
  }
  if (s.rabinowitschMethod === "local" && !(Number.isInteger(s.rabinowitschWindow) && s.rabinowitschWindow >= 3 && s.rabinowitschWindow % 2 === 1)) {
    errors.push({ field: "rabinowitschWindow", message: "Give an odd whole number of points, 3 or more (for example 5)." });
  }
  const unknown = s.models.filter((m) => !PANE_MODELS.includes(m));
  if (unknown.length > 0) errors.push({ field: "models", message: `Unknown model(s): ${unknown.join(", ")}.` });
  if (s.chartModel !== "best" && !s.models.includes(s.chartModel)) {
    errors.push({ field: "chartModel", message: `${modelName(s.chartModel)} is not among the models to fit: tick it there, or chart the best model.` });
  }
  if (s.transducerRangeBar !== null && !(Number.isFinite(s.transducerRangeBar) && s.transducerRangeBar > 0)) {
    errors.push({ field: "transducerRangeBar", message: "Give the full scale as a number of bar greater than zero, or leave it empty." });
  }
  if (s.transducerRangeBar !== null && !(s.transducerAccuracyPercent !== null && Number.isFinite(s.transducerAccuracyPercent) && s.transducerAccuracyPercent > 0 && s.transducerAccuracyPercent < 100)) {
    errors.push({ field: "transducerAccuracyPercent", message: "Give the accuracy in % of full scale, above 0 and below 100 (for example 0.25)." });
  }
  if (s.heating) {
    const need = (field: "heatingDensity" | "heatingHeatCapacity" | "heatingConductivity", what: string) => {
      const v = s[field];
      if (!(v !== null && Number.isFinite(v) && v > 0)) errors.push({ field, message: `The heating check needs the ${what} as a number greater than zero.` });
    };
    need("heatingDensity", "melt density in g/cm³ (for example 0.75)");
    need("heatingHeatCapacity", "specific heat in kJ/(kg·K) (for example 2.1)");
    need("heatingConductivity", "thermal conductivity in W/(m·K) (for example 0.18)");
    const b = s.heatingTemperatureCoefficient;
    if (b !== null && !(Number.isFinite(b) && b > 0)) errors.push({ field: "heatingTemperatureCoefficient", message: "Give b in 1/K as a number greater than zero, or leave it empty to fit it." });
  }
  if (!["none", "arrhenius", "wlf"].includes(s.temperatureShift)) {
    errors.push({ field: "temperatureShift", message: `Unknown temperature shift "${String(s.temperatureShift)}".` });
  }
  if (s.referenceTemperatureC !== null && !(Number.isFinite(s.referenceTemperatureC) && s.referenceTemperatureC > -273.15)) {
    errors.push({ field: "referenceTemperatureC", message: "Give the reference temperature in °C (above −273.15), or leave it empty." });
  }
  return errors;
}

/** True when the slope method takes a polynomial degree. */
export function usesDegree(method: RabinowitschMethod): boolean {
  return method === "local" || method === "global";
}

/**
 * The core's reduce options for these settings (display units converted to SI here, once).
 * Call after {@link validateSettings}: it assumes valid values.
 */
export function reduceOptionsOf(s: PaneSettings): Partial<ReduceOptions> {
  const o: Partial<ReduceOptions> = {
    endCorrection: s.endCorrection,
    rabinowitsch: { method: s.rabinowitschMethod, degree: s.rabinowitschDegree, window: s.rabinowitschWindow },
  };
  if (s.transducerRangeBar !== null && s.transducerAccuracyPercent !== null) {
    o.transducer = { fullScale: toSI(s.transducerRangeBar, "bar", "pressure"), accuracy: s.transducerAccuracyPercent / 100 };
  }
  if (s.representativeRate) o.representativeRate = true;
  if (s.slip) o.slip = true;
  if (s.extensional) o.extensional = true;
  if (s.pressureDependence) o.pressureDependence = true;
  if (s.heating) {
    o.heating = {
      density: toSI(s.heatingDensity as number, "g/cm3", "density"),
      heatCapacity: toSI(s.heatingHeatCapacity as number, "kJ/(kg.K)", "heatCapacity"),
      conductivity: toSI(s.heatingConductivity as number, "W/(m.K)", "thermalConductivity"),
    };
    if (s.heatingTemperatureCoefficient !== null) o.heating.temperatureCoefficient = s.heatingTemperatureCoefficient;
  }
  return o;
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
  ];
}

function onOff(v: boolean): string {
  return v ? "on" : "off";
}
