/**
 * The trace view's state and what it shows, without DOM: detect (or re-detect) the steps of the
 * recording with the windows the user moved, and derive the charts, the step table and the
 * method-sheet lines from the result. Pure: the panel's DOM code only renders this and calls
 * {@link moveWindow} / {@link resetWindow} / {@link traceView} on user actions.
 */
import type { BlankPoint } from "../../../core/steps/friction";
import type { StepOptions, WindowOverride } from "../../../core/steps/options";
import type { TraceRun } from "../../../core/steps/runSteps";
import { detectTraceSteps, type TraceSteps } from "../../../core/steps/traceSteps";
import type { Warning } from "../../../core/errors";
import { stepMethodLines } from "../../../io/stepRecord";
import { stepsTable, thermalChecksTable, type ResultTable } from "../../../io/resultTables";
import { TraceChartData, traceChartData } from "./chart";

/** Everything the trace view renders. */
export interface TraceView {
  trace: TraceSteps;
  charts: TraceChartData[];
  /** the step table, described as every result table is (src/io/resultTables.ts) */
  steps: ResultTable;
  /** the repeated-first-speed checks, or null when no run repeats its first speed */
  thermalChecks: ResultTable | null;
  /** lines for the method sheet (criterion, changed settings, hand-set windows) */
  method: string[];
  warnings: Warning[];
}

/**
 * The windows with one step's window moved (replacing an earlier move of the same step).
 * @example moveWindow([], { run: 1, step: 2, start: 40, end: 55 }) // [{ run: 1, step: 2, start: 40, end: 55 }]
 */
export function moveWindow(windows: readonly WindowOverride[], change: WindowOverride): WindowOverride[] {
  return [...windows.filter((w) => !(w.run === change.run && w.step === change.step)), { ...change }].sort((a, b) => a.run - b.run || a.step - b.step);
}

/** The windows without the hand-set window of one step (the detector's choice applies again). */
export function resetWindow(windows: readonly WindowOverride[], run: number, step: number): WindowOverride[] {
  return windows.filter((w) => !(w.run === run && w.step === step));
}

/**
 * Detects the steps with the user's windows and builds the view.
 * @throws RheoError from the detection (a window naming no step, bad samples, bad settings)
 */
export function traceView(runs: TraceRun[], options: Partial<StepOptions>, windows: readonly WindowOverride[], blank?: TraceRun | BlankPoint[]): TraceView {
  return traceViewOf(runs, detectTraceSteps(runs, { ...options, windows: [...windows] }, blank));
}

/** The view of steps already detected in `runs` (the runs the charts draw). */
export function traceViewOf(runs: readonly TraceRun[], trace: TraceSteps): TraceView {
  return {
    trace,
    charts: trace.runs.map((r, i) => traceChartData(runs[i] as TraceRun, r)),
    steps: stepsTable(trace.runs),
    thermalChecks: thermalChecksTable(trace.runs),
    method: stepMethodLines(trace),
    warnings: trace.warnings,
  };
}
