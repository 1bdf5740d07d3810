/**
 * bin/rheoledger.js runs the command-line bundle through V8's code cache (see the bin's header):
 * the first real command writes the cache beside the bundle, later runs use it, a cache V8 refuses
 * is rewritten, and a cache that cannot be written never stops the command. Each case runs a copy
 * of the bin and the built bundle in a folder of its own (no src/: no rebuild), so the checkout's
 * dist/ is not touched.
 */
import { spawnSync } from "node:child_process";
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";

const TABLE = [
  "die_diameter [mm],die_length [mm],flow_rate [mm3/s],pressure [bar]",
  "1,10,10,52.1",
  "1,10,100,131.2",
  "1,20,10,98.3",
  "1,20,100,247.5",
  "1,30,10,144.6",
  "1,30,100,363.9",
].join("\n");

const root = path.join(__dirname, "..");
const folders: string[] = [];

beforeAll(() => {
  // the checkout's bin rebuilds dist/cli.cjs when it is missing or older than src/
  expect(spawnSync(process.execPath, [path.join(root, "bin", "rheoledger.js"), "--version"]).status).toBe(0);
});

afterAll(() => {
  for (const f of folders) rmSync(f, { recursive: true, force: true });
});

/** A folder with bin/rheoledger.js, dist/cli.cjs and a small table. */
function install(): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), "rheoledger-cache-"));
  folders.push(dir);
  mkdirSync(path.join(dir, "bin"));
  mkdirSync(path.join(dir, "dist"));
  copyFileSync(path.join(root, "bin", "rheoledger.js"), path.join(dir, "bin", "rheoledger.js"));
  copyFileSync(path.join(root, "dist", "cli.cjs"), path.join(dir, "dist", "cli.cjs"));
  writeFileSync(path.join(dir, "table.csv"), TABLE + "\n");
  return dir;
}

function run(dir: string, args: string[], env: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [path.join(dir, "bin", "rheoledger.js"), ...args], { cwd: dir, encoding: "utf8", env: { ...process.env, RHEOLEDGER_TIMING: "1", ...env } });
  return { status: r.status, stdout: r.stdout, cache: /code cache (\w+)(, written at exit)?/.exec(r.stderr), stderr: r.stderr };
}

const caches = (dir: string) => readdirSync(path.join(dir, "dist")).filter((n) => n.endsWith(".v8cache"));
const leftovers = (dir: string) => readdirSync(path.join(dir, "dist")).filter((n) => n.endsWith(".tmp"));

describe("the command line's code cache", () => {
  test("the first reduce writes it, the next run uses it, and the output is the same as without it", () => {
    const dir = install();
    const plain = run(dir, ["reduce", "table.csv", "--json"], { RHEOLEDGER_CODE_CACHE: "0" });
    expect(plain.status).toBe(0);
    expect(plain.cache).toBeNull();
    expect(caches(dir)).toEqual([]);

    const first = run(dir, ["reduce", "table.csv", "--json"]);
    expect(first.status).toBe(0);
    expect(first.cache?.[1]).toBe("none");
    expect(first.cache?.[2]).toBe(", written at exit");
    expect(caches(dir)).toHaveLength(1);
    expect(caches(dir)[0]).toContain(`-${process.version}-${process.arch}.v8cache`);

    const second = run(dir, ["reduce", "table.csv", "--json"]);
    expect(second.status).toBe(0);
    expect(second.cache?.[1]).toBe("used");
    expect(second.cache?.[2]).toBeUndefined();
    expect(second.stdout).toBe(plain.stdout);
    expect(first.stdout).toBe(plain.stdout);
    expect(leftovers(dir)).toEqual([]);
  });

  test("--version does not write a cache; a cache V8 refuses is rewritten; a cache of an older bundle is removed", () => {
    const dir = install();
    expect(run(dir, ["--version"]).cache?.[2]).toBeUndefined();
    expect(caches(dir)).toEqual([]);
    run(dir, ["reduce", "table.csv"]);
    const [name] = caches(dir) as [string];
    const file = path.join(dir, "dist", name);
    writeFileSync(file, Buffer.from("not a code cache"));
    const old = path.join(dir, "dist", ".cli.1-2-v0-x.v8cache");
    writeFileSync(old, "left by an older bundle");
    const r = run(dir, ["reduce", "table.csv"]);
    expect(r.status).toBe(0);
    expect(r.cache?.[1]).toBe("rejected");
    expect(readFileSync(file).length).toBeGreaterThan(1000);
    expect(existsSync(old)).toBe(false);
    expect(run(dir, ["reduce", "table.csv"]).cache?.[1]).toBe("used");
  });

  test("a cache that cannot be written leaves the command's result and exit code alone", () => {
    const dir = install();
    run(dir, ["reduce", "table.csv"]);
    const [name] = caches(dir) as [string];
    const file = path.join(dir, "dist", name);
    rmSync(file);
    mkdirSync(path.join(file, "in-the-way"), { recursive: true }); // a folder where the cache file goes
    const r = run(dir, ["reduce", "table.csv", "--json"]);
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).groups.length).toBe(1);
    expect(leftovers(dir)).toEqual([]);
    expect(r.stderr).not.toMatch(/error/i);
  });
});
