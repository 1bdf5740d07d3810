import { DEFAULT_INSTABILITY_OPTIONS, findFlowBreak, meltFractureNote } from "../src/core/flowInstability";
import { gaussian, seededRandom } from "../src/core/random";
import { BENCH_MELTS, logRates, trueCurve } from "./helpers/capillaryRun";
import { expectClose } from "./helpers/expectClose";

/**
 * Die pressures of a shear-thinning melt (Carreau–Yasuda, exact flow integral: helpers/capillaryRun)
 * at 10 apparent rates over 20–5000 1/s: ln ΔP = ln(2τ_w(L/R + e)) with e = 3. Thresholds of the
 * test are common practice, no source.
 */
const CURVE = trueCurve(BENCH_MELTS["Carreau–Yasuda"], logRates(20, 5000, 10));
const X = CURVE.rates.map(Math.log);

function dies(options: { noise?: number; seed?: number; factor?: (i: number, die: number) => number } = {}) {
  const random = seededRandom(options.seed ?? 1);
  return [10, 20, 40, 60].map((lr, d) => ({
    x: X,
    y: CURVE.stresses.map((tau, i) => Math.log(2 * tau * (lr + 3) * (options.factor?.(i, d) ?? 1) * (1 + (options.noise ?? 0) * gaussian(random)))),
  }));
}

describe("findFlowBreak(series): a stable melt", () => {
  test("exact data: no break, no fall", () => {
    const r = findFlowBreak(dies());
    expect(r.break).toBeNull();
    expect(r.falls.flat()).toEqual([]);
  });
  test("1 % noise, seeds 1–100: no break in any draw (measured: 0 of 300 in development)", () => {
    let breaks = 0;
    for (let seed = 1; seed <= 100; seed++) if (findFlowBreak(dies({ noise: 0.01, seed })).break) breaks++;
    expect(breaks).toBe(0);
  });
});

describe("findFlowBreak(series): spurt and stall", () => {
  test("pressures cut 15 % at the top three speeds of every die (1 % noise): the break starts at the 8th speed", () => {
    const r = findFlowBreak(dies({ noise: 0.01, seed: 7, factor: (i) => (i >= 7 ? 0.85 : 1) }));
    expect(r.break).not.toBeNull();
    expect(r.break?.firstFlagged).toEqual([7, 7, 7, 7]);
    expectClose(r.break?.jump as number, -0.15, { abs: 0.03 });
    expectClose(Math.exp(r.break?.x as number), CURVE.rates[7] as number, { rel: 1e-12 });
  });
  test("a pressure that stalls (stays flat) over the top two speeds is a break, though it never falls", () => {
    const r = findFlowBreak(dies({ factor: (i) => (i >= 8 ? (CURVE.stresses[7] as number) / (CURVE.stresses[i] as number) : 1) }));
    expect(r.break?.firstFlagged[0]).toBe(8);
    expect(r.break?.falls).toBe(false);
  });
  test("a 15 % cut at the top speed of one die alone (exact data) is found on that die; the pressure still rises (a stall)", () => {
    const r = findFlowBreak([dies({ factor: (i) => (i === 9 ? 0.85 : 1) })[0] as { x: number[]; y: number[] }]);
    expect(r.break?.firstFlagged).toEqual([9]);
    expect(r.break?.falls).toBe(false);
  });
  test("a 25 % cut at the top speed makes the pressure fall", () => {
    const r = findFlowBreak([dies({ factor: (i) => (i === 9 ? 0.75 : 1) })[0] as { x: number[]; y: number[] }]);
    expect(r.break?.firstFlagged).toEqual([9]);
    expect(r.break?.falls).toBe(true);
  });
  test("a single reading 25 % low in the middle of one die is an isolated fall, not a break", () => {
    const series = dies({ factor: (i, d) => (i === 5 && d === 2 ? 0.75 : 1) });
    const r = findFlowBreak(series);
    expect(r.break).toBeNull();
    expect(r.falls[2]).toEqual([5]);
  });
  test("a pressure that jumps up is not a flow instability (only falls and stalls are tested)", () => {
    expect(findFlowBreak(dies({ factor: (i) => (i >= 7 ? 1.2 : 1) })).break).toBeNull();
  });
});

describe("findFlowBreak(series): long series and short ones", () => {
  test("a dense ladder of 6000 speeds is tested on bin means; the break maps to the first flagged reading", () => {
    const x = Array.from({ length: 6000 }, (_, i) => Math.log(20) + (i / 5999) * Math.log(250));
    const random = seededRandom(3);
    const y = x.map((xi, i) => 0.4 * xi + (i >= 4800 ? Math.log(0.85) : 0) + 0.01 * gaussian(random));
    const r = findFlowBreak([{ x, y }]);
    expect(r.break).not.toBeNull();
    const first = r.break?.firstFlagged[0] as number;
    expect(Math.abs(first - 4800)).toBeLessThanOrEqual(6000 / 120);
  });
  test("three points: only a fall of at least minJump counts", () => {
    expect(DEFAULT_INSTABILITY_OPTIONS.minJump).toBe(0.05);
    expect(findFlowBreak([{ x: [0, 1, 2], y: [0, 0.3, 0.24] }]).break?.firstFlagged).toEqual([2]);
    expect(findFlowBreak([{ x: [0, 1, 2], y: [0, 0.3, 0.28] }]).break).toBeNull();
  });
});

describe("meltFractureNote(stress, rate)", () => {
  test("below 0.1 MPa: none; at 0.26 MPa: an info note naming the stress and the 0.1–0.3 MPa range (common practice, no source)", () => {
    expect(meltFractureNote(0.09e6, 1000)).toBeNull();
    const note = meltFractureNote(0.26e6, 3600);
    expect(note?.code).toBe("MELT_FRACTURE_STRESS");
    expect(note?.message).toContain("0.26 MPa (at 3600 1/s)");
    expect(note?.message).toContain("0.1–0.3 MPa");
  });
});
