/**
 * `rheoledger reduce` with the fit across temperatures (--master, --model cross-wlf), the material
 * class, the rotational join (--rotational) and fits whose numbers are undefined (no NaN in JSON or
 * in the workbook, which openpyxl and exceljs both read back).
 *
 * The demo file is generated (scripts/demo/filmGrade.ts) from a Carreau–Yasuda law, η0 = 6000 Pa·s
 * at 210 °C, shifted with an Arrhenius activation energy of 55 kJ/mol, 0.5 % noise on every
 * pressure; its lowest true wall rate (about 24 1/s) lies far above the onset of shear thinning
 * (1/λ ≈ 1.7 1/s), so no single curve, and not the three together, reach the zero-shear plateau.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import { main } from "../src/cli/main";
import { FILM_GRADE, filmGradeViscosity } from "../scripts/demo/filmGrade";
import { filmGradeRotationalCsv } from "../scripts/demo/filmGradeRotational";
import { findPython } from "../scripts/findPython";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

const DEMO = "workbooks/demo-film-grade.csv";

async function run(args: string[], files: Record<string, string> = {}, written?: Map<string, Uint8Array | string>) {
  let stdout = "";
  let stderr = "";
  const code = await main(args, {
    readFile: (p) => (p in files ? (files[p] as string) : readFileSync(p, "utf8")),
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    writeFile: (p, data) => written?.set(p, data),
  });
  return { code, stdout, stderr };
}

describe("rheoledger reduce DEMO --master carreau-yasuda --shift arrhenius --tref \"210 C\" --json", () => {
  test('adds the top-level "masterFit" as issue 14 spells it, in SI', async () => {
    const { code, stdout, stderr } = await run(["reduce", DEMO, "--master", "carreau-yasuda", "--shift", "arrhenius", "--tref", "210 C", "--json"]);
    expect([code, stderr]).toEqual([0, ""]);
    const m = JSON.parse(stdout).masterFit;
    expect(Object.keys(m).slice(0, 8)).toEqual(["model", "law", "referenceTemperature", "parameters", "standardErrors", "activationEnergy", "converged", "determined"]);
    expect([m.model, m.law, m.referenceTemperature, m.converged]).toEqual(["carreau-yasuda", "arrhenius", 483.15, true]);
    expect(Object.keys(m.parameters)).toEqual(["eta0", "etaInf", "lambda", "n", "a"]);
    expect(Object.keys(m.determined)).toEqual(["eta0", "etaInf", "lambda", "n", "a", "activationEnergy"]);
    // the generator's 55 kJ/mol (scripts/demo/filmGrade.ts) within 2 %
    expectClose(m.activationEnergy, FILM_GRADE.activationEnergy, { rel: 0.02 }, "Ea");
    expectClose(m.parameters.n, FILM_GRADE.n, { abs: 0.02 }, "n");
    // the demo never reaches the plateau: η0 and λ are reported as not determined, with η0's supported bound
    expect(m.determined.eta0).toBe(false);
    expect(m.determined.activationEnergy).toBe(true);
    expect(m.undetermined.eta0.supportedBound.side).toBe("lower");
    expect(m.fixed).toEqual(["etaInf"]);
    expect(m).not.toHaveProperty("c1");
  });
  test("--master cross-wlf needs no --shift: WLF law with c1, c2; moulding parameter names", async () => {
    const { code, stdout, stderr } = await run(["reduce", DEMO, "--master", "cross-wlf", "--d2", "-50 C", "--json"]);
    expect([code, stderr]).toEqual([0, ""]);
    const m = JSON.parse(stdout).masterFit;
    expect([m.model, m.law]).toEqual(["cross-wlf", "wlf"]);
    expect(Object.keys(m.parameters)).toEqual(["n", "tauStar", "D1", "D2", "D3", "A1", "A2tilde"]);
    expectClose(m.referenceTemperature, 223.15, { rel: 1e-12 });
    expect(m.parameters.D2).toBe(m.referenceTemperature);
    expect([m.c2, m.parameters.A2tilde, m.parameters.D3]).toEqual([51.6, 51.6, 0]);
    expectClose(m.c1, m.parameters.A1 / Math.LN10, { rel: 1e-12 });
    expect(m).not.toHaveProperty("activationEnergy");
  });
  test("--model cross-wlf is accepted and fitted across the temperatures (no per-group fit)", async () => {
    const { code, stdout } = await run(["reduce", DEMO, "--model", "cross-wlf", "--d2", "-50 C", "--json"]);
    expect(code).toBe(0);
    const doc = JSON.parse(stdout);
    expect(doc.masterFit.model).toBe("cross-wlf");
    expect(doc.groups[0]).not.toHaveProperty("fit");
  });
  test("--help lists cross-wlf under --model, and --master, --material, --d2, --rotational", async () => {
    const { stdout } = await run(["--help"]);
    expect(stdout).toMatch(/--model VALUE\s+.*casson, cross-wlf/);
    for (const flag of ["--master", "--material", "--d2", "--rotational"]) expect(stdout).toContain(`${flag} VALUE`);
  });
  const errors: [string, string[], RegExp][] = [
    ["--master without its law", ["--master", "cross"], /^rheoledger: --shift: is the temperature law of --master cross: arrhenius or wlf/],
    ["--d2 without Cross-WLF", ["--d2", "-20 C"], /^rheoledger: --d2: is Cross-WLF's D2 \(T\*\); it goes with --master cross-wlf/],
    ["--tref with --master cross-wlf alone", ["--master", "cross-wlf", "--tref", "210 C"], /^rheoledger: --tref: is the reference temperature of --shift; give --shift arrhenius or wlf too \(Cross-WLF's own reference temperature is D2: --d2\)/],
    ["an unknown model for --master", ["--master", "bingham"], /^rheoledger: --master: unknown choice "bingham"; accepted: power-law, cross, carreau, carreau-yasuda, cross-wlf/],
    ["an unknown material", ["--material", "gel"], /^rheoledger: --material: unknown choice "gel"; accepted: melt, paste/],
  ];
  for (const [name, flags, message] of errors) {
    test(`error: ${name} (exit 1, nothing on stdout)`, async () => {
      const { code, stdout, stderr } = await run(["reduce", DEMO, ...flags]);
      expect({ code, stdout }).toEqual({ code: 1, stdout: "" });
      expect(stderr).toMatch(message);
    });
  }
});

describe("rheoledger reduce DEMO --rotational FILE.csv", () => {
  // Complex viscosity from the demo's own generating law at 210 °C (Cox–Merz: |η*|(ω) = η(γ̇ = ω)), 0.01–30 rad/s.
  const eta = filmGradeViscosity(483.15);
  const omega = Array.from({ length: 15 }, (_, i) => 0.01 * Math.pow(3000, i / 14));
  const rotational = ["angular_frequency [rad/s],complex_viscosity [Pa.s],temperature [C]", ...omega.map((w) => `${w},${eta(w)},210`)].join("\n") + "\n";
  test('adds "rotational": overlap within tolerance, η0 of the joined curve determined and near the generating 6000 Pa·s', async () => {
    const { code, stdout, stderr } = await run(["reduce", DEMO, "--rotational", "rot.csv", "--json"], { "rot.csv": rotational });
    expect([code, stderr]).toEqual([0, ""]);
    const doc = JSON.parse(stdout);
    const r = doc.rotational;
    expect(r.groups).toEqual(["210 °C, D 1 mm"]);
    expect(r.overlap.withinTolerance).toBe(true);
    expectClose(r.overlap.ratio, 1, { abs: 0.05 });
    expect(r.verdict.recommended).toBe("carreau-yasuda");
    expect(r.verdict.fit.determined.eta0).toBe(true);
    expectClose(r.verdict.fit.parameters.eta0, FILM_GRADE.eta0, { rel: 0.03 }, "joined eta0");
    expect(doc.warnings.map((w: { code: string }) => w.code)).toContain("COX_MERZ_APPLIED");
  });
  test("the bundled demo rotational curve (workbooks/, 1 % noise) as the file is committed: it is the generator's, and the join gives η0 within 3 % of 6000 Pa·s", async () => {
    const committed = readFileSync("workbooks/demo-film-grade-rotational.csv", "utf8");
    expect(committed).toBe(filmGradeRotationalCsv());
    const { code, stdout } = await run(["reduce", DEMO, "--rotational", "rot.csv", "--json"], { "rot.csv": committed });
    expect(code).toBe(0);
    const r = JSON.parse(stdout).rotational;
    expect(r.overlap.withinTolerance).toBe(true);
    expect(r.verdict.fit.determined.eta0).toBe(true);
    expectClose(r.verdict.fit.parameters.eta0, FILM_GRADE.eta0, { rel: 0.03 }, "joined eta0 from the noisy demo curve");
  });
  test("a rotational file with text in a cell names the flag, the column and the line", async () => {
    const { code, stdout, stderr } = await run(["reduce", DEMO, "--rotational", "rot.csv"], { "rot.csv": "angular_frequency [rad/s],complex_viscosity [Pa.s],temperature [C]\n0.1,abc,210\n" });
    expect({ code, stdout }).toEqual({ code: 1, stdout: "" });
    expect(stderr).toBe('rheoledger: --rotational complex_viscosity [Pa.s] (column 2): line 2 is text "abc", not a number\n');
  });
  test("a rotational file that cannot be read names the file", async () => {
    const { code, stderr } = await run(["reduce", DEMO, "--rotational", "missing-rotational.csv"]);
    expect(code).toBe(1);
    expect(stderr).toMatch(/^rheoledger: missing-rotational\.csv: cannot be read/);
  });
});

describe("no NaN anywhere: fits whose numbers are undefined", () => {
  // A Newtonian liquid, 1000 Pa·s, dies L = 10 and 20 mm of 1 mm bore, e = 2 (Hagen–Poiseuille + Bagley):
  // exact data make the Newtonian fit exact (SSR = 0: AIC −∞, R² undefined) and Casson's and Sisko's
  // covariance singular (parameters with no influence on a Newtonian curve).
  const lines = ["die_diameter [mm],die_length [mm],flow_rate [mm3/s],pressure [Pa]"];
  for (const L of [10, 20]) for (const rate of [10, 30, 100, 300]) lines.push(`1,${L},${flowRateForApparentShearRate(rate, 1e-3) * 1e9},${2 * 1000 * rate * ((2 * L) / 1 + 2)}`);
  const csv = lines.join("\n") + "\n";
  test("JSON: undefined numbers are null and the warnings say why", async () => {
    const { code, stdout } = await run(["reduce", "newtonian.csv", "--model", "casson", "--material", "paste", "--json", "--si"], { "newtonian.csv": csv });
    expect(code).toBe(0);
    expect(stdout).not.toMatch(/NaN|Infinity/);
    const doc = JSON.parse(stdout);
    const fit = doc.groups[0].fit;
    expect(Object.values(fit.standardErrors)).toEqual([null, null]);
    expect(fit.r2).toBeNull();
    expect(doc.warnings.map((w: { code: string }) => w.code)).toEqual(expect.arrayContaining(["SINGULAR_COVARIANCE", "R2_UNDEFINED"]));
  });
  test("a workbook with singular fits: empty cells with a note; exceljs and openpyxl read it back", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-nan-"));
    const out = path.join(dir, "singular.xlsx");
    const written = new Map<string, Uint8Array | string>();
    const { code } = await run(["reduce", "newtonian.csv", "--compare", "newtonian,casson,sisko", "--material", "paste", "--si", "--out", out], { "newtonian.csv": csv }, written);
    expect(code).toBe(0);
    const bytes = written.get(out) as Uint8Array;
    expect(bytes).toBeInstanceOf(Uint8Array);
    writeFileSync(out, bytes);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer);
    // the parameter sheet (src/io/resultTables.ts "Model fits, parameters"): title row, header row, then rows
    const fits = wb.getWorksheet("Model fits, parameters") as ExcelJS.Worksheet;
    const rows: unknown[][] = [];
    fits.eachRow({ includeEmpty: true }, (r) => rows.push((r.values as unknown[]).slice(1)));
    const header = rows[1] as string[];
    const col = (h: string) => header.findIndex((x) => typeof x === "string" && x.startsWith(h));
    const casson = rows.filter((r) => r[col("Model")] === "Casson");
    expect(casson.length).toBe(2);
    for (const r of casson) {
      expect(r[col("Standard error")] ?? null).toBeNull();
      expect(String(r[col("Note")])).toContain("no standard error: the data cannot separate it (singular covariance)");
    }
    wb.eachSheet((ws) => ws.eachRow((r) => (r.values as unknown[]).forEach((v) => typeof v === "number" && expect(Number.isFinite(v)).toBe(true))));
    // openpyxl (Python) refuses a NaN cell; it must open the file and see the same empty cells
    const py = findPython(["openpyxl"]);
    if (py.python === null) throw new Error(`openpyxl is needed for this check (Debian: apt-get install python3-openpyxl): ${py.reason}`);
    const script = "import openpyxl,sys,json;wb=openpyxl.load_workbook(sys.argv[1]);ws=wb['Model fits, parameters'];print(json.dumps([[c.value for c in r] for r in ws.iter_rows()], default=str))";
    const read = spawnSync(py.python, ["-c", script, out], { encoding: "utf8" });
    expect(read.stderr).toBe("");
    const pyRows = JSON.parse(read.stdout) as unknown[][];
    expect(pyRows.filter((r) => r[col("Model")] === "Casson").map((r) => r[col("Standard error")])).toEqual([null, null]);
  });
});
