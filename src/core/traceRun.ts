/**
 * A run of Rheoledger from a pressure recording: the steps of every die run are detected
 * (src/core/steps), their steady plateaus become ordinary measurements, and those are reduced,
 * fitted and shifted exactly as a point table is (run.ts). The run carries the steps, and their
 * warnings join the run's one warning list (after the input's, before the reduction's).
 */
import { RheoError, type Warning } from "./errors";
import type { ReduceOptions } from "./reduceTypes";
import { runReduction, type FitRequest, type ReductionRun } from "./run";
import type { BlankPoint } from "./steps/friction";
import type { StepOptions } from "./steps/options";
import type { TraceRun } from "./steps/runSteps";
import { detectTraceSteps, stepMeasurements, type TraceSteps } from "./steps/traceSteps";

/**
 * Detects the steps and reduces their plateaus (see the module comment).
 * @param blank a blank run (recording or steady points) whose friction is subtracted
 * @throws RheoError("missing", "steps") when no step can go into the flow curve; any error of the
 *   step detection or of the reduction
 * @example runTraceReduction(runs, {}, {}, {}, []).steps.runs.length
 */
export function runTraceReduction(
  runs: TraceRun[],
  steps: Partial<StepOptions>,
  options: Partial<ReduceOptions>,
  fits: FitRequest,
  inputWarnings: Warning[],
  blank?: TraceRun | BlankPoint[],
): ReductionRun & { steps: NonNullable<ReductionRun["steps"]> } {
  return reduceTraceSteps(detectTraceSteps(runs, steps, blank), options, fits, inputWarnings);
}

/**
 * Reduces the plateaus of steps already detected (the task pane shows the steps even when they
 * cannot be reduced, so it detects first and reduces second).
 * @throws RheoError("missing", "steps") when no step can go into the flow curve; any error of the reduction
 * @example reduceTraceSteps(detectTraceSteps(runs), {}, {}, []).result.groups.length
 */
export function reduceTraceSteps(
  trace: TraceSteps,
  options: Partial<ReduceOptions>,
  fits: FitRequest,
  inputWarnings: Warning[],
): ReductionRun & { steps: NonNullable<ReductionRun["steps"]> } {
  const measurements = stepMeasurements(trace);
  if (measurements.length === 0) {
    const found = trace.runs.reduce((n, r) => n + r.steps.length, 0);
    throw new RheoError("missing", "steps", `no step of the recording can go into the flow curve (${found} steps found, none steady); see the step table, or keep unsteady steps flagged (setting unsteady: keep)`);
  }
  const run = runReduction(measurements, options, fits, [...inputWarnings, ...trace.warnings]);
  return { ...run, steps: trace };
}
