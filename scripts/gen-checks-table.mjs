#!/usr/bin/env node
/**
 * Builds docs/checks.md, the table of outside checks (method → check → source → tolerance), from
 * the tests' own annotations. An annotation is one comment line directly above (or beside) the
 * assertion it describes:
 *
 *   // @check <module> | <what is checked> | <source> | <tolerance> | <number of values>
 *
 * - module: the src/core module the check exercises, as a path without extension
 *   ("bagley", "temperature/fitShift", "models/ellis"); several separated by ", " when one
 *   assertion checks them together;
 * - source: the outside reference, first the one the value comes from (a standard, handbook,
 *   paper, book with edition, or an independent library such as scipy with its generator); mark
 *   "from memory" where the text was not at hand;
 * - tolerance: as passed to expectClose ("rel 1e-9", "abs 1e-12", "exact");
 * - number of values: how many outside reference values the assertion compares against.
 *
 * Usage: node scripts/gen-checks-table.mjs          writes docs/checks.md
 *        node scripts/gen-checks-table.mjs --json   prints the checks, the summary and uncovered modules
 *        node scripts/gen-checks-table.mjs --check  exits 1 when docs/checks.md is not current
 * The module also exports collectChecks() and renderTable() for test/checks-table.test.ts.
 */
import { readdirSync, readFileSync, writeFileSync, existsSync, mkdirSync } from "node:fs";
import { join, relative, dirname } from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = join(dirname(fileURLToPath(import.meta.url)), "..");
export const TABLE_PATH = join(ROOT, "docs", "checks.md");
const TAG = /\/\/\s*@check\s+(.*)$/;

/** Sources that do not count towards the goal of outside sources (the fitter's own fixture). */
export const FITTER_FIXTURE = "scipy fitter fixture";

/**
 * Core modules that hold no calculation with an outside reference, with the reason.
 * Every other module under src/core must have at least one @check.
 */
export const EXEMPT_MODULES = {
  index: "re-exports only",
  errors: "error type and argument checks, no calculation",
  warningCodes: "registry of warning codes, no calculation",
  reduceTypes: "types only",
  random: "seeded generator for demos and Monte Carlo draws; its output is checked through the Monte Carlo tests of uncertainty",
  "fit/index": "re-exports only",
  "fit/options": "defaults only",
  "fit/validate": "input checks, no calculation",
  "fit/extrapolation": "compares rates with the fitted range, no calculation",
  "models/index": "registry of the models",
  "models/types": "types only",
  "models/parameterSpec": "types only",
  "models/numerics": "shared guards, no calculation",
  "models/guess": "starting values; judged by the fits they lead to (scipy fitter fixture)",
  "temperature/index": "re-exports only",
  "temperature/curves": "input checks, no calculation",
  grouping: "sorting points into temperature and diameter groups, no calculation",
  transducerChoice: "a selection rule (each step within 5–90 % of full scale: common practice, no source); the pressures it ranks are checked against Hagen–Poiseuille through the planner",
  rowAccount: "counting input rows by the reason they were not used, no calculation",
  groupDies: "assembling a group's dies from its points and recording what became of each row, no calculation",
  speedSteps: "grouping a die's readings into speed steps and comparing repeats with a limit (common practice, no source); judged on lab-style fixtures (test/speedSteps.test.ts)",
  flowInstability: "a detection rule for a fall or stall of pressure with rising rate, judged against the readings' own scatter (common practice, no source); the melt-fracture stress range is common practice, no source; judged on lab-style fixtures (test/flowInstability.test.ts)",
  parameterComparison: "an interval-overlap rule (common practice, no source); the intervals come from fitModel, checked against scipy",
  "steps/index": "re-exports only",
  "steps/options": "settings, their defaults and their checks, no calculation",
  "steps/segment": "a segmentation rule (common practice, no source); judged by the plateaus it leads to on first-order recordings (steps/plateau)",
  "steps/groupSteps": "assigning die runs to reduction groups, no calculation",
  "steps/thermalCheck": "a comparison of two plateaus against a limit (common practice, no source); the plateaus are checked through steps/plateau",
};

function testFiles(dir) {
  const out = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) out.push(...testFiles(path));
    else if (/\.test\.ts$/.test(entry.name)) out.push(path);
  }
  return out.sort();
}

/** Every @check annotation of the test files, with problems found in them. */
export function collectChecks(root = ROOT) {
  const checks = [];
  const problems = [];
  for (const file of testFiles(join(root, "test"))) {
    const rel = relative(root, file).split("\\").join("/");
    readFileSync(file, "utf8")
      .split("\n")
      .forEach((line, i) => {
        const m = TAG.exec(line);
        if (!m) return;
        const fields = m[1].split(" | ").map((f) => f.trim());
        const where = `${rel}:${i + 1}`;
        if (fields.length !== 5 || fields.some((f) => f === "")) {
          problems.push(`${where}: an @check needs 5 non-empty fields separated by " | ", got ${fields.length}`);
          return;
        }
        const [moduleList, check, source, tolerance, count] = fields;
        if (!/^[1-9][0-9]*$/.test(count)) {
          problems.push(`${where}: the number of values must be a whole number ≥ 1, got "${count}"`);
          return;
        }
        const modules = moduleList.split(", ");
        const missing = modules.filter((m) => !existsSync(join(root, "src", "core", `${m}.ts`)));
        if (missing.length) {
          problems.push(`${where}: no module ${missing.map((m) => `src/core/${m}.ts`).join(", ")}`);
          return;
        }
        checks.push({ module: moduleList, modules, check, source, tolerance, values: Number(count), file: rel, line: i + 1 });
      });
  }
  return { checks, problems };
}

