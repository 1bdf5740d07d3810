/**
 * Worksheet functions of the RHEO namespace for model fitting and temperature shifting. Thin
 * adapters over src/core/fit, src/core/models and src/core/temperature (the shaping is in
 * ./fitTables.ts). custom-functions-metadata-plugin reads the @customfunction blocks of this file
 * (it is listed in FUNCTION_FILES in webpack.config.js) and appends the associate calls.
 *
 * Spills hold SI values (Pa·s, s, Pa, K, J/mol) with a unit column. A fit that does not converge
 * still spills, with converged FALSE and its stop reason; errors become cell errors, never throws.
 */
import { guard } from "./adapter";
import { compareTable, fitTable, masterFitTable, modelColumn, shiftColumn, shiftFitTable } from "./fitTables";

/**
 * Fits a viscosity model; spills parameter, value, std error, 95 % CI low/high and SI unit, then rows R², RMSE, AIC, points, converged, stop reason and warnings.
 * @customfunction FIT
 * @example =RHEO.FIT(F2:F20, G2:G20, "carreau-yasuda", "etaInf=0") spills eta0, etaInf (fixed), lambda, n, a with uncertainties.
 * @param shearRate True wall shear rate γ̇ in 1/s: a column or row; blank rows are skipped.
 * @param viscosity Viscosity η at each rate, as long as shearRate (default unit Pa.s).
 * @param model Model id: newtonian, power-law, cross, carreau, carreau-yasuda, sisko, ellis, bingham, herschel-bulkley, casson, cross-wlf.
 * @param fixed Parameters held, in SI: text "etaInf=0, a=2" or a two-column range of names and values (default none).
 * @param residuals "log" (relative errors, ln η) or "linear" (η in Pa.s) (default log).
 * @param weights Weight ≥ 0 per point, as long as shearRate; 0 leaves a point out (default all 1).
 * @param temperature Temperature per point, needed by cross-wlf (default unit C).
 * @param viscosityUnit Unit of viscosity, e.g. "Pa.s", "mPa.s", "P" (default Pa.s).
 * @param temperatureUnit Unit of temperature, e.g. "C", "K", "F" (default C).
 * @param header TRUE to start with a header row (default FALSE).
 * @returns Six columns: name, value (SI), std error, CI low, CI high, unit.
 */
export function fit(
  shearRate: unknown[][],
  viscosity: unknown[][],
  model: string,
  fixed?: unknown[][],
  residuals?: string,
  weights?: unknown[][],
  temperature?: unknown[][],
  viscosityUnit?: string,
  temperatureUnit?: string,
  header?: boolean,
): unknown[][] {
  return guard("fit", () => fitTable({ shearRate, viscosity, model, fixed, residuals, weights, temperature, viscosityUnit, temperatureUnit, header }));
}

/**
 * Viscosity of a model at given shear rates, from its parameters (SI), e.g. the RHEO.FIT spill.
 * @customfunction MODEL
 * @example =RHEO.MODEL("carreau", J2:K10, A2:A50) evaluates the fit spilled in J2 at the rates in A2:A50.
 * @param model Model id as in RHEO.FIT, e.g. "carreau-yasuda"; a wrong id gives #VALUE! listing the accepted ones.
 * @param parameters Parameter names and SI values: a two-column range (a RHEO.FIT spill works) or text "K=1e4, n=0.4".
 * @param shearRate Shear rates γ̇ in 1/s: a cell, column or row; the result is aligned with it.
 * @param temperature Temperature, cross-wlf only: one cell or a range as long as shearRate (default unit C).
 * @param outputUnit Unit of the result, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @param temperatureUnit Unit of temperature, e.g. "C", "K" (default C).
 * @returns Viscosity per row, aligned with shearRate.
 */
export function modelViscosity(
  model: string,
  parameters: unknown[][],
  shearRate: unknown[][],
  temperature?: unknown[][],
  outputUnit?: string,
  temperatureUnit?: string,
): unknown[][] {
  return guard("model", () => modelColumn({ model, parameters, shearRate, temperature, outputUnit, temperatureUnit }));
}

/**
 * Fits several models to one flow curve, ranks them by AIC and marks the recommended one: rank, model, AIC, ΔAIC, Akaike weight, R², RMSE, converged, note, well determined, recommended.
 * @customfunction COMPAREFITS
 * @example =RHEO.COMPAREFITS(F2:F20, G2:G20, "cross, carreau, carreau-yasuda", , , , TRUE)
 * @param shearRate True wall shear rate γ̇ in 1/s: a column or row; blank rows are skipped.
 * @param viscosity Viscosity η at each rate, as long as shearRate (default unit Pa.s).
 * @param models Model ids: a range of names or text "cross, carreau" (default: newtonian, power-law, cross, carreau, carreau-yasuda; a paste adds bingham, herschel-bulkley, casson).
 * @param residuals "log" (relative errors, ln η) or "linear" (η in Pa.s) (default log).
 * @param weights Weight ≥ 0 per point, as long as shearRate; 0 leaves a point out (default all 1).
 * @param viscosityUnit Unit of viscosity, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @param header TRUE to start with a header row (default FALSE).
 * @param material "melt" (η∞ held at 0, no yield stress unless named) or "paste" (default melt).
 * @returns One row per model, best AIC first; the recommended row carries the reason in its note; models that failed last with converged FALSE.
 */
