/**
 * Every workbook the project writes, opened by two readers independent of exceljs:
 *   - openpyxl (Debian python3-openpyxl; strict: it refuses a file with a NaN cell), through
 *     test/helpers/read_xlsx.py;
 *   - LibreOffice Calc headless (Debian libreoffice-calc): every sheet converted to CSV (raw values,
 *     and as shown), and the results workbook printed to PDF (poppler-utils' pdftotext reads it).
 * The files: the three demo workbooks, and `reduce --out` results with every option on, with
 * Mooney slip, with a singular fit, and with formula-like user text. Values read back are
 * compared with the JSON output of the same run (test/helpers/resultsJson.ts).
 *
 * .ci/run installs the three packages; locally a missing tool skips these tests with a message,
 * in CI it fails (the pattern of the other system-tool tests).
 */
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import { main } from "../src/cli/main";
import { nodeIO } from "../src/cli/nodeIO";
import { DEFAULT_DIGITS, formatSignificant } from "../src/io/numberFormat";
import { parseCsv } from "../src/io/csv";
import { SHEET_SPECS, compareSheet } from "./helpers/resultsJson";
import { expectClose } from "./helpers/expectClose";
import { EVERY_OPTION, FORMULA_LIKE, newtonianCsv } from "./helpers/resultsCases";

const ROOT = path.join(__dirname, "..");
const PYTHON = "/usr/bin/python3";

function has(command: string, args: string[]): boolean {
  return spawnSync(command, args, { stdio: "pipe" }).status === 0;
}
const tools = {
  openpyxl: existsSync(PYTHON) && has(PYTHON, ["-c", "import openpyxl"]),
  soffice: has("soffice", ["--version"]),
  pdftotext: has("pdftotext", ["-v"]),
};
const missing = Object.entries(tools).filter(([, ok]) => !ok).map(([name]) => name);
// In CI (.ci/run installs python3-openpyxl libreoffice-calc poppler-utils) a missing tool is a failure, never a silent skip.
if (missing.length > 0 && process.env.CI) throw new Error(`second-reader tools missing in CI: ${missing.join(", ")}; .ci/run must install python3-openpyxl libreoffice-calc poppler-utils`);
if (missing.length > 0) console.warn(`second-reader tests skipped: ${missing.join(", ")} missing (apt-get install -y python3-openpyxl libreoffice-calc poppler-utils; .ci/run installs them)`);
const maybe = missing.length === 0 ? describe : describe.skip;

/** Same double through openpyxl: exact. LibreOffice's CSV carries 15 significant digits. */
const EXACT = { rel: 1e-15, abs: 0 };
const FIFTEEN_DIGITS = { rel: 2e-14, abs: 1e-300 };

const DEMOS = ["film-grade", "paste-slip", "cream-yield"];

interface OpenpyxlSheet {
  name: string;
  values: unknown[][];
  types: string[][];
  formats: string[][];
  formulas: [string, string][];
  charts: number;
  freeze: string | null;
}
type OpenpyxlBook = { sheets: OpenpyxlSheet[] } | { error: string };

interface Case {
  name: string;
  csv: string;
  args: string[];
  doc?: { groups: Record<string, unknown>[] } & Record<string, unknown>;
}

