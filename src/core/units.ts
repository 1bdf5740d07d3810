/**
 * Unit table and conversions. The core works in SI; surfaces convert at their edges with these.
 *
 * A small documented table is used rather than a general units library: the quantities of
 * capillary rheometry are few, some are trade-specific (g/10min, mass rate with a density), and a
 * table keeps the worksheet bundle small. Factors are exact by definition unless noted, from
 * NIST SP 811 (2008), appendix B: 1 in = 0.0254 m, 1 psi = 6894.757293168 Pa,
 * 1 bar = 1e5 Pa, 1 P = 0.1 Pa·s, 1 lb = 0.45359237 kg, 1 kgf = 9.80665 N,
 * T(K) = T(°C) + 273.15, T(K) = (T(°F) + 459.67)·5/9.
 */
import { RheoError } from "./errors";

/** Physical quantities the table knows, each with its SI unit. */
export const QUANTITY_SI_UNIT = {
  pressure: "Pa",
  length: "m",
  speed: "m/s",
  volumetricFlow: "m3/s",
  massRate: "kg/s",
  temperature: "K",
  temperatureDifference: "K",
  viscosity: "Pa.s",
  density: "kg/m3",
  shearRate: "1/s",
  angularFrequency: "rad/s",
  time: "s",
  area: "m2",
  volume: "m3",
  mass: "kg",
  force: "N",
  heatCapacity: "J/(kg.K)",
  thermalConductivity: "W/(m.K)",
  molarEnergy: "J/mol",
  inverseTemperature: "1/K",
  inverseStress: "1/Pa",
  ratio: "1",
} as const;

export type Quantity = keyof typeof QUANTITY_SI_UNIT;

/** One unit: multiply by `factor` and add `offset` to reach SI. */
interface UnitDef {
  symbol: string;
  factor: number;
  offset?: number;
  aliases?: string[];
}

const INCH = 0.0254;
const PSI = 6894.757293168;
const POUND = 0.45359237;

