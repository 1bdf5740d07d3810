/**
 * Raw data tables (a header row of `quantity [unit]` cells, then one row per measurement) to SI
 * measurements for the core. The same reader serves CSV files (row by row, as they stream in),
 * workbook sheets, worksheet ranges and the pane.
 *
 * Each cell is read once: numbers as numbers, text through the one number reader
 * (numberText.ts: one decimal mark per table, ambiguous cells refused), then scaled to SI with
 * the column's factor, found once per column. Only the columns used are read.
 *
 * Every row below the header is accounted for (core/rowAccount.ts): used, or skipped as blank, as
 * a comment line, or for a blank needed cell, each reason with one warning listing the rows.
 * Values outside the plausible range of their quantity (core/plausibility.ts) give a warning
 * that names the likely unit slip.
 */
import { RheoError, Warning, warning } from "../core/errors";
import { unitFactors } from "../core/units";
import { flowRateFromMassRate, flowRateFromPiston } from "../core/flow";
import type { Measurement } from "../core/reduceTypes";
import { type PlausibleKey, checkPlausible, plausibilityText } from "../core/plausibility";
import { type RowAccount, RowList, countText, emptyRowAccount } from "../core/rowAccount";
import { COLUMN_QUANTITIES, ColumnInfo, ColumnName, readHeader } from "./headers";
import { type CellPlace, type DecimalMark, type PendingCell, TableNumberReader, ambiguityText, plainDecimalAt, readAlone } from "./numberText";
import { excerpt } from "./safeText";

/** Most data rows one table may hold: as many as one Excel sheet holds below its header row. */
export const MAX_DATA_ROWS = 1_048_575;

/** Options of {@link readRawTable} and {@link RawTableReader}. */
export interface RawTableOptions {
  /** how rows are named in messages: "line" for files, "row" for worksheets */
  rowWord: "line" | "row";
  /** number of the header row/line (data rows are numbered after it) */
  headerNumber: number;
  /** 1-based numbers of each row (header first), when rows are not consecutive ({@link readRawTable}) */
  rowNumbers?: number[];
  /**
   * the decimal mark to assume when no cell of the table shows it (a comma-delimited file: "."); without it, a
   * table whose only marked numbers could be read either way ("1.160") is refused
   */
  decimalMark?: DecimalMark;
  /** used when there is no barrel_diameter column, SI (m) */
  barrelDiameter?: number;
  /** used when there is no density column, SI (kg/m³) */
  density?: number;
  /** most data rows accepted (default {@link MAX_DATA_ROWS}) */
  maxRows: number;
  /** names the table in messages about the whole table (a file name) */
  source?: string;
}

export const DEFAULT_RAW_TABLE_OPTIONS: Readonly<RawTableOptions> = Object.freeze({
  rowWord: "row",
  headerNumber: 1,
  maxRows: MAX_DATA_ROWS,
});

/** Result of {@link readRawTable}. */
export interface RawTable {
  measurements: Measurement[];
  columns: ColumnInfo[];
  /** numbers of rows skipped because a needed cell was blank (the first 10 000) */
  skippedRows: number[];
  warnings: Warning[];
  /** every row below the header: used or skipped, by reason */
  rows: RowAccount;
  /** the decimal mark the table's text numbers were read with (null: no text number had one) */
  decimalMark: DecimalMark | null;
}

/**
 * A cell as a number, or null when blank; numbers stored as text are read with
 * {@link readAlone} (a text with two readings, such as "1,000", is refused).
 * @param argument names the column in the error, e.g. `pressure [bar] (column 5)`
 * @param place names the row in the error, e.g. `line 7` or `row 4`
 * @throws RheoError("value"): `pressure [bar] (column 5): line 7 is text "n/a", not a number`
 */
