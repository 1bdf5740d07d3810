/**
 * Rotational-rheometer tables (a header row of `quantity [unit]` cells, then one row per point)
 * to the core's RotationalCurve (SI). One reader for the CLI's `--rotational FILE.csv`, the pane
 * and worksheet ranges.
 *
 * Columns: `angular_frequency [rad/s]` + `complex_viscosity [Pa.s]` (an oscillatory test, joined by
 * the Cox–Merz rule) or `shear_rate [1/s]` + `viscosity [Pa.s]` (steady shear), and optionally
 * `temperature [C]` (one temperature for the whole table). Other columns are ignored with a
 * COLUMN_IGNORED warning; a row with every needed cell blank is skipped silently, one with some
 * blank with ROW_SKIPPED_BLANK. Numbers stored as text are read with one decimal mark for the
 * whole table, as point tables are (numberText.ts): a cell such as "3.547" takes the mark the rest
 * of the table shows, and a table where every such cell reads two ways is refused (or read with
 * the caller's `decimalMark`).
 */
import { RheoError, warning, type Warning } from "../core/errors";
import type { RotationalCurve } from "../core/rotationalJoin";
import { acceptedUnits, isUnitOf, toSI, type Quantity } from "../core/units";
import { normaliseColumnName } from "./headers";
import { readNumberCell } from "./rawTable";
import { TableNumberReader, type CellPlace, type DecimalMark, type PendingCell } from "./numberText";

/** The columns a rotational table may hold, with the quantity of their unit. */
export const ROTATIONAL_COLUMNS = Object.freeze({
  angular_frequency: { quantity: "angularFrequency", description: "angular frequency ω of an oscillatory test" },
  complex_viscosity: { quantity: "viscosity", description: "magnitude of the complex viscosity |η*|" },
  shear_rate: { quantity: "shearRate", description: "steady shear rate γ̇" },
  viscosity: { quantity: "viscosity", description: "steady shear viscosity η" },
  temperature: { quantity: "temperature", description: "test temperature (one for the whole table)" },
} as const satisfies Record<string, { quantity: Quantity; description: string }>);

type RotationalColumn = keyof typeof ROTATIONAL_COLUMNS;

/** Options of {@link readRotationalTable}. */
export interface RotationalTableOptions {
  /** how rows are named in messages: "line" for files, "row" for worksheets */
  rowWord: "line" | "row";
  /** number of the header row/line */
  headerNumber: number;
  /** 1-based numbers of each row (CSV with comments) */
  rowNumbers?: number[];
  /** the argument messages name, e.g. "--rotational" */
  argument: string;
  /**
   * the decimal mark to assume when no cell of the table decides it (a comma-delimited file: a
   * decimal point); without it a table whose numbers all read two ways is refused
   */
  decimalMark?: DecimalMark;
}

export const DEFAULT_ROTATIONAL_TABLE_OPTIONS: Readonly<RotationalTableOptions> = Object.freeze({ rowWord: "row", headerNumber: 1, argument: "rotational" });

/** A rotational curve and what reading it found. */
export interface RotationalTable {
  curve: RotationalCurve;
  warnings: Warning[];
}

/**
 * Reads a rotational table into SI.
 * @throws RheoError naming the argument, column and row: no header, unknown or missing units, both
 *   or neither pair of columns, text or non-positive numbers, several temperatures, no points.
 * @example readRotationalTable([["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], [0.1, 5200]]).curve.kind // "oscillatory"
 */
