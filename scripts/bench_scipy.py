#!/usr/bin/python3
"""The Carreau-Yasuda fit of `npm run bench`, done by scipy.optimize.least_squares, timed.

Called by scripts/bench.ts with one JSON document on stdin:
    {"shearRate": [...], "viscosity": [...], "start": [eta0, etaInf, lambda, n, a], "repeats": 21, "batch": 10}
and answers one JSON document on stdout:
    {"scipy": "1.10.1", "variants": [{"name", "samplesMs", "medianMs", "nfev", "ssr", "parameters": {...}, "success"}]}
(samplesMs: one per repeat, each the mean of `batch` fits; ssr: the sum of squared residuals reached).
scripts/bench.ts calls it once per round, alternating with its own samples.
or {"error": "..."} with exit status 3 when numpy or scipy cannot be imported.

The problem is the one fitModel("carreau-yasuda") solves: five parameters, residuals
r_i = ln eta_model - ln eta_i, parameters moved as u = ln p (as src/core/fit/transforms.ts does
for parameters bounded below by 0), the same starting values (the model's own data-based guess,
passed in), and tolerances equal to DEFAULT_FIT_OPTIONS (ftol 1e-12, xtol 1e-10, gtol 1e-10).
fitModel moves eta_inf in linear coordinates kept >= 0 by projection (its bound 0 is admissible)
and solves the five-parameter problem in one run; scipy is given the free problem directly (the
optimum here is inside the bounds, so the coordinates do not change it). The model formula is coded
here independently (Yasuda, Armstrong & Cohen 1981):
    eta = eta_inf + (eta0 - eta_inf) * (1 + (lambda*rate)^a)^((n-1)/a)
Three variants are timed: MINPACK "lm" with the analytic Jacobian (the same information the
TypeScript solver gets), "lm" with 2-point finite differences, and scipy's default method ("trf",
trust region reflective, with 2-point differences).
Run by the first Python that imports scipy (scripts/findPython.ts), e.g. Debian's python3-scipy.
"""
import json
import statistics
import sys
import time

try:
    import numpy as np
    import scipy
    from scipy.optimize import least_squares
except ImportError as error:  # the bench skips its scipy line
    print(json.dumps({"error": f"scipy not available: {error}"}))
    sys.exit(3)

NAMES = ["eta0", "etaInf", "lambda", "n", "a"]


def log_viscosity(u, rate):
    eta0, eta_inf, lam, n, a = np.exp(u)
    ln_x = np.log(lam * rate)
    ln_b = np.logaddexp(0.0, a * ln_x)  # ln(1 + (lambda*rate)^a) without overflow
    f = np.exp((n - 1) / a * ln_b)
    return np.log(eta_inf + (eta0 - eta_inf) * f)


def residuals(u, rate, ln_eta):
    return log_viscosity(u, rate) - ln_eta


def jacobian(u, rate, _ln_eta):
    """d ln eta / d ln p_j = p_j * d ln eta / d p_j."""
    eta0, eta_inf, lam, n, a = np.exp(u)
    ln_x = np.log(lam * rate)
    ln_b = np.logaddexp(0.0, a * ln_x)
    f = np.exp((n - 1) / a * ln_b)
    eta = eta_inf + (eta0 - eta_inf) * f
    q = np.exp(a * ln_x - ln_b)  # z / (1 + z), z = (lambda*rate)^a
    s = (eta0 - eta_inf) * f / eta  # share of the shear-thinning part in eta
    jac = np.empty((rate.size, 5))
    jac[:, 0] = eta0 * f / eta                            # d/d ln eta0
    jac[:, 1] = eta_inf * (1 - f) / eta                   # d/d ln eta_inf
    jac[:, 2] = s * (n - 1) * q                           # d/d ln lambda
    jac[:, 3] = s * n * ln_b / a                          # d/d ln n
    jac[:, 4] = s * (n - 1) * (q * ln_x - ln_b / a)       # d/d ln a
    return jac


def timed(fit, repeats, batch):
    result = fit()
    samples = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        for _ in range(batch):
            fit()
        samples.append((time.perf_counter() - t0) * 1000 / batch)
    return samples, result


def main():
    job = json.load(sys.stdin)
    rate = np.asarray(job["shearRate"], dtype=float)
    ln_eta = np.log(np.asarray(job["viscosity"], dtype=float))
    u0 = np.log(np.asarray(job["start"], dtype=float))
    repeats = int(job.get("repeats", 21))
    batch = int(job.get("batch", 10))
    tolerances = dict(ftol=1e-12, xtol=1e-10, gtol=1e-10)
    variants = {
        "lm, analytic Jacobian": lambda: least_squares(residuals, u0, jac=jacobian, method="lm", args=(rate, ln_eta), **tolerances),
        "lm, 2-point differences": lambda: least_squares(residuals, u0, method="lm", args=(rate, ln_eta), **tolerances),
        "trf (default), 2-point differences": lambda: least_squares(residuals, u0, args=(rate, ln_eta), **tolerances),
    }
    out = []
    for name, fit in variants.items():
        samples, result = timed(fit, repeats, batch)
        out.append({
            "name": name,
            "samplesMs": samples,
            "medianMs": statistics.median(samples),
            "nfev": int(result.nfev),
            "ssr": float(2 * result.cost),
            "success": bool(result.success),
            "parameters": dict(zip(NAMES, np.exp(result.x).tolist())),
        })
    print(json.dumps({"scipy": scipy.__version__, "numpy": np.__version__, "variants": out}))


if __name__ == "__main__":
    main()
