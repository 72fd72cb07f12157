#!/usr/bin/env python3
"""Reference values for Whittaker-Henderson graduation (the engine's graduate()).

Usage: python3 tests/reference/graduation_reference.py           (prints the fixture JSON)
       python3 tests/reference/graduation_reference.py --write   (also writes graduation-fixture.json beside this script)

For each dataset the normal equations (W + h K'K) u = W y of Whittaker (1923) and Henderson (1924) are built densely
(K: the (n - z) x n matrix of z-th differences) and solved twice:
  - numpy.linalg.solve in float64 (with numpy.linalg.cond of the matrix, so the test can scale its tolerance);
  - mpmath.lu_solve at 60 significant digits (an independent high-precision dense solve).
Also: the trace of the hat matrix (W + h K'K)^-1 W (numpy, and mpmath at 60 digits), the standardised deviations and chi-square with their p-value from
scipy.stats.chi2.sf, the sign test p-value from scipy.stats.binom, the grouping-of-signs probability (Stevens 1939,
exact with Python integers), and for a very large h the weighted least-squares polynomial of degree z - 1 from
numpy.polyfit (the limit of the graduation). Inputs are short decimal strings built here (no real data).
"""
import math
from decimal import Decimal, getcontext

import mpmath
import numpy as np
from scipy import stats

from fixture_io import emit

getcontext().prec = 60
mpmath.mp.dps = 60


def dstr(v):
    return format(v, '.17g') if isinstance(v, float) else str(v)


def differences(n, z):
    K = np.zeros((n - z, n))
    c = [(-1) ** (z - k) * math.comb(z, k) for k in range(z + 1)]
    for r in range(n - z):
        K[r, r:r + z + 1] = c
    return K


def mortality_points(n, start, exposure_scale, wobble):
    pts = []
    for i in range(n):
        q = Decimal('0.0004') * (Decimal('1.095') ** i)
        E = (Decimal(exposure_scale) * (Decimal('0.985') ** i)).quantize(Decimal('0.01'))
        noise = Decimal(str(round(math.sin(i * 7.3 + wobble) * 0.15, 4)))
        d = int((q * E * (1 + noise)).to_integral_value())
        pts.append({'x': str(start + i), 'deaths': str(d), 'exposure': str(E)})
    return pts


DATASETS = [
    {'name': 'mortality-central', 'order': 3, 'smoothing': '50000000', 'exposureType': 'central', 'points': mortality_points(60, 40, '20000', 0.3)},
    {'name': 'mortality-initial', 'order': 2, 'smoothing': '2000000', 'exposureType': 'initial', 'points': mortality_points(45, 50, '8000', 1.1)},
    {'name': 'weights-with-gap', 'order': 2, 'smoothing': '10', 'points': [
        {'x': str(x), 'y': str(Decimal(str(round(0.5 + 0.02 * x + 0.3 * math.sin(x), 6)))), 'weight': '0' if 12 <= x <= 14 else str(1 + (x % 4))} for x in range(30)]},
    {'name': 'large-smoothing', 'order': 3, 'smoothing': '10000000', 'points': [
        {'x': str(x / 2), 'y': str(Decimal(str(round(1 + 0.01 * x * x + math.cos(x), 5))))} for x in range(40)]},
    {'name': 'order-one', 'order': 1, 'smoothing': '0.5', 'points': [{'x': str(x), 'y': str((x * 37) % 11)} for x in range(12)]},
    {'name': 'polynomial-limit', 'order': 2, 'smoothing': '1000000000000', 'points': [
        {'x': str(x), 'y': str(Decimal(str(round(2 + 0.5 * x + math.sin(3 * x), 4)))), 'weight': str(1 + x % 3)} for x in range(25)]},
]


