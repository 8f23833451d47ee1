package cylinder

import (
	"math"

	"finmarch/airflow"
)

// The march evaluates the developing-flow correlation at the two ends of
// every segment at the segment's bulk properties, which change little from
// one segment to the next (the bulk temperature moves by a few kelvin).
// filmPowers carries the powers of Pr and Re that ChannelNu needs and updates them by the binomial series
// (1 + d)^a = sum_j C(a, j) d^j over the segment's relative change d,
// instead of taking logarithms and exponentials afresh. The series is
// summed through d^6; with |d| <= binomMax = 0.01 the first term left out,
// |C(a, 7)| d^7, is below 2e-14 for the exponents used here. A larger
// change, or every anchorEvery segments, re-anchors the powers exactly, so
// rounding and truncation never accumulate over more than 16 steps
// (TestFilmPowers holds the march to 1e-11 of the exact evaluation).
const (
	binomMax    = 0.01
	binomTerms  = 6
	anchorEvery = 16
)

// binom holds C(a, j), j = 1..binomTerms, for one exponent a.
type binom [binomTerms]float64

func newBinom(a float64) binom {
	var b binom
	c := 1.0
	for j := 1; j <= binomTerms; j++ {
		c *= (a - float64(j-1)) / float64(j)
		b[j-1] = c
	}
	return b
}

// at returns (1 + d)^a for |d| <= binomMax.
func (b *binom) at(d float64) float64 {
	return 1 + d*(b[0]+d*(b[1]+d*(b[2]+d*(b[3]+d*(b[4]+d*b[5])))))
}

// The exponents of Stephan's correlation (x*^-1.14 and x*^-0.64 with
// x* = x/(Dh Re Pr), and Pr^0.17) and of Gnielinski's (Pr^(2/3)).
var (
	bPr114   = newBinom(1.14)
	bPr081   = newBinom(0.81)
	bPr23    = newBinom(2.0 / 3)
	bMu114   = newBinom(-1.14) // Re = reC/mu, so Re^a = (reC/mu)^a
	bMu064   = newBinom(-0.64)
	bTb045   = newBinom(0.45) // the gas heating factor (T_b/T_w)^0.45
	reLam114 = math.Pow(airflow.ReLaminar, 1.14)
	reLam064 = math.Pow(airflow.ReLaminar, 0.64)
	// the Konakov factor at the turbulent end of transition
	xiTurb     = airflow.KonakovFriction(airflow.ReTurbulent, nil)
	sqrtXi8Tur = math.Sqrt(xiTurb / 8)
)

// filmPowers are the powers of the film Prandtl and Reynolds numbers of the
// current segment.
type filmPowers struct {
	n                  int // segments since the last exact anchor; -1 before the first
	pr, mu             float64
	pr114, pr081, pr23 float64 // Pr^1.14, Pr^0.81, Pr^(2/3)
	re114, re064       float64 // Re^1.14, Re^0.64
	exact              bool    // anchor at every segment (tests)
	kh, khTb           float64 // the gas heating factor and the bulk temperature it holds for (0: none yet)
}

// heating returns the gas heating factor (T_b/T_w)^0.45 at bulk
// temperature tb on a wall at tw (fixed through a march), carried like the
// powers by the binomial series from the previous segment's, and
// re-anchored by airflow.GasHeatingFactor with them.
func (f *filmPowers) heating(tb, tw float64) float64 {
	if !(tw > tb) {
		f.khTb = 0
		return 1
	}
	if d := tb/f.khTb - 1; f.khTb > 0 && f.n > 0 && math.Abs(d) <= binomMax {
		f.kh *= bTb045.at(d)
	} else {
		f.kh = airflow.GasHeatingFactor(tb, tw, nil)
	}
	f.khTb = tb
	return f.kh
}

