/**
 * The one reader of numbers written as text, shared by the command line (CSV and workbook cells,
 * option values), the worksheet functions (numbers stored as text, settings) and the task pane's
 * fields.
 *
 * A number may be written with a decimal point (`1234.5`, `1,234.5`) or a decimal comma
 * (`1234,5`, `1.234,5`), with thousands grouped by the other mark, a space, a no-break or narrow
 * space, or an apostrophe (`1 234,5`, `1'234.5`), with a sign (`-`, `+`, `−`) and an exponent
 * (`1.5e3`, `1,5E+03`; never grouped). Each text has at most two readings, one per decimal mark;
 * most have one (`190,3`, `0.001`, `1.234,5`), some have two (`1.160`: 1.16, or 1160 with the
 * dot grouping thousands).
 *
 * One field (a pane field, a command-line value, a settings cell) carries no context to decide
 * between them: {@link readNumberText} reads every form that has one reading and refuses a form
 * that has two, naming both. A table (a file, a range) uses one decimal mark:
 * {@link TableNumberReader} decides it from the first cell that has only one reading, checks every
 * other cell against it, and refuses a cell with two readings when nothing in the table decides.
 */
import { RheoError } from "../core/errors";
import { type Quantity, toSI } from "../core/units";
import { excerpt } from "./safeText";

export { excerpt } from "./safeText";

/** The character that separates the decimals. */
export type DecimalMark = "." | ",";

/** Both values of a text that reads two ways. */
export interface TwoReadings {
  point: number;
  comma: number;
}

/** What a text means with each decimal mark; null where it is not a number written that way. */
export interface NumberReadings {
  point: number | null;
  comma: number | null;
}

const DIGIT_0 = 48;
const DIGIT_9 = 57;

function isDigitCode(c: number): boolean {
  return c >= DIGIT_0 && c <= DIGIT_9;
}

/** Characters that group thousands besides the two marks: spaces and apostrophes. */
function isGroupSpace(c: number): boolean {
  return c === 32 || c === 0xa0 || c === 0x202f || c === 0x2009 || c === 39 || c === 0x2019;
}

/** The plain digits (no sign) of a plain decimal number, fast path: digits with at most one `.`. */
const PLAIN_POINT = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
/** Same with a comma: `190,3`, `,5`, `1,5e3`. */
const PLAIN_COMMA = /^[-+]?(?:\d+,?\d*|,\d+)(?:[eE][-+]?\d+)?$/;
/** Only digits, with a sign and an exponent: the same with either mark. */
const PLAIN_INTEGER = /^[-+]?\d+(?:[eE][-+]?\d+)?$/;

/**
 * Reads `text` (trimmed, no surrounding spaces) with decimal mark `mark`; null when it is not a
 * number written that way (see the module comment for the accepted forms).
 * @example readWithMark("1.234,5", ",") // 1234.5
 * @example readWithMark("1.234,5", ".") // null
 */
export function readWithMark(text: string, mark: DecimalMark): number | null {
  const simple = simpleDecimal(text, mark === "." ? 46 : 44);
  if (simple === 1) return Number(text);
  if (simple === 2) return Number(mark === "." ? text : text.replace(",", "."));
  if (PLAIN_INTEGER.test(text)) return finite(Number(text));
  if (mark === ".") {
    if (PLAIN_POINT.test(text)) return finite(Number(text));
  } else if (PLAIN_COMMA.test(text)) {
    return finite(Number(text.replace(",", ".")));
  }
  return readGrouped(text, mark);
}

/**
 * The commonest cells, recognised by one pass over the characters: 1 for digits with an optional
 * leading "-" (an integer), 2 for digits with one `markCode` between or around them ("190.3",
 * ".5", "12."), 0 for anything else (then the general rules apply). At most 15 characters, so the
 * value is exact in a double the way Number() reads it.
 */
function simpleDecimal(text: string, markCode: number): 0 | 1 | 2 {
  const n = text.length;
  if (n === 0 || n > MAX_PLAIN_CHARS) return 0;
  let i = text.charCodeAt(0) === 45 ? 1 : 0;
  let digits = 0;
  let marks = 0;
  for (; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c >= DIGIT_0 && c <= DIGIT_9) digits++;
    else if (c === markCode && marks === 0) marks = 1;
    else return 0;
  }
  if (digits === 0) return 0;
  return marks === 0 ? 1 : 2;
}

