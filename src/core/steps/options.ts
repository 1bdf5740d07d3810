/**
 * Settings of step detection in a pressure–time recording, with their defaults defined once.
 *
 * Every limit below is a rule of thumb (common practice, no source) unless its comment names a
 * source; the criteria themselves are documented in the module that applies them (segment.ts,
 * transient.ts, plateau.ts, oscillation.ts, thermalCheck.ts).
 */
import { RheoError } from "../errors";
import { DEFAULT_PLANNER_OPTIONS } from "../planner";

/** What happens to a step that never reaches steady state. */
export type UnsteadyPolicy = "exclude" | "keep";

/** A steady window chosen by hand for one step (times in s, on the run's own clock). */
export interface WindowOverride {
  /** 1-based run (die run) number, in the order the runs appear */
  run: number;
  /** 1-based step number within the run */
  step: number;
  /** window start and end, s */
  start: number;
  end: number;
}

/** Settings of {@link detectRunSteps} and {@link detectTraceSteps}. */
export interface StepOptions {
  /** relative speed change that starts a new step (0.05: 5 %) */
  speedTolerance: number;
  /** consecutive samples beyond the tolerance needed to start a step (shorter spikes are jitter) */
  speedHoldSamples: number;
  /** segments with fewer samples are speed transitions and join the following step */
  minStepSamples: number;
  /** steady window: at least this long, s */
  minWindowTime: number;
  /** steady window: at least this many samples */
  minWindowSamples: number;
  /** steady when the drift over the window is at most this many noise standard deviations */
  driftLimit: number;
  /** drift always accepted up to this fraction of the plateau (a floor for very quiet signals) */
  driftFloor: number;
  /** the pressure within this fraction of its final value ends the transient (planner's ε) */
  settleTolerance: number;
  /** first-order time constant τ of the pressure approach, s; undefined: estimated */
  timeConstant: number | undefined;
  /** melt compressibility β, 1/Pa: with meltVolume, τ = β·V·ΔP/Q as in the planner */
  compressibility: number | undefined;
  /** melt volume in the barrel, m³ (with compressibility) */
  meltVolume: number | undefined;
  /** "exclude" (default) or "keep": what to do with steps that never become steady */
  unsteady: UnsteadyPolicy;
  /** peak-to-peak oscillation, as a fraction of the plateau, reported as flow instability */
  oscillationLimit: number;
  /** full oscillation cycles needed before an oscillation is reported */
  oscillationMinCycles: number;
  /** change of the repeated first speed's pressure, as a fraction, above which it is a warning */
  thermalCheckLimit: number;
  /** hand-set windows (the pane's "move a window and re-run") */
  windows: WindowOverride[];
}

/** Defaults of {@link StepOptions} (common practice, no source, except where stated). */
export const DEFAULT_STEP_OPTIONS: Readonly<StepOptions> = Object.freeze({
  speedTolerance: 0.05,
  speedHoldSamples: 3,
  minStepSamples: 5,
  minWindowTime: 5,
  minWindowSamples: 10,
  driftLimit: 1,
  driftFloor: 0.001,
  /** the planner's steady-state criterion, so plan and analysis agree (planner.ts) */
  settleTolerance: DEFAULT_PLANNER_OPTIONS.settleTolerance,
  timeConstant: undefined,
  compressibility: undefined,
  meltVolume: undefined,
  unsteady: "exclude" as UnsteadyPolicy,
  oscillationLimit: 0.05,
  oscillationMinCycles: 3,
  thermalCheckLimit: 0.03,
  windows: [] as WindowOverride[],
});

type NumberKey = { [K in keyof StepOptions]: StepOptions[K] extends number ? K : never }[keyof StepOptions];

/** Bounds of each numeric setting: [lowest, highest, whole number?]; exclusive lower bound 0 marked by `open`. */
const NUMERIC: Record<NumberKey, { min: number; max: number; open?: boolean; whole?: boolean }> = {
  speedTolerance: { min: 0, max: 1, open: true },
  speedHoldSamples: { min: 1, max: 1000, whole: true },
  minStepSamples: { min: 1, max: 100000, whole: true },
  minWindowTime: { min: 0, max: 1e6 },
  minWindowSamples: { min: 3, max: 1e6, whole: true },
  driftLimit: { min: 0, max: 1000 },
  driftFloor: { min: 0, max: 1 },
  settleTolerance: { min: 0, max: 1, open: true },
  oscillationLimit: { min: 0, max: 10, open: true },
  oscillationMinCycles: { min: 1, max: 1e6, whole: true },
  thermalCheckLimit: { min: 0, max: 10, open: true },
};

/**
 * Fills the defaults in and checks every setting.
 * @throws RheoError("value") naming an unknown setting; ("domain") a value outside its range
 * @example resolveStepOptions({ driftLimit: 2 }).minWindowTime // 5
 */
export function resolveStepOptions(options: Partial<StepOptions> = {}): StepOptions {
  const o: StepOptions = { ...DEFAULT_STEP_OPTIONS, windows: [...DEFAULT_STEP_OPTIONS.windows] };
  for (const [key, value] of Object.entries(options)) {
    if (!(key in DEFAULT_STEP_OPTIONS)) {
      throw new RheoError("value", "steps", `unknown setting "${key}"; accepted: ${Object.keys(DEFAULT_STEP_OPTIONS).join(", ")}`);
    }
    if (value === undefined) continue;
    (o as unknown as Record<string, unknown>)[key] = value;
  }
  for (const [key, bound] of Object.entries(NUMERIC) as [NumberKey, (typeof NUMERIC)[NumberKey]][]) {
    const v = o[key];
    if (typeof v !== "number" || !Number.isFinite(v)) throw new RheoError("value", key, `must be a finite number, got ${String(v)}`);
    const low = bound.open ? v <= bound.min : v < bound.min;
    if (low || v > bound.max || (bound.whole && !Number.isInteger(v))) {
      const kind = bound.whole ? "a whole number" : "a number";
      throw new RheoError("domain", key, `must be ${kind} ${bound.open ? "above" : "from"} ${bound.min} ${bound.open ? "and at most" : "to"} ${bound.max}, got ${v}`);
    }
  }
  for (const key of ["timeConstant", "compressibility", "meltVolume"] as const) {
    const v = o[key];
    if (v !== undefined && !(typeof v === "number" && Number.isFinite(v) && v > 0)) {
      throw new RheoError("domain", key, `must be a number greater than zero, got ${String(v)}`);
    }
  }
  if ((o.compressibility === undefined) !== (o.meltVolume === undefined)) {
    throw new RheoError("missing", o.compressibility === undefined ? "compressibility" : "meltVolume", "the compressibility time constant needs both the melt compressibility and the melt volume");
  }
  if (o.unsteady !== "exclude" && o.unsteady !== "keep") {
    throw new RheoError("value", "unsteady", `must be "exclude" or "keep", got "${String(o.unsteady)}"`);
  }
  if (!Array.isArray(o.windows)) throw new RheoError("value", "windows", "must be a list of {run, step, start, end}");
  o.windows.forEach((w, i) => {
    const where = `windows[${i + 1}]`;
    for (const k of ["run", "step"] as const) {
      if (!(Number.isInteger(w?.[k]) && w[k] >= 1)) throw new RheoError("value", where, `${k} must be a whole number from 1, got ${String(w?.[k])}`);
    }
    if (!(Number.isFinite(w.start) && Number.isFinite(w.end) && w.end > w.start)) {
      throw new RheoError("domain", where, `the window must end after it starts, got ${String(w.start)} s to ${String(w.end)} s`);
    }
  });
  return o;
}
