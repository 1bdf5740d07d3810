#!/usr/bin/python3
"""Independent reference values for test/scipy-checks.test.ts and test/levenbergMarquardt.test.ts.

Writes test/fixtures/scipy-checks.json. Run with Debian's python3 (python3-scipy):
    /usr/bin/python3 scripts/scipy_checks_reference.py

1. flowIntegrals: apparent wall rates of Carreau and Cross liquids (no closed form) in a tube and
   a slit, from the stress form of the flow integrals evaluated by scipy.integrate.quad, with the
   rate at each stress found by scipy.optimize.brentq (the project integrates over the rate with
   Gauss-Legendre panels instead):
       tube  gamma_a = (4/tau_w^3) * int_0^tau_w tau^2 gamma(tau) dtau
       slit  gamma_a = (3/tau_w^2) * int_0^tau_w tau   gamma(tau) dtau
2. shiftFits: invented viscosity curves at several temperatures (Carreau-Yasuda master curve,
   Arrhenius or WLF shift, 1.5 % log-normal noise, fixed seed) and the joint least-squares fit of
   the shift constants with a cubic master curve in the scaled reduced rate, as
   src/core/temperature/fitShift.ts states it, solved by scipy.optimize.least_squares;
   standard errors s^2 (J^T J)^-1 with J at the optimum (complex-step derivatives), s^2 = SSR/(m - k).
3. nist: NIST StRD nonlinear regression problems (data, starting values and certified values
   copied from the NIST Statistical Reference Datasets pages) re-solved with
   scipy.optimize.least_squares, to show the copied values are right: scipy must reproduce the
   certified values to about 1e-7 relative, which this script asserts.
"""
import json
import math
import pathlib

import numpy as np
import scipy
from scipy.integrate import quad
from scipy.optimize import brentq, least_squares

SEED = 20261205
rng = np.random.default_rng(SEED)
OUT = pathlib.Path(__file__).resolve().parent.parent / "test" / "fixtures" / "scipy-checks.json"


# ---------------------------------------------------------------------------------------------
# 1. flow integrals
def carreau(eta0, lam, n):
    return lambda g: eta0 * (1 + (lam * g) ** 2) ** ((n - 1) / 2)


def cross(eta0, lam, m):
    return lambda g: eta0 / (1 + (lam * g) ** m)


def rate_at_stress(eta, tau, upper):
    if tau == 0:
        return 0.0
    return brentq(lambda g: eta(g) * g - tau, 0.0, upper * 10, xtol=1e-300, rtol=4 * np.finfo(float).eps, maxiter=500)


def apparent(eta, wall, power):
    tau_w = eta(wall) * wall
    integrand = lambda t: t ** power * rate_at_stress(eta, t, wall)
    value, _err = quad(integrand, 0, tau_w, epsabs=0, epsrel=1e-13, limit=400)
    return (power + 2) * value / tau_w ** (power + 1)


fluids = {
    "carreau": {"model": "carreau", "parameters": {"eta0": 8000.0, "lambda": 0.8, "n": 0.35}, "eta": carreau(8000.0, 0.8, 0.35)},
    "cross": {"model": "cross", "parameters": {"eta0": 3000.0, "lambda": 0.05, "m": 0.7}, "eta": cross(3000.0, 0.05, 0.7)},
}
flow_integrals = []
for name, f in fluids.items():
    for wall in [0.1, 3.0, 100.0, 3000.0]:
        flow_integrals.append({
            "fluid": name,
            "model": f["model"],
            "parameters": f["parameters"],
            "wallRate": wall,
            "tube": apparent(f["eta"], wall, 2),
            "slit": apparent(f["eta"], wall, 1),
        })

# ---------------------------------------------------------------------------------------------
# 2. shift fits
R_GAS = 8.314462618


def cy(g):
    eta0, lam, n, a = 6000.0, 0.4, 0.35, 0.7
    return eta0 * (1 + (lam * g) ** a) ** ((n - 1) / a)


