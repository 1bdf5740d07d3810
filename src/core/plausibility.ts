/**
 * The plausible range of each quantity in capillary rheometry, in one table, and the check that
 * finds a likely unit slip: a die bore typed in µm as if it were mm, a temperature column headed
 * [K] holding °C values, pressures in GPa that should be MPa, a heat capacity given in kJ
 * without its unit.
 *
 * The ranges are common practice, no source: wide enough for melts, pastes, feedstocks and
 * rubbers on laboratory capillary and slit rheometers, narrow enough that a factor of 1000 (a
 * wrong SI prefix) or °C read as K falls outside. A value outside its range is a warning, never an
 * error: unusual tests exist. docs/input.md prints this table (test/plausibility.test.ts keeps the
 * two equal).
 */
import { QUANTITY_SI_UNIT, type Quantity, fromSI, isUnitOf, toSI } from "./units";

/** One row of the table: SI bounds, the unit to show them in, and the units a slip usually involves. */
export interface PlausibleRange {
  /** what is checked, in plain words */
  label: string;
  quantity: Quantity;
  /** SI */
  min: number;
  /** SI */
  max: number;
  /** unit the bounds are shown in */
  displayUnit: string;
  /** units to suggest, most likely first */
  slipUnits: string[];
}

const LENGTH_SLIPS = ["mm", "um", "cm", "m", "in"];

/** The table (common practice, no source). Keys name the input column or option. */
export const PLAUSIBLE_RANGES = Object.freeze({
  dieDiameter: { label: "die bore", quantity: "length", min: 0.1e-3, max: 20e-3, displayUnit: "mm", slipUnits: LENGTH_SLIPS },
  dieLength: { label: "die length", quantity: "length", min: 0.05e-3, max: 200e-3, displayUnit: "mm", slipUnits: LENGTH_SLIPS },
  slitWidth: { label: "slit width", quantity: "length", min: 1e-3, max: 100e-3, displayUnit: "mm", slipUnits: LENGTH_SLIPS },
  slitHeight: { label: "slit height", quantity: "length", min: 0.1e-3, max: 10e-3, displayUnit: "mm", slipUnits: LENGTH_SLIPS },
  barrelDiameter: { label: "barrel bore", quantity: "length", min: 5e-3, max: 60e-3, displayUnit: "mm", slipUnits: LENGTH_SLIPS },
  pistonSpeed: { label: "piston speed", quantity: "speed", min: 0.001e-3 / 60, max: 5000e-3 / 60, displayUnit: "mm/min", slipUnits: ["mm/min", "mm/s", "m/min", "m/s", "cm/min", "in/min"] },
  flowRate: { label: "volumetric flow rate", quantity: "volumetricFlow", min: 1e-13, max: 1e-3, displayUnit: "mm3/s", slipUnits: ["mm3/s", "cm3/s", "cm3/min", "mm3/min", "m3/s"] },
  massRate: { label: "mass rate", quantity: "massRate", min: 1e-11, max: 1, displayUnit: "g/min", slipUnits: ["g/min", "g/s", "g/10min", "kg/h", "kg/s"] },
  density: { label: "melt density", quantity: "density", min: 200, max: 10000, displayUnit: "g/cm3", slipUnits: ["g/cm3", "kg/m3"] },
  pressure: { label: "pressure", quantity: "pressure", min: 1e3, max: 400e6, displayUnit: "bar", slipUnits: ["bar", "MPa", "kPa", "psi", "Pa", "GPa"] },
  temperature: { label: "test temperature", quantity: "temperature", min: 213.15, max: 723.15, displayUnit: "C", slipUnits: ["C", "K", "F"] },
  viscosity: { label: "viscosity", quantity: "viscosity", min: 1e-4, max: 1e8, displayUnit: "Pa.s", slipUnits: [] },
  heatCapacity: { label: "specific heat capacity", quantity: "heatCapacity", min: 500, max: 5000, displayUnit: "J/(kg.K)", slipUnits: ["J/(kg.K)", "kJ/(kg.K)"] },
  thermalConductivity: { label: "thermal conductivity", quantity: "thermalConductivity", min: 0.03, max: 20, displayUnit: "W/(m.K)", slipUnits: [] },
  temperatureCoefficient: { label: "temperature coefficient of viscosity b", quantity: "inverseTemperature", min: 1e-3, max: 0.3, displayUnit: "1/K", slipUnits: [] },
  transducerFullScale: { label: "transducer full scale", quantity: "pressure", min: 1e5, max: 500e6, displayUnit: "bar", slipUnits: ["bar", "MPa", "psi", "kPa"] },
} satisfies Record<string, PlausibleRange & { quantity: Quantity }>);

export type PlausibleKey = keyof typeof PLAUSIBLE_RANGES;

/** A number for a message: four significant figures, no float noise, powers of ten for extremes. */
function short(x: number): string {
  const abs = Math.abs(x);
  if (abs !== 0 && (abs >= 1e5 || abs < 1e-3)) return Number(x.toPrecision(4)).toExponential().replace("e+", "e");
  return String(Number(x.toPrecision(4)));
}

