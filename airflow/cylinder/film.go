package cylinder

import (
	"math"

	"finmarch/airflow"
)

// The march evaluates the developing-flow correlation once per segment at
// film properties that change little from one segment to the next (the
// film temperature moves by a few kelvin). filmPowers carries the powers of
// Pr and Re that ChannelNu needs and updates them by the binomial series
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
	reLam114 = math.Pow(airflow.ReLaminar, 1.14)
	reLam064 = math.Pow(airflow.ReLaminar, 0.64)
	// the Petukhov factor at the turbulent end of transition
	fTurb      = airflow.PetukhovFriction(airflow.ReTurbulent, nil)
	sqrtF8Turb = math.Sqrt(fTurb / 8)
)

// filmPowers are the powers of the film Prandtl and Reynolds numbers of the
// current segment.
type filmPowers struct {
	n                  int // segments since the last exact anchor; -1 before the first
	pr, mu             float64
	pr114, pr081, pr23 float64 // Pr^1.14, Pr^0.81, Pr^(2/3)
	re114, re064       float64 // Re^1.14, Re^0.64
	exact              bool    // anchor at every segment (tests)
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

// nuPowers is airflow.ChannelNu for the march's inner loop at a segment end with
// e1 = (x/Dh)^-1.14 and e2 = (x/Dh)^-0.64 and d23 = (Dh/x)^(2/3)
// precomputed, and the film powers of f: Stephan's correlation written as
//
//	Nu = 7.55 + 0.024 e1 (Re Pr)^1.14 / (1 + 0.0358 e2 Re^0.64 Pr^0.81),
//
// which is ParallelPlatesNu with x*^-1.14 = (x/Dh)^-1.14 (Re Pr)^1.14 and
// Pr^0.17 x*^-0.64 = (x/Dh)^-0.64 Re^0.64 Pr^0.81; Gnielinski's and the
// transition blend as in ChannelNu (TestNuPowers holds it to 1e-12 of
// ChannelNu). It checks no ranges, which the march does once per path.
func nuPowers(re float64, f *filmPowers, e1, e2, d23 float64) float64 {
	gn := func(re, f8, sf8 float64) float64 {
		return f8 * (re - 1000) * f.pr / (1 + 12.7*sf8*(f.pr23-1)) * (1 + d23)
	}
	switch {
	case re <= airflow.ReLaminar:
		return 7.55 + 0.024*e1*f.re114*f.pr114/(1+0.0358*e2*f.re064*f.pr081)
	case re >= airflow.ReTurbulent:
		fr := airflow.PetukhovFriction(re, nil)
		return gn(re, fr/8, math.Sqrt(fr/8))
	}
	nl := 7.55 + 0.024*e1*reLam114*f.pr114/(1+0.0358*e2*reLam064*f.pr081)
	nt := gn(airflow.ReTurbulent, fTurb/8, sqrtF8Turb)
	g := (re - airflow.ReLaminar) / (airflow.ReTurbulent - airflow.ReLaminar)
	return (1-g)*nl + g*nt
}
