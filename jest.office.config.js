/**
 * The suites that need a Debian package: LibreOffice (test/office-suite). `npm run test:office`
 * runs them; .ci/run installs libreoffice-calc-nogui first. Same transform and global setup as
 * the main suite (the batch runner's command line is compiled there).
 */
const base = require("./jest.config.js");

module.exports = {
  ...base,
  roots: ["<rootDir>/test/office-suite"],
  testPathIgnorePatterns: ["/node_modules/"],
  testTimeout: 300_000,
};
