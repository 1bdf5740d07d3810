/**
 * Worksheet functions of the RHEO namespace for test planning and lot comparison (QC). Thin
 * adapters: the range reading and shaping are in ./planFunctions.ts, the calculations in
 * src/core/planner.ts and src/core/lotComparison.ts. custom-functions-metadata-plugin reads the
 * @customfunction blocks of this file (listed in FUNCTION_FILES in webpack.config.js) and appends
 * the associate calls.
 */
import { guard } from "./adapter";
import { lotCheckSheet, planSheet } from "./planFunctions";

/**
 * Plans a capillary test: per die a log-spaced speed ladder with predicted pressures, range flags, the suggested transducer, material and time.
 * @customfunction PLAN
 * @example =RHEO.PLAN(A2:B12, D2:G5, I2:J4) spills the speed ladder with predicted pressures per die.
 * @param settings Two columns, name | value: barrelDiameter, usableLength, density, dwellTime, shearRateMin, shearRateMax, points and a prior (priorModel with priorParameters, or mfr with mfrLoad). Numbers in mm, g/cm3, s, 1/s, or text like "15 mm". See README.
 * @param dies Table with a header row: name, type (capillary, orifice, slit), diameter [mm], length [mm], width [mm], height [mm], transducer (optional).
 * @param transducers Table with a header row: name, full_scale [bar], accuracy [%].
 * @param output "steps" (the ladder, default), "summary" (per die and total) or "warnings".
 * @returns A table with a header row; pressures in bar, speeds in mm/min, material in cm3 and g.
 */
export function plan(settings: unknown[][], dies: unknown[][], transducers: unknown[][], output?: string): unknown[][] {
  return guard("plan", () => planSheet({ settings, dies, transducers, output }));
}

/**
 * Compares a lot's flow curve with a reference table or model within a tolerance band: per-rate deviation, PASS/FAIL, verdict and worst point.
 * @customfunction LOTCHECK
 * @example =RHEO.LOTCHECK(A2:A9, B2:B9, D2:D9, E2:E9, 10) spills the deviation per rate, PASS/FAIL and the verdict.
 * @param lotShearRate The lot's shear rates in 1/s: a column or row.
 * @param lotViscosity The lot's viscosities (same length; default unit Pa.s).
 * @param referenceShearRate The reference rates in 1/s (for a model: the rates to compare at; blank for the lot's rates).
 * @param reference The reference viscosities (same length as referenceShearRate), or a model name such as "power-law", "carreau", "cross".
 * @param tolerance Band half-width in percent (default 10).
 * @param parameters With a model name: its parameters in SI units, e.g. "K=12000, n=0.38".
 * @param viscosityUnit Unit of the viscosities in and out, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @param temperature Temperature for cross-wlf (default unit C).
 * @returns Header row, one row per reference rate (rate, reference, band, lot, deviation %, status), then the verdict rows.
 */
export function lotCheck(
  lotShearRate: unknown[][],
  lotViscosity: unknown[][],
  referenceShearRate: unknown[][],
  reference: unknown[][],
  tolerance?: number,
  parameters?: string,
  viscosityUnit?: string,
  temperature?: number,
): unknown[][] {
  return guard("lotCheck", () =>
    lotCheckSheet({ lotShearRate, lotViscosity, referenceShearRate, reference, tolerance, parameters, viscosityUnit, temperature }),
  );
}
