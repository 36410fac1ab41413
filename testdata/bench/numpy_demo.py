#!/usr/bin/env python3
"""A vectorised numpy script of the demo reservoir model, for measuring
rockheat side by side with an array language (README, "Speed").

The same inputs as scenarios/examples/demo.toml, drawn by plain random
sampling (numpy's own generators, so not the same draws), the same
volumetric formula, and exact percentiles (numpy.percentile, linear, as
type 7) of two outputs: heat in place and electric capacity.

    /usr/bin/python3 testdata/bench/numpy_demo.py 1000000
"""
import json
import sys

import numpy as np

n = int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000
rng = np.random.default_rng(12345)

area = rng.triangular(3, 6, 14, n) * 1e6                       # m²
thickness = rng.uniform(800, 1600, n)                          # m
temp = rng.normal(235, 12, n)                                  # °C, cut below at 200
low = temp < 200
while low.any():
    temp[low] = rng.normal(235, 12, low.sum())
    low = temp < 200
a, b = 1 + 4 * (0.06 - 0.02) / 0.10, 1 + 4 * (0.12 - 0.06) / 0.10
porosity = 0.02 + 0.10 * rng.beta(a, b, n)                     # PERT(0.02, 0.06, 0.12)
rock_c = rng.uniform(850, 1000, n)
recovery = rng.uniform(0.08, 0.20, n)
efficiency = rng.triangular(0.08, 0.11, 0.14, n)
life = 30 * 365.25 * 86400

rho_c = (1 - porosity) * 2650 * rock_c + porosity * 850 * 4600
heat = area * thickness * rho_c * (temp - 15)                  # J
power = efficiency * recovery * heat / (0.9 * life) / 1e6      # MWe

out = {}
for name, x in (("heat_in_place", heat), ("electric_power", power)):
    p90, p50, p10 = np.percentile(x, [10, 50, 90])
    out[name] = {"p90": p90, "p50": p50, "p10": p10, "mean": float(x.mean())}
print(json.dumps(out))
