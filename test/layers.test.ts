/**
 * The layers of src/ and the direction of their imports, checked over every source file:
 *   core       imports only core and the allow-listed numeric packages (no Office, DOM, I/O);
 *   io         imports core and io (and the workbook library);
 *   functions, taskpane, cli  import core and io and themselves, never each other.
 * A relative import is resolved to its folder, so `../../functions/x` from core/models is caught.
 * Data files (.csv, .json) may be imported only from workbooks/ (the demo data) and package.json.
 */
import { readFileSync, readdirSync, statSync } from "fs";
import path from "path";

const SRC = path.join(__dirname, "..", "src");
type Layer = "core" | "io" | "functions" | "taskpane" | "cli";
const LAYERS: readonly Layer[] = ["core", "io", "functions", "taskpane", "cli"];

/** Which layers each layer may import, and which packages. */
const ALLOWED: Record<Layer, { layers: Layer[]; packages: RegExp }> = {
  core: { layers: ["core"], packages: /^$/ },
  io: { layers: ["core", "io"], packages: /^(exceljs|jszip)$/ },
  functions: { layers: ["core", "io", "functions"], packages: /^$/ },
  taskpane: { layers: ["core", "io", "taskpane"], packages: /^$/ },
  cli: { layers: ["core", "io", "cli"], packages: /^(node:[a-z_/]+)$/ },
};

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = path.join(dir, n);
    return statSync(p).isDirectory() ? files(p) : /\.ts$/.test(n) ? [p] : [];
  });
}

function layerOf(file: string): Layer | null {
  const top = path.relative(SRC, file).split(path.sep)[0] as Layer;
  return LAYERS.includes(top) ? top : null;
}

/** Every module specifier of `import ... from "x"`, `export ... from "x"` and `import("x")`. */
function specifiers(text: string): string[] {
  const out: string[] = [];
  for (const m of text.matchAll(/(?:^|\n)\s*(?:import|export)\s[^;]*?from\s+"([^"]+)"|import\(\s*"([^"]+)"\s*\)|(?:^|\n)\s*import\s+"([^"]+)"/g)) {
    out.push((m[1] ?? m[2] ?? m[3]) as string);
  }
  return out;
}

describe("import boundaries of src/", () => {
  const all = files(SRC).filter((f) => layerOf(f) !== null);

  test("the scan sees every layer and its imports", () => {
    for (const l of LAYERS) expect(all.some((f) => layerOf(f) === l)).toBe(true);
    expect(specifiers('import { a } from "./x";\nexport * from "../y";\nconst z = await import("exceljs");')).toEqual(["./x", "../y", "exceljs"]);
  });

  test.each(LAYERS)("%s imports only what it may", (layer) => {
    const bad: string[] = [];
    for (const file of all.filter((f) => layerOf(f) === layer)) {
      for (const spec of specifiers(readFileSync(file, "utf8"))) {
        if (/\.(csv|json)$/.test(spec)) {
          // data bundled into the pane (demo files, the version): only from workbooks/ or package.json
          const target = path.relative(path.join(SRC, ".."), path.resolve(path.dirname(file), spec));
          if (!/^(workbooks\/[^/]+|package\.json)$/.test(target.split(path.sep).join("/"))) bad.push(`${path.relative(SRC, file)} → data ${spec}`);
        } else if (spec.startsWith(".")) {
          const target = layerOf(path.resolve(path.dirname(file), spec) + ".ts") ?? layerOf(path.resolve(path.dirname(file), spec, "index.ts"));
          if (target === null || !ALLOWED[layer].layers.includes(target)) bad.push(`${path.relative(SRC, file)} → ${spec}`);
        } else if (!ALLOWED[layer].packages.test(spec)) bad.push(`${path.relative(SRC, file)} → package ${spec}`);
      }
    }
    expect(bad).toEqual([]);
  });
});
