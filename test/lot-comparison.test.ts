import { DEFAULT_LOT_COMPARISON_OPTIONS, compareLot, type LotReference } from "../src/core/lotComparison";
import { compareParameters } from "../src/core/parameterComparison";
import { fitModel } from "../src/core/fit";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";
import { lotChartSeries, lotComparisonTable, lotVerdictTable } from "../src/io/planTables";

// Constructed cases: the reference table is invented; expected deviations are by hand.
const ref: LotReference = { kind: "table", shearRate: [10, 100, 1000], viscosity: [2000, 800, 200] };

describe("compareLot(reference table, lot) at the reference's rates", () => {
  test("identical rates: deviation = η_lot/η_ref − 1, pass inside ±10 %", () => {
    const r = compareLot(ref, { shearRate: [10, 100, 1000], viscosity: [2100, 760, 205] });
    expect(r.points.map((p) => p.status)).toEqual(["pass", "pass", "pass"]);
    expectClose(r.points[0]!.deviation as number, 0.05, { rel: 1e-12 });
    expectClose(r.points[1]!.deviation as number, -0.05, { rel: 1e-12 });
    expectClose(r.points[2]!.deviation as number, 0.025, { rel: 1e-12 });
    expect(r.verdict).toBe("pass");
    expect(r.worst?.shearRate).toBe(10); // |+5 %| ties |−5 %|: the first of largest |d| is kept
    expect(r.tolerance).toBe(DEFAULT_LOT_COMPARISON_OPTIONS.tolerance);
    expectClose(r.points[1]!.lower, 720, { rel: 1e-12 });
    expectClose(r.points[1]!.upper, 880, { rel: 1e-12 });
  });

  test.each([
    // just inside, on, and just outside the upper and lower edges of a ±10 % band at 100 1/s
    [879.99, "pass"],
    [880, "pass"],
    [880.01, "fail"],
    [720.01, "pass"],
    [720, "pass"],
    [719.99, "fail"],
  ])("band edge: lot %p Pa·s against 800 ± 10 %% → %p", (lotValue, status) => {
    const r = compareLot(ref, { shearRate: [10, 100, 1000], viscosity: [2000, lotValue, 200] });
    expect(r.points[1]!.status).toBe(status);
    expect(r.verdict).toBe(status);
    if (status === "fail") {
      expect(r.worst?.shearRate).toBe(100);
      expect(r.failed).toBe(1);
    }
  });

  test("tolerance 5 %: the same lot fails at 100 1/s (−5.0125 %) and passes at −4.9875 %", () => {
    expect(compareLot(ref, { shearRate: [10, 100, 1000], viscosity: [2000, 759.9, 200] }, { tolerance: 0.05 }).verdict).toBe("fail");
    expect(compareLot(ref, { shearRate: [10, 100, 1000], viscosity: [2000, 760.1, 200] }, { tolerance: 0.05 }).verdict).toBe("pass");
  });

  // Log–log interpolation by hand: lot points (50, 1000) and (200, 500): at 100 1/s,
  // t = ln(100/50)/ln(200/50) = 0.5, η = exp(0.5 ln 1000 + 0.5 ln 500) = √(500 000) = 707.107 Pa·s.
  test("lot measured at other rates: interpolated in log–log, not linearly", () => {
    const r = compareLot(ref, { shearRate: [5, 50, 200, 2000], viscosity: [2200, 1000, 500, 180] });
    // @check lotComparison | lot viscosity between measured rates interpolated log–log: the geometric mean on a power-law segment | Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1 (1987), ch. 4 (power law straight in log–log; from memory) | rel 1e-6 | 1
    expectClose(r.points[1]!.lotViscosity as number, 707.107, { rel: 1e-6 });
    expectClose(r.points[1]!.deviation as number, 707.1068 / 800 - 1, { rel: 1e-5 });
    expect(r.points[1]!.status).toBe("fail"); // −11.6 %
    // a power law is a straight line in log–log: interpolation is exact for it
    const pl = (g: number) => 5000 * Math.pow(g, -0.6);
    const lot = compareLot({ kind: "table", shearRate: [30, 300], viscosity: [pl(30), pl(300)] }, { shearRate: [3, 3000], viscosity: [pl(3), pl(3000)] });
    lot.points.forEach((p) => expectClose(p.deviation as number, 0, { abs: 1e-12 }));
  });

  test("reference rates outside the lot's range are not compared (no extrapolation) and reported", () => {
    const r = compareLot(ref, { shearRate: [20, 100, 500], viscosity: [1500, 800, 300] });
    expect(r.points.map((p) => p.status)).toEqual(["not-compared", "pass", "not-compared"]);
    expect(r.points[0]!.lotViscosity).toBeNull();
    expect(r.compared).toBe(1);
    expect(r.notCompared).toBe(2);
    expect(r.verdict).toBe("pass");
    expect(r.warnings[0]!.code).toBe("LOT_POINTS_NOT_COMPARED");
    expect(r.warnings[0]!.message).toMatch(/10\.00, 1000 1\/s/);
  });

  test("nothing inside the lot's range: verdict not-compared, never pass", () => {
    const r = compareLot(ref, { shearRate: [2000, 3000], viscosity: [100, 80] });
    expect(r.verdict).toBe("not-compared");
    expect(r.worst).toBeNull();
    expect(r.warnings.map((w) => w.code)).toEqual(["LOT_POINTS_NOT_COMPARED", "LOT_NOTHING_COMPARED"]);
  });
});

