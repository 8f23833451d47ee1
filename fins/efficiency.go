package fins

import (
	"math"

	"finmarch/fins/bessel"
	"finmarch/fins/validity"
)

// BiotLimit is the Biot number h t/(2k) above which the one-dimensional fin
// model loses accuracy (Incropera et al. 6th ed., Sec. 3.6.1: Bi << 1;
// 0.1 is the customary limit, common practice).
const BiotLimit = 0.1

func checkBiot(log *validity.Log, name string, h, k, t float64) {
	log.Check(name, "Biot number h t/(2k)", h*t/(2*k), 0, BiotLimit)
}

// tanhc returns tanh(x)/x, with its series near 0 so that the limit 1 is
// reached without 0/0.
func tanhc(x float64) float64 {
	if math.Abs(x) < 1e-4 {
		return 1 - x*x/3
	}
	return math.Tanh(x) / x
}

// StraightRectangular returns the efficiency of a straight fin of uniform
// thickness with the tip loss folded into a corrected length:
//
//	eta = tanh(m Lc) / (m Lc),  m = sqrt(2h/(k t)),  Lc = L + t/2,
//
// relative to the area 2 Lc per unit width. Source: Incropera et al. 6th ed.
// Table 3.5 and Eq. 3.89 (corrected length from Harper & Brown, NACA Report
// 158, 1922). Valid: 1-D fin (Biot h t/(2k) < 0.1); the corrected length is
// within 8% of the exact convective-tip result while (h t/k)^(1/2) <= 0.6
// (Incropera Sec. 3.6.4). h in W/(m2 K), k in W/(m K), t and L in m.
func StraightRectangular(h, k, t, L float64, log *validity.Log) float64 {
	checkBiot(log, "straight rectangular fin", h, k, t)
	m := math.Sqrt(2 * h / (k * t))
	return tanhc(m * (L + t/2))
}

// StraightRectangularTip returns the efficiency of a straight uniform fin
// with a convecting tip by the exact solution (Incropera et al. 6th ed.
// Eq. 3.72, Table 3.4 case A):
//
//	q = sqrt(2 h k t) theta_b (sinh mL + (h/mk) cosh mL)/(cosh mL + (h/mk) sinh mL)
//
// per unit width, with eta = q / (h (2L + t) theta_b). Arguments as for
// StraightRectangular.
func StraightRectangularTip(h, k, t, L float64, log *validity.Log) float64 {
	checkBiot(log, "straight rectangular fin", h, k, t)
	m := math.Sqrt(2 * h / (k * t))
	a := h / (m * k)
	x := m * L
	if x < 1e-4 {
		// Series of the exact result about mL = 0 is 1 to first order.
		return 1 - x*x/3
	}
	th := math.Tanh(x)
	q := math.Sqrt(2*h*k*t) * (th + a) / (1 + a*th)
	return q / (h * (2*L + t))
}

// StraightTriangular returns the efficiency of a straight fin of triangular
// profile (root thickness t, sharp tip):
//
//	eta = I1(2mL) / (mL I0(2mL)),  m = sqrt(2h/(k t)),
//
// relative to 2L per unit width (the small-slope area). Source: Incropera
// et al. 6th ed. Table 3.5; Gardner (1945). Valid: 1-D fin, Biot h t/(2k) <
// 0.1, slope t/(2L) small. Units as for StraightRectangular.
func StraightTriangular(h, k, t, L float64, log *validity.Log) float64 {
	checkBiot(log, "straight triangular fin", h, k, t)
	m := math.Sqrt(2 * h / (k * t))
	x := m * L
	if x < 1e-4 {
		return 1 - x*x/2
	}
	return bessel.I1e(2*x) / (x * bessel.I0e(2*x))
}

// StraightTrapezoidal returns the efficiency of a straight fin whose
// thickness falls linearly from tRoot at the root to tTip at the tip (the
// as-cast taper), with heat convected from the tip face too. Relative to
// (2L + tTip) per unit width. Exact solution of d/dx(k d(x) dtheta/dx) =
// 2 h theta with d linear: with s = (tRoot - tTip)/L, beta = 2h/(k s^2) and
// z = 2 sqrt(beta d),
//
//	theta = A I0(z) + B K0(z),  q = k s (z/2) (A I1(z) - B K1(z)),
//
// B/A fixed by the tip balance q(tip) = h tTip theta(tip). This is the
// Bessel-function solution of the longitudinal trapezoidal fin in Kraus,
// Aziz & Welty, Extended Surface Heat Transfer (2001), Sec. 2.7; it reduces
// to StraightTriangular at tTip = 0 and to StraightRectangularTip at
// tTip = tRoot, both of which the tests check. Valid: 1-D fin, Biot at the
// root h tRoot/(2k) < 0.1, 0 <= tTip <= tRoot. Units as above.
func StraightTrapezoidal(h, k, tRoot, tTip, L float64, log *validity.Log) float64 {
	checkBiot(log, "straight trapezoidal fin", h, k, tRoot)
	if tRoot-tTip <= 1e-9*tRoot {
		return StraightRectangularTip(h, k, tRoot, L, nil)
	}
	if q, ok := trapezoidQ(h, k, tRoot, tTip, L); ok {
		return q / (h * (2*L + tTip))
	}
	return StraightRectangularTip(h, k, tRoot, L, nil)
}

