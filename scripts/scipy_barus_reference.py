#!/usr/bin/python3
"""Reference values for test/pressureDependence.test.ts: Bagley lines of a melt whose viscosity
rises with pressure, and their Barus fits, computed with scipy.

Writes test/fixtures/scipy-barus.json. Run with Debian's python3 (python3-scipy):
    /usr/bin/python3 scripts/scipy_barus_reference.py

Invented liquids (not real materials). The pressure dependence follows time-pressure
superposition with a shift factor a_p = exp(beta * p), beta the constant-stress (shift-factor)
coefficient: eta(rate, p) = a_p * eta0(a_p * rate). In a round die the wall stress at a given
apparent rate is then tau_w(rate_a, p) = tau_w0(a_p * rate_a), tau_w0 the zero-pressure curve,
and the pressure along the die obeys (force balance, flow rate held)
    dp/dz = (2/R) * tau_w0(exp(beta p) * rate_a),   p = 0 at the exit,
integrated here with solve_ivp. The entrance loss is 2 * e * tau_w0(rate_a) with e = 3 radii,
independent of pressure (as the module assumes). tau_w0(rate_a) comes from the Weissenberg-
Rabinowitsch flow integral rate_a = (4/tau^3) int_0^tau s^2 rate(s) ds, inverted with brentq.

Each Bagley line is fitted with scipy.optimize.curve_fit to
    P(x) = A - ln(1 - 2 beta_r tau0 x) / beta_r,   x = L/R,
returning beta_r (the coefficient at the held flow rate), tau0, A and their standard errors
(pcov = s^2 (J^T J)^-1, absolute_sigma False). For a power law beta_r = n * beta exactly; for the
Cross liquid beta_r ~ n' * beta with n' the local slope of the zero-pressure curve.
"""
import json
import math
import pathlib

import numpy as np
import scipy
from scipy.integrate import quad, solve_ivp
from scipy.optimize import brentq, curve_fit

SEED = 20240917
rng = np.random.default_rng(SEED)

D = 1e-3
R = D / 2
X = [10.0, 20.0, 40.0, 60.0]  # L/R of the four dies
E_RADII = 3.0  # entrance loss in radii


def power_law_stress(K, n):
    """Zero-pressure wall stress at an apparent rate: tau_w = K ((3n+1)/(4n) rate_a)^n."""
    return lambda rate_a: K * ((3 * n + 1) / (4 * n) * rate_a) ** n


def cross_stress(eta0, lam, m):
    """Zero-pressure wall stress at an apparent rate for eta = eta0 / (1 + (lam rate)^m)."""

    def tau(rate):
        return eta0 * rate / (1 + (lam * rate) ** m)

    def dtau(rate):
        u = (lam * rate) ** m
        return eta0 * (1 + u - m * u) / (1 + u) ** 2

    def apparent(rate_w):
        tw = tau(rate_w)
        integral, _ = quad(lambda g: tau(g) ** 2 * g * dtau(g), 0, rate_w, epsabs=0, epsrel=1e-13, limit=200)
        return 4 * integral / tw**3

    def wall_stress(rate_a):
        rate_w = brentq(lambda w: apparent(w) - rate_a, 0.5 * rate_a, 10 * rate_a, xtol=1e-14 * rate_a, rtol=1e-14)
        return tau(rate_w)

    return wall_stress


def local_slope(stress, rate_a):
    h = 1e-4
    return (math.log(stress(rate_a * math.exp(h))) - math.log(stress(rate_a * math.exp(-h)))) / (2 * h)


def die_pressure(stress, rate_a, beta, x):
    """Pressure at the die entry (above the exit) for a die of L/R = x."""
    L = x * R
    sol = solve_ivp(lambda _z, p: [2 / R * stress(math.exp(beta * p[0]) * rate_a)], [0, L], [0.0], rtol=1e-11, atol=1e-3)
    return float(sol.y[0, -1])


def barus(x, A, tau0, beta_r):
    return A - np.log1p(-2 * beta_r * tau0 * x) / beta_r


def fit_line(x, p):
    x = np.asarray(x)
    p = np.asarray(p)
    b, a = np.polyfit(x, p, 1)
    c2 = np.polyfit(x, p, 2)[0]
    start = [a, b / 2, 2 * c2 / b**2 if c2 != 0 else 1e-12]
    popt, pcov = curve_fit(barus, x, p, p0=start, xtol=1e-15, ftol=1e-15, gtol=1e-15, maxfev=20000)
    se = np.sqrt(np.diag(pcov))
    return {"entrancePressure": popt[0], "tau0": popt[1], "betaRate": popt[2], "seEntrancePressure": se[0], "seTau0": se[1], "seBetaRate": se[2]}


def dataset(name, description, stress, beta, rates, noise):
    lines = []
    for rate in rates:
        entrance = 2 * E_RADII * stress(rate)
        exact = [entrance + die_pressure(stress, rate, beta, x) for x in X]
        measured = [p * (1 + noise * rng.standard_normal()) for p in exact] if noise > 0 else exact
        line = {
            "shearRateApparent": rate,
            "pressure": measured,
            "wallShearStressAtZeroPressure": stress(rate),
            "nPrimeAtZeroPressure": local_slope(stress, rate),
            "fit": fit_line(X, measured),
        }
        lines.append(line)
    return {"name": name, "description": description, "dieDiameter": D, "lengthOverRadius": X, "pressureCoefficient": beta, "noise": noise, "lines": lines}


def main():
    pl = power_law_stress(1.2e4, 0.35)
    cr = cross_stress(5000.0, 0.5, 0.65)
    rates = [20.0, 60.0, 200.0, 600.0, 2000.0]
    out = {
        "generator": "scripts/scipy_barus_reference.py",
        "scipy": scipy.__version__,
        "numpy": np.__version__,
        "seed": SEED,
        "datasets": [
            dataset("power-law", "power law K = 1.2e4 Pa.s^n, n = 0.35; beta = 15 1/GPa; no noise", pl, 15e-9, rates, 0.0),
            dataset("cross", "Cross eta0 = 5000 Pa.s, lambda = 0.5 s, m = 0.65; beta = 15 1/GPa; no noise", cr, 15e-9, rates, 0.0),
            dataset("cross-noisy", "the Cross liquid with 0.3 % normal noise on each pressure (seeded)", cr, 15e-9, rates, 0.003),
        ],
    }
    path = pathlib.Path(__file__).resolve().parent.parent / "test" / "fixtures" / "scipy-barus.json"
    path.write_text(json.dumps(out, indent=1) + "\n")
    print(f"wrote {path}")


if __name__ == "__main__":
    main()
