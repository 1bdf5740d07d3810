/**
 * Scalar option arguments of the worksheet functions: units, choices, whole numbers, switches.
 * An omitted optional argument arrives as null or undefined (Excel) and an empty cell as "" or
 * null; all of them mean "use the default".
 */
import { RheoError } from "../../core/errors";
import { Quantity, acceptedUnits, knownQuantities } from "../../core/units";
import { isBlank, readNumber } from "./ranges";
import { isKnownUnit } from "./unitScale";

/**
 * Default units of the worksheet functions' inputs and outputs. The JSDoc of each function in
 * functions.ts repeats them (Excel reads descriptions from there); test/metadata.test.ts checks
 * that every unit parameter's description names the default given here.
 */
export const DEFAULT_SHEET_UNITS = Object.freeze({
  /** die and barrel geometry */
  length: "mm",
  /** piston speed */
  speed: "mm/min",
  /** time of a recording's samples */
  time: "s",
  /** measured pressures and entrance pressures */
  pressure: "bar",
  /** wall shear stresses */
  stress: "Pa",
  /** shear rates (the only unit) */
  shearRate: "1/s",
  viscosity: "Pa.s",
  temperature: "C",
  volumetricFlow: "mm3/s",
  massRate: "g/min",
  density: "g/cm3",
});

/** Reads an optional text argument; the fallback when blank or omitted. */
export function optionalText(value: unknown, argument: string, fallback: string): string {
  if (isBlank(value)) return fallback;
  if (typeof value === "string") return value.trim();
  if (typeof value === "number" && Number.isFinite(value)) return String(value);
  throw new RheoError("value", argument, `must be text, got ${describe(value)}`);
}

/**
 * Reads an optional unit argument of `quantity`; the fallback when blank or omitted.
 * @throws RheoError("value") naming the argument and listing the accepted units.
 */
export function unitArg(value: unknown, argument: string, quantity: Quantity, fallback: string): string {
  const unit = optionalText(value, argument, fallback);
  if (!isKnownUnit(quantity, unit)) {
    throw new RheoError("value", argument, `unknown ${quantity} unit "${unit}"; accepted: ${acceptedUnits(quantity).join(", ")}`);
  }
  return unit;
}

/** Reads an optional choice (case-insensitive); returns the canonical spelling from `choices`. */
export function choiceArg<T extends string>(value: unknown, argument: string, choices: readonly T[], fallback: T): T {
  const text = optionalText(value, argument, fallback);
  const found = choices.find((c) => c.toLowerCase() === text.toLowerCase());
  if (found === undefined) {
    throw new RheoError("value", argument, `unknown choice "${text}"; accepted: ${choices.join(", ")}`);
  }
  return found;
}

/** Reads an optional whole number within [min, max]. */
export function integerArg(value: unknown, argument: string, fallback: number, min: number, max: number): number {
  const n = isBlank(value) ? fallback : readNumber(value, argument, "the value");
  if (n === null || !Number.isInteger(n) || n < min || n > max) {
    throw new RheoError("value", argument, `must be a whole number from ${min} to ${max}, got ${describe(value)}`);
  }
  return n;
}

/** Reads an optional switch: TRUE/FALSE, 1/0 or the text "true"/"false". */
export function booleanArg(value: unknown, argument: string, fallback: boolean): boolean {
  if (isBlank(value)) return fallback;
  if (typeof value === "boolean") return value;
  if (value === 1 || value === 0) return value === 1;
  if (typeof value === "string" && /^(true|false)$/i.test(value.trim())) return value.trim().toLowerCase() === "true";
  throw new RheoError("value", argument, `must be TRUE or FALSE, got ${describe(value)}`);
}

/** Reads an optional quantity name (as the unit table spells it, case-insensitive). */
export function quantityArg(value: unknown, argument: string): Quantity | undefined {
  if (isBlank(value)) return undefined;
  return choiceArg(value, argument, knownQuantities(), knownQuantities()[0] as Quantity);
}

/** A short rendering of a cell value for messages: text quoted, numbers and logicals plain. */
export function describe(value: unknown): string {
  if (typeof value === "string") return `"${value}"`;
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  if (value === null || value === undefined) return "nothing";
  if (typeof value === "number") return String(value);
  return "a non-text value";
}
