/**
 * Step detection in one die run (one die, one barrel load): segments by speed (segment.ts), the
 * transient (transient.ts), the steady window and plateau (plateau.ts), oscillation
 * (oscillation.ts), barrel friction (friction.ts) and the repeated-first-speed check
 * (thermalCheck.ts). SI units throughout: s, m/s, m, Pa.
 */
import { RheoError, Warning, warning } from "../errors";
import { groupLabel, millimetres } from "../grouping";
import { barrelArea, FrictionCurve } from "./friction";
import { detectOscillation, Oscillation } from "./oscillation";
import { StepOptions } from "./options";
import { indexAtOrAfter, steadyWindow, windowAt, WindowChoice, WindowLimits } from "./plateau";
import { positionSign, speedFromPosition, windowSpeedFromPosition } from "./positionSpeed";
import { segmentBySpeed } from "./segment";
import { repeatStepIndex, thermalCheck, ThermalCheck } from "./thermalCheck";
import { stepTransient, TimeConstantSource } from "./transient";
import { WindowSums } from "./windowFit";

/** The die of a run, SI (m): a round die (dieDiameter) or a slit (slitWidth, slitHeight). */
export interface RunDie {
  dieDiameter?: number;
  slitWidth?: number;
  slitHeight?: number;
  dieLength: number;
}

/** One die run's samples, SI. */
export interface TraceRun {
  /** sample times, s, strictly increasing */
  time: ArrayLike<number>;
  /** pressure per sample, Pa (for a force instrument F/A_b, before friction) */
  pressure: ArrayLike<number>;
  /** piston speed per sample, m/s (or give pistonPosition) */
  pistonSpeed?: ArrayLike<number>;
  /** piston position per sample, m (speed is derived) */
  pistonPosition?: ArrayLike<number>;
  /** source line (or row) of each sample, for messages */
  lines?: ArrayLike<number>;
  /** how `lines` are named in messages: "line" (files, the default) or "row" (worksheets) */
  rowWord?: "line" | "row";
  /** the die (absent for a blank run) */
  die?: RunDie;
  /** barrel bore D_b, m (needed for flow rates, the compressibility τ and friction) */
  barrelDiameter?: number;
  /** mean melt temperature, K, or null */
  temperature?: number | null;
  /** where the run came from, e.g. a file name (for messages) */
  source?: string;
}

/** One detected step. SI units; times on the run's own clock. */
export interface TraceStep {
  /** 1-based run and step numbers */
  run: number;
  step: number;
  /** "point": a point of the flow curve; "check": the repeated first speed (thermal check) */
  role: "point" | "check";
  /** piston speed over the window, m/s */
  pistonSpeed: number;
  /** the step's first and last sample times, s */
  stepStart: number;
  stepEnd: number;
  /** the window the plateau is taken over, s */
  start: number;
  end: number;
  /** sample indices of the window in the run */
  startIndex: number;
  endIndex: number;
  samples: number;
  /** plateau mean, net of barrel friction, Pa */
  pressure: number;
  /** standard deviation of the window's readings, Pa */
  pressureStd: number;
  /** barrel friction subtracted, Pa (0 without a blank) */
  friction: number;
  /** true when the friction was taken beyond the blank's speed range */
  frictionOutside: boolean;
  /** signed drift over the window and the largest accepted |drift|, Pa */
  drift: number;
  driftAllowed: number;
  /** noise: residual standard deviation about the window's line, Pa */
  noise: number;
  /** τ and where it came from; the transient excluded, s */
  timeConstant: number;
  timeConstantSource: TimeConstantSource;
  transient: number;
  steady: boolean;
  /** why the step is not steady, or null */
  reason: string | null;
  oscillation: Oscillation | null;
  /** "detected", or "set" by hand (windows setting) */
  window: "detected" | "set";
  /** the detected window when the window was set by hand, s */
  detected?: { start: number; end: number };
  /** true when the step becomes a point of the flow curve */
  used: boolean;
  /** source line of the window's first sample (when the run has lines) */
  line?: number;
}

/** Steps of one die run. */
export interface RunSteps {
  run: number;
  /** e.g. "190 °C, D 1 mm, L 20 mm" */
  label: string;
  die?: RunDie;
  barrelDiameter?: number;
  temperature: number | null;
  source?: string;
  steps: TraceStep[];
  thermalCheck: ThermalCheck | null;
  /** speed of each sample (given or derived), m/s: the chart and re-runs use it */
  speed: Float64Array;
  warnings: Warning[];
}

/** The label of a run: its group label and the die length ("" for a run without a die). */
export function runLabel(run: Pick<TraceRun, "die" | "temperature">): string {
  const d = run.die;
  if (!d) return "";
  const group = groupLabel({ temperature: run.temperature ?? null, dieDiameter: d.dieDiameter ?? NaN, slitWidth: d.slitWidth, slitHeight: d.slitHeight });
  return `${group}, L ${millimetres(d.dieLength)}`;
}

