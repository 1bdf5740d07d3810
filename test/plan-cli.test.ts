/**
 * `rheoledger plan` and `rheoledger compare`, run in-process through main() as the shell runs them.
 */
import { readFileSync } from "node:fs";
import { main } from "../src/cli/main";
import { readPlanOptions } from "../src/io/planOptions";
import { expectClose } from "./helpers/expectClose";

function run(args: string[], files: Record<string, string> = {}) {
  let stdout = "";
  let stderr = "";
  const code = main(args, {
    readFile: (p) => {
      if (p in files) return files[p] as string;
      return readFileSync(p, "utf8");
    },
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
  });
  return { code, stdout, stderr };
}

/** A Newtonian plan (invented glycerol-like liquid, 1.4 Pa·s) whose pressures have a closed form. */
const NEWTONIAN = {
  barrelDiameter: "15 mm",
  usableLength: "200 mm",
  density: "1.26 g/cm3",
  dwellTime: "1 min",
  shearRateMin: "100 1/s",
  shearRateMax: "10000 1/s",
  points: 3,
  priorModel: "newtonian",
  priorParameters: { mu: 1.4 },
  endCorrection: 0,
  dies: [{ name: "L20", type: "capillary", diameter: "1 mm", length: "20 mm" }],
  transducers: [
    { name: "P10", fullScale: "10 bar" },
    { name: "P100", fullScale: "100 bar", accuracy: "0.25 %" },
  ],
};

const json = (o: unknown) => JSON.stringify(o);

describe("rheoledger plan OPTIONS.json --json", () => {
  test("Newtonian: ΔP = 8μLQ/(πR⁴) per step; capacity by hand; P100 suggested", () => {
    const { code, stdout, stderr } = run(["plan", "n.json", "--json"], { "n.json": json(NEWTONIAN) });
    expect(stderr).toBe("");
    expect(code).toBe(0);
    const doc = JSON.parse(stdout);
    const die = doc.dies[0];
    // Hagen–Poiseuille (Bird, Stewart & Lightfoot 2002, eq. 2.3-21, from memory); at γ̇a = 100 1/s:
    // ΔP = 2μγ̇·L/R = 2 · 1.4 · 100 · 40 = 11 200 Pa = 0.112 bar; ×10 and ×100 at the next steps.
    // @check planner, diePressure | every planned step of a Newtonian liquid: Hagen–Poiseuille pressure | Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. (2002), eq. 2.3-21 (from memory) | rel 1e-6 | 3
    for (const s of die.steps) expectClose(s.pressure, (8 * 1.4 * 0.02 * s.flowRate) / (Math.PI * 0.0005 ** 4), { rel: 1e-6 });
    [11200, 112000, 1120000].forEach((p, i) => expectClose(die.steps[i].pressure, p, { rel: 1e-6 }));
    // 0.112 to 11.2 bar spans 100×: no transducer keeps it in 5–90 % FS; P100 covers the top two
    // steps without going over full scale.
    expect(die.transducer.name).toBe("P100");
    expect(die.transducerCoversAll).toBe(false);
    expect(doc.warnings.map((w: { code: string }) => w.code)).toEqual(expect.arrayContaining(["PLAN_PRESSURE_LOW", "PLAN_NO_TRANSDUCER_COVERS"]));
    // Barrel 15 mm × 200 mm = 35.343 cm³ (π·1.5²/4·20); × 1.26 g/cm³ = 44.532 g.
    expectClose(doc.barrelVolume, 3.53429e-5, { rel: 1e-5 });
    expectClose(doc.barrelMass, 0.0445321, { rel: 1e-5 });
    // Q = γ̇πD³/32 = 9.8175e-9, 9.8175e-8, 9.8175e-7 m³/s, 60 s each: 6.5384e-5 m³ in all —
    // more than the barrel holds: the third step runs it empty.
    expectClose(die.volume, 6.53844e-5, { rel: 1e-5 });
    expect(die.steps.map((s: { withinCapacity: boolean }) => s.withinCapacity)).toEqual([true, true, false]);
    expect(doc.totalDuration).toBe(180);
  });

  test("readable output: one ladder per die, a summary and the warnings", () => {
    const { code, stdout } = run(["plan", "workbooks/demo-plan.json"]);
    expect(code).toBe(0);
    expect(stdout).toMatch(/== die "L20" \(capillary\)/);
    expect(stdout).toMatch(/== die "orifice" \(orifice\)/);
    expect(stdout).toMatch(/Summary \(one barrel load per die\)/);
    expect(stdout).toMatch(/pressure \[bar\]/);
  });

  test("plan --help lists every options key", () => {
    const { code, stdout } = run(["plan", "--help"]);
    expect(code).toBe(0);
    for (const k of ["barrelDiameter", "usableLength", "dwellTime", "priorModel", "mfrLoad", "transducers"]) expect(stdout).toContain(k);
  });

  test.each([
    [{ ...NEWTONIAN, barrelDiameter: undefined }, /^rheoledger: barrelDiameter: is required/],
    [{ ...NEWTONIAN, barrelDiameter: 15 }, /barrelDiameter: needs a unit, e.g. "15 mm"/],
    [{ ...NEWTONIAN, barrelDiameter: "15 furlong" }, /barrelDiameter: unknown length unit "furlong"; accepted: m, cm, mm/],
    [{ ...NEWTONIAN, density: "x g/cm3" }, /density: must start with a number/],
    [{ ...NEWTONIAN, barrelDimater: "15 mm" }, /barrelDimater: unknown setting; accepted: barrelDiameter/],
    [{ ...NEWTONIAN, points: 2.5 }, /points: must be a whole number/],
    [{ ...NEWTONIAN, dies: [{ name: "a", type: "capillary", diameter: "1 mm", length: "20 bar" }] }, /dies\[1\]\.length: unknown length unit "bar"/],
    [{ ...NEWTONIAN, dies: [{ name: "a", type: "nozzle", diameter: "1 mm" }] }, /dies\[1\]\.type: unknown die type "nozzle"/],
    [{ ...NEWTONIAN, dies: [{ name: "a", diameter: "1 mm", lenght: "2 mm" }] }, /dies\[1\]: unknown key "lenght"/],
    [{ ...NEWTONIAN, transducers: [{ name: "a" }] }, /transducers\[1\]\.fullScale: is required/],
    [{ ...NEWTONIAN, priorParameters: { mu: "1.4 Pa.s" } }, /priorParameters\.mu: must be a number in SI units/],
    [{ ...NEWTONIAN, mfr: "2 g/10min" }, /give exactly one prior viscosity/],
    [{ ...NEWTONIAN, priorModel: "carreau" }, /priorParameters: unknown parameter "mu" for carreau; accepted: eta0, etaInf, lambda, n/],
    [{ ...NEWTONIAN, rateBasis: "true" }, /rateBasis: must be "apparent" or "wall"/],
  ])("bad options %# exit 1 with a message naming the field", (options, message) => {
    const { code, stdout, stderr } = run(["plan", "o.json"], { "o.json": json(options) });
    expect(code).toBe(1);
    expect(stdout).toBe("");
    expect(stderr).toMatch(message);
  });

  test("not JSON, missing file, no file", () => {
    expect(run(["plan", "o.json"], { "o.json": "{ barrel: 15 }" }).stderr).toMatch(/o\.json: is not valid JSON/);
    expect(run(["plan", "missing.json"]).code).toBe(1);
    expect(run(["plan"]).code).toBe(2);
  });
});

