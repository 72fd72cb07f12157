#!/usr/bin/env python3
"""Reference values from SciPy / NumPy for the Knotwork engine tests.

Usage: python3 tests/reference/scipy_reference.py [output.json]
(default output: tests/reference/scipy-fixture.json next to this script).

Every value is the library's float64 result printed with 17 significant digits. The datasets'
inputs are short decimal strings so the engine (decimal arithmetic) and SciPy (binary floats)
start from the same numbers up to one rounding of the input. The check values are SciPy's output;
the input shapes are chosen to exercise the methods (uneven spacing, exponential growth,
a yield-curve hump, the fewest points each method takes, runs of equal values).

Quadratic spline: SciPy has no dedicated class. make_interp_spline(x, y, k=2, bc_type=...) with one
derivative condition places the knots at the data points (augmented knot vector) and gives the C1
quadratic spline through the points; bc_type=([(2, 0.0)], None) is "zero curvature on the first
piece", (None, [(2, 0.0)]) the mirror, ([(1, s)], None) / (None, [(1, s)]) a given end slope.
Checked with SciPy 1.17.
"""
import json
import os
import sys
from decimal import Decimal

import numpy as np
import scipy
from scipy.interpolate import (Akima1DInterpolator, CubicSpline, PchipInterpolator,
                               make_interp_spline)


def fmt(v):
    return format(float(v), ".17g")


def eval_points(xs, count=60):
    """count points from x_0 to x_n inclusive, rounded to 4 decimals, plus every knot."""
    lo, hi = Decimal(xs[0]), Decimal(xs[-1])
    pts = {lo + (hi - lo) * k / (count - 1) for k in range(count)}
    pts = {p.quantize(Decimal("0.0001")) for p in pts}
    pts |= {Decimal(x) for x in xs}
    pts = sorted(p for p in pts if lo <= p <= hi)
    return [format(p.normalize(), "f") for p in pts]


DATASETS = [
    {
        "name": "uneven",
        "note": "uneven spacing, sign changes",
        "x": ["0", "0.7", "1.5", "3.1", "3.4", "5", "7.25", "9"],
        "y": ["1.2", "0.4", "2.8", "3.1", "2.2", "-0.5", "0.9", "1.7"],
    },
    {
        "name": "mortality-exponential",
        "note": "q_x = 0.0004 exp(0.095 (x - 20)) at ages 20..100 step 10, 6 significant digits",
        "x": [str(a) for a in range(20, 101, 10)],
        "y": [format(Decimal(0.0004 * np.exp(0.095 * (a - 20))), ".6g") for a in range(20, 101, 10)],
    },
    {
        "name": "yield-curve",
        "note": "spot rates at standard tenors, humped shape",
        "x": ["0.25", "0.5", "1", "2", "3", "5", "7", "10", "15", "20", "30"],
        "y": ["0.0412", "0.0405", "0.0391", "0.0368", "0.0355", "0.0349", "0.0352", "0.0361", "0.0375", "0.0381", "0.0372"],
    },
    {
        "name": "two-points",
        "note": "the fewest points every method takes",
        "x": ["1", "3.5"],
        "y": ["0.25", "1.75"],
    },
    {
        "name": "three-points",
        "note": "not-a-knot gives the parabola; first non-trivial PCHIP/Akima case",
        "x": ["0", "1.5", "4"],
        "y": ["2", "0.5", "3"],
    },
    {
        "name": "equal-values",
        "note": "runs of equal y: zero slopes, Akima's undefined-slope case",
        "x": ["1", "2", "3", "4", "5", "6", "7", "8", "9"],
        "y": ["1", "1", "1", "2", "3", "3", "3", "2", "2"],
    },
    {
        "name": "step",
        "note": "a step: Akima with both weights zero, PCHIP flat at the turn",
        "x": ["0", "1", "2", "3", "4", "5", "6"],
        "y": ["0", "0", "0", "1", "1", "1", "1"],
    },
    {
        "name": "turning-ends",
        "note": "data turning next to both ends: PCHIP's end-slope cap 3 m0 (Moler 2004) applies at both ends",
        "x": ["0", "1", "2", "3.5", "4", "5", "6"],
        "y": ["0", "0.1", "-2", "-2.5", "1", "3", "2.9"],
    },
]

CLAMP = ("0.5", "-0.25")
SLOPE = "0.3"


def compute(ds):
    x = np.array([float(v) for v in ds["x"]])
    y = np.array([float(v) for v in ds["y"]])
    at_s = eval_points(ds["x"])
    at = np.array([float(v) for v in at_s])
    s0, s1 = float(CLAMP[0]), float(CLAMP[1])
    sl = float(SLOPE)
    results = []

    def add(method, options, call, fn):
        results.append({"method": method, "options": options, "scipy": call, "values": [fmt(v) for v in fn(at)]})

    add("linear", {}, "numpy.interp(at, x, y)", lambda t: np.interp(t, x, y))
    add("cubic-natural", {}, "CubicSpline(x, y, bc_type='natural')", CubicSpline(x, y, bc_type="natural"))
    add("cubic-clamped", {"startSlope": CLAMP[0], "endSlope": CLAMP[1]},
        f"CubicSpline(x, y, bc_type=((1, {CLAMP[0]}), (1, {CLAMP[1]})))", CubicSpline(x, y, bc_type=((1, s0), (1, s1))))
    add("cubic-not-a-knot", {}, "CubicSpline(x, y, bc_type='not-a-knot')", CubicSpline(x, y, bc_type="not-a-knot"))
    add("pchip", {}, "PchipInterpolator(x, y)", PchipInterpolator(x, y))
    add("akima", {}, "Akima1DInterpolator(x, y, method='akima')", Akima1DInterpolator(x, y, method="akima"))
    add("quadratic", {"condition": "left-zero-curvature"}, "make_interp_spline(x, y, k=2, bc_type=([(2, 0.0)], None))",
        make_interp_spline(x, y, k=2, bc_type=([(2, 0.0)], None)))
    add("quadratic", {"condition": "right-zero-curvature"}, "make_interp_spline(x, y, k=2, bc_type=(None, [(2, 0.0)]))",
        make_interp_spline(x, y, k=2, bc_type=(None, [(2, 0.0)])))
    add("quadratic", {"condition": "left-slope", "slope": SLOPE}, f"make_interp_spline(x, y, k=2, bc_type=([(1, {SLOPE})], None))",
        make_interp_spline(x, y, k=2, bc_type=([(1, sl)], None)))
    add("quadratic", {"condition": "right-slope", "slope": SLOPE}, f"make_interp_spline(x, y, k=2, bc_type=(None, [(1, {SLOPE})]))",
        make_interp_spline(x, y, k=2, bc_type=(None, [(1, sl)])))
    return {**ds, "at": at_s, "results": results}


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "scipy-fixture.json")
    fixture = {
        "source": "SciPy scipy.interpolate and NumPy numpy.interp, float64, values printed with 17 significant digits",
        "generator": "tests/reference/scipy_reference.py",
        "scipy": scipy.__version__,
        "numpy": np.__version__,
        "python": sys.version.split()[0],
        "datasets": [compute(ds) for ds in DATASETS],
    }
    with open(out, "w") as f:
        json.dump(fixture, f, indent=1)
        f.write("\n")
    print(f"wrote {out}: {len(fixture['datasets'])} datasets, scipy {scipy.__version__}")


if __name__ == "__main__":
    main()