const where = (run: TraceRun, i: number) => `${run.source ? `${run.source} ` : ""}${run.lines ? `${run.rowWord ?? "line"} ${run.lines[i]}` : `sample ${i + 1}`}`;

function validateRun(run: TraceRun, n: number): void {
  const check = (values: ArrayLike<number> | undefined, name: string, positive = false) => {
    if (values === undefined) return;
    if (values.length !== n) throw new RheoError("value", name, `has ${values.length} samples, time has ${n}`);
    for (let i = 0; i < n; i++) {
      const v = values[i] as number;
      if (!Number.isFinite(v)) throw new RheoError("value", name, `${where(run, i)} is not a finite number (${String(v)})`);
      if (positive && v < 0) throw new RheoError("domain", name, `${where(run, i)} is negative (${v})`);
    }
  };
  check(run.time, "time");
  check(run.pressure, "pressure");
  check(run.pistonSpeed, "piston_speed");
  check(run.pistonPosition, "piston_position");
  for (let i = 1; i < n; i++) {
    const t = run.time[i] as number;
    const before = run.time[i - 1] as number;
    if (!(t > before)) {
      const what = t === before ? `repeats the time of ${where(run, i - 1)}` : `is earlier than ${where(run, i - 1)}`;
      throw new RheoError("value", "time", `${where(run, i)} ${what}; times must increase within a die run`);
    }
  }
}

/** Display of a speed in mm/min and a pressure in bar, for messages. */
const mmPerMin = (v: number) => `${Number((v * 6e4).toPrecision(4))} mm/min`;
const bar = (p: number) => `${Number((p / 1e5).toPrecision(4))} bar`;

/**
 * Detects the steps of one die run (see the module comment).
 * @param runNumber 1-based number of the run (messages, window overrides)
 * @param friction the blank's friction curve, for a force instrument (needs barrelDiameter)
 * @throws RheoError naming the column and line of a bad sample, or a window that holds no samples
 */
