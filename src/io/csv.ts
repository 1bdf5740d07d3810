/**
 * A streaming CSV reader for instrument exports: RFC 4180 quoting (a quoted cell may hold the
 * delimiter, doubled quotes and line breaks), CRLF or LF line ends, `#` comment lines; the
 * delimiter (comma, semicolon or tab) is detected from the first content line, counting outside
 * quotes. Text is pushed in chunks of any size and every record is handed to a sink as soon as it
 * is complete, so a file is never held whole in memory.
 *
 * Limits, so that a damaged file ends in a message and not in an exhausted memory: one record
 * (line) holds at most {@link DEFAULT_CSV_LIMITS.maxRecordChars} characters; an unterminated
 * quote is reported with the line and column where it opens.
 *
 * Which decimal mark the numbers use is not decided here: see numberText.ts.
 */
import { RheoError } from "../core/errors";

/** One parsed record with its 1-based line number in the file (the line it starts on). */
export interface CsvLine {
  line: number;
  cells: string[];
}

export type CsvDelimiter = "," | ";" | "\t";

/** What the parser hands over, in file order. */
export interface CsvSink {
  /** a record (a line of cells; a line of only delimiters gives empty cells) */
  record(cells: string[], line: number): void;
  /** a `#` comment line */
  comment?(line: number): void;
  /** an empty (or all-space) line */
  blank?(line: number): void;
  /**
   * a record on one line without quotes, as its text (no line break): for a sink that reads the
   * cells itself; without it, `record(text.split(delimiter))`
   */
  line?(text: string, delimiter: CsvDelimiter, line: number): void;
}

/** Limits of the reader. */
export interface CsvLimits {
  /** longest record, in characters */
  maxRecordChars: number;
}

export const DEFAULT_CSV_LIMITS: Readonly<CsvLimits> = Object.freeze({ maxRecordChars: 1_000_000 });

const QUOTE = 34;
const NEWLINE = 10;
const RETURN = 13;

/**
 * Push-based parser (see the module comment).
 * @example const p = new CsvParser(sink); p.push("a;b\n1,5;"); p.push("2\n"); p.end();
 */
export class CsvParser {
  /** the detected delimiter (null until the first content line is complete) */
  delimiter: CsvDelimiter | null;
  private buffer = "";
  private line = 1;
  private readonly limits: CsvLimits;
  private readonly source: string;

  /**
   * @param source names the file in messages
   * @param delimiter a known delimiter (otherwise detected)
   */
  constructor(
    private readonly sink: CsvSink,
    options: { source?: string; delimiter?: CsvDelimiter; limits?: Partial<CsvLimits> } = {},
  ) {
    this.delimiter = options.delimiter ?? null;
    this.source = options.source ?? "input";
    this.limits = { ...DEFAULT_CSV_LIMITS, ...options.limits };
  }

  /** Adds text; complete records are handed to the sink. */
  push(text: string): void {
    this.buffer = this.buffer.length === 0 ? text : this.buffer + text;
    this.drain(false);
  }

  /** Ends the input: the last record (without a final line break) is handed over. */
  end(): void {
    this.drain(true);
    if (this.delimiter === null) this.delimiter = ",";
  }

  private drain(final: boolean): void {
    const buf = this.buffer;
    const n = buf.length;
    let pos = 0;
    while (pos < n) {
      const first = buf.charCodeAt(pos);
      const lineEnd = buf.indexOf("\n", pos);
      if (first === 35 /* # */) {
        if (lineEnd < 0 && !final) break;
        this.sink.comment?.(this.line);
        this.line++;
        pos = lineEnd < 0 ? n : lineEnd + 1;
        continue;
      }
      if (this.delimiter === null) {
        // the delimiter comes from the first content line: wait until it is whole
        const end = this.contentLineEnd(buf, pos, final);
        if (end === null) break;
        const text = buf.slice(pos, end);
        if (text.trim() === "") {
          this.sink.blank?.(this.line);
          this.line++;
          pos = end + 1;
          continue;
        }
        this.delimiter = detectDelimiter(text);
      }
      const delimiter = this.delimiter;
      if (buf.indexOf('"', pos) < 0) {
        // no quote in the rest of the buffer: every line is one record, split natively
        const stop = final ? n : buf.lastIndexOf("\n") + 1;
        if (stop <= pos) break;
        this.plainLines(buf.slice(pos, final && buf.charCodeAt(n - 1) !== NEWLINE ? n : stop - 1), delimiter);
        pos = stop;
        continue;
      }
      // a record on one line without quotes
      const end = lineEnd < 0 ? (final ? n : -1) : lineEnd;
      if (end < 0) break;
      const text = buf.slice(pos, end);
      if (text.indexOf('"') < 0) {
        const body = text.charCodeAt(text.length - 1) === RETURN ? text.slice(0, -1) : text;
        if (body.trim() === "") this.sink.blank?.(this.line);
        else this.plainRecord(body, delimiter);
        this.line++;
        pos = end + 1;
        continue;
      }
      const parsed = this.quotedRecord(buf, pos, final);
      if (parsed === null) break;
      this.sink.record(parsed.cells, this.line);
      this.line += 1 + parsed.breaks;
      pos = parsed.next;
    }
    this.buffer = pos >= n ? "" : buf.slice(pos);
    if (this.buffer.length > this.limits.maxRecordChars) this.tooLong();
  }