def make_curves(temperatures, log_shift):
    curves = []
    for T in temperatures:
        lnA = log_shift(T)
        rates = np.logspace(0.3, 3.3, 9)
        eta = np.exp(lnA) * cy(np.exp(lnA) * rates) * np.exp(rng.normal(0, 0.015, rates.size))
        curves.append({"temperature": T, "shearRate": rates.tolist(), "viscosity": eta.tolist()})
    return curves


def fit_shift(curves, t_ref, law_shift, theta0, degree=3):
    T = np.concatenate([[c["temperature"]] * len(c["shearRate"]) for c in curves])
    x = np.log(np.concatenate([c["shearRate"] for c in curves]))
    y = np.log(np.concatenate([c["viscosity"] for c in curves]))
    center = (x.max() + x.min()) / 2
    half = max((x.max() - x.min()) / 2, 1.0)
    k_theta = len(theta0[0])

    def residuals(p):
        theta, coef = p[:k_theta], p[k_theta:]
        lnA = law_shift(theta, T)
        z = (x + lnA - center) / half
        return lnA + np.polynomial.polynomial.polyval(z, coef) - y

    best = None
    for start in theta0:
        p0 = np.concatenate([start, np.zeros(degree + 1)])
        p0[k_theta] = y.mean()
        sol = least_squares(residuals, p0, method="lm", xtol=1e-15, ftol=1e-15, gtol=1e-15, max_nfev=20000)
        if best is None or sol.cost < best.cost:
            best = sol
    J = np.column_stack([np.imag(residuals(best.x + 1e-30j * np.eye(best.x.size)[j])) / 1e-30 for j in range(best.x.size)])
    m, k = J.shape
    s2 = 2 * best.cost / (m - k)
    cov = s2 * np.linalg.inv(J.T @ J)
    return best.x[:k_theta], np.sqrt(np.diag(cov))[:k_theta], math.sqrt(2 * best.cost / m)


T_REF = 473.15
arrhenius_curves = make_curves([453.15, 473.15, 493.15, 513.15], lambda T: (42e3 / R_GAS) * (1 / T - 1 / T_REF))
theta, se, rmse = fit_shift(
    arrhenius_curves, T_REF, lambda th, T: (th[0] * 1e3 / R_GAS) * (1 / T - 1 / T_REF), [np.array([v]) for v in (20.0, 40.0, 80.0)]
)
arrhenius = {"referenceTemperature": T_REF, "curves": arrhenius_curves, "activationEnergy": theta[0] * 1e3, "activationEnergyStandardError": se[0] * 1e3, "rmse": rmse}

T_REF_W = 423.15
wlf_true = (8.0, 120.0)
wlf_curves = make_curves([403.15, 423.15, 448.15, 473.15, 503.15], lambda T: -math.log(10) * wlf_true[0] * (T - T_REF_W) / (wlf_true[1] + T - T_REF_W))
theta, se, rmse = fit_shift(
    wlf_curves,
    T_REF_W,
    lambda th, T: -math.log(10) * th[0] * (T - T_REF_W) / (th[1] + T - T_REF_W),
    [np.array([c1, c2]) for c1 in (5.0, 10.0) for c2 in (80.0, 150.0)],
)
wlf = {"referenceTemperature": T_REF_W, "curves": wlf_curves, "C1": theta[0], "C2": theta[1], "C1StandardError": se[0], "C2StandardError": se[1], "rmse": rmse}