export function readNumberCell(cell: unknown, argument: string, place: string): number | null {
  if (cell === null || cell === undefined) return null;
  if (typeof cell === "number") {
    if (!Number.isFinite(cell)) throw new RheoError("value", argument, `${place} is not a finite number (${String(cell)})`);
    return cell;
  }
  if (typeof cell === "string") {
    if (cell.trim() === "") return null;
    const r = readAlone(cell);
    if (typeof r === "number") return r;
    if (r === null) throw new RheoError("value", argument, `${place} is text "${excerpt(cell.trim())}", not a number`, undefined, "NOT_A_NUMBER");
    throw new RheoError("value", argument, `${place} ${ambiguityText(cell.trim(), r.point, r.comma)}; write it without a thousands separator`, undefined, "AMBIGUOUS_NUMBER");
  }
  throw nonNumberCell(cell, argument, place);
}

/** A cell a source could not turn into a value (a formula without a saved result...), with why. */
export class UnreadableCell {
  constructor(readonly why: string) {}
}

function nonNumberCell(cell: unknown, argument: string, place: string): RheoError {
  if (cell instanceof UnreadableCell) return new RheoError("value", argument, `${place} ${cell.why}`);
  if (typeof cell === "boolean") return new RheoError("value", argument, `${place} is a TRUE/FALSE value, not a number`);
  if (cell instanceof Date) return new RheoError("value", argument, `${place} is a date, not a number`);
  if (typeof cell === "object" && cell !== null && "code" in cell && typeof (cell as { code: unknown }).code === "string") {
    return new RheoError("value", argument, `${place} holds the error ${excerpt((cell as { code: string }).code)}`);
  }
  return new RheoError("value", argument, `${place} is not a number (${typeof cell})`);
}

const NO_CORRECTIONS: readonly PendingCell[] = Object.freeze([]);

/** Column of {@link PLAUSIBLE_RANGES} checked for each input column. */
const PLAUSIBLE_KEY: Record<ColumnName, PlausibleKey> = {
  die_diameter: "dieDiameter",
  die_length: "dieLength",
  slit_width: "slitWidth",
  slit_height: "slitHeight",
  piston_speed: "pistonSpeed",
  barrel_diameter: "barrelDiameter",
  flow_rate: "flowRate",
  mass_rate: "massRate",
  density: "density",
  pressure: "pressure",
  temperature: "temperature",
};

/** One column the reader uses, resolved once. */
interface Slot {
  name: ColumnName;
  index: number;
  /** `pressure [bar] (column 5)`: built once */
  label: string;
  unit: string;
  factor: number;
  offset: number;
  /** smallest and largest value as written, with their rows */
  low: number;
  lowRow: number;
  high: number;
  highRow: number;
}

/** A row whose text numbers wait for the table's decimal mark. */
interface DeferredRow {
  /** its place in `measurements` */
  at: number;
  number: number;
  /** values as written (decimal-point reading) per slot; NaN for blank */
  values: Float64Array;
}

/**
 * The needed cells of one unquoted line read as plain decimals into `values` (by slot; NaN for a
 * blank or missing cell); returns the number of blank cells, or -1 when a needed cell is not a
 * plain decimal written with `markCode` (then the caller reads the line the general way).
 * The cells are read in place by {@link plainDecimalAt}, without a string per cell.
 */
function readPlainCells(text: string, delimiter: string, markCode: number, slotAtColumn: Int32Array, values: Float64Array): number {
  values.fill(NaN);
  let blanks = values.length;
  let column = 0;
  let start = 0;
  const n = text.length;
  while (column < slotAtColumn.length && start <= n) {
    let end = text.indexOf(delimiter, start);
    if (end < 0) end = n;
    const slot = slotAtColumn[column] as number;
    if (slot >= 0 && end > start) {
      const value = plainDecimalAt(text, start, end, markCode);
      if (value !== value) return -1;
      values[slot] = value;
      blanks--;
    }
    column++;
    start = end + 1;
  }
  return blanks;
}

