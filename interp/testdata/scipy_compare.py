#!/usr/bin/python3
"""Time `isofield grid` against scipy's RBFInterpolator on the same data.

Not run by CI. Usage, from the repository root, after `go build -o
/tmp/isofield ./cmd/isofield`:

    /usr/bin/python3 interp/testdata/scipy_compare.py /tmp/isofield [N]

It writes N (default 100,000) seeded scattered readings of the surface
potential of four point current sources buried in a half-space,
V = rho I / (2 pi sqrt(r^2 + d^2)) (Telford, Geldart & Sheriff, Applied
Geophysics, ch. 8), in mV, over an invented 999 m x 749 m site (with
readings at the four corners so that a 1 m grid has 1000 x 750 nodes).
Then it times, side by side on this machine:

  1. the whole `isofield grid --spacing 1` run, CSV in and CSV out;
  2. scipy.interpolate.RBFInterpolator(kernel="thin_plate_spline",
     neighbors=32) fit plus evaluation at the same nodes (no CSV, no field).

and reports each one's RMS and maximum error against the closed form over
the nodes isofield did not mask.
"""
import csv
import os
import subprocess
import sys
import tempfile
import time

import numpy as np
import scipy
from scipy.interpolate import RBFInterpolator

RHO = 100.0  # ohm metres
SOURCES = [  # x, y, depth (m), current (A)
    (250.0, 300.0, 30.0, 20.0),
    (700.0, 450.0, 40.0, -20.0),
    (500.0, 150.0, 25.0, 10.0),
    (820.0, 640.0, 35.0, -10.0),
]


def potential_mV(x, y):
    v = np.zeros_like(x)
    for sx, sy, d, i in SOURCES:
        v += RHO * i / (2 * np.pi * np.sqrt((x - sx) ** 2 + (y - sy) ** 2 + d * d))
    return 1000.0 * v


def survey(n):
    rng = np.random.default_rng(42)
    x = np.concatenate([[0, 999, 0, 999], 999.0 * rng.random(n - 4)])
    y = np.concatenate([[0, 0, 749, 749], 749.0 * rng.random(n - 4)])
    return x, y, potential_mV(x, y)


def run_isofield(binary, path, out):
    t0 = time.perf_counter()
    subprocess.run([binary, "grid", "--spacing", "1", "--force", "-o", out, path], check=True)
    return time.perf_counter() - t0


def read_grid(out):
    data = np.genfromtxt(out, delimiter=",", names=True)
    return data["x_m"], data["y_m"], data["potential_mV"]


def errors(v, truth):
    d = v - truth
    return float(np.sqrt(np.mean(d * d))), float(np.max(np.abs(d)))


def main():
    binary = sys.argv[1]
    n = int(sys.argv[2]) if len(sys.argv) > 2 else 100_000
    x, y, v = survey(n)
    tmp = tempfile.mkdtemp(prefix="isofield-compare-")
    path, out = os.path.join(tmp, "readings.csv"), os.path.join(tmp, "grid.csv")
    with open(path, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["id", "x", "y", "potential_mV"])
        for k in range(n):
            w.writerow(["P%d" % k, "%.3f" % x[k], "%.3f" % y[k], "%.4f" % v[k]])
    x, y = np.round(x, 3), np.round(y, 3)

    t_iso = run_isofield(binary, path, out)
    gx, gy, gv = read_grid(out)
    keep = np.isfinite(gv)
    truth = potential_mV(gx, gy)
    e_iso = errors(gv[keep], truth[keep])

    nodes = np.column_stack([gx, gy])
    t0 = time.perf_counter()
    rbf = RBFInterpolator(np.column_stack([x, y]), v, kernel="thin_plate_spline", neighbors=32)
    sv = rbf(nodes)
    t_sci = time.perf_counter() - t0
    e_sci = errors(sv[keep], truth[keep])

    print("readings %d, grid nodes %d (%d unmasked), scipy %s, numpy %s, %d cores"
          % (n, len(gx), int(keep.sum()), scipy.__version__, np.__version__, os.cpu_count()))
    print("isofield grid (CSV in and out, with field): %8.2f s   RMS %.4g mV  max %.4g mV" % (t_iso, *e_iso))
    print("scipy RBFInterpolator(neighbors=32) fit+eval: %8.2f s   RMS %.4g mV  max %.4g mV" % (t_sci, *e_sci))
    print("speed-up %.1fx" % (t_sci / t_iso))


if __name__ == "__main__":
    main()
