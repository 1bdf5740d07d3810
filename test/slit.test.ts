import { reduce, Measurement } from "../src/core/reduce";
import { slitWallShearStress, slitLengthOverHeight, slitWarnings, DEFAULT_SLIT_OPTIONS } from "../src/core/slit";
import { apparentSlitRateFromWallRate, slitShapeFactor } from "../src/core/slitFlow";
import { readRawTable } from "../src/io/rawTable";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

const W = 10e-3;
const H = 1e-3;

describe("slit formulas", () => {
  // Force balance on a slab of the slit (Macosko 1994, ch. 6, from memory): τ_w = ΔP·H/(2L).
  test("slitWallShearStress(1e7, 1 mm, 20 mm) = 2.5e5 Pa; with ΔP_ent = 2e6, 2e5 Pa", () => {
    // @check slit | τ_w = (ΔP − ΔP_ent)·H/(2L) from a force balance on the slit, two cases | Macosko, Rheology (1994), ch. 6, slit rheometry (from memory); ISO 11443 | rel 1e-15 | 2
    expectClose(slitWallShearStress(1e7, 1e-3, 20e-3), 2.5e5, { rel: 1e-15 });
    expectClose(slitWallShearStress(1e7, 1e-3, 20e-3, 2e6), 2e5, { rel: 1e-15 });
  });
  test("slitLengthOverHeight(20 mm, 1 mm) = 20", () => expect(slitLengthOverHeight(20e-3, 1e-3)).toBe(20));
  test("bad geometry is refused, naming the argument", () => {
    expect(() => slitWallShearStress(1e7, 0, 20e-3)).toThrow(/slitHeight: must be greater than zero/);
    expect(() => slitLengthOverHeight(-1, 1e-3)).toThrow(RheoError);
  });
  test("SLIT_NARROW below W/H = 10 (common practice), none at 10", () => {
    expect(DEFAULT_SLIT_OPTIONS.minAspectRatio).toBe(10);
    expect(slitWarnings(5e-3, 1e-3).map((w) => w.code)).toEqual(["SLIT_NARROW"]);
    expect(slitWarnings(10e-3, 1e-3)).toEqual([]);
  });
});

/**
 * Newtonian slit, plane Poiseuille flow (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed.
 * 2002, ch. 2, flow through a narrow slit, from memory): Q = W H³ ΔP_die/(12 μ L), so ΔP_die = 12μQL/(WH³), the wall
 * rate is 6Q/(WH²) exactly and τ_w = ΔP_die·H/(2L). A constant entrance loss is added.
 */
function newtonianSlit(mu: number, entrance: number, lengths: number[], rates: number[]): Measurement[] {
  return lengths.flatMap((L) =>
    rates.map((rate) => {
      const Q = (rate * W * H * H) / 6;
      return { slitWidth: W, slitHeight: H, dieLength: L, flowRate: Q, pressure: entrance + (12 * mu * Q * L) / (W * H ** 3) };
    }),
  );
}

