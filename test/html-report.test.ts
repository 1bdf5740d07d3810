/**
 * `rheoledger reduce FILE --report report.html`: one self-contained HTML file — no script, no
 * network (a Content-Security-Policy forbidding every fetch, no external reference at all), the
 * summary, every result table, inline SVG charts drawn by the pane's chart code, the warnings and
 * the method record, text escaped — that prints to PDF (Chromium headless, as a browser's "Save
 * as PDF" does; skipped with a message when Chromium is missing locally, a failure in CI).
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { main } from "../src/cli/main";
import { htmlReport } from "../src/io/htmlReport";
import { EVERY_OPTION } from "./helpers/resultsCases";

const ROOT = path.join(__dirname, "..");
const FILM = path.join(ROOT, "workbooks/demo-film-grade.csv");
const CHROMIUM = "/usr/bin/chromium";

async function report(args: string[]): Promise<{ code: number; html: string; stdout: string; stderr: string; dir: string }> {
  const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-report-"));
  const meta = path.join(dir, "meta.json");
  writeFileSync(meta, JSON.stringify({ material: "<script>alert('x')</script> & grade", preheatTime: "6 min" }));
  const out = path.join(dir, "report.html");
  const written = new Map<string, Uint8Array | string>();
  let stdout = "";
  let stderr = "";
  const code = await main(["reduce", FILM, ...args, "--meta", meta, "--report", out], {
    readFile: (p) => readFileSync(p, "utf8"),
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    writeFile: (p, d) => written.set(p, d),
  });
  return { code, html: String(written.get(out) ?? ""), stdout, stderr, dir };
}

describe("reduce --report report.html (every option on)", () => {
  let r: Awaited<ReturnType<typeof report>>;
  let doc: { groups: { flowCurve: unknown[] }[] };
  beforeAll(async () => {
    r = await report([...EVERY_OPTION, "--json"]);
    doc = JSON.parse(r.stdout);
  });

  it("writes one HTML document and says where", () => {
    expect(r.code).toBe(0);
    expect(r.stderr).toContain("Report written to ");
    expect(r.html.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(r.html.trimEnd().endsWith("</html>")).toBe(true);
  });

  it("is self-contained: a policy forbidding every fetch, no script, no external reference", () => {
    expect(r.html).toContain(`<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`);
    expect(r.html).not.toMatch(/<script|<link|<iframe|<object|<embed|<img|\bsrc=|url\(|@import|\bon[a-z]+=/i);
    // the only address: the SVG namespace (a name, never fetched)
    expect([...new Set(r.html.match(/https?:\/\/[^\s"'<>)]+/g))]).toEqual(["http://www.w3.org/2000/svg"]);
  });

  it("holds the summary, every result table, the warnings and the method record, text escaped", () => {
    const tables = [...r.html.matchAll(/<table data-table="([^"]+)"/g)].map((m) => m[1]);
    expect(tables[0]).toBe("groups");
    for (const id of ["bagley", "bagleyPoints", "flowCurve", "rabinowitsch", "viscosityModel", "fitRanking", "fitParameters", "shift", "shiftConstants", "master", "extensional", "heating", "pressureDependence", "meltFlowRate", "warnings", "methodRun", "settings", "equations", "reportItems", "methodWarnings"]) expect(tables).toContain(id);
    // one flow-curve table per group, one row per point of the JSON
    const flow = [...r.html.matchAll(/<table data-table="flowCurve">(.*?)<\/table>/gs)].map((m) => (m[1]?.match(/<tr>/g) ?? []).length - 1);
    expect(flow).toEqual(doc.groups.map((g) => g.flowCurve.length));
    expect(r.html).toContain("<td class=\"num\">32.29</td>");
    expect(r.html).toContain("&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt; &amp; grade");
    expect(r.html).toContain("(to be filled in)");
    expect(r.html).toMatch(/<p class="counts"><span>\d+ caution<\/span>/);
  });

  it("draws the seven charts as inline SVG with the pane's chart code: one marker per flow-curve point", () => {
    const charts = [...r.html.matchAll(/<svg class="chart"[^>]*data-chart="([^"]+)"/g)].map((m) => m[1]);
    expect(charts).toEqual(["bagley-190-c-d-1-mm", "bagley-210-c-d-1-mm", "bagley-230-c-d-1-mm", "flowCurve", "viscosity", "nPrime", "master"]);
    const flowSvg = /<svg class="chart"[^>]*data-chart="flowCurve".*?<\/svg>/s.exec(r.html)?.[0] ?? "";
    expect((flowSvg.match(/<circle /g) ?? []).length).toBe(doc.groups.reduce((n, g) => n + g.flowCurve.length, 0));
    const viscositySvg = /<svg class="chart"[^>]*data-chart="viscosity".*?<\/svg>/s.exec(r.html)?.[0] ?? "";
    expect((viscositySvg.match(/<polyline /g) ?? []).length).toBe(3); // the recommended model of each group
  });

  it("has print rules: A4 pages, repeated table headers, nothing split, the method record on a new page", () => {
    const print = /@media print \{([\s\S]*?)\n\}/.exec(r.html)?.[1] ?? "";
    expect(print).toContain("@page { size: A4;");
    expect(print).toContain("thead { display: table-header-group; }");
    expect(print).toContain("tr, figure { break-inside: avoid; }");
    expect(print).toContain("#method { break-before: page; }");
  });

  const haveChromium = existsSync(CHROMIUM) && existsSync("/usr/bin/pdftotext");
  if (!haveChromium && process.env.CI) throw new Error(`${CHROMIUM} or pdftotext is missing in CI: .ci/run must install chromium and poppler-utils`);
  if (!haveChromium) console.warn(`report printing test skipped: ${CHROMIUM} or pdftotext is missing (apt-get install -y chromium poppler-utils)`);
  (haveChromium ? it : it.skip)("prints to PDF: summary on page 1, every chart and the method record on its own later page", () => {
    const file = path.join(r.dir, "report.html");
    writeFileSync(file, r.html);
    const pdf = path.join(r.dir, "report.pdf");
    execFileSync(CHROMIUM, ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run", `--user-data-dir=${path.join(r.dir, "chromium")}`, "--no-pdf-header-footer", `--print-to-pdf=${pdf}`, `file://${file}`], { stdio: "pipe", timeout: 120_000 });
    const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync("pdfinfo", [pdf], { encoding: "utf8" }))?.[1]);
    expect(pages).toBeGreaterThan(5);
    expect(pages).toBeLessThan(60);
    const page = (n: number) => execFileSync("pdftotext", ["-f", String(n), "-l", String(n), "-layout", pdf, "-"], { encoding: "utf8" });
    expect(page(1)).toContain("Summary");
    const all = Array.from({ length: pages }, (_, i) => page(i + 1));
    const method = all.findIndex((t) => /^\s*Method record\s*$/m.test(t));
    expect(method).toBeGreaterThan(1);
    expect(all[method]?.trimStart().startsWith("Method record")).toBe(true);
    for (const t of ["Bagley plot, 190 °C, D 1 mm", "Master curve", "Test report items (ISO 11443, ASTM D3835)"]) expect(all.join("\n")).toContain(t);
  });
});

describe("htmlReport(content)", () => {
  it("leaves NaN cells empty with a note and counts the warning", () => {
    const { html, warnings } = htmlReport({ title: "T", subtitle: "S", tables: [{ id: "x", title: "X", columns: [{ key: "v", header: "V", unit: "kPa", kind: "number" }], rows: [[NaN], [1.5]] }] });
    expect(warnings.map((w) => w.code)).toEqual(["RESULT_NOT_FINITE"]);
    expect(html).not.toMatch(/>(NaN|-?Infinity)</);
    expect(html).toContain('<td class="empty"></td>');
    expect(html).toContain("<span>1 caution</span>");
  });
});
