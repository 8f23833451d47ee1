// Package roots finds a root of a function of one variable inside a
// bracket by Brent's method (R. P. Brent, Algorithms for Minimization
// without Derivatives, Prentice-Hall 1973, Ch. 4, procedure zero): inverse
// quadratic interpolation and secant steps, safeguarded by bisection, so it
// converges whenever the bracket holds a sign change and never leaves it.
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

// Expand widens [a, b] geometrically about its ends, up to n times, until
// f changes sign, keeping a >= lo. It returns the bracket found or
// ErrNoBracket.
func Expand(f func(float64) float64, a, b, lo float64, n int) (float64, float64, error) {
	fa, fb := f(a), f(b)
	for i := 0; i < n; i++ {
		if (fa > 0) != (fb > 0) {
			return a, b, nil
		}
		w := b - a
		if math.Abs(fa) < math.Abs(fb) && a-w >= lo {
			a -= w
			fa = f(a)
		} else {
			b += 1.6 * w
			fb = f(b)
		}
		if math.IsNaN(fa) || math.IsNaN(fb) {
			break
		}
	}
	if (fa > 0) != (fb > 0) {
		return a, b, nil
	}
	return a, b, fmt.Errorf("%w between %g and %g", ErrNoBracket, a, b)
}
