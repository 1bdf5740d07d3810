/**
 * The pane's reduction settings: one record with its defaults defined once, a one-line
 * explanation of every choice (shown beside the control), strict validation that names the field
 * at fault, and the translation into the core's options. Pure: no DOM, no Office.
 */
import { DEFAULT_RABINOWITSCH_OPTIONS, RabinowitschMethod } from "../core/rabinowitsch";
import { DEFAULT_REDUCE_OPTIONS, ReduceOptions } from "../core/reduce";
import { MODEL_REGISTRY, type ModelId } from "../core/models";

/** Every setting of one run. Numbers in the units the pane shows (bar for the transducer). */
export interface PaneSettings {
  /** "bagley": end correction over die lengths; "none": the longest die as measured */
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
  | "run"
  | "share";

/** One-line explanation of each choice, shown under its control. */
export const SETTING_HELP = {
  endCorrection: {
    bagley: "Fits pressure against L/R over dies of one bore at each rate and removes the entrance loss (needs two or more die lengths).",
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
  transducerRangeBar: "Full scale of the pressure transducer; readings above it, or in its bottom 2 %, are flagged.",
} as const;

/** Readings below this fraction of the transducer's full scale are flagged (common practice, no source). */
export const TRANSDUCER_LOW_FRACTION = 0.02;

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
  if (s.endCorrection !== "bagley" && s.endCorrection !== "none") {
    errors.push({ field: "endCorrection", message: `Choose Bagley or no end correction (got "${String(s.endCorrection)}").` });
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
  if (s.transducerRangeBar !== null && !(Number.isFinite(s.transducerRangeBar) && s.transducerRangeBar > 0)) {
    errors.push({ field: "transducerRangeBar", message: "Give the full scale as a number of bar greater than zero, or leave it empty." });
  }
  return errors;
}

/** True when the slope method takes a polynomial degree. */
export function usesDegree(method: RabinowitschMethod): boolean {
  return method === "local" || method === "global";
}

/** The core's reduce options for these settings. */
export function reduceOptionsOf(s: PaneSettings): Partial<ReduceOptions> {
  return {
    endCorrection: s.endCorrection,
    rabinowitsch: { method: s.rabinowitschMethod, degree: s.rabinowitschDegree, window: s.rabinowitschWindow },
  };
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
    ["End correction", s.endCorrection === "bagley" ? "Bagley (pressure vs L/R per rate)" : "none (longest die as measured)"],
    ["Rabinowitsch slope method", s.rabinowitschMethod],
    ["Rabinowitsch polynomial degree", usesDegree(s.rabinowitschMethod) ? String(s.rabinowitschDegree) : "not used by this method"],
    ["Rabinowitsch local window (points)", s.rabinowitschMethod === "local" ? String(s.rabinowitschWindow) : "not used by this method"],
    ["Models fitted", s.models.length > 0 ? s.models.join(", ") : "none"],
    ["Transducer full scale", s.transducerRangeBar === null ? "not given" : `${s.transducerRangeBar} bar`],
  ];
}
