/**
 * The one place where failures become worksheet errors.
 *
 * Policy (README, "Conventions of the RHEO functions"): a function returns its whole result or one
 * error. `RheoError` kinds map to Excel error codes as
 *   value → #VALUE!, missing → #N/A, domain and convergence → #NUM!.
 * Excel shows the message of #VALUE! and #N/A errors in the cell's error menu; a #NUM! keeps its
 * message on the object (tests read it) but Excel does not display it.
 * Any other exception is a defect: it becomes #VALUE! with "internal error: …" so that no exception
 * ever leaves a worksheet function.
 */
import { RheoError, RheoErrorKind } from "../../core/errors";

/** The Excel error codes the RHEO functions return (values of `CustomFunctions.ErrorCode`). */
export const CELL_ERROR_CODE = {
  value: "#VALUE!",
  missing: "#N/A",
  domain: "#NUM!",
  convergence: "#NUM!",
} as const satisfies Record<RheoErrorKind, string>;

export type CellErrorCode = (typeof CELL_ERROR_CODE)[RheoErrorKind];

/**
 * Stand-in for `CustomFunctions.Error` where the Office runtime is absent (Node, the CLI, a
 * spreadsheet engine in tests). Same shape: `code` and `message`.
 */
export class SheetError extends Error {
  readonly code: string;
  constructor(code: string, message?: string) {
    super(message ?? "");
    this.name = "SheetError";
    this.code = code;
  }
}

/** What a worksheet function returns in place of a value. */
export type CellErrorValue = CustomFunctions.Error | SheetError;

function officeRuntime(): typeof CustomFunctions | undefined {
  return typeof CustomFunctions !== "undefined" && typeof CustomFunctions.Error === "function"
    ? CustomFunctions
    : undefined;
}

/** Builds the error value for `code` with `message`, using the Office runtime when present. */
export function cellError(code: CellErrorCode, message: string): CellErrorValue {
  const runtime = officeRuntime();
  if (runtime) {
    const errorCode = {
      "#VALUE!": runtime.ErrorCode.invalidValue,
      "#N/A": runtime.ErrorCode.notAvailable,
      "#NUM!": runtime.ErrorCode.invalidNumber,
    }[code];
    return new runtime.Error(errorCode, message);
  }
  return new SheetError(code, message);
}

/** Maps any thrown value to a cell error (see the module comment). */
export function toCellError(thrown: unknown): CellErrorValue {
  if (thrown instanceof RheoError) return cellError(CELL_ERROR_CODE[thrown.kind], thrown.message);
  if (isCellError(thrown)) return thrown;
  const text = thrown instanceof Error ? thrown.message : String(thrown);
  return cellError("#VALUE!", `internal error: ${text}`);
}

/** True for a `CustomFunctions.Error` or {@link SheetError} (an error value already shaped). */
export function isCellError(value: unknown): value is CellErrorValue {
  if (value instanceof SheetError) return true;
  const runtime = officeRuntime();
  return runtime !== undefined && value instanceof runtime.Error;
}

/**
 * Runs a worksheet function's body: returns its grid, or a 1×1 grid holding the error.
 * A number that is not finite never reaches a cell: that cell becomes #NUM! instead.
 */
export function guard(what: string, body: () => unknown[][]): unknown[][] {
  try {
    // the body's grid is its own: non-finite numbers are replaced in place (no copy per call)
    const grid = body();
    for (let r = 0; r < grid.length; r++) {
      const row = grid[r] as unknown[];
      for (let c = 0; c < row.length; c++) {
        const cell = row[c];
        if (typeof cell === "number" && !Number.isFinite(cell)) row[c] = cellError("#NUM!", `${what}: the result is not a finite number (${String(cell)})`);
      }
    }
    return grid;
  } catch (thrown) {
    return [[toCellError(thrown)]];
  }
}
