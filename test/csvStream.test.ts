/**
 * The streaming CSV reader (src/io/csv.ts): RFC 4180 quoting, chunks of any size, line numbers,
 * limits and the messages of a damaged file.
 */
import { CsvParser, detectDelimiter, parseCsv } from "../src/io/csv";

interface Seen {
  records: { line: number; cells: string[] }[];
  comments: number[];
  blanks: number[];
}

function parseInChunks(text: string, size: number, options: ConstructorParameters<typeof CsvParser>[1] = {}): Seen {
  const seen: Seen = { records: [], comments: [], blanks: [] };
  const p = new CsvParser({ record: (cells, line) => seen.records.push({ line, cells }), comment: (l) => seen.comments.push(l), blank: (l) => seen.blanks.push(l) }, options);
  for (let i = 0; i < text.length; i += size) p.push(text.slice(i, i + size));
  p.end();
  return seen;
}

const SAMPLE = '# note\r\na;b;c\r\n\r\n"1;5";2;"say ""hi"""\r\n"two\nlines";x;y\n# later\n3;;\n;;\n4;5;6';

describe("CsvParser", () => {
  test("RFC 4180 (IETF, 2005): quoted delimiters, doubled quotes, line breaks in quotes; CRLF; file line numbers", () => {
    const whole = parseInChunks(SAMPLE, SAMPLE.length);
    expect(whole.records).toEqual([
      { line: 2, cells: ["a", "b", "c"] },
      { line: 4, cells: ["1;5", "2", 'say "hi"'] },
      { line: 5, cells: ["two\nlines", "x", "y"] },
      { line: 8, cells: ["3", "", ""] },
      { line: 9, cells: ["", "", ""] },
      { line: 10, cells: ["4", "5", "6"] },
    ]);
    expect(whole.comments).toEqual([1, 7]);
    expect(whole.blanks).toEqual([3]);
  });
  test("any chunking gives the same records (1 to 17 characters per chunk)", () => {
    const whole = parseInChunks(SAMPLE, SAMPLE.length);
    for (let size = 1; size <= 17; size++) expect(parseInChunks(SAMPLE, size)).toEqual(whole);
  });
  test("the delimiter comes from the first content line, counted outside quotes", () => {
    expect(detectDelimiter('"a,b";c;d')).toBe(";");
    expect(detectDelimiter("a\tb\tc")).toBe("\t");
    expect(detectDelimiter("a,b")).toBe(",");
    expect(detectDelimiter("single")).toBe(",");
  });
  test("an unterminated quote on line 3 of a large file: one short message naming the line, the column and the quote", () => {
    const text = "a,b\n1,2\n3,\"oops\n" + "5,6\n".repeat(200000);
    let message = "";
    try {
      parseInChunks(text, 65536, { source: "big.csv" });
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toMatch(/^big\.csv: line 3, column 2: unterminated quote/);
    expect(message.length).toBeLessThan(300);
    expect(message).not.toContain("5,6");
  });
  test("a quote still open past the record limit stops the reading at once, naming where it opened", () => {
    const p = new CsvParser({ record: () => undefined }, { source: "f.csv", limits: { maxRecordChars: 1000 } });
    p.push("a,b\n1,\"");
    expect(() => p.push("x".repeat(2000))).toThrow(/^f\.csv: line 2, column 2: unterminated quote\? the quoted cell that opens there runs on for more than 1000 characters/);
  });
  test("a line longer than the limit (a binary or one-line file) ends in a message, not in memory", () => {
    const p = new CsvParser({ record: () => undefined }, { source: "f.csv", limits: { maxRecordChars: 1000 } });
    p.push("a,b\n");
    expect(() => {
      for (let i = 0; i < 10; i++) p.push("y".repeat(500));
    }).toThrow(/^f\.csv: line 2 is longer than 1000 characters/);
  });
});

describe("parseCsv(text)", () => {
  test("comma file with BOM, CRLF, comments, quotes and blank lines keeps file line numbers", () => {
    const csv = parseCsv('\uFEFF# note\r\na,b\r\n\r\n"1,5",2\r\n3,"say ""hi"""\r\n');
    expect(csv.delimiter).toBe(",");
    expect(csv.lines).toEqual([
      { line: 2, cells: ["a", "b"] },
      { line: 4, cells: ["1,5", "2"] },
      { line: 5, cells: ["3", 'say "hi"'] },
    ]);
  });
});
