/**
 * The RHEO worksheet functions as a HyperFormula plugin, for evaluating workbooks headlessly in
 * tests. Every function declared with `@customfunction` in the files of the registry
 * src/functions/entry.ts is
 * registered under its Excel name and calls the SAME exported implementation the add-in
 * registers; arguments arrive as Excel passes them (ranges as 2-D arrays, blanks and omitted
 * optional arguments as null).
 *
 * HyperFormula (GPL-3.0, licence key "gpl-v3") is a test-only dependency: never import this from src/.
 *
 * Result sizes: HyperFormula asks for a formula's result size before evaluating it. The demo
 * workbooks hold legacy array formulas whose size is fixed in the file, so the size is taken from
 * `declareArraySize` (keyed by sheet index and cell); a result smaller than its range is padded
 * with #N/A and a larger one cut, as Excel does with array formulas. Tests compare every cell, so
 * a size mismatch still fails.
 *
 * Stored names: the demo workbooks hold RHEO formulas as Excel stores add-in functions,
 * `_xldudf_RHEO_NAME(…)` (scripts/workbooks/functionTable.ts); {@link excelFormulaText} maps them
 * back to `RHEO.NAME(…)` before HyperFormula sees them, as Excel does when the add-in loads
 * (HyperFormula's parser does not accept a function name starting with "_").
 *
 * Excel's literals TRUE and FALSE are functions in HyperFormula: pass
 * {@link BOOLEAN_LITERALS} as named expressions when building the engine.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { ArraySize, CellError, EmptyValue, ErrorType, FunctionArgumentType, FunctionPlugin, HyperFormula, SimpleRangeValue } from "hyperformula";
import type { ImplementedFunctions } from "hyperformula";
import { isCellError } from "../../src/functions/adapter";
import { FUNCTION_MODULES as MODULES } from "../../src/functions/entry";
import { readFunctionTable, storedFunctionName, type SheetFunctionEntry } from "../../scripts/workbooks/functionTable";

type Implementation = (...args: unknown[]) => unknown[][];

/** The files that declare worksheet functions and their exports (the registry src/functions/entry.ts). */
const FUNCTION_MODULES = Object.entries(MODULES) as [string, Record<string, unknown>][];

/** Every RHEO function as declared in src/functions (Excel name, parameters). */
export const RHEO_FUNCTIONS: SheetFunctionEntry[] = FUNCTION_MODULES.flatMap(([file]) => readFunctionTable(readFileSync(path.join(__dirname, "../../src/functions", file), "utf8")));

/** The exported implementation of each Excel name. */
const IMPLEMENTATIONS = new Map<string, Implementation>(
  FUNCTION_MODULES.flatMap(([file, module]) =>
    readFunctionTable(readFileSync(path.join(__dirname, "../../src/functions", file), "utf8")).map((e): [string, Implementation] => [e.excelName, module[e.jsName] as Implementation]),
  ),
);

/** Excel name of each stored name: "_xldudf_RHEO_FLOWRATE" → "RHEO.FLOWRATE" (case-insensitive, as Excel reads names). */
const EXCEL_NAME_OF_STORED = new Map(RHEO_FUNCTIONS.map((e) => [storedFunctionName(e.excelName).toUpperCase(), e.excelName]));

/**
 * A formula as the file stores it, with every stored add-in name mapped back to the name the
 * add-in registers (what Excel does once the add-in's manifest is loaded): `_xldudf_RHEO_BAGLEY(`
 * → `RHEO.BAGLEY(`. Text inside string literals is left alone; an unknown `_xldudf_` name is left
 * as it is (the spreadsheet engine then reports it).
 */
export function excelFormulaText(stored: string): string {
  return stored.replace(/"(?:[^"]|"")*"|\b_xldudf_[A-Za-z0-9_]+(?=\()/g, (m) => (m.startsWith('"') ? m : (EXCEL_NAME_OF_STORED.get(m.toUpperCase()) ?? m)));
}

/** The implementation registered for `excelName` (undefined when none). */
export function implementationOf(excelName: string): Implementation | undefined {
  return IMPLEMENTATIONS.get(excelName);
}

export const BOOLEAN_LITERALS = [
  { name: "TRUE", expression: "=TRUE()" },
  { name: "FALSE", expression: "=FALSE()" },
];

const declaredSizes = new Map<string, { width: number; height: number }>();
const key = (sheet: number, row: number, col: number) => `${sheet}!${row}!${col}`;

