/**
 * One run of the recording panel, without DOM: the settings through the shared reader, the
 * recording through the shared trace-table reader, the steps detected with the windows the user
 * moved (view.ts), then the plateaus reduced to a flow curve with the default reduction settings
 * (src/core/traceRun.ts). The steps are shown even when the reduction cannot be done (too few
 * steady steps, one die only): the reason is kept and said instead of the flow curve.
 */
import { RheoError, type Warning } from "../../../core/errors";
import type { WindowOverride } from "../../../core/steps/options";
import type { TraceRun } from "../../../core/steps/runSteps";
import { reduceTraceSteps } from "../../../core/traceRun";
import type { ReductionRun } from "../../../core/run";
import { readTraceTable } from "../../../io/traceTable";
import { PaneFieldError, detailOf, sentence, type FieldProblem } from "../../panelContract";
import { readTraceSettings, traceControlOf } from "./settings";
import { traceView, type TraceView } from "./view";

/** What the panel was given. */
export interface TraceInput {
  /** the recording's cells, header row first */
  cells: unknown[][];
  /** where it came from ("Data!A1:G700", the demo file) */
  label: string;
  /** the form's values by setting key, as typed */
  settings: Readonly<Record<string, string>>;
  /** the windows the user moved */
  windows: readonly WindowOverride[];
}

/** Everything one run produced. */
export interface TraceOutput {
  label: string;
  runs: TraceRun[];
  view: TraceView;
  windows: WindowOverride[];
  /** the reduction of the plateaus, or null when it could not be done */
  reduction: ReductionRun | null;
  /** why there is no flow curve (a sentence), or null */
  reductionProblem: string | null;
  /** every warning: reading, steps, reduction (the core's one list when the reduction ran) */
  warnings: Warning[];
}

/** The field a reader or detection error concerns, from its argument (never its wording). */
export function traceFieldOf(error: RheoError): string {
  const a = error.argument;
  if (a === "windows" || a.startsWith("windows[")) return "traceStart";
  if (a === "barrel_diameter") return traceControlOf("barrelDiameter");
  return "traceSource";
}

/**
 * Runs the panel (see the module comment).
 * @throws PaneFieldError naming the field(s) at fault: settings, the recording, a moved window
 */
export function runTrace(input: TraceInput): TraceOutput {
  const { request, problems } = readTraceSettings(input.settings);
  if (problems.length > 0) throw new PaneFieldError(problems);
  let table: ReturnType<typeof readTraceTable>;
  let view: TraceView;
  try {
    table = readTraceTable(input.cells, { rowWord: "row", source: input.label, ...(request.input.barrelDiameter !== undefined ? { barrelDiameter: request.input.barrelDiameter } : {}) });
    view = traceView(table.runs, request.steps, input.windows);
  } catch (error) {
    if (error instanceof RheoError) {
      const field = traceFieldOf(error);
      // a cell of the recording: say where; a window: the detector names the run and step
      const problem: FieldProblem = { field, message: field === "traceSource" && error.row === undefined ? sentence(error.message) : detailOf(error) };
      throw new PaneFieldError(problem);
    }
    throw error;
  }
  let reduction: ReductionRun | null = null;
  let reductionProblem: string | null = null;
  try {
    reduction = reduceTraceSteps(view.trace, request.options, {}, table.warnings);
  } catch (error) {
    if (!(error instanceof RheoError)) throw error;
    reductionProblem = sentence(error.message);
  }
  return {
    label: input.label,
    runs: table.runs,
    view,
    windows: [...input.windows],
    reduction,
    reductionProblem,
    warnings: reduction ? reduction.warnings : [...table.warnings, ...view.warnings],
  };
}
