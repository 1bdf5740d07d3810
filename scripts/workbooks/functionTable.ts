/**
 * The RHEO worksheet functions as declared in src/functions/functions.ts: Excel name (from the
 * `@customfunction` tag), exported JavaScript name and parameters (range or scalar, optional or
 * not). Read from the source text so the demo-workbook generator and the spreadsheet-engine test
 * see every function the add-in registers, with nothing listed by hand.
 */

/** The namespace Excel shows before each function name (manifest.xml). */
export const FUNCTION_NAMESPACE = "RHEO";

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
