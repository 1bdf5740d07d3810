/**
 * The step table of a pressure recording, described once for every surface (CLI text, results
 * workbook, pane, worksheet function): one row per detected step with its window, plateau mean
 * and standard deviation, whether it is steady and whether it went into the flow curve, and a
 * plain note on what was found. Values in SI; each column names its quantity and display unit.
 * Also the thermal-check table (the repeated first speed of each die run).
 */
import { fromSI, type Quantity } from "../core/units";
import { DEFAULT_STEP_OPTIONS, type StepOptions } from "../core/steps/options";
import type { TraceSteps } from "../core/steps/traceSteps";
import type { RunSteps, TraceStep } from "../core/steps/runSteps";

/** One column of a table: key in the rows, plain header, and quantity with display unit when dimensional. */
export interface StepColumn {
  key: string;
  header: string;
  quantity?: Quantity;
  /** display unit (the rows hold SI) */
  unit?: string;
}

export const STEP_TABLE_COLUMNS: readonly StepColumn[] = Object.freeze([
  { key: "run", header: "die run" },
  { key: "die", header: "die" },
  { key: "step", header: "step" },
  { key: "pistonSpeed", header: "piston speed", quantity: "speed", unit: "mm/min" },
  { key: "stepStart", header: "step start", quantity: "time", unit: "s" },
  { key: "start", header: "window start", quantity: "time", unit: "s" },
  { key: "end", header: "window end", quantity: "time", unit: "s" },
  { key: "samples", header: "samples" },
  { key: "pressure", header: "pressure", quantity: "pressure", unit: "bar" },
  { key: "pressureStd", header: "pressure sd", quantity: "pressure", unit: "bar" },
  { key: "steady", header: "steady" },
  { key: "used", header: "in flow curve" },
  { key: "note", header: "note" },
]);

export type StepRow = Record<string, number | string | boolean>;

/**
 * A plain note on one step: why it is not steady, an oscillation, the thermal check, a hand-set
 * window, the friction subtracted. Empty for a clean step.
 * @example stepNote(step) // "not steady: drifting: 1.1 % over the last 22.4 s, 0.44 % allowed"
 */
export function stepNote(step: TraceStep): string {
  const notes: string[] = [];
  if (step.role === "check") notes.push("repeat of the first speed (thermal check)");
  if (!step.steady && step.reason) notes.push(`not steady: ${step.reason}`);
  if (step.oscillation) notes.push(`oscillation (stick–slip) ${(100 * step.oscillation.relativeAmplitude).toPrecision(2)} % peak to peak, period ${step.oscillation.period.toPrecision(3)} s`);
  if (step.window === "set" && step.detected) notes.push(`window set by hand (detected ${step.detected.start.toPrecision(4)}–${step.detected.end.toPrecision(4)} s)`);
  if (step.friction > 0) notes.push(`barrel friction ${Number((step.friction / 1e5).toPrecision(3))} bar subtracted${step.frictionOutside ? " (beyond the blank's speeds)" : ""}`);
  if (step.role === "point" && !step.used && step.steady) notes.push("left out");
  return notes.join("; ");
}

/** The rows of one run's steps (SI values). */
export function runStepRows(run: RunSteps): StepRow[] {
  return run.steps.map((s) => ({
    run: run.run,
    die: run.label,
    step: s.step,
    pistonSpeed: s.pistonSpeed,
    stepStart: s.stepStart,
    start: s.start,
    end: s.end,
    samples: s.samples,
    pressure: s.pressure,
    pressureStd: s.pressureStd,
    steady: s.steady,
    used: s.used,
    note: stepNote(s),
  }));
}

/** The step table of a recording: every run's steps in order (SI values). */
export function stepTableRows(trace: TraceSteps): StepRow[] {
  return trace.runs.flatMap(runStepRows);
}