/** A slot's value in SI: value·factor + offset (NaN for a column the table does not have). */
function siValue(values: Float64Array, slots: readonly Slot[], s: number | undefined): number {
  return s === undefined ? NaN : (values[s] as number) * (slots[s] as Slot).factor + (slots[s] as Slot).offset;
}

/**
 * Reads a raw table row by row (see the module comment): construct with the header row, `add`
 * each data row, `skip` blank and comment lines a file has, then `finish`.
 *
 * Needs die_diameter (or slit_width and slit_height for slit dies; a row has one or the other),
 * die_length, pressure, and a flow: flow_rate, or piston_speed with barrel_diameter (column or
 * option), or mass_rate with density (column or option); temperature is optional. Unknown
 * columns are ignored with a warning.
 *
 * @throws RheoError naming the column and row, e.g. `pressure [bar] (column 4): line 5 is text "n/a", not a number`
 */
export class RawTableReader {
  readonly columns: ColumnInfo[];
  private readonly opt: RawTableOptions;
  private readonly warnings: Warning[] = [];
  private readonly slots: Slot[] = [];
  private readonly slotOf: Partial<Record<ColumnName, number>> = {};
  private readonly hasSlit: boolean;
  private readonly flowSource: "flow_rate" | "piston_speed" | "mass_rate";
  private readonly numbers: TableNumberReader;
  private readonly measurements: (Measurement | undefined)[] = [];
  private deferred: DeferredRow[] = [];
  private readonly scratch: Float64Array;
  /** for each column index, its slot (-1: a column not read) */
  private readonly slotAtColumn: Int32Array;
  private readonly rows: RowAccount = emptyRowAccount();
  private readonly blankRows = new RowList();
  private readonly commentRows = new RowList();
  /** partly blank rows by the set of blank columns */
  private readonly incomplete = new Map<string, RowList>();
  private readonly skippedRows: number[] = [];
  private dataRows = 0;