describe("reduce() with slit dies", () => {
  test("Newtonian slit: γ̇_a = 6Q/(WH²), τ = μγ̇ and η = μ exactly after the L/H Bagley plot", () => {
    const mu = 800;
    const r = reduce(newtonianSlit(mu, 3e5, [10e-3, 20e-3, 40e-3], [10, 30, 100, 300]));
    const g = r.groups[0]!;
    expect(g.geometry).toBe("slit");
    expectClose(g.slitWidth as number, W, { rel: 1e-12 });
    expectClose(g.slitHeight as number, H, { rel: 1e-12 });
    expect(Number.isNaN(g.dieDiameter)).toBe(true);
    [10, 20, 40].forEach((x, i) => expectClose(g.dies[i]!.lengthOverRadius, x, { rel: 1e-12 }));
    g.bagley.forEach((b) => {
      expectClose(b.entrancePressure, 3e5, { rel: 1e-9 });
      // e in gaps: ΔP_ent / (2τ_w)
      expectClose(b.endCorrection, 3e5 / (2 * mu * b.shearRateApparent), { rel: 1e-9 });
    });
    g.flowCurve.forEach((f) => {
      expectClose(f.wallShearStress, mu * f.shearRateApparent, { rel: 1e-9 });
      expectClose(f.nPrime, 1, { rel: 1e-6 });
      expectClose(f.shearRateWall as number, f.shearRateApparent, { rel: 1e-6 });
      expectClose(f.viscosity as number, mu, { rel: 1e-6 });
    });
  });

  test("power-law slit: the true wall rate is γ̇_a(2n+1)/(3n) (Macosko 1994, ch. 6, from memory)", () => {
    const K = 2e4;
    const n = 0.4;
    const eta = (g: number) => K * Math.pow(g, n - 1);
    const wallRates = [10, 30, 100, 300, 1000];
    // apparent rates from the plane-Poiseuille flow integral by quadrature (slitFlow.ts), not from the factor
    const data: Measurement[] = [10e-3, 30e-3].flatMap((L) =>
      wallRates.map((w) => {
        const apparent = apparentSlitRateFromWallRate(eta, w);
        return { slitWidth: W, slitHeight: H, dieLength: L, flowRate: (apparent * W * H * H) / 6, pressure: 2 * K * w ** n * (L / H) };
      }),
    );
    const g = reduce(data).groups[0]!;
    g.flowCurve.forEach((f, i) => {
      expectClose(f.nPrime, n, { rel: 1e-6 });
      expectClose(f.shearRateWall as number, f.shearRateApparent * ((2 * n + 1) / (3 * n)), { rel: 1e-6 });
      expectClose(f.shearRateWall as number, wallRates[i] as number, { rel: 1e-6 });
      expectClose(f.viscosity as number, eta(wallRates[i] as number), { rel: 1e-6 });
    });
  });

  test("slits are grouped by (W, H); a narrow slit warns SLIT_NARROW; round dies form their own group", () => {
    const narrow = newtonianSlit(500, 1e5, [10e-3, 20e-3], [10, 100]).map((m) => ({ ...m, slitWidth: 5e-3 }));
    const round: Measurement[] = [10e-3, 20e-3].flatMap((L) => [10, 100].map((rate) => ({ dieDiameter: 1e-3, dieLength: L, flowRate: (rate * Math.PI * 1e-9) / 32, pressure: 500 * rate * 4 * (L / 1e-3) + 1e5 })));
    const r = reduce([...newtonianSlit(500, 1e5, [10e-3, 20e-3], [10, 100]), ...narrow, ...round]);
    expect(r.groups.map((g) => g.geometry).sort()).toEqual(["round", "slit", "slit"]);
    expect(r.warnings.filter((w) => w.code === "SLIT_NARROW")).toHaveLength(1);
    expect(r.warnings.find((w) => w.code === "SLIT_NARROW")!.message).toMatch(/slit 5 mm × 1 mm/);
  });

  test("a row with both a diameter and a slit size, or half a slit, is refused", () => {
    const base = { dieLength: 10e-3, flowRate: 1e-9, pressure: 1e6 };
    expect(() => reduce([{ ...base, dieDiameter: 1e-3, slitWidth: W, slitHeight: H }])).toThrow(/dieDiameter: row 1 is given together with a slit/);
    expect(() => reduce([{ ...base, slitWidth: W }])).toThrow(/slitHeight: row 1 a slit needs both/);
    expect(() => reduce([{ ...base }])).toThrow(/dieDiameter: row 1 needs a die diameter/);
  });
});

describe("readRawTable() with slit_width and slit_height", () => {
  test("reads slit rows and round rows in one table (blank cells of the other kind)", () => {
    const t = readRawTable([
      ["die_diameter [mm]", "slit_width [mm]", "slit_height [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"],
      [1, "", "", 20, 10, 100],
      ["", 10, 1, 20, 10, 100],
    ]);
    expect(t.measurements).toHaveLength(2);
    expect(t.measurements[0]).toMatchObject({ dieDiameter: 1e-3 });
    expect(t.measurements[0]!.slitWidth).toBeUndefined();
    expectClose(t.measurements[1]!.slitWidth as number, 10e-3, { rel: 1e-15 });
    expectClose(t.measurements[1]!.slitHeight as number, 1e-3, { rel: 1e-15 });
    expect(t.measurements[1]!.dieDiameter).toBeUndefined();
    expect(t.warnings).toEqual([]);
  });
  test("a slit-only table needs no die_diameter column", () => {
    const t = readRawTable([["slit_width [mm]", "slit_height [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"], [10, 1, 20, 10, 100]]);
    expect(t.measurements[0]!.dieDiameter).toBeUndefined();
  });
  test("errors: half a slit column pair; both kinds in one row; neither in a row is skipped with a warning", () => {
    expect(() => readRawTable([["slit_width [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"], [10, 20, 10, 100]])).toThrow(/slit_height: a slit die needs both/);
    const header = ["die_diameter [mm]", "slit_width [mm]", "slit_height [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"];
    expect(() => readRawTable([header, [1, 10, 1, 20, 10, 100]])).toThrow(/row 2: has both a die diameter and a slit size/);
    const t = readRawTable([header, [1, "", "", 20, 10, 100], ["", "", "", 20, 10, 100]]);
    expect(t.warnings.map((w) => w.code)).toEqual(["ROW_SKIPPED_BLANK"]);
  });
});

