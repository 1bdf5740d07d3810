/**
 * Raw files as labs and Excel write them (test/fixtures/input/, made by
 * scripts/make-input-fixtures.ts): every variant holds the same invented run as plain.csv and must
 * read to exactly the same measurements. Then the files that are not tables, and files too large
 * or damaged to read whole (generated inside the test, streamed, never stored).
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { RheoError } from "../src/core/errors";
import type { Measurement } from "../src/core/reduceTypes";
import { type ByteSource, type RawCsv, bytesSource, findCsvHeader, readRawFile } from "../src/io/rawInput";
import { MAX_DATA_ROWS } from "../src/io/rawTable";
import { readRawWorkbook } from "../src/io/workbookInput";

const DIR = join(__dirname, "fixtures", "input");
const bytes = (name: string) => new Uint8Array(readFileSync(join(DIR, name)));

function readCsv(name: string): RawCsv {
  const r = readRawFile(bytesSource(bytes(name), 97), name);
  if (r.kind !== "csv") throw new Error(`${name} read as ${r.kind}`);
  return r.table;
}

function errorOf(f: () => unknown): RheoError {
  try {
    f();
  } catch (e) {
    if (e instanceof RheoError) return e;
    throw e;
  }
  throw new Error("no error");
}

const strip = (ms: Measurement[]) => ms.map(({ row: _row, ...m }) => m);
const PLAIN = readCsv("plain.csv");

describe("files written as labs write them read exactly like the plain file", () => {
  test("plain.csv: 42 rows, comma-separated, UTF-8", () => {
    expect(PLAIN.measurements).toHaveLength(42);
    expect(PLAIN.rows).toEqual({ rowsRead: 42, rowsUsed: 42, rowsSkipped: {} });
    expect(PLAIN.warnings).toEqual([]);
  });
  test("semicolon, decimal comma and dot thousands (1.160 = 1160, 0,5 = 0.5), as a German Excel writes it", () => {
    const t = readCsv("semicolon-thousands.csv");
    expect(t.delimiter).toBe(";");
    expect(t.decimalMark).toBe(",");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements));
  });
  test("Windows-1252 code page (°C as byte 0xB0) with CRLF: read, and the encoding named in a warning", () => {
    const raw = bytes("windows-1252.csv");
    expect(raw.indexOf(0xb0)).toBeGreaterThan(0);
    const t = readCsv("windows-1252.csv");
    expect(t.encoding).toBe("windows-1252");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements));
    expect(t.warnings.map((w) => w.code)).toEqual(["INPUT_ENCODING"]);
    expect(t.warnings[0]?.message).toMatch(/Windows-1252/);
  });
  test("Excel's Unicode text: UTF-16 LE with byte-order mark, tab-separated", () => {
    const t = readCsv("unicode-text.txt");
    expect(t.encoding).toBe("utf-16le");
    expect(t.delimiter).toBe("\t");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements));
  });
  test("comma-separated with comma thousands in quoted cells (\"1,160\" = 1160)", () => {
    const t = readCsv("comma-grouped.csv");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements));
  });
  test("UTF-8 byte-order mark, notes above the header, a blank line, an all-blank row and a comment: every row accounted for", () => {
    const t = readCsv("bom-comments.csv");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements));
    expect(t.rows).toEqual({ rowsRead: 45, rowsUsed: 42, rowsSkipped: { blank: 2, comment: 1 } });
    expect(t.warnings.map((w) => [w.code, w.message])).toEqual([
      ["ROWS_BLANK", "lines 9, 13 are blank and skipped."],
      ["ROWS_COMMENT", "line 18 is a comment line (starting with #) below the header, skipped."],
    ]);
  });
  test("xlsx: the first sheet by default, a formula's saved result, a number stored as text with a decimal comma", async () => {
    const t = await readRawWorkbook(bytes("run.xlsx"), "run.xlsx", undefined);
    expect(t.sheet).toBe("Raw");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements));
    expect(t.measurements[0]?.row).toBe(2);
  });
  test("xlsx: a named sheet whose header sits below a title row", async () => {
    const t = await readRawWorkbook(bytes("run.xlsx"), "run.xlsx", "230 c only");
    expect(t.sheet).toBe("230 C only");
    expect(strip(t.measurements)).toEqual(strip(PLAIN.measurements.filter((m) => Math.abs((m.temperature as number) - 503.15) < 1e-9)));
    expect(t.warnings.map((w) => w.code)).toEqual(["PREAMBLE_SKIPPED"]);
  });
  test("xlsx: an unknown sheet is refused listing the sheets", async () => {
    await expect(readRawWorkbook(bytes("run.xlsx"), "run.xlsx", "Data")).rejects.toThrow('--sheet: no sheet "Data" in run.xlsx; its sheets: "Raw", "230 C only"');
  });
  test("a zip holding a workbook is recognised from its bytes, whatever its name", () => {
    expect(readRawFile(bytesSource(bytes("run.xlsx")), "export.dat").kind).toBe("xlsx");
  });
  test("a genuinely ambiguous file is refused: the column, a line and both readings", () => {
    const e = errorOf(() => readCsv("ambiguous.csv"));
    expect(e.code).toBe("AMBIGUOUS_NUMBER");
    expect(e.message).toMatch(/^pressure \[kPa\] \(column 6\): line 2 "1\.629" could be 1\.629 \(decimal point\) or 1629 \("\." grouping thousands\)/);
  });
});

describe("the header row is found below a title", () => {
  test("the first line naming two known quantities, with its delimiter", () => {
    expect(findCsvHeader("Run 7; invented\n\nDate;today\ntemperature [C];pressure [bar]\n1;2\n")).toEqual({ delimiter: ";", line: 4 });
    expect(findCsvHeader("just text\nmore\n")).toBeNull();
  });
});

describe("files that are not tables say what they are", () => {
  const cases: [string, number[], RegExp][] = [
    ["PDF", [...Buffer.from("%PDF-1.7\n%âãÏÓ\n")], /^x: is a PDF document, not a table; give a CSV/],
    ["zip", [0x50, 0x4b, 0x03, 0x04, ...Buffer.from("readme.txt hello")], /^x: is a zip archive, not a table/],
    ["old xls", [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0, 0], /^x: is an Excel 97–2003 workbook \(\.xls\)/],
    ["PNG", [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], /^x: is a PNG image/],
    ["binary", [1, 2, 0, 0, 255, 0, 7, 8, 0, 0, 0, 1], /^x: is a binary file, not text, not a table/],
    ["gzip", [0x1f, 0x8b, 8, 0], /^x: is a gzip-compressed file/],
  ];
  test.each(cases)("%s", (_name, data, message) => {
    const e = errorOf(() => readRawFile(bytesSource(new Uint8Array(data)), "x"));
    expect(e.code).toBe("NOT_A_TABLE");
    expect(e.message).toMatch(message);
    expect(e.message).not.toMatch(/found: "PK"/);
  });
  test("an empty file", () => {
    expect(() => readRawFile(bytesSource(new Uint8Array(0)), "empty.csv")).toThrow(/^empty\.csv: is empty/);
  });
});

/** A file of `lines` generated lines, streamed in 1 MB chunks and never held whole. */
function generated(header: string, line: (i: number) => string, lines: number): ByteSource {
  return {
    *chunks() {
      const encoder = new TextEncoder();
      let text = header;
      for (let i = 0; i < lines; i++) {
        text += line(i);
        if (text.length >= 1 << 20) {
          yield encoder.encode(text);
          text = "";
        }
      }
      yield encoder.encode(text);
    },
  };
}