/** Longest plain decimal ({@link simpleDecimal}, {@link plainDecimalAt}): at most 14 digits, exact in a double. */
const MAX_PLAIN_CHARS = 15;

/** Exact powers of ten 10^0 … 10^15 (all below 2^53). */
const POWERS_OF_TEN = Float64Array.from({ length: MAX_PLAIN_CHARS + 1 }, (_, k) => 10 ** k);

/**
 * The value of text[start, end) when it is a plain decimal in the sense of {@link simpleDecimal}
 * (optional "-", digits with at most one `markCode` among or around them, at most 15 characters),
 * read without making a string; NaN for anything else (then the general rules apply).
 *
 * Bit for bit what Number() gives for the text: at most 14 digits form an integer m < 2^53 and
 * 10^k (k ≤ 14) is exact, so one IEEE division rounds m / 10^k correctly (the exact fast path of
 * decimal input, W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990).
 */
export function plainDecimalAt(text: string, start: number, end: number, markCode: number): number {
  if (end <= start || end - start > MAX_PLAIN_CHARS) return NaN;
  let i = start;
  const negative = text.charCodeAt(i) === 45;
  if (negative) i++;
  let mantissa = 0;
  let digits = 0;
  let decimals = 0;
  let marks = 0;
  for (; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c >= DIGIT_0 && c <= DIGIT_9) {
      mantissa = mantissa * 10 + (c - DIGIT_0);
      digits++;
      decimals += marks;
    } else if (c === markCode && marks === 0) marks = 1;
    else return NaN;
  }
  if (digits === 0) return NaN;
  const magnitude = mantissa / (POWERS_OF_TEN[decimals] as number);
  return negative ? -magnitude : magnitude;
}