/** "0.1 to 20 mm", "−60 to 450 °C" */
export function rangeText(key: PlausibleKey): string {
  const r: PlausibleRange = PLAUSIBLE_RANGES[key];
  const lo = fromSI(r.min, r.displayUnit, r.quantity);
  const hi = fromSI(r.max, r.displayUnit, r.quantity);
  return `${short(lo).replace(/^-/, "−")} to ${short(hi)} ${unitShown(r.displayUnit)}`;
}

/** What {@link checkPlausible} found about a value range. */
export interface PlausibilityFinding {
  /** the offending value as given (in `unit`) */
  value: number;
  /** "low" or "high" */
  side: "low" | "high";
  /** a unit in which every given value would be plausible, if one of the usual slips fits (the likeliest) */
  suggestedUnit: string | null;
  /** every usual slip unit that fits, likeliest first */
  fittingUnits: string[];
}

/**
 * Checks values given in `unit` (the smallest and largest of a column or option) against the
 * plausible range of `key`; null when both are inside.
 * @param unit the unit the values were given in ("" or undefined for SI)
 * @example checkPlausible("dieDiameter", 1, 2, "um") // { value: 1, side: "low", suggestedUnit: "mm" }
 */
export function checkPlausible(key: PlausibleKey, smallest: number, largest: number, unit?: string): PlausibilityFinding | null {
  const r: PlausibleRange = PLAUSIBLE_RANGES[key];
  const given = unit === undefined || unit === "" ? siUnit(r.quantity) : unit;
  const lo = toSI(smallest, given, r.quantity);
  const hi = toSI(largest, given, r.quantity);
  const inside = (a: number, b: number) => a >= r.min && b <= r.max;
  if (inside(lo, hi)) return null;
  const side = lo < r.min ? "low" : "high";
  const value = side === "low" ? smallest : largest;
  const fittingUnits: string[] = [];
  for (const u of r.slipUnits) {
    if (!isUnitOf(r.quantity, u)) continue;
    const sameAsGiven = toSI(1, u, r.quantity) === toSI(1, given, r.quantity) && toSI(0, u, r.quantity) === toSI(0, given, r.quantity);
    if (sameAsGiven) continue;
    if (inside(toSI(smallest, u, r.quantity), toSI(largest, u, r.quantity))) fittingUnits.push(u);
  }
  return { value, side, suggestedUnit: fittingUnits[0] ?? null, fittingUnits };
}

function siUnit(quantity: Quantity): string {
  return QUANTITY_SI_UNIT[quantity];
}

/** How a unit is shown in a message ("C" → "°C", "um" → "µm"). */
export function unitShown(unit: string): string {
  if (unit === "C") return "°C";
  if (unit === "F") return "°F";
  if (unit === "um") return "µm";
  return unit;
}

/**
 * The sentence of a finding: "1 µm is below the usual range of a die bore (0.1–20 mm); did you mean mm?"
 */
export function plausibilityText(key: PlausibleKey, finding: PlausibilityFinding, unit?: string): string {
  const r: PlausibleRange = PLAUSIBLE_RANGES[key];
  const given = unit === undefined || unit === "" ? siUnit(r.quantity) : unit;
  const where = finding.side === "low" ? "below" : "above";
  const shown = `${short(finding.value)} ${unitShown(given)}`.trim();
  const si = toSI(finding.value, given, r.quantity);
  const asDisplay = r.displayUnit !== given ? ` (= ${short(fromSI(si, r.displayUnit, r.quantity)).replace(/^-/, "−")} ${unitShown(r.displayUnit)})` : "";
  const fits = finding.fittingUnits.slice(0, 3).map(unitShown);
  const hint = finding.suggestedUnit
    ? `; did you mean ${fits.length > 1 ? `${fits.slice(0, -1).join(", ")} or ${fits[fits.length - 1]}` : fits[0]}? (${short(finding.value)} ${fits[0]} would be usual)`
    : "; check the value and its unit";
  return `${shown}${asDisplay} is ${where} the usual range of a ${r.label} (${rangeText(key)})${hint}`;
}

/** The table as Markdown (docs/input.md holds this text). */
export function plausibilityMarkdown(): string {
  const rows = (Object.keys(PLAUSIBLE_RANGES) as PlausibleKey[]).map((k) => {
    const r: PlausibleRange = PLAUSIBLE_RANGES[k];
    const slips = r.slipUnits.length ? r.slipUnits.map(unitShown).join(", ") : "—";
    return `| ${k} | ${r.label} | ${rangeText(k)} | ${slips} |`;
  });
  return ["| key | quantity | usual range | units tried when a value is outside |", "|---|---|---|---|", ...rows].join("\n");
}

/**
 * Plausibility of the reduction's own settings (SI: the unit they were typed in is no longer
 * known here): melt density, heating inputs, transducer full scale, barrel bore.
 * @returns one sentence per value outside its range
 */
export function optionFindings(values: Partial<Record<PlausibleKey, number>>): string[] {
  const out: string[] = [];
  for (const [key, value] of Object.entries(values) as [PlausibleKey, number | undefined][]) {
    if (value === undefined || !Number.isFinite(value)) continue;
    const finding = checkPlausible(key, value, value);
    if (finding) out.push(`${PLAUSIBLE_RANGES[key].label}: ${plausibilityText(key, finding)}`);
  }
  return out;
}
