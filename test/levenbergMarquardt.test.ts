/**
 * The project's own Levenberg–Marquardt solver (src/core/fit/levenbergMarquardt.ts) on standard
 * nonlinear least-squares problems with known solutions:
 * - NIST StRD nonlinear regression problems (Misra1a, DanWood, BoxBOD, MGH09): data, both NIST
 *   starting points and the certified values and standard errors as published by NIST
 *   (Statistical Reference Datasets, nonlinear regression), copied into
 *   test/fixtures/scipy-checks.json by scripts/scipy_checks_reference.py, which re-solves each
 *   with scipy.optimize.least_squares and asserts the certified values are reproduced (so the
 *   copy is checked);
 * - Rosenbrock's function as least squares, r = (10(u₂ − u₁²), 1 − u₁), minimum 0 at (1, 1) from
 *   the standard start (−1.2, 1) (Rosenbrock, Comput. J. 3 (1960) 175; Moré, Garbow & Hillstrom,
 *   ACM TOMS 7 (1981) 17, problem 1);
 * - the helical valley (Fletcher & Powell 1963; Moré, Garbow & Hillstrom 1981, problem 7),
 *   minimum 0 at (1, 0, 0) from (−1, 0, 0).
 */
import fixture from "./fixtures/scipy-checks.json";
import { levenbergMarquardt, type LeastSquaresProblem, type SolverSettings } from "../src/core/fit/levenbergMarquardt";
import { expectClose } from "./helpers/expectClose";

const TIGHT: SolverSettings = { maxIterations: 5000, functionTolerance: 1e-15, stepTolerance: 1e-15, gradientTolerance: 1e-15 };

type Model = (b: ArrayLike<number>, x: number) => { value: number; gradient: number[] };
const MODELS: Record<string, Model> = {
  "b1*(1-exp(-b2*x))": (b, x) => {
    const e = Math.exp(-(b[1] as number) * x);
    return { value: (b[0] as number) * (1 - e), gradient: [1 - e, (b[0] as number) * x * e] };
  },
  "b1*x**b2": (b, x) => {
    const p = Math.pow(x, b[1] as number);
    return { value: (b[0] as number) * p, gradient: [p, (b[0] as number) * p * Math.log(x)] };
  },
  "b1*(x**2+x*b2)/(x**2+x*b3+b4)": (b, x) => {
    const [b1, b2, b3, b4] = Array.from(b) as [number, number, number, number];
    const num = x * x + x * b2;
    const den = x * x + x * b3 + b4;
    return { value: (b1 * num) / den, gradient: [num / den, (b1 * x) / den, (-b1 * num * x) / (den * den), (-b1 * num) / (den * den)] };
  },
};

function regressionProblem(model: Model, x: number[], y: number[], k: number): LeastSquaresProblem {
  return {
    residualCount: x.length,
    parameterCount: k,
    evaluate(u, r, jac) {
      x.forEach((xi, i) => {
        const { value, gradient } = model(u, xi);
        r[i] = value - (y[i] as number);
        if (jac) gradient.forEach((g, j) => (jac[i * k + j] = g));
      });
      return r.every(Number.isFinite);
    },
  };
}

/** Standard errors s·√diag((JᵀJ)⁻¹) at the solution, s² = SSR/(m − k) (2×2 and 4×4 by Gauss–Jordan). */
function standardErrors(jac: Float64Array, m: number, k: number, ssr: number): number[] {
  const a: number[][] = Array.from({ length: k }, (_, i) => Array.from({ length: 2 * k }, (_, j): number => (j < k ? 0 : i === j - k ? 1 : 0)));
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) for (let r = 0; r < m; r++) (a[i] as number[])[j]! += (jac[r * k + i] as number) * (jac[r * k + j] as number);
  for (let c = 0; c < k; c++) {
    let p = c;
    for (let r = c + 1; r < k; r++) if (Math.abs((a[r] as number[])[c]!) > Math.abs((a[p] as number[])[c]!)) p = r;
    [a[c], a[p]] = [a[p] as number[], a[c] as number[]];
    const row = a[c] as number[];
    const pivot = row[c] as number;
    for (let j = 0; j < 2 * k; j++) row[j] = (row[j] as number) / pivot;
    for (let r = 0; r < k; r++) {
      if (r === c) continue;
      const other = a[r] as number[];
      const f = other[c] as number;
      for (let j = 0; j < 2 * k; j++) other[j] = (other[j] as number) - f * (row[j] as number);
    }
  }
  return Array.from({ length: k }, (_, i) => Math.sqrt((ssr / (m - k)) * ((a[i] as number[])[k + i] as number)));
}

