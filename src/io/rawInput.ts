/**
 * A raw-data file to measurements: bytes streamed in chunks through the text decoder
 * (textDecode.ts), the CSV parser (csv.ts) and the row-by-row table reader (rawTable.ts), so
 * memory holds the measurements, never the file. A workbook (xlsx) is recognised from its bytes
 * and handed back for the workbook reader (workbookInput.ts); any other non-text file is refused
 * with what it is.
 */
import { RheoError, type Warning } from "../core/errors";
import { RowList } from "../core/rowAccount";
import { CsvParser, type CsvDelimiter } from "./csv";
import { HEADER_SEARCH_ROWS, knownColumnName } from "./headers";
import { type RawTable, type RawTableOptions, RawTableReader, preambleWarning } from "./rawTable";
import { ChunkDecoder, NotUtf8, type TextEncodingName, describeZip, encodingWarning, notATable, sniffFile } from "./textDecode";

/** Bytes of a file, read in chunks; `chunks()` may be called again to read from the start. */
export interface ByteSource {
  chunks(): Iterable<Uint8Array>;
}

/** A ByteSource over bytes already in memory (tests, small inputs). */
export function bytesSource(bytes: Uint8Array, chunkSize = 1 << 20): ByteSource {
  return {
    *chunks() {
      for (let i = 0; i < bytes.length; i += chunkSize) yield bytes.subarray(i, Math.min(bytes.length, i + chunkSize));
      if (bytes.length === 0) yield bytes;
    },
  };
}

/** A raw table read from a CSV file, with how the file was read. */
export interface RawCsv extends RawTable {
  encoding: TextEncodingName;
  delimiter: CsvDelimiter;
}

/** Largest workbook read whole into memory (bytes). */
export const MAX_WORKBOOK_BYTES = 200 * 1024 * 1024;

/**
 * What a file holds: a raw table read from CSV text, or a workbook's bytes (to be read by
 * workbookInput.ts).
 */
export type RawFile = { kind: "csv"; table: RawCsv } | { kind: "xlsx"; bytes: Uint8Array };

/**
 * Reads a raw-data file (see the module comment).
 * @param file names the file in messages
 * @param options table options (barrel bore, density, row limit...); rows are "line"s
 * @throws RheoError naming the file (not a table, unterminated quote, too many rows) or the column
 *   and line of a bad cell
 */
export function readRawFile(source: ByteSource, file: string, options: Partial<RawTableOptions> = {}): RawFile {
  const first = firstChunk(source);
  const kind = sniffFile(first.subarray(0, 4096));
  if (kind.kind === "zip") {
    const bytes = wholeFile(source, file);
    const zip = describeZip(bytes);
    if (zip.kind === "xlsx") return { kind: "xlsx", bytes };
    throw notATable(file, zip.kind === "other" ? zip.what : "a zip archive");
  }
  if (kind.kind === "other") throw notATable(file, kind.what);
  if (kind.kind === "xlsx") throw notATable(file, "an xlsx workbook");
  try {
    return { kind: "csv", table: readCsvStream(source, file, kind.encoding, kind.bomLength, options) };
  } catch (e) {
    if (!(e instanceof NotUtf8)) throw e;
    return { kind: "csv", table: readCsvStream(source, file, "windows-1252", kind.bomLength, options) };
  }
}

function firstChunk(source: ByteSource): Uint8Array {
  for (const chunk of source.chunks()) return chunk;
  return new Uint8Array(0);
}

