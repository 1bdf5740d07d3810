/**
 * The input of `rheoledger reduce FILE`: a CSV (or tab-separated) text file streamed row by row,
 * or an xlsx workbook's sheet (`--sheet NAME`, the first sheet by default). The workbook reader
 * (and exceljs with it) is imported only when a workbook is read.
 */
import { RheoError } from "../core/errors";
import type { RawTable, RawTableOptions } from "../io/rawTable";
import { readRawFile } from "../io/rawInput";
import { excerpt } from "../io/safeText";
import { ENCODING_NAMES } from "../io/textDecode";
import type { ReduceRequest } from "../io/reduceOptions";
import type { ParsedArgs } from "./args";
import { type CliIO, inputSource } from "./io";

/** The raw table of a reduce run and a short description of where it came from. */
export interface ReduceInput extends RawTable {
  /** what was read: 'data.csv (UTF-8 text, ";" delimited, decimal comma)' or 'run.xlsx, sheet "Raw"' */
  description: string;
  /** how the file was read, for the JSON document */
  format: { kind: "csv"; encoding: string; delimiter: string } | { kind: "xlsx"; sheet: string };
}

const DELIMITER_NAMES: Record<string, string> = { ",": "comma", ";": "semicolon", "\t": "tab" };


/**
 * Reads the raw table of `file` (see the module comment): a number for a CSV, a Promise for a
 * workbook.
 * @throws RheoError naming the file (not a table, unreadable), the flag (`--sheet` on a CSV, an
 *   unknown sheet) or the column and line of a bad cell
 */
export function readReduceInput(io: CliIO, file: string, args: ParsedArgs, input: ReduceRequest["input"]): ReduceInput | Promise<ReduceInput> {
  const options: Partial<RawTableOptions> = { barrelDiameter: input.barrelDiameter, density: input.density };
  const sheet = args.flags.get("sheet");
  const read = readRawFile(inputSource(io, file), file, options);
  if (read.kind === "csv") {
    if (typeof sheet === "string") throw new RheoError("value", "--sheet", `${file} is a text (CSV) file, not a workbook; --sheet applies to .xlsx input`);
    if (/\.xlsx$/i.test(file)) throw new RheoError("value", file, "is named .xlsx but holds text, not a workbook; rename it .csv if it is a CSV file");
    const t = read.table;
    const mark = t.decimalMark === null ? "" : `, decimal ${t.decimalMark === "," ? "comma" : "point"}`;
    return {
      ...t,
      description: `${file} (${ENCODING_NAMES[t.encoding]} text, ${DELIMITER_NAMES[t.delimiter]}-separated${mark})`,
      format: { kind: "csv", encoding: t.encoding, delimiter: t.delimiter },
    };
  }
  return import("../io/workbookInput").then(async ({ readRawWorkbook }) => {
    const t = await readRawWorkbook(read.bytes, file, typeof sheet === "string" ? sheet : undefined, options);
    return { ...t, description: `${file}, sheet "${excerpt(t.sheet)}"`, format: { kind: "xlsx" as const, sheet: t.sheet } };
  });
}
