/**
 * Files the command line writes (src/cli/safeWrite.ts): an existing file is replaced only with
 * --force, never through a symlink or onto an input (same path, another spelling, a hard link),
 * a missing folder is named, and a write that fails midway (disk full: a mocked write stream, and
 * a real 64 KiB tmpfs where the machine allows mounting one) leaves the old file intact and no
 * temporary file behind.
 */
import { execFileSync } from "node:child_process";
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { RheoError } from "../src/core/errors";
import { main } from "../src/cli/main";
import { nodeIO } from "../src/cli/nodeIO";
import { OUTPUT_ERROR_CODES, checkOutput, safeWriteFile, type OutputFs, type OutputOptions } from "../src/cli/safeWrite";

const ROOT = path.join(__dirname, "..");
const DEMO = path.join(ROOT, "workbooks/demo-film-grade.csv");

function freshDir(): string {
  return fs.mkdtempSync(path.join(tmpdir(), "rheoledger-safe-"));
}

const opts = (over: Partial<OutputOptions> = {}): OutputOptions => ({ flag: "--out", force: false, inputs: [], ...over });

/** The RheoError a call throws (fails when it does not throw one). */
function refusal(call: () => void): RheoError {
  try {
    call();
  } catch (e) {
    if (e instanceof RheoError) return e;
    throw e;
  }
  throw new Error("expected a refusal, the call succeeded");
}

/** Files in `dir` other than `keep`. */
const leftovers = (dir: string, keep: string[]) => fs.readdirSync(dir).filter((f) => !keep.includes(f));

