/**
 * The pane's temperature shift: the run's corrected flow curves gathered per temperature and
 * handed to the core's shift fits (src/core/temperature) and master curve. Nothing is fitted
 * here; this only shapes the groups into the core's curves and picks the reference temperature.
 */
import { RheoError } from "../core/errors";
import type { ReductionGroup } from "../core/reduce";
import { fitArrheniusShift, fitWlfShift, masterCurve, type ArrheniusShiftFit, type MasterCurve, type ShiftLaw, type TemperatureCurve, type WlfShiftFit } from "../core/temperature";
import { groupCurvesByTemperature } from "../core/reduceMethods";
import { toSI } from "../core/units";

/** The shift of one run: the fit, the law with its constants, and the master curve. */
export interface ShiftOutput {
  fit: ArrheniusShiftFit | WlfShiftFit;
  law: ShiftLaw;
  master: MasterCurve;
  /** how the reference temperature was chosen, for the method record */
  referenceChoice: "given" | "middle";
}

/** The corrected viscosity points of every group, one curve per temperature (K), sorted by T. */
export function curvesByTemperature(groups: readonly ReductionGroup[]): TemperatureCurve[] {
  return groupCurvesByTemperature(groups).sort((a, b) => a.temperature - b.temperature);
}

/**
 * Fits the chosen shift law to the run's curves at the reference temperature (°C, or null for
 * the middle temperature of the data) and reduces every point onto the master curve.
 * @throws RheoError("missing", "temperatureShift") with fewer than two temperatures; the core's
 *   errors of the fit otherwise.
 */
export function shiftRun(groups: readonly ReductionGroup[], law: "arrhenius" | "wlf", referenceC: number | null): ShiftOutput {
  const curves = curvesByTemperature(groups);
  if (curves.length < 2) {
    throw new RheoError("missing", "temperatureShift", `needs flow curves at two or more temperatures (the data have ${curves.length}); add a temperature column or choose no shift`);
  }
  const temps = curves.map((c) => c.temperature);
  const reference = referenceC === null ? (temps[temps.length >> 1] as number) : toSI(referenceC, "C", "temperature");
  const fit = law === "arrhenius" ? fitArrheniusShift(curves, reference) : fitWlfShift(curves, reference);
  const shift: ShiftLaw = fit.law === "arrhenius" ? { law: "arrhenius", referenceTemperature: reference, activationEnergy: fit.activationEnergy } : { law: "wlf", referenceTemperature: reference, C1: fit.C1, C2: fit.C2 };
  return { fit, law: shift, master: masterCurve(curves, shift), referenceChoice: referenceC === null ? "middle" : "given" };
}
