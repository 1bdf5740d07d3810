/**
 * `rheoledger reduce FILE.csv --out results.xlsx`: writes the results workbook
 * (src/io/resultsWorkbook.ts), then prints the command's output. exceljs writes asynchronously,
 * so this path of main() returns a Promise of the exit code.
 */
import { resultsWorkbookBytes } from "../io/resultsWorkbook";
import type { CliIO } from "./io";
import type { CommandOutput } from "./reduceCommand";

/** Writes the workbook, then the command's standard output and a note of where the file went. */
export async function writeResultsFile(out: CommandOutput, source: string, path: string, io: CliIO, json: boolean): Promise<number> {
  if (!/\.xlsx$/i.test(path)) {
    io.stderr(`rheoledger: --out: expected a file name ending in .xlsx, got "${path}"\n`);
    return 2;
  }
  if (!io.writeFile) {
    io.stderr("rheoledger: --out: this surface cannot write files\n");
    return 1;
  }
  try {
    const bytes = await resultsWorkbookBytes({ result: out.result, warnings: out.run.warnings, fits: out.run.comparisons, source, ...(out.run.steps ? { steps: out.run.steps } : {}) });
    io.writeFile(path, bytes);
  } catch (e) {
    io.stderr(`rheoledger: cannot write ${path}: ${(e as Error).message}\n`);
    return 1;
  }
  io.stdout(out.stdout);
  // keep standard output one JSON document: the note goes to standard error then
  if (json) io.stderr(`Results workbook written to ${path}\n`);
  else io.stdout(`Results workbook written to ${path}\n`);
  return 0;
}