export function readRotationalTable(cells: unknown[][], options: Partial<RotationalTableOptions> = {}): RotationalTable {
  const opt: RotationalTableOptions = { ...DEFAULT_ROTATIONAL_TABLE_OPTIONS, ...options };
  const arg = opt.argument;
  const header = cells[0];
  if (!header || header.every((c) => c === null || c === undefined || String(c).trim() === "")) {
    throw new RheoError("missing", arg, `the first ${opt.rowWord} must hold the column headers, e.g. "angular_frequency [rad/s]" and "complex_viscosity [Pa.s]"`);
  }
  const warnings: Warning[] = [];
  const byName = new Map<RotationalColumn, { index: number; header: string; unit: string }>();
  header.forEach((cell, index) => {
    const text = cell === null || cell === undefined ? "" : String(cell);
    if (text.trim() === "") return;
    const m = /^\s*([^[(]+?)\s*(?:[[(]\s*([^\])]*?)\s*[\])])?\s*$/.exec(text);
    const key = normaliseColumnName(m?.[1] ?? text);
    if (!(key in ROTATIONAL_COLUMNS)) {
      warnings.push(warning("COLUMN_IGNORED", `Column ${index + 1} "${text}" is not a rotational quantity (${Object.keys(ROTATIONAL_COLUMNS).join(", ")}); it is ignored.`));
      return;
    }
    const name = key as RotationalColumn;
    const quantity = ROTATIONAL_COLUMNS[name].quantity;
    const unit = m?.[2];
    if (!unit) throw new RheoError("value", `${arg} column ${index + 1}`, `"${text}" has no unit; write it as "${name} [unit]" with one of ${acceptedUnits(quantity).join(", ")}`);
    if (!isUnitOf(quantity, unit)) throw new RheoError("value", `${arg} column ${index + 1}`, `"${text}": unknown ${quantity} unit "${unit}"; accepted: ${acceptedUnits(quantity).join(", ")}`);
    if (byName.has(name)) throw new RheoError("value", `${arg} column ${index + 1}`, `"${text}" repeats the quantity ${name}`);
    byName.set(name, { index, header: text, unit });
  });
  const oscillatory = byName.has("angular_frequency") || byName.has("complex_viscosity");
  const steady = byName.has("shear_rate") || byName.has("viscosity");
  if (oscillatory && steady) {
    throw new RheoError("value", arg, "holds both an oscillatory pair (angular_frequency, complex_viscosity) and a steady pair (shear_rate, viscosity); give one curve per table");
  }
  if (!oscillatory && !steady) {
    throw new RheoError("missing", arg, 'needs "angular_frequency [rad/s]" with "complex_viscosity [Pa.s]", or "shear_rate [1/s]" with "viscosity [Pa.s]"');
  }
  const [rateCol, etaCol]: [RotationalColumn, RotationalColumn] = oscillatory ? ["angular_frequency", "complex_viscosity"] : ["shear_rate", "viscosity"];
  for (const name of [rateCol, etaCol]) {
    if (!byName.has(name)) throw new RheoError("missing", arg, `has "${byName.get(name === rateCol ? etaCol : rateCol)?.header}" but no "${name} [unit]" column`);
  }
  const used: RotationalColumn[] = [rateCol, etaCol, ...(byName.has("temperature") ? ["temperature" as const] : [])];
  const columns = used.map((name) => byName.get(name) as { index: number; header: string; unit: string });
  const whereOf = (u: number) => `${arg} ${(columns[u] as { header: string }).header} (column ${(columns[u] as { index: number }).index + 1})`;
  // First pass: every cell's number, text cells read with one decimal mark for the whole table
  // (numberText.ts), as the point-table reader does; a cell with two readings waits for the mark.
  const numbers = new TableNumberReader({ describe: (u, row): CellPlace => ({ column: whereOf(u), row: `${opt.rowWord} ${row}` }), fallback: opt.decimalMark });
  const stored: (number | null)[] = [];
  const rowOf: number[] = [];
  const correct = (list: readonly PendingCell[]) => list.forEach((c) => (stored[c.key] = c.comma));
  for (let r = 1; r < cells.length; r++) {
    const rowCells = cells[r] ?? [];
    const number = opt.rowNumbers?.[r] ?? opt.headerNumber + r;
    rowOf.push(number);
    columns.forEach((col, u) => {
      const cell = rowCells[col.index];
      const key = stored.length;
      if (typeof cell === "string" && cell.trim() !== "") {
        stored.push(numbers.read(cell.trim(), u, number, key));
        correct(numbers.takeCorrections());
      } else stored.push(readNumberCell(cell, whereOf(u), `${opt.rowWord} ${number}`));
    });
  }
  correct(numbers.finish());
  // Second pass: units, signs, blanks.
  const rate: number[] = [];
  const viscosity: number[] = [];
  const temperatures = new Set<number>();
  rowOf.forEach((number, k) => {
    const values = new Map<RotationalColumn, number>();
    const blanks: RotationalColumn[] = [];
    used.forEach((name, u) => {
      const col = columns[u] as { index: number; header: string; unit: string };
      const v = stored[k * used.length + u] as number | null;
      if (v === null) {
        blanks.push(name);
        return;
      }
      const si = toSI(v, col.unit, ROTATIONAL_COLUMNS[name].quantity, col.header);
      if (name !== "temperature" && !(si > 0)) throw new RheoError("domain", whereOf(u), `${opt.rowWord} ${number} must be greater than zero, got ${v}`);
      values.set(name, si);
    });
    if (blanks.length === used.length) return;
    if (blanks.length > 0) {
      warnings.push(warning("ROW_SKIPPED_BLANK", `${arg}: ${opt.rowWord} ${number} skipped: blank ${blanks.join(", ")}.`));
      return;
    }
    rate.push(values.get(rateCol) as number);
    viscosity.push(values.get(etaCol) as number);
    if (values.has("temperature")) temperatures.add(values.get("temperature") as number);
  });
  if (rate.length === 0) throw new RheoError("missing", arg, "has no data rows");
  const temps = [...temperatures];
  if (Math.max(...temps) - Math.min(...temps) > 1) {
    throw new RheoError("value", arg, `holds several temperatures (${temps.map((t) => `${Number((t - 273.15).toPrecision(4))} °C`).join(", ")}); give one curve at one temperature per table`);
  }
  const curve: RotationalCurve = { kind: oscillatory ? "oscillatory" : "steady", rate, viscosity };
  if (temps.length > 0) curve.temperature = temps.reduce((s, t) => s + t, 0) / temps.length;
  return { curve, warnings };
}
