package transient

import (
	"math"
	"testing"
)

// The Dormand–Prince tableau is consistent: each row of A sums to its
// node c, and both weight rows sum to one (Hairer, Nørsett and Wanner
// 1993, II.1, the conditions for any order).
func TestTableau(t *testing.T) {
	for s := 1; s < 7; s++ {
		var sum float64
		for _, a := range dpA[s] {
			sum += a
		}
		if math.Abs(sum-dpC[s]) > 1e-15 {
			t.Errorf("row %d sums to %.17g, c = %.17g", s, sum, dpC[s])
		}
	}
	var b5, b4 float64
	for j := range dpB5 {
		b5, b4 = b5+dpB5[j], b4+dpB4[j]
	}
	if math.Abs(b5-1) > 1e-15 || math.Abs(b4-1) > 1e-15 {
		t.Errorf("weights sum to %.17g and %.17g", b5, b4)
	}
	// the quadrature conditions sum b_i c_i^(q-1) = 1/q: q up to 5 for the
	// fifth-order weights, up to 4 for the fourth-order ones
	for q := 1; q <= 5; q++ {
		var s5, s4 float64
		for j := range dpB5 {
			s5 += dpB5[j] * math.Pow(dpC[j], float64(q-1))
			s4 += dpB4[j] * math.Pow(dpC[j], float64(q-1))
		}
		if math.Abs(s5-1/float64(q)) > 1e-14 {
			t.Errorf("fifth-order weights: sum b c^%d = %.17g, want 1/%d", q-1, s5, q)
		}
		if q <= 4 && math.Abs(s4-1/float64(q)) > 1e-14 {
			t.Errorf("fourth-order weights: sum b c^%d = %.17g, want 1/%d", q-1, s4, q)
		}
	}
}

// Against closed forms: exponential decay y' = -y/tau, a linear system of
// two coupled masses (eigen-solution by hand), and the oscillator
// y” = -y over several periods; each within the tolerance asked, and the
// error falls as the tolerance is tightened (fifth order: about 10^(4/5)
// per decade of tolerance at a fixed problem, at least 10x over two
// decades here).
func TestIntegrateClosedForms(t *testing.T) {
	tau := 120.0
	decay := func(_ float64, y, dy []float64) error { dy[0] = -y[0] / tau; return nil }
	// two masses exchanging heat through g and losing it through a to
	// ambient 0: C1 y1' = -a y1 - g (y1 - y2), C2 y2' = -g (y2 - y1)
	c1, c2, a, g := 1000.0, 1000.0, 5.0, 5.0
	pair := func(_ float64, y, dy []float64) error {
		dy[0] = (-a*y[0] - g*(y[0]-y[1])) / c1
		dy[1] = -g * (y[1] - y[0]) / c2
		return nil
	}
	// with c1 = c2 = c the matrix [[-(a+g), g], [g, -g]]/c has eigenvalues
	// l = (-(a+2g) +- sqrt(a^2+4g^2)) / (2c)
	r := math.Sqrt(a*a + 4*g*g)
	l1, l2 := (-(a+2*g)+r)/(2*c1), (-(a+2*g)-r)/(2*c1)
	// eigenvectors (v1, 1) with v1 = (l c + g)/g
	v1, v2 := (l1*c1+g)/g, (l2*c1+g)/g
	// y(0) = (100, 0) = p (v1, 1) + q (v2, 1)
	p := 100 / (v1 - v2)
	q := -p
	osc := func(_ float64, y, dy []float64) error { dy[0], dy[1] = y[1], -y[0]; return nil }
	type cas struct {
		name  string
		f     Func
		y0    []float64
		t1    float64
		exact []float64
	}
	cases := []cas{
		{"decay", decay, []float64{200}, 600, []float64{200 * math.Exp(-600/tau)}},
		{"two masses", pair, []float64{100, 0}, 900, []float64{p*v1*math.Exp(l1*900) + q*v2*math.Exp(l2*900), p*math.Exp(l1*900) + q*math.Exp(l2*900)}},
		{"oscillator", osc, []float64{1, 0}, 10 * math.Pi, []float64{math.Cos(10 * math.Pi), -math.Sin(10 * math.Pi)}},
	}
	for _, c := range cases {
		var errs []float64
		for _, rel := range []float64{1e-6, 1e-8} {
			y := append([]float64(nil), c.y0...)
			n, _, err := Integrate(c.f, 0, c.t1, y, 0, Tolerances{Abs: rel, Rel: rel}, nil)
			if err != nil {
				t.Fatalf("%s: %v", c.name, err)
			}
			var e float64
			for i := range y {
				e = math.Max(e, math.Abs(y[i]-c.exact[i]))
			}
			errs = append(errs, e)
			scale := math.Abs(c.y0[0])
			if e > 100*rel*scale {
				t.Errorf("%s at tolerance %g: error %.3g after %d evaluations", c.name, rel, e, n)
			}
		}
		if !(errs[1] < errs[0]/10) {
			t.Errorf("%s: error %.3g at 1e-6 and %.3g at 1e-8: not converging", c.name, errs[0], errs[1])
		}
	}
}

// Dense output: the cubic Hermite interpolant between accepted steps
// follows the exact decay to third order, and the steps tile the span.
func TestDenseOutput(t *testing.T) {
	tau := 60.0
	f := func(_ float64, y, dy []float64) error { dy[0] = -y[0] / tau; return nil }
	y := []float64{1}
	prev, worst := 0.0, 0.0
	out := make([]float64, 1)
	_, _, err := Integrate(f, 0, 300, y, 0, Tolerances{Abs: 1e-10, Rel: 1e-10}, func(s *Step) error {
		if s.T0 != prev {
			t.Errorf("step from %g after a step to %g", s.T0, prev)
		}
		prev = s.T1
		for k := 1; k < 4; k++ {
			tt := s.T0 + float64(k)/4*(s.T1-s.T0)
			s.At(tt, out)
			worst = math.Max(worst, math.Abs(out[0]-math.Exp(-tt/tau)))
		}
		return nil
	})
	if err != nil || prev != 300 {
		t.Fatalf("%v, ended at %g", err, prev)
	}
	if worst > 1e-6 {
		t.Errorf("interpolation error %.3g", worst)
	}
}
