/** Jest: TypeScript through SWC (no type-check here; `npm test` runs tsc first). */
const esmOnly = [
  "is-any-array",
  "ml-array-[a-z]+",
  "ml-kernel-[a-z]+",
  "ml-levenberg-marquardt",
  "ml-regression[a-z-]*",
  "ml-matrix",
  "ml-distance[a-z-]*",
  "ml-[a-z-]+",
  "strip-bom",
];
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: { "^.+\\.(t|j|mj)sx?$": ["@swc/jest"] },
  transformIgnorePatterns: [`/node_modules/(?!(${esmOnly.join("|")})/)`],
  moduleNameMapper: {
    "^office-addin-manifest$": "<rootDir>/node_modules/office-addin-manifest/lib/officeApp.js",
  },
  testTimeout: 60000,
  // `npm run coverage`: every source file counts, loaded by a test or not (0 % when not)
  collectCoverageFrom: ["src/**/*.ts", "!src/**/*.d.ts"],
  coverageProvider: "v8",
  coverageReporters: ["json-summary", "text-summary"],
  coverageDirectory: "coverage",
};
