/* eslint-env node */
/**
 * webpack build of the Excel add-in: the worksheet functions and the task pane, which share one
 * runtime page (taskpane.html; manifest.xml declares SharedRuntime). One webpack runtime
 * (runtime.js) and one chunk of the code both use (core.js: the calculation core and the shared
 * readers) are loaded once; functions.js and taskpane.js hold only what is their own. The pane
 * never imports src/functions.
 *
 * Loading order on taskpane.html (see the page): office.js and functions.js are `defer` scripts,
 * so the worksheet functions run only after office.js; runtime.js, core.js and taskpane.js are
 * `async`, so the pane paints and starts (preview mode on a timeout) whatever office.js does.
 *
 *   npm run build        production build into dist/ (functions.js, taskpane.js, functions.json, ...)
 *   npm run dev-server   https://localhost:3000 with the Office developer certificates
 *
 * custom-functions-metadata-plugin reads the @customfunction JSDoc of FUNCTION_FILES, writes
 * dist/functions.json, and appends `CustomFunctions.associate(id, fn)` for each declared function
 * to that file's source. The list of those files is src/functions/entry.ts (the bundle's entry and
 * the one registry of function files).
 */
const fs = require("fs");
const os = require("os");
const path = require("path");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");
const HtmlWebpackPlugin = require("html-webpack-plugin");

/**
 * Files holding @customfunction declarations (the metadata plugin's input): the files that
 * src/functions/entry.ts, the one registry, imports.
 */
const FUNCTION_FILES = [...fs.readFileSync(path.join(__dirname, "src/functions/entry.ts"), "utf8").matchAll(/^import \* as \w+ from "\.\/(\w+)";$/gm)].map(
  (m) => `./src/functions/${m[1]}.ts`,
);
const DEV_PORT = 3000;
/**
 * Size budget of what the worksheet functions load at every Excel start: runtime.js + core.js +
 * functions.js together. Until the core was shared with the pane, functions.js alone carried it
 * under a 170 KiB budget (163.9 KiB at the split); sharing costs the functions about 8 KB, because
 * webpack cannot merge the modules both bundles use into one scope, and saves the page a second
 * copy of the core (docs/performance.md has the figures before and after). Since then the functions
 * read lab tables as the command line does (one decimal mark per table, row account, plausibility,
 * temperature set-points: +12 KB) and RHEO.PLATEAUS carries the step detection of pressure
 * recordings (src/core/steps: +21 KB), and RHEO.REDUCE the uncertainty budget and the secondary
 * corrections' new quantities (+23 KB), and RHEO.FIT, RHEO.COMPAREFITS and RHEO.MASTERFIT the one
 * verdict, the determinacy report, log-space intervals and the fit across temperatures (+23 KB),
 * and RHEO.REDUCE the reduction of real, imperfect data (repeats compared per die, one rate ladder,
 * flow instabilities, Bagley curvature and scatter checks, the transition smoother's two shapes, row
 * accounting: src/core/speedSteps.ts, rateLadder.ts, flowInstability.ts, bagleyChecks.ts,
 * groupDies.ts, rowAccount.ts: +23 KB). The pane's recording panel and fit settings then moved the
 * step detection's wrappers and the fit tables they share with the functions into core.js, and the
 * per-row lane of the element-wise functions added its own code (+10 KB). Worth doing next: load
 * the rarely used functions' code (recordings, fits across temperatures) on first call with
 * import(), so the cold start carries only the common steps.
 */
const FUNCTIONS_BUDGET_BYTES = 305 * 1024;
/** The scripts the worksheet functions need, in load order (their sum is held to the budget). */
const FUNCTIONS_SCRIPTS = ["runtime.js", "core.js", "functions.js"];

/**
 * HTTPS options for the dev server. office-addin-dev-certs creates and trusts a localhost
 * certificate; on Linux it can create but not install the CA and throws, so fall back to the
 * files it generated under ~/.office-addin-dev-certs (creating them if needed).
 */
