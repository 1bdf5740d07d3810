/**
 * `rheoledger reduce FILE.csv --out results.xlsx`: what a colleague opening the file sees.
 *   - every result of the run, each table on its sheet under a title and one header row with its
 *     unit, values equal to the JSON document of the same run (test/helpers/resultsJson.ts);
 *   - significant-figure number formats, fitted widths, a frozen header;
 *   - native charts (DrawingML parts) whose series read ranges that hold the charted values;
 *   - a Method sheet: input file name and SHA-256, version, settings, equations, warnings with
 *     severity, test-report items filled from the data and from --meta;
 *   - text stays text (no formula anywhere in the file), no NaN or Infinity in any cell.
 * The second readers (openpyxl, LibreOffice) open the same files in test/second-readers.test.ts.
 */
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { copyFileSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import JSZip from "jszip";
import { main } from "../src/cli/main";
import { resultsWorkbookBytes } from "../src/io/resultsWorkbook";
import type { ResultTable } from "../src/io/resultTables";
import { CREAM_YIELD } from "../scripts/demo/creamYield";
import { expectClose } from "./helpers/expectClose";
import { SHEET_SPECS, compareSheet } from "./helpers/resultsJson";
import { EVERY_OPTION, FORMULA_LIKE, newtonianCsv } from "./helpers/resultsCases";
import { modelName, parameterSymbol } from "../src/io/displayNames";
import pkg from "../package.json";

const ROOT = path.join(__dirname, "..");
const FILM = path.join(ROOT, "workbooks/demo-film-grade.csv");
/** Same doubles written to xlsx and read back: exact. */
const SAME = { rel: 1e-15, abs: 0 };

interface Run {
  code: number;
  stdout: string;
  stderr: string;
  bytes: Uint8Array;
  wb: ExcelJS.Workbook;
  zip: JSZip;
  out: string;
  dir: string;
}

async function runOut(csv: string, extra: string[] = []): Promise<Run> {
  const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-out-"));
  const out = path.join(dir, "results.xlsx");
  const written = new Map<string, Uint8Array | string>();
  let stdout = "";
  let stderr = "";
  const code = await main(["reduce", csv, ...extra.map((a) => a.replace("$DIR", dir)), "--out", out], {
    readFile: (p) => readFileSync(p, "utf8"),
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    writeFile: (p, data) => written.set(p, data),
  });
  const bytes = (written.get(out) ?? new Uint8Array()) as Uint8Array;
  const wb = new ExcelJS.Workbook();
  if (bytes.length > 0) await wb.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer);
  const zip = bytes.length > 0 ? await JSZip.loadAsync(bytes) : new JSZip();
  return { code, stdout, stderr, bytes, wb, zip, out, dir };
}

/** A sheet as rows of plain values (row 1 first). */
export function sheetRows(wb: ExcelJS.Workbook, name: string): unknown[][] {
  const ws = wb.getWorksheet(name);
  if (!ws) throw new Error(`no sheet "${name}"; sheets: ${wb.worksheets.map((w) => w.name).join(", ")}`);
  const rows: unknown[][] = [];
  for (let r = 1; r <= ws.rowCount; r++) rows.push(Array.from({ length: ws.columnCount }, (_, c) => ws.getCell(r, c + 1).value ?? null));
  return rows;
}

/** Rows of a table on the Method sheet, found by its title (until the next blank row). */
function methodBlock(wb: ExcelJS.Workbook, title: string): unknown[][] {
  const rows = sheetRows(wb, "Method");
  const at = rows.findIndex((r) => typeof r[0] === "string" && (r[0] as string).startsWith(title));
  if (at < 0) throw new Error(`Method sheet has no "${title}"`);
  const out: unknown[][] = [];
  for (let i = at + 1; i < rows.length && rows[i]?.some((v) => v !== null); i++) out.push(rows[i] as unknown[]);
  return out;
}

async function sheetXml(zip: JSZip): Promise<string[]> {
  const names = Object.keys(zip.files).filter((n) => /^xl\/worksheets\/sheet\d+\.xml$/.test(n));
  return Promise.all(names.map((n) => (zip.file(n) as JSZip.JSZipObject).async("string")));
}

