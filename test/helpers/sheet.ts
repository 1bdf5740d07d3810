/**
 * Calling worksheet functions as Excel does: ranges are 2-D arrays (a column is [[a],[b]], a row
 * [[a, b]]), blanks arrive as null or "", omitted optional arguments as null. The Office runtime's
 * CustomFunctions.Error is stood in for by a class of the same shape (code, message), installed as
 * the global before the functions run.
 */
export const ERROR_CODES = {
  invalidValue: "#VALUE!",
  notAvailable: "#N/A",
  divisionByZero: "#DIV/0!",
  invalidNumber: "#NUM!",
  nullReference: "#NULL!",
  invalidName: "#NAME?",
  invalidReference: "#REF!",
} as const;

/** Same shape as the runtime's CustomFunctions.Error (office-js custom-functions-runtime). */
export class FakeCustomFunctionError extends Error {
  code: string;
  constructor(code?: string, message?: string) {
    super(message ?? "");
    this.code = code ?? ERROR_CODES.invalidValue;
  }
}

/** Installs a stand-in `CustomFunctions` global; returns a function that removes it. */
export function installOfficeRuntime(): () => void {
  const g = globalThis as Record<string, unknown>;
  const previous = g.CustomFunctions;
  g.CustomFunctions = { Error: FakeCustomFunctionError, ErrorCode: ERROR_CODES, associate: () => undefined };
  return () => {
    if (previous === undefined) delete g.CustomFunctions;
    else g.CustomFunctions = previous;
  };
}

export const col = (...values: unknown[]): unknown[][] => values.map((v) => [v]);
export const row = (...values: unknown[]): unknown[][] => [values];
export const cell = (value: unknown): unknown[][] => [[value]];

/** The single error a call returned, with its code and message; fails if the result is not one. */
export function errorOf(grid: unknown[][]): { code: string; message: string } {
  expect(grid).toHaveLength(1);
  expect(grid[0]).toHaveLength(1);
  const e = (grid[0] as unknown[])[0];
  if (!(e instanceof FakeCustomFunctionError)) throw new Error(`expected an error value, got ${JSON.stringify(grid)}`);
  return { code: e.code, message: e.message };
}

/** The numbers of a one-column or one-row result, "" kept; fails on error values. */
export function valuesOf(grid: unknown[][]): (number | string)[] {
  const flat = grid.length === 1 ? (grid[0] as unknown[]) : grid.map((r) => r[0]);
  return flat.map((v) => {
    if (typeof v === "number" || v === "") return v;
    throw new Error(`unexpected cell ${v instanceof Error ? `${(v as FakeCustomFunctionError).code} ${v.message}` : JSON.stringify(v)}`);
  });
}

/** The number in a cell (fails on anything else). */
export function num(v: unknown): number {
  if (typeof v !== "number") throw new Error(`expected a number, got ${v instanceof Error ? v.message : JSON.stringify(v)}`);
  return v;
}
