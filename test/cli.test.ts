import { readFileSync } from "node:fs";
import { execFileSync } from "node:child_process";
import { main } from "../src/cli/main";
import { FILM_GRADE } from "../scripts/demo/filmGrade";
import { expectClose } from "./helpers/expectClose";

const DEMO = "workbooks/demo-film-grade.csv";

async function run(args: string[], files: Record<string, string> = {}) {
  let stdout = "";
  let stderr = "";
  const code = await main(args, {
    readFile: (p) => {
      if (p in files) return files[p] as string;
      return readFileSync(p, "utf8");
    },
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  });
  return { code, stdout, stderr };
}

/**
 * The demo data are generated from a known Carreau–Yasuda law (scripts/demo/filmGrade.ts) with
 * 0.5 % pressure noise: the reduced viscosity must match that law at the corrected wall rate.
 */
function trueViscosity(rate: number, temperatureK: number): number {
  const p = FILM_GRADE;
  const aT = Math.exp((p.activationEnergy / 8.314462618) * (1 / temperatureK - 1 / p.referenceTemperature));
  return aT * p.eta0 * Math.pow(1 + Math.pow(p.lambda * aT * rate, p.a), (p.n - 1) / p.a);
}

describe("rheoledger reduce DEMO --json", () => {
  test("three groups with the contract keys; viscosities match the generating law (rms < 1.5 %, each < 5 %)", async () => {
    const { code, stdout, stderr } = await run(["reduce", DEMO, "--json"]);
    expect(stderr).toBe("");
    expect(code).toBe(0);
    const doc = JSON.parse(stdout);
    expect(doc.groups).toHaveLength(3);
    let sumSq = 0;
    let count = 0;
    for (const g of doc.groups) {
      expect(Object.keys(g)).toEqual(expect.arrayContaining(["temperature", "dieDiameter", "bagley", "flowCurve", "warnings"]));
      expect(Object.keys(g.bagley[0])).toEqual(expect.arrayContaining(["shearRateApparent", "wallShearStress", "entrancePressure", "endCorrection", "r2"]));
      expect(Object.keys(g.flowCurve[0])).toEqual(expect.arrayContaining(["shearRateApparent", "wallShearStress", "nPrime", "shearRateWall", "viscosity"]));
      expectClose(g.dieDiameter, 1e-3, { rel: 1e-12 });
      for (const row of g.flowCurve) {
        const truth = trueViscosity(row.shearRateWall, g.temperature);
        expectClose(row.viscosity, truth, { rel: 0.05 }, `η at ${row.shearRateWall} 1/s, ${g.temperature} K`);
        sumSq += (row.viscosity / truth - 1) ** 2;
        count++;
      }
    }
    expect(Math.sqrt(sumSq / count)).toBeLessThan(0.015);
  });
});

describe("rheoledger reduce DEMO (tables)", () => {
  test("prints units in the headers and one block per group", async () => {
    const { code, stdout } = await run(["reduce", DEMO]);
    expect(code).toBe(0);
    expect(stdout.match(/^== /gm)).toHaveLength(3);
    expect(stdout).toContain("Wall shear stress [kPa]");
    expect(stdout).toContain("Viscosity [Pa·s]");
  });
});

describe("bad files exit non-zero with the line and column, and print nothing else", () => {
  const header = "die_diameter [mm],die_length [mm],barrel_diameter [mm],piston_speed [mm/min],pressure [bar]";
  const cases: [string, string, RegExp][] = [
    ["missing column", "die_length [mm],barrel_diameter [mm],piston_speed [mm/min],pressure [bar]\n20,15,1,100\n", /die_diameter: no "die_diameter \[unit\]" column/],
    ["unknown unit", header.replace("[bar]", "[atmos]") + "\n1,20,15,1,100\n", /column 5: "pressure \[atmos\]": unknown pressure unit "atmos"; accepted: Pa, kPa, MPa/],
    ["text in a number cell", `# comment\n${header}\n1,20,15,1,100\n1,20,15,2,n/a\n`, /pressure \[bar\] \(column 5\): line 4 is text "n\/a", not a number/],
    ["a single die", `${header}\n1,20,15,1,100\n1,20,15,2,150\n`, /single die length \(20 mm\); the Bagley correction needs two or more/],
  ];
  for (const [name, text, message] of cases) {
    test(name, async () => {
      const { code, stdout, stderr } = await run(["reduce", "bad.csv", "--json"], { "bad.csv": text });
      expect(code).toBe(1);
      expect(stdout).toBe("");
      expect(stderr).toMatch(message);
    });
  }
  test("unknown option", async () => {
    const { code, stderr } = await run(["reduce", DEMO, "--colour"]);
    expect(code).toBe(1);
    expect(stderr).toMatch(/--colour: unknown option; accepted: .*--json/);
  });
  test("missing file", async () => {
    const { code, stderr } = await run(["reduce", "no-such-file.csv"]);
    expect(code).toBe(1);
    expect(stderr).toMatch(/^rheoledger: no-such-file.csv: cannot be read: /);
  });
  test("unknown command and no arguments", async () => {
    expect((await run(["squash"])).code).toBe(2);
    expect((await run([])).code).toBe(2);
  });
});

describe("the npm bin", () => {
  test("node bin/rheoledger.js reduce DEMO --json runs as a process", () => {
    const out = execFileSync(process.execPath, ["bin/rheoledger.js", "reduce", DEMO, "--json"], { encoding: "utf8" });
    expect(JSON.parse(out).groups).toHaveLength(3);
  });
});