describe("reduce --out with every option on (film grade: shift, representative rate, Cogswell, transducer, heating, pressure, fits, MFR)", () => {
  let run: Run;
  let doc: { groups: Record<string, unknown>[] } & Record<string, unknown>;
  beforeAll(async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-meta-"));
    const meta = path.join(dir, "meta.json");
    writeFileSync(meta, JSON.stringify({ material: "invented film grade QF-207, lot 7", preheatTime: "6 min", testDate: "2024-03-14" }));
    run = await runOut(FILM, [...EVERY_OPTION, "--json", "--meta", meta]);
    doc = JSON.parse(run.stdout);
  });

  it("exits 0, keeps standard output one JSON document and says where the workbook went", () => {
    expect(run.code).toBe(0);
    expect(run.stderr).toBe(`Results workbook written to ${run.out}\n`);
    expect(doc.groups).toHaveLength(3);
  });

  it("holds every result: the groups first, Charts second, a sheet per result table, Method last", () => {
    expect(run.wb.worksheets.map((w) => w.name)).toEqual([
      "Groups reduced", "Charts", "Bagley end correction", "Bagley plot data", "Flow curve", "Uncertainty budget", "Rabinowitsch correction", "Viscosity and model", "Extensional viscosity", "Viscous heating", "Pressure dependence",
      "Recommended model", "Melt-flow-rate point", "Model fits, ranking by AIC", "Model fits, parameters", "Temperature shift", "Temperature shift, constants", "Master curve at 210 °C", "Rows used and left out", "Warnings", "Method",
    ]);
  });

  it("every table sheet: a bold title row, one header row, frozen, filtered; units in one spelling each", () => {
    const units = new Set<string>();
    for (const ws of run.wb.worksheets.filter((w) => !["Charts", "Chart data", "Method"].includes(w.name))) {
      expect(ws.getCell(1, 1).font?.bold).toBe(true);
      expect(ws.views[0]).toMatchObject({ state: "frozen", ySplit: 2 });
      expect(ws.autoFilter).toBeDefined();
      for (const h of sheetRows(run.wb, ws.name)[1] ?? []) {
        expect(typeof h).toBe("string");
        const unit = / \[([^\]]+)\]$/.exec(String(h))?.[1];
        if (unit) units.add(unit);
      }
    }
    // one spelling per unit: never "Pa.s", "Pa s", "C", "1/sec", "mm3/s"
    expect([...units].sort()).toEqual(["%", "1/GPa", "1/s", "K", "Pa·s", "bar", "kPa", "mm", "mm/s", "mm³/s", "°C"]);
    const flow = sheetRows(run.wb, "Flow curve")[1];
    expect(flow?.slice(0, 7)).toEqual(["Group", "Apparent shear rate [1/s]", "Wall shear stress [kPa]", "n′", "True wall shear rate [1/s]", "Viscosity [Pa·s]", "Apparent viscosity [Pa·s]"]);
  });

  it("the numbers equal the JSON document of the same run, in the units of their headers", () => {
    let n = 0;
    for (const spec of SHEET_SPECS) {
      if (!run.wb.getWorksheet(spec.sheet)) continue;
      n += compareSheet(sheetRows(run.wb, spec.sheet), spec, doc, SAME, "exceljs");
    }
    // 27 flow-curve rows × 12 columns, 27 Bagley × 5, Cogswell, heating, pressure, shift, MFR
    expect(n).toBeGreaterThan(700);
  });

  it("fit parameters with intervals (--model) and the ranked comparison (--compare) equal the JSON", () => {
    const rows = sheetRows(run.wb, "Model fits, parameters").slice(2);
    const ranking = sheetRows(run.wb, "Model fits, ranking by AIC").slice(2);
    doc.groups.forEach((g, i) => {
      const scope = sheetRows(run.wb, "Groups reduced")[2 + i]?.[0] as string;
      const fit = g.fit as { model: string; parameters: Record<string, number>; confidenceIntervals: Record<string, [number, number]>; undetermined: Record<string, { outsideData: boolean; supportedBound: { side: string; value: number } | null }> };
      for (const [name, value] of Object.entries(fit.parameters)) {
        const r = rows.find((x) => x[0] === scope && x[1] === modelName(fit.model) && x[2] === null && x[3] === parameterSymbol(name)) as unknown[];
        const u = fit.undetermined[name];
        if (u?.outsideData) {
          // not determined by the data: the cell is empty and the note gives the bound the data support
          expect([r[5], r[10], String(r[11]).startsWith(u.supportedBound ? "≥ " : "not determined")]).toEqual([null, false, true]);
          continue;
        }
        expectClose(r[5] as number, value, SAME, `${scope} --model ${name}`);
        const ci = fit.confidenceIntervals[name];
        if (ci) {
          expectClose(r[7] as number, ci[0], SAME, `${scope} ${name} low`);
          expectClose(r[8] as number, ci[1], SAME, `${scope} ${name} high`);
        }
      }
      (g.compare as { ranked: { model: string; aic: number; parameters: Record<string, number> }[] }).ranked.forEach((ranked, k) => {
        for (const [name, value] of Object.entries(ranked.parameters)) {
          const r = rows.find((x) => x[0] === scope && x[1] === modelName(ranked.model) && x[2] === k + 1 && x[3] === parameterSymbol(name)) as unknown[];
          if (r[5] === null && r[10] === false) continue; // not determined by the data (checked above for --model)
          expectClose(r[5] as number, value, SAME, `${scope} --compare ${ranked.model} ${name}`);
        }
        const line = ranking.find((x) => x[0] === scope && x[1] === k + 1) as unknown[];
        expect(line[2]).toBe(modelName(ranked.model));
        expectClose(line[3] as number, ranked.aic, SAME, `${scope} AIC ${ranked.model}`);
      });
    });
  });

  it("the shift constants sheet holds Ea (kJ/mol) with its standard error and the reference temperature; the master curve aT·rate and η/aT", () => {
    const shift = doc.shift as { activationEnergy: number; activationEnergyStandardError: number; referenceTemperature: number; factors: { temperature: number; aT: number }[] };
    const rows = sheetRows(run.wb, "Temperature shift, constants");
    expect(rows[1]).toEqual(["Constant", "Value", "Standard error", "Unit"]);
    expect(rows[2]?.[0]).toBe("Activation energy Ea");
    expectClose(rows[2]?.[1] as number, shift.activationEnergy / 1e3, SAME, "Ea");
    expectClose(rows[2]?.[2] as number, shift.activationEnergyStandardError / 1e3, SAME, "SE of Ea");
    expect(rows[2]?.[3]).toBe("kJ/mol");
    expectClose(rows[3]?.[1] as number, shift.referenceTemperature - 273.15, SAME, "Tref");
    const master = sheetRows(run.wb, "Master curve at 210 °C").slice(2);
    const points = doc.groups.reduce((n, g) => n + (g.flowCurve as unknown[]).length, 0);
    expect(master).toHaveLength(points);
    const flow = sheetRows(run.wb, "Flow curve").slice(2);
    for (const r of master) {
      const aT = shift.factors.find((f) => Math.abs(f.temperature - 273.15 - (r[0] as number)) < 1e-9)?.aT as number;
      expectClose(r[1] as number, aT, SAME, "aT");
      // each reduced point is a measured point of the flow curve at that temperature
      const measured = flow.find((f) => String(f[0]).startsWith(`${r[0]} °C`) && Math.abs((f[4] as number) * aT - (r[2] as number)) <= 1e-12 * (r[2] as number));
      if (!measured) throw new Error(`master point ${String(r[2])} at ${String(r[0])} °C is no measured point`);
      expectClose(r[3] as number, (measured[5] as number) / aT, { rel: 1e-12, abs: 0 }, "η/aT");
    }
  });

  it("Bagley plot data: each line passes through ΔP = 2τ_w·L/R + ΔP_ent (Bagley 1957) and reaches zero at L/R = −e; the Rabinowitsch factor is (3n′ + 1)/(4n′)", () => {
    const lines = sheetRows(run.wb, "Bagley end correction").slice(2);
    const points = sheetRows(run.wb, "Bagley plot data").slice(2).filter((r) => typeof r[1] === "number");
    expect(points).toHaveLength(lines.length * 4); // per rate: the zero-pressure point and three dies
    for (const p of points) {
      const line = lines.find((l) => l[0] === p[0] && l[1] === p[1]) as unknown[];
      const [tau, entrance, e] = [line[2] as number, line[3] as number, line[4] as number];
      // kPa and bar: ΔP [bar] = (2·τ_w[kPa]·1e3·L/R)/1e5 + ΔP_ent [bar]
      expectClose(p[5] as number, (2 * tau * 1e3 * (p[3] as number)) / 1e5 + entrance, { rel: 1e-9, abs: 1e-9 }, `line at ${String(p[1])} 1/s, L/R ${String(p[3])}`);
      if (p[2] === "line at zero pressure") {
        expectClose(p[3] as number, -e, SAME, "L/R = −e");
        expect(p[4]).toBeNull();
      } else expect(typeof p[4]).toBe("number");
    }
    for (const r of sheetRows(run.wb, "Rabinowitsch correction").slice(2).filter((x) => typeof x[1] === "number")) {
      const n = r[2] as number;
      expectClose(r[3] as number, (3 * n + 1) / (4 * n), SAME, "factor");
      expectClose(r[4] as number, (r[3] as number) * (r[1] as number), { rel: 1e-12, abs: 0 }, "true rate = factor × apparent rate");
    }
  });

  it("shows each number with its column's significant figures (4 by default; n′ 3; R² 5) and fits the widths", () => {
    const ws = run.wb.getWorksheet("Flow curve") as ExcelJS.Worksheet;
    // row 3: 190 °C, 18 1/s; wall shear stress 32.2875 kPa → "32.29"; n′ 0.4233 → "0.423"; η 1337.99 → "1338"
    expect(ws.getCell(3, 3).numFmt).toBe("0.00");
    expect(ws.getCell(3, 4).numFmt).toBe("0.000");
    expect(ws.getCell(3, 6).numFmt).toBe("0");
    expect(ws.getCell(3, 2).numFmt).toBe("0"); // 18 1/s: a whole number
    expect((run.wb.getWorksheet("Bagley end correction") as ExcelJS.Worksheet).getCell(3, 6).numFmt).toBe("0.000000"); // R², 6 figures
    for (let c = 1; c <= ws.columnCount; c++) {
      const width = ws.getColumn(c).width as number;
      expect(width).toBeGreaterThanOrEqual(8);
      expect(width).toBeLessThanOrEqual(50);
    }
    expect(ws.getColumn(1).width).toBeGreaterThanOrEqual("190 °C, D 1 mm".length);
  });

  it("the Method sheet records the input's SHA-256, the version, the date, settings, equations, warnings and report items", () => {
    const record = Object.fromEntries(methodBlock(run.wb, "Method record").slice(1).map((r) => [r[0], r[1]]));
    expect(record["Input file"]).toBe(FILM);
    expect(record["Input file SHA-256"]).toBe(createHash("sha256").update(readFileSync(FILM)).digest("hex"));
    expect(record["Input file size"]).toBe(`${readFileSync(FILM).length} bytes`);
    expect(record.Program).toBe(`Rheoledger ${pkg.version} (command line)`);
    expect(String(record["Date and time (UTC)"])).toMatch(new RegExp(`^${new Date().toISOString().slice(0, 4)}-\\d\\d-\\d\\d \\d\\d:\\d\\d:\\d\\d UTC$`));
    expect(String(record.Command)).toContain('--tref "210 C"');
    const settings = Object.fromEntries(methodBlock(run.wb, "Settings").slice(1).map((r) => [r[0], [r[1], r[2]]]));
    expect(settings["End correction"]).toEqual(["bagley", "default"]);
    expect(settings["Rabinowitsch slope method"]).toEqual(["transition", "default"]);
    expect(settings["Temperature shift"]).toEqual(["arrhenius", "--shift"]);
    expect(settings["Reference temperature"]).toEqual(["210 C", "--tref"]);
    expect(settings["Wall slip (Mooney)"]).toEqual(["off", "default"]);
    const steps = methodBlock(run.wb, "Equations").slice(1).map((r) => r[0]);
    expect(steps).toEqual(expect.arrayContaining(["Bagley end correction", "Rabinowitsch correction", "Extensional viscosity", "Viscous heating", "Pressure dependence", "Temperature shift", "Model cross"]));
    // the same warnings as the Warnings sheet, most serious first, each with its severity; the JSON's among them
    const warnings = methodBlock(run.wb, "Warnings").slice(1);
    const sheet = sheetRows(run.wb, "Warnings").slice(2).filter((r) => r[0] !== null && !String(r[0]).startsWith("Note"));
    expect(warnings.map((w) => w[1]).sort()).toEqual(sheet.map((w) => w[1]).sort());
    expect(warnings.map((w) => ["serious", "caution", "info"].indexOf(w[0] as string))).toEqual([...warnings.map((w) => ["serious", "caution", "info"].indexOf(w[0] as string))].sort());
    const json = JSON.parse(run.stdout).warnings as { code: string; message: string }[];
    expect(sheet.length).toBe(json.length + sheet.filter((r) => r[1] === "RESULT_NOT_FINITE").length);
    for (const w of json) expect(sheet.some((r) => r[1] === w.code && r[3] === w.message)).toBe(true);
    const items = Object.fromEntries(methodBlock(run.wb, "Test report items").slice(1).map((r) => [r[3], r]));
    expect(items.material?.slice(1, 3)).toEqual(["invented film grade QF-207, lot 7", "metadata"]);
    expect(items.testTemperatures?.slice(1, 3)).toEqual(["190, 210, 230 °C", "data"]);
    expect(items.dieGeometry?.[1]).toBe("D 1 mm: L 10 mm (L/D 10), 20 mm (L/D 20), 30 mm (L/D 30)");
    expect(items.transducer?.slice(1, 3)).toEqual(["full scale and accuracy 700 bar, 0.25 %", "settings"]);
    expect(items.dieEntryAngle?.slice(1, 3)).toEqual([null, "to be filled in"]);
    const ws = run.wb.getWorksheet("Method") as ExcelJS.Worksheet;
    const rows = sheetRows(run.wb, "Method");
    const empty = rows.findIndex((r) => r[3] === "dieEntryAngle");
    expect((ws.getCell(empty + 1, 2).fill as ExcelJS.FillPattern).fgColor?.argb).toBe("FFFFF4CC");
  });

  it("native charts: Bagley per group, flow curve, viscosity with the model, n′ and master curve; series read the ranges that hold their values", async () => {
    const charts = Object.keys(run.zip.files).filter((n) => /^xl\/charts\/chart\d+\.xml$/.test(n)).sort();
    expect(charts).toHaveLength(7);
    const xml = await Promise.all(charts.map((n) => (run.zip.file(n) as JSZip.JSZipObject).async("string")));
    const titles = xml.map((x) => /<a:t>([^<]*)<\/a:t>/.exec(x)?.[1]);
    expect(titles).toEqual(["Bagley plot, 190 °C, D 1 mm", "Bagley plot, 210 °C, D 1 mm", "Bagley plot, 230 °C, D 1 mm", "Flow curve", "Viscosity", "Flow index n′", "Master curve"]);
    const logAxes = xml.map((x) => (x.match(/<c:logBase val="10"\/>/g) ?? []).length);
    expect(logAxes).toEqual([0, 0, 0, 2, 2, 1, 2]);
    for (const x of xml) expect(x).toContain("<c:scatterChart>");
    // every series: the range named in <c:f> holds exactly the cached points
    let points = 0;
    for (const x of xml) {
      for (const m of x.matchAll(/<c:f>'((?:[^']|'')+)'!\$([A-Z]+)\$(\d+):\$[A-Z]+\$(\d+)<\/c:f><c:numCache>.*?<c:ptCount val="(\d+)"\/>(.*?)<\/c:numCache>/g)) {
        const [, sheet, colLetters, r0, r1, count, pts] = m as unknown as string[];
        const ws = run.wb.getWorksheet((sheet as string).replace(/''/g, "'")) as ExcelJS.Worksheet;
        const col = [...(colLetters as string)].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
        expect(Number(r1) - Number(r0) + 1).toBe(Number(count));
        const cached = new Map([...(pts as string).matchAll(/<c:pt idx="(\d+)"><c:v>([^<]*)<\/c:v><\/c:pt>/g)].map((p) => [Number(p[1]), Number(p[2])]));
        for (let i = 0; i < Number(count); i++) {
          const v = ws.getCell(Number(r0) + i, col).value;
          expect(`${sheet}!${colLetters}${Number(r0) + i}: ${typeof v === "number" ? v : null}`).toBe(`${sheet}!${colLetters}${Number(r0) + i}: ${cached.get(i) ?? null}`);
          points++;
        }
      }
    }
    expect(points).toBeGreaterThan(300);
    const types = await (run.zip.file("[Content_Types].xml") as JSZip.JSZipObject).async("string");
    expect((types.match(/drawingml\.chart\+xml/g) ?? []).length).toBe(7);
  });

  it("holds no formula and no NaN or Infinity anywhere", async () => {
    for (const x of await sheetXml(run.zip)) {
      expect(x).not.toMatch(/<f[ >]/);
      expect(x).not.toMatch(/<v>(NaN|-?Infinity)<\/v>/);
    }
  });
});

