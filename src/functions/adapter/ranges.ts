/**
 * Ranges as Excel passes them (2-D arrays of cell values) → numeric columns with their positions,
 * and results → grids that spill in the caller's orientation.
 *
 * Rules (README, "Conventions of the RHEO functions"):
 * - a data argument is one column or one row; a single cell is allowed and is repeated against
 *   longer ranges ("broadcast");
 * - paired ranges have equal lengths, else a #VALUE! naming both;
 * - blank cells (null, undefined, "" or only spaces) mark a row to skip; a row is skipped when
 *   any paired cell of it is blank, and column results keep that row empty so they stay aligned;
 * - numbers stored as text ("12.5", " 1e3 ", "1,5", "1.234,5") are read as numbers by the one
 *   number reader (src/io/numberText.ts); a text with two readings ("1,000": 1 or 1000?), other
 *   text, logical values and error values are refused with a #VALUE! naming the argument and the row.
 */
import { RheoError } from "../../core/errors";
import { ambiguityText, readAlone } from "../../io/numberText";
import { excerpt } from "../../io/safeText";

/** How a range runs: down a column, across a row, or a single cell. */
export type Orientation = "column" | "row" | "single";

/** A data argument read from a range. `values[i]` is null where the cell is blank. */
export interface Vector {
  argument: string;
  orientation: Orientation;
  values: (number | null)[];
}

/** "row 4" down a column, "column 4" across a row: where the user finds the cell in the range. */
export function position(orientation: Orientation, index: number): string {
  return `${orientation === "row" ? "column" : "row"} ${index + 1}`;
}

/** A RheoError located at one cell of a range. */
export function errorAt(error: RheoError, argument: string, orientation: Orientation, index: number): RheoError {
  return error.retarget({ argument, row: null, context: position(orientation, index) });
}

/** True for the cell values Excel passes for an empty cell. */
export function isBlank(cell: unknown): boolean {
  return cell === null || cell === undefined || (typeof cell === "string" && cell.trim() === "");
}

/**
 * Reads one cell as a number: null when blank; throws a `value` RheoError otherwise.
 * @param where e.g. "row 4", used in the message
 */
export function readNumber(cell: unknown, argument: string, where: string): number | null {
  if (isBlank(cell)) return null;
  if (typeof cell === "number") {
    if (Number.isFinite(cell)) return cell;
    throw new RheoError("value", argument, `${where} is not a finite number (${String(cell)})`);
  }
  if (typeof cell === "string") {
    const text = cell.trim();
    const r = readAlone(text);
    if (typeof r === "number") return r;
    if (r !== null) throw new RheoError("value", argument, `${where} ${ambiguityText(text, r.point, r.comma)}; write it without a thousands separator`, undefined, "AMBIGUOUS_NUMBER");
    throw new RheoError("value", argument, `${where} is text "${excerpt(cell)}"`);
  }
  if (typeof cell === "boolean") {
    throw new RheoError("value", argument, `${where} is the logical value ${cell ? "TRUE" : "FALSE"}, not a number`);
  }
  const code = errorCodeOf(cell);
  if (code !== undefined) throw new RheoError("value", argument, `${where} holds the error ${code}`);
  throw new RheoError("value", argument, `${where} is not a number`);
}

function errorCodeOf(cell: unknown): string | undefined {
  if (typeof cell === "object" && cell !== null && "code" in cell) {
    const code = (cell as { code: unknown }).code;
    if (typeof code === "string" && code.startsWith("#")) return code;
  }
  return undefined;
}

/** The cells of a range argument as a flat list with its orientation; throws for 2-D blocks. */
export function flatten(range: unknown, argument: string): { orientation: Orientation; cells: unknown[] } {
  if (range === null || range === undefined) {
    throw new RheoError("missing", argument, "is required");
  }
  if (!Array.isArray(range)) return { orientation: "single", cells: [range] };
  const rows = range.map((row: unknown) => (Array.isArray(row) ? (row as unknown[]) : [row]));
  const height = rows.length;
  const width = Math.max(0, ...rows.map((r) => r.length));
  if (height === 0 || width === 0) throw new RheoError("missing", argument, "is an empty range");
  if (height > 1 && width > 1) {
    throw new RheoError("value", argument, `must be a single column or row, got a ${height}×${width} range`);
  }
  if (height > 1) return { orientation: "column", cells: rows.map((r) => r[0]) };
  if (width > 1) return { orientation: "row", cells: rows[0] as unknown[] };
  return { orientation: "single", cells: [(rows[0] as unknown[])[0]] };
}

