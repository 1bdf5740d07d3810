/**
 * The one registry of the files that declare worksheet functions, and the entry of the functions
 * bundle. Everything that needs the list reads it here: webpack.config.js (it reads the imports of
 * this file for custom-functions-metadata-plugin, which writes functions.json and appends
 * `CustomFunctions.associate(id, fn)` to each listed file), the HyperFormula test helper and the
 * demo-workbook generator (they import FUNCTION_MODULES). A new file of worksheet functions is one
 * import line and one entry below.
 *
 * Importing the files from one entry lets webpack concatenate them and the adapter layer into one
 * scope (about 8 KB smaller than separate entry modules, measured on the production build).
 */
import * as coreFunctions from "./functions";
import * as fittingFunctions from "./fitting";
import * as methodFunctions from "./methods";
import * as planningFunctions from "./planning";
import * as stepFunctions from "./steps";

/** Each declaring file (name within src/functions) with its exports. */
export const FUNCTION_MODULES = Object.freeze({
  "functions.ts": coreFunctions,
  "fitting.ts": fittingFunctions,
  "methods.ts": methodFunctions,
  "planning.ts": planningFunctions,
  "steps.ts": stepFunctions,
});

/** The exported JavaScript name of any declared worksheet function. */
export type SheetFunctionName = { [F in keyof typeof FUNCTION_MODULES]: keyof (typeof FUNCTION_MODULES)[F] }[keyof typeof FUNCTION_MODULES];
