#!/usr/bin/python3
"""Reference values of the monotone piecewise cubic interpolant (pchip) for
the Go tests of airflow/cylinder (fan curves).

scipy.interpolate.PchipInterpolator (Fritsch & Carlson 1980, slopes of
Fritsch & Butland 1984 as scipy computes them) on three data sets shaped
like fan curves (pressure falling with flow, one with a flat part and one
with uneven spacing), evaluated at points inside each data range.
Run with Debian's python3-scipy: /usr/bin/python3 gen_pchip.py > pchip.csv
Columns: set, x, value.
"""
import numpy as np
from scipy.interpolate import PchipInterpolator

sets = {
    "fan": ([0.0, 0.02, 0.04, 0.06, 0.08, 0.10], [620.0, 600.0, 540.0, 430.0, 260.0, 0.0]),
    "flat": ([0.0, 0.01, 0.03, 0.05, 0.06], [300.0, 300.0, 280.0, 150.0, 0.0]),
    "uneven": ([0.0, 0.005, 0.02, 0.021, 0.05, 0.09], [900.0, 880.0, 800.0, 790.0, 500.0, 40.0]),
}
print("set,x,value")
for name, (x, y) in sets.items():
    f = PchipInterpolator(np.array(x), np.array(y))
    for t in np.linspace(x[0], x[-1], 37):
        print(f"{name},{t!r},{float(f(t))!r}")