  constructor(header: readonly unknown[] | undefined, options: Partial<RawTableOptions> = {}) {
    const opt: RawTableOptions = { ...DEFAULT_RAW_TABLE_OPTIONS, ...options };
    this.opt = opt;
    if (!header || header.every((c) => c === null || c === undefined || String(c).trim() === "")) {
      throw new RheoError("missing", "header", `the first ${opt.rowWord} must hold the column headers, e.g. "pressure [bar]"`);
    }
    this.columns = header.map((h, i) => readHeader(h === null || h === undefined ? "" : String(h), i));
    const byName = new Map<ColumnName, ColumnInfo>();
    for (const c of this.columns) {
      if (c.header.trim() === "") continue;
      if (c.name === null) {
        this.warnings.push(warning("COLUMN_IGNORED", `Column ${c.index + 1} ${c.problem}; it is ignored.`));
        continue;
      }
      if (c.problem) throw new RheoError("value", `column ${c.index + 1}`, c.problem);
      const before = byName.get(c.name);
      if (before) throw new RheoError("value", `column ${c.index + 1}`, `"${excerpt(c.header)}" repeats the quantity ${c.name} of column ${before.index + 1}; keep one of them`, undefined, "DUPLICATE_COLUMN");
      byName.set(c.name, c);
    }
    const hasSlit = byName.has("slit_width") || byName.has("slit_height");
    this.hasSlit = hasSlit;
    if (hasSlit && !(byName.has("slit_width") && byName.has("slit_height"))) {
      const missing = byName.has("slit_width") ? "slit_height" : "slit_width";
      throw new RheoError("missing", missing, `a slit die needs both "slit_width [unit]" and "slit_height [unit]" columns`);
    }
    const geometryColumns: ColumnName[] = [...(byName.has("die_diameter") || !hasSlit ? ["die_diameter" as const] : []), ...(hasSlit ? ["slit_width" as const, "slit_height" as const] : [])];
    const required: ColumnName[] = [...geometryColumns, "die_length", "pressure"];
    for (const name of required) {
      if (!byName.has(name)) {
        throw new RheoError("missing", name, `no "${name} [unit]" column; found: ${this.columns.map((c) => `"${excerpt(c.header)}"`).join(", ")}`);
      }
    }
    const flowSource = byName.has("flow_rate") ? "flow_rate" : byName.has("piston_speed") ? "piston_speed" : byName.has("mass_rate") ? "mass_rate" : null;
    if (flowSource === null) {
      throw new RheoError("missing", "flow_rate", `no flow column: give flow_rate, or piston_speed with barrel_diameter, or mass_rate with density`);
    }
    this.flowSource = flowSource;
    if (flowSource === "piston_speed" && !byName.has("barrel_diameter") && opt.barrelDiameter === undefined) {
      throw new RheoError("missing", "barrel_diameter", `piston_speed needs the barrel bore: add a "barrel_diameter [mm]" column, or give the bore on its own (--barrel-diameter on the command line, the barrelDiameter argument of RHEO.REDUCE)`);
    }
    if (flowSource === "mass_rate" && !byName.has("density") && opt.density === undefined) {
      throw new RheoError("missing", "density", `mass_rate needs the melt density: add a "density [g/cm3]" column, or give it on its own (--density on the command line, the density argument of RHEO.REDUCE)`);
    }
    const used: ColumnName[] = [...required, flowSource];
    if (flowSource === "piston_speed" && byName.has("barrel_diameter")) used.push("barrel_diameter");
    if (flowSource === "mass_rate" && byName.has("density")) used.push("density");
    if (byName.has("temperature")) used.push("temperature");
    for (const name of used) {
      const col = byName.get(name) as ColumnInfo;
      const unit = col.unit as string;
      const { factor, offset } = unitFactors(COLUMN_QUANTITIES[name].quantity, unit, col.header);
      this.slotOf[name] = this.slots.length;
      this.slots.push({ name, index: col.index, label: `${excerpt(col.header)} (column ${col.index + 1})`, unit, factor, offset, low: Infinity, lowRow: 0, high: -Infinity, highRow: 0 });
    }
    this.scratch = new Float64Array(this.slots.length);
    this.slotAtColumn = new Int32Array(Math.max(0, ...this.slots.map((slot) => slot.index + 1))).fill(-1);
    this.slots.forEach((slot, i) => (this.slotAtColumn[slot.index] = i));
    this.numbers = new TableNumberReader({
      describe: (slot, row): CellPlace => ({ column: (this.slots[slot] as Slot).label, row: `${opt.rowWord} ${row}` }),
      fallback: opt.decimalMark,
    });
  }

  /** A blank or comment line of a file below the header. */
  skip(reason: "blank" | "comment", number: number): void {
    this.count();
    (reason === "blank" ? this.blankRows : this.commentRows).add(number);
    this.rows.rowsSkipped[reason] = (this.rows.rowsSkipped[reason] ?? 0) + 1;
  }

  private count(): void {
    this.rows.rowsRead++;
    if (++this.dataRows > this.opt.maxRows) {
      const where = this.opt.source ?? "data";
      throw new RheoError("value", where, `has more than ${countText(this.opt.maxRows)} data ${this.opt.rowWord}s, the most one table may hold (as many as one Excel sheet); reduce a part of it at a time`, undefined, "TOO_MANY_ROWS");
    }
  }