describe("text stays text: user text that looks like a formula (--meta, file name)", () => {
  it("is stored as strings, never as formulas, and reads back as typed", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-text-"));
    const input = path.join(dir, "=SUM(A1)+cmd.csv");
    copyFileSync(path.join(ROOT, "workbooks/demo-cream-yield.csv"), input);
    const meta = path.join(dir, "meta.json");
    writeFileSync(meta, JSON.stringify({ ...FORMULA_LIKE, instrument: "bell\u0007 and nul\u0000 removed" }));
    const run = await runOut(input, ["--meta", meta]);
    expect(run.code).toBe(0);
    for (const x of await sheetXml(run.zip)) expect(x).not.toMatch(/<f[ >]/);
    const items = Object.fromEntries(methodBlock(run.wb, "Test report items").slice(1).map((r) => [r[3], r[1]]));
    for (const [key, value] of Object.entries(FORMULA_LIKE)) expect(JSON.stringify(items[key])).toBe(JSON.stringify(value.replace(/\r/g, "\n")));
    expect(items.instrument).toBe("bell and nul removed");
    const record = Object.fromEntries(methodBlock(run.wb, "Method record").slice(1).map((r) => [r[0], r[1]]));
    expect(record["Input file"]).toBe(input);
    // the cells are text cells (shared strings), formatted as text
    const strings = await (run.zip.file("xl/sharedStrings.xml") as JSZip.JSZipObject).async("string");
    expect(strings).toContain("=HYPERLINK(&quot;http://example.invalid&quot;,&quot;x&quot;)");
    expect(strings).toContain("@P50");
  });
});

