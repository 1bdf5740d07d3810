/**
 * Plain names for what the core identifies by stable ids: models and their parameters, as the
 * pane, the workbook and the reports show them ("Carreau–Yasuda", "η₀"). The ids stay in JSON and
 * in worksheet-function arguments; only these words are shown to people.
 */
import type { ModelId } from "../core/models";

/** Display name of each model. */
export const MODEL_NAMES: Readonly<Record<ModelId, string>> = Object.freeze({
  newtonian: "Newtonian",
  "power-law": "Power law",
  cross: "Cross",
  carreau: "Carreau",
  "carreau-yasuda": "Carreau–Yasuda",
  sisko: "Sisko",
  ellis: "Ellis",
  bingham: "Bingham",
  "herschel-bulkley": "Herschel–Bulkley",
  casson: "Casson",
  "cross-wlf": "Cross-WLF",
});

/** Display symbol of each parameter name used by the models. */
export const PARAMETER_SYMBOLS: Readonly<Record<string, string>> = Object.freeze({
  eta0: "η₀",
  etaInf: "η∞",
  lambda: "λ",
  n: "n",
  m: "m",
  a: "a",
  K: "K",
  mu: "μ",
  muP: "μp",
  tauY: "τy",
  etaC: "ηc",
  tauHalf: "τ½",
  alpha: "α",
  tauStar: "τ*",
  D1: "D1",
  Tstar: "T*",
  A1: "A1",
  A2: "A2",
});

/** The display name of a model id (the id itself when unknown). */
export function modelName(id: string): string {
  return (MODEL_NAMES as Record<string, string>)[id] ?? id;
}

/** The display symbol of a parameter name (the name itself when unknown). */
export function parameterSymbol(name: string): string {
  return PARAMETER_SYMBOLS[name] ?? name;
}

/** An SI unit as shown: "Pa.s" → "Pa·s", "Pa.s^n" → "Pa·sⁿ", "1" → "" (dimensionless). */
export function displayUnit(unit: string): string {
  if (unit === "1" || unit === "-") return "";
  return unit.replace(/\.s\^n/g, "·sⁿ").replace(/\./g, "·").replace(/m3/g, "m³").replace(/m2/g, "m²");
}
