/**
 * The docs stay true to the code: the generated blocks of docs/ are current, the README stays an
 * orientation (under 15 KB, the two commands, links that resolve), and every relative link in the
 * docs points at a file that exists.
 */
import { existsSync, readFileSync, readdirSync } from "fs";
import path from "path";
import { generatedBlocks, replaceBlock } from "../scripts/docs/generated";

const ROOT = path.join(__dirname, "..");
const read = (f: string) => readFileSync(path.join(ROOT, f), "utf8");

describe("docs", () => {
  test.each(generatedBlocks().map((b) => [`${b.file} ${b.name}`, b] as const))("%s is current (npm run docs)", (_, b) => {
    const text = read(b.file);
    expect(replaceBlock(text, b.name, b.content)).toBe(text);
  });

  test("README.md is short and gives the run and test commands", () => {
    const readme = read("README.md");
    expect(Buffer.byteLength(readme)).toBeLessThanOrEqual(15 * 1024);
    expect(readme).toContain("npm run demo");
    expect(readme).toContain("npm test");
  });

  test("relative links in README.md, DEVELOPERS.md, SECURITY.md and docs/ resolve", () => {
    const files = ["README.md", "DEVELOPERS.md", "SECURITY.md", ...readdirSync(path.join(ROOT, "docs")).filter((f) => f.endsWith(".md")).map((f) => `docs/${f}`)];
    const broken: string[] = [];
    for (const f of files) {
      for (const m of read(f).matchAll(/\]\(([^)#\s]+)(#[^)]*)?\)/g)) {
        const target = m[1] as string;
        if (/^[a-z]+:/.test(target)) continue;
        if (!existsSync(path.join(ROOT, path.dirname(f), target))) broken.push(`${f} → ${target}`);
      }
    }
    expect(broken).toEqual([]);
  });
});
