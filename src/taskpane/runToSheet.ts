/**
 * The one run-to-sheet flow every panel uses: clear the panel's messages, block the other runs,
 * compute, then in Excel write the panel's sheets (new, numbered together, removed again on any
 * failure) or in preview mode build the same sheet plans, show them in the panel, say what
 * happened, and put any problem next to its field.
 */
import { excelBatch, supportsExcelApi } from "./officeHost";
import { PaneFieldError, type PanePanel } from "./panelContract";
import { byId, clearFieldErrors } from "./paneDom";
import { fail, panelMeta, setBusy, state } from "./paneState";
import { writeSheets } from "./excelWriter";
import type { SheetPlan } from "./sheetPlan";

/** Stamp of a run: add-in version and local date-time. */
export type RunMeta = ReturnType<typeof panelMeta>;

/** One run of a panel. */
export interface SheetRun<T> {
  panel: PanePanel;
  /** the panel's status line and results container */
  statusId: string;
  resultsId: string;
  /** the status while it works */
  working: string;
  /** the computation; throws a PaneFieldError (or a core error) naming the field(s) at fault */
  compute: (progress: (step: string, fraction: number) => void) => Promise<T>;
  /** the sheet plans of the result, one per base name of `panel.sheets`, built for `names` */
  plans: (out: T, names: readonly string[], meta: RunMeta) => SheetPlan[];
  /** the panel's view of the result (markup with every text escaped); `written` is null in preview mode */
  render: (out: T, plans: SheetPlan[], written: readonly string[] | null) => string;
  /** the status line afterwards */
  done: (out: T, written: readonly string[] | null) => string;
  /** what else to do with the result (hand it to other panels) */
  after?: (out: T) => void;
  /** progress of a long run (the reduction's bar) */
  progress?: (step: string, fraction: number | null) => void;
}

/** The ExcelApi version the writer needs (XY charts, log axes, conditional formats). */
export const WRITER_EXCEL_API = "1.7";

/** Runs `job` as described in the module comment. Never throws: problems are shown in the panel. */
export async function runToSheet<T>(job: SheetRun<T>): Promise<void> {
  if (state.busy) return;
  const section = document.getElementById(`${job.panel.id}-section`) ?? document;
  clearFieldErrors(section);
  setBusy(true);
  const status = byId(job.statusId);
  const progress = job.progress ?? (() => undefined);
  const runField = runFieldOf(job.panel);
  try {
    status.textContent = job.working;
    const out = await job.compute((step, f) => progress(`${step}…`, f));
    const meta = panelMeta();
    let plans: SheetPlan[] = [];
    let written: string[] | null = null;
    if (state.mode.kind === "excel") {
      if (!supportsExcelApi(WRITER_EXCEL_API)) {
        throw new PaneFieldError({ field: runField, message: `This version of Excel lacks the functions the pane writes with (ExcelApi ${WRITER_EXCEL_API}); use the RHEO worksheet functions instead.` });
      }
      written = await writeSheets(excelBatch, job.panel.sheets, (names) => (plans = job.plans(out, names, meta)), (step, f) => progress(`${step}…`, f));
    } else {
      plans = job.plans(out, job.panel.sheets, meta);
    }
    byId(job.resultsId).innerHTML = job.render(out, plans, written);
    progress("", null);
    status.textContent = job.done(out, written);
    job.after?.(out);
  } catch (error) {
    progress("", null);
    status.textContent = "Stopped; nothing was written.";
    fail(error, runField);
  } finally {
    setBusy(false);
  }
}

/** The field of a panel's run button (its error box `${field}-error`). */
export function runFieldOf(panel: PanePanel): string {
  return Object.entries(panel.fields).find(([, f]) => f.control === panel.runButton)?.[0] ?? "run";
}