function finite(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

/**
 * The general reader: sign, digits grouped in threes by one separator (not the decimal mark),
 * optional decimal part, optional exponent (then no grouping).
 */
function readGrouped(text: string, mark: DecimalMark): number | null {
  const markCode = mark === "." ? 46 : 44;
  const otherMark = mark === "." ? 44 : 46;
  let i = 0;
  const n = text.length;
  let sign = "";
  const first = text.charCodeAt(0);
  if (first === 43 || first === 45 || first === 0x2212) {
    sign = first === 43 ? "" : "-";
    i = 1;
  }
  let intDigits = "";
  let groupSeparator = -1;
  let groupLength = 0;
  let grouped = false;
  for (; i < n; i++) {
    const c = text.charCodeAt(i);
    if (isDigitCode(c)) {
      intDigits += text[i];
      groupLength++;
      continue;
    }
    if (c === otherMark || isGroupSpace(c)) {
      if (groupSeparator === -1) {
        if (groupLength < 1 || groupLength > 3 || text.charCodeAt(i - groupLength) === DIGIT_0) return null;
        groupSeparator = c;
      } else if (c !== groupSeparator || groupLength !== 3) return null;
      grouped = true;
      groupLength = 0;
      continue;
    }
    break;
  }
  if (grouped && groupLength !== 3) return null;
  let fraction = "";
  if (i < n && text.charCodeAt(i) === markCode) {
    i++;
    const start = i;
    while (i < n && isDigitCode(text.charCodeAt(i))) i++;
    fraction = text.slice(start, i);
  }
  if (intDigits === "" && fraction === "") return null;
  let exponent = "";
  if (i < n && (text.charCodeAt(i) === 101 || text.charCodeAt(i) === 69)) {
    if (grouped) return null;
    const start = ++i;
    const s = text.charCodeAt(i);
    if (s === 43 || s === 45 || s === 0x2212) i++;
    const digitsStart = i;
    while (i < n && isDigitCode(text.charCodeAt(i))) i++;
    if (i === digitsStart) return null;
    exponent = "e" + text.slice(start, i).replace("\u2212", "-");
  }
  if (i !== n) return null;
  const value = Number(`${sign}${intDigits || "0"}.${fraction || "0"}${exponent}`);
  return Number.isFinite(value) ? value : null;
}

/**
 * Both readings of a text (trimmed by the caller or not: surrounding spaces are ignored).
 * @example numberReadings("1.160") // { point: 1.16, comma: 1160 }
 * @example numberReadings("190,3") // { point: null, comma: 190.3 }
 */
export function numberReadings(text: string): NumberReadings {
  const t = text.trim();
  return { point: readWithMark(t, "."), comma: readWithMark(t, ",") };
}

/** Plain words for a mark in messages. */
export function markName(mark: DecimalMark): string {
  return mark === "." ? "a decimal point" : "a decimal comma";
}

/** A number for a message, without float noise: 1.16, 1160, 0.001. */
export function shortNumber(x: number): string {
  return String(Number(x.toPrecision(12)));
}

/**
 * What one text on its own means: its value, both values when it reads two ways, or null when it
 * is no number either way.
 * @example readAlone("1,5") // 1.5
 * @example readAlone("1,000") // { point: 1000, comma: 1 }
 */
export function readAlone(text: string): number | TwoReadings | null {
  const t = text.trim();
  const point = readWithMark(t, ".");
  const comma = readWithMark(t, ",");
  if (point === null) return comma;
  if (comma === null || comma === point) return point;
  return { point, comma };
}

/**
 * Reads one number typed by a person (see the module comment): the unambiguous forms are read, a
 * form with two readings is refused naming both.
 * @throws RheoError("value") naming `argument`: not a number (blank included), or two readings
 * @example readNumberText("1,5", "fullScale") // 1.5
 * @example readNumberText("1,000", "fullScale") // throws: can be read as 1 or as 1000
 */
export function readNumberText(text: string, argument: string): number {
  const r = readAlone(text);
  if (r === null) throw new RheoError("value", argument, `expected a number, got "${excerpt(text.trim())}"`, undefined, "NOT_A_NUMBER");
  if (typeof r === "number") return r;
  const [low, high] = r.point < r.comma ? [r.point, r.comma] : [r.comma, r.point];
  const t = text.trim();
  const mark = t.includes(",") ? "," : ".";
  throw new RheoError(
    "value",
    argument,
    `"${excerpt(t)}" can be read as ${shortNumber(low)} or as ${shortNumber(high)} ("${mark}" as the decimal mark or as a thousands separator); write it without a thousands separator (e.g. "${shortNumber(high)}") or with more decimals`,
    undefined,
    "AMBIGUOUS_NUMBER",
  );
}

/**
 * `"1.160" could be 1.16 (decimal point) or 1160 ("." grouping thousands)`: both readings of a
 * text, each with the role its separator plays.
 */
export function ambiguityText(text: string, point: number, comma: number): string {
  const hasDot = text.indexOf(".") >= 0;
  const hasComma = text.indexOf(",") >= 0;
  const pointRole = hasDot ? "decimal point" : hasComma ? '"," grouping thousands' : "decimal point";
  const commaRole = hasComma ? "decimal comma" : '"." grouping thousands';
  const first = `${shortNumber(point)} (${pointRole})`;
  const second = `${shortNumber(comma)} (${commaRole})`;
  return `"${excerpt(text)}" could be ${hasComma && !hasDot ? `${second} or ${first}` : `${first} or ${second}`}`;
}

/**
 * Splits "15 mm", "700bar", "1 000 bar", "-1,5e3 Pa" into the number's text and the rest (the
 * unit, possibly empty). Grouping spaces count only before exactly three digits, so "100 1/s"
 * splits as 100 and "1/s".
 * @returns null when the text does not start with a number
 */
export function splitNumberAndUnit(text: string): { number: string; unit: string } | null {
  const t = text.trim();
  const n = t.length;
  let i = 0;
  const s = t.charCodeAt(0);
  if (s === 43 || s === 45 || s === 0x2212) i = 1;
  let digits = 0;
  for (; i < n; i++) {
    const c = t.charCodeAt(i);
    if (isDigitCode(c)) {
      digits++;
      continue;
    }
    const next = t.charCodeAt(i + 1);
    if ((c === 46 || c === 44 || c === 39 || c === 0x2019) && isDigitCode(next)) continue;
    if ((c === 32 || c === 0xa0 || c === 0x202f || c === 0x2009) && digits > 0 && /^\d{3}(?!\d)/.test(t.slice(i + 1, i + 5))) continue;
    break;
  }
  if (digits === 0) return null;
  if (i < n && (t.charCodeAt(i) === 101 || t.charCodeAt(i) === 69)) {
    const m = /^[eE][-+\u2212]?\d+/.exec(t.slice(i));
    if (m) i += m[0].length;
  }
  return { number: t.slice(0, i), unit: t.slice(i).trim() };
}

/**
 * Splits "value unit" text ("15 mm", "15mm", "0,25 %", "1 234,5 bar") into its number (read by
 * {@link readNumberText}) and its unit text ("" when none).
 * @throws RheoError("value") naming `argument` when the text does not start with a number, or
 *   its number reads two ways
 */
export function readQuantityText(text: string, argument: string): { value: number; unit: string } {
  const split = splitNumberAndUnit(text);
  if (split === null) throw new RheoError("value", argument, `expected a number with a unit, e.g. "15 mm", got "${excerpt(text.trim())}"`, undefined, "NOT_A_NUMBER");
  return { value: readNumberText(split.number, argument), unit: split.unit };
}

/**
 * Reads a pane field or option holding a quantity: "15", "15 mm", "700 bar", "1,5 mm",
 * "1 000 bar". A bare number is in `defaultUnit`; a unit written after it must be a unit of
 * `quantity`. The number follows {@link readNumberText}: "1,000" (1 or 1000?) is refused.
 * @returns the value in SI units, or null for a blank field
 * @throws RheoError("value") naming `argument`
 * @example readFieldQuantity("1,000 bar", "pressure", "bar", "fullScale") // throws: can be read as 1 or as 1000
 * @example readFieldQuantity("15", "length", "mm", "barrel") // 0.015
 */
export function readFieldQuantity(text: string, quantity: Quantity, defaultUnit: string, argument: string = quantity): number | null {
  if (text.trim() === "") return null;
  const { value, unit } = readQuantityText(text, argument);
  return toSI(value, unit === "" ? defaultUnit : unit, quantity, argument);
}

// ---------------------------------------------------------------------------------------------
// One decimal mark per table

/** Where a cell is, for messages: the column as the user knows it and the row/line number. */
export interface CellPlace {
  /** e.g. `pressure [bar] (column 5)` */
  column: string;
  /** e.g. `line 7` or `row 7` */
  row: string;
}

/** A cell read with two readings before the table's mark was known, kept until it is. */
export interface PendingCell {
  /** the caller's column index and row number, as passed to `read` */
  column: number;
  row: number;
  /** the caller's key (which stored value to correct) */
  key: number;
  text: string;
  point: number;
  comma: number;
}

/** Options of {@link TableNumberReader}. */
export interface TableNumberReaderOptions {
  /** names a cell for messages; called only when a message is built or the mark is decided */
  describe: (column: number, row: number) => CellPlace;
  /**
   * the mark to assume when the table never decides (a comma-delimited file: decimal point);
   * without it a table that never decides refuses its two-reading cells
   */
  fallback?: DecimalMark;
  /** cells kept undecided before the table is refused as ambiguous (bounds memory); default 100 000 */
  maxPending?: number;
}

/**
 * Reads the text cells of one table with one decimal mark (see the module comment).
 *
 * `read` returns a cell's value. While no cell has decided the mark, a cell with two readings
 * returns its decimal-point reading and is kept as pending; the first one-reading cell decides
 * the mark, and `takeCorrections()` then hands back the pending cells whose value must change
 * (to their decimal-comma reading). `finish()` settles what is still open: the fallback mark, or
 * an error naming the first ambiguous cell and both its readings.
 */
const NONE_PENDING: readonly PendingCell[] = Object.freeze([]);

export class TableNumberReader {
  /** the decided mark, or null while undecided */
  mark: DecimalMark | null = null;
  /** the cell that decided the mark (for messages) */
  private evidence: { text: string; place: CellPlace } | null = null;
  private pending: PendingCell[] = [];
  private corrections: PendingCell[] = [];
  private readonly describe: (column: number, row: number) => CellPlace;
  private readonly fallback: DecimalMark | undefined;
  private readonly maxPending: number;

  constructor(options: TableNumberReaderOptions) {
    this.describe = options.describe;
    this.fallback = options.fallback;
    this.maxPending = options.maxPending ?? 100000;
  }

  /**
   * The value of a non-blank, trimmed text cell.
   * @param column,row the caller's column index and row number (for messages and pending cells)
   * @param key the caller's key for a pending cell
   * @throws RheoError("value") naming the column and row: not a number, or a mark that contradicts
   *   the table's
   */
  read(text: string, column: number, row: number, key: number): number {
    const mark = this.mark;
    if (mark !== null) {
      const v = readWithMark(text, mark);
      if (v !== null) return v;
      const otherMark = mark === "." ? "," : ".";
      if (readWithMark(text, otherMark) === null) throw notANumber(text, this.describe(column, row));
      throw this.contradiction(text, this.describe(column, row), otherMark);
    }
    const point = readWithMark(text, ".");
    const comma = readWithMark(text, ",");
    if (point === null && comma === null) throw notANumber(text, this.describe(column, row));
    if (comma === null || point === comma) {
      if (comma === null && hasMark(text)) this.decide(".", text, column, row);
      return point as number;
    }
    if (point === null) {
      this.decide(",", text, column, row);
      return comma;
    }
    // two readings, undecided: keep it
    if (this.pending.length >= this.maxPending) {
      if (this.fallback === undefined) throw this.ambiguous(this.pending[0] as PendingCell, true);
      this.settle(this.fallback);
      return this.fallback === "." ? point : comma;
    }
    this.pending.push({ column, row, key, text, point, comma });
    return point;
  }

  /** Pending cells whose stored (decimal-point) value must be replaced by `comma`; emptied on read. */
  takeCorrections(): readonly PendingCell[] {
    const out = this.corrections;
    if (out.length === 0) return NONE_PENDING; // most rows: no new array per row
    this.corrections = [];
    return out;
  }

  /** Number of cells waiting for the mark. */
  get undecided(): number {
    return this.pending.length;
  }

  /**
   * Closes the table: an undecided table takes the fallback mark (corrections as from
   * `takeCorrections`), or is refused when it holds two-reading cells and has no fallback.
   * @throws RheoError("value") naming the first ambiguous cell and both its readings
   */
  finish(): readonly PendingCell[] {
    if (this.mark === null && this.pending.length > 0) {
      if (this.fallback === undefined) throw this.ambiguous(this.pending[0] as PendingCell, false);
      this.settle(this.fallback);
    }
    return this.takeCorrections();
  }

  private decide(mark: DecimalMark, text: string, column: number, row: number): void {
    this.evidence = { text, place: this.describe(column, row) };
    this.settle(mark);
  }

  private settle(mark: DecimalMark): void {
    this.mark = mark;
    if (mark === ",") this.corrections.push(...this.pending);
    this.pending = [];
  }

  private contradiction(text: string, place: CellPlace, cellMark: DecimalMark): RheoError {
    const ev = this.evidence;
    const seen = ev ? `, but ${ev.place.row} (${ev.place.column}) "${excerpt(ev.text)}" has ${markName(this.mark as DecimalMark)}` : `, but the table is read with ${markName(this.mark as DecimalMark)}`;
    return new RheoError("value", place.column, `${place.row} "${excerpt(text)}" has ${markName(cellMark)}${seen}; a table must use one decimal mark`, undefined, "MIXED_DECIMAL_MARKS");
  }

  private ambiguous(cell: PendingCell, many: boolean): RheoError {
    const place = this.describe(cell.column, cell.row);
    const scope = many ? ` in its first ${this.maxPending} such cells` : "";
    return new RheoError(
      "value",
      place.column,
      `${place.row} ${ambiguityText(cell.text, cell.point, cell.comma)}, and no number in the table${scope} shows which decimal mark it uses; write one number with its decimal part (e.g. "1160,0" or "1.16") or remove the thousands separators`,
      undefined,
      "AMBIGUOUS_NUMBER",
    );
  }
}

function hasMark(text: string): boolean {
  return text.indexOf(".") >= 0 || text.indexOf(",") >= 0;
}

function notANumber(text: string, place: CellPlace): RheoError {
  return new RheoError("value", place.column, `${place.row} is text "${excerpt(text)}", not a number`, undefined, "NOT_A_NUMBER");
}