  /** One data row (cells in header order) with its row/line number. */
  add(cells: ArrayLike<unknown>, number: number): void {
    this.count();
    const slots = this.slots;
    const values = this.scratch;
    const undecidedBefore = this.numbers.undecided;
    const at = this.measurements.length;
    let blanks = 0;
    for (let s = 0; s < slots.length; s++) {
      const slot = slots[s] as Slot;
      const cell = cells[slot.index];
      let v: number;
      if (typeof cell === "number") {
        if (!Number.isFinite(cell)) throw new RheoError("value", slot.label, `${this.opt.rowWord} ${number} is not a finite number (${String(cell)})`);
        v = cell;
      } else if (typeof cell === "string") {
        const t = cell.trim();
        v = t === "" ? NaN : this.numbers.read(t, s, number, at);
      } else if (cell === null || cell === undefined) {
        v = NaN;
      } else {
        throw nonNumberCell(cell, slot.label, `${this.opt.rowWord} ${number}`);
      }
      if (v !== v) blanks++;
      values[s] = v;
    }
    this.place(values, number, at, blanks, undecidedBefore);
  }

  /**
   * One data line of a delimited file, as its text (no quotes, no line break). When the table's
   * decimal mark is decided and every needed cell is blank or a plain decimal of at most 15
   * characters ("190.3", "-5", "0,25" in a decimal-comma table), the cells are read straight from
   * the text without splitting it into cell strings; any other line goes through {@link add}.
   *
   * The values are the same bit for bit as the general path's (see plainDecimalAt in numberText.ts).
   */
  addLine(text: string, delimiter: string, number: number): void {
    const mark = this.numbers.mark;
    if (mark === null || this.deferred.length > 0) return this.add(text.split(delimiter), number);
    const values = this.scratch;
    const blanks = readPlainCells(text, delimiter, mark === "." ? 46 : 44, this.slotAtColumn, values);
    if (blanks < 0) return this.add(text.split(delimiter), number);
    this.count();
    this.place(values, number, this.measurements.length, blanks, this.numbers.undecided);
  }

  /** A row's values read (`blanks` of them blank): counted as blank, waiting for the mark, or settled. */
  private place(values: Float64Array, number: number, at: number, blanks: number, undecidedBefore: number): void {
    const slots = this.slots;
    if (blanks === slots.length) {
      this.blankRows.add(number);
      this.rows.rowsSkipped.blank = (this.rows.rowsSkipped.blank ?? 0) + 1;
      return;
    }
    const numbers = this.numbers;
    const corrections = numbers.mark !== null ? numbers.takeCorrections() : NO_CORRECTIONS;
    if (numbers.mark === null && numbers.undecided > undecidedBefore) {
      // a cell of this row could be read two ways: the row waits for the table's decimal mark
      this.measurements.push(undefined);
      this.deferred.push({ at, number, values: values.slice() });
    } else {
      for (const c of corrections) if (c.key === at) values[c.column] = c.comma;
      this.settleRow(values, number, at, false);
    }
    if (this.deferred.length > 0 && numbers.mark !== null) this.settleDeferred(corrections);
  }

  /** Applies the decimal-comma readings of pending cells and settles the rows that waited for them. */
  private settleDeferred(corrections: readonly PendingCell[]): void {
    const byAt = new Map<number, DeferredRow>();
    for (const d of this.deferred) byAt.set(d.at, d);
    for (const c of corrections) {
      const d = byAt.get(c.key);
      if (d) d.values[c.column] = c.comma;
    }
    const rows = this.deferred;
    this.deferred = [];
    for (const d of rows) this.settleRow(d.values, d.number, d.at, true);
  }

