import { bagleyCorrection, BagleyPoint } from "../src/core/bagley";
import { RheoError } from "../src/core/errors";
import { apparentShearRate } from "../src/core/capillary";
import { expectClose } from "./helpers/expectClose";
import { BENCH_MELTS, capillaryRun, logRates, trueCurve } from "./helpers/capillaryRun";

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
  test("the middle die reading 12 % high bends the lines down: BAGLEY_CURVED, no longer BAGLEY_LOW_R2", () => {
    const pts = exactPoints([10, 20, 30], RATES, () => 2).map((p) => (p.lengthOverRadius === 20 ? { ...p, pressure: p.pressure * 1.12 } : p));
    const result = bagleyCorrection(pts);
    expect(result.rows.every((r) => r.r2 < 0.99)).toBe(true);
    const codes = result.warnings.map((w) => w.code);
    expect(codes).toContain("BAGLEY_CURVED");
    expect(codes).not.toContain("BAGLEY_LOW_R2");
    expect(result.warnings.find((w) => w.code === "BAGLEY_CURVED")?.message).toMatch(/bend downwards/);
    result.rows.forEach((r) => expect(r.curvature).toBeLessThan(0));
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

/**
 * Checks of the lines against the scatter of the readings (bagleyChecks.ts; limits common
 * practice, no source). Pressures from helpers/capillaryRun: a Carreau–Yasuda melt, 4 dies
 * (L/D 5, 10, 20, 30) × 10 rates over 20–5000 1/s, e rising with rate (2 + 1.5·log10(γ̇_a/10)).
 */
describe("Bagley checks: curvature and an irregular end correction", () => {
  const curve = trueCurve(BENCH_MELTS["Carreau–Yasuda"], logRates(20, 5000, 10));
  const points = (run: ReturnType<typeof capillaryRun>): BagleyPoint[] =>
    run.map((m) => ({ die: `L ${m.dieLength}`, lengthOverRadius: (2 * m.dieLength) / (m.dieDiameter as number), shearRateApparent: apparentShearRate(m.flowRate, m.dieDiameter as number), pressure: m.pressure }));
  const codes = (run: ReturnType<typeof capillaryRun>) => bagleyCorrection(points(run)).warnings.map((w) => w.code);

  test("exact straight lines whose e rises with rate: no curvature, no scatter warning", () => {
    const result = bagleyCorrection(points(capillaryRun(curve)));
    expect(result.warnings).toEqual([]);
    result.rows.forEach((r) => expect(Math.abs(r.curvature as number)).toBeLessThan(1e-6));
  });

  test("1 % pressure noise on straight lines, seeds 1–100: BAGLEY_CURVED and the e-scatter warning at most twice each (nominal level 1 %; measured 0 and 0)", () => {
    let curved = 0;
    let scatter = 0;
    for (let seed = 1; seed <= 100; seed++) {
      const c = codes(capillaryRun(curve, { noise: 0.01, seed }));
      if (c.includes("BAGLEY_CURVED")) curved++;
      if (c.includes("BAGLEY_END_CORRECTION_SCATTER")) scatter++;
    }
    expect(curved).toBeLessThanOrEqual(2);
    expect(scatter).toBeLessThanOrEqual(2);
  });

  test("pressure-dependent viscosity (β = 6 GPa⁻¹): R² > 0.99 on every line hid a 13 % bias; BAGLEY_CURVED (upwards) finds it", () => {
    // η ∝ exp(βp) (Barus 1893): the land's pressure −ln(1 − 2βτ_w·L/R)/β bends the Bagley line up.
    const run = capillaryRun(curve, { pressureCoefficient: 6e-9 });
    const result = bagleyCorrection(points(run));
    result.rows.forEach((r) => expect(r.r2).toBeGreaterThan(0.99));
    const top = result.rows[result.rows.length - 1] as { wallShearStress: number };
    expectClose(top.wallShearStress / (curve.stresses[9] as number) - 1, 0.13, { abs: 0.01 }, "straight-line τ_w against τ_w at zero pressure");
    const warning = result.warnings.find((w) => w.code === "BAGLEY_CURVED");
    expect(warning?.message).toMatch(/bend upwards/);
    expect(result.warnings.map((w) => w.code)).not.toContain("BAGLEY_LOW_R2");
  });

  test("the same melt with 0.5 % pressure noise: BAGLEY_CURVED in at least 45 of seeds 1–50 (measured: 49; with 1 % noise 17)", () => {
    let caught = 0;
    for (let seed = 1; seed <= 50; seed++) if (codes(capillaryRun(curve, { pressureCoefficient: 6e-9, noise: 0.005, seed })).includes("BAGLEY_CURVED")) caught++;
    expect(caught).toBeGreaterThanOrEqual(45);
  });

  test("e jumping at one rate (all lines straight): BAGLEY_END_CORRECTION_SCATTER names that rate", () => {
    const jump = curve.rates[5] as number;
    const run = capillaryRun(curve, { endCorrection: (r) => (r === jump ? 8 : 2 + 1.5 * Math.log10(r / 10)) });
    const warning = bagleyCorrection(points(run)).warnings.find((w) => w.code === "BAGLEY_END_CORRECTION_SCATTER");
    expect(warning?.message).toContain(`at ${Number(jump.toPrecision(4))} 1/s`);
  });

  test("dies with fewer than five speeds: BAGLEY_CHECKS_LIMITED says the checks were not made", () => {
    expect(codes(capillaryRun(trueCurve(BENCH_MELTS.Cross, logRates(20, 5000, 4))))).toContain("BAGLEY_CHECKS_LIMITED");
  });
});

describe("one rate ladder per group (rateLadder.ts)", () => {
  test("dies whose rates differ by 0.5 % (bores of one nominal size) give one line per longest-die rate, not twice as many", () => {
    const rates = logRates(20, 2000, 9);
    const pts = [
      ...exactPoints([10, 20], rates.map((r) => r * 1.005), () => 3),
      ...exactPoints([40], rates, () => 3),
    ];
    const result = bagleyCorrection(pts);
    expect(result.rows.map((r) => r.shearRateApparent)).toEqual(rates);
    // the shorter dies' pressures at the lowest rate are continued 0.5 % below their range, and said so
    const interpolated = result.warnings.find((w) => w.code === "BAGLEY_RATES_INTERPOLATED");
    expect(interpolated?.message).toContain("2 of them lie beyond their die's measured rates by at most 3 %");
    for (const row of result.rows) {
      expectClose(row.endCorrection, 3, { rel: 1e-9 });
      expect(row.points.filter((p) => p.interpolated)).toHaveLength(2);
    }
  });

  test("a short die run beyond the longest extends the ladder; a die is never extrapolated further than 3 %", () => {
    const pts = [...exactPoints([10, 20], [10, 100, 1000, 3000], () => 3), ...exactPoints([40], [10, 100, 1000], () => 3)];
    const result = bagleyCorrection(pts);
    expect(result.rows.map((r) => r.shearRateApparent)).toEqual([10, 100, 1000, 3000]);
    expect(result.rows[3]?.diesUsed).toBe(2);
    expect(result.warnings.find((w) => w.code === "BAGLEY_LINE_PARTIAL")?.message).toContain("L/R=40 at 1 rate(s)");
  });

  test("the 10 % kink: a drifted repeat of the first speed is never mixed into another die's interpolation", () => {
    // die L/R 40 measured at the ladder; die L/R 10 at rates 3 % off, its first speed repeated 10 % high at the end
    const rates = [10, 30, 100, 300, 1000];
    const off = rates.map((r) => r * 1.03);
    const repeat: BagleyPoint = { ...(exactPoints([10], [off[0] as number], () => 3)[0] as BagleyPoint) };
    repeat.pressure *= 1.1;
    const clean = [...exactPoints([10], off, () => 3), ...exactPoints([20], off, () => 3), ...exactPoints([40], rates, () => 3)];
    const withRepeat = bagleyCorrection([...clean, repeat]);
    const without = bagleyCorrection(clean);
    expect(withRepeat.rows).toEqual(without.rows);
    expect(withRepeat.warnings.map((w) => w.code)).toContain("REPEAT_DRIFT");
  });
});