describe("large and damaged files end in a message, never a crash", () => {
  const HEADER = "die_diameter [mm],die_length [mm],flow_rate [mm3/s],pressure [bar]\n";
  test("more rows than the limit stop the reading at the limit with the file named: a 1 GB file (25 million lines) ends there", () => {
    // a smaller limit keeps the test quick; the default, as many rows as one Excel sheet, is timed by npm run bench
    expect(MAX_DATA_ROWS).toBe(1_048_575);
    let produced = 0;
    const lines = 25_000_000;
    const source = generated(HEADER, (i) => {
      produced = i;
      return `1,${10 + (i % 3) * 10},${1 + (i % 1000)},${100 + (i % 700)}\n`;
    }, lines);
    const e = errorOf(() => readRawFile(source, "huge.csv", { maxRows: 20_000 }));
    expect(e.code).toBe("TOO_MANY_ROWS");
    expect(e.message).toBe("huge.csv: has more than 20,000 data lines, the most one table may hold (as many as one Excel sheet); reduce a part of it at a time");
    expect(produced).toBeLessThan(200_000); // stopped within a few chunks of the limit, not at the end of the file
  });
  test("an unterminated quote on line 3 of a 30 MB file: the line, the cause, a short message", () => {
    const source = generated(HEADER + '1,10,"2,100\n', () => "1,10,2,100\n", 3_000_000);
    const e = errorOf(() => readRawFile(source, "quote.csv"));
    expect(e.code).toBe("UNTERMINATED_QUOTE");
    expect(e.message).toMatch(/^quote\.csv: line 2, column 3: unterminated quote/);
    expect(e.message.length).toBeLessThan(300);
  });
  test("one endless line (no line breaks) stops at the line limit", () => {
    const source: ByteSource = {
      *chunks() {
        const chunk = new TextEncoder().encode("1,2,3,".repeat(1 << 18));
        for (let i = 0; i < 50; i++) yield chunk;
      },
    };
    expect(errorOf(() => readRawFile(source, "line.csv")).code).toBe("LINE_TOO_LONG");
  });
  test("terminal escape sequences in a header are not echoed", () => {
    const text = "die_diameter [mm],\u001b]0;pwned\u0007\u001b[2Jpressure [bar]\n1,2\n";
    const e = errorOf(() => readRawFile(bytesSource(new TextEncoder().encode(text)), "esc.csv"));
    // eslint-disable-next-line no-control-regex
    expect(e.message).not.toMatch(/[\u0000-\u001f\u007f-\u009f]/);
  });
});
