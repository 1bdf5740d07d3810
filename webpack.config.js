/* eslint-env node */
/**
 * webpack build of the Excel add-in: the worksheet functions and the task pane, which share one
 * runtime page (taskpane.html; manifest.xml declares SharedRuntime). Both bundles are injected
 * into that page as separate scripts; the pane never imports src/functions.
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
/** Size budget of the functions bundle (it loads at every Excel start). */
// 150 KB until RHEO.REDUCE read every reduce setting through the shared reader (src/io/reduceOptions.ts, +14 KB);
// 170 KB until RHEO.REDUCE read lab tables as the command line does (one decimal mark per table, row
// account, plausibility, temperature set-points: +12 KB) and RHEO.PLATEAUS brought the step detection
// of pressure recordings (src/core/steps, +21 KB)
const FUNCTIONS_BUDGET_BYTES = 210 * 1024;

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
        // the shared runtime page: worksheet functions first, then the pane
        chunks: ["functions", "taskpane"],
        chunksSortMode: "manual",
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
      assetFilter: (name) => name === "functions.js",
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
