import { geometricMean, interpolateLogLog } from "../src/core/interpolate";
import { expectClose } from "./helpers/expectClose";

describe("interpolateLogLog(xs, ys, x)", () => {
  // A power law y = 3x^0.4 is a straight line in log–log: interpolation is exact (by hand).
  const xs = [1, 10, 100, 1000];
  const ys = xs.map((x) => 3 * x ** 0.4);
  test("is exact for a power law between nodes", () => expectClose(interpolateLogLog(xs, ys, 31.6) as number, 3 * 31.6 ** 0.4, { rel: 1e-13 }));
  test("returns the node value at a node, in any input order", () => {
    expect(interpolateLogLog([...xs].reverse(), [...ys].reverse(), 100)).toBe(ys[2]);
  });
  test("never extrapolates", () => {
    expect(interpolateLogLog(xs, ys, 0.5)).toBeUndefined();
    expect(interpolateLogLog(xs, ys, 2000)).toBeUndefined();
    expect(interpolateLogLog([], [], 1)).toBeUndefined();
  });
});

describe("geometricMean(values)", () => {
  test("√(10·1000) = 100", () => expectClose(geometricMean([10, 1000]), 100, { rel: 1e-15 }));
  test("identical values come back exactly (no round-off from logs)", () => {
    expect(geometricMean([0.001, 0.001, 0.001])).toBe(0.001);
    expect(geometricMean([150, 150])).toBe(150);
  });
});
