/**
 * Pressure–time recordings ("trace tables"): one row per sample, `quantity [unit]` headers as in
 * raw point tables (headers.ts), read into SI die runs for the step detection of
 * src/core/steps. The same reader serves CSV files, worksheet ranges and the pane.
 *
 * Columns: time; piston_speed or piston_position; pressure, or force with barrel_diameter
 * (column or option); die_diameter (or slit_width and slit_height), die_length; barrel_diameter
 * and temperature optional. The die columns are constant within a die run: a new run starts
 * where a die or barrel value changes or where the time goes back (the clock restarted). A run's
 * temperature is the mean of its readings.
 *
 * A blank run (barrel friction, `--blank`) has piston_speed or piston_position and force, with
 * time (a recording: its steps are detected) or without (one steady point per row).
 */
import { RheoError, Warning, warning } from "../core/errors";
import { toSI, type Quantity } from "../core/units";
import { barrelArea, type BlankPoint } from "../core/steps/friction";
import type { TraceRun } from "../core/steps/runSteps";
import { COLUMN_QUANTITIES, ColumnInfo, readHeaderOf } from "./headers";
import { readNumberCell } from "./rawTable";
import { TableNumberReader, readWithMark, type DecimalMark } from "./numberText";

/** The quantities of a trace table: the raw table's and the recording's own. */
export const TRACE_COLUMN_QUANTITIES = {
  ...COLUMN_QUANTITIES,
  time: { quantity: "time", description: "time of the sample" },
  piston_position: { quantity: "length", description: "piston (crosshead) position; the speed is derived from it" },
  force: { quantity: "force", description: "piston force (with barrel_diameter: pressure = force / barrel area)" },
} as const satisfies Record<string, { quantity: Quantity; description: string }>;

export type TraceColumnName = keyof typeof TRACE_COLUMN_QUANTITIES;

/** Options of {@link readTraceTable}. */
export interface TraceTableOptions {
  /** how rows are named in messages: "line" for files, "row" for worksheets */
  rowWord: "line" | "row";
  /** number of the header row/line (data rows are numbered after it) */
  headerNumber: number;
  /** 1-based numbers of each row, when rows are not consecutive (CSV with comments) */
  rowNumbers?: number[];
  /**
   * the decimal mark to assume when no cell of the table decides it (a comma-delimited file: ".");
   * without it a table whose numbers all have two readings is refused
   */
  decimalMark?: DecimalMark;
  /** used when there is no barrel_diameter column, SI (m) */
  barrelDiameter?: number;
  /** names the table in messages and in the runs (a file name) */
  source?: string;
}

export const DEFAULT_TRACE_TABLE_OPTIONS: Readonly<TraceTableOptions> = Object.freeze({ rowWord: "row", headerNumber: 1 });

/** Result of {@link readTraceTable}. */
export interface TraceTable {
  runs: TraceRun[];
  columns: ColumnInfo<TraceColumnName>[];
  /** "pressure" or "force" (pressure = force / barrel area) */
  pressureSource: "pressure" | "force";
  /** "piston_speed" or "piston_position" */
  speedSource: "piston_speed" | "piston_position";
  warnings: Warning[];
}

/** True when a header row reads as a trace table (it has a `time [unit]` column). */
export function isTraceHeader(header: readonly unknown[]): boolean {
  return header.some((h) => typeof h === "string" && readHeaderOf(h, 0, TRACE_COLUMN_QUANTITIES).name === "time");
}

interface Columns {
  byName: Map<TraceColumnName, ColumnInfo<TraceColumnName>>;
  columns: ColumnInfo<TraceColumnName>[];
  warnings: Warning[];
}

function readColumns(header: readonly unknown[] | undefined, rowWord: string, what: string): Columns {
  if (!header || header.every((c) => c === null || c === undefined || String(c).trim() === "")) {
    throw new RheoError("missing", "header", `the first ${rowWord} of the ${what} must hold the column headers, e.g. "time [s]"`);
  }
  const columns = header.map((h, i) => readHeaderOf(h === null || h === undefined ? "" : String(h), i, TRACE_COLUMN_QUANTITIES));
  const byName = new Map<TraceColumnName, ColumnInfo<TraceColumnName>>();
  const warnings: Warning[] = [];
  for (const c of columns) {
    if (c.header.trim() === "") continue;
    if (c.name === null) {
      warnings.push(warning("COLUMN_IGNORED", `Column ${c.index + 1} ${c.problem}; it is ignored.`));
      continue;
    }
    if (c.problem) throw new RheoError("value", `column ${c.index + 1}`, c.problem);
    if (byName.has(c.name)) throw new RheoError("value", `column ${c.index + 1}`, `"${c.header}" repeats the quantity ${c.name}`);
    byName.set(c.name, c);
  }
  return { byName, columns, warnings };
}