# ---------------------------------------------------------------------------------------------
# 3. NIST StRD nonlinear regression
NIST = {
    "Misra1a": {
        "model": "b1*(1-exp(-b2*x))",
        "x": [77.6, 114.9, 141.1, 190.8, 239.9, 289.0, 332.8, 378.4, 434.8, 477.3, 536.8, 593.1, 689.1, 760.0],
        "y": [10.07, 14.73, 17.94, 23.93, 29.61, 35.18, 40.02, 44.82, 50.76, 55.05, 61.01, 66.40, 75.47, 81.78],
        "starts": [[500, 1e-4], [250, 5e-4]],
        "certified": [2.3894212918e02, 5.5015643181e-04],
        "certifiedStandardErrors": [2.7070075241e00, 7.2668688436e-06],
        "certifiedRss": 1.2455138894e-01,
    },
    "DanWood": {
        "model": "b1*x**b2",
        "x": [1.309, 1.471, 1.490, 1.565, 1.611, 1.680],
        "y": [2.138, 3.421, 3.597, 4.340, 4.882, 5.660],
        "starts": [[1, 5], [0.7, 4]],
        "certified": [7.6886226176e-01, 3.8604055871e00],
        "certifiedStandardErrors": [1.8281973860e-02, 5.1726610913e-02],
        "certifiedRss": 4.3173084083e-03,
    },
    "BoxBOD": {
        "model": "b1*(1-exp(-b2*x))",
        "x": [1, 2, 3, 5, 7, 10],
        "y": [109, 149, 149, 191, 213, 224],
        "starts": [[1, 1], [100, 0.75]],
        "certified": [2.1380940889e02, 5.4723748542e-01],
        "certifiedStandardErrors": [1.2354515176e01, 1.0455993237e-01],
        "certifiedRss": 1.1680088766e03,
    },
    "MGH09": {
        "model": "b1*(x**2+x*b2)/(x**2+x*b3+b4)",
        "x": [4.0, 2.0, 1.0, 0.5, 0.25, 0.167, 0.125, 0.1, 0.0833, 0.0714, 0.0625],
        "y": [0.1957, 0.1947, 0.1735, 0.1600, 0.0844, 0.0627, 0.0456, 0.0342, 0.0323, 0.0235, 0.0246],
        "starts": [[25, 39, 41.5, 39], [0.25, 0.39, 0.415, 0.39]],
        "certified": [1.9280693458e-01, 1.9128232873e-01, 1.2305650693e-01, 1.3606233068e-01],
        "certifiedStandardErrors": [1.1435312227e-02, 1.9633220911e-01, 8.0842031232e-02, 9.0025542308e-02],
        "certifiedRss": 3.0750560385e-04,
    },
}

MODELS = {
    "b1*(1-exp(-b2*x))": lambda b, x: b[0] * (1 - np.exp(-b[1] * x)),
    "b1*x**b2": lambda b, x: b[0] * x ** b[1],
    "b1*(x**2+x*b2)/(x**2+x*b3+b4)": lambda b, x: b[0] * (x ** 2 + x * b[1]) / (x ** 2 + x * b[2] + b[3]),
}

for name, p in NIST.items():
    f = MODELS[p["model"]]
    x = np.array(p["x"], dtype=float)
    y = np.array(p["y"], dtype=float)
    best = None
    for start in p["starts"]:
        sol = least_squares(lambda b: f(b, x) - y, np.array(start, dtype=float), method="lm", xtol=1e-15, ftol=1e-15, gtol=1e-15, max_nfev=100000)
        if best is None or sol.cost < best.cost:
            best = sol
    rss = 2 * best.cost
    # Jacobian at the optimum by the complex step (exact to rounding), not the solver's differences
    k = best.x.size
    J = np.column_stack([np.imag(f(best.x + 1e-30j * np.eye(k)[j], x)) / 1e-30 for j in range(k)])
    m = x.size
    se = np.sqrt(np.diag(rss / (m - k) * np.linalg.inv(J.T @ J)))
    for got, want in zip(best.x, p["certified"]):
        assert abs(got / want - 1) < 1e-7, (name, got, want)
    for got, want in zip(se, p["certifiedStandardErrors"]):
        assert abs(got / want - 1) < 1e-5, (name, "se", got, want)
    assert abs(rss / p["certifiedRss"] - 1) < 1e-8, (name, rss)
    p["scipy"] = best.x.tolist()
    p["scipyStandardErrors"] = se.tolist()

out = {
    "generator": "scripts/scipy_checks_reference.py",
    "scipy": scipy.__version__,
    "numpy": np.__version__,
    "seed": SEED,
    "flowIntegrals": flow_integrals,
    "shiftFits": {"arrhenius": arrhenius, "wlf": wlf},
    "nist": NIST,
}
OUT.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {OUT.relative_to(OUT.parent.parent.parent)}")