describe("readPlanOptions: priors from an MFR and from one apparent point", () => {
  const base = { ...NEWTONIAN, priorModel: undefined, priorParameters: undefined };
  test("mfr + mfrLoad + density → power law with n = 0.4 (K by hand in test/planner.test.ts: 8960.92)", () => {
    const p = readPlanOptions({ ...base, density: "0.74 g/cm3", mfr: "2 g/10min", mfrLoad: "2.16 kg" });
    // η(γ̇w) = K·γ̇w^(n−1) at γ̇w = 6.86116 1/s: 8960.92 · 6.86116^−0.6 = 2821.7 Pa·s (τ_w/γ̇_w)
    expectClose(p.input.viscosity(6.86116), 19360.3 / 6.86116, { rel: 1e-5 });
    expect(p.priorDescription).toMatch(/n=0.4 \(assumed\) from an MFR/);
  });
  test("apparentViscosity + apparentShearRate with flowIndex 1 is Newtonian", () => {
    const p = readPlanOptions({ ...base, apparentViscosity: "800 Pa.s", apparentShearRate: "100 1/s", flowIndex: 1 });
    expectClose(p.input.viscosity(5), 800, { rel: 1e-12 });
    expectClose(p.input.viscosity(5000), 800, { rel: 1e-12 });
  });
  test("fractions: \"0.25 %\" and 0.0025 are the same accuracy", () => {
    const a = readPlanOptions({ ...NEWTONIAN, transducers: [{ name: "t", fullScale: "1 MPa", accuracy: "0.25 %" }] });
    const b = readPlanOptions({ ...NEWTONIAN, transducers: [{ name: "t", fullScale: "1 MPa", accuracy: 0.0025 }] });
    expectClose(a.input.transducers[0]!.accuracy as number, 0.0025, { rel: 1e-12 });
    expect(b.input.transducers[0]!.accuracy).toBe(0.0025);
    expect(a.input.transducers[0]!.fullScale).toBe(1e6);
  });
});