  /** Hands over lines without quotes (no line break at the end of `text`). */
  private plainLines(text: string, delimiter: CsvDelimiter): void {
    const sink = this.sink;
    for (let start = 0; start <= text.length; ) {
      const newline = text.indexOf("\n", start);
      const end = newline < 0 ? text.length : newline;
      const line = text.slice(start, text.charCodeAt(end - 1) === RETURN && end > start ? end - 1 : end);
      const first = line.charCodeAt(0);
      if (first === 35 /* # */) sink.comment?.(this.line);
      else if (line.length === 0 || ((first === 32 || first === 9) && line.trim() === "")) sink.blank?.(this.line);
      else this.plainRecord(line, delimiter);
      this.line++;
      start = end + 1;
    }
  }

  /** One record without quotes: its text to a sink that reads cells itself, else its cells. */
  private plainRecord(text: string, delimiter: CsvDelimiter): void {
    if (this.sink.line) this.sink.line(text, delimiter, this.line);
    else this.sink.record(text.split(delimiter), this.line);
  }

  /** End of the line at `pos` outside quotes, or null when the chunk ends first. */
  private contentLineEnd(buf: string, pos: number, final: boolean): number | null {
    let inQuote = false;
    for (let i = pos; i < buf.length; i++) {
      const c = buf.charCodeAt(i);
      if (c === QUOTE) inQuote = !inQuote;
      else if (c === NEWLINE && !inQuote) return i;
    }
    return final ? buf.length : null;
  }

  /**
   * One record that holds quotes, starting at `pos`; null when it is not complete in the buffer
   * (and the input has not ended).
   * @throws RheoError at the end of the input when a quoted cell never closes
   */
  private quotedRecord(buf: string, pos: number, final: boolean): { cells: string[]; next: number; breaks: number } | null {
    const delim = (this.delimiter as CsvDelimiter).charCodeAt(0);
    const n = buf.length;
    const cells: string[] = [];
    let breaks = 0;
    let i = pos;
    for (;;) {
      // one field starting at i
      let j = i;
      while (j < n && (buf.charCodeAt(j) === 32 || (buf.charCodeAt(j) === 9 && delim !== 9))) j++;
      let value: string;
      if (j < n && buf.charCodeAt(j) === QUOTE) {
        let k = j + 1;
        let text = "";
        for (;;) {
          const q = buf.indexOf('"', k);
          if (q < 0 || (q === n - 1 && !final)) {
            if (!final) return null;
            this.unterminated(buf, pos, j, cells.length + 1);
          }
          if (buf.charCodeAt(q + 1) === QUOTE) {
            text += buf.slice(k, q + 1);
            k = q + 2;
            continue;
          }
          text += buf.slice(k, q);
          k = q + 1;
          break;
        }
        for (let b = text.indexOf("\n"); b >= 0; b = text.indexOf("\n", b + 1)) breaks++;
        // characters after the closing quote, up to the delimiter, are kept (lenient)
        let e = k;
        while (e < n && buf.charCodeAt(e) !== delim && buf.charCodeAt(e) !== NEWLINE) e++;
        if (e === n && !final) return null;
        let tail = buf.slice(k, e);
        if (tail.charCodeAt(tail.length - 1) === RETURN) tail = tail.slice(0, -1);
        value = tail.trim() === "" ? text : text + tail;
        i = e;
      } else {
        let e = i;
        while (e < n && buf.charCodeAt(e) !== delim && buf.charCodeAt(e) !== NEWLINE) e++;
        if (e === n && !final) return null;
        value = buf.slice(i, e);
        if (value.charCodeAt(value.length - 1) === RETURN && (e === n || buf.charCodeAt(e) === NEWLINE)) value = value.slice(0, -1);
        i = e;
      }
      cells.push(value);
      if (i >= n) return { cells, next: n, breaks };
      if (buf.charCodeAt(i) === NEWLINE) return { cells, next: i + 1, breaks };
      i++; // the delimiter
    }
  }