describe("compareLot(reference model, lot)", () => {
  // power law η = K·γ̇^(n−1), K = 1e4, n = 0.4 (invented): η(10) = 2511.886, η(100) = 630.957 Pa·s
  const model: LotReference = { kind: "model", model: "power-law", parameters: { K: 1e4, n: 0.4 } };
  test("at the lot's own rates by default", () => {
    const r = compareLot(model, { shearRate: [10, 100], viscosity: [2511.886 * 1.08, 630.957 * 0.89] });
    expectClose(r.points[0]!.referenceViscosity, 2511.886, { rel: 1e-6 });
    expectClose(r.points[0]!.deviation as number, 0.08, { rel: 1e-5 });
    expect(r.points.map((p) => p.status)).toEqual(["pass", "fail"]);
    expect(r.worst?.shearRate).toBe(100);
  });
  test("at given rates, interpolating the lot", () => {
    const r = compareLot({ ...model, shearRate: [31.6227766] }, { shearRate: [10, 100], viscosity: [2511.886, 630.957] });
    expectClose(r.points[0]!.deviation as number, 0, { abs: 1e-6 });
  });
  test("bad model parameters name the parameter", () => {
    expect(() => compareLot({ kind: "model", model: "power-law", parameters: { K: 1e4 } }, { shearRate: [1], viscosity: [1] })).toThrow(/missing: n/);
  });
});

describe("compareLot: bad input", () => {
  test.each([
    [{ shearRate: [1, 2], viscosity: [1] }, /^lot: has 2 shear rates but 1 viscosities/],
    [{ shearRate: [1, -2], viscosity: [1, 1] }, /^lot shear rate: row 2/],
    [{ shearRate: [1, 2], viscosity: [1, NaN] }, /^lot viscosity: row 2/],
    [{ shearRate: [1, 1], viscosity: [1, 2] }, /twice/],
    [{ shearRate: [], viscosity: [] }, /^lot: needs at least 1 point/],
  ])("lot %#", (lot, message) => {
    expect(() => compareLot(ref, lot)).toThrow(RheoError);
    expect(() => compareLot(ref, lot)).toThrow(message);
  });
  test("tolerance must be positive", () => {
    expect(() => compareLot(ref, { shearRate: [1], viscosity: [1] }, { tolerance: 0 })).toThrow(/^tolerance:/);
  });
});

describe("compareParameters(reference, lot) with confidence intervals", () => {
  test("reference value inside / outside the lot's interval", () => {
    const lot = { parameters: { K: 1.1e4, n: 0.42 }, confidenceIntervals: { K: [1.0e4, 1.2e4] as [number, number], n: [0.41, 0.43] as [number, number] } };
    const r = compareParameters({ parameters: { K: 1e4, n: 0.4 } }, lot);
    expect(r.rows.map((x) => x.consistent)).toEqual([true, false]); // K = 1e4 on the interval's edge: inside
    expect(r.verdict).toBe("inconsistent");
    expectClose(r.rows[0]!.relativeDifference as number, 0.1, { rel: 1e-12 });
  });
  test("both intervals: overlap decides", () => {
    const r = compareParameters(
      { parameters: { n: 0.4 }, confidenceIntervals: { n: [0.38, 0.42] } },
      { parameters: { n: 0.45 }, confidenceIntervals: { n: [0.421, 0.48] } },
    );
    expect(r.rows[0]!.consistent).toBe(false);
    const touching = compareParameters(
      { parameters: { n: 0.4 }, confidenceIntervals: { n: [0.38, 0.42] } },
      { parameters: { n: 0.45 }, confidenceIntervals: { n: [0.42, 0.48] } },
    );
    expect(touching.verdict).toBe("consistent");
  });
  test("no intervals: not judged; a missing lot parameter is named", () => {
    expect(compareParameters({ parameters: { n: 0.4 } }, { parameters: { n: 0.5 } }).verdict).toBe("not-judged");
    expect(() => compareParameters({ parameters: { K: 1 } }, { parameters: { n: 0.5 } })).toThrow(/^lot: has no parameter "K"/);
  });
  // Recovery: a lot made exactly from the reference power law, fitted, keeps the reference inside its CI.
  test("a fit of data made from the reference model is consistent with it", () => {
    const rates = [10, 30, 100, 300, 1000];
    const noise = [1.01, 0.99, 1.005, 0.995, 1.0];
    const visc = rates.map((g, i) => 1e4 * Math.pow(g, -0.6) * (noise[i] as number));
    const fit = fitModel("power-law", { shearRate: rates, viscosity: visc });
    expect(compareParameters({ parameters: { K: 1e4, n: 0.4 } }, fit).verdict).toBe("consistent");
  });
});

describe("sheet tables for the pane (src/io/planTables.ts)", () => {
  test("lotComparisonTable: status column and pass flags; lotChartSeries: reference, band, lot", () => {
    const lot = { shearRate: [20, 100, 500], viscosity: [1500, 900, 300] };
    const r = compareLot(ref, lot);
    const t = lotComparisonTable(r);
    expect(t.header[t.statusColumn]).toBe("status");
    expect(t.passFlags).toEqual([null, false, null]);
    expect(t.rows[0]![4]).toBe("");
    const series = lotChartSeries(r, lot, "mPa.s");
    expect(series.map((s) => s.role)).toEqual(["reference", "band-lower", "band-upper", "lot"]);
    expectClose(series[2]!.y[1] as number, 880e3, { rel: 1e-12 }); // 800 Pa·s + 10 % in mPa·s
    expect(series[3]!.x).toEqual([20, 100, 500]);
    const v = lotVerdictTable(r);
    expect(v.header).toEqual(["verdict", "FAIL"]);
  });
});