/** Declares the size of the array formula whose top-left cell is (sheet, row, col), all 0-based. */
export function declareArraySize(sheet: number, row: number, col: number, width: number, height: number): void {
  declaredSizes.set(key(sheet, row, col), { width, height });
}

export function clearArraySizes(): void {
  declaredSizes.clear();
}

const ERROR_TYPES: Record<string, ErrorType> = {
  "#VALUE!": ErrorType.VALUE,
  "#N/A": ErrorType.NA,
  "#NUM!": ErrorType.NUM,
  "#DIV/0!": ErrorType.DIV_BY_ZERO,
  "#REF!": ErrorType.REF,
  "#NAME?": ErrorType.NAME,
};

/** A HyperFormula value as Excel would hand it to a custom function. */
function toExcel(value: unknown): unknown {
  if (value === EmptyValue || value === undefined) return null;
  if (value instanceof CellError) return { code: `#${value.type === ErrorType.DIV_BY_ZERO ? "DIV/0!" : value.type === ErrorType.NA ? "N/A" : value.type + (value.type === ErrorType.NAME ? "?" : "!")}`, message: value.message };
  if (typeof value === "object" && value !== null && "val" in value) return (value as { val: unknown }).val; // rich numbers (dates, percents)
  return value;
}

/** A result cell as HyperFormula stores it. */
function fromExcel(value: unknown): unknown {
  if (isCellError(value)) return new CellError(ERROR_TYPES[value.code] ?? ErrorType.VALUE, value.message);
  if (value === null || value === undefined) return EmptyValue;
  return value;
}

class RheoPlugin extends FunctionPlugin {
  static override implementedFunctions: ImplementedFunctions = {};

  /** Calls the implementation of the function named in the formula with Excel-shaped arguments. */
  callRheo(ast: { procedureName: string; args: unknown[] }, state: { formulaAddress: { sheet: number; row: number; col: number } }): unknown {
    const entry = RHEO_FUNCTIONS.find((e) => e.excelName === ast.procedureName.toUpperCase());
    if (!entry) return new CellError(ErrorType.NAME, `unknown function ${ast.procedureName}`);
    const metadata = this.metadata(ast.procedureName.toUpperCase());
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    return this.runFunction(ast.args as any, state as any, metadata, (...values: unknown[]) => {
      const args = entry.parameters.map((p, i) => {
        const v = values[i];
        if (v instanceof SimpleRangeValue) return v.data.map((row) => row.map(toExcel));
        const scalar = toExcel(v);
        return p.range && scalar !== null ? [[scalar]] : scalar;
      });
      const grid = (IMPLEMENTATIONS.get(entry.excelName) as Implementation)(...args);
      const size = declaredSizes.get(key(state.formulaAddress.sheet, state.formulaAddress.row, state.formulaAddress.col)) ?? { width: 1, height: 1 };
      const out: unknown[][] = [];
      for (let r = 0; r < size.height; r++) {
        const line: unknown[] = [];
        for (let c = 0; c < size.width; c++) {
          const cell = grid[r]?.[c];
          line.push(cell === undefined ? new CellError(ErrorType.NA, "outside the function's result") : fromExcel(cell));
        }
        out.push(line);
      }
      // eslint-disable-next-line @typescript-eslint/no-explicit-any
      return SimpleRangeValue.onlyValues(out as any);
    });
  }

  rheoSize(_ast: unknown, state: { formulaAddress: { sheet: number; row: number; col: number } }): ArraySize {
    const size = declaredSizes.get(key(state.formulaAddress.sheet, state.formulaAddress.row, state.formulaAddress.col));
    return size ? new ArraySize(size.width, size.height) : ArraySize.scalar();
  }
}

let registered = false;

/** Registers every RHEO function with HyperFormula (once per process). */
export function registerRheoFunctions(): void {
  if (registered) return;
  const translations: Record<string, string> = {};
  for (const e of RHEO_FUNCTIONS) {
    RheoPlugin.implementedFunctions[e.excelName] = {
      method: "callRheo",
      sizeOfResultArrayMethod: "rheoSize",
      vectorizationForbidden: true,
      parameters: e.parameters.map((p) => ({ argumentType: p.range ? FunctionArgumentType.RANGE : FunctionArgumentType.ANY, optionalArg: p.optional })),
    };
    translations[e.excelName] = e.excelName;
  }
  HyperFormula.registerFunctionPlugin(RheoPlugin, { enGB: translations });
  registered = true;
}
