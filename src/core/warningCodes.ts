/**
 * The one registry of warning codes: every warning any part of Rheoledger raises is listed here
 * with its severity. Its plain-language title (the heading the pane and the reports show) and
 * one-line description (the generated table in docs/methods.md) sit in src/io/warningCatalog.ts,
 * kept out of the worksheet-function bundle; a test keeps the two key sets equal. Codes are stable
 * identifiers: tools match on them; never rename one, add a new one instead.
 *
 * Severity (one scale for every surface):
 *   - "info": what was done to the data, for the record (a column ignored, rates interpolated);
 *   - "caution": a check a rheologist should look at; the result stands but may be limited;
 *   - "serious": the affected results are probably wrong or not determined by the data.
 *
 * test/warningCodes.test.ts fails when src/ raises a code that is not listed here.
 */

/** How much a warning matters (see the module comment). */
export type WarningSeverity = "info" | "caution" | "serious";

/** Every warning code with its severity, by area. */
export const WARNING_CODES = Object.freeze({
  // Reading the input table
  COLUMN_IGNORED: "info",
  ROW_SKIPPED_BLANK: "info",
  ROWS_BLANK: "info",
  PREAMBLE_SKIPPED: "info",
  ROWS_COMMENT: "info",
  INPUT_ENCODING: "info",
  IMPLAUSIBLE_VALUE: "serious",
  TEMPERATURE_SPREAD: "caution",
  TEMPERATURE_GROUPS_CLOSE: "caution",
  TEMPERATURE_IGNORED: "info",

  // Repeated readings and flow instabilities
  DUPLICATE_ROWS: "caution",
  REPEATS_AVERAGED: "info",
  REPEAT_DRIFT: "caution",
  READINGS_NOT_USED: "caution",
  FLOW_INSTABILITY: "caution",
  MELT_FRACTURE_STRESS: "info",
  // Steps of a pressure–time trace
  STEP_NOT_STEADY: "caution",
  STEP_WINDOW_SET: "info",
  STEP_PRESSURE_NONPOSITIVE: "serious",
  BLANK_SPEED_OUTSIDE: "caution",
  THERMAL_CHECK_CHANGE: "caution",

  // End correction
  BAGLEY_FEW_DIES: "caution",
  BAGLEY_LOW_R2: "caution",
  BAGLEY_NEGATIVE_END_CORRECTION: "serious",
  BAGLEY_END_CORRECTION_SCATTER: "caution",
  BAGLEY_CURVED: "caution",
  BAGLEY_CHECKS_LIMITED: "info",
  BAGLEY_LINE_PARTIAL: "info",
  BAGLEY_RATES_INTERPOLATED: "info",
  BAGLEY_RATE_DROPPED: "caution",
  BAGLEY_NONPOSITIVE_SLOPE: "serious",
  END_CORRECTION_NONE: "caution",
  ORIFICE_DIE_NOT_ON_BAGLEY: "info",
  ORIFICE_RATE_OUTSIDE: "caution",
  ORIFICE_PRESSURE_TOO_HIGH: "serious",
  ORIFICE_BAGLEY_DISAGREE: "caution",

  // Rabinowitsch correction
  RABINOWITSCH_FEW_POINTS: "caution",
  RABINOWITSCH_NONPOSITIVE_SLOPE: "serious",
  RABINOWITSCH_NPRIME_RANGE: "caution",

  // Optional checks
  REPRESENTATIVE_RATE_DISAGREES: "caution",
  SLIT_NARROW: "caution",
  SLIT_EDGE_CORRECTED: "info",
  SLIP_ONE_DIAMETER: "caution",
  SLIP_FEW_DIAMETERS: "caution",
  SLIP_STRESS_OVERLAP_NARROW: "caution",
  SLIP_NEGATIVE_VELOCITY: "serious",
  SLIP_LOW_R2: "caution",
  SLIP_CORRECTED_RATE_NONPOSITIVE: "serious",
  COGSWELL_ROUND_ONLY: "info",
  COGSWELL_POINT_SKIPPED: "info",
  COGSWELL_LOW_TROUTON: "caution",
  HEATING_ADIABATIC_RISE: "caution",
  HEATING_NAHME: "caution",
  PRESSURE_DEPENDENCE: "caution",
  PRESSURE_CURVATURE_DOWNWARD: "caution",
  PRESSURE_FEW_DIES: "info",
  PRESSURE_FIT_NOT_CONVERGED: "caution",
  PRESSURE_EXACT_FIT: "caution",
  TRANSDUCER_LOW_READING: "caution",
  TRANSDUCER_OVER_RANGE: "serious",
  UNCERTAINTY_NO_SCATTER: "caution",
  UNCERTAINTY_TEMPERATURE_OMITTED: "info",
  UNCERTAINTY_PARTIAL: "caution",
  MFR_APPARENT_POINT: "info",
  MFR_UNUSUAL_LOAD: "caution",

  // Model fits and temperature shift
  NOT_CONVERGED: "serious",
  SINGULAR_COVARIANCE: "serious",
  PARAMETER_AT_BOUND: "caution",
  POORLY_DETERMINED: "caution",
  FIT_FAILED: "caution",
  FIT_SKIPPED: "info",
  REFERENCE_OUTSIDE_DATA: "caution",
  WLF_C2_UNIVERSAL: "info",
  WLF_C2_POORLY_DETERMINED: "caution",
  ZERO_SHEAR_NOT_DETERMINED: "caution",
  ONSET_NOT_DETERMINED: "caution",
  NO_WELL_DETERMINED_MODEL: "caution",
  VERDICT_FAMILIES_DIFFER: "caution",
  FIT_EXACT: "info",
  R2_UNDEFINED: "info",
  EXTRAPOLATED: "caution",
  OUTPUT_VALUE_UNDEFINED: "caution",
  MASTER_C2_HELD: "info",
  MASTER_PRESSURE_TERM_HELD: "info",

  // Rotational data joined to the capillary curve
  COX_MERZ_APPLIED: "info",
  ROTATIONAL_OVERLAP_MISMATCH: "caution",
  ROTATIONAL_NO_OVERLAP: "caution",

  // Planner and lot check
  PLAN_PRESSURE_OVER_FULL_SCALE: "serious",
  PLAN_PRESSURE_NEAR_FULL_SCALE: "caution",
  PLAN_PRESSURE_LOW: "caution",
  PLAN_NO_TRANSDUCER_COVERS: "serious",
  PLAN_BARREL_CAPACITY_EXCEEDED: "serious",
  PLAN_PRIOR_NOT_SHIFTED: "caution",
  LOT_NOTHING_COMPARED: "serious",
  LOT_POINTS_NOT_COMPARED: "info",

  // Written results (workbook, report)
  RESULT_NOT_FINITE: "caution",
} satisfies Record<string, WarningSeverity>);

/** A registered warning code. */
export type WarningCode = keyof typeof WARNING_CODES;

/** True when `code` is registered. */
export function isWarningCode(code: string): code is WarningCode {
  return Object.prototype.hasOwnProperty.call(WARNING_CODES, code);
}

/** The severity of `code`; an unregistered code reads as a "caution". */
export function warningSeverity(code: string): WarningSeverity {
  return isWarningCode(code) ? WARNING_CODES[code] : "caution";
}

/** Severities from the most to the least important (for sorting and grouping). */
export const SEVERITY_ORDER: readonly WarningSeverity[] = ["serious", "caution", "info"];
