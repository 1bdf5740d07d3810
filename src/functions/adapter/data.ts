/**
 * The usual shape of a worksheet function: read paired data ranges in their units, convert to SI,
 * compute per row or over all rows, convert back, spill aligned with the input.
 */
import { RheoError } from "../../core/errors";
import { Quantity, fromSI, toSI } from "../../core/units";
import { Rows, column, eachRow, pairRows, readVector, spill } from "./ranges";

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
      rows.columns[a.argument] = column(rows, a.argument).map((v) => toSI(v, unit, quantity, a.argument));
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
  rename: Record<string, string> = {},
): unknown[][] {
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
  return spill(rows, output ? values.map((v) => fromSI(v, output.unit, output.quantity)) : values);
}

function inUserTerms(thrown: unknown, rows: SheetRows, k: number, rename: Record<string, string>): unknown {
  if (!(thrown instanceof RheoError) || thrown.row !== undefined) return thrown;
  const argument = rename[thrown.argument] ?? thrown.argument;
  let rest = thrown.message.slice(`${thrown.argument}: `.length);
  const typed = rows.typed[argument]?.[k];
  const unit = rows.units[argument];
  if (typed !== undefined && /got \S+$/.test(rest)) rest = rest.replace(/got \S+$/, `got ${typed}${unit ? ` ${unit}` : ""}`);
  return new RheoError(thrown.kind, argument, rest);
}