function pick<T extends TraceColumnName>(byName: Map<TraceColumnName, unknown>, names: readonly T[]): T | null {
  return names.find((n) => byName.has(n)) ?? null;
}

/** One value per used column per row, SI; rows with blanks collected for one warning. */
function readSamples(cells: unknown[][], cols: Columns, used: TraceColumnName[], optional: TraceColumnName[], opt: TraceTableOptions) {
  const all = [...used, ...optional];
  const values = new Map<TraceColumnName, number[]>(all.map((n) => [n, []]));
  const lines: number[] = [];
  const skipped: { line: number; blanks: TraceColumnName[] }[] = [];
  const convert = all.map((name) => {
    const col = cols.byName.get(name) as ColumnInfo<TraceColumnName>;
    const argument = `${col.header} (column ${col.index + 1})`;
    return { name, col, argument, toSI: (v: number) => toSI(v, col.unit as string, TRACE_COLUMN_QUANTITIES[name].quantity, col.header) };
  });
  // one decimal mark for the whole table, decided from every text number (as for point tables)
  const marks = new TableNumberReader({
    describe: (column, r) => ({ column: (convert[column] as (typeof convert)[number]).argument, row: `${opt.rowWord} ${opt.rowNumbers?.[r] ?? opt.headerNumber + r}` }),
    fallback: opt.decimalMark,
  });
  for (let r = 1; r < cells.length; r++) {
    const rowCells = cells[r] ?? [];
    convert.forEach((c, k) => {
      const cell = rowCells[c.col.index];
      if (typeof cell === "string" && cell.trim() !== "") marks.read(cell.trim(), k, r, 0);
    });
  }
  marks.finish();
  const mark: DecimalMark = marks.mark ?? opt.decimalMark ?? ".";
  const cellNumber = (cell: unknown, argument: string, place: string): number | null =>
    typeof cell === "string" && cell.trim() !== "" ? (readWithMark(cell.trim(), mark) as number) : readNumberCell(cell, argument, place);
  const row = new Map<TraceColumnName, number>();
  for (let r = 1; r < cells.length; r++) {
    const rowCells = cells[r] ?? [];
    const number = opt.rowNumbers?.[r] ?? opt.headerNumber + r;
    const place = `${opt.rowWord} ${number}`;
    row.clear();
    const blanks: TraceColumnName[] = [];
    let anyUsed = false;
    for (const c of convert) {
      const v = cellNumber(rowCells[c.col.index], c.argument, place);
      if (v === null) {
        if (used.includes(c.name)) blanks.push(c.name);
        continue;
      }
      if (used.includes(c.name)) anyUsed = true;
      row.set(c.name, c.toSI(v));
    }
    if (!anyUsed && blanks.length === used.length) continue;
    if (blanks.length > 0) {
      skipped.push({ line: number, blanks });
      continue;
    }
    for (const c of convert) (values.get(c.name) as number[]).push(row.get(c.name) ?? NaN);
    lines.push(number);
  }
  const warnings: Warning[] = [];
  if (skipped.length > 0) {
    const shown = skipped.slice(0, 10).map((s) => `${s.line} (blank ${s.blanks.join(", ")})`).join(", ");
    warnings.push(warning("ROW_SKIPPED_BLANK", `${skipped.length} ${opt.rowWord}${skipped.length === 1 ? "" : "s"} of samples skipped for blank cells: ${opt.rowWord}${skipped.length === 1 ? "" : "s"} ${shown}${skipped.length > 10 ? ", …" : ""}.`));
  }
  return { values, lines, warnings };
}

/**
 * Reads a trace table (first row headers) into SI die runs (see the module comment).
 * @throws RheoError naming the column and row of a bad cell, or the missing column
 * @example readTraceTable([["time [s]", "piston_speed [mm/min]", "pressure [bar]", "die_diameter [mm]", "die_length [mm]"], [0, 1, 2, 1, 20]]).runs.length // 1
 */
