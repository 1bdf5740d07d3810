/** The command line's version: the package's (package.json), for `rheoledger --version`. */
import pkg from "../../package.json";

export const CLI_VERSION: string = pkg.version;
