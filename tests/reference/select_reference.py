"""Select-and-ultimate fill reference (issue 17): an invented select table of pivotal cells (entry ages 20..60 by 10,
durations 0, 1, 3, 4 of a 5-year select period) with an ultimate column. SciPy fills the select block by a method per
axis as the engine does (along x first for every given d, then along d): CubicSpline(bc_type='natural') along x and
numpy.interp (linear) along d; the ultimate column by CubicSpline(bc_type='natural') along x. Then, for entry age 40,
the annuity-due and curtate expectation along the select-then-ultimate path at 3 %, summed in floats (AMLCR 3.7, 5.6)."""
import numpy as np
from scipy.interpolate import CubicSpline
from fixture_io import emit, provenance

xs = [20, 30, 40, 50, 60]
ds = [0, 1, 3, 4]
z = [[0.00030, 0.00042, 0.00055, 0.00060], [0.00040, 0.00055, 0.00072, 0.00078], [0.00070, 0.00098, 0.00130, 0.00142],
     [0.00160, 0.00230, 0.00310, 0.00340], [0.00400, 0.00580, 0.00780, 0.00860]]
ult = [0.00070, 0.00095, 0.00170, 0.00420, 0.01050]
gx = list(range(20, 61))
gd = [0, 1, 2, 3, 4]

cols = np.array([CubicSpline(xs, [row[j] for row in z], bc_type='natural')(gx) for j in range(len(ds))])  # (d, x)
select = [[float(np.interp(d, ds, cols[:, k])) for d in gd] for k in range(len(gx))]
ultimate = [float(v) for v in CubicSpline(xs, ult, bc_type='natural')(gx)]

def path_figures(q, i=0.03):
    v, p, vk, a, e = 1 / (1 + i), 1.0, 1.0, 1.0, 0.0
    for qk in q:
        p *= 1 - qk
        vk *= v
        a += vk * p
        e += p
    return a, e

k40 = gx.index(40)
a40, e40 = path_figures(select[k40] + ultimate[k40:])
emit('select-fixture.json', {
    **provenance("SciPy CubicSpline(bc_type='natural') along x, numpy.interp along d; annuity summed in floats", 'tests/reference/select_reference.py'),
    'xs': [str(x) for x in xs], 'ds': [str(d) for d in ds], 'z': [[repr(v) for v in row] for row in z], 'ult': [repr(v) for v in ult],
    'select': [[repr(v) for v in row] for row in select], 'ultimate': [repr(v) for v in ultimate],
    'annuity40': repr(a40), 'expectation40': repr(e40),
})
