package cylinder

import (
	"math"
	"testing"

	"finmarch/airflow"
)

// The march's Nusselt number from film powers (nuState) is ChannelNu's, to
// rounding, in every regime, with and without the gas heating factor,
// whether the powers are anchored exactly or carried by the binomial series
// over small changes of Pr and viscosity.
func TestNuPowers(t *testing.T) {
	for re := 30.0; re < 2e5; re *= 1.13 {
		for _, ld := range []float64{0.05, 0.7, 3, 25, 80} {
			for _, pr := range []float64{0.68, 0.71} {
				for _, k := range []float64{1, 0.8} {
					want, _ := airflow.ChannelNu(re, pr, ld, k, nil)
					sp := segPre{e1: math.Pow(ld, -1.14), e2: math.Pow(ld, -0.64), d23: math.Pow(1/ld, 2.0/3)}
					var f filmPowers
					f.anchor(pr, 1.8e-5, re)
					st := newNuState(re, k, &f)
					if got := st.at(&sp); rel(got, want) > 1e-12 {
						t.Fatalf("Re %g L/Dh %g Pr %g k %g: anchored %.15g, ChannelNu %.15g", re, ld, pr, k, got, want)
					}
					// arrive at (Re, Pr) by 12 series steps from 6% away
					f = filmPowers{n: -1}
					for j := 12; j >= 0; j-- {
						s := 1 + 0.005*float64(j)
						f.step(pr*s, 1.8e-5*s, re/s)
					}
					if f.n != 12 {
						t.Fatalf("expected 12 series steps, got %d", f.n)
					}
					st = newNuState(re, k, &f)
					if got := st.at(&sp); rel(got, want) > 1e-12 {
						t.Fatalf("Re %g L/Dh %g Pr %g k %g: stepped %.15g, ChannelNu %.15g", re, ld, pr, k, got, want)
					}
				}
			}
		}
	}
}

// The binomial coefficients and the series against math.Pow (closed form):
// within 2e-14 relative over |d| <= binomMax (the first omitted term,
// |C(-1.14, 7)| d^7, is 1.4e-14 at d = 0.01).
func TestBinom(t *testing.T) {
	for _, a := range []float64{1.14, 0.81, 2.0 / 3, -1.14, -0.64} {
		b := newBinom(a)
		for d := -binomMax; d <= binomMax; d += binomMax / 50 {
			if r := rel(b.at(d), math.Pow(1+d, a)); r > 2e-14 {
				t.Errorf("a %g d %g: series %.17g, pow %.17g", a, d, b.at(d), math.Pow(1+d, a))
			}
		}
	}
}

func rel(a, b float64) float64 { return math.Abs(a-b) / math.Abs(b) }
