/**
 * Adapter of RHEO.PLATEAUS: time, piston-speed and pressure columns of one die run → the step
 * table (src/io/stepTable.ts) in the user's units.
 */
import { RheoError } from "../core/errors";
import { detectTraceSteps } from "../core/steps/traceSteps";
import { DEFAULT_STEP_OPTIONS } from "../core/steps/options";
import { fromSI, toSI } from "../core/units";
import { stepNote } from "../io/stepRecord";
import { DEFAULT_SHEET_UNITS as U, booleanArg, choiceArg, column, readNumber, readRows, unitArg } from "./adapter";
import { appendWarnings } from "./reduceTable";

/** Arguments of RHEO.PLATEAUS as Excel passes them. */
export interface PlateauArgs {
  time: unknown;
  pistonSpeed: unknown;
  pressure: unknown;
  timeUnit?: unknown;
  speedUnit?: unknown;
  pressureUnit?: unknown;
  minWindow?: unknown;
  unsteady?: unknown;
  showWarnings?: unknown;
}

/** The core's names of the samples, as the worksheet arguments call them. */
const SHEET_NAMES: Record<string, string> = { piston_speed: "pistonSpeed", piston_position: "pistonSpeed", minWindowTime: "minWindow" };

/** Header row of the spilled table, `quantity [unit]`. */
export function plateauHeader(timeUnit: string, speedUnit: string, pressureUnit: string): string[] {
  return ["step", `piston_speed [${speedUnit}]`, `start [${timeUnit}]`, `end [${timeUnit}]`, `pressure [${pressureUnit}]`, `pressure_sd [${pressureUnit}]`, "steady", "used", "note"];
}

/** RHEO.PLATEAUS (see steps.ts for the argument descriptions). */
export function plateauTable(a: PlateauArgs): unknown[][] {
  const timeUnit = unitArg(a.timeUnit, "timeUnit", "time", U.time);
  const speedUnit = unitArg(a.speedUnit, "speedUnit", "speed", U.speed);
  const pressureUnit = unitArg(a.pressureUnit, "pressureUnit", "pressure", U.pressure);
  const unsteady = choiceArg(a.unsteady, "unsteady", ["exclude", "keep"] as const, DEFAULT_STEP_OPTIONS.unsteady);
  const showWarnings = booleanArg(a.showWarnings, "showWarnings", false);
  const minWindowTyped = readNumber(Array.isArray(a.minWindow) ? (a.minWindow as unknown[][])[0]?.[0] : a.minWindow, "minWindow", "the value");
  const rows = readRows([
    { argument: "time", range: a.time, quantity: "time", unit: timeUnit },
    { argument: "pistonSpeed", range: a.pistonSpeed, quantity: "speed", unit: speedUnit },
    { argument: "pressure", range: a.pressure, quantity: "pressure", unit: pressureUnit },
  ]);
  if (rows.kept.length < 3) throw new RheoError("missing", "time", `needs at least 3 samples with time, pistonSpeed and pressure, got ${rows.kept.length}`);
  if (minWindowTyped !== null && !(minWindowTyped >= 0)) throw new RheoError("domain", "minWindow", `must be zero or more, got ${minWindowTyped} ${timeUnit}`);
  const options = { unsteady, ...(minWindowTyped !== null ? { minWindowTime: toSI(minWindowTyped, timeUnit, "time", "timeUnit") } : {}) };
  const run = { time: column(rows, "time"), pistonSpeed: column(rows, "pistonSpeed"), pressure: column(rows, "pressure"), lines: rows.kept.map((pos) => pos + 1), rowWord: "row" as const };
  let trace;
  try {
    trace = detectTraceSteps([run], options);
  } catch (e) {
    throw e instanceof RheoError && e.argument in SHEET_NAMES ? e.retarget({ argument: SHEET_NAMES[e.argument] }) : e;
  }
  const table: unknown[][] = [plateauHeader(timeUnit, speedUnit, pressureUnit)];
  for (const s of trace.runs[0]?.steps ?? []) {
    const t = (v: number) => fromSI(v, timeUnit, "time");
    const p = (v: number) => fromSI(v, pressureUnit, "pressure");
    table.push([s.step, fromSI(s.pistonSpeed, speedUnit, "speed"), t(s.start), t(s.end), p(s.pressure), p(s.pressureStd), s.steady, s.used, stepNote(s)]);
  }
  if (showWarnings) appendWarnings(table, trace.warnings);
  return table;
}