export function readTraceTable(cells: unknown[][], options: Partial<TraceTableOptions> = {}): TraceTable {
  const opt: TraceTableOptions = { ...DEFAULT_TRACE_TABLE_OPTIONS, ...options };
  const cols = readColumns(cells[0], opt.rowWord, "recording");
  const { byName } = cols;
  const found = () => cols.columns.filter((c) => c.header.trim() !== "").map((c) => `"${c.header}"`).join(", ");
  if (!byName.has("time")) throw new RheoError("missing", "time", `no "time [s]" column; found: ${found()}`);
  const speedSource = pick(byName, ["piston_speed", "piston_position"] as const);
  if (!speedSource) throw new RheoError("missing", "piston_speed", `no "piston_speed [mm/min]" or "piston_position [mm]" column; found: ${found()}`);
  const pressureSource = pick(byName, ["pressure", "force"] as const);
  if (!pressureSource) throw new RheoError("missing", "pressure", `no "pressure [bar]" or "force [N]" column; found: ${found()}`);
  if (byName.has("pressure") && byName.has("force")) throw new RheoError("value", "force", "give pressure or force, not both");
  const slit = byName.has("slit_width") || byName.has("slit_height");
  if (slit && !(byName.has("slit_width") && byName.has("slit_height"))) {
    throw new RheoError("missing", byName.has("slit_width") ? "slit_height" : "slit_width", `a slit die needs both "slit_width [unit]" and "slit_height [unit]" columns`);
  }
  if (slit && byName.has("die_diameter")) throw new RheoError("value", "die_diameter", "a recording is of round dies (die_diameter) or slits (slit_width, slit_height), not both");
  const geometry: TraceColumnName[] = slit ? ["slit_width", "slit_height"] : ["die_diameter"];
  for (const name of [...geometry, "die_length"] as TraceColumnName[]) {
    if (!byName.has(name)) throw new RheoError("missing", name, `no "${name} [unit]" column; found: ${found()}`);
  }
  if (pressureSource === "force" && !byName.has("barrel_diameter") && opt.barrelDiameter === undefined) {
    throw new RheoError("missing", "barrel_diameter", `force needs the barrel bore to give a pressure: add a "barrel_diameter [mm]" column, or give the bore on its own (--barrel-diameter on the command line)`);
  }
  for (const name of ["flow_rate", "mass_rate", "density"] as const) {
    if (byName.has(name)) cols.warnings.push(warning("COLUMN_IGNORED", `Column ${(byName.get(name) as ColumnInfo<TraceColumnName>).index + 1} "${name}" is not used in a recording: the flow comes from the piston; it is ignored.`));
  }
  const used: TraceColumnName[] = ["time", speedSource, pressureSource, ...geometry, "die_length"];
  const optional: TraceColumnName[] = (["barrel_diameter", "temperature"] as const).filter((n) => byName.has(n));
  const { values, lines, warnings } = readSamples(cells, cols, used, optional, opt);
  if (lines.length === 0) throw new RheoError("missing", "data", `no samples below the header`);
  const col = (n: TraceColumnName) => values.get(n) as number[];
  const time = col("time");
  const runs: TraceRun[] = [];
  const keyCols: TraceColumnName[] = [...geometry, "die_length", ...optional.filter((n) => n === "barrel_diameter")];
  let start = 0;
  const flush = (end: number) => {
    if (end <= start) return;
    runs.push(buildRun(values, lines, start, end, geometry, pressureSource, speedSource, opt));
    start = end;
  };
  for (let i = 1; i < lines.length; i++) {
    const restart = (time[i] as number) < (time[i - 1] as number);
    const changed = keyCols.some((n) => {
      const a = col(n)[i] as number;
      const b = col(n)[i - 1] as number;
      return Number.isNaN(a) ? !Number.isNaN(b) : a !== b;
    });
    if (restart || changed) flush(i);
  }
  flush(lines.length);
  return { runs, columns: cols.columns, pressureSource, speedSource, warnings: [...cols.warnings, ...warnings] };
}