/**
 * Finite width: Newtonian flow in a rectangular duct, Q = (WH³ΔP/(12μL))·F (Boussinesq series;
 * White, Viscous Fluid Flow, ch. 3, from memory). Check values: the Poiseuille numbers f·Re of rectangular
 * ducts (Shah & London, Laminar Flow Forced Convection in Ducts, 1978; from memory), which give F
 * through f·Re = 24/((1 + α)²·F), α = H/W (D_h = 2WH/(W + H)).
 */
describe("slit shape factor and edge correction", () => {
  test.each([
    [1, 14.227],
    [0.5, 15.548],
    [0.25, 18.233],
    [0.125, 20.585],
    [0.1, 21.169],
  ])("α = H/W = %f: f·Re = %f (Shah & London 1978)", (alpha, fRe) => {
// @check slitFlow | Newtonian shape factor of a rectangular duct through its Poiseuille number f·Re, 5 aspect ratios | Shah & London, Laminar Flow Forced Convection in Ducts (1978) (from memory) | rel 1e-4 | 5
    expectClose(24 / ((1 + alpha) ** 2 * slitShapeFactor(1, alpha)), fRe, { rel: 1e-4 });
  });
  test("F → 1 for wide slits; bad sizes are refused", () => {
    expectClose(slitShapeFactor(1000e-3, 1e-3), 1 - 0.63025 / 1000, { rel: 1e-6 });
    expect(() => slitShapeFactor(1e-3, 2e-3)).toThrow(/slitHeight: must not exceed the width/);
    expect(() => slitShapeFactor(0, 1e-3)).toThrow(/slitWidth: must be greater than zero/);
  });
  // a 5:1 Newtonian slit, flow from the exact duct formula with a constant entrance loss
  const w = 5e-3;
  const mu = 300;
  const F = slitShapeFactor(w, H);
  const duct: Measurement[] = [10e-3, 20e-3, 40e-3].flatMap((L) =>
    [10, 30, 100, 300].map((rate) => {
      const Q = (rate * w * H * H) / 6;
      return { slitWidth: w, slitHeight: H, dieLength: L, flowRate: Q, pressure: 2e5 + (12 * mu * Q * L) / (w * H ** 3 * F) };
    }),
  );
  test("uncorrected, a 5:1 slit overstates η by 1/F − 1 = 14 % and says so (SLIT_NARROW)", () => {
    const r = reduce(duct);
// @check slit, slitFlow | a 5:1 Newtonian duct read as parallel plates overstates η by 1/F, 4 rates | White, Viscous Fluid Flow (1974), ch. 3 (from memory) | rel 1e-6 | 4
    r.groups[0]!.flowCurve.forEach((f) => expectClose(f.viscosity as number, mu / F, { rel: 1e-6 }));
    const narrow = r.warnings.find((x) => x.code === "SLIT_NARROW")!;
    expect(narrow.message).toMatch(/understate the wall rate and overstate the viscosity \(by about 14 %/);
  });
  test("slitEdgeCorrection: η = μ exactly; apparent rate and stress unchanged; SLIT_EDGE_CORRECTED", () => {
    const plain = reduce(duct).groups[0]!;
    const r = reduce(duct, { slitEdgeCorrection: true });
    const g = r.groups[0]!;
    expectClose(g.slitShapeFactor as number, F, { rel: 1e-15 });
    g.flowCurve.forEach((f, i) => {
// @check slit, reduceMethods | edge correction: η = μ of the 5:1 Newtonian duct at 4 rates | White, Viscous Fluid Flow (1974), ch. 3 (from memory) | rel 1e-6 | 4
      expectClose(f.viscosity as number, mu, { rel: 1e-6 });
      expect(f.shearRateApparent).toBe(plain.flowCurve[i]!.shearRateApparent);
      expect(f.wallShearStress).toBe(plain.flowCurve[i]!.wallShearStress);
    });
    expect(r.warnings.map((x) => x.code)).toContain("SLIT_EDGE_CORRECTED");
    // round groups are untouched
    expect(reduce(newtonianSlit(800, 3e5, [10e-3, 20e-3], [10, 100]).map(({ slitWidth: _w, slitHeight: _h, ...m }) => ({ ...m, dieDiameter: 1e-3 })), { slitEdgeCorrection: true }).groups[0]!.slitShapeFactor).toBeUndefined();
  });
});
