/**
 * Invariants of the reduction that no tuning can fake:
 * - round trip: raw data made from a known viscosity function by the forward flow integral and
 *   Bagley's relation ΔP = 2τ_w(L/R + e) (Bagley 1957) reduce back to that viscosity function;
 *   the fluid is Herschel–Bulkley (Herschel & Bulkley 1926), whose tube flow is checked against its
 *   closed form in closed-forms.test.ts;
 * - similarity: doubling every length (bore, land, and so Q by 2³) leaves γ̇_a, τ_w, n', γ̇_w and
 *   η unchanged, since the flow curve depends on L/D and Q/D³ only (dimensional analysis);
 * - scaling: multiplying every pressure by k multiplies every stress and viscosity by k and leaves
 *   the rates and n' alone (the momentum balance is linear in the stress);
 * - units: every accepted unit converts to SI and back to the same number.
 */
import { reduce, type Measurement, type ReductionGroup } from "../src/core/reduce";
import { apparentRateFromWallRate } from "../src/core/forwardFlow";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { acceptedUnits, fromSI, knownQuantities, toSI } from "../src/core/units";
import { expectClose } from "./helpers/expectClose";

const tau0 = 800;
const K = 3000;
const n = 0.5;
const viscosity = (g: number) => tau0 / g + K * g ** (n - 1);
const stress = (g: number) => tau0 + K * g ** n;
const WALL = [10, 25, 60, 150, 400, 1000, 2500];
const E = 1.8;

function rawData(D: number, lengthsOverD: number[]): Measurement[] {
  return lengthsOverD.flatMap((ld) =>
    WALL.map((w) => {
      const apparent = apparentRateFromWallRate(viscosity, w);
      return { dieDiameter: D, dieLength: ld * D, flowRate: flowRateForApparentShearRate(apparent, D), pressure: 2 * stress(w) * (2 * ld + E) };
    }),
  );
}

const only = (groups: ReductionGroup[]) => {
  expect(groups).toHaveLength(1);
  return groups[0] as ReductionGroup;
};

describe("round trip: forward flow integral → reduce → the same viscosity function", () => {
  const g = only(reduce(rawData(1e-3, [10, 20, 30])).groups);
  test("Bagley recovers e and the wall stresses exactly", () => {
    g.bagley.forEach((b) => expectClose(b.endCorrection, E, { rel: 1e-9 }));
    g.flowCurve.forEach((p, i) => expectClose(p.wallShearStress, stress(WALL[i] as number), { rel: 1e-9 }));
  });
  test("the true wall rates and viscosities are those of the fluid within 1 %", () => {
    expect(g.flowCurve).toHaveLength(WALL.length);
    g.flowCurve.forEach((p, i) => {
      // @check reduce, reduceGroup | forward integral → reduce round trip: γ̇_w of a Herschel–Bulkley fluid at 7 stresses (default Rabinowitsch smoothing) | Herschel & Bulkley, Kolloid-Z. 39 (1926) 291; Bagley, J. Appl. Phys. 28 (1957) 624 | rel 0.01 | 7
      expectClose(p.shearRateWall as number, WALL[i] as number, { rel: 0.01 }, `point ${i}`);
      expectClose(p.viscosity as number, viscosity(WALL[i] as number), { rel: 0.01 }, `point ${i}`);
    });
  });
});

describe("similarity and scaling", () => {
  const base = only(reduce(rawData(1e-3, [10, 20, 30])).groups);

  test("doubling every length (D, L, and Q by 8) leaves the flow curve unchanged", () => {
    const doubled = rawData(1e-3, [10, 20, 30]).map((m) => ({ ...m, dieDiameter: 2 * (m.dieDiameter as number), dieLength: 2 * m.dieLength, flowRate: 8 * m.flowRate }));
    const g = only(reduce(doubled).groups);
    expect(g.flowCurve).toHaveLength(base.flowCurve.length);
    g.flowCurve.forEach((p, i) => {
      const q = base.flowCurve[i] as (typeof base.flowCurve)[number];
      expectClose(p.shearRateApparent, q.shearRateApparent, { rel: 1e-12 });
      expectClose(p.wallShearStress, q.wallShearStress, { rel: 1e-12 });
      expectClose(p.nPrime, q.nPrime, { rel: 1e-9 });
      expectClose(p.viscosity as number, q.viscosity as number, { rel: 1e-9 });
    });
  });

  for (const k of [0.01, 3, 1000]) {
    test(`pressures × ${k}: stresses and viscosities × ${k}, rates and n' unchanged`, () => {
      const scaled = rawData(1e-3, [10, 20, 30]).map((m) => ({ ...m, pressure: k * m.pressure }));
      const g = only(reduce(scaled).groups);
      g.flowCurve.forEach((p, i) => {
        const q = base.flowCurve[i] as (typeof base.flowCurve)[number];
        expectClose(p.shearRateApparent, q.shearRateApparent, { rel: 1e-12 });
        expectClose(p.wallShearStress, k * q.wallShearStress, { rel: 1e-12 });
        expectClose(p.nPrime, q.nPrime, { rel: 1e-9 });
        expectClose(p.shearRateWall as number, q.shearRateWall as number, { rel: 1e-9 });
        expectClose(p.viscosity as number, k * (q.viscosity as number), { rel: 1e-9 });
      });
      g.bagley.forEach((b, i) => expectClose(b.endCorrection, (base.bagley[i] as (typeof base.bagley)[number]).endCorrection, { rel: 1e-9 }));
    });
  }
});

describe("unit round trips", () => {
  test("every accepted unit of every quantity: fromSI(toSI(x)) = x", () => {
    let count = 0;
    for (const quantity of knownQuantities()) {
      for (const unit of acceptedUnits(quantity)) {
        for (const x of [-40, 1e-7, 0.5, 3.14159, 2.5e8]) {
          if (quantity !== "temperature" && x < 0) continue;
          expectClose(fromSI(toSI(x, unit, quantity), unit, quantity), x, { rel: 1e-13, abs: 1e-12 }, `${x} ${unit}`);
          count++;
        }
      }
    }
    expect(count).toBeGreaterThan(200);
  });
});
