/**
 * Security properties of the add-in, checked on what ships (dist/ from `npm run build`, the
 * manifest) and on the sources of the add-in (src/core, src/io, src/functions, src/taskpane):
 *
 * - no dynamic code: no eval, no Function constructor, no string timers (and eslint keeps
 *   no-eval, no-implied-eval and no-new-func on);
 * - no network use of our own: no fetch, XMLHttpRequest, WebSocket, EventSource, sendBeacon or
 *   script injection; the only remote address anywhere is the Office host script
 *   (https://appsforoffice.microsoft.com/lib/1/hosted/office.js), all else is localhost;
 * - the pane page carries a Content-Security-Policy that allows scripts only from itself and the
 *   Office host, and no inline script;
 * - the manifest asks for ReadWriteDocument and nothing wider;
 * - the CI audit of production dependencies (scripts/audit.mjs, run by .ci/run) fails on high or
 *   critical findings and only reports an unreachable audit service.
 */
import fs from "fs";
import os from "os";
import path from "path";
import { execFileSync, spawnSync } from "child_process";

const root = path.join(__dirname, "..");
const dist = path.join(root, "dist");
const OFFICE_HOST_SCRIPT = "https://appsforoffice.microsoft.com/lib/1/hosted/office.js";
const OFFICE_HOST_ORIGIN = "https://appsforoffice.microsoft.com";

function built(file: string): string {
  const p = path.join(dist, file);
  if (!fs.existsSync(p)) throw new Error(`${p} is missing: run \`npm run build\` before the tests`);
  return fs.readFileSync(p, "utf8");
}

/** Every .ts file under the add-in's source folders. */
function addinSources(): { file: string; code: string }[] {
  const out: { file: string; code: string }[] = [];
  const walk = (dir: string) => {
    for (const name of fs.readdirSync(dir)) {
      const p = path.join(dir, name);
      if (fs.statSync(p).isDirectory()) walk(p);
      else if (/\.ts$/.test(name)) out.push({ file: path.relative(root, p), code: stripComments(fs.readFileSync(p, "utf8")) });
    }
  };
  for (const area of ["src/core", "src/io", "src/functions", "src/taskpane"]) walk(path.join(root, area));
  return out;
}