describe("a singular fit (an ideal Newtonian liquid fitted with Carreau and Cross)", () => {
  let run: Run;
  beforeAll(async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-newton-"));
    const csv = path.join(dir, "newtonian.csv");
    writeFileSync(csv, newtonianCsv(50));
    run = await runOut(csv, ["--compare", "power-law,carreau", "--json"]);
  });

  it("reduces to η = 50 Pa·s at every rate (Hagen–Poiseuille: n′ = 1, true rate = apparent rate)", () => {
    expect(run.code).toBe(0);
    const doc = JSON.parse(run.stdout) as { groups: { flowCurve: { viscosity: number; nPrime: number }[] }[] };
    for (const f of doc.groups[0]?.flowCurve ?? []) {
      expectClose(f.viscosity, 50, { rel: 1e-9 }, "η");
      expectClose(f.nPrime, 1, { rel: 1e-9 }, "n′");
    }
  });

  // Whether JᵀJ of Carreau on exactly Newtonian data fails its Cholesky test depends on the last
  // bits of the flow curve; either way λ and n are not determined, and nothing is NaN.
  it("marks Carreau's λ and n not determined, writes a missing standard error and its interval as empty cells together, says why, and has no NaN in the file", async () => {
    const fits = sheetRows(run.wb, "Model fits, parameters");
    const carreau = fits.slice(2).filter((r) => r[1] === "Carreau" && r[9] === false);
    expect(carreau.length).toBeGreaterThan(0);
    for (const r of carreau) {
      const [se, low, high] = r.slice(6, 9);
      if (se === null) expect([low, high]).toEqual([null, null]);
      else for (const v of [se, low, high]) expect(Number.isFinite(v)).toBe(true);
    }
    const warnings = sheetRows(run.wb, "Warnings").slice(2).map((r) => r[1]);
    expect(warnings.some((w) => w === "SINGULAR_COVARIANCE" || w === "ONSET_NOT_DETERMINED")).toBe(true);
    for (const x of await sheetXml(run.zip)) expect(x).not.toMatch(/<v>(NaN|-?Infinity)<\/v>/);
  });
});