describe("NIST StRD nonlinear regression: certified values from both starting points", () => {
  for (const [name, p] of Object.entries(fixture.nist)) {
    p.starts.forEach((start, s) => {
      // BoxBOD from start 1 (1, 1): the first, nearly Gauss–Newton step (initial damping 1e-3 of
      // diag JᵀJ) throws b2 far out, onto the plateau b2 → ∞ where b1 = ȳ = 172.5 and the gradient
      // vanishes; the solver stops there (RSS 9771.5, not the certified 1168.0). scipy's MINPACK "lm",
      // whose first step is bounded by a trust region, reaches the certified point from the same
      // start. Known limitation, reported: test.failing turns red when the solver learns to do it.
      const known = name === "BoxBOD" && s === 0 ? test.failing : test;
      known(`${name}, start ${s + 1} (${start.join(", ")})`, () => {
        const k = p.certified.length;
        const solved = levenbergMarquardt(regressionProblem(MODELS[p.model] as Model, p.x, p.y, k), start, TIGHT);
        expect(solved.converged).toBe(true);
        // @check fit/levenbergMarquardt | NIST StRD certified parameters (Misra1a, DanWood, MGH09 from both starts, BoxBOD from start 2; 18 values) | NIST Statistical Reference Datasets, nonlinear regression (certified values; the copy checked by scipy least_squares) | rel 1e-7 | 18
        p.certified.forEach((c, j) => expectClose(solved.u[j] as number, c, { rel: 1e-7 }, `b${j + 1}`));
        // @check fit/levenbergMarquardt | NIST StRD certified residual sums of squares (7 problem–start pairs) | NIST Statistical Reference Datasets, nonlinear regression | rel 1e-9 | 7
        expectClose(2 * solved.cost, p.certifiedRss, { rel: 1e-9 }, "RSS");
        const se = standardErrors(solved.jacobian, p.x.length, k, 2 * solved.cost);
        // @check fit/levenbergMarquardt | NIST StRD certified standard errors from the solver’s Jacobian (7 problem–start pairs; 18 values) | NIST Statistical Reference Datasets, nonlinear regression | rel 1e-5 | 18
        p.certifiedStandardErrors.forEach((c, j) => expectClose(se[j] as number, c, { rel: 1e-5 }, `se(b${j + 1})`));
      });
    });
  }
});

describe("test functions of Moré, Garbow & Hillstrom (1981)", () => {
  test("Rosenbrock from (−1.2, 1): zero residual at (1, 1)", () => {
    const problem: LeastSquaresProblem = {
      residualCount: 2,
      parameterCount: 2,
      evaluate(u, r, jac) {
        const [a, b] = [u[0] as number, u[1] as number];
        r[0] = 10 * (b - a * a);
        r[1] = 1 - a;
        if (jac) jac.set([-20 * a, 10, -1, 0]);
        return true;
      },
    };
    const solved = levenbergMarquardt(problem, [-1.2, 1], TIGHT);
    expect(solved.converged).toBe(true);
    // @check fit/levenbergMarquardt | Rosenbrock as least squares: minimiser (1, 1) from (−1.2, 1) | Rosenbrock, Comput. J. 3 (1960) 175; Moré, Garbow & Hillstrom, ACM TOMS 7 (1981) 17, problem 1 | abs 1e-10 | 2
    expectClose(solved.u[0] as number, 1, { abs: 1e-10 });
    expectClose(solved.u[1] as number, 1, { abs: 1e-10 });
    expect(solved.cost).toBeLessThan(1e-20);
  });

  test("helical valley from (−1, 0, 0): zero residual at (1, 0, 0)", () => {
    const problem: LeastSquaresProblem = {
      residualCount: 3,
      parameterCount: 3,
      evaluate(u, r, jac) {
        const [x1, x2, x3] = [u[0] as number, u[1] as number, u[2] as number];
        const theta = Math.atan2(x2, x1) / (2 * Math.PI);
        const rho = Math.hypot(x1, x2);
        r[0] = 10 * (x3 - 10 * theta);
        r[1] = 10 * (rho - 1);
        r[2] = x3;
        if (jac) {
          const s = rho * rho;
          jac.set([(100 * x2) / (2 * Math.PI * s), (-100 * x1) / (2 * Math.PI * s), 10, (10 * x1) / rho, (10 * x2) / rho, 0, 0, 0, 1]);
        }
        return true;
      },
    };
    const solved = levenbergMarquardt(problem, [-1, 0, 0], TIGHT);
    expect(solved.converged).toBe(true);
    // @check fit/levenbergMarquardt | helical valley: minimiser (1, 0, 0) from (−1, 0, 0) | Fletcher & Powell, Comput. J. 6 (1963) 163; Moré, Garbow & Hillstrom, ACM TOMS 7 (1981) 17, problem 7 | abs 1e-8 | 3
    [1, 0, 0].forEach((v, j) => expectClose(solved.u[j] as number, v, { abs: 1e-8 }, `x${j + 1}`));
  });
});
