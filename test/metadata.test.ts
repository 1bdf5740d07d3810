/**
 * dist/functions.json is produced by the build (`npm run build`) from the @customfunction JSDoc,
 * is current, and describes every exported worksheet function with its parameters; the bundle
 * associates each id and stays within its size budget.
 */
import fs from "fs";
import path from "path";
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";
import * as sheet from "../src/functions/functions";
import { DEFAULT_SHEET_UNITS } from "../src/functions/adapter";
import { DEFAULT_RABINOWITSCH_OPTIONS } from "../src/core/rabinowitsch";
import { DEFAULT_REDUCE_OPTIONS } from "../src/core/reduce";

const root = path.join(__dirname, "..");
const dist = path.join(root, "dist");
const source = path.join(root, "src/functions/functions.ts");
// eslint-disable-next-line @typescript-eslint/no-require-imports
const webpackConfig = require("../webpack.config.js") as { FUNCTION_FILES: string[]; FUNCTIONS_BUDGET_BYTES: number; FUNCTIONS_SCRIPTS: string[] };

interface ParamMeta {
  name: string;
  description?: string;
  type?: string;
  dimensionality?: string;
  optional?: boolean;
}
interface FunctionMeta {
  id: string;
  name: string;
  description?: string;
  parameters: ParamMeta[];
  result: { dimensionality?: string; type?: string };
}

function built(file: string): string {
  const p = path.join(dist, file);
  if (!fs.existsSync(p)) throw new Error(`${p} is missing: run \`npm run build\` before the tests`);
  return fs.readFileSync(p, "utf8");
}

const metadata = () => JSON.parse(built("functions.json")) as { functions: FunctionMeta[] };

/**
 * The other FUNCTION_FILES (fitting.ts, ...): checks each exported function is declared with as
 * many parameters as its signature has; returns how many there are.
 */
async function declaredOutsideFunctionsTs(): Promise<number> {
  let count = 0;
  const meta = new Map(metadata().functions.map((f) => [f.id, f]));
  for (const file of webpackConfig.FUNCTION_FILES.map((f) => path.join(root, f)).filter((f) => f !== source)) {
    const generated = await generateCustomFunctionsMetadata([file]);
    const byJsName = new Map(generated.associate.map((a) => [a.functionName, a.id]));
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const module = require(file) as Record<string, unknown>;
    for (const [jsName, fn] of Object.entries(module).filter(([, v]) => typeof v === "function")) {
      const id = byJsName.get(jsName);
      expect({ file, jsName, id }).toEqual({ file, jsName, id: expect.any(String) });
      expect((meta.get(id as string) as FunctionMeta).parameters).toHaveLength((fn as (...args: unknown[]) => unknown).length);
      count++;
    }
  }
  return count;
}