const REF = "shear_rate [1/s],viscosity [Pa.s]\n10,2000\n100,800\n1000,200\n";
const lotCsv = (v100: number) => `# invented lot\nshear_rate [1/s],viscosity [mPa.s]\n10,${2000e3}\n100,${v100 * 1e3}\n1000,${200e3}\n`;

describe("rheoledger compare LOT.csv --reference REF.csv", () => {
  test("just inside the ±10 % band: PASS, exit 0; just outside: FAIL, exit 3", () => {
    const inside = run(["compare", "lot.csv", "--reference", "ref.csv", "--json"], { "lot.csv": lotCsv(879.9), "ref.csv": REF });
    expect(inside.code).toBe(0);
    expect(JSON.parse(inside.stdout).verdict).toBe("pass");
    const outside = run(["compare", "lot.csv", "--reference", "ref.csv", "--json"], { "lot.csv": lotCsv(880.1), "ref.csv": REF });
    expect(outside.code).toBe(3);
    const doc = JSON.parse(outside.stdout);
    expect(doc.verdict).toBe("fail");
    expect(doc.worst.shearRate).toBe(100);
    expectClose(doc.worst.deviation, 880.1 / 800 - 1, { rel: 1e-9 });
  });
  test("--tolerance 12 lets the same lot pass; text output shows PASS/FAIL words", () => {
    const r = run(["compare", "lot.csv", "--reference", "ref.csv", "--tolerance", "12"], { "lot.csv": lotCsv(880.1), "ref.csv": REF });
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/verdict\s+PASS/);
  });
  test("demo files: the reference's first rate lies below the lot's range and is not compared", () => {
    const r = run(["compare", "workbooks/demo-lot-new.csv", "--reference", "workbooks/demo-lot-reference.csv", "--json"]);
    const doc = JSON.parse(r.stdout);
    expect(doc.points[0].status).toBe("not-compared");
    expect(doc.warnings.map((w: { code: string }) => w.code)).toContain("LOT_POINTS_NOT_COMPARED");
  });
});

describe("rheoledger compare LOT.csv --model NAME --params", () => {
  // power law K = 1e4, n = 0.4 (invented): η(10) = 2511.886, η(100) = 630.957, η(1000) = 158.489 Pa·s
  const lot = "shear_rate [1/s],viscosity [Pa.s]\n10,2600\n100,640\n1000,150\n";
  test("at the lot's rates; --compare-parameters fits the lot and compares with intervals", () => {
    const r = run(["compare", "lot.csv", "--model", "power-law", "--params", "K=1e4,n=0.4", "--compare-parameters", "--json"], { "lot.csv": lot });
    expect(r.stderr).toBe("");
    const doc = JSON.parse(r.stdout);
    expectClose(doc.points[0].referenceViscosity, 2511.886, { rel: 1e-6 });
    expectClose(doc.points[2].deviation, 150 / 158.4893 - 1, { rel: 1e-5 });
    expect(doc.verdict).toBe("pass");
    expect(doc.parameters.rows.map((x: { name: string }) => x.name)).toEqual(["K", "n"]);
  });
  test("usage and input errors", () => {
    expect(run(["compare", "lot.csv"], { "lot.csv": lot }).code).toBe(2);
    expect(run(["compare", "lot.csv", "--model", "power-law", "--reference", "r.csv"], { "lot.csv": lot }).code).toBe(2);
    const noParams = run(["compare", "lot.csv", "--model", "power-law"], { "lot.csv": lot });
    expect(noParams.code).toBe(1);
    expect(noParams.stderr).toMatch(/--params: is required with --model/);
    expect(run(["compare", "lot.csv", "--model", "power-law", "--params", "K=1e4,n=0.4", "--tolerance", "-5"], { "lot.csv": lot }).stderr).toMatch(/--tolerance/);
    const badCsv = run(["compare", "lot.csv", "--model", "power-law", "--params", "K=1e4,n=0.4"], { "lot.csv": "rate,viscosity [Pa.s]\n1,2\n" });
    expect(badCsv.stderr).toMatch(/lot: needs a "shear_rate \[1\/s\]"/);
    const textCell = run(["compare", "lot.csv", "--model", "power-law", "--params", "K=1e4,n=0.4"], { "lot.csv": "shear_rate [1/s],viscosity [Pa.s]\n1,2\n10,n/a\n" });
    expect(textCell.stderr).toMatch(/lot viscosity \[Pa.s\]: line 3 is text "n\/a"/);
  });
});
