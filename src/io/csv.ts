/**
 * A small CSV reader for instrument exports: RFC 4180 quoting, CRLF or LF line ends, a UTF-8
 * byte-order mark, `#` comment lines and blank lines skipped; the delimiter (comma, semicolon or
 * tab) is detected from the first content line. With a semicolon delimiter a decimal comma is
 * assumed (the usual European export).
 */

/** One parsed line with its 1-based line number in the file. */
export interface CsvLine {
  line: number;
  cells: string[];
}

export interface CsvTable {
  delimiter: "," | ";" | "\t";
  decimalComma: boolean;
  lines: CsvLine[];
}

function detectDelimiter(firstLine: string): "," | ";" | "\t" {
  const count = (ch: string) => firstLine.split(ch).length - 1;
  const candidates: ("," | ";" | "\t")[] = [",", ";", "\t"];
  return candidates.reduce((best, ch) => (count(ch) > count(best) ? ch : best), ",");
}

/** Splits CSV text into lines of cells (see the module comment). Quoted fields may span lines. */
export function parseCsv(text: string): CsvTable {
  const src = text.replace(/^\uFEFF/, "");
  const firstContent = src.split(/\r?\n/).find((l) => l.trim() !== "" && !l.trimStart().startsWith("#")) ?? "";
  const delimiter = detectDelimiter(firstContent);
  const lines: CsvLine[] = [];
  let cells: string[] = [];
  let field = "";
  let quoted = false;
  let lineNo = 1;
  let startLine = 1;
  let atLineStart = true;
  let comment = false;
  const endRecord = () => {
    cells.push(field);
    if (!(cells.length === 1 && (cells[0] as string).trim() === "")) lines.push({ line: startLine, cells });
    cells = [];
    field = "";
  };
  for (let i = 0; i < src.length; i++) {
    const ch = src[i] as string;
    if (atLineStart) {
      startLine = lineNo;
      atLineStart = false;
      comment = ch === "#";
    }
    if (comment) {
      if (ch === "\n") {
        lineNo++;
        atLineStart = true;
        comment = false;
      }
      continue;
    }
    if (quoted) {
      if (ch === '"') {
        if (src[i + 1] === '"') {
          field += '"';
          i++;
        } else quoted = false;
      } else {
        if (ch === "\n") lineNo++;
        field += ch;
      }
      continue;
    }
    if (ch === '"' && field.trim() === "") {
      quoted = true;
      field = "";
    } else if (ch === delimiter) {
      cells.push(field);
      field = "";
    } else if (ch === "\n") {
      endRecord();
      lineNo++;
      atLineStart = true;
    } else if (ch !== "\r") {
      field += ch;
    }
  }
  if (!atLineStart && !comment) endRecord();
  return { delimiter, decimalComma: delimiter === ";", lines };
}
