/**
 * The RHEO worksheet functions as declared in src/functions/functions.ts: Excel name (from the
 * `@customfunction` tag), exported JavaScript name and parameters (range or scalar, optional or
 * not). Read from the source text so the demo-workbook generator and the spreadsheet-engine test
 * see every function the add-in registers, with nothing listed by hand.
 */

/** The namespace Excel shows before each function name (manifest.xml). */
export const FUNCTION_NAMESPACE = "RHEO";

/**
 * Prefix under which Excel stores an add-in's JavaScript custom functions in the file.
 *
 * What Excel writes, as found in public sources (no Microsoft specification states it):
 *   - OfficeDev/Excel-Custom-Functions issue #108 (maintainer): "For Javascript Custom Functions,
 *     we by default save out with a different prefix '_xldudf'";
 *   - OfficeDev/office-js issue #3558 (maintainer): until the add-in's manifest is read the cell
 *     shows the `_xldudf` name; once Excel knows the functions it maps them back to their real
 *     names and calculates;
 *   - OfficeDev/office-js issue #2568: the stored form seen in sheetN.xml is `_xldudf_XXXX`
 *     (broken files had `[2]!_xldudf_XXX`); issue #877: a dot in a function name becomes an
 *     underscore;
 *   - workbooks from other add-ins in public repositories store `<f>_xldudf_NAMESPACE_NAME(…)</f>`
 *     with the cached value in `<v>` (e.g. `_xldudf_CX_GET(…)`).
 * Hence RHEO.FLOWRATE is stored as `_xldudf_RHEO_FLOWRATE`. Not confirmed against a file saved by
 * Excel itself (no Excel here); docs/workbooks.md says so.
 */
export const STORED_FUNCTION_PREFIX = "_xldudf_";

/** The name Excel stores for a function, e.g. "RHEO.FLOWRATE" → "_xldudf_RHEO_FLOWRATE". */
export function storedFunctionName(excelName: string): string {
  return STORED_FUNCTION_PREFIX + excelName.replace(/\./g, "_");
}

export interface SheetFunctionParameter {
  name: string;
  /** declared `unknown[][]`: Excel passes a 2-D array (a range or a single cell) */
  range: boolean;
  optional: boolean;
}

export interface SheetFunctionEntry {
  /** e.g. "RHEO.FLOWRATE" */
  excelName: string;
  /** the exported implementation, e.g. "flowRate" */
  jsName: string;
  parameters: SheetFunctionParameter[];
}

const DECLARATION = /@customfunction\s+([A-Z][A-Z0-9.]*)[\s\S]*?\*\/\s*export function (\w+)\(([\s\S]*?)\)\s*:/g;

/** Parses the `@customfunction` declarations of functions.ts source text. */
export function readFunctionTable(source: string): SheetFunctionEntry[] {
  const entries: SheetFunctionEntry[] = [];
  for (const m of source.matchAll(DECLARATION)) {
    const [, tag, jsName, paramText] = m as unknown as [string, string, string, string];
    const parameters = paramText
      .split(",")
      .map((p) => p.trim())
      .filter((p) => p !== "")
      .map((p) => {
        const pm = /^(\w+)(\?)?\s*:\s*(.+)$/.exec(p);
        if (!pm) throw new Error(`functions.ts: cannot read parameter "${p}" of ${jsName}`);
        return { name: pm[1] as string, optional: pm[2] === "?", range: /\[\]\[\]$/.test((pm[3] as string).trim()) };
      });
    entries.push({ excelName: `${FUNCTION_NAMESPACE}.${tag}`, jsName, parameters });
  }
  return entries;
}