  /** Turns one row's values (as written) into a measurement, or counts it as skipped. */
  private settleRow(values: Float64Array, number: number, at: number, placed: boolean): void {
    const slots = this.slots;
    const geometryNotNeeded = this.hasSlit ? this.notNeededGeometry(values, number) : null;
    let blankNames: string | null = null;
    for (let s = 0; s < slots.length; s++) {
      if (values[s] !== values[s]) {
        const slot = slots[s] as Slot;
        if (geometryNotNeeded !== null && geometryNotNeeded.includes(slot.name)) continue;
        blankNames = blankNames === null ? slot.name : `${blankNames}, ${slot.name}`;
      }
    }
    if (blankNames !== null) {
      let list = this.incomplete.get(blankNames);
      if (!list) this.incomplete.set(blankNames, (list = new RowList()));
      list.add(number);
      if (this.skippedRows.length < 10000) this.skippedRows.push(number);
      this.rows.rowsSkipped.incomplete = (this.rows.rowsSkipped.incomplete ?? 0) + 1;
      if (placed) this.measurements[at] = undefined;
      return;
    }
    for (let s = 0; s < slots.length; s++) {
      const v = values[s] as number;
      if (v !== v) continue;
      const slot = slots[s] as Slot;
      if (v < slot.low) {
        slot.low = v;
        slot.lowRow = number;
      }
      if (v > slot.high) {
        slot.high = v;
        slot.highRow = number;
      }
    }
    const of = this.slotOf;
    const isSlit = this.hasSlit && values[of.slit_width as number] === values[of.slit_width as number];
    const flowSource = this.flowSource;
    let flowRate: number;
    try {
      if (flowSource === "flow_rate") flowRate = siValue(values, slots, of.flow_rate);
      else if (flowSource === "piston_speed") flowRate = flowRateFromPiston(siValue(values, slots, of.piston_speed), of.barrel_diameter !== undefined ? siValue(values, slots, of.barrel_diameter) : (this.opt.barrelDiameter as number));
      else flowRate = flowRateFromMassRate(siValue(values, slots, of.mass_rate), of.density !== undefined ? siValue(values, slots, of.density) : (this.opt.density as number));
    } catch (e) {
      throw this.rowError(flowSource, number, e, values);
    }
    const dieLength = siValue(values, slots, of.die_length);
    const pressure = siValue(values, slots, of.pressure);
    let m: Measurement;
    if (isSlit) {
      const slitWidth = siValue(values, slots, of.slit_width);
      const slitHeight = siValue(values, slots, of.slit_height);
      if (!(slitWidth > 0)) throw this.notPositive("slit_width", number, values);
      if (!(slitHeight > 0)) throw this.notPositive("slit_height", number, values);
      m = { slitWidth, slitHeight, dieLength, flowRate, pressure, row: number };
    } else {
      const dieDiameter = siValue(values, slots, of.die_diameter);
      if (!(dieDiameter > 0)) throw this.notPositive("die_diameter", number, values);
      m = { dieDiameter, dieLength, flowRate, pressure, row: number };
    }
    if (!(dieLength > 0)) throw this.notPositive("die_length", number, values);
    if (!(pressure > 0)) throw this.notPositive("pressure", number, values);
    if (!(flowRate > 0)) throw this.notPositive(flowSource, number, values);
    if (of.temperature !== undefined) m.temperature = siValue(values, slots, of.temperature);
    if (placed) this.measurements[at] = m;
    else this.measurements.push(m);
  }

  /** For a slit table: the geometry columns a row may leave blank (the other kind of die). */
  private notNeededGeometry(values: Float64Array, number: number): ColumnName[] {
    const has = (name: ColumnName) => {
      const s = this.slotOf[name];
      return s !== undefined && values[s] === values[s];
    };
    const round = has("die_diameter");
    const slit = has("slit_width") || has("slit_height");
    if (round && slit) {
      throw new RheoError("value", `${this.opt.rowWord} ${number}`, "has both a die diameter and a slit size; give die_diameter for a round die or slit_width and slit_height for a slit");
    }
    return round ? ["slit_width", "slit_height"] : slit ? ["die_diameter"] : [];
  }

  /** "pressure [bar] (column 5): line 7 must be greater than zero, got -3 bar": the value as written. */
  private notPositive(name: ColumnName, number: number, values: Float64Array): RheoError {
    const s = this.slotOf[name];
    const slot = s === undefined ? undefined : this.slots[s];
    const label = slot ? slot.label : name;
    const written = slot && s !== undefined ? `${values[s]} ${slot.unit}` : undefined;
    return new RheoError("domain", label, `${this.opt.rowWord} ${number} must be greater than zero`, undefined, undefined, written);
  }

