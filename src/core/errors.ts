/**
 * The one error type the core throws, and the warning record it returns.
 *
 * Error policy (see DEVELOPERS.md): every failure names the argument it concerns and, where a row
 * is at fault, the row. Surfaces map {@link RheoErrorKind} to their own channel:
 * worksheet cells use #VALUE! for `value`, #N/A for `missing`, #NUM! for `domain` and
 * `convergence`; the CLI prints the message and exits non-zero.
 */

import { type WarningSeverity, warningSeverity } from "./warningCodes";

export type { WarningSeverity } from "./warningCodes";

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

/** Default {@link RheoError.code} of each kind, when the thrower gives no more specific code. */
export const DEFAULT_ERROR_CODES: Readonly<Record<RheoErrorKind, string>> = Object.freeze({
  value: "INVALID_VALUE",
  missing: "MISSING_INPUT",
  domain: "OUT_OF_RANGE",
  convergence: "NOT_CONVERGED",
});

/** What {@link RheoError.retarget} may change. */
export interface RheoErrorAddress {
  /** the argument as the caller's user knows it (a flag, a field, a worksheet argument) */
  argument?: string;
  /** the row as the caller counts it; `null` removes the row */
  row?: number | null;
  /** a phrase put before the detail, e.g. "group 190 °C, D 1 mm:" */
  context?: string;
  /** the offending value as the user gave it, e.g. "-5 mm" (replaces the core's SI value) */
  received?: string;
}

/**
 * An error raised by the calculation core. `argument` names the input at fault, `row` the row,
 * `detail` says what is wrong (without the argument and row), `code` is a stable UPPER_SNAKE
 * identifier (tools and surfaces match on it, never on the text). The message is
 * "argument: row N detail".
 */
export class RheoError extends Error {
  readonly kind: RheoErrorKind;
  readonly argument: string;
  /** 1-based row (data row, not counting a header) when a single row is at fault. */
  readonly row: number | undefined;
  /** what is wrong, in plain words, without the argument and row */
  readonly detail: string;
  /** stable identifier: {@link DEFAULT_ERROR_CODES} of the kind unless the thrower names one */
  readonly code: string;
  /** the offending value, when the thrower gives it apart from the detail (", got …" in the message) */
  readonly received: string | undefined;

  constructor(kind: RheoErrorKind, argument: string, detail: string, row?: number, code?: string, received?: string) {
    super(`${argument}: ${row !== undefined ? `row ${row} ` : ""}${detail}${received !== undefined ? `, got ${received}` : ""}`);
    this.name = "RheoError";
    this.kind = kind;
    this.argument = argument;
    this.row = row;
    this.detail = detail;
    this.code = code ?? DEFAULT_ERROR_CODES[kind];
    this.received = received;
  }

  /**
   * The same error addressed the way the caller's user sees it: another argument name, another
   * row (or none), a context phrase before the detail. Kind and code are kept.
   * @example new RheoError("value", "fullScale", "must be positive").retarget({ argument: "--transducer" }).message
   *   // "--transducer: must be positive"
   */
  retarget(address: RheoErrorAddress): RheoError {
    const row = address.row === null ? undefined : address.row ?? this.row;
    const detail = address.context ? `${address.context} ${this.detail}` : this.detail;
    return new RheoError(this.kind, address.argument ?? this.argument, detail, row, this.code, address.received ?? this.received);
  }
}

/**
 * A non-fatal finding. `code` is stable and registered in warningCodes.ts (tools may match on it);
 * `message` is plain language; `severity` comes from the registry; `scope` names the group or
 * stage it belongs to (a group label, "input", "fit", "shift"), when known.
 */
export interface Warning {
  code: string;
  message: string;
  severity: WarningSeverity;
  scope?: string;
}

/** Builds a warning record; the severity comes from the code's registry entry. */
export function warning(code: string, message: string, scope?: string): Warning {
  const w: Warning = { code, message, severity: warningSeverity(code) };
  if (scope !== undefined) w.scope = scope;
  return w;
}

/** The warning with its message prefixed by `scope` ("scope: message") and its scope set. */
export function scoped(w: Warning, scope: string): Warning {
  return { ...w, message: `${scope}: ${w.message}`, scope };
}

/*
 * The checks below test a valid value in one comparison and build their error in a separate
 * function: a check called for every row stays small enough for the optimiser to inline into
 * its caller (a per-row worksheet formula calls three of them per cell).
 */

/**
 * Throws a `domain` error unless `value` is a finite number > 0.
 * @example requirePositive(0.001, "dieDiameter") // returns 0.001
 */
export function requirePositive(value: number, argument: string, row?: number): number {
  if (typeof value === "number" && value > 0 && value < Infinity) return value;
  throw checkError(value, argument, row, "must be greater than zero");
}

/** Throws a `domain` error unless `value` is a finite number >= 0. */
export function requireNonNegative(value: number, argument: string, row?: number): number {
  if (typeof value === "number" && value >= 0 && value < Infinity) return value;
  throw checkError(value, argument, row, "must not be negative");
}

/** Throws a `value` error unless `value` is a finite number. */
export function requireFinite(value: number, argument: string, row?: number): number {
  if (typeof value === "number" && value - value === 0) return value;
  throw checkError(value, argument, row, "");
}

/** The error of a failed check: `value` when not a finite number, else `domain` with `detail`. */
function checkError(value: unknown, argument: string, row: number | undefined, detail: string): RheoError {
  if (typeof value !== "number" || !Number.isFinite(value)) return new RheoError("value", argument, "must be a finite number", row, undefined, String(value));
  return new RheoError("domain", argument, detail, row, undefined, String(value));
}
