/**
 * The usual shape of a worksheet function: read paired data ranges in their units, convert to SI,
 * compute per row or over all rows, convert back, spill aligned with the input.
 */
import { RheoError } from "../../core/errors";
import { Quantity } from "../../core/units";
import { Rows, column, eachRow, pairRows, readVector, spill } from "./ranges";
import { unitScale } from "./unitScale";

/** One data argument: its range, its name and (for dimensional data) its quantity and unit. */
export interface DataArg {
  argument: string;
  range: unknown;
  quantity?: Quantity;
  unit?: string;
}

/** Paired rows in SI, with the values as the user typed them (for messages). */
export interface SheetRows extends Rows {
  /** per argument, the kept rows' values in the user's unit */
  typed: Record<string, number[]>;
  units: Record<string, string | undefined>;
}

/** Reads and pairs the data arguments; every column of the result is in SI. */
export function readRows(args: DataArg[]): SheetRows {
  const rows = pairRows(args.map((a) => readVector(a.range, a.argument)));
  const typed: Record<string, number[]> = {};
  const units: Record<string, string | undefined> = {};
  for (const a of args) {
    const { quantity, unit } = a;
    typed[a.argument] = column(rows, a.argument);
    units[a.argument] = unit;
    if (quantity !== undefined && unit !== undefined) {
      const scale = unitScale(quantity, unit, a.argument);
      rows.columns[a.argument] = column(rows, a.argument).map(scale.toSI);
    }
  }
  return { ...rows, typed, units };
}

/**
 * Element-wise function: `compute` receives the SI values of the arguments (in the order of
 * `args`) for each kept row and returns an SI value, which is converted to `output.unit`.
 * `rename` maps the core's argument names to the worksheet's where they differ. A core message
 * ending "got <SI value>" is rewritten to the value and unit the user typed.
 */
export function mapRows(
  args: DataArg[],
  compute: (...values: number[]) => number,
  output?: { quantity: Quantity; unit: string },
  rename: Readonly<Record<string, string>> = NO_RENAME,
): unknown[][] {
  const single = singleCellResult(args, compute, output);
  if (single !== undefined) return single;
  const rows = readRows(args);
  const names = args.map((a) => a.argument);
  let k = 0;
  const values = eachRow(rows, names, (...v) => {
    try {
      return compute(...v);
    } catch (thrown) {
      throw inUserTerms(thrown, rows, k, rename);
    } finally {
      k++;
    }
  });
  return spill(rows, output ? values.map(unitScale(output.quantity, output.unit, "unit").fromSI) : values);
}

const NO_RENAME: Readonly<Record<string, string>> = Object.freeze({});

/** The number in a 1×1 range, or undefined for anything else (blank, text, a longer range...). */
function singleNumber(range: unknown): number | undefined {
  if (!Array.isArray(range) || range.length !== 1) return undefined;
  const row: unknown = range[0];
  if (!Array.isArray(row) || row.length !== 1) return undefined;
  const cell: unknown = row[0];
  return typeof cell === "number" && Number.isFinite(cell) ? cell : undefined;
}

/**
 * Fast path of {@link mapRows} for the commonest call: one formula per row, every data argument a
 * single cell holding a finite number (Excel batches thousands of these). Gives exactly what the
 * general path gives ([[value]]); returns undefined, to take the general path, for any other
 * input or when `compute` throws (the general path then builds the positioned error message).
 * Up to four arguments are passed without building an array (no allocation but the result).
 */
function singleCellResult(
  args: DataArg[],
  compute: (...values: number[]) => number,
  output?: { quantity: Quantity; unit: string },
): unknown[][] | undefined {
  const n = args.length;
  if (n > 4) return singleCellResultMany(args, compute, output);
  let v0 = 0;
  let v1 = 0;
  let v2 = 0;
  let v3 = 0;
  for (let i = 0; i < n; i++) {
    const a = args[i] as DataArg;
    const v = singleNumber(a.range);
    if (v === undefined) return undefined;
    const x = a.quantity !== undefined && a.unit !== undefined ? unitScale(a.quantity, a.unit, a.argument).toSI(v) : v;
    if (i === 0) v0 = x;
    else if (i === 1) v1 = x;
    else if (i === 2) v2 = x;
    else v3 = x;
  }
  let result: number;
  try {
    result = n === 1 ? compute(v0) : n === 2 ? compute(v0, v1) : n === 3 ? compute(v0, v1, v2) : compute(v0, v1, v2, v3);
  } catch {
    return undefined;
  }
  return [[output ? unitScale(output.quantity, output.unit, "unit").fromSI(result) : result]];
}

function singleCellResultMany(args: DataArg[], compute: (...values: number[]) => number, output?: { quantity: Quantity; unit: string }): unknown[][] | undefined {
  const values: number[] = [];
  for (const a of args) {
    const v = singleNumber(a.range);
    if (v === undefined) return undefined;
    values.push(a.quantity !== undefined && a.unit !== undefined ? unitScale(a.quantity, a.unit, a.argument).toSI(v) : v);
  }
  let result: number;
  try {
    result = compute(...values);
  } catch {
    return undefined;
  }
  return [[output ? unitScale(output.quantity, output.unit, "unit").fromSI(result) : result]];
}

function inUserTerms(thrown: unknown, rows: SheetRows, k: number, rename: Record<string, string>): unknown {
  if (!(thrown instanceof RheoError) || thrown.row !== undefined) return thrown;
  const argument = rename[thrown.argument] ?? thrown.argument;
  const typed = rows.typed[argument]?.[k];
  const unit = rows.units[argument];
  // the value as the user typed it, in the user's unit, in place of the core's SI value
  const received = typed !== undefined && thrown.received !== undefined ? `${typed}${unit ? ` ${unit}` : ""}` : undefined;
  return thrown.retarget({ argument, ...(received !== undefined ? { received } : {}) });
}