// trapezoidQ is the root heat rate per unit width per kelvin of base excess
// for the straight trapezoidal fin. ok is false when the taper is so slight
// that the Bessel arguments lose meaning (use the uniform solution then).
func trapezoidQ(h, k, tRoot, tTip, L float64) (float64, bool) {
	s := (tRoot - tTip) / L
	beta := 2 * h / (k * s * s)
	zb := 2 * math.Sqrt(beta*tRoot)
	zt := 2 * math.Sqrt(beta*tTip)
	if zb < 1e-6 {
		return 2 * h * (L + tTip/2), true // efficiency 1 to first order
	}
	var r float64
	if tTip > 0 {
		c := 2 * h * tTip / (k * s * zt)
		i0, i1, k0, k1 := bessel.IK01e(zt)
		r = (i1 - c*i0) / (k1 + c*k0)
	}
	e := math.Exp(-2 * (zb - zt))
	var i0b, i1b, k0b, k1b float64
	if r != 0 {
		i0b, i1b, k0b, k1b = bessel.IK01e(zb)
	} else {
		i0b, i1b = bessel.I01e(zb)
	}
	num := i1b - r*e*k1b
	den := i0b + r*e*k0b
	q := k * s * zb / 2 * num / den
	if math.IsNaN(q) || math.IsInf(q, 0) {
		return 0, false
	}
	return q, true
}

// AnnularRectangular returns the efficiency of an annular fin of uniform
// thickness t from root radius r1 to tip radius r2, tip loss folded into the
// corrected radius r2c = r2 + t/2:
//
//	eta = (2 r1 / m) / (r2c^2 - r1^2) *
//	      [K1(m r1) I1(m r2c) - I1(m r1) K1(m r2c)] /
//	      [I0(m r1) K1(m r2c) + K0(m r1) I1(m r2c)],   m = sqrt(2h/(k t)),
//
// relative to the area 2 pi (r2c^2 - r1^2). Source: Incropera et al. 6th ed.
// Table 3.5 (Gardner 1945). Evaluated with exponentially scaled Bessel
// functions so that large m r2c does not overflow. Valid: 1-D fin, Biot
// h t/(2k) < 0.1, r2 > r1 > 0. h in W/(m2 K), k in W/(m K), lengths in m.
func AnnularRectangular(h, k, t, r1, r2 float64, log *validity.Log) float64 {
	checkBiot(log, "annular rectangular fin", h, k, t)
	m := math.Sqrt(2 * h / (k * t))
	r2c := r2 + t/2
	a, b := m*r1, m*r2c
	if b < 1e-6 {
		return 1
	}
	e := math.Exp(-2 * (b - a))
	i0a, i1a, k0a, k1a := bessel.IK01e(a)
	_, i1b, _, k1b := bessel.IK01e(b)
	num := k1a*i1b - i1a*k1b*e
	den := k0a*i1b + i0a*k1b*e
	return 2 * r1 / (m * (r2c*r2c - r1*r1)) * num / den
}

// taperCells is the coarse mesh of AnnularTapered; the fine mesh doubles it.
const taperCells = 16

// AnnularTapered returns the efficiency of an annular fin whose thickness
// falls linearly from tRoot at r1 to tTip at r2, convecting from both faces
// and the tip face, relative to 2 pi (r2^2 - r1^2) + 2 pi r2 tTip. No
// elementary closed form exists for this profile (Kraus, Aziz & Welty 2001,
// Ch. 3 treat it numerically), so it is solved by the finite-volume method
// of Solve on a fixed mesh of 16 and 32 cells combined by Richardson
// extrapolation (Richardson 1911), which the tests hold to 1e-6 of a fine
// solution and to AnnularRectangular at tTip = tRoot. It does not allocate.
// Valid: 1-D fin, Biot at the root < 0.1, 0 <= tTip <= tRoot, r2 > r1 > 0.
// Units as for AnnularRectangular.
func AnnularTapered(h, k, tRoot, tTip, r1, r2 float64, log *validity.Log) float64 {
	checkBiot(log, "annular tapered fin", h, k, tRoot)
	p := profile{annular: true, r1: r1, L: r2 - r1, t0: tRoot, t1: tTip, tipConv: true}
	var bc [2*taperCells + 1]float64
	var bf [4*taperCells + 1]float64
	coarse, fine := p.mesh(taperCells, bc[:]), p.mesh(2*taperCells, bf[:])
	x := h / k
	q := h * (4*fine.heat(x) - coarse.heat(x)) / 3
	area := 2*math.Pi*(r2*r2-r1*r1) + 2*math.Pi*r2*tTip
	return q / (h * area)
}
