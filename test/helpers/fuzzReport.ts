/**
 * Per-suite report of the fuzz tests: cases run, cases that reached the calculations and returned
 * numbers, and errors by kind. Each suite writes test-output/fuzz/<suite>.json; the merged
 * test-output/fuzz-report.json is rewritten from every suite file present, and a one-line
 * summary is printed.
 */
import fs from "fs";
import path from "path";

export interface FuzzTally {
  cases: number;
  reachedCore: number;
  errors: Record<string, number>;
}

export function newTally(): FuzzTally {
  return { cases: 0, reachedCore: 0, errors: {} };
}

export function countError(tally: FuzzTally, kind: string): void {
  tally.errors[kind] = (tally.errors[kind] ?? 0) + 1;
}

export function writeFuzzReport(suite: string, tally: FuzzTally, parts: Record<string, FuzzTally> = {}): void {
  const dir = path.join(__dirname, "..", "..", "test-output", "fuzz");
  fs.mkdirSync(dir, { recursive: true });
  const entry = { ...tally, reachedShare: tally.cases ? tally.reachedCore / tally.cases : 0, parts };
  fs.writeFileSync(path.join(dir, `${suite}.json`), JSON.stringify(entry, null, 1));
  const merged: Record<string, unknown> = {};
  for (const f of fs.readdirSync(dir).filter((n) => n.endsWith(".json")).sort()) {
    merged[f.replace(/\.json$/, "")] = JSON.parse(fs.readFileSync(path.join(dir, f), "utf8"));
  }
  fs.writeFileSync(path.join(dir, "..", "fuzz-report.json"), JSON.stringify(merged, null, 1));
  const errors = Object.entries(tally.errors)
    .sort((a, b) => b[1] - a[1])
    .map(([k, n]) => `${k} ${n}`)
    .join(", ");
  console.log(`fuzz ${suite}: ${tally.cases} cases, ${tally.reachedCore} reached the calculations (${(100 * entry.reachedShare).toFixed(0)} %); errors: ${errors || "none"}`);
}