def run(ds):
    pts = ds['points']
    n = len(pts)
    z = ds['order']
    h = Decimal(ds['smoothing'])
    full = all('deaths' in p and 'exposure' in p for p in pts)
    y = [Decimal(p['y']) if 'y' in p else Decimal(p['deaths']) / Decimal(p['exposure']) for p in pts]
    w = [Decimal(p['weight']) if 'weight' in p else Decimal(p['exposure']) if 'exposure' in p else Decimal(1) for p in pts]
    K = differences(n, z)
    # float64
    A = np.diag([float(v) for v in w]) + float(h) * K.T @ K
    b = np.array([float(wi * yi) for wi, yi in zip(w, y)])
    u64 = np.linalg.solve(A, b)
    cond = float(np.linalg.cond(A))
    hat_trace = float(np.trace(np.linalg.solve(A, np.diag([float(v) for v in w]))))
    # 60 digits
    Km = mpmath.matrix(K.tolist())
    Am = mpmath.diag([mpmath.mpf(str(v)) for v in w]) + mpmath.mpf(str(h)) * (Km.T * Km)
    bm = mpmath.matrix([mpmath.mpf(str(wi * yi)) for wi, yi in zip(w, y)])
    u60 = mpmath.lu_solve(Am, bm)
    hat60 = sum((mpmath.lu_solve(Am, mpmath.matrix([w[i] if k == i else 0 for k in range(n)]))[i] for i in range(n)), mpmath.mpf(0))
    out = {
        'name': ds['name'], 'order': z, 'smoothing': ds['smoothing'], 'points': pts,
        'numpy': [dstr(float(v)) for v in u64], 'cond': cond,
        'mpmath': [mpmath.nstr(u60[i], 50, strip_zeros=False) for i in range(n)],
        'effectiveParameters': hat_trace,
        'effectiveParameters60': mpmath.nstr(hat60, 40),
    }
    if 'exposureType' in ds:
        out['exposureType'] = ds['exposureType']
    u = [float(u60[i]) for i in range(n)]
    if full:
        zs = []
        for p, ui in zip(pts, u):
            E = float(p['exposure'])
            var = E * ui if ds.get('exposureType', 'central') == 'central' else E * ui * (1 - ui)
            if var > 0:
                zs.append((float(p['deaths']) - E * ui) / math.sqrt(var))
        chi = sum(v * v for v in zs)
        df = len(zs) - hat_trace
        out['chiSquare'] = {'statistic': chi, 'df': df, 'pValue': float(stats.chi2.sf(chi, df))}
        signs = [1 if v > 0 else -1 for v in zs if v != 0]
    else:
        signs = []  # a point of weight 0 carries no observation: no deviation
        for i, yi in enumerate(y):
            d = mpmath.mpf(str(yi)) - u60[i] if w[i] > 0 else 0
            if d != 0:
                signs.append(1 if d > 0 else -1)
    pos = sum(1 for s in signs if s > 0)
    neg = len(signs) - pos
    m = min(pos, neg)
    out['signs'] = {'positive': pos, 'negative': neg, 'pValue': min(1.0, float(2 * stats.binom.cdf(m, pos + neg, 0.5)))}
    groups = sum(1 for k, s in enumerate(signs) if s > 0 and (k == 0 or signs[k - 1] != s))
    total = math.comb(pos + neg, pos)
    tail = sum(math.comb(pos - 1, t - 1) * math.comb(neg + 1, t) for t in range(1, groups + 1))
    out['runs'] = {'positiveGroups': groups, 'pValue': tail / total if pos and neg else 1.0}
    if ds['name'] == 'polynomial-limit':
        xs = np.array([float(p['x']) for p in pts])
        coef = np.polyfit(xs, [float(v) for v in y], z - 1, w=np.sqrt([float(v) for v in w]))
        out['polyfit'] = [dstr(float(np.polyval(coef, xv))) for xv in xs]
    return out


def main():
    emit('graduation-fixture.json', {'numpy': np.__version__, 'scipy': __import__('scipy').__version__, 'mpmath': mpmath.__version__, 'datasets': [run(ds) for ds in DATASETS]})


if __name__ == '__main__':
    main()
