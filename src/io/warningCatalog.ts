/**
 * The words of the warning codes of src/core/warningCodes.ts: a short plain-language title (the
 * heading the pane, the workbook and the reports show) and one line on when it is raised and what
 * to do (the generated table in docs/methods.md). The keys are exactly the registry's
 * (test/warningCodes.test.ts).
 */
import { WARNING_CODES, isWarningCode, type WarningCode, type WarningSeverity } from "../core/warningCodes";

/** Title and description of one code. */
export interface WarningText {
  title: string;
  description: string;
}

export const WARNING_CATALOG: Readonly<Record<WarningCode, WarningText>> = Object.freeze({
  COLUMN_IGNORED: { title: "Column not used", description: "A column whose header is not a known quantity was left out of the calculation." },
  ROW_SKIPPED_BLANK: { title: "Blank row skipped", description: "A data row with blank cells in required columns was skipped; the row number is given." },
  ROWS_BLANK: { title: "Blank rows skipped", description: "Rows (lines) below the header with no value in any column used were skipped; they are listed and counted." },
  PREAMBLE_SKIPPED: { title: "Title rows skipped", description: "Rows above the header row (a title, notes) were skipped; the header is the first row naming two known quantities." },
  ROWS_COMMENT: { title: "Comment lines skipped", description: "Lines starting with # below the header were skipped as comments; they are listed and counted." },
  INPUT_ENCODING: { title: "File read in a legacy encoding", description: "The file is not UTF-8 and was read in the encoding named (Windows-1252 or UTF-16); check that units and labels read right." },
  IMPLAUSIBLE_VALUE: { title: "Value outside the usual range", description: "A value lies outside the usual range of its quantity in capillary rheometry (docs/input.md): often a unit slip, and the unit that would fit is suggested." },
  TEMPERATURE_SPREAD: { title: "Temperature readings spread", description: "The readings of one temperature set-point spread more than the tolerance; they were kept together at their mean, and the die whose series drifted is named." },
  TEMPERATURE_GROUPS_CLOSE: { title: "Set-points close together", description: "Two temperature groups lie closer than set-points usually do; if they are one set-point, give a larger temperature tolerance." },
  TEMPERATURE_IGNORED: { title: "Temperature not used by the model", description: "An isothermal model was fitted; the temperature column played no part in it." },
  STEP_NOT_STEADY: { title: "Step not steady", description: "A step of the pressure recording never settled (drifting, or cut short); it is left out or kept flagged as the unsteady setting says." },
  STEP_WINDOW_SET: { title: "Plateau window set by hand", description: "The window a step's plateau is read from was moved by hand; the detected window is given beside it." },
  STEP_PRESSURE_NONPOSITIVE: { title: "Step pressure not positive", description: "A step's plateau less the barrel friction is zero or negative; the step is left out: check the blank run." },
  BLANK_SPEED_OUTSIDE: { title: "Speed outside the blank run", description: "A step ran faster or slower than any step of the blank run; the friction of the nearest blank speed was subtracted." },
  THERMAL_CHECK_CHANGE: { title: "Repeated first speed reads differently", description: "The first speed repeated at the end of a die run changed its pressure beyond the limit: the melt may have degraded or cross-linked." },
  FLOW_INSTABILITY: { title: "Flow instability", description: "The pressure oscillates (stick–slip) or jumps: the flow is not steady there and its points are time averages." },
  BAGLEY_FEW_DIES: { title: "Few dies for the Bagley correction", description: "Fewer than three die lengths: a straight Bagley line cannot be checked for curvature." },
  BAGLEY_LOW_R2: { title: "Bagley lines not straight", description: "R² of a Bagley line below the limit: check the data, or pressure dependence of viscosity." },
  BAGLEY_NEGATIVE_END_CORRECTION: { title: "Negative end correction", description: "A Bagley intercept below zero is unphysical: check die lengths, pressures and the zero of the transducer." },
  BAGLEY_END_CORRECTION_SCATTER: { title: "End correction scatters", description: "The end correction e varies more between neighbouring rates than a smooth trend allows." },
  BAGLEY_RATES_INTERPOLATED: { title: "Rates interpolated between dies", description: "Dies were not run at identical rates; pressures were interpolated (log–log) to common rates." },
  BAGLEY_RATE_DROPPED: { title: "Rates reached by one die only", description: "Rates that fewer than two dies reach have no Bagley line and were left out (listed)." },
  BAGLEY_NONPOSITIVE_SLOPE: { title: "Bagley line does not rise", description: "Pressure does not rise with L/R at some rates: no wall stress can be derived there." },
  END_CORRECTION_NONE: { title: "No end correction", description: "The wall stress of the longest die includes its entrance loss and is overestimated." },
  ORIFICE_DIE_NOT_ON_BAGLEY: { title: "Orifice die kept off the Bagley line", description: "A die with L/D below the orifice limit is used only for the entrance pressure." },
  ORIFICE_RATE_OUTSIDE: { title: "Orifice die does not cover the rate", description: "The orifice die was not run over the whole rate range of the long die; those rates have no orifice correction." },
  ORIFICE_PRESSURE_TOO_HIGH: { title: "Orifice pressure at or above the long die's", description: "The orifice pressure is not below the long die's pressure: the corrected wall stress would not be positive." },
  ORIFICE_BAGLEY_DISAGREE: { title: "Orifice and Bagley disagree", description: "The two entrance-pressure estimates differ by more than the limit." },
  RABINOWITSCH_FEW_POINTS: { title: "Few points for the Rabinowitsch slope", description: "Too few flow-curve points for the chosen smoother; a simpler curve was used." },
  RABINOWITSCH_NONPOSITIVE_SLOPE: { title: "No true wall rate at some points", description: "The smoothed slope n′ is not positive there; no true wall rate or viscosity is given." },
  RABINOWITSCH_NPRIME_RANGE: { title: "Unusual flow index n′", description: "n′ lies outside the range usual for polymer melts and suspensions." },
  REPRESENTATIVE_RATE_DISAGREES: { title: "Representative-rate check disagrees", description: "The Schümmer representative-rate viscosity differs from the Rabinowitsch result by more than the limit." },
  SLIT_NARROW: { title: "Narrow slit", description: "W/H is small: the side walls slow the flow, so the parallel-plate formulas understate the wall rate and overstate the viscosity; the edge correction applies the channel's shape factor." },
  SLIT_EDGE_CORRECTED: { title: "Slit edge correction applied", description: "The true wall rate was divided, and the viscosity multiplied, by the slit's Newtonian shape factor (exact for a Newtonian liquid)." },
  SLIP_ONE_DIAMETER: { title: "Slip needs several bores", description: "The Mooney analysis needs two or more die bores at one temperature." },
  SLIP_FEW_DIAMETERS: { title: "Few bores for slip", description: "Two bores give a slip line without a check of its straightness." },
  SLIP_STRESS_OVERLAP_NARROW: { title: "Bores overlap little", description: "The die bores share only a narrow range of wall stress." },
  SLIP_NEGATIVE_VELOCITY: { title: "Negative slip velocity", description: "A negative slip velocity is unphysical: the bores' data disagree beyond slip; those stresses are left uncorrected (v_s = 0)." },
  SLIP_LOW_R2: { title: "Mooney lines not straight", description: "With three or more bores, a Mooney line's R² is below the limit: the slip velocity there is uncertain." },
  SLIP_CORRECTED_RATE_NONPOSITIVE: { title: "Slip correction removes all flow", description: "The slip-corrected apparent rate is not positive at some stresses." },
  COGSWELL_ROUND_ONLY: { title: "Cogswell for round dies only", description: "The extensional estimate is given for round dies only." },
  COGSWELL_POINT_SKIPPED: { title: "Extensional point skipped", description: "A point without entrance pressure or true wall rate has no extensional estimate." },
  COGSWELL_LOW_TROUTON: { title: "Trouton ratio below 3", description: "An extensional viscosity below three times the shear viscosity is not expected; check the entrance pressure." },
  HEATING_ADIABATIC_RISE: { title: "Viscous heating", description: "The adiabatic temperature rise exceeds the limit: the viscosity at high rates is underestimated." },
  HEATING_NAHME: { title: "Viscosity coupled to heating", description: "The Nahme–Griffith number exceeds the limit: viscous heating changes the viscosity along the die." },
  PRESSURE_DEPENDENCE: { title: "Viscosity rises with pressure", description: "The Bagley lines bend upwards: the straight-line end correction is biased at those rates." },
  PRESSURE_CURVATURE_DOWNWARD: { title: "Bagley lines bend downwards", description: "Downward curvature is not pressure dependence: look for slip, heating or a die-length error." },
  PRESSURE_FEW_DIES: { title: "Pressure dependence needs three dies", description: "The curvature of a Bagley line needs three or more die lengths." },
  PRESSURE_FIT_NOT_CONVERGED: { title: "Pressure-dependence fit failed", description: "The curved Bagley fit did not converge at some rates." },
  PRESSURE_EXACT_FIT: { title: "Curvature fitted exactly by three dies", description: "Three dies fit the three parameters of the curved Bagley line exactly: the pressure coefficient has no standard error; add a fourth die length." },
  TRANSDUCER_LOW_READING: { title: "Low transducer reading", description: "Readings below the usable fraction of the transducer's full scale have a large relative uncertainty." },
  TRANSDUCER_OVER_RANGE: { title: "Transducer over range", description: "A reading exceeds the transducer's full scale." },
  UNCERTAINTY_NO_SCATTER: { title: "No random part in the uncertainty", description: "No plateau standard deviations and no Bagley line of three or more dies: the ± values cover the systematic inputs only." },
  UNCERTAINTY_TEMPERATURE_OMITTED: { title: "Temperature not in the uncertainty", description: "No temperature coefficient b was given or could be fitted, so the melt-temperature tolerance was not propagated." },
  UNCERTAINTY_PARTIAL: { title: "Uncertainty budget incomplete", description: "A repetition of the reduction with an input moved by its uncertainty failed; that contribution is missing." },
  MFR_APPARENT_POINT: { title: "Melt-flow-rate point is apparent", description: "The MFR point is uncorrected (no Bagley, no Rabinowitsch) and is shown for comparison only." },
  MFR_UNUSUAL_LOAD: { title: "Unusual MFR load", description: "The load is not one of the standard loads." },
  NOT_CONVERGED: { title: "Fit did not converge", description: "The fit stopped before converging; its parameters are not reliable." },
  SINGULAR_COVARIANCE: { title: "Parameters not separable", description: "The data cannot separate the model's parameters (singular covariance); no standard errors." },
  PARAMETER_AT_BOUND: { title: "Parameter at its bound", description: "A parameter ended at a bound of its allowed range; the data do not determine it." },
  POORLY_DETERMINED: { title: "Parameter poorly determined", description: "A parameter's relative standard error is above the limit (25 % of the value): the data do not determine it." },
  FIT_FAILED: { title: "Model not fitted", description: "A model could not be fitted to a group; the reason is given." },
  FIT_SKIPPED: { title: "No model fitted", description: "A group had too few corrected points for a model fit." },
  REFERENCE_OUTSIDE_DATA: { title: "Reference temperature outside the data", description: "The master curve is extrapolated to a reference temperature outside the measured range." },
  WLF_C2_UNIVERSAL: { title: "WLF C2 from the universal value", description: "The data could not determine C2: it was held at the universal 51.6 K converted to the reference temperature with the given glass transition temperature." },
  WLF_C2_POORLY_DETERMINED: { title: "WLF C2 poorly determined", description: "The fitted C2 is not positive or its standard error exceeds it; give the glass transition temperature to hold C2 at the converted universal value." },
  ZERO_SHEAR_NOT_DETERMINED: { title: "Zero-shear viscosity not determined", description: "The data never reach the zero-shear plateau: η0 is an extrapolation; only the lower bound given (the highest measured viscosity) is supported. Add lower rates, rotational data, or fit across temperatures." },
  ONSET_NOT_DETERMINED: { title: "Time constant not determined", description: "The onset of shear thinning (1/λ) lies outside the measured rates: λ is an extrapolation; only the bound given is supported." },
  NO_WELL_DETERMINED_MODEL: { title: "No well-determined model", description: "No fitted model has every parameter determined by the data; the simplest adequate model is recommended with its undetermined parameters named." },
  VERDICT_FAMILIES_DIFFER: { title: "Groups recommend different model families", description: "The recommended models of the groups belong to different families; each group's reason is given (often a different data window, not a different material)." },
  FIT_EXACT: { title: "Fit passes through every point", description: "Zero residuals: AIC is −∞ and the parameters have no uncertainty estimate (too few points for the model, or exact data)." },
  R2_UNDEFINED: { title: "R² undefined", description: "Every viscosity is the same, so R² has nothing to explain; it is left empty." },
  EXTRAPOLATED: { title: "Fitted curve extrapolated", description: "A fitted curve was evaluated outside the shear-rate range of the data it was fitted to." },
  OUTPUT_VALUE_UNDEFINED: { title: "Value left empty", description: "A result was not a finite number; it is written as an empty cell (null in JSON) instead of NaN or infinity." },
  MASTER_C2_HELD: { title: "WLF C2 held", description: "With fewer than three temperatures the fit across temperatures holds the WLF constant C2 at 51.6 K and fits C1 only." },
  MASTER_PRESSURE_TERM_HELD: { title: "Cross-WLF pressure term held", description: "The Cross-WLF pressure coefficient D3 is held at 0: capillary data at one pressure level per rate do not determine it." },
  COX_MERZ_APPLIED: { title: "Cox–Merz rule applied", description: "Complex viscosity at angular frequency ω was taken as steady shear viscosity at γ̇ = ω (Cox & Merz 1958)." },
  ROTATIONAL_OVERLAP_MISMATCH: { title: "Rotational and capillary curves disagree", description: "In their common rate range the rotational viscosity differs from the capillary one by more than the tolerance: check slip, the Cox–Merz rule, temperature, or degradation." },
  ROTATIONAL_NO_OVERLAP: { title: "Rotational and capillary curves do not overlap", description: "The two curves share no shear-rate range, so their agreement cannot be checked; the joined curve assumes they agree." },
  PLAN_PRESSURE_OVER_FULL_SCALE: { title: "Predicted pressure over full scale", description: "A planned step's predicted pressure exceeds the transducer's full scale." },
  PLAN_PRESSURE_NEAR_FULL_SCALE: { title: "Predicted pressure near full scale", description: "A planned step's predicted pressure is close to the transducer's full scale." },
  PLAN_PRESSURE_LOW: { title: "Predicted pressure low", description: "A planned step's predicted pressure is a small fraction of full scale." },
  PLAN_NO_TRANSDUCER_COVERS: { title: "No transducer covers the step", description: "No transducer of the list covers a planned step's predicted pressure." },
  PLAN_PRIOR_NOT_SHIFTED: { title: "Prior at another temperature", description: "The prior viscosity belongs to another temperature than the test's and no shift law was given: it was used unshifted." },
  PLAN_BARREL_CAPACITY_EXCEEDED: { title: "Barrel too small for the plan", description: "The planned ladder needs more melt than one barrel filling holds." },
  LOT_NOTHING_COMPARED: { title: "Lot not compared", description: "No lot point lies in the reference's rate range." },
  LOT_POINTS_NOT_COMPARED: { title: "Lot points outside the reference", description: "Lot points outside the reference's rate range were not compared." },
  RESULT_NOT_FINITE: { title: "Result not a number", description: "A result came out as NaN or infinite (e.g. a standard error of a singular fit); its cell is left empty and the table's notes say where." },
});

/** Severity, title and description of `code` (an unregistered code is titled by itself). */
export function describeWarning(code: string): WarningText & { severity: WarningSeverity } {
  if (!isWarningCode(code)) return { severity: "caution", title: code, description: "" };
  return { severity: WARNING_CODES[code], ...WARNING_CATALOG[code] };
}
