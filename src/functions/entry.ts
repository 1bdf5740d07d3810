/**
 * Entry of the functions bundle (webpack.config.js): imports every file listed in FUNCTION_FILES
 * once, so that webpack concatenates them and the adapter layer into one scope (about 8 KB smaller
 * than listing the files as separate entry modules, measured on the production build).
 * custom-functions-metadata-plugin appends the associate calls to each listed file; a file listed
 * there but not imported here leaves its functions unassociated (test/metadata.test.ts fails).
 */
import "./functions";
import "./fitting";
import "./methods";
import "./planning";