describe("resultsWorkbookBytes(content) on hand-made tables", () => {
  const table = (over: Partial<ResultTable>): ResultTable => ({ id: "t", title: "T", columns: [{ key: "x", header: "X", unit: "1/s", kind: "number" }, { key: "y", header: "Y", unit: "Pa·s", kind: "number" }], rows: [], ...over });

  it("NaN and ±Infinity become empty cells with a note and a warning, also appended to the warnings table", async () => {
    const warningsTable: ResultTable = { id: "warnings", title: "Warnings", columns: [{ key: "code", header: "Code", unit: "", kind: "text" }, { key: "message", header: "Message", unit: "", kind: "text" }], rows: [] };
    const { bytes, warnings } = await resultsWorkbookBytes({ tables: [table({ rows: [[1, NaN], [2, Infinity], [3, -Infinity], [4, 5]] }), warningsTable] });
    expect(warnings.map((w) => [w.code, w.severity])).toEqual([["RESULT_NOT_FINITE", "caution"]]);
    expect(warnings[0]?.message).toBe("T: 3 value(s) were not finite numbers and are left empty (Y).");
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer);
    const rows = sheetRows(wb, "T");
    expect(rows.slice(2, 6).map((r) => r[1])).toEqual([null, null, null, 5]);
    expect(rows[7]?.[0]).toBe('Note: "Y" is empty in rows 1–3 of this table: the value was not a finite number (NaN or infinite).');
    expect(sheetRows(wb, "Warnings")[2]).toEqual(["RESULT_NOT_FINITE", warnings[0]?.message]);
  });

  it("sheet names: at most 31 characters, no []:*?/\\, unique; a series on non-consecutive rows is charted from a Chart data sheet", async () => {
    const long = "A very long title: with [brackets] * and / slashes (detail)";
    const chart = { kind: "flowCurve" as const, x: "x", y: ["y"], logX: true, logY: true, seriesBy: "g" };
    const t = table({ title: long, columns: [{ key: "g", header: "G", unit: "", kind: "text" }, { key: "x", header: "X", unit: "1/s", kind: "number" }, { key: "y", header: "Y", unit: "Pa·s", kind: "number" }], rows: [["a", 1, 10], ["b", 2, 20], ["a", 3, 30], ["b", 4, 40]], chart });
    const { bytes } = await resultsWorkbookBytes({ tables: [t, { ...t, id: "u" }] });
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer);
    const names = wb.worksheets.map((w) => w.name);
    expect(names).toEqual(["A very long title, with -bracke", "Charts", "A very long title, with -brac 2", "Chart data"]);
    const data = sheetRows(wb, "Chart data");
    expect(data[0]?.[0]).toBe("Flow curve: a");
    expect(data.slice(2, 4).map((r) => [r[0], r[1]])).toEqual([[1, 10], [3, 30]]);
  });
});