  /** A core error about one row's value, addressed to the column and line, stating the value as written. */
  private rowError(name: ColumnName, number: number, e: unknown, values: Float64Array): RheoError {
    const s = this.slotOf[name];
    const slot = s === undefined ? undefined : (this.slots[s] as Slot);
    const label = slot ? slot.label : name;
    if (!(e instanceof RheoError)) return new RheoError("value", label, `${this.opt.rowWord} ${number} ${String(e)}`);
    return e.retarget({ argument: label, row: null, context: `${this.opt.rowWord} ${number}`, received: e.received === undefined ? undefined : slot && s !== undefined ? `${values[s]} ${slot.unit}` : e.received });
  }

  /**
   * Ends the table: settles rows still waiting for the decimal mark, checks plausibility, and
   * returns the measurements with the row account and the warnings.
   * @throws RheoError("missing") when no row holds data; ("value") for an ambiguous table
   */
  finish(): RawTable {
    if (this.deferred.length > 0 || this.numbers.undecided > 0) this.settleDeferred(this.numbers.finish());
    const measurements = this.measurements.filter((m): m is Measurement => m !== undefined);
    this.rows.rowsUsed = measurements.length;
    if (measurements.length === 0) throw new RheoError("missing", "data", `no data ${this.opt.rowWord}s below the header`);
    const word = this.opt.rowWord;
    if (this.blankRows.count > 0) this.warnings.push(warning("ROWS_BLANK", `${this.blankRows.text(word)} ${this.blankRows.count === 1 ? "is" : "are"} blank and skipped.`));
    if (this.commentRows.count > 0) this.warnings.push(warning("ROWS_COMMENT", `${this.commentRows.text(word)} ${this.commentRows.count === 1 ? "is a comment line" : "are comment lines"} (starting with #) below the header, skipped.`));
    for (const [names, list] of this.incomplete) this.warnings.push(warning("ROW_SKIPPED_BLANK", `${list.text(word)} skipped: blank ${names}.`));
    for (const slot of this.slots) {
      if (slot.low > slot.high) continue;
      const key = PLAUSIBLE_KEY[slot.name];
      const finding = checkPlausible(key, slot.low, slot.high, slot.unit);
      if (finding) {
        const row = finding.side === "low" ? slot.lowRow : slot.highRow;
        this.warnings.push(warning("IMPLAUSIBLE_VALUE", `${slot.label}, ${word} ${row}: ${plausibilityText(key, finding, slot.unit)}.`));
      }
    }
    return { measurements, columns: this.columns, skippedRows: this.skippedRows, warnings: this.warnings, rows: { ...this.rows, rowsSkipped: { ...this.rows.rowsSkipped } }, decimalMark: this.numbers.mark };
  }
}

/** The note that rows above the header row (a title, notes) were skipped. */
export function preambleWarning(rows: RowList, word: "line" | "row", headerNumber: number): Warning {
  return warning("PREAMBLE_SKIPPED", `${rows.text(word)} above the header row (${word} ${headerNumber}) ${rows.count === 1 ? "was" : "were"} read as a title or notes and skipped.`);
}

/**
 * Reads a raw table held in memory (first row headers) into SI measurements: a worksheet range,
 * the pane's selection, a parsed CSV. See {@link RawTableReader} for the rules.
 * @throws RheoError naming the column and row, e.g. `pressure [bar] (column 4): line 5 is text "n/a", not a number`.
 */
export function readRawTable(cells: unknown[][], options: Partial<RawTableOptions> = {}): RawTable {
  const reader = new RawTableReader(cells[0], options);
  const headerNumber = options.headerNumber ?? DEFAULT_RAW_TABLE_OPTIONS.headerNumber;
  for (let r = 1; r < cells.length; r++) reader.add(cells[r] ?? [], options.rowNumbers?.[r] ?? headerNumber + r);
  return reader.finish();
}
