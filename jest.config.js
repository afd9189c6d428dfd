/** Jest runs the TypeScript tests under test/ through ts-jest. */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json" }] },
  // The Chromium and LibreOffice suites run from their own script (see README).
  // office-addin-mock needs only the OfficeApp enum from office-addin-manifest, whose package
  // entry also loads an ES-module-only dependency that jest on Node 20 cannot require; the
  // enum's own module is mapped in its place.
  moduleNameMapper: {
    "^office-addin-manifest$": "<rootDir>/node_modules/office-addin-manifest/lib/officeApp",
  },
  globalSetup: "<rootDir>/test/engine/globalSetup.ts",
  testPathIgnorePatterns: ["/node_modules/", "/test/browser/", "/test/office-suite/"],
};
