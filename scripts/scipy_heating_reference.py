#!/usr/bin/python3
"""Reference values for test/viscousHeating.test.ts: fully developed pipe flow of a Newtonian
liquid whose viscosity falls with temperature, heated by its own dissipation, wall held at the
inlet temperature; solved with scipy.integrate.solve_bvp.

Writes test/fixtures/scipy-heating.json. Run with Debian's python3 (python3-scipy):
    /usr/bin/python3 scripts/scipy_heating_reference.py

Model (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. 2002, ch. 10, from memory, with a
temperature-dependent viscosity): eta = eta_w exp(-b (T - T_w)); pressure gradient G gives
tau(r) = G r / 2 and rate(r) = tau / eta(T(r)); energy k (1/r) d/dr(r dT/dr) = -tau * rate,
dT/dr = 0 at the axis, T = T_w at the wall. With s = r/R and theta = b (T - T_w):
    (1/s) d/ds (s dtheta/ds) = -Lambda s^2 exp(theta),   Lambda = b G^2 R^4 / (4 k eta_w),
Q = pi R^3 int_0^1 s^2 rate ds, and the Newtonian (unheated) flow Q0 = pi R^4 G / (8 eta_w).
The apparent viscosity read by a capillary rheometer at this pressure gradient is
eta_app = eta_w Q0 / Q. The test compares 1 - eta_app/eta_w with Na/2, Na = b eta_w V^2 / k
(V = Q / (pi R^2)), the first-order result derived in docs/methods.md.
"""
import json
import math
import pathlib

import numpy as np
import scipy
from scipy.integrate import quad, solve_bvp

ETA_W = 1000.0  # Pa.s
B = 0.03  # 1/K
K = 0.2  # W/(m.K)
R = 0.5e-3  # m


def solve(lam):
    s = np.linspace(0, 1, 401)
    y0 = np.zeros((2, s.size))

    def f(s, y):
        # y0 = theta, y1 = s * dtheta/ds
        return np.vstack([np.where(s > 0, y[1] / np.maximum(s, 1e-300), 0.0), -lam * s**3 * np.exp(y[0])])

    def bc(ya, yb):
        return np.array([ya[1], yb[0]])

    sol = solve_bvp(f, bc, s, y0, tol=1e-10, max_nodes=200000)
    if not sol.success:
        raise RuntimeError(sol.message)
    ratio, _ = quad(lambda x: 4 * x**3 * math.exp(float(sol.sol(x)[0])), 0, 1, epsabs=0, epsrel=1e-12, limit=200)
    return ratio, float(sol.sol(0.0)[0])


def main():
    cases = []
    for target_na in [0.005, 0.02, 0.05, 0.1, 0.2]:
        # Na of the unheated flow is Lambda/16; the heated flow is faster, so Na is recomputed below
        lam = 16 * target_na
        ratio, theta_axis = solve(lam)
        G = math.sqrt(lam * 4 * K * ETA_W / (B * R**4))
        q0 = math.pi * R**4 * G / (8 * ETA_W)
        q = ratio * q0
        V = q / (math.pi * R**2)
        cases.append(
            {
                "pressureGradient": G,
                "meanVelocity": V,
                "flowRatio": ratio,
                "apparentViscosity": ETA_W / ratio,
                "axisTemperatureRise": theta_axis / B,
            }
        )
    out = {
        "generator": "scripts/scipy_heating_reference.py",
        "scipy": scipy.__version__,
        "numpy": np.__version__,
        "wallViscosity": ETA_W,
        "temperatureCoefficient": B,
        "conductivity": K,
        "radius": R,
        "cases": cases,
    }
    path = pathlib.Path(__file__).resolve().parent.parent / "test" / "fixtures" / "scipy-heating.json"
    path.write_text(json.dumps(out, indent=1) + "\n")
    print(f"wrote {path}")


if __name__ == "__main__":
    main()
