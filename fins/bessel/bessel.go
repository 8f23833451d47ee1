// Package bessel evaluates the modified Bessel functions of the first and
// second kind of orders 0 and 1, I0, I1, K0, K1, and their exponentially
// scaled forms, which the annular and tapered fin solutions need and which
// neither the Go standard library nor gonum provides.
//
// Methods (x in the argument's own units, dimensionless):
//   - I0, I1 for x <= 25: the ascending series, Abramowitz & Stegun (1964)
//     Eq. 9.6.10; every term is positive, so it is accurate to rounding.
//   - I0, I1 for x > 25 and K0, K1 for x > 25: the asymptotic expansions
//     A&S Eqs. 9.7.1 and 9.7.2, summed until the terms stop falling; at
//     x = 25 the smallest term is below 1e-20.
//   - K0, K1 for x <= 2: the series A&S Eqs. 9.6.13 and 9.6.11.
//   - K0, K1 for 2 < x <= 25: the integral K_n(x) = int_0^inf
//     exp(-x cosh t) cosh(n t) dt (A&S Eq. 9.6.24) by the trapezoidal rule,
//     which converges geometrically for this integrand (Trefethen &
//     Weideman, SIAM Review 56, 2014, Sec. 5).
//
// Accuracy, checked against mpmath and scipy values in
// testdata/reference/bessel.csv: better than 1e-13 relative for
// 1e-4 <= x <= 700. The unscaled I overflow to +Inf and K underflow to 0
// beyond about x = 700; use the scaled forms there. Non-positive x for K and
// negative x for I return NaN for K and the even/odd extension for I.
package bessel

import "math"

const (
	seriesLimitI = 25.0
	seriesLimitK = 2.0
	asymLimit    = 25.0
	eulerGamma   = 0.57721566490153286060651209008240243
	trapStep     = 0.125
	trapTerms    = 64
)

// cosh(k h) and cosh(k h)-1 for the trapezoidal rule, built once.
var trapCosh, trapCoshM1 [trapTerms]float64

func init() {
	for k := range trapTerms {
		t := float64(k) * trapStep
		trapCosh[k] = math.Cosh(t)
		// cosh t - 1 = 2 sinh^2(t/2), without cancellation near t = 0.
		s := math.Sinh(t / 2)
		trapCoshM1[k] = 2 * s * s
	}
}

// iSeries returns I0(x), I1(x) by A&S 9.6.10.
func iSeries(x float64) (i0, i1 float64) {
	q := x * x / 4
	t0, t1 := 1.0, x/2
	i0, i1 = t0, t1
	for k := 1; k < 200; k++ {
		fk := float64(k)
		t0 *= q / (fk * fk)
		t1 *= q / (fk * (fk + 1))
		i0 += t0
		i1 += t1
		if t0 < 1e-17*i0 && t1 < 1e-17*i1 {
			break
		}
	}
	return i0, i1
}

// asym sums the asymptotic series sum_k s^k a_k(nu)/x^k, a_k as in A&S
// 9.7.1, with s = -1 for I and +1 for K.
func asym(nu, x, s float64) float64 {
	mu := 4 * nu * nu
	term, sum := 1.0, 1.0
	prev := math.Inf(1)
	for k := 1; k < 100; k++ {
		fk := float64(2*k - 1)
		term *= s * (mu - fk*fk) / (8 * float64(k) * x)
		a := math.Abs(term)
		if a >= prev {
			break
		}
		sum += term
		prev = a
		if a < 1e-17*math.Abs(sum) {
			break
		}
	}
	return sum
}

// I0e returns exp(-|x|) I0(x).
func I0e(x float64) float64 {
	x = math.Abs(x)
	if x <= seriesLimitI {
		i0, _ := iSeries(x)
		return i0 * math.Exp(-x)
	}
	return asym(0, x, -1) / math.Sqrt(2*math.Pi*x)
}

// I1e returns exp(-|x|) I1(x).
func I1e(x float64) float64 {
	ax := math.Abs(x)
	var v float64
	if ax <= seriesLimitI {
		_, i1 := iSeries(ax)
		v = i1 * math.Exp(-ax)
	} else {
		v = asym(1, ax, -1) / math.Sqrt(2*math.Pi*ax)
	}
	if x < 0 {
		return -v
	}
	return v
}

// I0 returns the modified Bessel function of the first kind of order 0.
func I0(x float64) float64 {
	ax := math.Abs(x)
	if ax <= seriesLimitI {
		i0, _ := iSeries(ax)
		return i0
	}
	return I0e(ax) * math.Exp(ax)
}

