/**
 * The per-row lane of the element-wise worksheet functions: one formula per row, every data
 * argument a 1×1 range holding a finite number (Excel hands thousands of these calls over when a
 * formula is filled down). Such a call is answered here without building argument records,
 * closures, unit texts or messages; anything else — a longer range, a blank, text, an unknown
 * unit, a unit with an offset, a core function that throws, a result that is not finite —
 * declines (returns undefined) and the function's general path (mapRows under guard) answers,
 * so every error cell and message comes from one place.
 *
 * The lane gives bit for bit what the general path gives: SI = value·factor + 0 for each
 * dimensional argument (adapter/unitScale.ts), a dimensionless argument as it is, the result
 * divided by the output unit's factor.
 */
import { Quantity } from "../../core/units";
import { unitArg } from "./args";
import { unitScale } from "./unitScale";

/** Factor of a dimensionless data argument: its value is passed as it is. */
export const AS_IS = 0;

/**
 * One unit argument of a worksheet function (e.g. WALLSTRESSAPP's `lengthUnit`): its name,
 * quantity and default, declared once per function file, and the unit's factor to SI remembered
 * for the last text given.
 */
export class UnitArgument {
  /** the factor of the default unit (NaN for a unit with an offset) */
  private readonly fallbackFactor: number;
  /** the last text given (undefined: none yet) and its factor */
  private lastText: unknown = undefined;
  private lastFactor = NaN;

  constructor(
    readonly argument: string,
    readonly quantity: Quantity,
    readonly fallback: string,
  ) {
    this.fallbackFactor = this.lookUp(fallback);
  }

  /**
   * The unit the argument names (its default when blank or omitted), for the general path.
   * @throws RheoError("value") naming the argument and listing the accepted units (see unitArg)
   */
  read(value: unknown): string {
    return unitArg(value, this.argument, this.quantity, this.fallback);
  }

  /**
   * The factor to SI of the unit the argument names; NaN when the per-row lane must decline (an
   * unknown unit, whose message the general path builds, or a unit with an offset such as °C).
   * Kept small so that the optimiser inlines it: a new text goes to {@link remember}.
   */
  factor(value: unknown): number {
    if (value === undefined) return this.fallbackFactor;
    return value === this.lastText ? this.lastFactor : this.remember(value);
  }

  private remember(value: unknown): number {
    const factor = this.lookUp(value);
    this.lastText = value;
    this.lastFactor = factor;
    return factor;
  }

  private lookUp(value: unknown): number {
    try {
      return unitScale(this.quantity, this.read(value), this.argument).factor ?? NaN;
    } catch {
      return NaN; // an unknown unit: the general path throws the message naming the argument
    }
  }
}

/*
 * The number of a 1×1 range holding a finite number; NaN for anything else. One reader per
 * argument position rather than one shared reader: each function literal keeps its own type
 * feedback, so the optimiser sees one array shape per position (decimals in one, whole numbers in
 * another) and can read the cell without a generic lookup, or drop the 1×1 arrays altogether
 * when it inlines the call into a loop.
 */
function cell0(range: unknown): number {
  if (!Array.isArray(range) || range.length !== 1) return NaN;
  const row: unknown = range[0];
  if (!Array.isArray(row) || row.length !== 1) return NaN;
  const cell: unknown = row[0];
  return typeof cell === "number" && cell - cell === 0 ? cell : NaN;
}
function cell1(range: unknown): number {
  if (!Array.isArray(range) || range.length !== 1) return NaN;
  const row: unknown = range[0];
  if (!Array.isArray(row) || row.length !== 1) return NaN;
  const cell: unknown = row[0];
  return typeof cell === "number" && cell - cell === 0 ? cell : NaN;
}
function cell2(range: unknown): number {
  if (!Array.isArray(range) || range.length !== 1) return NaN;
  const row: unknown = range[0];
  if (!Array.isArray(row) || row.length !== 1) return NaN;
  const cell: unknown = row[0];
  return typeof cell === "number" && cell - cell === 0 ? cell : NaN;
}
function cell3(range: unknown): number {
  if (!Array.isArray(range) || range.length !== 1) return NaN;
  const row: unknown = range[0];
  if (!Array.isArray(row) || row.length !== 1) return NaN;
  const cell: unknown = row[0];
  return typeof cell === "number" && cell - cell === 0 ? cell : NaN;
}

/** A data value in SI: value·factor + 0 (as unitScale's toSI), or the value itself for {@link AS_IS}. */
function si(value: number, factor: number): number {
  return factor === AS_IS ? value : value * factor + 0;
}

/** [[result in the output unit]], or undefined when the result is not finite (the general path makes the #NUM!). */
function shaped(result: number, output: number): unknown[][] | undefined {
  const value = output === AS_IS ? result : result / output;
  return value - value === 0 ? [[value]] : undefined;
}

/**
 * The per-row lane for two data arguments: `compute` on their SI values, shaped as [[value]] in
 * the output unit (factor `output`, or {@link AS_IS} for an SI result); undefined to decline.
 */
export function rowCells2(compute: (a: number, b: number) => number, r0: unknown, f0: number, r1: unknown, f1: number, output: number): unknown[][] | undefined {
  const a = cell0(r0);
  const b = cell1(r1);
  // NaN marks a cell or a unit the lane does not take (NaN !== NaN)
  if (a !== a || b !== b || f0 !== f0 || f1 !== f1 || output !== output) return undefined;
  let result: number;
  try {
    result = compute(si(a, f0), si(b, f1));
  } catch {
    return undefined;
  }
  return shaped(result, output);
}

/** The per-row lane for three data arguments (see {@link rowCells2}). */
export function rowCells3(
  compute: (a: number, b: number, c: number) => number,
  r0: unknown,
  f0: number,
  r1: unknown,
  f1: number,
  r2: unknown,
  f2: number,
  output: number,
): unknown[][] | undefined {
  const a = cell0(r0);
  const b = cell1(r1);
  const c = cell2(r2);
  if (a !== a || b !== b || c !== c || f0 !== f0 || f1 !== f1 || f2 !== f2 || output !== output) return undefined;
  let result: number;
  try {
    result = compute(si(a, f0), si(b, f1), si(c, f2));
  } catch {
    return undefined;
  }
  return shaped(result, output);
}

/** The per-row lane for four data arguments (see {@link rowCells2}). */
export function rowCells4(
  compute: (a: number, b: number, c: number, d: number) => number,
  r0: unknown,
  f0: number,
  r1: unknown,
  f1: number,
  r2: unknown,
  f2: number,
  r3: unknown,
  f3: number,
  output: number,
): unknown[][] | undefined {
  const a = cell0(r0);
  const b = cell1(r1);
  const c = cell2(r2);
  const d = cell3(r3);
  if (a !== a || b !== b || c !== c || d !== d || f0 !== f0 || f1 !== f1 || f2 !== f2 || f3 !== f3 || output !== output) return undefined;
  let result: number;
  try {
    result = compute(si(a, f0), si(b, f1), si(c, f2), si(d, f3));
  } catch {
    return undefined;
  }
  return shaped(result, output);
}