export function detectRunSteps(run: TraceRun, runNumber: number, o: StepOptions, friction?: FrictionCurve): RunSteps {
  const n = run.time.length;
  if (n < 3) throw new RheoError("missing", "time", `die run ${runNumber} has ${n} samples; at least 3 are needed`);
  if (!run.pistonSpeed && !run.pistonPosition) throw new RheoError("missing", "piston_speed", "give piston_speed or piston_position");
  validateRun(run, n);
  if (friction && run.barrelDiameter === undefined) throw new RheoError("missing", "barrel_diameter", "the barrel friction of a blank run needs the barrel bore");
  const speed = run.pistonSpeed ? Float64Array.from(run.pistonSpeed as ArrayLike<number>) : speedFromPosition(run.time, run.pistonPosition as ArrayLike<number>);
  const sign = run.pistonPosition ? positionSign(run.pistonPosition) : 1;
  const named = runLabel(run);
  const label = named ? `run ${runNumber} (${named})` : `run ${runNumber}`;
  const segments = segmentBySpeed(speed, o.speedTolerance, o.speedHoldSamples, o.minStepSamples).filter((s) => !s.idle);
  const warnings: Warning[] = [];
  const steps: TraceStep[] = segments.map((seg, k) => {
    const from = seg.startIndex;
    const to = seg.endIndex;
    const area = run.barrelDiameter !== undefined ? barrelArea(run.barrelDiameter) : undefined;
    const transient = stepTransient(run.time, run.pressure, from, to, {
      settleTolerance: o.settleTolerance,
      timeConstant: o.timeConstant,
      compressibility: o.compressibility,
      meltVolume: o.meltVolume,
      flowRate: area !== undefined ? seg.level * area : undefined,
    });
    const sums = new WindowSums(run.time, run.pressure, from, to);
    const limits: WindowLimits = { ...o, timeConstant: transient.timeConstant };
    const detected = steadyWindow(sums, run.time, from, to, transient.exclusion, limits);
    const override = o.windows.find((w) => w.run === runNumber && w.step === k + 1);
    let chosen: WindowChoice = detected;
    if (override) {
      const set = windowAt(sums, run.time, from, to, override.start, override.end, limits);
      if (!set) {
        throw new RheoError("value", "windows", `${label}, step ${k + 1}: the window ${override.start}–${override.end} s holds fewer than 3 samples of the step (${run.time[from]}–${run.time[to]} s)`);
      }
      chosen = set;
    }
    const a = chosen.startIndex;
    const b = chosen.endIndex;
    let pistonSpeed: number;
    if (run.pistonSpeed) {
      let s = 0;
      for (let i = a; i <= b; i++) s += speed[i] as number;
      pistonSpeed = s / (b - a + 1);
    } else pistonSpeed = windowSpeedFromPosition(run.time, run.pistonPosition as ArrayLike<number>, a, b, sign);
    const oscFrom = Math.min(a, indexAtOrAfter(run.time, from, to, (run.time[from] as number) + transient.exclusion));
    const region = sums.fit(oscFrom, to);
    const oscillation = detectOscillation(run.time, run.pressure, oscFrom, to, { mean: region.mean, slope: region.slope }, o.oscillationLimit, o.oscillationMinCycles);
    let frictionPressure = 0;
    let frictionOutside = false;
    if (friction && area !== undefined) {
      const f = friction.at(pistonSpeed);
      frictionPressure = f.force / area;
      frictionOutside = f.outside;
    }
    const step: TraceStep = {
      run: runNumber,
      step: k + 1,
      role: "point",
      pistonSpeed,
      stepStart: run.time[from] as number,
      stepEnd: run.time[to] as number,
      start: chosen.fit.start,
      end: chosen.fit.end,
      startIndex: a,
      endIndex: b,
      samples: chosen.fit.samples,
      pressure: chosen.fit.mean - frictionPressure,
      pressureStd: chosen.fit.sd,
      friction: frictionPressure,
      frictionOutside,
      drift: chosen.drift,
      driftAllowed: chosen.driftAllowed,
      noise: chosen.fit.noise,
      timeConstant: transient.timeConstant,
      timeConstantSource: transient.source,
      transient: transient.exclusion,
      steady: chosen.steady,
      reason: chosen.reason,
      oscillation,
      window: override ? "set" : "detected",
      used: false,
    };
    if (override) step.detected = { start: detected.fit.start, end: detected.fit.end };
    if (run.lines) step.line = run.lines[a] as number;
    return step;
  });
  const repeat = repeatStepIndex(steps, o.speedTolerance);
  let check: ThermalCheck | null = null;
  if (repeat >= 0) {
    const first = steps[0] as TraceStep;
    const last = steps[repeat] as TraceStep;
    last.role = "check";
    check = thermalCheck(0, repeat, first, last, o.thermalCheckLimit);
  }
  for (const s of steps) {
    const name = `${label}, step ${s.step} at ${mmPerMin(s.pistonSpeed)}`;
    if (s.window === "set" && s.detected) {
      warnings.push(warning("STEP_WINDOW_SET", `${name}: window set by hand to ${s.start.toPrecision(4)}–${s.end.toPrecision(4)} s (detected ${s.detected.start.toPrecision(4)}–${s.detected.end.toPrecision(4)} s).`));
    }
    if (s.oscillation) {
      const osc = s.oscillation;
      warnings.push(warning("FLOW_INSTABILITY", `${name}: the pressure oscillates (stick–slip) by ${(100 * osc.relativeAmplitude).toPrecision(2)} % peak to peak with a period of ${osc.period.toPrecision(3)} s over ${osc.cycles} cycles; the plateau is a time average.`));
    }
    if (s.frictionOutside) {
      warnings.push(warning("BLANK_SPEED_OUTSIDE", `${name}: outside the blank run's speed range; the friction of its nearest speed (${bar(s.friction)}) was subtracted.`));
    }
    if (s.role === "check") continue;
    const usable = s.steady || o.unsteady === "keep";
    if (!s.steady) {
      const action = o.unsteady === "keep" ? "kept in the flow curve, flagged (setting unsteady: keep)" : "left out of the flow curve (setting unsteady: keep would keep it, flagged)";
      warnings.push(warning("STEP_NOT_STEADY", `${name}: not steady (${s.reason}); ${action}.`));
    }
    if (usable && !(s.pressure > 0)) {
      warnings.push(warning("STEP_PRESSURE_NONPOSITIVE", `${name}: the plateau less the barrel friction is ${bar(s.pressure)}; left out of the flow curve.`));
      continue;
    }
    s.used = usable;
  }
  if (check) {
    const c = check;
    const text = `${label}: the first speed (${mmPerMin(c.pistonSpeed)}) repeated at step ${c.repeatStep} reads ${bar(c.repeatPressure)} against ${bar(c.firstPressure)} at step ${c.firstStep}, a change of ${(100 * c.change).toFixed(1)} %`;
    if (!c.withinLimit) warnings.push(warning("THERMAL_CHECK_CHANGE", `${text} (limit ${(100 * o.thermalCheckLimit).toFixed(1)} %): the melt may have changed during the run.${c.bothSteady ? "" : " One of the two steps is not steady."}`));
  }
  const out: RunSteps = { run: runNumber, label: runLabel(run), temperature: run.temperature ?? null, steps, thermalCheck: check, speed, warnings };
  if (run.die) out.die = run.die;
  if (run.barrelDiameter !== undefined) out.barrelDiameter = run.barrelDiameter;
  if (run.source !== undefined) out.source = run.source;
  return out;
}
