/**
 * reductionSummary(run): each group's line names the one verdict (src/core/fit/verdict.ts): the
 * recommended model with each free parameter as far as the data determine it, and says when no
 * model is well determined; the warning count includes the fits' warnings.
 */
import { reductionSummary } from "../src/cli/summary";
import { type Measurement } from "../src/core/reduce";
import { runReduction } from "../src/core/run";
import { flowRateForApparentShearRate } from "../src/core/capillary";

/** Newtonian liquid, 1000 Pa·s, dies L = 10 and 20 mm of 1 mm bore, e = 2 (Hagen–Poiseuille + Bagley). */
function newtonian(): Measurement[] {
  return [10e-3, 20e-3].flatMap((L) =>
    [10, 30, 100, 300].map((rate) => ({ dieDiameter: 1e-3, dieLength: L, flowRate: flowRateForApparentShearRate(rate, 1e-3), pressure: 2 * 1000 * rate * (2 * L / 1e-3 + 2) })),
  );
}

/** Power-law melt (K = 2e4 Pa·s^n, n = 0.4) through the same dies: the Rabinowitsch factor (3n+1)/(4n) applies exactly. */
function powerLaw(): Measurement[] {
  const K = 2e4;
  const n = 0.4;
  return [10e-3, 20e-3].flatMap((L) =>
    [20, 50, 100, 200, 500, 1000, 2000].map((apparent) => {
      const wall = (apparent * (3 * n + 1)) / (4 * n);
      const tau = K * Math.pow(wall, n);
      return { dieDiameter: 1e-3, dieLength: L, flowRate: flowRateForApparentShearRate(apparent, 1e-3), pressure: 2 * tau * (2 * L / 1e-3 + 2) };
    }),
  );
}

test("a Newtonian liquid: the summary recommends the Newtonian model with μ and no fit warning", () => {
  const run = runReduction(newtonian(), {}, { rank: true });
  const text = reductionSummary(run);
  expect(run.groupFits[0]?.verdict.recommended).toBe("newtonian");
  expect(text).toMatch(/recommended newtonian \(mu 1000 Pa\.s\)/);
  expect(text).not.toMatch(/no model is well determined/);
});

test("a power-law melt: power law recommended; the plateau models' η0 lie outside the data and are passed over", () => {
  const run = runReduction(powerLaw(), {}, { rank: true });
  const v = run.groupFits[0]?.verdict;
  expect(v?.recommended).toBe("power-law");
  expect(v?.status).toBe("well-determined");
  expect(reductionSummary(run)).toMatch(/recommended power-law \(K 2\.*\d* ?e?\+?\d* ?Pa\.s\^n, n 0\.4\)/);
});

test("the warning count of the summary includes the fits' warnings", () => {
  const run = runReduction(newtonian(), {}, { rank: true, compare: ["cross"] });
  const fitWarnings = run.groupFits.flatMap((g) => g.warnings);
  expect(fitWarnings.length).toBeGreaterThan(0);
  const text = reductionSummary(run);
  expect(text).toContain(`${run.warnings.length} warning${run.warnings.length === 1 ? "" : "s"} (`);
  for (const w of fitWarnings) expect(run.warnings).toContainEqual(w);
});
