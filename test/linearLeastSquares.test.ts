/**
 * leastSquares (Householder QR) and fitPolynomial, against closed forms: exact recovery of a
 * polynomial from noise-free points, and the textbook straight-line formulas
 * b = Sxy/Sxx, a = ȳ − b·x̄ (Draper & Smith, Applied Regression Analysis, 3rd ed. 1998, ch. 1, from memory).
 */
import { leastSquares } from "../src/core/linearLeastSquares";
import { fitPolynomial, polynomialValue } from "../src/core/regression";
import { seededRandom } from "../src/core/random";
import { expectClose } from "./helpers/expectClose";

describe("leastSquares(columns, y)", () => {
  test("the JSDoc example: y = 1 + 2x through three points", () => {
    const c = leastSquares([[1, 1, 1], [0, 1, 2]], [1, 3, 5]);
    expectClose(c[0] as number, 1, { abs: 1e-14 });
    expectClose(c[1] as number, 2, { rel: 1e-14 });
  });

  test("a noisy line matches b = Sxy/Sxx, a = ȳ − b·x̄ (closed form)", () => {
    const random = seededRandom(11);
    const x = Array.from({ length: 25 }, (_, i) => i * 0.4 - 3);
    const y = x.map((t) => 2.5 - 0.7 * t + (random() - 0.5));
    const mx = x.reduce((s, v) => s + v, 0) / x.length;
    const my = y.reduce((s, v) => s + v, 0) / y.length;
    let sxy = 0;
    let sxx = 0;
    x.forEach((t, i) => {
      sxy += (t - mx) * ((y[i] as number) - my);
      sxx += (t - mx) ** 2;
    });
    // @check linearLeastSquares, regression | Householder least squares of a noisy line equals the closed form b = Sxy/Sxx, a = ȳ − b·x̄ | Draper & Smith, Applied Regression Analysis, 3rd ed. (1998), ch. 1 (from memory) | rel 1e-12 | 2
    const slope = sxy / sxx;
    const c = leastSquares([x.map(() => 1), x], y);
    expectClose(c[1] as number, slope, { rel: 1e-12 });
    expectClose(c[0] as number, my - slope * mx, { rel: 1e-12 });
  });

  test("a column that depends on the others gets coefficient 0; the fit is still least squares", () => {
    // x takes two values, so x² = 3x − 2 on these points: only 1 and x are determined.
    const x = [1, 1, 2, 2];
    const y = [1, 1.2, 3, 3.1];
    const c = leastSquares([x.map(() => 1), x, x.map((t) => t * t)], y);
    expect(c[2]).toBe(0);
    // least squares over two groups: the line passes through the group means 1.1 and 3.05
    expectClose((c[0] as number) + (c[1] as number), 1.1, { rel: 1e-12 });
    expectClose((c[0] as number) + 2 * (c[1] as number), 3.05, { rel: 1e-12 });
  });

  test("an all-zero column gets coefficient 0", () => {
    const c = leastSquares([[1, 1, 1], [0, 0, 0]], [2, 2, 2]);
    expectClose(c[0] as number, 2, { rel: 1e-14 });
    expect(c[1]).toBe(0);
  });
});

describe("fitPolynomial(x, y, degree, x0)", () => {
  test.each([1, 2, 3])("recovers an exact polynomial of degree %i (noise-free data)", (degree) => {
    const truth = [0.8, -1.3, 0.45, -0.07].slice(0, degree + 1);
    const x = Array.from({ length: 12 }, (_, i) => 0.5 + i * 0.6);
    const x0 = 3.2;
    const y = x.map((t) => polynomialValue(truth, t - x0));
    const c = fitPolynomial(x, y, degree, x0);
    expect(c).toHaveLength(degree + 1);
    c.forEach((ck, k) => expectClose(ck, truth[k] as number, { rel: 1e-10, abs: 1e-12 }, `c${k}`));
  });

  test("the JSDoc example: 1 + x + x² through three points", () => {
    fitPolynomial([0, 1, 2], [1, 3, 7], 2).forEach((c) => expectClose(c, 1, { rel: 1e-12 }));
  });
});
