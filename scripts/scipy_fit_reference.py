#!/usr/bin/python3
"""Reference fits for test/fit*.test.ts, computed with scipy.optimize.least_squares.

Writes test/fixtures/scipy-fits.json. Run with Debian's python3 (python3-scipy):
    /usr/bin/python3 scripts/scipy_fit_reference.py
Invented data: known parameters, fixed seed, log-normal (or normal, for linear residuals) noise.
Residuals as in src/core/fit/residuals.ts: r_i = sqrt(w_i)*(ln eta_model - ln eta_i) ("log") or
sqrt(w_i)*(eta_model - eta_i) ("linear"). The model formulas are coded here independently.
Standard errors: s^2 (J^T J)^-1 with J = dr/dtheta (3-point differences) at the optimum,
s^2 = SSR/(n - p).
"""
import json
import pathlib

import numpy as np
import scipy
from scipy.optimize import brentq, least_squares
from scipy.stats import t as student_t

SEED = 20240611
rng = np.random.default_rng(SEED)


def carreau_yasuda(p, g, _T):
    eta0, eta_inf, lam, n, a = p
    return eta_inf + (eta0 - eta_inf) * (1 + (lam * g) ** a) ** ((n - 1) / a)


def carreau(p, g, T):
    return carreau_yasuda([*p, 2.0], g, T)


def cross(p, g, _T):
    eta0, eta_inf, lam, m = p
    return eta_inf + (eta0 - eta_inf) / (1 + (lam * g) ** m)


def power_law(p, g, _T):
    K, n = p
    return K * g ** (n - 1)


def sisko(p, g, _T):
    eta_inf, K, n = p
    return eta_inf + K * g ** (n - 1)


def ellis(p, g, _T):
    eta0, tau_half, alpha = p
    # eta = eta0 / (1 + (eta*g/tau_half)^(alpha-1)), solved for eta at each rate
    def one(rate):
        f = lambda eta: eta * (1 + (eta * rate / tau_half) ** (alpha - 1)) - eta0
        return brentq(f, 1e-300, eta0, xtol=1e-300, rtol=4 * np.finfo(float).eps, maxiter=500)
    return np.array([one(rate) for rate in g])


def bingham(p, g, _T):
    tau_y, mu_p = p
    return (tau_y + mu_p * g) / g


def herschel_bulkley(p, g, _T):
    tau_y, K, n = p
    return (tau_y + K * g ** n) / g


def casson(p, g, _T):
    tau_y, eta_c = p
    return (np.sqrt(tau_y) + np.sqrt(eta_c * g)) ** 2 / g


def cross_wlf(p, g, T):
    D1, A1, A2, Tstar, tau_star, n = p
    eta0 = D1 * np.exp(-A1 * (T - Tstar) / (A2 + T - Tstar))
    return eta0 / (1 + (eta0 * g / tau_star) ** (1 - n))


MODELS = {
    "carreau-yasuda": (carreau_yasuda, ["eta0", "etaInf", "lambda", "n", "a"]),
    "carreau": (carreau, ["eta0", "etaInf", "lambda", "n"]),
    "cross": (cross, ["eta0", "etaInf", "lambda", "m"]),
    "power-law": (power_law, ["K", "n"]),
    "sisko": (sisko, ["etaInf", "K", "n"]),
    "ellis": (ellis, ["eta0", "tauHalf", "alpha"]),
    "bingham": (bingham, ["tauY", "muP"]),
    "herschel-bulkley": (herschel_bulkley, ["tauY", "K", "n"]),
    "casson": (casson, ["tauY", "etaC"]),
    "cross-wlf": (cross_wlf, ["D1", "A1", "A2", "Tstar", "tauStar", "n"]),
}


def log_rates(lo, hi, count):
    return np.logspace(np.log10(lo), np.log10(hi), count)