async function httpsOptions() {
  const devCerts = require("office-addin-dev-certs");
  try {
    return await devCerts.getHttpsServerOptions();
  } catch (error) {
    const dir = path.join(os.homedir(), ".office-addin-dev-certs");
    const files = { ca: "ca.crt", cert: "localhost.crt", key: "localhost.key" };
    const missing = Object.values(files).some((f) => !fs.existsSync(path.join(dir, f)));
    if (missing) {
      await devCerts.generateCertificates(
        path.join(dir, files.ca),
        path.join(dir, files.cert),
        path.join(dir, files.key),
      );
    }
    console.warn(
      `office-addin-dev-certs could not install its CA (${String(error && error.message ? error.message : error).split("\n")[0]}); ` +
        `serving with the certificates in ${dir}. Trust ${files.ca} in your browser to open the pages.`,
    );
    return Object.fromEntries(Object.entries(files).map(([k, f]) => [k, fs.readFileSync(path.join(dir, f))]));
  }
}

module.exports = async (env, argv) => {
  const production = argv.mode !== "development";
  const serving = Boolean(env && env.WEBPACK_SERVE);
  return {
    mode: production ? "production" : "development",
    // the sources are ES2020 (tsconfig): let webpack write its own wrappers and runtime in ES2020 too (arrow functions, const)
    target: ["web", "es2020"],
    // no eval-based source maps: the pane's Content-Security-Policy forbids eval
    devtool: "source-map",
    entry: {
      // src/functions/entry.ts imports every file of FUNCTION_FILES (the plugin appends their associate calls)
      functions: "./src/functions/entry.ts",
      taskpane: "./src/taskpane/taskpane.ts",
    },
    output: {
      path: path.resolve(__dirname, "dist"),
      filename: "[name].js",
      // dist/ also holds the CLI build (dist/cli.cjs): never wipe the folder.
      clean: false,
    },
    optimization: {
      // one-letter export names where possible: the shared chunk's exports are named at every use
      mangleExports: "size",
      // one webpack runtime and one module registry for both entries: core.js is evaluated once
      runtimeChunk: { name: "runtime" },
      splitChunks: {
        cacheGroups: {
          default: false,
          defaultVendors: false,
          // every module both entries use (the core, the shared readers) goes into core.js
          core: { name: "core", chunks: "initial", minChunks: 2, minSize: 0, enforce: true },
        },
      },
    },
    resolve: { extensions: [".ts", ".js"] },
    module: {
      rules: [
        {
          test: /\.ts$/,
          exclude: /node_modules/,
          use: {
            loader: "ts-loader",
            options: {
              // `npm run typecheck` type-checks; ES modules let webpack drop unused core code.
              transpileOnly: true,
              compilerOptions: { module: "esnext", sourceMap: true },
            },
          },
        },
        // the pane's preview mode bundles the demo CSV as text
        { test: /\.csv$/, type: "asset/source" },
      ],
    },
    plugins: [
      new CustomFunctionsMetadataPlugin({ output: "functions.json", input: FUNCTION_FILES }),
      new HtmlWebpackPlugin({
        filename: "taskpane.html",
        template: "./src/taskpane/taskpane.html",
        // the page writes its own script tags (async for the pane, defer for office.js and the functions)
        inject: false,
      }),
      new HtmlWebpackPlugin({
        filename: "functions.html",
        template: "./src/functions/functions.html",
        chunks: ["functions"],
      }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "assets/*.png", to: "assets/[name][ext]" },
          { from: "manifest.xml", to: "manifest.xml" },
          { from: "src/taskpane/taskpane.css", to: "taskpane.css" },
        ],
      }),
    ],
    performance: {
      hints: production ? "error" : false,
      maxAssetSize: FUNCTIONS_BUDGET_BYTES,
      maxEntrypointSize: FUNCTIONS_BUDGET_BYTES,
      // entrypoint "functions" = runtime.js + core.js + functions.js, held to the budget as a sum
      assetFilter: (name) => FUNCTIONS_SCRIPTS.includes(name),
    },
    devServer: {
      port: DEV_PORT,
      headers: { "Access-Control-Allow-Origin": "*" },
      server: serving ? { type: "https", options: await httpsOptions() } : "https",
      static: { directory: path.resolve(__dirname, "assets"), publicPath: "/assets" },
    },
  };
};

module.exports.FUNCTION_FILES = FUNCTION_FILES;
module.exports.FUNCTIONS_BUDGET_BYTES = FUNCTIONS_BUDGET_BYTES;
module.exports.FUNCTIONS_SCRIPTS = FUNCTIONS_SCRIPTS;