function buildRun(
  values: Map<TraceColumnName, number[]>,
  lines: number[],
  a: number,
  b: number,
  geometry: TraceColumnName[],
  pressureSource: "pressure" | "force",
  speedSource: "piston_speed" | "piston_position",
  opt: TraceTableOptions,
): TraceRun {
  const slice = (n: TraceColumnName) => (values.get(n) as number[]).slice(a, b);
  const first = (n: TraceColumnName) => (values.get(n) as number[])[a] as number;
  const barrelColumn = values.has("barrel_diameter") ? first("barrel_diameter") : NaN;
  const barrelDiameter = Number.isNaN(barrelColumn) ? opt.barrelDiameter : barrelColumn;
  const place = `${opt.rowWord} ${lines[a]}`;
  const positive = (v: number, name: string) => {
    if (!(v > 0)) throw new RheoError("domain", name, `${place}: must be greater than zero, got ${v}`);
    return v;
  };
  const die = geometry[0] === "die_diameter"
    ? { dieDiameter: positive(first("die_diameter"), "die_diameter"), dieLength: positive(first("die_length"), "die_length") }
    : { slitWidth: positive(first("slit_width"), "slit_width"), slitHeight: positive(first("slit_height"), "slit_height"), dieLength: positive(first("die_length"), "die_length") };
  let pressure = slice(pressureSource);
  if (pressureSource === "force") {
    const area = barrelArea(positive(barrelDiameter as number, "barrel_diameter"));
    pressure = pressure.map((f) => f / area);
  }
  const run: TraceRun = { time: slice("time"), pressure, die, lines: lines.slice(a, b) };
  if (speedSource === "piston_speed") run.pistonSpeed = slice("piston_speed");
  else run.pistonPosition = slice("piston_position");
  if (barrelDiameter !== undefined) run.barrelDiameter = positive(barrelDiameter, "barrel_diameter");
  if (values.has("temperature")) {
    const t = slice("temperature").filter((v) => !Number.isNaN(v));
    run.temperature = t.length > 0 ? t.reduce((s, v) => s + v, 0) / t.length : null;
  }
  if (opt.source !== undefined) run.source = opt.source;
  return run;
}

/** A blank run as read: a recording (its steps give the points) or steady points. */
export type BlankTable = { kind: "recording"; run: TraceRun; warnings: Warning[] } | { kind: "points"; points: BlankPoint[]; warnings: Warning[] };

/**
 * Reads a blank run: force against piston speed (or position), with a time column (a recording)
 * or without (one steady point per row). Die columns are not needed and are ignored.
 * @throws RheoError naming the column and row of a bad cell, or the missing column
 */
export function readBlankTable(cells: unknown[][], options: Partial<TraceTableOptions> = {}): BlankTable {
  const opt: TraceTableOptions = { ...DEFAULT_TRACE_TABLE_OPTIONS, ...options };
  const cols = readColumns(cells[0], opt.rowWord, "blank run");
  const { byName } = cols;
  if (!byName.has("force")) throw new RheoError("missing", "force", `the blank run needs a "force [N]" column (piston force with no die, against piston speed)`);
  const recording = byName.has("time");
  const speedSource = recording ? pick(byName, ["piston_speed", "piston_position"] as const) : byName.has("piston_speed") ? "piston_speed" : null;
  if (!speedSource) throw new RheoError("missing", "piston_speed", recording ? `the blank run needs "piston_speed [mm/min]" or "piston_position [mm]"` : `the blank run needs "piston_speed [mm/min]" (or a "time [s]" column to read it as a recording)`);
  const used: TraceColumnName[] = recording ? ["time", speedSource, "force"] : [speedSource, "force"];
  const { values, lines, warnings } = readSamples(cells, cols, used, [], opt);
  if (lines.length === 0) throw new RheoError("missing", "blank", "has no rows below the header");
  for (const [name, c] of byName) {
    if (!used.includes(name)) cols.warnings.push(warning("COLUMN_IGNORED", `Column ${c.index + 1} "${c.header}" is not used in a blank run; it is ignored.`));
  }
  const all = [...cols.warnings, ...warnings];
  const col = (n: TraceColumnName) => values.get(n) as number[];
  if (!recording) {
    return { kind: "points", points: lines.map((_, i) => ({ pistonSpeed: col("piston_speed")[i] as number, force: col("force")[i] as number })), warnings: all };
  }
  const run: TraceRun = { time: col("time"), pressure: col("force"), lines };
  if (speedSource === "piston_speed") run.pistonSpeed = col("piston_speed");
  else run.pistonPosition = col("piston_position");
  if (opt.source !== undefined) run.source = opt.source;
  return { kind: "recording", run, warnings: all };
}