/** Removes block and line comments (roughly: enough to scan code for identifiers). */
function stripComments(code: string): string {
  return code.replace(/\/\*[\s\S]*?\*\//g, "").replace(/(^|[^:"'`\\])\/\/.*$/gm, "$1");
}

/** Dynamic code and network use, as they appear in source or in minified bundles. */
const FORBIDDEN: [string, RegExp][] = [
  ["eval", /(^|[^\w$.])eval\s*\(/],
  ["Function constructor", /new\s+Function\s*\(|(^|[^\w$.])Function\s*\(\s*["'`]/],
  ["string timer", /set(Timeout|Interval)\s*\(\s*["'`]/],
  ["fetch", /(^|[^\w$])fetch\s*\(/],
  ["XMLHttpRequest", /XMLHttpRequest/],
  ["WebSocket", /WebSocket/],
  ["EventSource", /EventSource/],
  ["sendBeacon", /sendBeacon/],
  ["importScripts", /importScripts/],
  ["script injection", /createElement\(\s*["'`]script["'`]\s*\)|document\.write\s*\(/],
];

function forbiddenUses(files: { file: string; code: string }[]): string[] {
  const found: string[] = [];
  for (const { file, code } of files) for (const [what, re] of FORBIDDEN) if (re.test(code)) found.push(`${file}: ${what}`);
  return found;
}

describe("no dynamic code and no network use", () => {
  test("the built bundles (our code and every library in them)", () => {
    const bundles = ["functions.js", "taskpane.js", "core.js", "runtime.js"].map((file) => ({ file: `dist/${file}`, code: built(file) }));
    expect(forbiddenUses(bundles)).toEqual([]);
  });

  test("the add-in's sources", () => {
    const sources = addinSources();
    expect(sources.length).toBeGreaterThan(20);
    expect(forbiddenUses(sources)).toEqual([]);
  });

  test("the scan finds what it looks for (the patterns are not dead)", () => {
    const samples = ['eval("1")', 'x=new Function("a","return a")', 'setTimeout("go()",1)', "fetch(url)", "new XMLHttpRequest", "new WebSocket(u)", "navigator.sendBeacon(u,d)", 'document.createElement("script")'];
    expect(samples.map((code) => forbiddenUses([{ file: "sample", code }]).length)).toEqual(samples.map(() => 1));
    expect(forbiddenUses([{ file: "sample", code: "const medieval = retrieval(x); a.evaluate(b); prefetch(c)" }])).toEqual([]);
  });

  test("eslint keeps no-eval, no-implied-eval and no-new-func as errors for the add-in's code", () => {
    for (const file of ["src/functions/functions.ts", "src/taskpane/taskpane.ts", "src/core/reduce.ts"]) {
      const config = JSON.parse(
        execFileSync(process.execPath, [path.join(root, "node_modules/eslint/bin/eslint.js"), "--print-config", file], { cwd: root, encoding: "utf8" }),
      ) as { rules: Record<string, unknown> };
      for (const rule of ["no-eval", "no-implied-eval", "no-new-func"]) {
        const setting = config.rules[rule];
        const level = Array.isArray(setting) ? setting[0] : setting;
        expect({ file, rule, error: level === 2 || level === "error" }).toEqual({ file, rule, error: true });
      }
    }
  });
});

describe("remote addresses", () => {
  /** Every http(s) URL in a text, minus XML and SVG namespace names (identifiers, never fetched). */
  function urls(text: string): string[] {
    const all = (text.match(/https?:\/\/[^\s"'<>`)\\;]+/g) ?? []).map((u) => u.replace(/[.,]+$/, "")); // no sentence punctuation
    return all.filter((u) => !/^http:\/\/(schemas\.microsoft\.com\/|www\.w3\.org\/)/.test(u));
  }
  const allowed = (u: string) => u === OFFICE_HOST_SCRIPT || u === OFFICE_HOST_ORIGIN || /^https:\/\/localhost(:\d+)?(\/|$)/.test(u);

  test("every URL in the built pages, bundles and manifests is localhost or the Office host script", () => {
    const files = fs.readdirSync(dist).filter((f) => /\.(html|js|xml|json)$/.test(f) && !f.endsWith(".map") && f !== "cli.cjs");
    expect(files).toEqual(expect.arrayContaining(["functions.js", "taskpane.js", "taskpane.html", "manifest.xml"]));
    const found = [...files.map((f) => ({ f: `dist/${f}`, text: built(f) })), { f: "manifest.xml", text: fs.readFileSync(path.join(root, "manifest.xml"), "utf8") }]
      .flatMap(({ f, text }) => urls(text).map((u) => `${f}: ${u}`));
    expect(found.filter((entry) => !allowed(entry.slice(entry.indexOf(": ") + 2)))).toEqual([]);
  });

  test("the namespace exemption covers only namespace names", () => {
    expect(urls('xmlns="http://schemas.microsoft.com/office/appforoffice/1.1" src="http://evil.example/x.js"')).toEqual(["http://evil.example/x.js"]);
  });
});

describe("the pane page", () => {
  const pages = { "src/taskpane/taskpane.html": () => fs.readFileSync(path.join(root, "src/taskpane/taskpane.html"), "utf8"), "dist/taskpane.html": () => built("taskpane.html") };

  /** The Content-Security-Policy of a page's meta tag, as directive → sources. */
  function csp(html: string): Map<string, string[]> {
    const tag = (html.match(/<meta\b[^>]*>/gi) ?? []).find((t) => /http-equiv=["']?Content-Security-Policy/i.test(t));
    if (!tag) throw new Error("no Content-Security-Policy meta tag");
    const content = /\bcontent="([^"]*)"/i.exec(tag)?.[1] ?? /\bcontent='([^']*)'/i.exec(tag)?.[1] ?? "";
    return new Map(content.split(";").map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([name, ...sources]) => [(name as string).toLowerCase(), sources]));
  }

  test.each(Object.keys(pages))("%s: a Content-Security-Policy allowing scripts and connections only to itself and the Office host", (page) => {
    const policy = csp(pages[page as keyof typeof pages]());
    expect(policy.get("default-src")).toEqual(["'self'"]);
    for (const directive of ["script-src", "connect-src"]) {
      const sources = policy.get(directive) ?? policy.get("default-src") ?? [];
      expect({ directive, extra: sources.filter((s) => s !== "'self'" && s !== OFFICE_HOST_ORIGIN) }).toEqual({ directive, extra: [] });
    }
    expect(policy.get("object-src")).toEqual(["'none'"]);
    expect(policy.has("base-uri")).toBe(true);
  });

  test.each(Object.keys(pages))("%s: scripts only from the page's own folder or the Office host; no inline script or handlers", (page) => {
    const html = pages[page as keyof typeof pages]();
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attributes, body] of scripts) {
      expect((body ?? "").trim()).toBe("");
      const src = /\bsrc=["']?([^"'\s>]+)/i.exec(attributes ?? "")?.[1] ?? "";
      expect(src === OFFICE_HOST_SCRIPT || /^[\w./-]+$/.test(src)).toBe(true);
    }
    expect(html).not.toMatch(/\son[a-z]+\s*=/i);
  });
});

test("the manifest asks for ReadWriteDocument and nothing wider", () => {
  const manifest = fs.readFileSync(path.join(root, "manifest.xml"), "utf8");
  expect([...manifest.matchAll(/<Permissions>\s*([^<]*?)\s*<\/Permissions>/g)].map((m) => m[1])).toEqual(["ReadWriteDocument"]);
});

describe("scripts/audit.mjs (run by .ci/run before the tests)", () => {
  test(".ci/run runs it", () => {
    expect(fs.readFileSync(path.join(root, ".ci/run"), "utf8")).toMatch(/^node scripts\/audit\.mjs$/m);
  });

  /** Runs audit.mjs with a stand-in `npm` that prints `answer` (what `npm audit --json` would). */
  function audit(answer: string): { status: number | null; output: string } {
    const bin = fs.mkdtempSync(path.join(os.tmpdir(), "rheo-audit-"));
    fs.writeFileSync(path.join(bin, "answer.json"), answer);
    fs.writeFileSync(path.join(bin, "npm"), `#!/bin/sh\ncat "${path.join(bin, "answer.json")}"\nexit 1\n`, { mode: 0o755 });
    const run = spawnSync(process.execPath, [path.join(root, "scripts/audit.mjs")], { cwd: root, encoding: "utf8", env: { ...process.env, PATH: `${bin}${path.delimiter}${process.env.PATH ?? ""}` } });
    fs.rmSync(bin, { recursive: true, force: true });
    return { status: run.status, output: run.stdout + run.stderr };
  }
  const counts = (c: Partial<Record<"low" | "moderate" | "high" | "critical", number>>) =>
    JSON.stringify({ metadata: { vulnerabilities: { info: 0, low: 0, moderate: 0, high: 0, critical: 0, ...c } } });

  test("fails on a high or a critical finding", () => {
    expect(audit(counts({ high: 1 })).status).toBe(1);
    expect(audit(counts({ critical: 2, low: 3 })).status).toBe(1);
  });

  test("passes with only low and moderate findings, and says so", () => {
    const run = audit(counts({ low: 2, moderate: 1 }));
    expect(run.status).toBe(0);
    expect(run.output).toMatch(/0 critical, 0 high, 1 moderate, 2 low/);
  });

  test("reports an unreachable audit service without failing the build", () => {
    const run = audit(JSON.stringify({ error: { code: "ENOTFOUND", summary: "request to https://registry.npmjs.org/-/npm/v1/security/advisories/bulk failed" } }));
    expect(run.status).toBe(0);
    expect(run.output).toMatch(/could not be reached/);
  });
});
