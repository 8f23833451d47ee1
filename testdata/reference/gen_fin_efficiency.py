#!/usr/bin/python3
"""Reference fin efficiencies for the Go tests of package fins.

Closed forms (Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and
Mass Transfer, 6th ed., 2007, Tables 3.4 and 3.5) evaluated with
scipy.special, and the tapered profiles (straight trapezoidal with a
convecting tip, annular with a linear taper and a convecting tip), which
have no elementary closed form in the textbook, solved as two-point
boundary-value problems with scipy.integrate.solve_bvp at tol 1e-10.
Columns: profile, h [W/m2K], k [W/mK], t_root [m], t_tip [m], L [m],
r1 [m], efficiency [-]. Efficiency areas: see the Go doc comments (the
same definitions).

    /usr/bin/python3 testdata/reference/gen_fin_efficiency.py > testdata/reference/fin_efficiency.csv
"""
import math
import numpy as np
from scipy import special as sp
from scipy.integrate import solve_bvp

rows = []

def rect(h, k, t, L):
    m = math.sqrt(2 * h / (k * t)); Lc = L + t / 2
    return math.tanh(m * Lc) / (m * Lc)

def rect_tip(h, k, t, L):
    m = math.sqrt(2 * h / (k * t)); a = h / (m * k)
    q = math.sqrt(2 * h * k * t) * (math.sinh(m * L) + a * math.cosh(m * L)) / (math.cosh(m * L) + a * math.sinh(m * L))
    return q / (h * (2 * L + t))

def tri(h, k, t, L):
    m = math.sqrt(2 * h / (k * t))
    return sp.i1(2 * m * L) / (m * L * sp.i0(2 * m * L))

def ann(h, k, t, r1, r2):
    m = math.sqrt(2 * h / (k * t)); r2c = r2 + t / 2
    num = sp.k1(m * r1) * sp.i1(m * r2c) - sp.i1(m * r1) * sp.k1(m * r2c)
    den = sp.i0(m * r1) * sp.k1(m * r2c) + sp.k0(m * r1) * sp.i1(m * r2c)
    return 2 * r1 / m / (r2c ** 2 - r1 ** 2) * num / den

def bvp(h, k, t0, t1, L, r1, annular):
    """theta(0)=1, -k A_c theta'(L) = h A_tip theta(L); returns efficiency."""
    def thick(s):
        return t0 + (t1 - t0) * s / L
    def ac(s):
        return 2 * math.pi * (r1 + s) * thick(s) if annular else thick(s)
    def per(s):
        return 4 * math.pi * (r1 + s) if annular else 2.0
    def f(s, y):
        # y0 = theta, y1 = k A_c theta'  (conducted heat, toward -s)
        A = 2 * np.pi * (r1 + s) * thick(s) if annular else thick(s)
        P = 4 * np.pi * (r1 + s) if annular else 2.0 + 0 * s
        return np.vstack([y[1] / (k * A), h * P * y[0]])
    def bc(ya, yb):
        return np.array([ya[0] - 1.0, yb[1] + h * ac(L) * yb[0]])
    s = np.linspace(0, L, 201)
    y = np.vstack([np.ones_like(s), -np.ones_like(s) * h])
    sol = solve_bvp(f, bc, s, y, tol=1e-10, max_nodes=200000)
    assert sol.success, sol.message
    q = -sol.sol(0.0)[1]
    if annular:
        area = 2 * math.pi * ((r1 + L) ** 2 - r1 ** 2) + ac(L)
    else:
        area = 2 * L + t1
    return q / (h * area)

print("profile,h,k,t_root,t_tip,L,r1,efficiency")
for h in (10.0, 50.0, 150.0, 400.0):
    for k in (47.0, 151.0, 237.0):
        for (t, L) in ((0.002, 0.015), (0.004, 0.030), (0.006, 0.020), (0.003, 0.060)):
            print(f"rect,{h},{k},{t},{t},{L},0,{rect(h, k, t, L)!r}")
            print(f"rect_tip,{h},{k},{t},{t},{L},0,{rect_tip(h, k, t, L)!r}")
            print(f"triangular,{h},{k},{t},0,{L},0,{tri(h, k, t, L)!r}")
            for r1 in (0.025, 0.045):
                print(f"annular_rect,{h},{k},{t},{t},{L},{r1},{ann(h, k, t, r1, r1 + L)!r}")
for h in (20.0, 80.0, 250.0):
    for k in (96.2, 167.0):
        for (t0, t1, L) in ((0.004, 0.0015, 0.030), (0.006, 0.003, 0.025), (0.003, 0.001, 0.045)):
            print(f"trapezoidal,{h},{k},{t0},{t1},{L},0,{bvp(h, k, t0, t1, L, 0.0, False)!r}")
            for r1 in (0.03, 0.05):
                print(f"annular_tapered,{h},{k},{t0},{t1},{L},{r1},{bvp(h, k, t0, t1, L, r1, True)!r}")
