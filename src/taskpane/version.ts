/** The add-in's version (package.json), recorded on every method sheet. */
import pkg from "../../package.json";

export const ADDIN_VERSION: string = pkg.version;
