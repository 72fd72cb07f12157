#!/usr/bin/env python3
"""Locality of a bump, computed with SciPy / NumPy, for the Knotwork engine test tests/unit/engine/bump.test.ts.

Usage: python3 tests/reference/scipy_bump.py  (prints JSON on standard output).

For each dataset and method: raise the middle given point (index n // 2) by 1 basis point (curves) or 1 % of its value, fit again, evaluate both fits at
the middle of every interval between given points, and report the intervals whose value changed at all, the
intervals where the change is at least 1 % of the bump, and the largest change divided by the bump. A change counts
as "at all" when it exceeds 1e-12 times the bump: SciPy works in float64, where an untouched piece can still differ in
its last bits after a global solve; the engine's exact arithmetic gives exactly zero there.
"""
import json
import sys

import numpy as np
import scipy
from scipy.interpolate import Akima1DInterpolator, CubicSpline, PchipInterpolator, make_interp_spline

DATASETS = [
    {"name": "curve at standard tenors", "kind": "spot-rate",
     "x": ["0.25", "0.5", "1", "2", "3", "5", "7", "10", "15", "20", "30"],
     "y": ["0.0312", "0.0318", "0.0325", "0.0331", "0.0334", "0.0339", "0.0342", "0.0346", "0.0351", "0.0349", "0.0343"]},
    {"name": "q_x at 5-year ages", "kind": "mortality",
     "x": ["55", "60", "65", "70", "75", "80", "85", "90", "95"],
     "y": ["0.0041", "0.0065", "0.0104", "0.011", "0.0255", "0.041", "0.066", "0.105", "0.166"]},
]

METHODS = {
    "linear": lambda x, y: (lambda t: np.interp(t, x, y)),
    "cubic-natural": lambda x, y: CubicSpline(x, y, bc_type="natural"),
    "cubic-not-a-knot": lambda x, y: CubicSpline(x, y, bc_type="not-a-knot"),
    "pchip": lambda x, y: PchipInterpolator(x, y),
    "akima": lambda x, y: Akima1DInterpolator(x, y, method="akima"),
    "quadratic": lambda x, y: make_interp_spline(x, y, k=2, bc_type=([(2, 0.0)], None)),
}


def span(x, hits):
    if not hits:
        return None
    return {"from": x[hits[0]], "to": x[hits[-1] + 1], "intervals": len(hits)}


def main():
    out = []
    for ds in DATASETS:
        x = np.array([float(v) for v in ds["x"]])
        y = np.array([float(v) for v in ds["y"]])
        j = len(x) // 2
        # as the engine: 1 basis point on a curve, 1 % of the moved value on any other table
        size = 0.0001 if ds["kind"] == "spot-rate" else abs(y[j]) / 100
        yb = y.copy()
        yb[j] += size
        mid = (x[:-1] + x[1:]) / 2
        results = {}
        for name, make in METHODS.items():
            d = np.abs(make(x, yb)(mid) - make(x, y)(mid))
            results[name] = {
                "changed": span(ds["x"], [i for i, v in enumerate(d) if v > 1e-12 * size]),
                "material": span(ds["x"], [i for i, v in enumerate(d) if v >= size / 100]),
                "ratio": float(np.max(d) / size),
            }
        out.append({**ds, "results": results})
    json.dump({"scipy": scipy.__version__, "numpy": np.__version__, "datasets": out}, sys.stdout, indent=1)


if __name__ == "__main__":
    main()