/** The core modules (paths without extension) that need a check. */
export function coreModules(root = ROOT) {
  const base = join(root, "src", "core");
  const walk = (dir) =>
    readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
      e.isDirectory() ? walk(join(dir, e.name)) : e.name.endsWith(".ts") ? [relative(base, join(dir, e.name)).split("\\").join("/").replace(/\.ts$/, "")] : [],
    );
  return walk(base).sort();
}

/**
 * The first source named in a source field, as a key for counting distinct sources: the text
 * before ";", without parentheses, cut at the first ", " unless what follows ends an author list
 * ("Williams, Landel & Ferry"), without a trailing year; any scipy reference counts as "scipy".
 */
export function primarySource(source) {
  if (/^scipy\b/i.test(source)) return "scipy";
  const parts = source.replace(/\([^)]*\)/g, "").split(";")[0].split(", ");
  let key = parts[0].trim();
  if (parts[1] && / & /.test(parts[1]) && /^[A-Z]/.test(parts[1])) key += `, ${parts[1].trim()}`;
  return key.replace(/\s+(1[6-9]|20)\d\d\s*$/, "").trim();
}

export function summarise(checks) {
  const outside = checks.filter((c) => !c.source.startsWith(FITTER_FIXTURE));
  const sources = [...new Set(outside.map((c) => primarySource(c.source)))].sort((a, b) => a.localeCompare(b));
  return {
    values: outside.reduce((s, c) => s + c.values, 0),
    sources,
    fixtureValues: checks.filter((c) => c.source.startsWith(FITTER_FIXTURE)).reduce((s, c) => s + c.values, 0),
  };
}

const cellText = (s) => s.replace(/\|/g, "\\|");

export function renderTable(checks, root = ROOT) {
  const modules = coreModules(root);
  const sorted = [...checks].sort((a, b) => a.module.localeCompare(b.module) || a.file.localeCompare(b.file) || a.line - b.line);
  const s = summarise(checks);
  const lines = [
    "# Outside checks",
    "",
    "Generated by `node scripts/gen-checks-table.mjs` from the `// @check` annotations in test/",
    "(format in the script's header); `test/checks-table.test.ts` fails when this file is stale.",
    "Each row is one assertion against a value from outside the project: a standard, handbook,",
    "paper or book, a closed form from a named source, or an independent library (scipy, with its",
    "generator committed under scripts/ and its output under test/fixtures/).",
    "",
    `- ${s.values} outside values from ${s.sources.length} sources, besides ${s.fixtureValues} values of the scipy fitter fixture.`,
    `- Core modules with a check: ${new Set(checks.flatMap((c) => c.modules)).size} of ${modules.length - Object.keys(EXEMPT_MODULES).filter((m) => modules.includes(m)).length} (exempt modules are listed at the end).`,
    "",
    "| module | check | source | tolerance | values | test |",
    "|---|---|---|---|---:|---|",
    ...sorted.map((c) => `| ${c.module} | ${cellText(c.check)} | ${cellText(c.source)} | ${cellText(c.tolerance)} | ${c.values} | ${c.file}:${c.line} |`),
    "",
    "## Sources",
    "",
    ...s.sources.map((src) => `- ${src}`),
    "",
    "## Modules without an outside check, and why",
    "",
    ...Object.entries(EXEMPT_MODULES)
      .filter(([m]) => modules.includes(m))
      .map(([m, why]) => `- ${m}: ${why}`),
    "",
  ];
  return lines.join("\n");
}

const isMain = process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1];
if (isMain) {
  const { checks, problems } = collectChecks();
  if (problems.length) {
    console.error(problems.join("\n"));
    process.exit(1);
  }
  const text = renderTable(checks);
  if (process.argv.includes("--json")) {
    const modules = coreModules().filter((m) => !(m in EXEMPT_MODULES));
    const covered = new Set(checks.flatMap((c) => c.modules));
    console.log(JSON.stringify({ checks, summary: summarise(checks), uncovered: modules.filter((m) => !covered.has(m)) }));
  } else if (process.argv.includes("--check")) {
    const current = existsSync(TABLE_PATH) ? readFileSync(TABLE_PATH, "utf8") : "";
    if (current !== text) {
      console.error("docs/checks.md is not current: run node scripts/gen-checks-table.mjs");
      process.exit(1);
    }
  } else {
    mkdirSync(dirname(TABLE_PATH), { recursive: true });
    writeFileSync(TABLE_PATH, text);
    const s = summarise(checks);
    console.log(`docs/checks.md: ${checks.length} checks, ${s.values} outside values from ${s.sources.length} sources`);
  }
}
