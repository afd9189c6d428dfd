/**
 * Builds the add-in into dist/: taskpane.html (the one shared-runtime page), functions.js,
 * taskpane.js, taskpane.css, functions.json (custom functions metadata from the JSDoc of
 * src/functions/functions.ts), manifest.xml and assets/icon-*.png.
 *
 * The production build is offline and touches no certificates. Only `webpack serve` asks
 * office-addin-dev-certs for the localhost certificate that Office requires for sideloading.
 *
 * Office.js is not bundled: the page loads it from the Office script tag in taskpane.html,
 * as the platform requires.
 */
"use strict";
const path = require("path");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");

/** Names the manifest refers to; test/manifest.test.ts checks the manifest against them. */
const outputNames = Object.freeze({
  devPort: 3000,
  devUrl: "https://localhost:3000/",
  taskpaneEntry: "taskpane",
  functionsEntry: "functions",
  taskpaneHtml: "taskpane.html",
  functionsScript: "functions.js",
  taskpaneScript: "taskpane.js",
  functionsMetadata: "functions.json",
  // The engine's Web Worker (src/engine/browserWorker.ts); src/functions/engine.ts loads it by this name.
  engineWorkerEntry: "engine-worker",
  engineWorkerScript: "engine-worker.js",
  assetsDir: "assets",
});

const FUNCTIONS_SOURCE = "./src/functions/functions.ts";

async function devServerOptions() {
  // Required lazily: building must not load the certificate tool at all.
  const devCerts = require("office-addin-dev-certs");
  const https = await devCerts.getHttpsServerOptions();
  return {
    port: outputNames.devPort,
    server: { type: "https", options: { ca: https.ca, key: https.key, cert: https.cert } },
    headers: { "Access-Control-Allow-Origin": "*" },
    static: false,
    hot: false,
    liveReload: true,
    client: { overlay: { warnings: false, errors: true } },
  };
}

function config(argv = {}) {
  const dev = argv.mode === "development";
  return {
    mode: dev ? "development" : "production",
    devtool: dev ? "source-map" : false,
    context: __dirname,
    entry: {
      // The functions bundle carries the webpack runtime and every module it uses; the pane
      // bundle depends on it, so a module both use (the core, later the engine and its
      // cache) exists once in the shared JavaScript context rather than once per bundle.
      [outputNames.functionsEntry]: FUNCTIONS_SOURCE,
      [outputNames.taskpaneEntry]: {
        import: "./src/taskpane/taskpane.ts",
        dependOn: outputNames.functionsEntry,
      },
      // A worker has a context of its own: the core is bundled into it again, on purpose.
      [outputNames.engineWorkerEntry]: "./src/engine/browserWorker.ts",
    },
    output: {
      path: path.resolve(__dirname, "dist"),
      filename: "[name].js",
      clean: true,
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
              configFile: path.resolve(__dirname, "tsconfig.json"),
              onlyCompileBundledFiles: true,
              // tsconfig.json as it is (commonjs: the core uses `import x = require()` for
              // the stdlib packages); only source maps follow the build mode.
              compilerOptions: { sourceMap: dev },
            },
          },
        },
      ],
    },
    plugins: [
      new CustomFunctionsMetadataPlugin({
        input: FUNCTIONS_SOURCE,
        output: outputNames.functionsMetadata,
      }),
      new HtmlWebpackPlugin({
        filename: outputNames.taskpaneHtml,
        template: "./src/taskpane/taskpane.html",
        // Both bundles on the one page: this page is the shared runtime.
        chunks: [outputNames.functionsEntry, outputNames.taskpaneEntry],
        chunksSortMode: "manual",
        scriptLoading: "defer",
      }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "manifest.xml", to: "manifest.xml" },
          { from: "src/taskpane/taskpane.css", to: "taskpane.css" },
          { from: "assets/*.png", to: `${outputNames.assetsDir}/[name][ext]` },
        ],
      }),
    ],
    performance: { hints: false },
  };
}

/** What webpack-cli calls: the build config, plus the dev server only under `webpack serve`. */
async function configFor(env = {}, argv = {}) {
  const c = config(argv);
  if (env.WEBPACK_SERVE) c.devServer = await devServerOptions();
  return c;
}

module.exports = configFor;
module.exports.outputNames = outputNames;
module.exports.config = config;
