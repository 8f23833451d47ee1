package roots

import (
	"errors"
	"math"
	"testing"
)

// Classical test equations with known roots (closed form or published to
// 16 digits):
//   - x^3 - 2x - 5 = 0, Wallis's equation; root 2.0945514815423265
//     (Newton's own example; value in Press et al., Numerical Recipes,
//     3rd ed., 2007, Sec. 9.4, from memory);
//   - cos x = x, root 0.7390851332151607 (the Dottie number, from memory);
//   - x^2 - 2 = 0, root sqrt(2), closed form;
//   - exp(x) - 10 = 0, root ln 10, closed form;
//   - a function with a flat region and a steep root, (x - 1/3)^3 * 1e6,
//     root 1/3, where pure secant steps stall and bisection must take over.
func TestBrentKnownRoots(t *testing.T) {
	cases := []struct {
		name string
		f    func(float64) float64
		a, b float64
		root float64
	}{
		{"Wallis", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, 2.0945514815423265},
		{"Dottie", func(x float64) float64 { return math.Cos(x) - x }, 0, 1, 0.7390851332151607},
		{"sqrt2", func(x float64) float64 { return x*x - 2 }, 0, 2, math.Sqrt2},
		{"ln10", func(x float64) float64 { return math.Exp(x) - 10 }, -5, 5, math.Ln10},
		{"cubic flat", func(x float64) float64 { return 1e6 * math.Pow(x-1.0/3, 3) }, -1, 1, 1.0 / 3},
	}
	for _, c := range cases {
		x, err := Brent(c.f, c.a, c.b, 1e-14, 200)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		tol := 1e-13
		if c.name == "cubic flat" {
			tol = 1e-5 // a triple root is only located to the cube root of the tolerance in f
		}
		if math.Abs(x-c.root) > tol {
			t.Errorf("%s: got %.17g, want %.17g", c.name, x, c.root)
		}
	}
}

func TestBrentErrors(t *testing.T) {
	if _, err := Brent(func(x float64) float64 { return x*x + 1 }, -1, 1, 1e-12, 100); !errors.Is(err, ErrNoBracket) {
		t.Errorf("want ErrNoBracket, got %v", err)
	}
	if _, err := Brent(func(x float64) float64 { return math.NaN() }, -1, 1, 1e-12, 100); err == nil {
		t.Error("NaN accepted")
	}
	if _, err := Brent(func(x float64) float64 { return math.Tanh(50 * (x - 0.123456789)) }, 0, 1, 1e-300, 2); !errors.Is(err, ErrNotConverged) {
		t.Errorf("want ErrNotConverged, got %v", err)
	}
	if x, err := Brent(func(x float64) float64 { return x }, 0, 1, 1e-12, 10); err != nil || x != 0 {
		t.Errorf("root at the bracket end: %g %v", x, err)
	}
}

// Brent never evaluates outside the bracket (property over many brackets).
func TestBrentStaysInBracket(t *testing.T) {
	for k := 1; k < 200; k++ {
		r := float64(k) / 200
		lo, hi := 0.0, 1.0
		f := func(x float64) float64 {
			if x < lo || x > hi {
				t.Fatalf("evaluated at %g outside [%g, %g]", x, lo, hi)
			}
			return math.Tanh(20*(x-r)) + 0.01*(x-r)
		}
		x, err := Brent(f, lo, hi, 1e-12, 200)
		if err != nil || math.Abs(x-r) > 1e-10 {
			t.Fatalf("root %g: got %g, %v", r, x, err)
		}
	}
}

func BenchmarkBrent(b *testing.B) {
	f := func(x float64) float64 { return math.Cos(x) - x }
	for i := 0; i < b.N; i++ {
		_, _ = Brent(f, 0, 1, 1e-12, 100)
	}
}

// Secant on the classical equations above, from poor starting points, and
// on a nearly linear heat-balance shape where it should take few steps.
func TestSecant(t *testing.T) {
	cases := []struct {
		name     string
		f        func(float64) float64
		x0, x1   float64
		lo, hi   float64
		root     float64
		maxEvals int
	}{
		{"Wallis", func(x float64) float64 { return x*x*x - 2*x - 5 }, 1, 1.5, 0, 10, 2.0945514815423265, 40},
		{"Dottie", func(x float64) float64 { return math.Cos(x) - x }, 0, 0.1, -1, 2, 0.7390851332151607, 20},
		{"ln10", func(x float64) float64 { return math.Exp(x) - 10 }, -5, -4, -5, 5, math.Ln10, 60},
		{"near linear", func(x float64) float64 { return 15*(x-308) + 1e-9*math.Pow(x, 4) - 2700 }, 408, 500, 308, 773, 0, 8},
		{"steep tanh", func(x float64) float64 { return math.Tanh(30 * (x - 0.3)) }, 0.9, 1.0, 0, 1, 0.3, 80},
	}
	for _, c := range cases {
		evals := 0
		f := func(x float64) float64 { evals++; return c.f(x) }
		x, err := Secant(f, c.x0, c.x1, c.lo, c.hi, 1e-12, 100)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if c.root != 0 && math.Abs(x-c.root) > 1e-10 {
			t.Errorf("%s: got %.15g, want %.15g", c.name, x, c.root)
		}
		if math.Abs(c.f(x)) > 1e-6 {
			t.Errorf("%s: residual %g at %g", c.name, c.f(x), x)
		}
		if evals > c.maxEvals {
			t.Errorf("%s: %d evaluations, want at most %d", c.name, evals, c.maxEvals)
		}
	}
	if _, err := Secant(func(x float64) float64 { return x*x + 1 }, 0, 1, -2, 2, 1e-12, 50); !errors.Is(err, ErrNoBracket) {
		t.Errorf("no root: %v", err)
	}
}
