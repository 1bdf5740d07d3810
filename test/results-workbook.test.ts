/**
 * `rheoledger reduce FILE.csv --out results.xlsx`: the workbook opens with exceljs, has the
 * Summary, Bagley, Flow curve, Fits and Warnings sheets with `quantity [unit]` headers, and its
 * numbers are the core's (reduce(), fitFlowCurves()) for the same file, converted to the units in
 * the headers. The Herschel–Bulkley fit of the invented cream recovers the parameters the data
 * were generated from (scripts/demo/creamYield.ts).
 */
import { mkdtempSync, readFileSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import { fitFlowCurves } from "../src/core/flowCurveFits";
import { runReduction } from "../src/core/run";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import { RESULTS_SHEETS } from "../src/io/resultsWorkbook";
import { main } from "../src/cli/main";
import { CREAM_YIELD } from "../scripts/demo/creamYield";
import { expectClose } from "./helpers/expectClose";

const ROOT = path.join(__dirname, "..");
/** Same numbers, written to xlsx and read back: doubles round-trip exactly, allow the last bit. */
const SAME = { rel: 1e-12, abs: 1e-300 };

function coreOf(file: string) {
  const csv = parseCsv(readFileSync(file, "utf8"));
  const raw = readRawTable(csv.lines.map((l) => l.cells), { rowWord: "line", rowNumbers: csv.lines.map((l) => l.line), headerNumber: csv.lines[0]?.line ?? 1, decimalMark: csv.delimiter === "," ? "." : undefined });
  const run = runReduction(raw.measurements, {}, { rank: true }, raw.warnings);
  return { result: run.result, fits: fitFlowCurves(run.result), inputWarnings: raw.warnings, warnings: run.warnings };
}

async function runOut(csv: string, extra: string[] = []) {
  const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-out-"));
  const out = path.join(dir, "results.xlsx");
  const written = new Map<string, Uint8Array>();
  let stdout = "";
  let stderr = "";
  const code = await main(["reduce", csv, ...extra, "--out", out], {
    readFile: (p) => readFileSync(p, "utf8"),
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    writeFile: (p, data) => written.set(p, data),
  });
  const wb = new ExcelJS.Workbook();
  const bytes = written.get(out);
  if (bytes) await wb.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer);
  return { code, stdout, stderr, wb, bytes, out };
}

function table(wb: ExcelJS.Workbook, name: string): { header: string[]; rows: unknown[][] } {
  const ws = wb.getWorksheet(name);
  if (!ws) throw new Error(`no sheet ${name}`);
  const all: unknown[][] = [];
  ws.eachRow({ includeEmpty: true }, (row) => all.push((row.values as unknown[]).slice(1)));
  return { header: all[0] as string[], rows: all.slice(1) };
}