export const THERMAL_CHECK_COLUMNS: readonly StepColumn[] = Object.freeze([
  { key: "run", header: "die run" },
  { key: "die", header: "die" },
  { key: "pistonSpeed", header: "piston speed", quantity: "speed", unit: "mm/min" },
  { key: "firstPressure", header: "first pressure", quantity: "pressure", unit: "bar" },
  { key: "repeatPressure", header: "repeat pressure", quantity: "pressure", unit: "bar" },
  { key: "change", header: "change", quantity: "ratio", unit: "%" },
  { key: "withinLimit", header: "within limit" },
]);

/** One row per die run that repeats its first speed (SI values; change as a fraction). */
export function thermalCheckRows(trace: TraceSteps): StepRow[] {
  return trace.runs.flatMap((r) =>
    r.thermalCheck
      ? [{ run: r.run, die: r.label, pistonSpeed: r.thermalCheck.pistonSpeed, firstPressure: r.thermalCheck.firstPressure, repeatPressure: r.thermalCheck.repeatPressure, change: r.thermalCheck.change, withinLimit: r.thermalCheck.withinLimit }]
      : [],
  );
}

/** A table in display units: headers "name [unit]" and rows converted from SI. */
export interface DisplayTable {
  header: string[];
  rows: (number | string | boolean)[][];
}

/**
 * Converts SI rows to the columns' display units (fromSI), headers "header [unit]".
 * @example displayTable(STEP_TABLE_COLUMNS, stepTableRows(trace)).header[3] // "piston speed [mm/min]"
 */
export function displayTable(columns: readonly StepColumn[], rows: readonly StepRow[]): DisplayTable {
  return {
    header: columns.map((c) => (c.unit !== undefined ? `${c.header} [${c.unit}]` : c.header)),
    rows: rows.map((r) =>
      columns.map((c) => {
        const v = r[c.key] ?? "";
        return typeof v === "number" && c.quantity !== undefined && c.unit !== undefined ? fromSI(v, c.unit, c.quantity) : v;
      }),
    ),
  };
}

/**
 * The method record of the step detection, for the method sheet and the results workbook: the
 * criterion, the settings that differ from the defaults, and every window set by hand with the
 * window the detector had chosen.
 */
export function stepMethodLines(trace: TraceSteps): string[] {
  const o = trace.options;
  const lines = [
    "Steps: segmented where the piston speed changes by more than the speed tolerance; the transient ln(1/ε)·τ after each change is excluded (τ given, from the melt compressibility β·V·ΔP/Q, or read off the step).",
    `Steady window: the drift of the least-squares line over the window at most ${o.driftLimit} noise standard deviations (floor ${100 * o.driftFloor} % of the plateau) plus twice its standard error; at least ${o.minWindowTime} s, ${o.minWindowSamples} samples and half the step after the transient. Plateau: mean and standard deviation of the window's readings.`,
    `Steps that never become steady: ${o.unsteady === "keep" ? "kept in the flow curve, flagged" : "left out of the flow curve"}. Oscillation reported above ${100 * o.oscillationLimit} % peak to peak over ${o.oscillationMinCycles} cycles. Repeated first speed: warning above ${100 * o.thermalCheckLimit} % change.`,
  ];
  const changed = (Object.keys(DEFAULT_STEP_OPTIONS) as (keyof StepOptions)[]).filter((k) => k !== "windows" && o[k] !== DEFAULT_STEP_OPTIONS[k]);
  if (changed.length > 0) lines.push(`Settings changed from their defaults: ${changed.map((k) => `${k} = ${String(o[k])}`).join(", ")}.`);
  if (trace.blank) lines.push(`Barrel friction: a blank run of ${trace.blank.length} speeds, interpolated linearly in speed and subtracted as force / barrel area.`);
  for (const run of trace.runs) {
    for (const s of run.steps) {
      if (s.window === "set" && s.detected) {
        lines.push(`Die run ${run.run}${run.label ? ` (${run.label})` : ""}, step ${s.step}: window set by hand to ${s.start.toPrecision(4)}–${s.end.toPrecision(4)} s (detected ${s.detected.start.toPrecision(4)}–${s.detected.end.toPrecision(4)} s).`);
      }
    }
  }
  return lines;
}