// I1 returns the modified Bessel function of the first kind of order 1.
func I1(x float64) float64 {
	ax := math.Abs(x)
	var v float64
	if ax <= seriesLimitI {
		_, v = iSeries(ax)
	} else {
		v = I1e(ax) * math.Exp(ax)
	}
	if x < 0 {
		return -v
	}
	return v
}

// kSeries returns K0(x), K1(x) for small x by A&S 9.6.13 and 9.6.11.
func kSeries(x float64) (k0, k1 float64) {
	i0, i1 := iSeries(x)
	l := math.Log(x / 2)
	q := x * x / 4
	// K0 = -(ln(x/2)+gamma) I0 + sum_{k>=1} q^k/(k!)^2 H_k
	// K1 = 1/x + ln(x/2) I1 - (x/4) sum_{k>=0} (psi(k+1)+psi(k+2)) q^k/(k!(k+1)!)
	t := 1.0 // q^k/(k!)^2
	u := 1.0 // q^k/(k!(k+1)!)
	h := 0.0 // H_k
	s0 := 0.0
	s1 := -2*eulerGamma + 1 // k = 0: psi(1)+psi(2) = -2 gamma + 1
	for k := 1; k < 100; k++ {
		fk := float64(k)
		t *= q / (fk * fk)
		u *= q / (fk * (fk + 1))
		h += 1 / fk
		s0 += t * h
		d1 := u * (-2*eulerGamma + 2*h + 1/(fk+1))
		s1 += d1
		if t*h < 1e-17*math.Abs(s0) && math.Abs(d1) < 1e-17*math.Abs(s1) {
			break
		}
	}
	k0 = -(l+eulerGamma)*i0 + s0
	k1 = 1/x + l*i1 - x/4*s1
	return k0, k1
}

// kTrap returns exp(x) K0(x), exp(x) K1(x) by the trapezoidal rule.
func kTrap(x float64) (k0e, k1e float64) {
	s0, s1 := 0.5, 0.5 // t = 0 carries half weight; cosh 0 = 1
	for k := 1; k < trapTerms; k++ {
		e := math.Exp(-x * trapCoshM1[k])
		s0 += e
		s1 += e * trapCosh[k]
		if e < 1e-18 {
			break
		}
	}
	return s0 * trapStep, s1 * trapStep
}

// K0e returns exp(x) K0(x) for x > 0.
func K0e(x float64) float64 {
	switch {
	case !(x > 0):
		return math.NaN()
	case x <= seriesLimitK:
		k0, _ := kSeries(x)
		return k0 * math.Exp(x)
	case x <= asymLimit:
		k0e, _ := kTrap(x)
		return k0e
	}
	return asym(0, x, 1) * math.Sqrt(math.Pi/(2*x))
}

// K1e returns exp(x) K1(x) for x > 0.
func K1e(x float64) float64 {
	switch {
	case !(x > 0):
		return math.NaN()
	case x <= seriesLimitK:
		_, k1 := kSeries(x)
		return k1 * math.Exp(x)
	case x <= asymLimit:
		_, k1e := kTrap(x)
		return k1e
	}
	return asym(1, x, 1) * math.Sqrt(math.Pi/(2*x))
}

// I01e returns I0e(x) and I1e(x) together for x >= 0, sharing one series
// or one asymptotic evaluation of exp.
func I01e(x float64) (i0e, i1e float64) {
	if x <= seriesLimitI {
		i0, i1 := iSeries(x)
		e := math.Exp(-x)
		return i0 * e, i1 * e
	}
	r := math.Sqrt(2 * math.Pi * x)
	return asym(0, x, -1) / r, asym(1, x, -1) / r
}

// K01e returns K0e(x) and K1e(x) together for x > 0, sharing one series,
// one trapezoidal sum or one asymptotic evaluation.
func K01e(x float64) (k0e, k1e float64) {
	switch {
	case !(x > 0):
		return math.NaN(), math.NaN()
	case x <= seriesLimitK:
		k0, k1 := kSeries(x)
		e := math.Exp(x)
		return k0 * e, k1 * e
	case x <= asymLimit:
		return kTrap(x)
	}
	r := math.Sqrt(math.Pi / (2 * x))
	return asym(0, x, 1) * r, asym(1, x, 1) * r
}

// K0 returns the modified Bessel function of the second kind of order 0
// for x > 0 (NaN otherwise; +Inf at 0 is not returned, 0 gives NaN).
func K0(x float64) float64 {
	if x > 0 && x <= seriesLimitK {
		k0, _ := kSeries(x)
		return k0
	}
	return K0e(x) * math.Exp(-x)
}

// K1 returns the modified Bessel function of the second kind of order 1
// for x > 0 (NaN otherwise).
func K1(x float64) float64 {
	if x > 0 && x <= seriesLimitK {
		_, k1 := kSeries(x)
		return k1
	}
	return K1e(x) * math.Exp(-x)
}
