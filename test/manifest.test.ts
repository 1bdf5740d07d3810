/**
 * manifest.xml offline: well-formed (xmllint) and structurally sound — every resid defined, every
 * URL https, string lengths within the manifest limits, the CustomFunctions extension point, the
 * SharedRuntime requirement, a Home-tab button and ReadWriteDocument permission. The schema
 * validation by `office-addin-manifest validate` needs an online service and is a release step.
 */
import { execFileSync } from "child_process";
import fs from "fs";
import path from "path";

const manifestPath = path.join(__dirname, "..", "manifest.xml");
const text = fs.readFileSync(manifestPath, "utf8");

interface El {
  name: string;
  attrs: Record<string, string>;
  children: El[];
  text: string;
}

/** Minimal reader for a well-formed XML file (xmllint checks well-formedness first). */
function parseXml(xml: string): El {
  const body = xml.replace(/<\?[\s\S]*?\?>/g, "").replace(/<!--[\s\S]*?-->/g, "");
  const root: El = { name: "#root", attrs: {}, children: [], text: "" };
  const stack: El[] = [root];
  const tag = /<(\/?)([\w:.-]+)((?:\s+[\w:.-]+\s*=\s*"[^"]*")*)\s*(\/?)>|([^<]+)/g;
  let m: RegExpExecArray | null;
  while ((m = tag.exec(body))) {
    const top = stack[stack.length - 1] as El;
    if (m[5] !== undefined) {
      top.text += m[5].trim();
      continue;
    }
    const [, closing, name, attrText, selfClosing] = m as unknown as [string, string, string, string, string];
    if (closing) {
      stack.pop();
      continue;
    }
    const attrs: Record<string, string> = {};
    for (const a of attrText.matchAll(/([\w:.-]+)\s*=\s*"([^"]*)"/g)) attrs[a[1] as string] = a[2] as string;
    const el: El = { name, attrs, children: [], text: "" };
    top.children.push(el);
    if (!selfClosing) stack.push(el);
  }
  return root.children[0] as El;
}

const all = (el: El): El[] => [el, ...el.children.flatMap(all)];
const doc = parseXml(text);
const elements = all(doc);
const named = (name: string) => elements.filter((e) => e.name === name);
const one = (name: string) => {
  const found = named(name);
  expect({ name, count: found.length }).toEqual({ name, count: 1 });
  return found[0] as El;
};

/** Path of xmllint, or "" when it is not installed. */
function findXmllint(): string {
  try {
    return execFileSync("which", ["xmllint"], { encoding: "utf8" }).trim();
  } catch {
    return "";
  }
}
const XMLLINT = findXmllint();
// In CI (.ci/run installs libxml2-utils) a missing xmllint is a failure, never a silent skip.
if (!XMLLINT && process.env.CI) throw new Error("xmllint is missing in CI: .ci/run must install libxml2-utils");
if (!XMLLINT) console.warn("manifest well-formedness test skipped: xmllint is missing (apt-get install -y libxml2-utils)");

describe("manifest.xml", () => {
  (XMLLINT ? test : test.skip)("is well-formed XML (xmllint --noout)", () => {
    expect(() => execFileSync(XMLLINT, ["--noout", manifestPath], { stdio: "pipe" })).not.toThrow();
  });

  test("is an Excel task-pane add-in with ReadWriteDocument permission only", () => {
    expect(doc.name).toBe("OfficeApp");
    expect(doc.attrs["xsi:type"]).toBe("TaskPaneApp");
    expect(one("Id").text).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(one("Version").text).toMatch(/^\d+\.\d+\.\d+\.\d+$/);
    expect(named("Host").filter((h) => h.attrs.Name).map((h) => h.attrs.Name)).toEqual(["Workbook"]);
    expect(one("Permissions").text).toBe("ReadWriteDocument");
  });

  test("requires SharedRuntime and runs functions and pane on one long-lived page", () => {
    const sets = named("Set").map((s) => s.attrs.Name);
    expect(sets).toContain("SharedRuntime");
    const runtime = one("Runtime");
    expect(runtime.attrs.lifetime).toBe("long");
    const page = elements.find((e) => e.name === "Page") as El;
    const pageUrl = page.children[0]?.attrs.resid;
    expect(pageUrl).toBe(runtime.attrs.resid);
    const action = elements.find((e) => e.name === "Action" && e.attrs["xsi:type"] === "ShowTaskpane") as El;
    expect(action.children.find((c) => c.name === "SourceLocation")?.attrs.resid).toBe(runtime.attrs.resid);
    expect(one("FunctionFile").attrs.resid).toBe(runtime.attrs.resid);
  });

  test("declares the CustomFunctions extension point with script, page, metadata and namespace RHEO", () => {
    const ep = elements.find((e) => e.name === "ExtensionPoint" && e.attrs["xsi:type"] === "CustomFunctions") as El;
    expect(ep).toBeDefined();
    expect(ep.children.map((c) => c.name).sort()).toEqual(["Metadata", "Namespace", "Page", "Script"]);
    const urls = Object.fromEntries(named("bt:Url").map((u) => [u.attrs.id, u.attrs.DefaultValue]));
    const loc = (n: string) => (ep.children.find((c) => c.name === n) as El).children[0]?.attrs.resid as string;
    expect(urls[loc("Script")]).toMatch(/\/functions\.js$/);
    expect(urls[loc("Metadata")]).toMatch(/\/functions\.json$/);
    const ns = (ep.children.find((c) => c.name === "Namespace") as El).attrs.resid as string;
    expect(named("bt:String").find((s) => s.attrs.id === ns)?.attrs.DefaultValue).toBe("RHEO");
  });

  test("puts a task-pane button with our own group and icons on the Home tab", () => {
    const tab = one("OfficeTab");
    expect(tab.attrs.id).toBe("TabHome");
    const group = all(tab).find((e) => e.name === "Group") as El;
    expect(group.attrs.id).toMatch(/^Rheo\./);
    const button = all(group).find((e) => e.name === "Control" && e.attrs["xsi:type"] === "Button") as El;
    expect(button).toBeDefined();
    const sizes = all(button).filter((e) => e.name === "bt:Image").map((e) => e.attrs.size);
    expect(sizes).toEqual(["16", "32", "80"]);
  });

  test("every resid is defined exactly once, and every defined resource is used", () => {
    const defined = elements.filter((e) => e.name.startsWith("bt:") && e.attrs.id).map((e) => e.attrs.id as string);
    expect(new Set(defined).size).toBe(defined.length);
    const used = new Set(elements.map((e) => e.attrs.resid).filter((r): r is string => r !== undefined));
    for (const r of used) expect({ resid: r, defined: defined.includes(r) }).toEqual({ resid: r, defined: true });
    for (const d of defined) expect({ id: d, used: used.has(d) }).toEqual({ id: d, used: true });
    for (const r of used) expect(r.length).toBeLessThanOrEqual(32);
  });

  test("every URL is https, and the icon files exist", () => {
    // namespace declarations (xmlns, xmlns:*) are identifiers, not locations
    const urls = elements.flatMap((e) =>
      Object.entries(e.attrs)
        .filter(([k, v]) => !k.startsWith("xmlns") && /^[a-z]+:\/\//i.test(v))
        .map(([, v]) => v),
    );
    urls.push(...named("AppDomain").map((a) => a.text));
    expect(urls.length).toBeGreaterThan(8);
    for (const u of urls) expect(u).toMatch(/^https:\/\//);
    for (const u of urls.filter((x) => /\/assets\/.+\.png$/.test(x))) {
      const file = path.join(__dirname, "..", "assets", path.basename(u));
      expect({ u, exists: fs.existsSync(file) }).toEqual({ u, exists: true });
    }
  });

  test("strings fit the manifest limits (short 125, long 250, display name 125, description 2000)", () => {
    for (const s of elements.filter((e) => e.name === "bt:String")) {
      const inShort = named("bt:ShortStrings")[0]?.children.includes(s);
      expect((s.attrs.DefaultValue as string).length).toBeLessThanOrEqual(inShort ? 125 : 250);
    }
    expect((one("DisplayName").attrs.DefaultValue as string).length).toBeLessThanOrEqual(125);
    const description = doc.children.find((c) => c.name === "Description") as El;
    expect((description.attrs.DefaultValue as string).length).toBeLessThanOrEqual(2000);
  });

  test("the icon PNGs have the sizes their names say", () => {
    for (const size of [16, 32, 64, 80]) {
      const png = fs.readFileSync(path.join(__dirname, "..", "assets", `icon-${size}.png`));
      expect(png.subarray(1, 4).toString("ascii")).toBe("PNG");
      expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([size, size]);
    }
  });
});