export function compareFits(
  shearRate: unknown[][],
  viscosity: unknown[][],
  models?: unknown[][],
  residuals?: string,
  weights?: unknown[][],
  viscosityUnit?: string,
  header?: boolean,
  material?: string,
): unknown[][] {
  return guard("compareFits", () => compareTable({ shearRate, viscosity, models, residuals, weights, viscosityUnit, header, material }));
}

/**
 * Fits one viscosity model to flow curves at several temperatures at once, with its temperature law (time–temperature superposition); spills the parameters at Tref with "determined", the law's constants, aT per temperature.
 * @customfunction MASTERFIT
 * @example =RHEO.MASTERFIT(A2:A40, F2:F40, G2:G40, "carreau-yasuda", "arrhenius", 210) spills eta0, lambda, n, a at 210 °C and Ea in J/mol.
 * @param temperature Temperature of each point (default unit C); points of equal temperature form one curve.
 * @param shearRate True wall shear rate γ̇ in 1/s, as long as temperature.
 * @param viscosity Viscosity η, as long as temperature (default unit Pa.s).
 * @param model power-law, cross, carreau, carreau-yasuda, or cross-wlf (reported as n, tauStar, D1, D2, D3, A1, A2tilde).
 * @param law "arrhenius" or "wlf" (default arrhenius); blank for cross-wlf, which carries its own law.
 * @param referenceTemperature Tref of the law, one cell (same unit as temperature); for cross-wlf, D2 to hold (blank: fitted).
 * @param fixed Parameters held, in SI: text "a=1, activationEnergy=50000" or a two-column range (default none).
 * @param material "melt" (η∞ held at 0) or "paste" (default melt).
 * @param temperatureUnit Unit of temperature and referenceTemperature, e.g. "C", "K" (default C).
 * @param viscosityUnit Unit of viscosity, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @returns Seven columns: name, value (SI), std error, CI low, CI high, unit, determined; then Tref, R², RMSE, AIC, points, converged, stop reason, well determined, and a "temperature | aT" block.
 */
export function masterFit(
  temperature: unknown[][],
  shearRate: unknown[][],
  viscosity: unknown[][],
  model: string,
  law?: string,
  referenceTemperature?: unknown[][],
  fixed?: unknown[][],
  material?: string,
  temperatureUnit?: string,
  viscosityUnit?: string,
): unknown[][] {
  return guard("masterFit", () => masterFitTable({ temperature, shearRate, viscosity, model, law, referenceTemperature, fixed, material, temperatureUnit, viscosityUnit }));
}

/**
 * Temperature shift factor aT: Arrhenius exp[(Ea/R)(1/T − 1/Tref)] or WLF 10^(−C1(T−Tref)/(C2+T−Tref)).
 * @customfunction SHIFT
 * @example =RHEO.SHIFT(A2:A4, 210, "arrhenius", 55, , , "kJ/mol") gives aT at each temperature.
 * @param temperature Temperatures T: a cell, column or row (default unit C).
 * @param referenceTemperature Reference temperature Tref, one cell (same unit as temperature).
 * @param law "arrhenius" or "wlf".
 * @param activationEnergyOrC1 Arrhenius: activation energy Ea (default unit J/mol). WLF: C1 (dimensionless).
 * @param C2 WLF only: C2 in K (default 51.6 K, the universal value at Tref = Tg).
 * @param temperatureUnit Unit of temperature and referenceTemperature, e.g. "C", "K" (default C).
 * @param energyUnit Arrhenius only: unit of Ea, "J/mol" or "kJ/mol" (default J/mol).
 * @returns aT (dimensionless) per row, aligned with temperature.
 */
export function shift(
  temperature: unknown[][],
  referenceTemperature: unknown[][],
  law: string,
  activationEnergyOrC1: unknown[][],
  C2?: unknown[][],
  temperatureUnit?: string,
  energyUnit?: string,
): unknown[][] {
  return guard("shift", () => shiftColumn({ temperature, referenceTemperature, law, activationEnergyOrC1, C2, temperatureUnit, energyUnit }));
}

/**
 * Fits a temperature shift (Arrhenius Ea, or WLF C1, C2) to flow curves at several temperatures; spills the constants, then aT per temperature.
 * @customfunction SHIFTFIT
 * @example =RHEO.SHIFTFIT(A2:A40, F2:F40, G2:G40, 210) spills Ea in J/mol and aT at each temperature.
 * @param temperature Temperature of each point (default unit C); points of equal temperature form one curve.
 * @param shearRate True wall shear rate γ̇ in 1/s, as long as temperature.
 * @param viscosity Viscosity η, as long as temperature (default unit Pa.s).
 * @param referenceTemperature Reference temperature Tref, one cell (same unit as temperature).
 * @param law "arrhenius" or "wlf" (default arrhenius).
 * @param temperatureUnit Unit of temperature and referenceTemperature, e.g. "C", "K" (default C).
 * @param viscosityUnit Unit of viscosity, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @returns Four columns: name, value (SI), std error, unit; then a "temperature | aT" block.
 */
export function shiftFit(
  temperature: unknown[][],
  shearRate: unknown[][],
  viscosity: unknown[][],
  referenceTemperature: unknown[][],
  law?: string,
  temperatureUnit?: string,
  viscosityUnit?: string,
): unknown[][] {
  return guard("shiftFit", () => shiftFitTable({ temperature, shearRate, viscosity, referenceTemperature, law, temperatureUnit, viscosityUnit }));
}
