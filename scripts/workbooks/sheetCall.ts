/**
 * Building RHEO formulas for the demo workbooks together with the values they compute: each call
 * gives the formula text Excel stores and the result grid of the same implementation the add-in
 * registers (src/functions/functions.ts), which becomes the cell's cached value.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import * as sheetFunctions from "../../src/functions/functions";
import { isCellError } from "../../src/functions/adapter";
import { SheetFunctionEntry, readFunctionTable } from "./functionTable";

export type Grid = unknown[][];

/** A range argument: its reference text and the values Excel passes for it. */
export interface RangeArg {
  ref: string;
  values: Grid;
}

export type Arg = RangeArg | string | number | boolean | null;

export interface SheetCall {
  /** formula text without the leading "=" */
  formula: string;
  result: Grid;
}

type Implementation = (...args: unknown[]) => Grid;

let table: SheetFunctionEntry[] | undefined;

/** The declared RHEO functions (read once from src/functions/functions.ts under the working directory). */
export function functionTable(): SheetFunctionEntry[] {
  table ??= readFunctionTable(readFileSync(path.resolve("src/functions/functions.ts"), "utf8"));
  return table;
}

function isRangeArg(a: Arg): a is RangeArg {
  return typeof a === "object" && a !== null && "ref" in a;
}

function literal(a: Arg): string {
  if (a === null) return "";
  if (isRangeArg(a)) return a.ref;
  if (typeof a === "boolean") return a ? "TRUE" : "FALSE";
  if (typeof a === "number") return String(a);
  return `"${a.replace(/"/g, '""')}"`;
}

/**
 * The formula calling worksheet function `jsName` (its exported name in functions.ts) with `args`,
 * and what it returns for them. Trailing null arguments are left out; inner ones stay empty.
 */
export function rheo(jsName: keyof typeof sheetFunctions, args: Arg[]): SheetCall {
  const entry = functionTable().find((e) => e.jsName === jsName);
  if (!entry) throw new Error(`${jsName} is not a @customfunction of src/functions/functions.ts`);
  if (args.length > entry.parameters.length) throw new Error(`${entry.excelName} takes ${entry.parameters.length} arguments, got ${args.length}`);
  let last = args.length;
  while (last > 0 && args[last - 1] === null) last--;
  const used = args.slice(0, last);
  const values = entry.parameters.map((p, i) => {
    const a = used[i];
    if (a === undefined || a === null) return null;
    if (isRangeArg(a)) return a.values;
    return p.range ? [[a]] : a;
  });
  const fn = sheetFunctions[jsName] as unknown as Implementation;
  const result = fn(...values);
  for (const row of result) {
    for (const cell of row) {
      if (isCellError(cell)) throw new Error(`${entry.excelName} returned ${cell.code} ${cell.message} in a demo workbook`);
    }
  }
  return { formula: `${entry.excelName}(${used.map(literal).join(",")})`, result };
}
