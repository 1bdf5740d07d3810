/**
 * Building RHEO formulas for the demo workbooks together with the values they compute: each call
 * gives the formula text as Excel stores it (`_xldudf_RHEO_NAME(…)`, see functionTable.ts) and the
 * result grid of the same implementation the add-in registers (the files of the registry
 * src/functions/entry.ts), which becomes the cell's cached value.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { isCellError } from "../../src/functions/adapter";
import { FUNCTION_MODULES as MODULES } from "../../src/functions/entry";
import { SheetFunctionEntry, readFunctionTable, storedFunctionName } from "./functionTable";

const FUNCTION_MODULES = Object.entries(MODULES) as [string, Record<string, unknown>][];

import type { SheetFunctionName } from "../../src/functions/entry";
export type { SheetFunctionName };

export type Grid = unknown[][];

/** A range argument: its reference text and the values Excel passes for it. */
export interface RangeArg {
  ref: string;
  values: Grid;
}

export type Arg = RangeArg | string | number | boolean | null;

export interface SheetCall {
  /** formula text without the leading "=", in the form Excel stores (functionTable.ts: `_xldudf_RHEO_…`) */
  formula: string;
  result: Grid;
}

type Implementation = (...args: unknown[]) => Grid;

let table: (SheetFunctionEntry & { implementation: Implementation })[] | undefined;

/** The declared RHEO functions with their implementations (read once from src/functions/ under the working directory). */
export function functionTable(): (SheetFunctionEntry & { implementation: Implementation })[] {
  table ??= FUNCTION_MODULES.flatMap(([file, module]) =>
    readFunctionTable(readFileSync(path.resolve("src/functions", file), "utf8")).map((e) => ({ ...e, implementation: module[e.jsName] as Implementation })),
  );
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
export function rheo(jsName: SheetFunctionName, args: Arg[]): SheetCall {
  const entry = functionTable().find((e) => e.jsName === jsName);
  if (!entry) throw new Error(`${jsName} is not a @customfunction of src/functions/`);
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
  const result = entry.implementation(...values);
  for (const row of result) {
    for (const cell of row) {
      if (isCellError(cell)) throw new Error(`${entry.excelName} returned ${cell.code} ${cell.message} in a demo workbook`);
    }
  }
  return { formula: `${storedFunctionName(entry.excelName)}(${used.map(literal).join(",")})`, result };
}