const TABLE: Record<Quantity, UnitDef[]> = {
  pressure: [
    { symbol: "Pa", factor: 1 },
    { symbol: "kPa", factor: 1e3 },
    { symbol: "MPa", factor: 1e6 },
    { symbol: "GPa", factor: 1e9 },
    { symbol: "bar", factor: 1e5 },
    { symbol: "mbar", factor: 1e2 },
    { symbol: "psi", factor: PSI },
    { symbol: "atm", factor: 101325 },
  ],
  length: [
    { symbol: "m", factor: 1 },
    { symbol: "cm", factor: 1e-2 },
    { symbol: "mm", factor: 1e-3 },
    { symbol: "um", factor: 1e-6, aliases: ["µm", "μm", "micron"] },
    { symbol: "in", factor: INCH, aliases: ["inch"] },
  ],
  speed: [
    { symbol: "m/s", factor: 1 },
    { symbol: "mm/s", factor: 1e-3 },
    { symbol: "mm/min", factor: 1e-3 / 60 },
    { symbol: "cm/min", factor: 1e-2 / 60 },
    { symbol: "m/min", factor: 1 / 60 },
    { symbol: "um/s", factor: 1e-6, aliases: ["µm/s", "μm/s"] },
    { symbol: "in/min", factor: INCH / 60 },
    { symbol: "in/s", factor: INCH },
  ],
  volumetricFlow: [
    { symbol: "m3/s", factor: 1 },
    { symbol: "mm3/s", factor: 1e-9 },
    { symbol: "cm3/s", factor: 1e-6, aliases: ["ml/s", "mL/s", "cc/s"] },
    { symbol: "cm3/min", factor: 1e-6 / 60, aliases: ["ml/min", "mL/min", "cc/min"] },
    { symbol: "cm3/10min", factor: 1e-6 / 600 },
    { symbol: "mm3/min", factor: 1e-9 / 60 },
    { symbol: "L/min", factor: 1e-3 / 60, aliases: ["l/min"] },
    { symbol: "L/h", factor: 1e-3 / 3600, aliases: ["l/h"] },
  ],
  massRate: [
    { symbol: "kg/s", factor: 1 },
    { symbol: "g/s", factor: 1e-3 },
    { symbol: "g/min", factor: 1e-3 / 60 },
    { symbol: "g/10min", factor: 1e-3 / 600, aliases: ["g/10 min"] },
    { symbol: "kg/h", factor: 1 / 3600 },
    { symbol: "lb/h", factor: POUND / 3600 },
  ],
  temperature: [
    { symbol: "K", factor: 1 },
    { symbol: "C", factor: 1, offset: 273.15, aliases: ["°C", "degC", "℃"] },
    { symbol: "F", factor: 5 / 9, offset: 459.67 * (5 / 9), aliases: ["°F", "degF", "℉"] },
  ],
  temperatureDifference: [
    { symbol: "K", factor: 1 },
    { symbol: "C", factor: 1, aliases: ["°C", "degC"] },
    { symbol: "F", factor: 5 / 9, aliases: ["°F", "degF"] },
  ],
  viscosity: [
    { symbol: "Pa.s", factor: 1, aliases: ["Pas", "Pa s", "Pa·s", "N.s/m2"] },
    { symbol: "mPa.s", factor: 1e-3, aliases: ["mPas", "mPa s", "mPa·s"] },
    { symbol: "kPa.s", factor: 1e3, aliases: ["kPas", "kPa s", "kPa·s"] },
    { symbol: "P", factor: 0.1, aliases: ["poise"] },
    { symbol: "cP", factor: 1e-3, aliases: ["centipoise"] },
  ],
  density: [
    { symbol: "kg/m3", factor: 1 },
    { symbol: "g/cm3", factor: 1e3, aliases: ["g/ml", "g/mL", "g/cc"] },
    { symbol: "g/L", factor: 1, aliases: ["g/l"] },
  ],
  shearRate: [{ symbol: "1/s", factor: 1, aliases: ["s-1", "/s", "s^-1"] }],
  // ω = 2π·f: a frequency in Hz is 2π rad/s per hertz.
  angularFrequency: [
    { symbol: "rad/s", factor: 1, aliases: ["rad s-1", "rad/sec", "rad.s-1"] },
    { symbol: "Hz", factor: 2 * Math.PI },
  ],
  time: [
    { symbol: "s", factor: 1, aliases: ["sec"] },
    { symbol: "ms", factor: 1e-3 },
    { symbol: "min", factor: 60 },
    { symbol: "h", factor: 3600, aliases: ["hr"] },
  ],
  area: [
    { symbol: "m2", factor: 1 },
    { symbol: "cm2", factor: 1e-4 },
    { symbol: "mm2", factor: 1e-6 },
  ],
  volume: [
    { symbol: "m3", factor: 1 },
    { symbol: "L", factor: 1e-3, aliases: ["l"] },
    { symbol: "cm3", factor: 1e-6, aliases: ["ml", "mL", "cc"] },
    { symbol: "mm3", factor: 1e-9 },
  ],
  mass: [
    { symbol: "kg", factor: 1 },
    { symbol: "g", factor: 1e-3 },
    { symbol: "lb", factor: POUND },
  ],
  force: [
    { symbol: "N", factor: 1 },
    { symbol: "kN", factor: 1e3 },
    { symbol: "kgf", factor: 9.80665 },
  ],
  heatCapacity: [
    { symbol: "J/(kg.K)", factor: 1, aliases: ["J/kg/K", "J/(kg K)", "J/kgK"] },
    { symbol: "kJ/(kg.K)", factor: 1e3, aliases: ["kJ/kg/K", "kJ/(kg K)", "kJ/kgK"] },
  ],
  thermalConductivity: [{ symbol: "W/(m.K)", factor: 1, aliases: ["W/m/K", "W/(m K)", "W/mK"] }],
  molarEnergy: [
    { symbol: "J/mol", factor: 1 },
    { symbol: "kJ/mol", factor: 1e3 },
  ],
  inverseTemperature: [{ symbol: "1/K", factor: 1, aliases: ["K-1", "/K", "1/C", "1/°C"] }],
  inverseStress: [
    { symbol: "1/Pa", factor: 1, aliases: ["Pa-1"] },
    { symbol: "1/MPa", factor: 1e-6, aliases: ["MPa-1"] },
    { symbol: "1/GPa", factor: 1e-9, aliases: ["GPa-1"] },
  ],
  ratio: [
    { symbol: "1", factor: 1, aliases: ["-", ""] },
    { symbol: "%", factor: 0.01 },
  ],
};

/** Normalises spelling variants: superscripts, middle dots, spaces, micro signs. */
export function normaliseUnitText(text: string): string {
  return text
    .trim()
    .replace(/[³]/g, "3")
    .replace(/[²]/g, "2")
    .replace(/⁻¹/g, "-1")
    .replace(/[·⋅*]/g, ".")
    .replace(/\^/g, "")
    .replace(/\s+/g, " ");
}

/** Per quantity: every spelling (normalised, spaces removed) → its unit; built once on first use. */
const SPELLINGS = new Map<Quantity, Map<string, UnitDef>>();

function spellings(quantity: Quantity): Map<string, UnitDef> {
  let map = SPELLINGS.get(quantity);
  if (!map) {
    map = new Map();
    for (const def of TABLE[quantity]) {
      for (const name of [def.symbol, ...(def.aliases ?? [])]) {
        const key = normaliseUnitText(name).replace(/ /g, "");
        if (!map.has(key)) map.set(key, def);
      }
    }
    SPELLINGS.set(quantity, map);
  }
  return map;
}

