/**
 * `rheoledger reduce FILE`: the input side of the command line, in-process (files streamed through
 * the same chunked reader the process uses) and as a process (bin/rheoledger.js).
 */
import { execFileSync, spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { main } from "../src/cli/main";
import pkg from "../package.json";

const FIXTURE = (name: string) => join(__dirname, "fixtures", "input", name);

/** Runs main with files from disk, or from `files` (bytes), streamed in 1 KB chunks. */
async function run(args: string[], files: Record<string, Uint8Array> = {}) {
  let stdout = "";
  let stderr = "";
  const bytesOf = (p: string) => files[p] ?? new Uint8Array(readFileSync(p));
  const code = await main(args, {
    readFile: (p) => new TextDecoder().decode(bytesOf(p)),
    *readChunks(p) {
      const b = bytesOf(p);
      for (let i = 0; i < b.length; i += 1024) yield b.subarray(i, i + 1024);
    },
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  });
  return { code, stdout, stderr };
}

describe("rheoledger --version", () => {
  test("prints the package version", async () => {
    const r = await run(["--version"]);
    expect(r).toEqual({ code: 0, stdout: `rheoledger ${pkg.version}\n`, stderr: "" });
  });
});

describe("rheoledger reduce: input formats", () => {
  test("an xlsx workbook: the first sheet, reported in the JSON document with the row account", async () => {
    const r = await run(["reduce", FIXTURE("run.xlsx"), "--json"]);
    expect(r.stderr).toBe("");
    const doc = JSON.parse(r.stdout);
    expect(doc.input).toEqual({ kind: "xlsx", sheet: "Raw", decimalMark: ",", });
    expect(doc.rows).toEqual({ rowsRead: 42, rowsUsed: 42, rowsSkipped: {} });
    expect(doc.groups).toHaveLength(2);
  });
  test("--sheet picks a sheet; the text output names the input and counts its rows", async () => {
    const r = await run(["reduce", FIXTURE("run.xlsx"), "--sheet", "230 C only"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^Input: .*run\.xlsx, sheet "230 C only"; 21 rows read: 21 used\./);
  });
  test("a Windows-1252 CSV with semicolons and decimal commas: read, and the encoding named in the warnings", async () => {
    const r = await run(["reduce", FIXTURE("windows-1252.csv"), "--json"]);
    const doc = JSON.parse(r.stdout);
    expect(doc.input).toEqual({ kind: "csv", encoding: "windows-1252", delimiter: ";", decimalMark: "," });
    expect(doc.warnings.map((w: { code: string }) => w.code)).toContain("INPUT_ENCODING");
  });
  test("--sheet on a CSV and a .xlsx name holding text are refused", async () => {
    expect((await run(["reduce", FIXTURE("plain.csv"), "--sheet", "Raw"])).stderr).toMatch(/--sheet: .*plain\.csv is a text \(CSV\) file, not a workbook/);
    const text = new Uint8Array(readFileSync(FIXTURE("plain.csv")));
    expect((await run(["reduce", "data.xlsx"], { "data.xlsx": text })).stderr).toBe("rheoledger: data.xlsx: is named .xlsx but holds text, not a workbook; rename it .csv if it is a CSV file\n");
  });
  test("a PDF says it is a PDF, not 'found: \"%PDF\"'", async () => {
    const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj\n<<>>\nendobj\n");
    const r = await run(["reduce", "report.pdf"], { "report.pdf": pdf });
    expect(r.code).toBe(1);
    expect(r.stderr).toBe("rheoledger: report.pdf: is a PDF document, not a table; give a CSV (or tab-separated) text file or an .xlsx workbook\n");
  });
  test("a missing file is named, without a stack", async () => {
    const r = await run(["reduce", "no-such-file.csv"]);
    expect(r.code).toBe(1);
    expect(r.stderr).toBe("rheoledger: no-such-file.csv: cannot be read: no such file\n");
  });
  test("terminal escape sequences in a header never reach the terminal", async () => {
    const evil = new TextEncoder().encode("die_diameter [mm],die_length [mm],\u001b]0;owned\u0007\u001b[2Jflow [x],pressure [bar]\n1,10,1,100\n");
    const r = await run(["reduce", "evil.csv"], { "evil.csv": evil });
    expect(r.code).toBe(1);
    // eslint-disable-next-line no-control-regex
    expect(r.stderr + r.stdout).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/);
  });
});

describe("rheoledger as a process", () => {
  test("node bin/rheoledger.js --version", () => {
    expect(execFileSync(process.execPath, ["bin/rheoledger.js", "--version"], { encoding: "utf8" })).toBe(`rheoledger ${pkg.version}\n`);
  });
  test("reducing a CSV never loads the workbook library; reading an xlsx does", () => {
    const loaded = (file: string) => {
      const probe = "process.on('exit',()=>process.stderr.write('exceljs:'+Object.keys(require.cache).some((k)=>k.includes('node_modules/exceljs/'))+'\\n'))";
      const r = spawnSync(process.execPath, ["-e", `${probe};process.argv.splice(1,0,'bin/rheoledger.js');require('./bin/rheoledger.js')`, "reduce", file, "--summary"], { encoding: "utf8" });
      return /exceljs:(true|false)/.exec(r.stderr)?.[1];
    };
    expect(loaded(FIXTURE("plain.csv"))).toBe("false");
    expect(loaded(FIXTURE("run.xlsx"))).toBe("true");
  });
});