describe("rheoledger reduce FILE.csv --out results.xlsx", () => {
  const csv = path.join(ROOT, "workbooks/demo-film-grade.csv");
  let run: Awaited<ReturnType<typeof runOut>>;
  let core: ReturnType<typeof coreOf>;
  beforeAll(async () => {
    run = await runOut(csv);
    core = coreOf(csv);
  });

  it("exits 0, prints the tables and where the workbook went", () => {
    expect(run.stderr).toBe("");
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("Bagley end correction");
    expect(run.stdout).toContain(`Results workbook written to ${run.out}`);
  });

  it("has the five sheets, each header cell `quantity [unit]` or a plain name", () => {
    expect(run.wb.worksheets.map((w) => w.name)).toEqual([RESULTS_SHEETS.summary, RESULTS_SHEETS.bagley, RESULTS_SHEETS.flowCurve, RESULTS_SHEETS.fits, RESULTS_SHEETS.warnings]);
    for (const name of [RESULTS_SHEETS.bagley, RESULTS_SHEETS.flowCurve]) {
      for (const h of table(run.wb, name).header) expect(h).toMatch(/^[a-z0-9_]+ \[[^\]]+\]$/);
    }
  });

  it("Flow curve sheet equals reduce() in the header units (°C, mm, kPa, Pa.s)", () => {
    const { header, rows } = table(run.wb, RESULTS_SHEETS.flowCurve);
    expect(header).toEqual(["temperature [C]", "die_diameter [mm]", "shear_rate_apparent [1/s]", "wall_shear_stress [kPa]", "n_prime [-]", "shear_rate_wall [1/s]", "viscosity [Pa.s]", "viscosity_apparent [Pa.s]"]);
    const expected = core.result.groups.flatMap((g) => g.flowCurve.map((f) => [(g.temperature as number) - 273.15, g.dieDiameter * 1e3, f.shearRateApparent, f.wallShearStress / 1e3, f.nPrime, f.shearRateWall as number, f.viscosity as number, f.viscosityApparent]));
    expect(rows).toHaveLength(expected.length);
    expected.forEach((e, i) => e.forEach((v, j) => expectClose(rows[i]?.[j] as number, v, SAME, `${header[j]}, row ${i + 2}`)));
  });

  it("Bagley sheet equals reduce()'s Bagley rows (kPa, bar)", () => {
    const { rows } = table(run.wb, RESULTS_SHEETS.bagley);
    const expected = core.result.groups.flatMap((g) => g.bagley.map((b) => [b.shearRateApparent, b.wallShearStress / 1e3, b.entrancePressure / 1e5, b.endCorrection, b.r2, b.diesUsed]));
    expect(rows).toHaveLength(expected.length);
    expected.forEach((e, i) => e.forEach((v, j) => expectClose(rows[i]?.[j + 2] as number, v, SAME, `Bagley row ${i + 2}, column ${j + 3}`)));
  });

  it("Fits sheet lists every group's ranked models with the parameters of fitFlowCurves()", () => {
    const { rows } = table(run.wb, RESULTS_SHEETS.fits);
    const best = core.fits[1]?.ranked[0];
    if (!best) throw new Error("no fit at 210 °C");
    const bestRows = rows.filter((r) => Math.abs((r[0] as number) - 210) < 1e-9 && r[3] === 1);
    expect(bestRows.map((r) => r[2])).toEqual(Object.keys(best.result.parameters).map(() => best.model));
    for (const r of bestRows) expectClose(r[11] as number, best.result.parameters[r[9] as string] as number, SAME, `210 °C ${r[9]}`);
    const summary = table(run.wb, RESULTS_SHEETS.summary);
    expect(summary.rows.slice(0, 3).map((r) => r[10])).toEqual(core.fits.map((f) => f.ranked[0]?.model));
  });

  it("Warnings sheet lists the same codes as the core", () => {
    const { header, rows } = table(run.wb, RESULTS_SHEETS.warnings);
    expect(header).toEqual(["severity", "code", "message"]);
    // every warning of the run: reading, reduction and fits (one list on every surface)
    expect(rows.map((r) => r[1])).toEqual(core.warnings.map((w) => w.code));
    expect(rows.map((r) => r[0])).toEqual(core.warnings.map((w) => w.severity));
  });
});

describe("results workbook of the invented yield-stress cream", () => {
  it("the Herschel–Bulkley fit ranks first and recovers τy, K, n of the generator (noise 0.8 %)", async () => {
    const run = await runOut(path.join(ROOT, "workbooks/demo-cream-yield.csv"), ["--summary"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("best fit herschel-bulkley");
    const { rows } = table(run.wb, RESULTS_SHEETS.fits);
    const best = rows.filter((r) => r[3] === 1);
    expect(best[0]?.[2]).toBe("herschel-bulkley");
    const value = (name: string) => best.find((r) => r[9] === name)?.[11] as number;
    // tolerances: 0.8 % pressure noise through Bagley and Rabinowitsch (measured: 3 %, 6 %, 2 %)
    expectClose(value("tauY"), CREAM_YIELD.tauY, { rel: 0.1 }, "tauY");
    expectClose(value("K"), CREAM_YIELD.K, { rel: 0.1 }, "K");
    expectClose(value("n"), CREAM_YIELD.n, { rel: 0.05 }, "n");
  });
});

describe("reduce --out errors", () => {
  it("refuses a file name without .xlsx (exit 2, nothing written)", async () => {
    let stderr = "";
    const written: string[] = [];
    const code = await main(["reduce", "workbooks/demo-film-grade.csv", "--out", "results.csv"], {
      readFile: (p) => readFileSync(path.join(ROOT, p), "utf8"),
      stdout: () => undefined,
      stderr: (t) => (stderr += t),
      writeFile: (p) => written.push(p),
    });
    expect(code).toBe(2);
    expect(stderr).toContain("--out: expected a file name ending in .xlsx");
    expect(written).toEqual([]);
  });

  it("with --json keeps standard output one JSON document", async () => {
    const run = await runOut(path.join(ROOT, "workbooks/demo-film-grade.csv"), ["--json"]);
    expect(run.code).toBe(0);
    expect(() => JSON.parse(run.stdout)).not.toThrow();
    expect(run.stderr).toContain("Results workbook written to");
  });
});

it("the src/functions and src/taskpane bundles never import exceljs or the results workbook", () => {
  const files = (dir: string): string[] =>
    readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(path.join(dir, e.name)) : e.name.endsWith(".ts") ? [path.join(dir, e.name)] : []));
  for (const f of [...files(path.join(ROOT, "src/functions")), ...files(path.join(ROOT, "src/taskpane"))]) {
    const text = readFileSync(f, "utf8");
    expect(`${f}: ${/from "exceljs"|resultsWorkbook/.test(text)}`).toBe(`${f}: false`);
  }
});
