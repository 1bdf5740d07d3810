#!/usr/bin/python3
"""Reference values for test/steps*.test.ts from scipy and numpy.

Writes test/fixtures/scipy-steps.json. Run with Debian's python3 (python3-scipy):
    /usr/bin/python3 scripts/scipy_steps_reference.py
Invented data (fixed seed): a noisy, drifting pressure window and a noisy piston position.
- window line fits: scipy.stats.linregress (slope, its standard error, residual standard
  deviation sqrt(SSR/(n-2))), numpy mean and sample standard deviation (ddof=1);
- quantiles: numpy.percentile with the default "linear" method (Hyndman & Fan type 7);
- piston speed from position: scipy.signal.savgol_filter(window 5, polyorder 1, deriv 1, delta dt),
  interior samples only (the ends are handled differently).
"""
import json
import pathlib

import numpy as np
import scipy
from scipy.signal import savgol_filter
from scipy.stats import linregress

SEED = 20260415
rng = np.random.default_rng(SEED)

# A window: 200 samples at uneven spacing, 150 bar with 0.4 % noise and a drift.
t = np.cumsum(rng.uniform(0.05, 0.15, 200)) + 12.0
p = 150e5 * (1 + 0.004 * rng.standard_normal(200)) + 2000.0 * (t - t[0])
windows = []
for a, b in [(0, 199), (50, 149), (120, 199), (3, 12)]:
    tt, pp = t[a:b + 1], p[a:b + 1]
    fit = linregress(tt, pp)
    resid = pp - (fit.intercept + fit.slope * tt)
    windows.append({
        "from": a, "to": b,
        "mean": float(np.mean(pp)), "sd": float(np.std(pp, ddof=1)),
        "slope": float(fit.slope), "slopeError": float(fit.stderr),
        "noise": float(np.sqrt(np.sum(resid ** 2) / (len(pp) - 2))),
    })

quantile_data = [3.0, 1.0, 4.0, 1.0, 5.0, 9.0, 2.0, 6.0, 5.0, 3.0, 5.0]
quantiles = [{"q": q, "value": float(np.percentile(quantile_data, 100 * q))} for q in (0.05, 0.25, 0.5, 0.95)]

dt = 0.2
tp = np.arange(60) * dt
position = np.where(tp < 6.0, 0.5 * tp, 3.0 + 2.0 * (tp - 6.0)) + 0.01 * rng.standard_normal(60)
speed = savgol_filter(position, 5, 1, deriv=1, delta=dt)

out = {
    "generator": "scripts/scipy_steps_reference.py",
    "scipy": scipy.__version__,
    "numpy": np.__version__,
    "seed": SEED,
    "window": {"time": t.tolist(), "pressure": p.tolist(), "fits": windows},
    "quantiles": {"data": quantile_data, "values": quantiles},
    "position": {"time": tp.tolist(), "position": position.tolist(), "speed": speed.tolist()},
}
path = pathlib.Path(__file__).resolve().parent.parent / "test" / "fixtures" / "scipy-steps.json"
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}")