function wholeFile(source: ByteSource, file: string): Uint8Array {
  const parts: Uint8Array[] = [];
  let size = 0;
  for (const chunk of source.chunks()) {
    size += chunk.length;
    if (size > MAX_WORKBOOK_BYTES) throw new RheoError("value", file, `is a zip file larger than ${MAX_WORKBOOK_BYTES / 1024 / 1024} MB; save the sheet as CSV, which is read as it streams`, undefined, "FILE_TOO_LARGE");
    parts.push(chunk.slice());
  }
  const out = new Uint8Array(size);
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/** Text examined for the header row before the reading starts (characters). */
const HEAD_CHARS = 64 * 1024;

/**
 * Where the header row is and which delimiter it uses: the first content line (not blank, not a
 * `#` comment) of the first {@link HEADER_SEARCH_ROWS} in which two or more cells, split by one of
 * comma, semicolon or tab, name a known quantity; null when none does.
 */
export function findCsvHeader(head: string): { delimiter: CsvDelimiter; line: number } | null {
  const lines = head.split("\n");
  let content = 0;
  for (let i = 0; i < lines.length && content < HEADER_SEARCH_ROWS; i++) {
    const line = (lines[i] as string).replace(/\r$/, "");
    if (line.trim() === "" || line.startsWith("#")) continue;
    content++;
    let best: { delimiter: CsvDelimiter; known: number } | null = null;
    for (const delimiter of [",", ";", "\t"] as const) {
      const cells = line.split(delimiter).map((c) => c.trim().replace(/^"(.*)"$/, "$1"));
      const known = cells.filter((c) => c.length <= 200 && knownColumnName(c)).length;
      if (known >= 2 && (!best || known > best.known)) best = { delimiter, known };
    }
    if (best) return { delimiter: best.delimiter, line: i + 1 };
  }
  return null;
}

/**
 * Streams CSV text through the table reader. Throws {@link NotUtf8} when a UTF-8 read meets an
 * invalid byte sequence (the caller reads again as Windows-1252).
 */
function readCsvStream(source: ByteSource, file: string, encoding: TextEncodingName, bomLength: number, options: Partial<RawTableOptions>): RawCsv {
  const decoder = new ChunkDecoder(encoding);
  let reader: RawTableReader | null = null;
  let parser: CsvParser | null = null;
  let headerLine = 0;
  const preamble = new RowList();
  const sink = {
    record(cells: string[], line: number) {
      if (reader !== null) reader.add(cells, line);
      else if (line < headerLine) preamble.add(line);
      else {
        reader = new RawTableReader(cells, {
          ...options,
          rowWord: "line",
          headerNumber: line,
          source: file,
          decimalMark: options.decimalMark ?? ((parser as CsvParser).delimiter === "," ? "." : undefined),
        });
      }
    },
    line(text: string, delimiter: CsvDelimiter, line: number) {
      if (reader !== null) reader.addLine(text, delimiter, line);
      else this.record(text.split(delimiter), line);
    },
    comment(line: number) {
      reader?.skip("comment", line);
    },
    blank(line: number) {
      reader?.skip("blank", line);
    },
  };
  let head: string[] = [];
  let headLength = 0;
  const start = (): CsvParser => {
    const text = head.join("");
    head = [];
    const found = findCsvHeader(text);
    headerLine = found?.line ?? 0;
    const p = new CsvParser(sink, { source: file, delimiter: found?.delimiter });
    parser = p;
    p.push(text);
    return p;
  };
  const feed = (text: string) => {
    if (parser !== null) parser.push(text);
    else {
      head.push(text);
      headLength += text.length;
      if (headLength >= HEAD_CHARS) start();
    }
  };
  let skip = bomLength;
  for (const chunk of source.chunks()) {
    let bytes = chunk;
    if (skip > 0) {
      const n = Math.min(skip, bytes.length);
      bytes = bytes.subarray(n);
      skip -= n;
    }
    feed(decoder.decode(bytes));
  }
  feed(decoder.end());
  const p: CsvParser = parser ?? start();
  p.end();
  if (reader === null) throw new RheoError("missing", file, "is empty: no header row of \"quantity [unit]\" cells", undefined, "EMPTY_FILE");
  const table = (reader as RawTableReader).finish();
  const warnings: Warning[] = [];
  const w = encodingWarning(encoding, bomLength > 0);
  if (w) warnings.push(w);
  if (preamble.count > 0) warnings.push(preambleWarning(preamble, "line", headerLine));
  return { ...table, warnings: [...warnings, ...table.warnings], encoding, delimiter: p.delimiter as CsvDelimiter };
}