func (f *filmPowers) anchor(pr, mu, re float64) {
	lp, lr := math.Log(pr), math.Log(re)
	f.pr114, f.pr081, f.pr23 = math.Exp(1.14*lp), math.Exp(0.81*lp), math.Exp(2.0/3*lp)
	f.re114, f.re064 = math.Exp(1.14*lr), math.Exp(0.64*lr)
	f.pr, f.mu, f.n = pr, mu, 0
}

// step moves the powers to the segment's Pr, viscosity mu and Re = reC/mu.
func (f *filmPowers) step(pr, mu, re float64) {
	if f.exact || f.n < 0 || f.n >= anchorEvery {
		f.anchor(pr, mu, re)
		return
	}
	dp, dm := pr/f.pr-1, mu/f.mu-1
	if math.Abs(dp) > binomMax || math.Abs(dm) > binomMax {
		f.anchor(pr, mu, re)
		return
	}
	f.pr114 *= bPr114.at(dp)
	f.pr081 *= bPr081.at(dp)
	f.pr23 *= bPr23.at(dp)
	f.re114 *= bMu114.at(dm)
	f.re064 *= bMu064.at(dm)
	f.pr, f.mu = pr, mu
	f.n++
}

// nuState is airflow.ChannelNu at one segment's Reynolds and Prandtl
// numbers and gas heating factor, with everything that does not depend on
// the position along the path evaluated once, so that the segment's two
// ends cost a few multiplications each (TestNuPowers holds it to 1e-12 of
// ChannelNu). Stephan's correlation is written
//
//	Nu = 7.55 + 0.024 e1 (Re Pr)^1.14 / (1 + 0.0358 e2 Re^0.64 Pr^0.81),
//
// which is ParallelPlatesNu with x*^-1.14 = (x/Dh)^-1.14 (Re Pr)^1.14 and
// Pr^0.17 x*^-0.64 = (x/Dh)^-0.64 Re^0.64 Pr^0.81, and Gnielinski's as a
// core times (1 + (Dh/x)^(2/3)). It checks no ranges, which the march does
// once per path.
type nuState struct {
	lamA, lamB float64 // Stephan's 0.024 (Re Pr)^1.14 and 0.0358 Re^0.64 Pr^0.81 (at 2300 in transition)
	turb       float64 // Gnielinski's core times the heating factor (at 1e4 in transition)
	g          float64 // the blend's weight of the turbulent end: 0 laminar, 1 turbulent
}

func newNuState(re, k float64, f *filmPowers) nuState {
	core := func(re, f8, sf8 float64) float64 {
		return k * f8 * re * f.pr / (1 + 12.7*sf8*(f.pr23-1))
	}
	switch {
	case re <= airflow.ReLaminar:
		return nuState{lamA: 0.024 * f.re114 * f.pr114, lamB: 0.0358 * f.re064 * f.pr081}
	case re >= airflow.ReTurbulent:
		xi := airflow.KonakovFriction(re, nil)
		return nuState{turb: core(re, xi/8, math.Sqrt(xi/8)), g: 1}
	}
	return nuState{lamA: 0.024 * reLam114 * f.pr114, lamB: 0.0358 * reLam064 * f.pr081,
		turb: core(airflow.ReTurbulent, xiTurb/8, sqrtXi8Tur),
		g:    (re - airflow.ReLaminar) / (airflow.ReTurbulent - airflow.ReLaminar)}
}

// at returns the mean Nusselt number over the first x of the path, with
// e1 = (x/Dh)^-1.14, e2 = (x/Dh)^-0.64 and d23 = (Dh/x)^(2/3) of x.
func (s *nuState) at(sp *segPre) float64 {
	switch s.g {
	case 0:
		return 7.55 + s.lamA*sp.e1/(1+s.lamB*sp.e2)
	case 1:
		return s.turb * (1 + sp.d23)
	}
	return (1-s.g)*(7.55+s.lamA*sp.e1/(1+s.lamB*sp.e2)) + s.g*s.turb*(1+sp.d23)
}
