import { reduce, Measurement, DEFAULT_REDUCE_OPTIONS } from "../src/core/reduce";
import { wallRateFromApparentRate } from "../src/core/forwardFlow";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";

/** Carreau viscosity (Carreau 1972) of a melt-like liquid. */
const eta = (g: number) => 5000 * Math.pow(1 + (0.5 * g) ** 2, (0.4 - 1) / 2);

/**
 * Exact raw data: for each die and apparent rate, the wall stress from the flow integral
 * (Macosko 1994, ch. 6, from memory) and ΔP = 2τ_w(L/R + e) (Bagley 1957) with e = 2.5.
 */
const RATES = [20, 50, 100, 200, 500, 1000, 2000];
const STRESSES = RATES.map((rate) => {
  const wall = wallRateFromApparentRate(eta, rate);
  return eta(wall) * wall;
});

function rawData(lengths: number[], D = 1e-3, temperature?: number): Measurement[] {
  return lengths.flatMap((L) =>
    RATES.map((rate, i) => {
      const tau = STRESSES[i] as number;
      const m: Measurement = { dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: 2 * tau * ((2 * L) / D + 2.5) };
      if (temperature !== undefined) m.temperature = temperature;
      return m;
    }),
  );
}

describe("reduce(measurements) on exact data", () => {
  const result = reduce(rawData([10e-3, 20e-3, 30e-3]));
  const group = result.groups[0]!;

  test("one group; Bagley recovers e = 2.5 at every rate", () => {
    expect(result.groups).toHaveLength(1);
    expect(group.temperature).toBeNull();
    expect(group.bagley).toHaveLength(7);
    group.bagley.forEach((b) => expectClose(b.endCorrection, 2.5, { rel: 1e-9 }));
  });

  test("the true viscosity matches the Carreau law at the corrected wall rate within 1 %", () => {
    for (const row of group.flowCurve) {
      expect(row.shearRateWall).not.toBeNull();
      expectClose(row.viscosity as number, eta(row.shearRateWall as number), { rel: 0.01 });
      expectClose(row.viscosityApparent, row.wallShearStress / row.shearRateApparent, { rel: 1e-14 });
    }
  });

  test("apparent point quantities are kept per raw row", () => {
    expect(group.points).toHaveLength(21);
    const p = group.points[0]!;
    expectClose(p.wallShearStressApparent, (p.pressure * p.dieDiameter) / (4 * p.dieLength), { rel: 1e-14 });
  });
});

describe("grouping", () => {
  test("one group per temperature and die diameter", () => {
    const data = [...rawData([10e-3, 20e-3], 1e-3, 463.15), ...rawData([10e-3, 20e-3], 1e-3, 483.15), ...rawData([20e-3, 40e-3], 2e-3, 483.15)];
    const result = reduce(data);
    const expected = [
      [463.15, 1e-3],
      [483.15, 1e-3],
      [483.15, 2e-3],
    ];
    expect(result.groups).toHaveLength(3);
    result.groups.forEach((g, i) => {
      expectClose(g.temperature as number, expected[i]![0]!, { rel: 1e-12 });
      expectClose(g.dieDiameter, expected[i]![1]!, { rel: 1e-12 });
    });
    // group warnings are repeated at the top level with the group named
    expect(result.warnings.some((w) => w.code === "BAGLEY_FEW_DIES" && w.message.startsWith("190 °C, D 1 mm:"))).toBe(true);
  });
  test("temperatures within the tolerance join one group", () => {
    const data = [...rawData([10e-3], 1e-3, 483.15), ...rawData([20e-3], 1e-3, 483.15 + DEFAULT_REDUCE_OPTIONS.temperatureTolerance / 2)];
    expect(reduce(data).groups).toHaveLength(1);
  });
});

describe("end correction none", () => {
  test("uses the longest die's apparent stress and says so", () => {
    const result = reduce(rawData([10e-3]), { endCorrection: "none" });
    expect(result.warnings.map((w) => w.code)).toContain("END_CORRECTION_NONE");
    const g = result.groups[0]!;
    expect(g.bagley).toEqual([]);
    expectClose(g.flowCurve[0]!.wallShearStress, g.points[0]!.wallShearStressApparent, { rel: 1e-14 });
  });
});

describe("errors", () => {
  test("a single die where Bagley needs two", () => {
    expect(() => reduce(rawData([10e-3]))).toThrow(/dieLength: D 1 mm has a single die length \(10 mm\); the Bagley correction needs two or more/);
  });
  test("a negative pressure names the row", () => {
    const data = rawData([10e-3, 20e-3]);
    data[3]!.pressure = -1;
    expect(() => reduce(data)).toThrow("pressure: row 4 must be greater than zero, got -1");
  });
  test("NaN is refused, not propagated", () => {
    const data = rawData([10e-3, 20e-3]);
    data[0]!.flowRate = NaN;
    expect(() => reduce(data)).toThrow("flowRate: row 1 must be a finite number, got NaN");
  });
  test("no data", () => expect(() => reduce([])).toThrow("measurements: no data rows"));
  test("unknown end correction", () => expect(() => reduce(rawData([1e-2]), { endCorrection: "magic" as never })).toThrow('endCorrection: unknown end correction "magic"; accepted: bagley, none'));
});
