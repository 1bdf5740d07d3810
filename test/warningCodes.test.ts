/**
 * The warning-code registry (src/core/warningCodes.ts) against the code base: every code that
 * src/ raises is registered with a severity and a title, every registered code has a description,
 * and warning() takes its severity from the registry.
 */
import { readFileSync, readdirSync, statSync } from "fs";
import { join } from "path";
import { WARNING_CODES, isWarningCode, warningSeverity } from "../src/core/warningCodes";
import { WARNING_CATALOG, describeWarning } from "../src/io/warningCatalog";
import { warning } from "../src/core/errors";

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? sourceFiles(path) : path.endsWith(".ts") ? [path] : [];
  });
}

/** Codes raised in src/: the first argument of warning(...) and `code: "..."` literals. */
function raisedCodes(): Map<string, string> {
  const found = new Map<string, string>();
  for (const file of sourceFiles(join(__dirname, "..", "src"))) {
    if (file.endsWith("warningCodes.ts") || file.endsWith("warningCatalog.ts")) continue;
    const text = readFileSync(file, "utf8");
    for (const m of text.matchAll(/\bwarning\(\s*"([A-Z][A-Z0-9_]+)"|\bcode:\s*"([A-Z][A-Z0-9_]+)"/g)) {
      found.set((m[1] ?? m[2]) as string, file);
    }
  }
  return found;
}

describe("warning-code registry", () => {
  test("every code raised in src/ is registered", () => {
    const raised = raisedCodes();
    expect(raised.size).toBeGreaterThan(30);
    const missing = [...raised].filter(([code]) => !isWarningCode(code)).map(([code, file]) => `${code} (${file})`);
    expect(missing).toEqual([]);
  });

  test("every registered code has a severity, a title and a description", () => {
    for (const [code, severity] of Object.entries(WARNING_CODES)) {
      expect(["info", "caution", "serious"]).toContain(severity);
      expect(/^[A-Z][A-Z0-9_]+$/.test(code)).toBe(true);
    }
    expect(Object.keys(WARNING_CATALOG).sort()).toEqual(Object.keys(WARNING_CODES).sort());
    for (const text of Object.values(WARNING_CATALOG)) {
      expect(text.title.length).toBeGreaterThan(5);
      expect(text.description.length).toBeGreaterThan(20);
    }
  });

  test("warning(code, message) takes its severity from the registry", () => {
    expect(warning("BAGLEY_NEGATIVE_END_CORRECTION", "x").severity).toBe("serious");
    expect(warning("COLUMN_IGNORED", "x").severity).toBe("info");
    expect(warning("BAGLEY_FEW_DIES", "x", "190 °C, D 1 mm")).toEqual({ code: "BAGLEY_FEW_DIES", message: "x", severity: "caution", scope: "190 °C, D 1 mm" });
    expect(warningSeverity("NOT_A_CODE")).toBe("caution");
    expect(describeWarning("BAGLEY_FEW_DIES")).toEqual({ severity: "caution", ...WARNING_CATALOG.BAGLEY_FEW_DIES });
    expect(describeWarning("NOT_A_CODE")).toEqual({ severity: "caution", title: "NOT_A_CODE", description: "" });
  });
});
