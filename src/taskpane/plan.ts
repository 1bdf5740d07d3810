/** The whole plan of a run: the results sheet and its method record. */
import { buildMethodPlan } from "./methodPlan";
import { buildResultsPlan, PlanMeta } from "./resultsPlan";
import type { RunOutput } from "./runReduction";
import type { WorkbookPlan } from "./sheetPlan";

/** Builds both sheet plans of a run (pure; the preview renders it, the writer applies it). */
export function buildWorkbookPlan(run: RunOutput, meta: PlanMeta): WorkbookPlan {
  return { results: buildResultsPlan(run, meta), method: buildMethodPlan(run, meta) };
}
