/**
 * The suites that need Debian's Chromium (test/browser), driven by playwright-core with
 * executablePath /usr/bin/chromium; `npm run test:browser` builds dist/ and runs them, and
 * .ci/run installs the chromium package first. No browser is downloaded at install time.
 */
const base = require("./jest.config.js");

module.exports = {
  ...base,
  roots: ["<rootDir>/test/browser"],
  testPathIgnorePatterns: ["/node_modules/"],
  testTimeout: 120_000,
};
