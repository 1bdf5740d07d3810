/** Temperature dependence: Arrhenius and WLF shift factors, their fits, master curves. */
export { GAS_CONSTANT, WLF_UNIVERSAL_C1, WLF_UNIVERSAL_C2, arrheniusShiftFactor, wlfShiftFactor, shiftFactor, verticalShiftFactor, verticalFactor, wlfConstantsAtReference, type ShiftLaw, type VerticalShift } from "./shiftFactors";
export { fitArrheniusShift, fitWlfShift, DEFAULT_SHIFT_FIT_OPTIONS, type ShiftFitOptions, type ArrheniusShiftFit, type WlfShiftFit, type ShiftFactorEntry } from "./fitShift";
export { masterCurve, evaluateAtTemperature, type MasterCurve } from "./masterCurve";
export type { TemperatureCurve } from "./curves";
export {
  fitMasterCurve,
  DEFAULT_MASTER_FIT_OPTIONS,
  MASTER_MODELS,
  MASTER_LAWS,
  CROSS_WLF_LITERATURE,
  type MasterFitOptions,
  type MasterFitResult,
  type MasterModel,
  type MasterLaw,
} from "./masterFit";
