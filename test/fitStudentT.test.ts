import { normalQuantile, tQuantile } from "../src/core/fit";
import { expectClose } from "./helpers/expectClose";
import reference from "./fixtures/scipy-fits.json";

describe("tQuantile(p, dof) (Hill 1970, ACM Algorithm 396)", () => {
  // Printed two-sided 95 % t-table (e.g. Abramowitz & Stegun 1964, table of the t distribution, from memory; 3 decimals).
  const table: [number, number][] = [
    [1, 12.706],
    [2, 4.303],
    [3, 3.182],
    [5, 2.571],
    [10, 2.228],
    [20, 2.086],
    [30, 2.042],
    [120, 1.98],
  ];
  // @check fit/studentT | two-sided 95 % t quantiles at 8 degrees of freedom | Abramowitz & Stegun, Handbook of Mathematical Functions (1964), table of the t distribution (from memory) | abs 5e-4 | 8
  for (const [dof, t] of table) test(`t(0.975, ${dof}) = ${t} (t-table)`, () => expectClose(tQuantile(0.975, dof), t, { abs: 5e-4 }));
  test("matches scipy.stats.t.ppf to 1e-5 relative (fixture; worst 7e-6 at p 0.95, dof 3)", () => {
    // @check fit/studentT | t quantiles at 52 (p, dof) pairs | scipy fitter fixture (scipy.stats.t.ppf, scripts/scipy_fit_reference.py) | rel 1e-5 | 52
    for (const q of reference.tQuantiles) expectClose(tQuantile(q.p, q.dof), q.t, { rel: 1e-5 }, `p ${q.p}, dof ${q.dof}`);
  });
  test("is odd about p = 0.5", () => {
    expect(tQuantile(0.5, 7)).toBe(0);
    expectClose(tQuantile(0.025, 7), -tQuantile(0.975, 7), { rel: 1e-15 });
  });
  test("rejects p outside (0, 1) and dof < 1", () => {
    expect(() => tQuantile(1, 5)).toThrow("p: must be between 0 and 1, got 1");
    expect(() => tQuantile(0.9, 0)).toThrow("dof: must be at least 1, got 0");
  });
});

describe("normalQuantile(q) (Acklam's approximation)", () => {
  // Abramowitz & Stegun 1964, table of the normal distribution (from memory): z(0.025) = 1.959964, z(0.005) = 2.575829, z(0.05) = 1.644854.
  test("upper-tail deviates", () => {
    // @check fit/studentT | normal quantiles z(0.025), z(0.005), z(0.05) | Abramowitz & Stegun, Handbook of Mathematical Functions (1964), table of the normal distribution (from memory) | rel 1e-8 | 3
    expectClose(normalQuantile(0.025), 1.959963985, { rel: 1e-8 });
    expectClose(normalQuantile(0.005), 2.575829304, { rel: 1e-8 });
    expectClose(normalQuantile(0.05), 1.644853627, { rel: 1e-8 });
    expectClose(normalQuantile(0.975), -1.959963985, { rel: 1e-8 });
  });
});