function findUnit(quantity: Quantity, text: string): UnitDef | undefined {
  return spellings(quantity).get(normaliseUnitText(text).replace(/ /g, ""));
}

/** The accepted unit symbols of a quantity, in table order (aliases not listed). */
export function acceptedUnits(quantity: Quantity): string[] {
  return TABLE[quantity].map((d) => d.symbol);
}

/** All quantity names the table knows. */
export function knownQuantities(): Quantity[] {
  return Object.keys(TABLE) as Quantity[];
}

function lookup(quantity: Quantity, unit: string, argument: string): UnitDef {
  if (!(quantity in TABLE)) {
    throw new RheoError("value", argument, `unknown quantity "${quantity}"; known: ${knownQuantities().join(", ")}`);
  }
  const def = findUnit(quantity, unit);
  if (!def) {
    throw new RheoError(
      "value",
      argument,
      `unknown ${quantity} unit "${unit}"; accepted: ${acceptedUnits(quantity).join(", ")}`,
    );
  }
  return def;
}

/** True when `unit` is a unit of `quantity`. */
export function isUnitOf(quantity: Quantity, unit: string): boolean {
  return quantity in TABLE && findUnit(quantity, unit) !== undefined;
}

/**
 * Converts `value` in `unit` to the SI unit of `quantity`.
 * @throws RheoError(kind "value") naming `argument` when the unit is unknown, listing accepted ones.
 * @example toSI(100, "bar", "pressure") // 1e7
 */
export function toSI(value: number, unit: string, quantity: Quantity, argument = "unit"): number {
  const def = lookup(quantity, unit, argument);
  return value * def.factor + (def.offset ?? 0);
}

/**
 * The factor and offset that take `unit` to SI (`SI = value·factor + offset`), looked up once
 * for converting many values; the same arithmetic as {@link toSI}, bit for bit.
 * @throws RheoError(kind "value") naming `argument` when the unit is unknown
 * @example unitFactors("temperature", "C") // { factor: 1, offset: 273.15 }
 */
export function unitFactors(quantity: Quantity, unit: string, argument = "unit"): { factor: number; offset: number } {
  const def = lookup(quantity, unit, argument);
  return { factor: def.factor, offset: def.offset ?? 0 };
}

/**
 * Converts an SI `value` of `quantity` to `unit`.
 * @example fromSI(373.15, "C", "temperature") // 100
 */
export function fromSI(value: number, unit: string, quantity: Quantity, argument = "unit"): number {
  const def = lookup(quantity, unit, argument);
  return (value - (def.offset ?? 0)) / def.factor;
}

/**
 * The quantities whose table contains `unit` (several for e.g. "K": temperature and difference).
 */
export function quantitiesOfUnit(unit: string): Quantity[] {
  return knownQuantities().filter((q) => findUnit(q, unit) !== undefined);
}

/**
 * Converts between two units of one quantity. The quantity is inferred from the units when not
 * given; "K", "C" and "F" are read as temperatures (not differences) unless `quantity` says so.
 * @throws RheoError when the units are unknown or measure different quantities.
 * @example convertUnit(1, "psi", "Pa") // 6894.757293168
 */
export function convertUnit(value: number, fromUnit: string, toUnit: string, quantity?: Quantity): number {
  const q = quantity ?? commonQuantity(fromUnit, toUnit);
  return fromSI(toSI(value, fromUnit, q, "fromUnit"), toUnit, q, "toUnit");
}

function commonQuantity(fromUnit: string, toUnit: string): Quantity {
  const a = quantitiesOfUnit(fromUnit);
  const b = quantitiesOfUnit(toUnit);
  if (a.length === 0) {
    throw new RheoError("value", "fromUnit", `unknown unit "${fromUnit}"; ${describeAllUnits()}`);
  }
  if (b.length === 0) {
    throw new RheoError("value", "toUnit", `unknown unit "${toUnit}"; ${describeAllUnits()}`);
  }
  const shared = a.filter((q) => b.includes(q));
  const first = shared[0];
  if (first === undefined) {
    throw new RheoError(
      "value",
      "toUnit",
      `"${fromUnit}" is a ${a.join("/")} unit but "${toUnit}" is a ${b.join("/")} unit; they cannot be converted`,
    );
  }
  return first;
}

/** A one-line list of every quantity and its units, for error messages and help text. */
export function describeAllUnits(): string {
  return (
    "accepted units: " +
    knownQuantities()
      .map((q) => `${q} (${acceptedUnits(q).join(", ")})`)
      .join("; ")
  );
}
