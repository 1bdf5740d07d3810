/**
 * `npm run demo` (the README's run command): the command line it runs, taken from package.json,
 * run in-process through main() with the workbook redirected to a temporary folder.
 */
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import { main } from "../src/cli/main";

const ROOT = path.join(__dirname, "..");

/** The arguments the demo script passes to bin/rheoledger.js. */
function demoArgs(): string[] {
  const script = (JSON.parse(readFileSync(path.join(ROOT, "package.json"), "utf8")) as { scripts: Record<string, string> }).scripts.demo as string;
  const m = /node bin\/rheoledger\.js (.*)$/.exec(script);
  if (!m) throw new Error(`unexpected demo script: ${script}`);
  // split like a POSIX shell for the simple cases the script uses: words and "double-quoted words"
  return [...(m[1] as string).matchAll(/"([^"]*)"|(\S+)/g)].map((w) => (w[1] ?? w[2]) as string);
}

describe("npm run demo", () => {
  it("reduces the demo CSV, prints a short summary and writes the results workbook", async () => {
    const args = demoArgs();
    expect(args.slice(0, 2)).toEqual(["reduce", "workbooks/demo-film-grade.csv"]);
    const outAt = args.indexOf("--out");
    expect(outAt).toBeGreaterThan(0);
    const target = path.join(mkdtempSync(path.join(tmpdir(), "rheoledger-demo-")), "demo-results.xlsx");
    args[outAt + 1] = target;
    const written = new Map<string, Uint8Array | string>();
    let stdout = "";
    let stderr = "";
    const code = await main(args, {
      readFile: (p) => readFileSync(path.join(ROOT, p), "utf8"),
      stdout: (t) => (stdout += t),
      stderr: (t) => (stderr += t),
      writeFile: (p, d) => written.set(p, d),
    });
    expect(stderr).toBe("");
    expect(code).toBe(0);
    // the summary: one line per temperature group, the warnings count, where the workbook went
    expect(stdout).toMatch(/^Reduced 3 groups:/);
    for (const t of ["190 °C", "210 °C", "230 °C"]) expect(stdout).toContain(`  ${t}, D 1 mm, 3 dies: 9 points`);
    expect(stdout).toMatch(/No warnings\.|\d+ warnings?/);
    expect(stdout).toContain(`Results workbook written to ${target}`);
    expect(stdout.split("\n").length).toBeLessThan(20);
    // the temperature shift: the demo data were generated with Ea = 55 kJ/mol (scripts/demo/filmGrade.ts)
    const ea = /Ea = ([\d.]+) ± [\d.]+ kJ\/mol/.exec(stdout);
    expect(ea).not.toBeNull();
    expect(Math.abs(Number(ea?.[1]) / 55 - 1)).toBeLessThan(0.03);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(written.get(target) as Uint8Array) as unknown as ArrayBuffer);
    const names = wb.worksheets.map((w) => w.name);
    expect(names.slice(0, 2)).toEqual(["Groups reduced", "Charts"]);
    expect(names.at(-1)).toBe("Method");
    expect(names).toEqual(expect.arrayContaining(["Flow curve", "Bagley end correction", "Model fits, parameters", "Temperature shift", "Temperature shift, constants", "Extensional viscosity", "Viscous heating", "Warnings"]));
  });
});
