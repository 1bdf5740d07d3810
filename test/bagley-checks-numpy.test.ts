/**
 * The arithmetic of the Bagley-line checks and of the rate ladder against numpy, through
 * test/fixtures/numpy-bagley-checks.json (written by scripts/numpy_bagley_checks_reference.py,
 * committed): the weighted quadratic's curvature statistic z = b₂/se(b₂) with known reading
 * variances, and the log–log interpolation and end continuation of a die's pressure.
 */
import fixture from "./fixtures/numpy-bagley-checks.json";
import { DEFAULT_BAGLEY_CHECK_OPTIONS, curvatureTest } from "../src/core/bagleyChecks";
import { pressureOnLadder } from "../src/core/rateLadder";
import { expectClose } from "./helpers/expectClose";

describe("Bagley curvature statistic against numpy.polyfit (weighted, cov unscaled)", () => {
  test.each(fixture.curvature.map((c, i) => [i, c] as const))("line %i: z = b₂/se(b₂)", (_i, c) => {
    const line = { shearRateApparent: 100, points: c.x.map((x, k) => ({ lengthOverRadius: x, pressure: c.pressure[k] as number })) };
    const result = curvatureTest([line], { sigma: c.sigma, dof: 20 }, DEFAULT_BAGLEY_CHECK_OPTIONS);
    // @check bagleyChecks | curvature statistic z = b₂/se(b₂) of a weighted quadratic Bagley line | numpy.polyfit(w, cov="unscaled"), scripts/numpy_bagley_checks_reference.py | rel 1e-9 | 1
    expectClose(result.z[0] as number, c.z, { rel: 1e-9 });
  });
  test("the z of a line is the same whatever the units of L/R and pressure (the statistic is scale-free)", () => {
    const c = fixture.curvature[0]!;
    const line = { shearRateApparent: 100, points: c.x.map((x, k) => ({ lengthOverRadius: 3 * x, pressure: (c.pressure[k] as number) / 1e5 })) };
    expectClose(curvatureTest([line], { sigma: c.sigma, dof: 20 }, DEFAULT_BAGLEY_CHECK_OPTIONS).z[0] as number, c.z, { rel: 1e-9 });
  });
});

describe("a die's pressure on the group's rate ladder against numpy.interp in log–log", () => {
  test.each(fixture.ladder.map((l) => [l.rate, l] as const))("rate %d 1/s", (_rate, l) => {
    const got = pressureOnLadder({ rates: l.rates, pressures: l.pressures }, l.rate, 0.03);
    // @check rateLadder | log–log interpolation between a die's steps and continuation within 3 % beyond its ends | numpy.interp and numpy.polyfit on ln γ̇, ln ΔP, scripts/numpy_bagley_checks_reference.py | rel 1e-12 | 1
    expectClose(got?.pressure as number, l.pressure, { rel: 1e-12 });
    expect(got?.extrapolated).toBe(l.rate < (l.rates[0] as number) || l.rate > (l.rates[l.rates.length - 1] as number));
  });
  test("no value beyond the 3 % edge", () => {
    const l = fixture.ladder[0]!;
    expect(pressureOnLadder({ rates: l.rates, pressures: l.pressures }, 1040, 0.03)).toBeUndefined();
  });
});
