/**
 * reductionSummary(result, warnings, fits): the model it names must be one whose parameters the
 * data determine (rule: a standard error larger than the value makes a parameter poorly
 * determined; common practice, no source), even when a poorly determined model has a lower AIC.
 */
import { reductionSummary } from "../src/cli/summary";
import { reduce, Measurement } from "../src/core/reduce";
import { fitFlowCurves, GroupFits } from "../src/core/flowCurveFits";
import { RankedFit } from "../src/core/fit";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { warning } from "../src/core/errors";

/** Newtonian liquid, 1000 Pa·s, dies L = 10 and 20 mm of 1 mm bore, e = 2 (Hagen–Poiseuille + Bagley). */
function newtonian(): Measurement[] {
  return [10e-3, 20e-3].flatMap((L) =>
    [10, 30, 100, 300].map((rate) => ({ dieDiameter: 1e-3, dieLength: L, flowRate: flowRateForApparentShearRate(rate, 1e-3), pressure: 2 * 1000 * rate * (2 * L / 1e-3 + 2) })),
  );
}

function withWarning(fit: RankedFit, code: string): RankedFit {
  return { ...fit, result: { ...fit.result, warnings: [...fit.result.warnings, warning(code, "test")] } };
}

test("names the lowest-AIC well-determined model and the poorly determined ones it passed over", () => {
  const result = reduce(newtonian());
  const fits = fitFlowCurves(result, ["newtonian", "power-law"]);
  const ranked = (fits[0] as GroupFits).ranked;
  expect(ranked.length).toBe(2);
  const [first, second] = ranked as [RankedFit, RankedFit];
  // exact data give both fits AIC −∞; set ranks explicitly so the first has the lower AIC
  const doctored: GroupFits[] = [{ ...(fits[0] as GroupFits), ranked: [{ ...withWarning(first, "POORLY_DETERMINED"), aic: 10 }, { ...second, aic: 12 }] }];
  const text = reductionSummary({ result, comparisons: doctored, warnings: [] });
  expect(text).toContain(`best fit ${second.model} (`);
  expect(text).toContain(`(lower AIC but poorly determined parameters: ${first.model})`);
});

test("with every model poorly determined it names the lowest AIC and says so", () => {
  const result = reduce(newtonian());
  const fits = fitFlowCurves(result, ["newtonian"]);
  const only = (fits[0] as GroupFits).ranked[0] as RankedFit;
  const text = reductionSummary({ result, comparisons: [{ ...(fits[0] as GroupFits), ranked: [withWarning(only, "POORLY_DETERMINED")] }], warnings: [] });
  expect(text).toContain(`best fit ${only.model} (`);
  expect(text).toContain("(poorly determined parameters)");
});
