/**
 * The one error type the core throws, and the warning record it returns.
 *
 * Error policy (see DEVELOPERS.md): every failure names the argument it concerns and, where a row
 * is at fault, the row. Surfaces map {@link RheoErrorKind} to their own channel:
 * worksheet cells use #VALUE! for `value`, #N/A for `missing`, #NUM! for `domain` and
 * `convergence`; the CLI prints the message and exits non-zero.
 */

/** Why a calculation was refused. */
export type RheoErrorKind =
  /** wrong type, text where a number belongs, unknown unit or option */
  | "value"
  /** too few points, missing column or argument */
  | "missing"
  /** physically impossible input (non-positive length, negative pressure, ...) */
  | "domain"
  /** an iterative method did not reach a trustworthy answer */
  | "convergence";

/** An error raised by the calculation core. `argument` names the input at fault. */
export class RheoError extends Error {
  readonly kind: RheoErrorKind;
  readonly argument: string;
  /** 1-based row (data row, not counting a header) when a single row is at fault. */
  readonly row: number | undefined;

  constructor(kind: RheoErrorKind, argument: string, message: string, row?: number) {
    super(`${argument}: ${row !== undefined ? `row ${row} ` : ""}${message}`);
    this.name = "RheoError";
    this.kind = kind;
    this.argument = argument;
    this.row = row;
  }
}

/** A non-fatal finding. `code` is stable (tools may match on it); `message` is plain language. */
export interface Warning {
  code: string;
  message: string;
}

/** Builds a warning record. */
export function warning(code: string, message: string): Warning {
  return { code, message };
}

/**
 * Throws a `domain` error unless `value` is a finite number > 0.
 * @example requirePositive(0.001, "dieDiameter") // returns 0.001
 */
export function requirePositive(value: number, argument: string, row?: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new RheoError("value", argument, `must be a finite number, got ${String(value)}`, row);
  }
  if (value <= 0) throw new RheoError("domain", argument, `must be greater than zero, got ${value}`, row);
  return value;
}

/** Throws a `domain` error unless `value` is a finite number >= 0. */
export function requireNonNegative(value: number, argument: string, row?: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new RheoError("value", argument, `must be a finite number, got ${String(value)}`, row);
  }
  if (value < 0) throw new RheoError("domain", argument, `must not be negative, got ${value}`, row);
  return value;
}

/** Throws a `value` error unless `value` is a finite number. */
export function requireFinite(value: number, argument: string, row?: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new RheoError("value", argument, `must be a finite number, got ${String(value)}`, row);
  }
  return value;
}
