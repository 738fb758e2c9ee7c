#!/usr/bin/python3
"""Write interp/testdata/scipy_tps.csv: thin-plate spline values from scipy.

Run with Debian's python3-scipy:  /usr/bin/python3 interp/testdata/scipy_fixture.py

It fits scipy.interpolate.RBFInterpolator(kernel="thin_plate_spline",
degree=1), which is phi(r) = r^2 log r plus a linear polynomial, to a small
seeded survey and evaluates it at seeded test points, with smoothing 0 and
with smoothing 2.5 (scipy's smoothing is added to the kernel matrix's
diagonal in the caller's coordinates). The Go test TestScipyFixture fits the
same readings and must agree to 1e-8 relative.
"""
import csv
import sys

import numpy as np
import scipy
from scipy.interpolate import RBFInterpolator

OUT = sys.argv[1] if len(sys.argv) > 1 else "interp/testdata/scipy_tps.csv"
SMOOTHING = [0.0, 2.5]


def survey(rng, n):
    # An invented site, 200 m x 150 m, with a smooth potential field.
    x = 1000.0 + 200.0 * rng.random(n)
    y = 2000.0 + 150.0 * rng.random(n)
    v = 12.0 * np.sin(x / 37.0) + 8.0 * np.cos(y / 23.0) + 0.05 * (x - 1000.0)
    return x, y, v


def main():
    rng = np.random.default_rng(20240611)
    x, y, v = survey(rng, 60)
    tx = 1000.0 + 200.0 * rng.random(40)
    ty = 2000.0 + 150.0 * rng.random(40)
    pts = np.column_stack([x, y])
    tpts = np.column_stack([tx, ty])
    with open(OUT, "w", newline="") as f:
        f.write("# scipy %s, numpy %s: RBFInterpolator(kernel=\"thin_plate_spline\", degree=1)\n"
                % (scipy.__version__, np.__version__))
        f.write("# written by interp/testdata/scipy_fixture.py; rows: reading (x,y,value) or eval (x,y,smoothing,value)\n")
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["kind", "x", "y", "smoothing", "value"])
        for i in range(len(x)):
            w.writerow(["reading", repr(x[i]), repr(y[i]), "", repr(v[i])])
        for s in SMOOTHING:
            rbf = RBFInterpolator(pts, v, kernel="thin_plate_spline", degree=1, smoothing=s)
            tv = rbf(tpts)
            for i in range(len(tx)):
                w.writerow(["eval", repr(tx[i]), repr(ty[i]), repr(s), repr(tv[i])])


if __name__ == "__main__":
    main()