describe("safeWriteFile(path, data, options)", () => {
  it("writes a new file in an existing folder and leaves nothing else", () => {
    const dir = freshDir();
    const file = path.join(dir, "r.xlsx");
    safeWriteFile(file, new Uint8Array([1, 2, 3]), opts());
    expect([...fs.readFileSync(file)]).toEqual([1, 2, 3]);
    expect(leftovers(dir, ["r.xlsx"])).toEqual([]);
  });

  it("refuses an existing file without force (OUTPUT_EXISTS, file unchanged) and replaces it with force, keeping its permissions", () => {
    const dir = freshDir();
    const file = path.join(dir, "r.html");
    fs.writeFileSync(file, "old");
    fs.chmodSync(file, 0o640);
    const e = refusal(() => safeWriteFile(file, "new", opts({ flag: "--report" })));
    expect(e.code).toBe(OUTPUT_ERROR_CODES.exists);
    expect(e.message).toBe(`--report: "${file}" already exists; add --force to replace it, or choose another name`);
    expect(fs.readFileSync(file, "utf8")).toBe("old");
    safeWriteFile(file, "new", opts({ force: true }));
    expect(fs.readFileSync(file, "utf8")).toBe("new");
    expect(fs.statSync(file).mode & 0o777).toBe(0o640);
    expect(leftovers(dir, ["r.html"])).toEqual([]);
  });

  it("never writes through a symlink, even with force (the link and its target unchanged)", () => {
    const dir = freshDir();
    const target = path.join(dir, "precious.txt");
    fs.writeFileSync(target, "keep me");
    const link = path.join(dir, "r.xlsx");
    fs.symlinkSync(target, link);
    for (const force of [false, true]) {
      const e = refusal(() => safeWriteFile(link, "x", opts({ force })));
      expect(e.code).toBe(OUTPUT_ERROR_CODES.symlink);
      expect(e.message).toContain("is a symbolic link");
    }
    expect(fs.readFileSync(target, "utf8")).toBe("keep me");
    expect(fs.lstatSync(link).isSymbolicLink()).toBe(true);
    // a dangling link too
    const dangling = path.join(dir, "gone.xlsx");
    fs.symlinkSync(path.join(dir, "nothing-here"), dangling);
    expect(refusal(() => safeWriteFile(dangling, "x", opts({ force: true }))).code).toBe(OUTPUT_ERROR_CODES.symlink);
    expect(fs.existsSync(path.join(dir, "nothing-here"))).toBe(false);
  });

  it("never writes onto an input: the same path, another spelling of it, or a hard link to it (force or not)", () => {
    const dir = freshDir();
    const input = path.join(dir, "data.csv");
    fs.writeFileSync(input, "a,b\n");
    const hard = path.join(dir, "hard.xlsx");
    fs.linkSync(input, hard);
    const other = path.join(dir, "sub", "..", "data.csv");
    fs.mkdirSync(path.join(dir, "sub"));
    for (const [out, given] of [[input, input], [other, input], [input, path.relative(process.cwd(), input)], [hard, input]] as const) {
      for (const force of [false, true]) {
        const e = refusal(() => safeWriteFile(out, "x", opts({ force, inputs: [given] })));
        expect(e.code).toBe(OUTPUT_ERROR_CODES.input);
      }
    }
    expect(fs.readFileSync(input, "utf8")).toBe("a,b\n");
  });

  it("names a missing folder and creates nothing; refuses a folder as the output", () => {
    const dir = freshDir();
    const e = refusal(() => safeWriteFile(path.join(dir, "no", "such", "r.xlsx"), "x", opts()));
    expect(e.code).toBe(OUTPUT_ERROR_CODES.folder);
    expect(e.message).toBe(`--out: the folder "${path.join(dir, "no", "such")}" does not exist; create it first (nothing was written)`);
    expect(fs.existsSync(path.join(dir, "no"))).toBe(false);
    fs.mkdirSync(path.join(dir, "d.xlsx"));
    expect(refusal(() => safeWriteFile(path.join(dir, "d.xlsx"), "x", opts({ force: true }))).code).toBe(OUTPUT_ERROR_CODES.notFile);
  });

  it("a write failing midway (disk full) leaves the old file intact and removes the temporary file", () => {
    const dir = freshDir();
    const file = path.join(dir, "r.xlsx");
    const old = Buffer.alloc(5000, 7);
    fs.writeFileSync(file, old);
    let written = 0;
    // the real file system, except that the disk fills after 4096 bytes
    const full: OutputFs = {
      ...fs,
      writeSync: (fd, data, offset, length) => {
        if (written >= 4096) throw Object.assign(new Error("ENOSPC: no space left on device, write"), { code: "ENOSPC" });
        const n = fs.writeSync(fd, data, offset, Math.min(length, 4096 - written));
        written += n;
        return n;
      },
    };
    const e = refusal(() => safeWriteFile(file, new Uint8Array(100_000).fill(1), opts({ force: true }), full));
    expect(e.code).toBe(OUTPUT_ERROR_CODES.failed);
    expect(e.message).toBe(`--out: cannot write "${file}": the disk is full; the existing file is unchanged`);
    expect(written).toBe(4096);
    expect(fs.readFileSync(file).equals(old)).toBe(true);
    expect(leftovers(dir, ["r.xlsx"])).toEqual([]);
  });

  it("a failing flush or rename leaves the old file intact too; a new file that fails leaves nothing", () => {
    const dir = freshDir();
    const file = path.join(dir, "r.xlsx");
    fs.writeFileSync(file, "old");
    const eio = () => {
      throw Object.assign(new Error("EIO: i/o error"), { code: "EIO" });
    };
    expect(refusal(() => safeWriteFile(file, "new", opts({ force: true }), { ...fs, fsyncSync: eio })).message).toContain("input/output error; the existing file is unchanged");
    expect(refusal(() => safeWriteFile(file, "new", opts({ force: true }), { ...fs, renameSync: eio })).message).toContain("input/output error");
    expect(fs.readFileSync(file, "utf8")).toBe("old");
    const fresh = path.join(dir, "n.xlsx");
    expect(refusal(() => safeWriteFile(fresh, "new", opts(), { ...fs, fsyncSync: eio })).message).toContain("no file was left behind");
    expect(leftovers(dir, ["r.xlsx"])).toEqual([]);
  });

  it("a file that appears between the check and the write is not overwritten without force", () => {
    const dir = freshDir();
    const file = path.join(dir, "r.xlsx");
    const racing: OutputFs = {
      ...fs,
      linkSync: (existing, link) => {
        fs.writeFileSync(link, "someone else's");
        fs.linkSync(existing, link);
      },
    };
    expect(refusal(() => safeWriteFile(file, "mine", opts(), racing)).code).toBe(OUTPUT_ERROR_CODES.exists);
    expect(fs.readFileSync(file, "utf8")).toBe("someone else's");
    expect(leftovers(dir, ["r.xlsx"])).toEqual([]);
  });

  it("file systems without hard links fall back to a rename", () => {
    const dir = freshDir();
    const file = path.join(dir, "r.xlsx");
    const noLinks: OutputFs = { ...fs, linkSync: () => { throw Object.assign(new Error("EPERM"), { code: "EPERM" }); } };
    safeWriteFile(file, "mine", opts(), noLinks);
    expect(fs.readFileSync(file, "utf8")).toBe("mine");
    expect(leftovers(dir, ["r.xlsx"])).toEqual([]);
  });
});

