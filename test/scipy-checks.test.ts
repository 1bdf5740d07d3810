/**
 * Checks against scipy (Debian python3-scipy) where no printed example exists: the flow integrals
 * of liquids without a closed form, and the joint shift-factor fits. Reference values come from
 * scripts/scipy_checks_reference.py (committed) through test/fixtures/scipy-checks.json; the test
 * reads only the JSON. scipy integrates the stress form of the flow integral with QUADPACK (quad)
 * and inverts the stress with brentq; the project integrates over the rate with Gauss–Legendre
 * panels, so agreement is an independent check.
 */
import fixture from "./fixtures/scipy-checks.json";
import { apparentRateFromWallRate } from "../src/core/forwardFlow";
import { apparentSlitRateFromWallRate } from "../src/core/slitFlow";
import { evaluateModel } from "../src/core/models";
import { fitArrheniusShift, fitWlfShift } from "../src/core/temperature";
import { expectClose } from "./helpers/expectClose";

describe("flow integrals of Carreau and Cross liquids (scipy quad over the stress)", () => {
  for (const c of fixture.flowIntegrals) {
    test(`${c.fluid} at γ̇w = ${c.wallRate} 1/s: tube and slit`, () => {
      const eta = (g: number) => evaluateModel(c.model, { etaInf: 0, ...(c.parameters as unknown as Record<string, number>) }, [g])[0] as number;
      // @check forwardFlow | tube γ̇_a of Carreau and Cross liquids at 4 wall rates each | scipy 1.10 quad + brentq on the stress integral (scripts/scipy_checks_reference.py) | rel 1e-9 | 8
      expectClose(apparentRateFromWallRate(eta, c.wallRate), c.tube, { rel: 1e-9 }, "tube");
      // @check slitFlow | slit γ̇_a of Carreau and Cross liquids at 4 wall rates each | scipy 1.10 quad + brentq on the stress integral (scripts/scipy_checks_reference.py) | rel 1e-9 | 8
      expectClose(apparentSlitRateFromWallRate(eta, c.wallRate), c.slit, { rel: 1e-9 }, "slit");
    });
  }
});

describe("joint shift fits against scipy.optimize.least_squares", () => {
  test("Arrhenius: Ea and its standard error", () => {
    const a = fixture.shiftFits.arrhenius;
    const fit = fitArrheniusShift(a.curves, a.referenceTemperature);
    // @check temperature/fitShift | Arrhenius joint fit (4 temperatures, cubic master curve): Ea, its standard error and the rms residual | scipy 1.10 least_squares (scripts/scipy_checks_reference.py) | rel 1e-6 (Ea, rmse), 1e-4 (standard error) | 3
    expectClose(fit.activationEnergy, a.activationEnergy, { rel: 1e-6 }, "Ea");
    expectClose(fit.activationEnergyStandardError, a.activationEnergyStandardError, { rel: 1e-4 }, "se(Ea)");
    expectClose(fit.rmse, a.rmse, { rel: 1e-6 }, "rmse");
  });
  test("WLF: C1, C2 and their standard errors", () => {
    const w = fixture.shiftFits.wlf;
    const fit = fitWlfShift(w.curves, w.referenceTemperature);
    // @check temperature/fitShift | WLF joint fit (5 temperatures, C1 and C2 free): C1, C2 and their standard errors | scipy 1.10 least_squares (scripts/scipy_checks_reference.py) | rel 1e-5 (C1, C2), 1e-3 (standard errors) | 4
    expectClose(fit.C1, w.C1, { rel: 1e-5 }, "C1");
    expectClose(fit.C2, w.C2, { rel: 1e-5 }, "C2");
    expectClose(fit.C1StandardError, w.C1StandardError, { rel: 1e-3 }, "se(C1)");
    expectClose(fit.C2StandardError, w.C2StandardError, { rel: 1e-3 }, "se(C2)");
  });
});
