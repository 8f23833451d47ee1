package roots

import (
	"errors"
	"fmt"
	"math"
)

// ErrNoBracket means f(a) and f(b) have the same sign.
var ErrNoBracket = errors.New("root not bracketed")

// ErrNotConverged means the iteration limit was reached.
var ErrNotConverged = errors.New("root finder did not converge")

// Brent returns x in [a, b] with f(x) = 0 to within the absolute tolerance
// tol (plus 4 machine epsilons of |x|), given f(a) and f(b) of opposite
// sign. It evaluates f at most maxIter+2 times. A NaN from f is an error.
func Brent(f func(float64) float64, a, b, tol float64, maxIter int) (float64, error) {
	fa, fb := f(a), f(b)
	if math.IsNaN(fa) || math.IsNaN(fb) {
		return math.NaN(), fmt.Errorf("roots: function is NaN at the bracket ends (%g, %g)", a, b)
	}
	if fa == 0 {
		return a, nil
	}
	if fb == 0 {
		return b, nil
	}
	if (fa > 0) == (fb > 0) {
		return math.NaN(), fmt.Errorf("%w: f(%g) = %g and f(%g) = %g", ErrNoBracket, a, fa, b, fb)
	}
	c, fc := a, fa
	d := b - a
	e := d
	const eps = 2.220446049250313e-16
	for i := 0; i < maxIter; i++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*eps*math.Abs(b) + 0.5*tol
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p = 2 * xm * s
				q = 1 - s
			} else {
				q = fa / fc
				r := fb / fc
				p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			}
			p = math.Abs(p)
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = xm
				e = d
			}
		} else {
			d = xm
			e = d
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return math.NaN(), fmt.Errorf("roots: function is NaN at x = %g", b)
		}
	}
	return b, fmt.Errorf("%w after %d iterations (last x = %g)", ErrNotConverged, maxIter, b)
}

// Secant finds a root of f starting from the two guesses x0 and x1 inside
// [lo, hi], by secant steps (the method suits a smooth, nearly linear f,
// such as a heat balance against wall temperature, where it converges in a
// few evaluations), safeguarded as follows: every step is kept inside
// [lo, hi]; once two evaluated points bracket the root, a step that leaves
// the bracket, or four steps that do not halve it, hand the bracket to
// Brent. It returns ErrNoBracket wrapped when the secant leaves
// [lo, hi] without finding a sign change there (f(lo) and f(hi) are then
// evaluated to tell). tol is the absolute tolerance in x.
func Secant(f func(float64) float64, x0, x1, lo, hi, tol float64, maxIter int) (float64, error) {
	clamp := func(x float64) float64 { return math.Min(hi, math.Max(lo, x)) }
	x0, x1 = clamp(x0), clamp(x1)
	f0, f1 := f(x0), f(x1)
	if math.IsNaN(f0) || math.IsNaN(f1) {
		return math.NaN(), fmt.Errorf("roots: function is NaN at the starting points (%g, %g)", x0, x1)
	}
	// bracket bookkeeping: once two evaluated points differ in sign they
	// form the bracket [a, b]; later points inside it replace the end of
	// the same sign
	type pt struct{ x, f float64 }
	var seenBuf [8]pt
	seen := seenBuf[:0]
	haveBr := false
	var a, b pt
	note := func(x, fx float64) {
		p := pt{x, fx}
		if haveBr {
			if x > math.Min(a.x, b.x) && x < math.Max(a.x, b.x) {
				if (fx > 0) == (a.f > 0) {
					a = p
				} else {
					b = p
				}
			}
			return
		}
		best := -1
		for i, q := range seen {
			if (q.f > 0) != (fx > 0) && (best < 0 || math.Abs(q.x-x) < math.Abs(seen[best].x-x)) {
				best = i
			}
		}
		if best >= 0 {
			haveBr, a, b = true, seen[best], p
		}
		seen = append(seen, p)
	}
	bracketed := func() bool { return haveBr }
	blo := func() float64 { return math.Min(a.x, b.x) }
	bhi := func() float64 { return math.Max(a.x, b.x) }
	note(x0, f0)
	note(x1, f1)
	if f1 == 0 {
		return x1, nil
	}
	if f0 == 0 {
		return x0, nil
	}
	lastW, stall := math.Inf(1), 0
	for i := 0; i < maxIter; i++ {
		if bracketed() {
			if w := bhi() - blo(); w <= 0.5*lastW {
				lastW, stall = w, 0
			} else if stall++; stall > 3 {
				return Brent(f, blo(), bhi(), tol, maxIter)
			}
		}
		if f1 == f0 {
			break
		}
		x2 := x1 - f1*(x1-x0)/(f1-f0)
		if math.IsNaN(x2) {
			break
		}
		if bracketed() && (x2 <= blo() || x2 >= bhi()) {
			return Brent(f, blo(), bhi(), tol, maxIter)
		}
		x2 = clamp(x2)
		if x2 == x1 && (x1 == lo || x1 == hi) {
			break // pinned at an end of the range
		}
		f2 := f(x2)
		if math.IsNaN(f2) {
			return math.NaN(), fmt.Errorf("roots: function is NaN at x = %g", x2)
		}
		note(x2, f2)
		if f2 == 0 || math.Abs(x2-x1) <= tol {
			return x2, nil
		}
		x0, f0, x1, f1 = x1, f1, x2, f2
	}
	if bracketed() {
		return Brent(f, blo(), bhi(), tol, maxIter)
	}
	flo2, fhi2 := f(lo), f(hi)
	if (flo2 > 0) != (fhi2 > 0) {
		return Brent(f, lo, hi, tol, maxIter)
	}
	return math.NaN(), fmt.Errorf("%w in [%g, %g]: f = %g and %g", ErrNoBracket, lo, hi, flo2, fhi2)
}
