import { cogswell, cogswellEntrancePressure, cogswellTable, DEFAULT_COGSWELL_OPTIONS } from "../src/core/cogswell";
import { reduce, Measurement } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

describe("cogswell(ΔP_ent, γ̇, η, n)", () => {
  // Cogswell (1972): σ_E = 3(n+1)ΔP/8, ε̇ = 4ηγ̇²/(3(n+1)ΔP); by hand for ΔP = 1 MPa, γ̇ = 100 1/s,
  // η = 1000 Pa·s, n = 0.5: σ_E = 562 500 Pa, ε̇ = 4e7/4.5e6 = 8.8889 1/s, η_E = 63 281.25 Pa·s.
  test("worked numbers by hand", () => {
    const c = cogswell(1e6, 100, 1000, 0.5);
    expectClose(c.tensileStress, 562500, { rel: 1e-15 });
    expectClose(c.extensionRate, 4e7 / 4.5e6, { rel: 1e-15 });
    expectClose(c.extensionalViscosity, 63281.25, { rel: 1e-12 });
    expectClose(c.troutonRatio, 63.28125, { rel: 1e-12 });
  });
  // Trouton (1906): η_E = 3η for a Newtonian liquid. Cogswell's ΔP_ent for η_E = 3η, n = 1 is
  // 4√2·γ̇·√3·η/6 = √(8/3)·ηγ̇; the analysis must return the Trouton ratio 3 from it.
  test("Trouton ratio 3 for a Newtonian liquid", () => {
    const p = cogswellEntrancePressure(50, 200, 600, 1);
    expectClose(p, Math.sqrt(8 / 3) * 200 * 50, { rel: 1e-14 });
    expectClose(cogswell(p, 50, 200, 1).troutonRatio, 3, { rel: 1e-14 });
  });
  test("non-positive input is refused, naming the argument", () => {
    expect(() => cogswell(-1, 1, 1, 1)).toThrow(/entrancePressure: must be greater than zero/);
    expect(() => cogswell(1, 1, 1, 0)).toThrow(/flowIndex: must be greater than zero/);
  });
});

describe("cogswellTable warnings", () => {
  test("COGSWELL_POINT_SKIPPED and COGSWELL_LOW_TROUTON (below 0.9·3, common practice)", () => {
    expectClose(DEFAULT_COGSWELL_OPTIONS.minTroutonRatio, 2.7, { rel: 1e-15 });
    const r = cogswellTable([
      { shearRateApparent: 10, shearRateWall: 10, viscosity: 100, viscosityApparent: 100, nPrime: 1, entrancePressure: -5 },
      { shearRateApparent: 20, shearRateWall: 20, viscosity: 100, viscosityApparent: 100, nPrime: 1, entrancePressure: 1000 },
    ]);
    expect(r.warnings.map((w) => w.code)).toEqual(["COGSWELL_POINT_SKIPPED", "COGSWELL_LOW_TROUTON"]);
    expect(r.rows).toHaveLength(1);
  });
});

describe("reduce(…, { extensional: true }) on a Newtonian liquid with η_E = 3η", () => {
  // Hagen–Poiseuille die flow plus Cogswell's entrance loss for η_E = 3μ: ΔP_ent = √(8/3)·μγ̇
  const MU = 400;
  const D = 1e-3;
  const rates = [10, 30, 100, 300];
  const data: Measurement[] = [5e-3, 10e-3, 20e-3].flatMap((L) =>
    rates.map((rate) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: Math.sqrt(8 / 3) * MU * rate + (4 * MU * rate * L) / D })),
  );
  test("the Trouton ratio comes out 3 through Bagley, Rabinowitsch and Cogswell", () => {
    const g = reduce(data, { extensional: true }).groups[0]!;
    expect(g.extensional).toHaveLength(rates.length);
    g.extensional!.forEach((e) => {
      expectClose(e.troutonRatio, 3, { rel: 1e-6 });
      expectClose(e.extensionalViscosity, 3 * MU, { rel: 1e-6 });
    });
  });
  test("COGSWELL_ROUND_ONLY on a slit group", () => {
    expect(DEFAULT_COGSWELL_OPTIONS.shearRate).toBe("apparent");
    const slit = data.map(({ dieDiameter: _d, ...m }) => ({ ...m, slitWidth: 10e-3, slitHeight: 1e-3 }));
    expect(reduce(slit, { extensional: true }).warnings.map((w) => w.code)).toContain("COGSWELL_ROUND_ONLY");
  });
});

/**
 * Which shear rate: Cogswell (1972) works with the apparent wall rate 4Q/(πR³) and η_a = τ_w/γ̇_a;
 * ηγ̇ = τ_w for either pairing, so the Trouton ratio 9(n+1)²ΔP²/(32τ_w²) is the same, while ε̇
 * scales with γ̇ and η_E with 1/γ̇ (algebra of the formulas above). Power-law liquid, n = 0.4:
 * γ̇_w/γ̇_a = (3n+1)/(4n) = 1.375 (Rabinowitsch 1929).
 */
describe("Cogswell on the apparent rate (default) and on the true wall rate", () => {
  const n = 0.4;
  const K = 1e4;
  const D = 1e-3;
  const rates = [10, 30, 100, 300, 1000];
  const tau = (rate: number) => K * (((3 * n + 1) / (4 * n)) * rate) ** n;
  const data: Measurement[] = [5e-3, 10e-3, 20e-3].flatMap((L) =>
    rates.map((rate) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: 8 * tau(rate) + (4 * tau(rate) * L) / D })),
  );
  const apparent = reduce(data, { extensional: true }).groups[0]!.extensional!;
  const wall = reduce(data, { extensional: { shearRate: "wall" } }).groups[0]!.extensional!;
  test("same Trouton ratio and tensile stress; ε̇ and η_E differ by γ̇_w/γ̇_a = 1.375", () => {
    apparent.forEach((a, i) => {
      const w = wall[i]!;
      expect(a.shearRateBasis).toBe("apparent");
      expect(w.shearRateBasis).toBe("wall");
      expectClose(a.shearRate, a.shearRateApparent, { rel: 1e-15 });
      expectClose(w.shearRate, w.shearRateWall, { rel: 1e-15 });
// @check cogswell | apparent and wall rate: same Trouton ratio (9(n+1)²ΔP²/(32τ²) = 35.28) and σ_E; ε̇ and η_E apart by (3n+1)/(4n), 5 rates | Cogswell, Polym. Eng. Sci. 12 (1972) 64; Rabinowitsch, Z. Phys. Chem. A145 (1929) 1 | rel 1e-6 | 25
      expectClose(a.troutonRatio, w.troutonRatio, { rel: 1e-9 });
      // Trouton = 9(n+1)²ΔP²/(32τ²) with ΔP_ent = 8τ: 9·1.96·64/32 = 35.28
      expectClose(a.troutonRatio, (9 * (n + 1) ** 2 * 64) / 32, { rel: 1e-6 });
      expectClose(a.tensileStress, w.tensileStress, { rel: 1e-12 });
      expectClose(w.extensionRate / a.extensionRate, (3 * n + 1) / (4 * n), { rel: 1e-6 });
      expectClose(a.extensionalViscosity / w.extensionalViscosity, (3 * n + 1) / (4 * n), { rel: 1e-6 });
    });
  });
  test("an unknown basis is refused", () => {
    expect(() => cogswellTable([], { shearRate: "true" as "wall" })).toThrow(/shearRate: must be "apparent" or "wall"/);
  });
});
