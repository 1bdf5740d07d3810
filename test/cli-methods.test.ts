import { main } from "../src/cli/main";
import { CLI_SETTINGS_SOURCE, readReduceSettings } from "../src/io/reduceOptions";
import { expectClose } from "./helpers/expectClose";

async function run(args: string[], files: Record<string, string>) {
  let stdout = "";
  let stderr = "";
  const code = await main(args, { readFile: (p) => files[p] as string, stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

/** Newtonian liquid, μ = 400 Pa·s, dies of 0.5, 1 and 2 mm with 0.2 mm orifices; invented data. */
function csv(): string {
  const lines = ["die_diameter [mm],die_length [mm],flow_rate [mm3/s],pressure [bar],temperature [C]"];
  for (const D of [0.5, 1, 2]) {
    for (const L of [0.1 * D, 10 * D, 20 * D, 30 * D]) {
      for (const rate of [10, 30, 100, 300]) {
        const Q = (rate * Math.PI * D ** 3) / 32; // mm3/s
        const p = (Math.sqrt(8 / 3) * 400 * rate + (4 * 400 * rate * L) / D) / 1e5;
        lines.push(`${D},${L},${Q},${p},200`);
      }
    }
  }
  return lines.join("\n");
}

/** Numeric rows of every text table titled `title` in the CLI output (all groups), as numbers. */
function table(stdout: string, title: string): number[][] {
  const rows: number[][] = [];
  const lines = stdout.split("\n");
  lines.forEach((line, i) => {
    if (line.trim() !== title) return;
    // data rows follow the header and its rule, up to a blank line or an indented note
    for (let j = i + 3; j < lines.length && /^\s*-?[\d.]/.test(lines[j] as string) && !/^ {2}\S/.test(lines[j] as string); j++) {
      rows.push((lines[j] as string).trim().split(/\s+/).map(Number));
    }
  });
  expect(rows.length).toBeGreaterThan(0);
  rows.forEach((row) => row.forEach((v) => expect(Number.isFinite(v)).toBe(true)));
  return rows;
}

describe("rheoledger reduce with the method flags", () => {
  const files = { "n.csv": csv() };
  test("--slip --extensional --representative --pressure --transducer --mfr: JSON keys in SI", async () => {
    const r = await run(["reduce", "n.csv", "--json", "--slip", "--extensional", "--representative", "--pressure", "--transducer", "1000 bar, 0.25 %", "--mfr", "10 cm3/10min, 2.16 kg"], files);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.slip.length).toBeGreaterThan(0);
    for (const s of doc.slip) {
      expect(Object.keys(s)).toEqual(expect.arrayContaining(["wallShearStress", "slipVelocity", "shearRateApparentCorrected"]));
      // no slip in the data: v_s ≈ 0 relative to the rate × radius scale
      expect(Math.abs(s.slipVelocity)).toBeLessThan(1e-9);
    }
    const g = doc.groups[0];
    expect(g.geometry).toBe("round");
    expect(g.entrancePressures.length).toBe(4);
    // @check reduceMethods, cogswell | through reduce: data with Cogswell's entrance loss of a Trouton liquid give η_E/η = 3 at 4 rates | Trouton, Proc. R. Soc. A 77 (1906) 426; Cogswell, Polym. Eng. Sci. 12 (1972) 64 | rel 1e-6 | 4
    g.extensional.forEach((e: { troutonRatio: number }) => expectClose(e.troutonRatio, 3, { rel: 1e-6 }));
    expect(Object.keys(g.flowCurve[0])).toEqual(expect.arrayContaining(["viscosityRepresentative", "viscosityUncertainty", "wallShearStressUncertainty", "shearRateWallUncertainty"]));
    expect(g.pressureDependence.rows.length).toBe(4);
    expectClose(doc.meltFlowRate.viscosityApparent, 1048.612614495892, { rel: 1e-12 });
    expect(doc.warnings.map((w: { code: string }) => w.code)).toContain("ORIFICE_DIE_NOT_ON_BAGLEY");
  });
  test("--orifice and --heating: text tables with units", async () => {
    const r = await run(["reduce", "n.csv", "--orifice", "--heating", "density=0.75 g/cm3, cp=2.5 kJ/(kg.K), k=0.2 W/(m.K), b=0.03 1/K"], files);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("b = 0.03 1/K (given).");
    // values, not only headers: the invented data's entrance loss is √(8/3)·μ·γ̇_a (Cogswell's
    // relation for a Trouton liquid, μ = 400 Pa·s), which the Bagley column must show in bar
    const entrance = table(r.stdout, "Entrance pressure: Bagley and orifice die");
    expect(entrance.length).toBe(3 * 4);
    for (const [rate, bagleyBar] of entrance) expectClose(bagleyBar as number, (Math.sqrt(8 / 3) * 400 * (rate as number)) / 1e5, { rel: 2e-3 });
    // adiabatic rise ΔT = ΔP/(ρ·c_p) (Macosko 1994, ch. 6, from memory) of the pressure printed beside it
    const heating = table(r.stdout, "Viscous heating");
    expect(heating.length).toBe(3 * 4);
    for (const [, pressureBar, rise] of heating) expectClose(rise as number, ((pressureBar as number) * 1e5) / (750 * 2500), { rel: 3e-3 });
  });
  test("bad flag values exit 1 naming the flag", async () => {
    expect((await run(["reduce", "n.csv", "--transducer", "1000 bar"], files)).stderr).toMatch(/--transducer: expected "full scale, accuracy"/);
    expect((await run(["reduce", "n.csv", "--heating", "rho=1"], files)).stderr).toMatch(/--heating: expected key=value pairs/);
    expect((await run(["reduce", "n.csv", "--mfr", "10 g/10min, 2.16 kg"], files)).stderr).toMatch(/--density: an MFR in mass per time needs the melt density/);
    expect((await run(["reduce", "n.csv", "--orifice", "--end-correction", "none"], files)).code).toBe(1);
  });
});

describe("flag values through the reduce-settings reader", () => {
  const read = (settings: Record<string, string | boolean>) => readReduceSettings(settings, CLI_SETTINGS_SOURCE).options;
  test("--transducer: % or fraction", () => {
    expect(read({ transducer: "1000 bar, 0.25 %" }).transducer).toEqual({ fullScale: 1e8, accuracy: 0.0025 });
    expectClose((read({ transducer: "50 MPa, 0.005" }).transducer as { accuracy: number }).accuracy, 0.005, { rel: 1e-15 });
  });
  test("--heating: units converted to SI, b optional, a unit required unless --si", () => {
    const h = read({ heating: "density=0.76 g/cm3, cp=2.1 kJ/(kg.K), k=0.18 W/(m.K)" }).heating as { density: number; heatCapacity: number; conductivity: number; temperatureCoefficient?: number };
    expectClose(h.density, 760, { rel: 1e-15 });
    expectClose(h.heatCapacity, 2100, { rel: 1e-15 });
    expect(h.conductivity).toBe(0.18);
    expect(h.temperatureCoefficient).toBeUndefined();
    expect(() => read({ heating: "density=760 kg/m3, cp=2000 J/(kg.K)" })).toThrow(/--heating: needs k=/);
    expect(() => read({ heating: "density=0.76 g/cm3, cp=2.1 kJ/(kg.K), k=0.18" })).toThrow(/--heating k: needs a unit, e.g. "0.18 W\/\(m·K\)" \(or give --si/);
    expect((read({ heating: "density=760, cp=2100, k=0.18", si: true }).heating as { density: number }).density).toBe(760);
    expect(() => read({ heating: "density=0.76 g/cm3, density=0.8 g/cm3, cp=2.1 kJ/(kg.K), k=0.18 W/(m.K)" })).toThrow(/--heating: gives density= twice/);
  });
  test("--mfr: MVR by volume unit, MFR by mass unit with density", () => {
    expectClose(read({ meltFlowRate: "10 cm3/10min, 2.16 kg" }).meltFlowRate?.volumeRate as number, 10e-6 / 600, { rel: 1e-15 });
    const m = read({ meltFlowRate: "2 g/10min, 5 kg", density: "0.75 g/cm3" }).meltFlowRate as { massRate: number; load: number };
    expectClose(m.massRate, 2e-3 / 600, { rel: 1e-15 });
    expect(m.load).toBe(5);
    expect(() => read({ meltFlowRate: "2 bar, 5 kg", density: "0.75 g/cm3" })).toThrow(/not a mass rate/);
  });
});
