#!/usr/bin/python3
"""Reference Harrell-Davis quantiles (Harrell & Davis, Biometrika 69, 1982)
for airflow/uncertainty's percentiles, from scipy.stats.mstats.hdquantiles.

Run with Debian's python3-scipy:
    /usr/bin/python3 testdata/reference/gen_hdquantiles.py > testdata/reference/hdquantiles.csv
Each row: the case name, p, the quantile, then the sample (space separated).
"""
import numpy as np
from scipy.stats.mstats import hdquantiles

rng = np.random.default_rng(20261202)
cases = {
    "uniform-1-101": np.arange(1.0, 102.0),
    "skewed-6": np.array([1.0, 2.0, 3.0, 4.0, 10.0, 50.0]),
    "lognormal-200": np.round(np.exp(rng.normal(5.5, 0.3, 200)), 6),
}
print("case,p,quantile,sample")
for name, x in cases.items():
    for p in (0.05, 0.5, 0.95):
        q = hdquantiles(x, [p])[0]
        print(f"{name},{p},{q:.15g},{' '.join(f'{v:.15g}' for v in x)}")