describe("a real full disk (64 KiB tmpfs; needs root and mount)", () => {
  const mountPoint = fs.mkdtempSync(path.join(tmpdir(), "rheoledger-tmpfs-"));
  let mounted = false;
  beforeAll(() => {
    try {
      execFileSync("mount", ["-t", "tmpfs", "-o", "size=64k", "tmpfs", mountPoint], { stdio: "pipe" });
      mounted = true;
    } catch {
      console.warn("tmpfs disk-full test skipped: cannot mount a tmpfs here (needs root); the mocked disk-full test above covers the same path");
    }
  });
  afterAll(() => {
    if (mounted) execFileSync("umount", [mountPoint], { stdio: "pipe" });
    fs.rmdirSync(mountPoint);
  });

  it("writing 200 KB onto a 64 KiB disk fails with a clear message and keeps the old file", () => {
    if (!mounted) return;
    const file = path.join(mountPoint, "r.xlsx");
    fs.writeFileSync(file, "old results");
    const e = refusal(() => safeWriteFile(file, new Uint8Array(200_000).fill(9), opts({ force: true })));
    expect(e.message).toBe(`--out: cannot write "${file}": the disk is full; the existing file is unchanged`);
    expect(fs.readFileSync(file, "utf8")).toBe("old results");
    expect(fs.readdirSync(mountPoint)).toEqual(["r.xlsx"]);
  });
});

describe("rheoledger reduce … --out / --report through the real file system", () => {
  async function run(args: string[]) {
    let stdout = "";
    let stderr = "";
    const code = await main(args, nodeIO({ stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) }));
    return { code, stdout, stderr };
  }

  it("refuses an existing --out (exit 1, before the reduction, the file unchanged), replaces it with --force", async () => {
    const dir = freshDir();
    const out = path.join(dir, "r.xlsx");
    fs.writeFileSync(out, "old");
    const refused = await run(["reduce", DEMO, "--out", out]);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toBe(`rheoledger: --out: "${out}" already exists; add --force to replace it, or choose another name\n`);
    expect(refused.stdout).toBe("");
    expect(fs.readFileSync(out, "utf8")).toBe("old");
    const forced = await run(["reduce", DEMO, "--out", out, "--force", "--summary"]);
    expect(forced.code).toBe(0);
    expect(fs.readFileSync(out).subarray(0, 2).toString()).toBe("PK");
  });

  it("refuses a report onto the --meta file (a hard link named .html) and an --out whose folder is missing", async () => {
    const dir = freshDir();
    const meta = path.join(dir, "meta.json");
    fs.writeFileSync(meta, JSON.stringify({ material: "invented grade" }));
    const report = path.join(dir, "report.html");
    fs.linkSync(meta, report);
    const onInput = await run(["reduce", DEMO, "--report", report, "--meta", meta, "--force"]);
    expect(onInput.code).toBe(1);
    expect(onInput.stderr).toContain(`--report: "${report}" is the input file "${meta}"`);
    expect(fs.readFileSync(meta, "utf8")).toContain("invented grade");
    const missing = await run(["reduce", DEMO, "--out", path.join(dir, "later", "r.xlsx")]);
    expect(missing.code).toBe(1);
    expect(missing.stderr).toContain(`the folder "${path.join(dir, "later")}" does not exist`);
    expect(fs.existsSync(path.join(dir, "later"))).toBe(false);
  });

  it("--force or --meta without an output file, and --out equal to --report, are usage errors (exit 2)", async () => {
    expect((await run(["reduce", DEMO, "--force"])).code).toBe(2);
    expect((await run(["reduce", DEMO, "--meta", "m.json"])).stderr).toContain("--meta: applies only with --out or --report");
    expect((await run(["reduce", DEMO, "--report", "r.txt"])).stderr).toContain('--report: expected a file name ending in .html, got "r.txt"');
  });

  it("checkOutput is what writeFile checks: the same refusals before any work", () => {
    const dir = freshDir();
    const file = path.join(dir, "x.xlsx");
    fs.writeFileSync(file, "");
    expect(refusal(() => checkOutput(file, opts())).code).toBe(OUTPUT_ERROR_CODES.exists);
    expect(() => checkOutput(file, opts({ force: true }))).not.toThrow();
  });
});
