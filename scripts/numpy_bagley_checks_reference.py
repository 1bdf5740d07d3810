#!/usr/bin/python3
"""Independent reference values for test/bagley-checks-numpy.test.ts.

Writes test/fixtures/numpy-bagley-checks.json. Run with Debian's python3 (python3-numpy):
    /usr/bin/python3 scripts/numpy_bagley_checks_reference.py

1. curvature: weighted quadratic least squares of the Bagley plot at one rate,
   dP = b0 + b1 x + b2 x^2 (x = L/R), with known reading variances (sigma * dP_i)^2, by
   numpy.polyfit(x, dP, 2, w=1/(sigma dP), cov="unscaled"); z = b2 / sqrt(var b2). The project
   solves the normal equations in a centred, scaled abscissa instead (src/core/bagleyChecks.ts).
2. ladder: a die's pressure at a rate between two of its steps by linear interpolation of
   ln dP against ln rate, numpy.interp (the project bisects and interpolates itself,
   src/core/rateLadder.ts), and the continuation of the end interval a little beyond the last
   step, numpy.polyfit of degree 1 through the two end points in log-log.
The readings are invented (an upward-bending Bagley line and a power-law die); only the
arithmetic is the reference.
"""
import json
import pathlib

import numpy as np

out = {"generator": f"numpy {np.__version__} (Debian python3-numpy)", "curvature": [], "ladder": []}

SIGMA = 0.01
lines = [
    {"x": [5.0, 10.0, 20.0, 40.0], "p": [61.0e5, 95.0e5, 166.0e5, 322.0e5]},
    {"x": [5.0, 10.0, 20.0], "p": [30.2e5, 48.1e5, 86.9e5]},
    {"x": [0.0, 10.0, 20.0, 30.0, 40.0], "p": [20.0e5, 70.4e5, 119.7e5, 171.0e5, 219.2e5]},
]
for line in lines:
    x = np.array(line["x"])
    p = np.array(line["p"])
    coef, cov = np.polyfit(x, p, 2, w=1.0 / (SIGMA * p), cov="unscaled")
    out["curvature"].append({"x": line["x"], "pressure": line["p"], "sigma": SIGMA, "b2": coef[0], "z": coef[0] / np.sqrt(cov[0, 0])})

rates = [10.0, 30.0, 100.0, 300.0, 1000.0]
pressures = [52.0e5, 88.0e5, 151.0e5, 243.0e5, 395.0e5]
lr, lp = np.log(rates), np.log(pressures)
for rate in [17.0, 55.0, 999.0, 1020.0, 9.8]:
    if rates[0] <= rate <= rates[-1]:
        value = float(np.exp(np.interp(np.log(rate), lr, lp)))
    else:
        end = slice(-2, None) if rate > rates[-1] else slice(0, 2)
        slope, intercept = np.polyfit(lr[end], lp[end], 1)
        value = float(np.exp(intercept + slope * np.log(rate)))
    out["ladder"].append({"rates": rates, "pressures": pressures, "rate": rate, "pressure": value})

path = pathlib.Path(__file__).resolve().parent.parent / "test" / "fixtures" / "numpy-bagley-checks.json"
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}")
