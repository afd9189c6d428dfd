/** Jest runs the TypeScript tests under test/ through ts-jest. */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json" }] },
  // The Chromium and LibreOffice suites run from their own script (see README).
  testPathIgnorePatterns: ["/node_modules/", "/test/browser/", "/test/office-suite/"],
};
