/**
 * Finds a Python interpreter that can import the given modules (scipy for the bench, openpyxl for
 * the workbook check), instead of hard-coding one path: the first of `python3` on the PATH, the
 * system's /usr/bin/python3 (Debian's python3-scipy, python3-openpyxl) and `python` that imports
 * them all. Returns null, with the reason, when none does.
 */
import { spawnSync } from "node:child_process";

export const PYTHON_CANDIDATES = ["python3", "/usr/bin/python3", "python"];

export function findPython(modules: readonly string[]): { python: string } | { python: null; reason: string } {
  const tried: string[] = [];
  for (const candidate of PYTHON_CANDIDATES) {
    const run = spawnSync(candidate, ["-c", `import ${modules.join(", ")}`], { encoding: "utf8", timeout: 60000 });
    if (run.status === 0) return { python: candidate };
    tried.push(`${candidate}: ${run.error ? run.error.message : (run.stderr || "").trim().split("\n").pop()}`);
  }
  return { python: null, reason: `no Python imports ${modules.join(", ")} (tried ${tried.join("; ")})` };
}
