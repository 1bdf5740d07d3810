/**
 * Step detection over a whole recording (several die runs, from one file or several), the
 * barrel friction from a blank run, and the steady points handed to the reduction as ordinary
 * measurements (reduce.ts). SI units.
 */
import { RheoError, Warning, warning } from "../errors";
import type { Measurement } from "../reduceTypes";
import { barrelArea, BlankPoint, frictionCurve, FrictionCurve } from "./friction";
import { resolveStepOptions, StepOptions } from "./options";
import { detectRunSteps, RunDie, RunSteps, TraceRun, TraceStep } from "./runSteps";

/** Result of {@link detectTraceSteps}. */
export interface TraceSteps {
  runs: RunSteps[];
  /** the blank's steady points, when a blank was given */
  blank?: BlankPoint[];
  /** every run's warnings, each with its run as scope ("die run 2"); the blank's scoped "blank" */
  warnings: Warning[];
  /** the settings used, defaults filled in */
  options: StepOptions;
}

/**
 * The blank run's points: each step's plateau force against its piston speed. The blank's
 * `pressure` samples are forces (N); its die is ignored. Steps that are not steady are used all
 * the same, with a warning (a blank has no flow curve to protect).
 */
export function blankPoints(blank: TraceRun, options: Partial<StepOptions> = {}): { points: BlankPoint[]; warnings: Warning[] } {
  const o = resolveStepOptions({ ...options, windows: [], unsteady: "keep" });
  const steps = detectRunSteps(blank, 1, o);
  if (steps.steps.length === 0) throw new RheoError("missing", "blank", "has no step with the piston moving");
  const points = steps.steps.map((s) => ({ pistonSpeed: s.pistonSpeed, force: s.pressure }));
  const warnings = steps.steps
    .filter((s) => !s.steady)
    .map((s) => warning("STEP_NOT_STEADY", `blank run, step ${s.step} at ${Number((s.pistonSpeed * 6e4).toPrecision(4))} mm/min: not steady (${s.reason}); its mean force is used for the friction.`, "blank"));
  return { points, warnings };
}

/**
 * Detects the steps of every die run (runSteps.ts); a blank run (force against speed) gives the
 * barrel friction subtracted from every step; steady blank points (force against speed) may be
 * given instead of the recording.
 * @throws RheoError for bad samples, unknown settings, or a hand-set window naming a run or step
 *   that does not exist
 * @example detectTraceSteps([run]).runs[0].steps[0].pressure
 */
export function detectTraceSteps(runs: TraceRun[], options: Partial<StepOptions> = {}, blank?: TraceRun | BlankPoint[]): TraceSteps {
  const o = resolveStepOptions(options);
  if (runs.length === 0) throw new RheoError("missing", "trace", "has no die run");
  const warnings: Warning[] = [];
  let friction: FrictionCurve | undefined;
  let blankList: BlankPoint[] | undefined;
  if (Array.isArray(blank)) {
    blankList = blank;
    friction = frictionCurve(blank);
  } else if (blank) {
    const b = blankPoints(blank, options);
    blankList = b.points;
    friction = frictionCurve(b.points);
    warnings.push(...b.warnings);
  }
  const results = runs.map((run, i) => detectRunSteps(run, i + 1, o, friction));
  o.windows.forEach((w, i) => {
    const run = results[w.run - 1];
    if (!run) throw new RheoError("value", `windows[${i + 1}]`, `names die run ${w.run}; the recording has ${results.length}`);
    if (!run.steps[w.step - 1]) throw new RheoError("value", `windows[${i + 1}]`, `names step ${w.step} of die run ${w.run}, which has ${run.steps.length} steps`);
  });
  for (const r of results) warnings.push(...r.warnings.map((w) => ({ ...w, scope: `die run ${r.run}` })));
  const out: TraceSteps = { runs: results, warnings, options: o };
  if (blankList) out.blank = blankList;
  return out;
}

/** The steps that become points of the flow curve, in run and step order. */
export function usedSteps(trace: TraceSteps): { run: RunSteps; step: TraceStep }[] {
  return trace.runs.flatMap((run) => run.steps.filter((s) => s.used).map((step) => ({ run, step })));
}

/**
 * The steady points as ordinary measurements for reduce(): die, flow rate Q = v·πD_b²/4, plateau
 * pressure and its standard deviation, the run's temperature; `row` is the source line of the
 * window's first sample.
 * @throws RheoError("missing") when a run has no barrel bore
 */
export function stepMeasurements(trace: TraceSteps): Measurement[] {
  return usedSteps(trace).map(({ run, step }) => {
    if (!run.die) throw new RheoError("missing", "die_length", `die run ${run.run} has no die`);
    if (run.barrelDiameter === undefined) {
      throw new RheoError("missing", "barrel_diameter", `die run ${run.run} (${run.label}) has no barrel bore: add a "barrel_diameter [mm]" column or give the bore on its own`);
    }
    const m: Measurement = {
      dieLength: (run.die as RunDie).dieLength,
      flowRate: step.pistonSpeed * barrelArea(run.barrelDiameter),
      pressure: step.pressure,
      pressureStd: step.pressureStd,
    };
    const die = run.die;
    if (die.slitWidth !== undefined && die.slitHeight !== undefined) {
      m.slitWidth = die.slitWidth;
      m.slitHeight = die.slitHeight;
    } else m.dieDiameter = die.dieDiameter;
    if (run.temperature !== null) m.temperature = run.temperature;
    if (step.line !== undefined) m.row = step.line;
    return m;
  });
}