describe("dist/functions.json", () => {
  test("is what the metadata generator makes of the current source (the build is not stale)", async () => {
    const fresh = await generateCustomFunctionsMetadata(webpackConfig.FUNCTION_FILES.map((f) => path.join(root, f)));
    expect(fresh.errors).toEqual([]);
    expect(JSON.parse(built("functions.json"))).toEqual(JSON.parse(fresh.metadataJson));
  });

  test("lists every exported function of functions.ts, each with parameters matching its signature", async () => {
    const generated = await generateCustomFunctionsMetadata([source]);
    const byJsName = new Map(generated.associate.map((a) => [a.functionName, a.id]));
    const exported = Object.entries(sheet).filter(([, v]) => typeof v === "function");
    expect(exported.length).toBeGreaterThanOrEqual(14);
    const others = await declaredOutsideFunctionsTs();
    const meta = new Map(metadata().functions.map((f) => [f.id, f]));
    for (const [jsName, fn] of exported) {
      const id = byJsName.get(jsName);
      expect({ jsName, id }).toEqual({ jsName, id: expect.any(String) });
      const f = meta.get(id as string) as FunctionMeta;
      expect(f).toBeDefined();
      expect(f.parameters).toHaveLength((fn as (...args: unknown[]) => unknown).length);
    }
    expect(meta.size).toBe(exported.length + others);
  });

  test("every function and parameter has a description Excel can show", () => {
    for (const f of metadata().functions) {
      expect({ id: f.id, description: f.description }).toEqual({ id: f.id, description: expect.stringMatching(/\S{3}/) });
      expect((f.description as string).length).toBeLessThanOrEqual(255);
      for (const p of f.parameters) {
        expect({ id: f.id, p: p.name, description: p.description }).toEqual({ id: f.id, p: p.name, description: expect.stringMatching(/\S{3}/) });
        expect((p.description as string).length).toBeLessThanOrEqual(255);
      }
    }
  });

  test("ids are plain trade words; every result spills (matrix)", () => {
    for (const f of metadata().functions) {
      expect(f.id).toMatch(/^[A-Z]+$/);
      expect(f.name).toBe(f.id);
      expect(f.result.dimensionality).toBe("matrix");
    }
  });

  test("unit and option parameters state the defaults the code uses", () => {
    const outputQuantity: Record<string, keyof typeof DEFAULT_SHEET_UNITS> = {
      FLOWRATE: "volumetricFlow",
      FLOWRATEMASS: "volumetricFlow",
      WALLSTRESSAPP: "stress",
      WALLSTRESS: "stress",
      WALLSTRESSEND: "stress",
      VISCOSITY: "viscosity",
      VISCOSITYAPP: "viscosity",
    };
    const byName: Record<string, string> = {
      speedUnit: DEFAULT_SHEET_UNITS.speed,
      lengthUnit: DEFAULT_SHEET_UNITS.length,
      pressureUnit: DEFAULT_SHEET_UNITS.pressure,
      stressUnit: DEFAULT_SHEET_UNITS.stress,
      flowUnit: DEFAULT_SHEET_UNITS.volumetricFlow,
      massRateUnit: DEFAULT_SHEET_UNITS.massRate,
      densityUnit: DEFAULT_SHEET_UNITS.density,
      viscosityUnit: DEFAULT_SHEET_UNITS.viscosity,
      method: DEFAULT_RABINOWITSCH_OPTIONS.method,
      degree: String(DEFAULT_RABINOWITSCH_OPTIONS.degree),
    };
    const reduceOnly: Record<string, string> = { endCorrection: DEFAULT_REDUCE_OPTIONS.endCorrection };
    let checked = 0;
    for (const f of metadata().functions) {
      for (const p of f.parameters) {
        const quantity = outputQuantity[f.id];
        const expected =
          p.name === "outputUnit" && quantity
            ? DEFAULT_SHEET_UNITS[quantity]
            : f.id === "REDUCE" && p.name in reduceOnly
              ? reduceOnly[p.name]
              : p.name in reduceOnly
                ? undefined
                : byName[p.name];
        if (expected === undefined) continue;
        expect({ id: f.id, p: p.name, description: p.description }).toEqual({
          id: f.id,
          p: p.name,
          description: expect.stringContaining(`(default ${expected})`),
        });
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(30);
  });
});

describe("dist bundles", () => {
  test("functions.js associates every id once; the pane and the shared chunks associate none", () => {
    const js = built("functions.js");
    for (const f of metadata().functions) {
      expect({ id: f.id, count: js.split(`associate("${f.id}",`).length - 1 }).toEqual({ id: f.id, count: 1 });
    }
    for (const other of ["taskpane.js", "core.js", "runtime.js"]) expect(built(other)).not.toMatch(/associate\(/);
  });
  test("what the functions load (runtime + core + functions) stays within its budget and carries no spreadsheet-file library", () => {
    expect(webpackConfig.FUNCTIONS_SCRIPTS).toEqual(["runtime.js", "core.js", "functions.js"]);
    const size = webpackConfig.FUNCTIONS_SCRIPTS.reduce((n, f) => n + fs.statSync(path.join(dist, f)).size, 0);
    expect(size).toBeLessThanOrEqual(webpackConfig.FUNCTIONS_BUDGET_BYTES);
    expect(webpackConfig.FUNCTIONS_BUDGET_BYTES).toBe(305 * 1024);
    for (const f of webpackConfig.FUNCTIONS_SCRIPTS) expect(built(f)).not.toMatch(/exceljs|ExcelJS/);
  });
  test("the core is bundled once: the pane's own bundle holds none of the core's modules", () => {
    // a core function's error text appears in core.js only (webpack keeps string literals as written)
    const marker = "the Bagley correction needs dies of at least two lengths";
    expect(built("core.js")).toContain(marker);
    expect(built("taskpane.js")).not.toContain(marker);
    expect(built("functions.js")).not.toContain(marker);
  });
  test("the shared runtime page: office.js then the functions deferred, the pane and the shared chunks async", () => {
    const html = built("taskpane.html");
    // the built page is minified: attribute values may lose their quotes
    const tag = (src: string) => new RegExp(`<script\\b[^>]*\\bsrc=["']?([^"'\\s>]*/)?${src.replace(/\./g, "\\.")}["']?[\\s>][^>]*>?`).exec(html)?.[0] ?? "";
    const office = html.indexOf("office.js");
    expect(office).toBeGreaterThan(0);
    expect(html.indexOf("functions.js")).toBeGreaterThan(office);
    expect(tag("office.js")).toMatch(/\bdefer\b/);
    expect(tag("functions.js")).toMatch(/\bdefer\b/);
    for (const f of ["runtime.js", "core.js", "taskpane.js"]) expect({ f, tag: tag(f) }).toEqual({ f, tag: expect.stringMatching(/\basync\b/) });
    // nothing blocks the first paint: no script without async or defer
    const blocking = (html.match(/<script\b[^>]*>/g) ?? []).filter((t) => !/\b(async|defer)\b/.test(t));
    expect(blocking).toEqual([]);
  });
});