  private unterminated(buf: string, recordStart: number, quoteAt: number, column: number): never {
    // the line breaks before the quote all sit in earlier quoted cells of this record
    let line = this.line;
    for (let i = buf.indexOf("\n", recordStart); i >= 0 && i < quoteAt; i = buf.indexOf("\n", i + 1)) line++;
    const rest = buf.length - quoteAt;
    throw new RheoError(
      "value",
      this.source,
      `line ${line}, column ${column}: unterminated quote: the quoted cell that opens there is never closed (the remaining ${describeSize(rest)} of the file would be one cell); close the quote or remove it`,
      undefined,
      "UNTERMINATED_QUOTE",
    );
  }

  private tooLong(): never {
    const openQuote = this.openQuoteIn(this.buffer);
    const limit = describeSize(this.limits.maxRecordChars);
    if (openQuote !== null) {
      throw new RheoError(
        "value",
        this.source,
        `line ${openQuote.line}, column ${openQuote.column}: unterminated quote? the quoted cell that opens there runs on for more than ${limit}; close the quote or remove it`,
        undefined,
        "UNTERMINATED_QUOTE",
      );
    }
    throw new RheoError("value", this.source, `line ${this.line} is longer than ${limit} (the limit of one line); is this a data table?`, undefined, "LINE_TOO_LONG");
  }

  /** Where the first quote of the pending record that is still open sits. */
  private openQuoteIn(buf: string): { line: number; column: number } | null {
    const delim = (this.delimiter ?? ",").charCodeAt(0);
    let inQuote = false;
    let line = this.line;
    let column = 1;
    let openLine = 0;
    let openColumn = 0;
    for (let i = 0; i < buf.length; i++) {
      const c = buf.charCodeAt(i);
      if (c === QUOTE) {
        if (!inQuote) {
          openLine = line;
          openColumn = column;
        }
        inQuote = !inQuote;
      } else if (c === NEWLINE) {
        line++;
        if (!inQuote) column = 1;
      } else if (c === delim && !inQuote) column++;
    }
    return inQuote ? { line: openLine, column: openColumn } : null;
  }
}

/** "1.0 MB", "34 KB", "120 characters" */
function describeSize(chars: number): string {
  if (chars >= 1e6) return `${(chars / 1e6).toFixed(1)} million characters`;
  if (chars >= 1e4) return `${Math.round(chars / 1e3)} thousand characters`;
  return `${chars} characters`;
}

/** The delimiter of a line: the most frequent of comma, semicolon and tab outside quotes (comma on a tie). */
export function detectDelimiter(line: string): CsvDelimiter {
  let comma = 0;
  let semicolon = 0;
  let tab = 0;
  let inQuote = false;
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    if (c === QUOTE) inQuote = !inQuote;
    else if (inQuote) continue;
    else if (c === 44) comma++;
    else if (c === 59) semicolon++;
    else if (c === 9) tab++;
  }
  if (semicolon > comma && semicolon >= tab) return ";";
  if (tab > comma && tab > semicolon) return "\t";
  return ",";
}

/** A whole CSV text parsed at once (comment and blank lines left out). */
export interface CsvTable {
  delimiter: CsvDelimiter;
  lines: CsvLine[];
}

/**
 * Splits CSV text into lines of cells (see the module comment); blank and comment lines are left
 * out, line numbers are the file's.
 * @example parseCsv("a;b\n1,5;2\n").lines // [{ line: 1, cells: ["a", "b"] }, { line: 2, cells: ["1,5", "2"] }]
 */
export function parseCsv(text: string, source?: string): CsvTable {
  const lines: CsvLine[] = [];
  const parser = new CsvParser(
    {
      record: (cells, line) => {
        if (!(cells.length === 1 && (cells[0] as string).trim() === "")) lines.push({ line, cells });
      },
    },
    { source },
  );
  parser.push(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  parser.end();
  return { delimiter: parser.delimiter as CsvDelimiter, lines };
}
