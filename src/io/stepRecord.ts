/**
 * What the step detection of a pressure recording did, in words: a plain note per step (for the
 * step tables of src/io/resultTables.ts and RHEO.PLATEAUS) and the method record (criterion,
 * changed settings, windows set by hand) for the method sheet and the results workbook. Also the
 * ordinary point table the steps give (`rheoledger steps --out`), so a user can inspect or edit it.
 */
import { DEFAULT_STEP_OPTIONS, type StepOptions } from "../core/steps/options";
import type { RunSteps, TraceStep } from "../core/steps/runSteps";
import { usedSteps, type TraceSteps } from "../core/steps/traceSteps";

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

const fmt = (x: number, digits = 6) => String(Number(x.toPrecision(digits)));

/**
 * The ordinary point table of the steps that go into the flow curve, as CSV text in the raw-table
 * layout (src/io/rawTable.ts): die, barrel, piston speed, plateau pressure, temperature; comment
 * lines before the header record where each row came from (run, step, window, sd, steady).
 * Steps kept though not steady are marked in their comment line.
 * @param source names the recording in the first comment line
 */
export function pointTableCsv(trace: TraceSteps, source: string): string {
  const used = usedSteps(trace);
  const slit = used.some(({ run }) => run.die?.slitWidth !== undefined);
  const round = used.some(({ run }) => run.die?.slitWidth === undefined);
  const withT = used.some(({ run }) => run.temperature !== null);
  const header = [
    ...(round ? ["die_diameter [mm]"] : []),
    ...(slit ? ["slit_width [mm]", "slit_height [mm]"] : []),
    "die_length [mm]",
    "barrel_diameter [mm]",
    "piston_speed [mm/min]",
    "pressure [bar]",
    ...(withT ? ["temperature [C]"] : []),
  ];
  const comments = [`# Steady points of the pressure recording ${source} (rheoledger steps); one line per point below.`];
  const rows = used.map(({ run, step }, i) => {
    comments.push(`# point ${i + 1}: die run ${run.run} (${run.label}), step ${step.step}, window ${fmt(step.start, 5)}–${fmt(step.end, 5)} s, ${step.samples} samples, sd ${fmt(step.pressureStd / 1e5, 3)} bar${step.steady ? "" : `, NOT STEADY (${step.reason})`}`);
    const die = run.die as NonNullable<RunSteps["die"]>;
    return [
      ...(round ? [die.dieDiameter === undefined ? "" : fmt(die.dieDiameter * 1e3)] : []),
      ...(slit ? (die.slitWidth === undefined || die.slitHeight === undefined ? ["", ""] : [fmt(die.slitWidth * 1e3), fmt(die.slitHeight * 1e3)]) : []),
      fmt(die.dieLength * 1e3),
      run.barrelDiameter === undefined ? "" : fmt(run.barrelDiameter * 1e3),
      fmt(step.pistonSpeed * 6e4),
      fmt(step.pressure / 1e5),
      ...(withT ? [run.temperature === null ? "" : fmt(run.temperature - 273.15, 5)] : []),
    ].join(",");
  });
  return [...comments, header.join(","), ...rows].join("\n") + "\n";
}