/** Reads a column or row of numbers; blank cells give null. */
export function readVector(range: unknown, argument: string): Vector {
  const { orientation, cells } = flatten(range, argument);
  const values = cells.map((cell, i) => readNumber(cell, argument, position(orientation, i)));
  return { argument, orientation, values };
}

/** Paired vectors with the blank rows removed. */
export interface Rows {
  /** number of positions in the caller's ranges (the spill length of a column result) */
  length: number;
  /** orientation of the result: that of the first range longer than one cell */
  orientation: Orientation;
  /** the positions (0-based) of the rows kept, i.e. with no blank paired cell */
  kept: number[];
  /** per argument, the values of the kept rows */
  columns: Record<string, number[]>;
}

/**
 * Pairs data arguments row by row: checks equal lengths (single cells repeat), drops the rows
 * with a blank in any argument. A blank single cell repeated against a longer range is an error
 * (#N/A), since it would empty every row.
 */
export function pairRows(vectors: Vector[]): Rows {
  const long = vectors.filter((v) => v.values.length > 1);
  const first = long[0];
  const length = first ? first.values.length : 1;
  for (const v of long) {
    if (v.values.length !== length && first) {
      throw new RheoError(
        "value",
        v.argument,
        `has ${v.values.length} cells but ${first.argument} has ${length}; paired ranges must have equal lengths`,
      );
    }
  }
  if (length > 1) {
    for (const v of vectors) {
      if (v.values.length === 1 && v.values[0] === null) {
        throw new RheoError("missing", v.argument, "is blank; give a value or a range as long as the data");
      }
    }
  }
  const kept: number[] = [];
  for (let i = 0; i < length; i++) {
    if (vectors.every((v) => (v.values.length === 1 ? v.values[0] : v.values[i]) !== null)) kept.push(i);
  }
  const columns: Record<string, number[]> = {};
  for (const v of vectors) {
    columns[v.argument] = kept.map((i) => (v.values.length === 1 ? v.values[0] : v.values[i]) as number);
  }
  return { length, orientation: first ? first.orientation : "single", kept, columns };
}

/** The values of one paired argument (throws if the name was not paired: a programming error). */
export function column(rows: Rows, argument: string): number[] {
  const values = rows.columns[argument];
  if (!values) throw new Error(`argument "${argument}" was not paired`);
  return values;
}

/**
 * Spills values computed for the kept rows back at their positions, "" at skipped rows, in the
 * caller's orientation (a column for columns and single cells, a row for rows).
 */
export function spill(rows: Rows, values: unknown[]): unknown[][] {
  if (values.length !== rows.kept.length) {
    throw new Error(`spill: ${values.length} values for ${rows.kept.length} rows`);
  }
  const line: unknown[] = new Array<unknown>(rows.length).fill("");
  rows.kept.forEach((pos, k) => {
    line[pos] = values[k];
  });
  return rows.orientation === "row" ? [line] : line.map((v) => [v]);
}

/**
 * Runs a core call on the kept rows and rewrites a row number in its RheoError (which counts the
 * kept rows from 1) to the position in the caller's range. `rename` maps the core's argument
 * names to the worksheet's where they differ.
 */
export function atRows<T>(rows: Rows, call: () => T, rename: Record<string, string> = {}): T {
  try {
    return call();
  } catch (thrown) {
    if (!(thrown instanceof RheoError)) throw thrown;
    const argument = rename[thrown.argument] ?? thrown.argument;
    const pos = thrown.row !== undefined ? rows.kept[thrown.row - 1] : undefined;
    if (pos !== undefined) throw errorAt(thrown, argument, rows.orientation, pos);
    if (argument !== thrown.argument) throw thrown.retarget({ argument });
    throw thrown;
  }
}

/**
 * Applies `compute` to each kept row (values in argument order of `names`); a row that throws
 * makes the whole call fail with the row's position in the message.
 */
export function eachRow(rows: Rows, names: string[], compute: (...values: number[]) => number): number[] {
  const cols = names.map((n) => column(rows, n));
  return rows.kept.map((pos, k) => {
    try {
      return compute(...cols.map((c) => c[k] as number));
    } catch (thrown) {
      if (thrown instanceof RheoError && thrown.row === undefined) throw errorAt(thrown, thrown.argument, rows.orientation, pos);
      throw thrown;
    }
  });
}