describe("results workbook of the invented yield-stress cream", () => {
  it("the Herschel–Bulkley fit is recommended and recovers τy, K, n of the generator (noise 0.8 %)", async () => {
    // a yield-stress material is declared a paste: yield-stress models are in its default list
    const run = await runOut(path.join(ROOT, "workbooks/demo-cream-yield.csv"), ["--summary", "--material", "paste"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("recommended herschel-bulkley (tauY ");
    expect(sheetRows(run.wb, "Groups reduced")[2]?.[9]).toBe("Herschel–Bulkley");
    const rows = sheetRows(run.wb, "Model fits, parameters").filter((r) => r[1] === "Herschel–Bulkley" && r[2] === 1);
    const value = (name: string) => rows.find((r) => r[3] === parameterSymbol(name))?.[5] as number;
    // tolerances: 0.8 % pressure noise through Bagley and Rabinowitsch (measured: 3 %, 6 %, 2 %)
    expectClose(value("tauY"), CREAM_YIELD.tauY, { rel: 0.1 }, "tauY");
    expectClose(value("K"), CREAM_YIELD.K, { rel: 0.1 }, "K");
    expectClose(value("n"), CREAM_YIELD.n, { rel: 0.05 }, "n");
  });
});

describe("results workbook with the demo rotational curve joined (--rotational)", () => {
  it("draws the joined curve: both data sets as the join holds them and the recommended model through them; openpyxl reads the chart and its table", async () => {
    const run = await runOut(FILM, ["--rotational", path.join(ROOT, "workbooks/demo-film-grade-rotational.csv"), "--json"]);
    expect(run.code).toBe(0);
    const join = (JSON.parse(run.stdout) as { rotational: { verdict: { recommended: string } } }).rotational;
    // the chart: last of the summary charts, three series (points, points, model line)
    const charts = Object.keys(run.zip.files).filter((n) => /^xl\/charts\/chart\d+\.xml$/.test(n));
    const xml = await Promise.all(charts.map((n) => (run.zip.file(n) as JSZip.JSZipObject).async("string")));
    const joined = xml.find((x) => x.includes("<a:t>Rotational and capillary viscosity joined</a:t>")) as string;
    expect(joined).toBeDefined();
    expect((joined.match(/<c:logBase val="10"\/>/g) ?? []).length).toBe(2);
    const names = [...joined.matchAll(/<c:ser>.*?<c:tx><c:v>([^<]*)<\/c:v><\/c:tx>/gs)].map((m) => m[1]);
    const recommended = `${modelName(join.verdict.recommended)} (recommended)`;
    expect(names).toEqual(["Viscosity, capillary", "Viscosity, rotational", `Model viscosity, ${recommended}`]);
    // its table: the join's points by source, then the model on a grid over their rates
    const table = sheetRows(run.wb, "Joined curve, data and model");
    const body = table.filter((r) => typeof r[1] === "number");
    const bySource = (s: string) => body.filter((r) => r[0] === s);
    expect(bySource("capillary").length + bySource("rotational").length).toBe(body.length - bySource(recommended).length);
    expect(bySource(recommended)).toHaveLength(24);
    expect(bySource("rotational").length).toBeGreaterThan(5);
    // openpyxl (Debian python3-openpyxl), a reader independent of exceljs, sees the same table and the chart
    writeFileSync(path.join(run.dir, "joined.xlsx"), run.bytes);
    const py = JSON.parse(execFileSync("/usr/bin/python3", [path.join(__dirname, "helpers/read_xlsx.py"), path.join(run.dir, "joined.xlsx")], { encoding: "utf8", maxBuffer: 64 << 20 }))[path.join(run.dir, "joined.xlsx")] as { sheets: { name: string; values: unknown[][]; charts: number }[] };
    const pySheet = py.sheets.find((x) => x.name === "Joined curve, data and model");
    expect(pySheet?.values.filter((r) => typeof r[1] === "number")).toEqual(body);
    expect(py.sheets.find((x) => x.name === "Charts")?.charts).toBe(charts.length);
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
});

it("the src/functions and src/taskpane bundles never import exceljs, jszip or the results workbook; the CLI loads it lazily", () => {
  const files = (dir: string): string[] =>
    readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(path.join(dir, e.name)) : e.name.endsWith(".ts") ? [path.join(dir, e.name)] : []));
  for (const f of [...files(path.join(ROOT, "src/functions")), ...files(path.join(ROOT, "src/taskpane"))]) {
    const text = readFileSync(f, "utf8");
    expect(`${f}: ${/from "exceljs"|from "jszip"|resultsWorkbook|xlsxCharts/.test(text)}`).toBe(`${f}: false`);
  }
  for (const f of files(path.join(ROOT, "src/cli"))) {
    expect(`${f}: ${/^import[^;]*from "\.\.\/io\/(resultsWorkbook|xlsxCharts)"/m.test(readFileSync(f, "utf8"))}`).toBe(`${f}: false`);
  }
});
