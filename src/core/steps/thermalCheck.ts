/**
 * Thermal-stability check of a die run: when the last step repeats the first step's speed, the
 * change of its plateau pressure shows how much the melt changed (degradation, cross-linking,
 * loss of volatiles) during the run. The repeat is a check, not a new point of the flow curve.
 * A change beyond thermalCheckLimit (3 % by default; common practice, no source) is a warning.
 */

/** The first and the repeated step of a die run. SI units. */
export interface ThermalCheck {
  /** step numbers (1-based) of the first step and its repeat */
  firstStep: number;
  repeatStep: number;
  /** piston speed of the first step, m/s */
  pistonSpeed: number;
  /** plateau pressures, Pa */
  firstPressure: number;
  repeatPressure: number;
  /** (repeat − first)/first */
  change: number;
  /** |change| ≤ limit */
  withinLimit: boolean;
  /** false when either plateau is not steady (the change is then uncertain) */
  bothSteady: boolean;
}

/** A step as the check sees it. */
export interface CheckedStep {
  pistonSpeed: number;
  pressure: number;
  steady: boolean;
}

/**
 * Index of the step that repeats the first speed: the last of three or more steps when its speed
 * lies within `tolerance` (relative) of the first's and the step before it does not; else -1.
 * @example repeatStepIndex([{pistonSpeed: 1}, {pistonSpeed: 2}, {pistonSpeed: 1.01}], 0.05) // 2
 */
export function repeatStepIndex(steps: readonly { pistonSpeed: number }[], tolerance: number): number {
  if (steps.length < 3) return -1;
  const first = (steps[0] as { pistonSpeed: number }).pistonSpeed;
  const last = steps.length - 1;
  const same = (v: number) => Math.abs(v - first) <= tolerance * first;
  return same((steps[last] as { pistonSpeed: number }).pistonSpeed) && !same((steps[last - 1] as { pistonSpeed: number }).pistonSpeed) ? last : -1;
}

/**
 * Compares the repeat with the first step.
 * @param limit largest accepted |change| (fraction)
 * @example thermalCheck(0, 4, {pistonSpeed: 1e-5, pressure: 1e7, steady: true}, {pistonSpeed: 1e-5, pressure: 0.98e7, steady: true}, 0.03).change // -0.02
 */
export function thermalCheck(firstIndex: number, repeatIndex: number, first: CheckedStep, repeat: CheckedStep, limit: number): ThermalCheck {
  const change = (repeat.pressure - first.pressure) / first.pressure;
  return {
    firstStep: firstIndex + 1,
    repeatStep: repeatIndex + 1,
    pistonSpeed: first.pistonSpeed,
    firstPressure: first.pressure,
    repeatPressure: repeat.pressure,
    change,
    withinLimit: Math.abs(change) <= limit,
    bothSteady: first.steady && repeat.steady,
  };
}
