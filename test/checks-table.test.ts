/**
 * The table of outside checks (docs/checks.md) is generated from the tests' `// @check`
 * annotations by scripts/gen-checks-table.mjs; this test keeps it current and holds the goals:
 * every core module with a calculation has at least one outside check, and the outside values
 * (besides the scipy fitter fixture) number at least 60 from at least 15 sources.
 */
import { execFileSync } from "child_process";
import path from "path";

const root = path.join(__dirname, "..");
const script = path.join(root, "scripts", "gen-checks-table.mjs");
const run = (...args: string[]) => execFileSync(process.execPath, [script, ...args], { cwd: root, encoding: "utf8" });

interface Report {
  checks: { module: string; source: string; values: number }[];
  summary: { values: number; sources: string[]; fixtureValues: number };
  uncovered: string[];
}

let report: Report;
beforeAll(() => {
  report = JSON.parse(run("--json")) as Report;
});

test("docs/checks.md is current (node scripts/gen-checks-table.mjs rewrites it)", () => {
  expect(() => run("--check")).not.toThrow();
});

test("every core module with a calculation has at least one outside check", () => {
  expect(report.uncovered).toEqual([]);
});

test("at least 60 outside values from at least 15 sources besides the scipy fitter fixture", () => {
  expect(report.summary.values).toBeGreaterThanOrEqual(60);
  expect(report.summary.sources.length).toBeGreaterThanOrEqual(15);
});
