/**
 * Worksheet function of step detection in a pressure recording. Thin adapter over
 * src/core/steps, declared here so Excel reads its JSDoc (this file is listed in
 * webpack.config.js FUNCTION_FILES and imported by entry.ts).
 */
import { guard } from "./adapter";
import { plateauTable } from "./stepTables";

/**
 * Steady plateaus of one die run's pressure recording: one row per piston-speed step with its window, mean pressure and standard deviation.
 * @customfunction PLATEAUS
 * @example =RHEO.PLATEAUS(A2:A3001, B2:B3001, C2:C3001) spills the step table of the die run recorded in A:C.
 * @param time Sample times of one die run, increasing: a column or row (default unit s).
 * @param pistonSpeed Piston speed per sample, as long as time (default unit mm/min).
 * @param pressure Pressure per sample, as long as time (default unit bar).
 * @param timeUnit Unit of time and minWindow, e.g. "s", "min" (default s).
 * @param speedUnit Unit of pistonSpeed, e.g. "mm/min", "mm/s" (default mm/min).
 * @param pressureUnit Unit of pressure and of the plateau columns, e.g. "bar", "MPa" (default bar).
 * @param minWindow Shortest steady window, in timeUnit (default 5 s).
 * @param unsteady "exclude" or "keep": whether steps that never become steady count as used (default exclude).
 * @param showWarnings TRUE to list the warnings below the table (default FALSE).
 * @returns Header row, then per step: step, piston speed, window start and end, pressure, pressure sd, steady, used, note.
 */
export function plateaus(
  time: unknown[][],
  pistonSpeed: unknown[][],
  pressure: unknown[][],
  timeUnit?: string,
  speedUnit?: string,
  pressureUnit?: string,
  minWindow?: number,
  unsteady?: string,
  showWarnings?: boolean,
): unknown[][] {
  return guard("plateaus", () => plateauTable({ time, pistonSpeed, pressure, timeUnit, speedUnit, pressureUnit, minWindow, unsteady, showWarnings }));
}
