#!/usr/bin/env python3
"""Reference values from SciPy for the engine's two-way (tensor-product) fill (tests/unit/engine/fill2d.test.ts).

Usage: python3 tests/reference/fill2d_reference.py           (prints the fixture JSON)
       python3 tests/reference/fill2d_reference.py --write   (also writes fill2d-fixture.json beside this script)

Which SciPy call matches which engine request (both axes unless said):
- cubic-not-a-knot: RectBivariateSpline(x, d, Z, kx=3, ky=3, s=0) (FITPACK's interpolating spline, knots at the data
  except the second and next-to-last: the not-a-knot condition), and RegularGridInterpolator((x, d), Z, method='cubic',
  solver=scipy.sparse.linalg.spsolve). With its default iterative solver (gcrotmk) SciPy 1.17's 'cubic' stops early and
  differs by about 1e-4, so the direct solver is named here.
- linear: RegularGridInterpolator((x, d), Z, method='linear').
- pchip: RegularGridInterpolator((d, x), Z.T, method='pchip'). RegularGridInterpolator fills along its last axis first;
  with the axes given as (d, x) that is x, the engine's order (for pchip the order matters).
- per-axis methods: successive SciPy 1-D fits in the engine's order, along x for every given d, then along d:
  CubicSpline(bc_type='natural') then numpy.interp; make_interp_spline(k=2, bc_type=([(2, 0.0)], None)) then
  Akima1DInterpolator(method='akima').
- transform log with cubic-not-a-knot: exp of RectBivariateSpline on ln Z.
Every value is printed with 17 significant digits.
"""
from decimal import Decimal

import numpy as np
from scipy.interpolate import (Akima1DInterpolator, CubicSpline, RectBivariateSpline, RegularGridInterpolator,
                               make_interp_spline)
from scipy.sparse.linalg import spsolve

from fixture_io import emit, provenance


def fmt(v):
    return format(float(v), ".17g")


def sig6(v):
    return format(Decimal(float(v)), ".6g")


DATASETS = [
    {"name": "select-table", "note": "q by age at entry x and duration d, rising with both, uneven spacing on both axes",
     "x": ["20", "25", "30", "37", "45", "50", "60"], "d": ["0", "1", "2", "4", "5"],
     "f": lambda a, b: 0.0005 * np.exp(0.09 * (a - 20)) * (0.55 + 0.45 * (1 - np.exp(-0.6 * b))),
     "gx": ["20", "60", "2.5"], "gd": ["0", "5", "0.5"]},
    {"name": "wavy", "note": "a surface with turns along both axes and a step in d",
     "x": ["0", "1", "2.5", "3", "4", "6", "7", "9"], "d": ["0", "0.5", "1", "2", "3.5", "4"],
     "f": lambda a, b: np.sin(a / 1.7) + 0.3 * b * b - 0.05 * a * b + (0.8 if b > 1.5 else 0.0),
     "gx": ["0", "9", "0.25"], "gd": ["0", "4", "0.25"]},
]


def axis(g):
    lo, hi, step = (Decimal(v) for v in g)
    n = int((hi - lo) / step) + 1
    return [format((lo + step * k).normalize(), "f") for k in range(n)]


def successive(x, d, Z, along_x, along_d, px, pd):
    """Along x for every given d, then along d, at every (px, pd) pair (x-major)."""
    cols = np.array([along_x(x, Z[:, j])(px) for j in range(len(d))])  # shape (len(d), len(px))
    return np.array([along_d(d, cols[:, k])(pd) for k in range(len(px))]).ravel()


def compute(ds):
    x = np.array([float(v) for v in ds["x"]])
    d = np.array([float(v) for v in ds["d"]])
    zs = [[sig6(ds["f"](a, b)) for b in d] for a in x]
    Z = np.array([[float(v) for v in row] for row in zs])
    ax, ad = axis(ds["gx"]), axis(ds["gd"])
    px, pd = np.array([float(v) for v in ax]), np.array([float(v) for v in ad])
    pairs = np.array([[a, b] for a in px for b in pd])
    interp = (lambda u, v: (lambda t: np.interp(t, u, v)))
    results = []

    def add(method, call, values, transform="none"):
        results.append({"method": method, "transform": transform, "scipy": call, "values": [fmt(v) for v in values]})

    add("cubic-not-a-knot", "RectBivariateSpline(x, d, Z, kx=3, ky=3, s=0)",
        RectBivariateSpline(x, d, Z, kx=3, ky=3, s=0)(pairs[:, 0], pairs[:, 1], grid=False))
    add("cubic-not-a-knot", "RegularGridInterpolator((x, d), Z, method='cubic', solver=spsolve)",
        RegularGridInterpolator((x, d), Z, method="cubic", solver=spsolve)(pairs))
    add("linear", "RegularGridInterpolator((x, d), Z, method='linear')", RegularGridInterpolator((x, d), Z, method="linear")(pairs))
    add("pchip", "RegularGridInterpolator((d, x), Z.T, method='pchip') (last axis, x, first)",
        RegularGridInterpolator((d, x), Z.T, method="pchip")(pairs[:, ::-1]))
    add({"x": "cubic-natural", "d": "linear"}, "CubicSpline(bc_type='natural') along x, then numpy.interp along d",
        successive(x, d, Z, lambda u, v: CubicSpline(u, v, bc_type="natural"), interp, px, pd))
    add({"x": "quadratic", "d": "akima"}, "make_interp_spline(k=2, bc_type=([(2, 0.0)], None)) along x, then Akima1DInterpolator along d",
        successive(x, d, Z, lambda u, v: make_interp_spline(u, v, k=2, bc_type=([(2, 0.0)], None)),
                   lambda u, v: Akima1DInterpolator(u, v, method="akima"), px, pd))
    if (Z > 0).all():
        add("cubic-not-a-knot", "exp(RectBivariateSpline(x, d, ln Z, kx=3, ky=3, s=0))",
            np.exp(RectBivariateSpline(x, d, np.log(Z), kx=3, ky=3, s=0)(pairs[:, 0], pairs[:, 1], grid=False)), "log")
    return {"name": ds["name"], "note": ds["note"], "x": ds["x"], "d": ds["d"], "z": zs, "gridX": ax, "gridD": ad, "results": results}


def main():
    emit("fill2d-fixture.json", {
        **provenance(
            "SciPy RectBivariateSpline, RegularGridInterpolator and successive 1-D fits, float64",
            "tests/reference/fill2d_reference.py"),
        "datasets": [compute(ds) for ds in DATASETS],
    })


if __name__ == "__main__":
    main()