def make_case(name, model, truth, rates, space="log", noise=0.02, fixed=None, temps=None, weights=None):
    fn, names = MODELS[model]
    fixed = fixed or {}
    T = temps if temps is not None else np.full_like(rates, np.nan)
    clean = fn([truth[k] for k in names], rates, T)
    if space == "log":
        eta = clean * np.exp(noise * rng.standard_normal(rates.size))
    else:
        eta = clean * (1 + noise * rng.standard_normal(rates.size))
    w = np.ones_like(rates) if weights is None else np.asarray(weights, dtype=float)
    free = [k for k in names if k not in fixed]

    def full(x):
        values = dict(fixed)
        values.update(zip(free, x))
        return [values[k] for k in names]

    def residuals(x):
        model_eta = fn(full(x), rates, T)
        if space == "log":
            return np.sqrt(w) * (np.log(model_eta) - np.log(eta))
        return np.sqrt(w) * (model_eta - eta)

    x0 = np.array([truth[k] * 1.2 for k in free])
    upper = [np.inf if k != "n" or model != "cross-wlf" else 1.0 for k in free]
    res = least_squares(residuals, x0, jac="3-point", bounds=(np.zeros(len(free)), upper), method="trf",
                        x_scale="jac", ftol=1e-15, xtol=1e-15, gtol=1e-15, max_nfev=20000)
    J = res.jac
    dof = rates.size - len(free)
    ssr = float(np.sum(res.fun ** 2))
    cov = ssr / dof * np.linalg.inv(J.T @ J)
    case = {
        "name": name,
        "model": model,
        "residualSpace": space,
        "fixed": fixed,
        "truth": truth,
        "data": {"shearRate": rates.tolist(), "viscosity": eta.tolist()},
        "parameters": dict(zip(free, res.x.tolist())),
        "standardErrors": dict(zip(free, np.sqrt(np.diag(cov)).tolist())),
        "ssr": ssr,
        "status": int(res.status),
        "nfev": int(res.nfev),
    }
    if temps is not None:
        case["data"]["temperature"] = temps.tolist()
    if weights is not None:
        case["data"]["weights"] = w.tolist()
    return case


melt = log_rates(0.1, 1e4, 40)
cases = [
    make_case("melt, Carreau-Yasuda, etaInf held at 0", "carreau-yasuda",
              {"eta0": 2e4, "etaInf": 0.0, "lambda": 0.5, "n": 0.3, "a": 0.7}, melt, fixed={"etaInf": 0.0}),
    make_case("solution, Carreau-Yasuda with a second plateau", "carreau-yasuda",
              {"eta0": 50.0, "etaInf": 0.5, "lambda": 2.0, "n": 0.35, "a": 1.5}, log_rates(0.01, 1e5, 45), noise=0.01),
    make_case("solution, Cross", "cross", {"eta0": 120.0, "etaInf": 1.5, "lambda": 0.3, "m": 0.8}, log_rates(0.01, 1e5, 35)),
    make_case("melt, Carreau, linear residuals, weights", "carreau",
              {"eta0": 8e3, "etaInf": 0.0, "lambda": 0.3, "n": 0.35}, log_rates(0.1, 1e4, 30), space="linear",
              fixed={"etaInf": 0.0}, weights=np.linspace(0.5, 2.0, 30)),
    make_case("melt, power law", "power-law", {"K": 2e4, "n": 0.35}, log_rates(10, 1e4, 20), noise=0.03),
    make_case("grease, Sisko", "sisko", {"etaInf": 0.8, "K": 40.0, "n": 0.3}, log_rates(0.1, 1e4, 30)),
    make_case("melt, Ellis", "ellis", {"eta0": 3e3, "tauHalf": 2e4, "alpha": 2.5}, log_rates(0.1, 1e4, 30)),
    make_case("slurry, Bingham, linear residuals", "bingham", {"tauY": 15.0, "muP": 0.4}, log_rates(1, 1e3, 25), space="linear", noise=0.01),
    make_case("paste, Herschel-Bulkley", "herschel-bulkley", {"tauY": 20.0, "K": 3.0, "n": 0.55}, log_rates(0.1, 1e3, 30)),
    make_case("ink, Casson", "casson", {"tauY": 8.0, "etaC": 0.05}, log_rates(0.5, 1e4, 25)),
]
wlf_rates = np.tile(log_rates(1, 1e4, 15), 3)
wlf_temps = np.repeat([473.15, 493.15, 513.15], 15)
cases.append(make_case("melt at three temperatures, Cross-WLF (A2 held at 51.6 K)", "cross-wlf",
                       {"D1": 3e12, "A1": 28.0, "A2": 51.6, "Tstar": 373.0, "tauStar": 3e4, "n": 0.28},
                       wlf_rates, fixed={"A2": 51.6}, temps=wlf_temps))

quantiles = [{"p": p, "dof": d, "t": float(student_t.ppf(p, d))}
             for p in (0.975, 0.95, 0.995, 0.025) for d in (1, 2, 3, 4, 5, 7, 10, 15, 26, 30, 41, 100, 1000)]

out = {
    "generator": "scripts/scipy_fit_reference.py",
    "scipy": scipy.__version__,
    "numpy": np.__version__,
    "seed": SEED,
    "cases": cases,
    "tQuantiles": quantiles,
}
path = pathlib.Path(__file__).resolve().parent.parent / "test" / "fixtures" / "scipy-fits.json"
path.write_text(json.dumps(out, indent=1) + "\n")
for c in cases:
    print(f"{c['name']}: status {c['status']}, nfev {c['nfev']}, {c['parameters']}")
