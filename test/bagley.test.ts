import { bagleyCorrection, BagleyPoint, endCorrectionSpread } from "../src/core/bagley";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

/**
 * Exact Bagley data: ΔP = 2τ_w(L/R + e) (Bagley 1957, J. Appl. Phys. 28, 624), with a
 * power-law stress τ_w = K·γ̇^n so that log–log interpolation between rates is exact.
 */
function exactPoints(lOverR: number[], rates: number[], e: (rate: number) => number, K = 1e4, n = 0.4): BagleyPoint[] {
  return lOverR.flatMap((lr) =>
    rates.map((rate) => ({ die: `L/R=${lr}`, lengthOverRadius: lr, shearRateApparent: rate, pressure: 2 * K * rate ** n * (lr + e(rate)) })),
  );
}

const RATES = [10, 30, 100, 300, 1000];

describe("bagleyCorrection(points) on exact data", () => {
  test("recovers e, ΔP_ent and τ_w at every rate, R² = 1", () => {
    const result = bagleyCorrection(exactPoints([10, 20, 40], RATES, (r) => 2 + Math.log10(r)));
    expect(result.rows).toHaveLength(5);
    for (const row of result.rows) {
      const tau = 1e4 * row.shearRateApparent ** 0.4;
      const e = 2 + Math.log10(row.shearRateApparent);
      expectClose(row.wallShearStress, tau, { rel: 1e-12 }, "τ_w");
      expectClose(row.endCorrection, e, { rel: 1e-10 }, "e");
      expectClose(row.entrancePressure, 2 * tau * e, { rel: 1e-10 }, "ΔP_ent");
      expectClose(row.r2, 1, { abs: 1e-12 });
      expect(row.diesUsed).toBe(3);
      expectClose(row.slopeStandardError, 0, { abs: 1e-6 * row.slope });
    }
    expect(result.warnings).toEqual([]);
  });

  test("interpolates (log–log) when the dies ran at different rates", () => {
    const a = exactPoints([10], [10, 100, 1000], () => 3);
    const b = exactPoints([20], [12, 120, 1200], () => 3);
    const c = exactPoints([40], [9, 90, 900, 1100], () => 3);
    const result = bagleyCorrection([...a, ...b, ...c]);
    expect(result.warnings.map((w) => w.code)).toContain("BAGLEY_RATES_INTERPOLATED");
    expect(result.rows.length).toBeGreaterThan(0);
    for (const row of result.rows) {
      expectClose(row.endCorrection, 3, { rel: 1e-9 });
      expectClose(row.wallShearStress, 1e4 * row.shearRateApparent ** 0.4, { rel: 1e-9 });
    }
  });
});

describe("bagleyCorrection warnings (thresholds: common practice, no source)", () => {
  const codes = (pts: BagleyPoint[]) => bagleyCorrection(pts).warnings.map((w) => w.code);
  test("BAGLEY_FEW_DIES with two dies", () => expect(codes(exactPoints([10, 30], RATES, () => 2))).toContain("BAGLEY_FEW_DIES"));
  test("BAGLEY_NEGATIVE_END_CORRECTION", () => expect(codes(exactPoints([10, 20, 30], RATES, () => -1))).toContain("BAGLEY_NEGATIVE_END_CORRECTION"));
  test("BAGLEY_LOW_R2 when the middle die reads 12 % high", () => {
    const pts = exactPoints([10, 20, 30], RATES, () => 2).map((p) => (p.lengthOverRadius === 20 ? { ...p, pressure: p.pressure * 1.12 } : p));
    const result = bagleyCorrection(pts);
    expect(result.rows.every((r) => r.r2 < 0.99)).toBe(true);
    expect(result.warnings.map((w) => w.code)).toContain("BAGLEY_LOW_R2");
  });
  test("BAGLEY_END_CORRECTION_SCATTER when e jumps between rates", () => {
    expect(codes(exactPoints([10, 20, 30], RATES, (r) => (r === 100 ? 12 : 1)))).toContain("BAGLEY_END_CORRECTION_SCATTER");
  });
  test("BAGLEY_RATE_DROPPED when one rate is reached by a single die", () => {
    const pts = [...exactPoints([10, 20, 30], [10, 100], () => 2), ...exactPoints([30], [5000], () => 2)];
    expect(codes(pts)).toContain("BAGLEY_RATE_DROPPED");
  });
  test("BAGLEY_NONPOSITIVE_SLOPE when pressure falls with length", () => {
    const pts = exactPoints([10, 20, 30], [10, 100], () => 2).map((p) =>
      p.shearRateApparent === 100 ? { ...p, pressure: 1e7 - p.lengthOverRadius * 1e4 } : p,
    );
    const result = bagleyCorrection(pts);
    expect(result.warnings.map((w) => w.code)).toContain("BAGLEY_NONPOSITIVE_SLOPE");
    expect(result.rows).toHaveLength(1);
    expectClose((result.rows[0] as { shearRateApparent: number }).shearRateApparent, 10, { rel: 1e-12 });
  });
});

describe("bagleyCorrection errors", () => {
  test("one die length", () => {
    expect(() => bagleyCorrection(exactPoints([10], RATES, () => 2))).toThrow(
      "dieLength: the Bagley correction needs dies of at least two lengths at one diameter, got 1",
    );
  });
  test("non-overlapping rates", () => {
    const pts = [...exactPoints([10], [10, 20], () => 2), ...exactPoints([20], [500, 900], () => 2)];
    expect(() => bagleyCorrection(pts)).toThrow(/no apparent rate is covered by two or more dies/);
  });
  test("negative pressure names the row", () => {
    const pts = exactPoints([10, 20], [10], () => 2);
    (pts[1] as BagleyPoint).pressure = -5;
    let err: unknown;
    try {
      bagleyCorrection(pts);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RheoError);
    expect((err as RheoError).kind).toBe("domain");
    expect((err as RheoError).message).toBe("pressure: row 2 must be greater than zero, got -5");
  });
  test("one die label with two L/R values", () => {
    const pts: BagleyPoint[] = [
      { die: "A", lengthOverRadius: 10, shearRateApparent: 10, pressure: 1e6 },
      { die: "A", lengthOverRadius: 20, shearRateApparent: 20, pressure: 1e6 },
    ];
    expect(() => bagleyCorrection(pts)).toThrow('die: row 2 "A" appears with two different L/R values');
  });
});

test("endCorrectionSpread(values) is (max − min)/|median|", () => {
  expect(endCorrectionSpread([1, 2, 3])).toBe(1);
  expect(endCorrectionSpread([])).toBe(0);
  expect(endCorrectionSpread([-1, 0, 1])).toBe(Infinity);
});
