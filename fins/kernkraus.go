package fins

import (
	"math"

	"finmarch/fins/bessel"
	"finmarch/fins/validity"
)

// AnnularKernKraus returns the efficiency of an annular fin of uniform
// thickness t from root radius r1 to tip radius r2 with an insulated tip
// and no tip correction, relative to the two faces' area 2 pi (r2^2 -
// r1^2):
//
//	eta = 2 r1 / [m (r2^2 - r1^2)] *
//	      [I1(m r2) K1(m r1) - K1(m r2) I1(m r1)] /
//	      [I0(m r1) K1(m r2) + I1(m r2) K0(m r1)],   m = sqrt(2h/(k t)).
//
// Source: Kern & Kraus, Extended Surface Heat Transfer, McGraw-Hill, 1972
// (also Kraus, Aziz & Welty 2001), as implemented in
// CalebBell/ht:ht/core.py (fin_efficiency_Kern_Kraus, r_e = D_fin/2, r_o =
// D_o/2). It is the Bessel solution of AnnularRectangular with the tip at
// r2 itself instead of the corrected radius r2 + t/2, so that
// AnnularKernKraus(h, k, t, r1, r2) = AnnularRectangular(h, k, t, r1,
// r2 - t/2); the tip face's loss is left out. The
// source's assumptions: one-dimensional radial conduction, constant h and
// k, no radiation, constant base temperature, no contact resistance; the
// first is checked as Biot h t/(2k) < 0.1. Evaluated with exponentially
// scaled Bessel functions, so a large m r2 does not overflow. h in
// W/(m2 K), k in W/(m K), t, r1, r2 in m, r2 > r1 > 0.
func AnnularKernKraus(h, k, t, r1, r2 float64, log *validity.Log) float64 {
	checkBiot(log, "annular fin (Kern & Kraus)", h, k, t)
	m := math.Sqrt(2 * h / (k * t))
	a, b := m*r1, m*r2
	if b < 1e-6 {
		return 1
	}
	// With I(x) = Ie(x) exp(x) and K(x) = Ke(x) exp(-x), numerator and
	// denominator divided by exp(b - a) leave exp(-2 (b - a)) on the two
	// products K(b) I(a) and I0(a) K1(b), as in AnnularRectangular.
	e := math.Exp(-2 * (b - a))
	i0a, i1a, k0a, k1a := bessel.IK01e(a)
	_, i1b, _, k1b := bessel.IK01e(b)
	num := i1b*k1a - k1b*i1a*e
	den := i0a*k1b*e + i1b*k0a
	return 2 * r1 / (m * (r2*r2 - r1*r1)) * num / den
}