maybe("second readers: openpyxl and LibreOffice open every workbook the project writes", () => {
  const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-readers-"));
  const cases: Case[] = [
    { name: "every", csv: path.join(ROOT, "workbooks/demo-film-grade.csv"), args: [...EVERY_OPTION, "--json", "--meta", "$DIR/meta.json", "--report", "$DIR/every.html"] },
    { name: "slip", csv: path.join(ROOT, "workbooks/demo-paste-slip.csv"), args: ["--slip", "--json"] },
    { name: "singular", csv: path.join(dir, "newtonian.csv"), args: ["--compare", "power-law,carreau", "--json"] },
    { name: "text", csv: path.join(ROOT, "workbooks/demo-cream-yield.csv"), args: ["--json", "--meta", "$DIR/text.json"] },
  ];
  const xlsx = (c: string) => path.join(dir, `${c}.xlsx`);
  let py: Record<string, OpenpyxlBook>;
  const demoDocs: Record<string, Case["doc"]> = {};
  const soffice = (args: string[]) => execFileSync("soffice", [`-env:UserInstallation=file://${dir}/lo-profile`, "--headless", ...args], { stdio: "pipe", timeout: 240_000 });

  beforeAll(async () => {
    writeFileSync(path.join(dir, "newtonian.csv"), newtonianCsv(50));
    writeFileSync(path.join(dir, "meta.json"), JSON.stringify({ material: "invented film grade, lot 7", preheatTime: "6 min" }));
    writeFileSync(path.join(dir, "text.json"), JSON.stringify(FORMULA_LIKE));
    for (const c of cases) {
      let stdout = "";
      let stderr = "";
      const code = await main(["reduce", c.csv, ...c.args.map((a) => a.replace("$DIR", dir)), "--out", xlsx(c.name)], nodeIO({ stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) }));
      if (code !== 0) throw new Error(`${c.name}: exit ${code}: ${stderr}`);
      c.doc = JSON.parse(stdout);
    }
    for (const d of DEMOS) {
      let stdout = "";
      await main(["reduce", path.join(ROOT, `workbooks/demo-${d}.csv`), "--json"], nodeIO({ stdout: (t) => (stdout += t), stderr: () => undefined }));
      demoDocs[d] = JSON.parse(stdout);
    }
    // the old way: exceljs writing a NaN number, to show openpyxl's strictness is real
    const bad = new ExcelJS.Workbook();
    bad.addWorksheet("S").getCell(1, 1).value = NaN;
    writeFileSync(path.join(dir, "nan.xlsx"), Buffer.from(await bad.xlsx.writeBuffer()));
    const files = [...cases.map((c) => xlsx(c.name)), ...DEMOS.map((d) => path.join(ROOT, `workbooks/demo-${d}.xlsx`)), path.join(dir, "nan.xlsx")];
    py = JSON.parse(execFileSync(PYTHON, [path.join(__dirname, "helpers/read_xlsx.py"), ...files], { encoding: "utf8", maxBuffer: 64 << 20 }));
    // LibreOffice: every sheet of every workbook as CSV (raw values); the every-option results as shown and as PDF
    const csvAll = (shown: boolean) => `csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,${shown},false,false,-1`;
    mkdirSync(path.join(dir, "csv"));
    soffice(["--convert-to", csvAll(false), "--outdir", path.join(dir, "csv"), ...files.filter((f) => !f.endsWith("nan.xlsx"))]);
    mkdirSync(path.join(dir, "shown"));
    soffice(["--convert-to", csvAll(true), "--outdir", path.join(dir, "shown"), xlsx("every")]);
    soffice(["--convert-to", "pdf", "--outdir", dir, xlsx("every")]);
  }, 600_000);

  const book = (file: string): OpenpyxlSheet[] => {
    const b = py[file];
    if (!b) throw new Error(`openpyxl did not read ${file}`);
    if ("error" in b) throw new Error(`openpyxl refused ${file}: ${b.error}`);
    return b.sheets;
  };
  const sheet = (file: string, name: string): OpenpyxlSheet => {
    const s = book(file).find((x) => x.name === name);
    if (!s) throw new Error(`${file} has no sheet ${name}`);
    return s;
  };
  /** LibreOffice's CSV of one sheet, as rows of cells (text). */
  const loSheet = (folder: string, file: string, name: string): string[][] => {
    const csv = path.join(dir, folder, `${path.basename(file, ".xlsx")}-${name}.csv`);
    return parseCsv(readFileSync(csv, "utf8")).lines.map((l) => l.cells);
  };

  it("openpyxl opens every workbook; it refuses the old way of writing a NaN, so the check means something", () => {
    for (const c of cases) expect(book(xlsx(c.name)).length).toBeGreaterThan(5);
    for (const d of DEMOS) expect(book(path.join(ROOT, `workbooks/demo-${d}.xlsx`)).map((s) => s.name)).toEqual(["Raw data", "Formulas", "Notes"]);
    expect(py[path.join(dir, "nan.xlsx")]).toHaveProperty("error");
  });

  it("openpyxl: the results' numbers equal the JSON of the same run (every option, slip, singular fit)", () => {
    for (const c of cases.filter((x) => x.name !== "text")) {
      let n = 0;
      for (const spec of SHEET_SPECS) {
        const s = book(xlsx(c.name)).find((x) => x.name === spec.sheet);
        if (s) n += compareSheet(s.values, spec, c.doc as NonNullable<Case["doc"]>, EXACT, `openpyxl ${c.name}`);
      }
      expect(`${c.name}: ${n > 50}`).toBe(`${c.name}: true`);
    }
  });

  it("openpyxl: no formula in any results workbook, user text stored as text, numbers as numbers, header frozen, seven charts", () => {
    for (const c of cases) for (const s of book(xlsx(c.name))) expect(`${c.name} ${s.name}: ${s.formulas.length}`).toBe(`${c.name} ${s.name}: 0`);
    const method = sheet(xlsx("text"), "Method");
    for (const value of Object.values(FORMULA_LIKE)) {
      const at = method.values.flatMap((r, i) => r.map((v, j) => [v, i, j] as const)).find(([v]) => v === value.replace(/\r/g, "\n"));
      expect(`${JSON.stringify(value)}: ${at ? method.types[at[1]]?.[at[2]] : "missing"}`).toBe(`${JSON.stringify(value)}: s`);
    }
    const flow = sheet(xlsx("every"), "Flow curve");
    expect(flow.freeze).toBe("A3");
    expect(flow.types[2]?.slice(1, 7)).toEqual(["n", "n", "n", "n", "n", "n"]);
    expect(flow.formats[2]?.slice(1, 7)).toEqual(["0", "0.00", "0.000", "0.00", "0", "0"]);
    expect(sheet(xlsx("every"), "Charts").charts).toBe(7);
  });

  it("openpyxl: the demo workbooks store RHEO calls as _xldudf_RHEO_NAME, and RHEO.REDUCE's cached spill equals the JSON of the same CSV", () => {
    for (const d of DEMOS) {
      const f = sheet(path.join(ROOT, `workbooks/demo-${d}.xlsx`), "Formulas");
      const rheo = f.formulas.filter(([, text]) => /RHEO/.test(text));
      expect(rheo.length).toBeGreaterThan(8);
      for (const [cell, text] of rheo) expect(`${cell}: ${/^=_xldudf_RHEO_[A-Z0-9_]+\(/.test(text)}`).toBe(`${cell}: true`);
      const top = f.values.findIndex((r) => typeof r[0] === "string" && (r[0] as string).includes("(RHEO.REDUCE)")) + 1;
      const header = f.values[top] as string[];
      const doc = demoDocs[d] as NonNullable<Case["doc"]>;
      const expected: Record<string, number>[] = doc.groups.flatMap((g) => (g.flowCurve as Record<string, number>[]).map((p) => ({ ...p, temperature: g.temperature as number, dieDiameter: g.dieDiameter as number })));
      const key: Record<string, [string, (v: number) => number]> = {
        "temperature [C]": ["temperature", (v) => v + 273.15], "die_diameter [mm]": ["dieDiameter", (v) => v / 1e3], "shear_rate_apparent [1/s]": ["shearRateApparent", (v) => v],
        "wall_shear_stress [kPa]": ["wallShearStress", (v) => v * 1e3], "wall_shear_stress [Pa]": ["wallShearStress", (v) => v], "n_prime [-]": ["nPrime", (v) => v],
        "shear_rate_wall [1/s]": ["shearRateWall", (v) => v], "viscosity [Pa.s]": ["viscosity", (v) => v], "viscosity_apparent [Pa.s]": ["viscosityApparent", (v) => v],
      };
      expected.forEach((row, i) => header.forEach((h, j) => {
        if (h === null) return;
        const k = key[h];
        if (!k) throw new Error(`${d}: unexpected REDUCE column ${h}`);
        expectClose(k[1](f.values[top + 1 + i]?.[j] as number), row[k[0]] as number, { rel: 1e-12, abs: 1e-12 }, `${d} REDUCE row ${i + 1} ${h}`);
      }));
    }
  });

  it("LibreOffice: the results' numbers read back (15 digits) equal the JSON of the same run", () => {
    for (const c of cases.filter((x) => x.name !== "text")) {
      let n = 0;
      for (const spec of SHEET_SPECS) {
        if (!existsSync(path.join(dir, "csv", `${c.name}-${spec.sheet}.csv`))) continue;
        n += compareSheet(loSheet("csv", xlsx(c.name), spec.sheet), spec, c.doc as NonNullable<Case["doc"]>, FIFTEEN_DIGITS, `LibreOffice ${c.name}`);
      }
      expect(`${c.name}: ${n > 50}`).toBe(`${c.name}: true`);
    }
  });

  it("LibreOffice shows every number with its column's significant figures (the number formats render as the report writes them)", () => {
    const raw = sheet(xlsx("every"), "Flow curve").values;
    const shown = loSheet("shown", xlsx("every"), "Flow curve");
    // the figures each column asks for (src/io/resultTables.ts): 4 unless listed
    const digits: Record<string, number> = {
      "n′": 3,
      "Representative vs Rabinowitsch [%]": 3,
      "Method's own bias at n′ [%]": 3,
      "Difference beyond the bias [%]": 3,
      "± wall shear stress (k = 2) [kPa]": 2,
      "± true wall rate (k = 2) [1/s]": 2,
      "± viscosity (k = 2) [Pa·s]": 2,
    };
    let n = 0;
    raw.slice(2).forEach((r, i) => r.forEach((v, j) => {
      if (typeof v !== "number") return;
      const h = String(raw[1]?.[j]);
      expect(`${h} row ${i + 3}: ${shown[i + 2]?.[j]}`).toBe(`${h} row ${i + 3}: ${formatSignificant(v, digits[h] ?? DEFAULT_DIGITS)}`);
      n++;
    }));
    expect(n).toBeGreaterThan(250);
    expect(shown[2]?.slice(1, 7)).toEqual(["18", "32.29", "0.432", "23.93", "1349", "1794"]);
  });

  it("LibreOffice prints the Charts sheet with its seven charts drawn: four on the first page, three on the next", () => {
    const pdf = path.join(dir, "every.pdf");
    const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync("pdfinfo", [pdf], { encoding: "utf8" }))?.[1]);
    const text = Array.from({ length: pages }, (_, p) => execFileSync("pdftotext", ["-f", String(p + 1), "-l", String(p + 1), "-layout", pdf, "-"], { encoding: "utf8" }));
    const first = text.findIndex((t) => t.includes("Each chart reads its points"));
    expect(first).toBe(1); // right after the Summary page
    // charts drawn per page: the coloured ink (series markers and lines) in each quarter of the page, rendered at 20 dpi
    const drawn = [first, first + 1].map((p) => colouredQuarters(pdf, p + 1));
    expect(drawn).toEqual([[true, true, true, true], [true, true, true, false]]);
    // and which charts: the titles of the first two rows on the first page, the last three on the next
    expect(text[first]).toMatch(/Bagley plot, 190 °C, D 1 mm\s+Bagley plot, 210 °C, D 1 mm/);
    expect(text[first]).toMatch(/Bagley plot, 230 °C, D 1 mm\s+Flow curve/);
    expect(text[first + 1]).toMatch(/Viscosity\s+Flow index n′/);
    expect(text[first + 1]).toContain("Master curve");
    expect(text[first + 1]).toContain("aT × shear rate [1/s]");
  });

  /** Which quarters of a page (top left, top right, bottom left, bottom right; below a 10 % title band) hold coloured ink. */
  function colouredQuarters(pdf: string, page: number): boolean[] {
    const base = path.join(dir, `page${page}`);
    execFileSync("pdftoppm", ["-f", String(page), "-l", String(page), "-r", "20", "-singlefile", pdf, base]);
    const ppm = readFileSync(`${base}.ppm`);
    const header = /^P6\s+(\d+)\s+(\d+)\s+255\s/.exec(ppm.subarray(0, 40).toString("latin1"));
    if (!header) throw new Error("pdftoppm did not write a binary PPM");
    const [w, h] = [Number(header[1]), Number(header[2])];
    const data = ppm.subarray(header[0].length);
    const counts = [0, 0, 0, 0];
    for (let y = Math.floor(h * 0.1); y < h; y++) {
      for (let x = 0; x < w; x++) {
        const i = 3 * (y * w + x);
        const [r, g, b] = [data[i] as number, data[i + 1] as number, data[i + 2] as number];
        const q = (y < h * 0.55 ? 0 : 2) + (x < w / 2 ? 0 : 1);
        if (Math.max(r, g, b) - Math.min(r, g, b) > 60) counts[q] = (counts[q] as number) + 1;
      }
    }
    return counts.map((c) => c > 20);
  }

  it("LibreOffice: the demo workbooks' raw data read back as in the CSV, and the RHEO cells show #NAME? (docs/workbooks.md says so)", () => {
    for (const d of DEMOS) {
      const file = path.join(ROOT, `workbooks/demo-${d}.xlsx`);
      const raw = loSheet("csv", file, "Raw data");
      const csv = parseCsv(readFileSync(path.join(ROOT, `workbooks/demo-${d}.csv`), "utf8")).lines.map((l) => l.cells);
      expect(raw[0]).toEqual(csv[0]);
      csv.slice(1).forEach((r, i) => r.forEach((v, j) => expectClose(Number(raw[i + 1]?.[j]), Number(v), FIFTEEN_DIGITS, `${d} raw ${i + 2}:${j + 1}`)));
      const formulas = loSheet("csv", file, "Formulas");
      const names = formulas.flat().filter((v) => v === "#NAME?").length;
      expect(names).toBe(book(file).find((s) => s.name === "Formulas")?.formulas.filter(([, t]) => /_xldudf_RHEO/.test(t)).length ? names : -1);
      expect(names).toBeGreaterThan(50);
    }
    expect(readdirSync(path.join(dir, "csv")).length).toBeGreaterThan(40);
  });
});
