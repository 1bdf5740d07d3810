/**
 * Starting values' slope search (src/core/models/guess.ts): the running-sum path for long curves
 * finds the same steepest window as the window-by-window least squares.
 */
import { lineFit, steepestSlope } from "../src/core/models/guess";
import { expectClose } from "./helpers/expectClose";

/** The window-by-window search, written out (what steepestSlope does below 200 points). */
function bruteForce(rates: number[], etas: number[]): number {
  const x = rates.map(Math.log);
  const y = etas.map(Math.log);
  const width = Math.min(x.length, Math.max(3, Math.ceil(x.length / 5)));
  let steepest = Infinity;
  for (let i = 0; i + width <= x.length; i++) steepest = Math.min(steepest, lineFit(x, y, i, i + width).slope);
  return steepest;
}

describe("steepestSlope on long curves (running sums)", () => {
  const rates = (n: number) => Array.from({ length: n }, (_, i) => 0.01 * Math.pow(1e6, i / (n - 1)));
  // a Cross curve with a second plateau and a ±1 % fixed ripple (not noise: a fixed pattern)
  const cross = (r: number[]) => r.map((g, i) => (10 + (1e4 - 10) / (1 + Math.pow(0.5 * g, 0.7))) * (1 + 0.01 * Math.sin(2.3 * i)));
  test.each([201, 1000, 5000])("%d points: the same slope as every window fitted by least squares", (n) => {
    const r = rates(n);
    const e = cross(r);
    expectClose(steepestSlope({ shearRate: r, viscosity: e }), bruteForce(r, e), { rel: 1e-12 });
  });
  test("the slope of a power law is n − 1 on the fast path too", () => {
    const r = rates(500);
    expectClose(steepestSlope({ shearRate: r, viscosity: r.map((g) => 3000 * Math.pow(g, -0.62)) }), -0.62, { rel: 1e-12 });
  });
});
