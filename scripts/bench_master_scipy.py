#!/usr/bin/env python3
"""The fit across temperatures of `npm run bench` (Carreau-Yasuda x Arrhenius on three curves),
done by scipy.optimize.least_squares, timed.

Called by scripts/bench/masterFitBench.ts with one JSON document on stdin:
    {"temperature": [...K], "shearRate": [...], "viscosity": [...], "referenceTemperature": K,
     "start": {"eta0", "lambda", "n", "a", "activationEnergy"}, "repeats": 15, "batch": 5}
and answers one JSON document on stdout:
    {"scipy": "1.10.1", "variants": [{"name", "samplesMs": [...], "nfev", "success", "ssr", "parameters"}]}
or {"error": "..."} with exit status 3 when numpy or scipy cannot be imported.

The problem is the one fitMasterCurve("carreau-yasuda", {law: "arrhenius"}) solves for a melt
(eta_inf held at 0): five parameters, residuals r = ln eta_model - ln eta over every point, the
parameters moved as u = ln p, the same starting values, and the tolerances of DEFAULT_FIT_OPTIONS
(ftol 1e-12, xtol 1e-10, gtol 1e-10). The model is coded here independently:
    ln eta(rate, T) = ln aT + ln eta_ref(aT rate),  ln aT = Ea/R (1/T - 1/Tref)
    eta_ref = eta0 (1 + (lambda rate)^a)^((n-1)/a)          (Yasuda, Armstrong & Cohen 1981)
Variants: MINPACK "lm" with the analytic Jacobian (the information the TypeScript solver gets),
and scipy's default method ("trf") with its default 2-point differences.
"""
import json
import statistics
import sys
import time

try:
    import numpy as np
    import scipy
    from scipy.optimize import least_squares
except ImportError as error:
    print(json.dumps({"error": f"scipy not available: {error}"}))
    sys.exit(3)

R = 8.314462618
NAMES = ["eta0", "lambda", "n", "a", "activationEnergy"]


def parts(u, T, rate, Tref):
    eta0, lam, n, a, Ea = np.exp(u)
    x = 1 / T - 1 / Tref
    ln_aT = Ea / R * x
    ln_x = np.log(lam) + ln_aT + np.log(rate)  # ln(lambda aT rate)
    ln_b = np.logaddexp(0.0, a * ln_x)
    q = np.exp(a * ln_x - ln_b)  # z/(1+z), z = (lambda aT rate)^a
    return eta0, lam, n, a, Ea, x, ln_aT, ln_x, ln_b, q


def residuals(u, T, rate, ln_eta, Tref):
    eta0, lam, n, a, Ea, x, ln_aT, ln_x, ln_b, q = parts(u, T, rate, Tref)
    return ln_aT + np.log(eta0) + (n - 1) / a * ln_b - ln_eta


def jacobian(u, T, rate, _ln_eta, Tref):
    """d r/d ln p_j = p_j d r/d p_j."""
    eta0, lam, n, a, Ea, x, ln_aT, ln_x, ln_b, q = parts(u, T, rate, Tref)
    slope = (n - 1) * q  # d ln eta_ref / d ln rate
    jac = np.empty((rate.size, 5))
    jac[:, 0] = 1.0
    jac[:, 1] = slope
    jac[:, 2] = n * ln_b / a
    jac[:, 3] = (n - 1) * (q * ln_x - ln_b / a)
    jac[:, 4] = Ea * x / R * (1 + slope)
    return jac


def main():
    job = json.load(sys.stdin)
    T = np.asarray(job["temperature"], dtype=float)
    rate = np.asarray(job["shearRate"], dtype=float)
    ln_eta = np.log(np.asarray(job["viscosity"], dtype=float))
    Tref = float(job["referenceTemperature"])
    u0 = np.log([job["start"][k] for k in NAMES])
    repeats = int(job.get("repeats", 15))
    batch = int(job.get("batch", 5))
    args = (T, rate, ln_eta, Tref)
    tol = dict(ftol=1e-12, xtol=1e-10, gtol=1e-10)
    variants = {
        "lm, analytic Jacobian": lambda: least_squares(residuals, u0, jac=jacobian, method="lm", args=args, **tol),
        "trf (default), 2-point differences": lambda: least_squares(residuals, u0, args=args, **tol),
    }
    out = []
    for name, fit in variants.items():
        result = fit()
        for _ in range(batch):
            fit()  # warm-up
        samples = []
        for _ in range(repeats):
            t0 = time.perf_counter()
            for _ in range(batch):
                fit()
            samples.append((time.perf_counter() - t0) * 1000 / batch)
        out.append({
            "name": name,
            "samplesMs": samples,
            "medianMs": statistics.median(samples),
            "nfev": int(result.nfev),
            "success": bool(result.success),
            "ssr": float(np.sum(result.fun ** 2)),
            "parameters": dict(zip(NAMES, np.exp(result.x).tolist())),
        })
    print(json.dumps({"scipy": scipy.__version__, "numpy": np.__version__, "variants": out}))


if __name__ == "__main__":
    main()
