package bessel

import "math"

const (
	seriesLimitI = 25.0
	seriesLimitK = 2.0
	eulerGamma   = 0.57721566490153286060651209008240243
)

// iSeries returns I0(x), I1(x) by A&S 9.6.10. The term ratios 1/k^2 and
// 1/(k(k+1)) come from tables, so the loop multiplies only.
func iSeries(x float64) (i0, i1 float64) {
	q := x * x / 4
	t0, t1 := 1.0, x/2
	i0, i1 = t0, t1
	for k := 1; k < iTerms; k++ {
		t0 *= q * invSq[k]
		t1 *= q * invPron[k]
		i0 += t0
		i1 += t1
		if t0 < 1e-17*i0 && t1 < 1e-17*i1 {
			break
		}
	}
	return i0, i1
}

// iTerms bounds the series; at x = seriesLimitI it stops near k = 60.
const iTerms = 200

// invSq[k] = 1/k^2 and invPron[k] = 1/(k(k+1)), the ratios of successive
// terms of the I0 and I1 series over (x/2)^2; harmonic[k] = H_k = sum 1/j,
// j = 1..k, and psiPair[k] = psi(k+1) + psi(k+2) = -2 gamma + 2 H_k +
// 1/(k+1), the weights of the K0 and K1 series.
var invSq, invPron, harmonic, psiPair [iTerms]float64

func init() {
	h := 0.0
	for k := 1; k < iTerms; k++ {
		fk := float64(k)
		invSq[k] = 1 / (fk * fk)
		invPron[k] = 1 / (fk * (fk + 1))
		h += 1 / fk
		harmonic[k] = h
		psiPair[k] = -2*eulerGamma + 2*h + 1/(fk+1)
	}
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
	return kSeriesWith(x, i0, i1)
}

// kSeriesWith is kSeries given I0(x) and I1(x).
func kSeriesWith(x, i0, i1 float64) (k0, k1 float64) {
	l := math.Log(x / 2)
	q := x * x / 4
	// K0 = -(ln(x/2)+gamma) I0 + sum_{k>=1} q^k/(k!)^2 H_k
	// K1 = 1/x + ln(x/2) I1 - (x/4) sum_{k>=0} (psi(k+1)+psi(k+2)) q^k/(k!(k+1)!)
	t := 1.0 // q^k/(k!)^2
	u := 1.0 // q^k/(k!(k+1)!)
	s0 := 0.0
	s1 := -2*eulerGamma + 1 // k = 0: psi(1)+psi(2) = -2 gamma + 1
	for k := 1; k < 100; k++ {
		t *= q * invSq[k]
		u *= q * invPron[k]
		h := harmonic[k]
		s0 += t * h
		d1 := u * psiPair[k]
		s1 += d1
		if t*h < 1e-17*math.Abs(s0) && math.Abs(d1) < 1e-17*math.Abs(s1) {
			break
		}
	}
	k0 = -(l+eulerGamma)*i0 + s0
	k1 = 1/x + l*i1 - x/4*s1
	return k0, k1
}

// kCheb returns exp(x) K0(x), exp(x) K1(x) for x >= 2 from the Chebyshev
// series of kcheb.go, both by one Clenshaw pass over t = 4/x - 1.
func kCheb(x float64) (k0e, k1e float64) {
	t := 4/x - 1
	t2 := 2 * t
	var a1, a2, b1, b2 float64
	for j := len(kCheb0) - 1; j >= 1; j-- {
		a1, a2 = t2*a1-a2+kCheb0[j], a1
		b1, b2 = t2*b1-b2+kCheb1[j], b1
	}
	r := 1 / math.Sqrt(x)
	return (t*a1 - a2 + kCheb0[0]/2) * r, (t*b1 - b2 + kCheb1[0]/2) * r
}

// K0e returns exp(x) K0(x) for x > 0.
func K0e(x float64) float64 {
	switch {
	case !(x > 0):
		return math.NaN()
	case x <= seriesLimitK:
		k0, _ := kSeries(x)
		return k0 * math.Exp(x)
	}
	k0e, _ := kCheb(x)
	return k0e
}

// K1e returns exp(x) K1(x) for x > 0.
func K1e(x float64) float64 {
	switch {
	case !(x > 0):
		return math.NaN()
	case x <= seriesLimitK:
		_, k1 := kSeries(x)
		return k1 * math.Exp(x)
	}
	_, k1e := kCheb(x)
	return k1e
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

// K01e returns K0e(x) and K1e(x) together for x > 0, sharing one series
// or one Chebyshev pass.
func K01e(x float64) (k0e, k1e float64) {
	switch {
	case !(x > 0):
		return math.NaN(), math.NaN()
	case x <= seriesLimitK:
		k0, k1 := kSeries(x)
		e := math.Exp(x)
		return k0 * e, k1 * e
	}
	return kCheb(x)
}

// IK01e returns I01e(x) and K01e(x) for x > 0, sharing the ascending
// series between them where x <= 2.
func IK01e(x float64) (i0e, i1e, k0e, k1e float64) {
	if x > 0 && x <= seriesLimitK {
		i0, i1 := iSeries(x)
		k0, k1 := kSeriesWith(x, i0, i1)
		e := math.Exp(x)
		return i0 / e, i1 / e, k0 * e, k1 * e
	}
	i0e, i1e = I01e(x)
	k0e, k1e = K01e(x)
	return
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
