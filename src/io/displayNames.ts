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
  D2: "D2",
  D3: "D3",
  A2tilde: "Ã2",
  activationEnergy: "Ea",
  c1: "c1",
  c2: "c2",
});

/** The display name of a model id (the id itself when unknown). */
export function modelName(id: string): string {
  return (MODEL_NAMES as Record<string, string>)[id] ?? id;
}

/**
 * A sentence with every model id written as its display name ("carreau-yasuda is the adequate …"
 * → "Carreau–Yasuda is the adequate …"); longer ids first, whole words only.
 */
export function modelNamesIn(text: string): string {
  const ids = Object.keys(MODEL_NAMES).sort((a, b) => b.length - a.length);
  const pattern = new RegExp(`(?<![\\w-])(${ids.map((id) => id.replace(/[-]/g, "\\-")).join("|")})(?![\\w-])`, "g");
  return text.replace(pattern, (id) => modelName(id));
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

/** One spelling of each unit code on screen, beyond {@link displayUnit}'s rules. */
const UNIT_SPELLINGS: Readonly<Record<string, string>> = Object.freeze({
  C: "°C",
  degC: "°C",
  "g/cm3": "g/cm³",
  "kg/m3": "kg/m³",
  "kJ/(kg.K)": "kJ/(kg·K)",
  "J/(kg.K)": "J/(kg·K)",
  "W/(m.K)": "W/(m·K)",
  "1": "–",
  "-": "–",
});

/** A unit code in a label or a header: "Pa.s" → "Pa·s", "C" → "°C", "g/cm3" → "g/cm³", "1" → "–". */
export function unitLabel(unit: string): string {
  return UNIT_SPELLINGS[unit] ?? displayUnit(unit);
}

/** Column names of the shared tables (snake_case ids) read as words in the usual order. */
const WORD_ORDER: readonly [RegExp, string][] = [
  [/^shear rate apparent\b/, "apparent shear rate"],
  [/^shear rate wall\b/, "wall shear rate"],
];

/**
 * A header as shown: snake_case ids as words and every bracketed unit code respelled
 * ("shear_rate_apparent [1/s]" → "apparent shear rate [1/s]", "viscosity [Pa.s]" → "viscosity [Pa·s]").
 */
export function headerLabel(header: string): string {
  const bracket = header.indexOf("[");
  const name = bracket < 0 ? header : header.slice(0, bracket);
  const unit = bracket < 0 ? "" : header.slice(bracket);
  let words = name.includes("_") ? name.replace(/_/g, " ") : name;
  for (const [from, to] of WORD_ORDER) words = words.replace(from, to);
  return words + unit.replace(/\[([^\]]+)\]/g, (_, u: string) => `[${unitLabel(u.trim())}]`);
}
