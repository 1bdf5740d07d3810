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

/** Output factor of a result in SI: the result divided by 1, which leaves every number as it is. */
export const SI_RESULT = 1;

/**
 * One unit argument of a worksheet function (e.g. WALLSTRESSAPP's `lengthUnit`): its name,
 * quantity and default, declared once per function file, and the unit's factor to SI remembered
 * for the last text given.
 */
export class UnitArgument {
  /** the factor of the default unit (NaN for a unit with an offset) */
  private readonly fallbackFactor: number;
  /** the last unit text given (undefined: none yet) and its factor */
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
   * An omitted unit (undefined, or null as Excel may pass it) is the default's factor; a unit
   * given is compared with the last one given, and only a new one is looked up (out of line, in
   * {@link remember}, which a per-row fill-down reaches once: see the lane's notes below on
   * paths seldom taken).
   */
  factor(value: unknown): number {
    if (value == null) return this.fallbackFactor;
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

/**
 * The answer of a call the lane does not take: undefined, the caller's general path answers.
 * A call rather than a bare `undefined` on purpose (see below).
 */
function declined(): undefined {
  return undefined;
}

/*
 * How the lane is written, and why (`npm run bench` measures it; docs/performance.md).
 *
 * In the bench's loop, as in any JavaScript caller, the optimiser inlines the worksheet
 * function, this lane and the core function into the caller, and can then drop the 1×1
 * argument arrays and the [[value]] answer altogether (escape analysis): a row then costs a few
 * times the bare arithmetic instead of some twenty times. Two things decide whether it does.
 *
 * The inlining budget, counted in bytecode: about 920 bytes per optimised function, and a
 * candidate counts 1.2 × (its own bytecode + everything its own optimised code already
 * inlined). A worksheet function optimised on its own before its caller (a race between the
 * compiler threads) counts with its whole tree; a tree over about 760 bytes is then not inlined
 * and every argument array escapes into the call. So the lane is written small in bytecode:
 *   - the cells are read in place (`range[0][0]`) inside the try: a range that is not an array
 *     of arrays throws on reading and declines like a core error; no Array.isArray, no reader
 *     functions;
 *   - the shape is checked by one sum of lengths: each of the 2n lengths is at least 1 once its
 *     cell was read, so the sum is 2n only if every range is 1×1;
 *   - finiteness is checked once, on the SI values: a cell that is not finite, a NaN unit factor
 *     (a unit the lane does not take) or an overflow in the conversion makes an SI value
 *     non-finite, and x − x is 0 only for a finite x; the value in the output unit likewise (a
 *     NaN output factor, a core result that is not finite);
 *   - one way out for every decline.
 *
 * The decline itself: were it a plain `undefined`, the lane's answer would merge undefined and
 * the new [[value]] array, and an array that flows into such a merge is always allocated. A
 * call that has never run carries no type feedback, and the optimiser compiles it as "leave the
 * optimised code here" instead of as a branch; so while no call has declined, the answer is only
 * ever the array and the caller's `??` and `[0][0]` see through it. The same holds for every
 * path seldom taken (UnitArgument.remember, the function's general path): while it has never run
 * it costs nothing, so such paths stay out of line, behind one call each. Once the function has
 * declined in the process (a column spilled through it, a blank or an error row), the decline and
 * the call to the general path are ordinary branches: the answer array merges again, and the
 * argument arrays reach a call the optimiser does not inline, which (its escape analysis is not
 * partial) keeps them allocated on every call. `npm run bench` shows that state on an info line.
 */

/**
 * The per-row lane for two data arguments: `compute` on their SI values, shaped as [[value]] in
 * the output unit (factor `output`, {@link SI_RESULT} for a result in SI); undefined to decline.
 */
export function rowCells2(compute: (a: number, b: number) => number, r0: unknown, f0: number, r1: unknown, f1: number, output: number): unknown[][] | undefined {
  try {
    const row0 = (r0 as unknown[][])[0]!;
    const row1 = (r1 as unknown[][])[0]!;
    const a = row0[0];
    const b = row1[0];
    if (typeof a === "number" && typeof b === "number" && (r0 as unknown[]).length + row0.length + (r1 as unknown[]).length + row1.length === 4) {
      const x = f0 === AS_IS ? a : a * f0 + 0;
      const y = f1 === AS_IS ? b : b * f1 + 0;
      if (x - x + (y - y) === 0) {
        const result = compute(x, y);
        const value = result / output;
        if (value - value === 0) return [[value]];
      }
    }
  } catch {
    // a core error or a range that is not an array of arrays: the general path says which
  }
  return declined();
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
  try {
    const row0 = (r0 as unknown[][])[0]!;
    const row1 = (r1 as unknown[][])[0]!;
    const row2 = (r2 as unknown[][])[0]!;
    const a = row0[0];
    const b = row1[0];
    const c = row2[0];
    if (
      typeof a === "number" &&
      typeof b === "number" &&
      typeof c === "number" &&
      (r0 as unknown[]).length + row0.length + (r1 as unknown[]).length + row1.length + (r2 as unknown[]).length + row2.length === 6
    ) {
      const x = f0 === AS_IS ? a : a * f0 + 0;
      const y = f1 === AS_IS ? b : b * f1 + 0;
      const z = f2 === AS_IS ? c : c * f2 + 0;
      if (x - x + (y - y) + (z - z) === 0) {
        const result = compute(x, y, z);
        const value = result / output;
        if (value - value === 0) return [[value]];
      }
    }
  } catch {
    // a core error or a range that is not an array of arrays: the general path says which
  }
  return declined();
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
  try {
    const row0 = (r0 as unknown[][])[0]!;
    const row1 = (r1 as unknown[][])[0]!;
    const row2 = (r2 as unknown[][])[0]!;
    const row3 = (r3 as unknown[][])[0]!;
    const a = row0[0];
    const b = row1[0];
    const c = row2[0];
    const d = row3[0];
    if (
      typeof a === "number" &&
      typeof b === "number" &&
      typeof c === "number" &&
      typeof d === "number" &&
      (r0 as unknown[]).length + row0.length + (r1 as unknown[]).length + row1.length + (r2 as unknown[]).length + row2.length + (r3 as unknown[]).length + row3.length === 8
    ) {
      const x = f0 === AS_IS ? a : a * f0 + 0;
      const y = f1 === AS_IS ? b : b * f1 + 0;
      const z = f2 === AS_IS ? c : c * f2 + 0;
      const w = f3 === AS_IS ? d : d * f3 + 0;
      if (x - x + (y - y) + (z - z) + (w - w) === 0) {
        const result = compute(x, y, z, w);
        const value = result / output;
        if (value - value === 0) return [[value]];
      }
    }
  } catch {
    // a core error or a range that is not an array of arrays: the general path says which
  }
  return declined();
}
