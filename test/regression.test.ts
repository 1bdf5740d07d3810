/**
 * fitLine (src/core/regression.ts) against NIST's certified values for the Norris linear
 * regression problem (NIST StRD linear least squares, Norris.dat: 36 observations; certified
 * values as published by NIST), and on data with a large offset in x, where the raw one-pass
 * sums (nΣxy − ΣxΣy)/(nΣx² − (Σx)²) of ml-regression-simple-linear (used here before) lost the
 * slope in the third digit; the reference there is the exact rational least-squares line of the
 * same doubles (Python fractions, scripts notes in docs/numerics.md).
 */
import { fitLine } from "../src/core/regression";
import { expectClose } from "./helpers/expectClose";

const NORRIS_X = [0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0, 447.5, 11.6, 556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3, 229.2, 669.1, 448.9, 0.5];
const NORRIS_Y = [0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3, 448.9, 10.8, 557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6, 228.9, 668.4, 449.2, 0.2];

test("fitLine on NIST StRD Norris: certified coefficients, standard errors, R² and residual sum of squares", () => {
  const f = fitLine(NORRIS_X, NORRIS_Y);
  // @check regression | NIST StRD Norris: B0, B1, their standard errors, R², SSE | NIST Statistical Reference Datasets, linear least squares (Norris.dat, certified values) | rel 1e-10 | 6
  expectClose(f.intercept, -0.262323073774029, { rel: 1e-10 }, "B0");
  expectClose(f.slope, 1.00211681802045, { rel: 1e-12 }, "B1");
  expectClose(f.interceptStandardError, 0.232818234301152, { rel: 1e-10 }, "se(B0)");
  expectClose(f.slopeStandardError, 0.429796848199937e-3, { rel: 1e-10 }, "se(B1)");
  expectClose(f.r2, 0.999993745883712, { rel: 1e-12 }, "R²");
  expectClose(f.residuals.reduce((s, r) => s + r * r, 0), 26.6173985294224, { rel: 1e-10 }, "SSE");
});

test("fitLine keeps its digits when x carries a large offset (x = 1e7 + 0.37·i)", () => {
  const noise = [0.01, -0.02, 0.015, 0, 0.005, -0.01, 0.02, -0.005, 0, 0.01, -0.015, 0.005];
  const x = noise.map((_, i) => 1e7 + i * 0.37);
  const y = x.map((v, i) => 1.7 + 0.3 * (v - 1e7) + (noise[i] as number));
  const f = fitLine(x, y);
  // exact least-squares line of these doubles, in rational arithmetic (Python fractions)
  expectClose(f.slope, 0.29957474957755276, { rel: 1e-8 });
  expectClose(f.intercept, -2995745.7936601425, { rel: 1e-8 });
});
