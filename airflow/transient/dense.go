package transient

import (
	"fmt"
	"math"
	"sort"

	"finmarch/airflow/roots"
)

// Dense output and event location on it.
//
// Between the ends of an accepted step the ride is the cubic Hermite
// polynomial through both ends' values and derivatives (Step.At; the
// continuous extension of a one-step method, E. Hairer, S. P. Nørsett and
// G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer
// 1993, Sec. II.6, "Dense output"; event location, the same section, "the
// root of g(t, y(t)) on the dense output"). A ride's summary is read from
// these polynomials, step by step, not from the printed samples, so the
// print interval does not change it:
//
//   - a maximum of a wall is the largest of the step's end values and of
//     the cubic at its interior stationary points (the real roots in the
//     step of the derivative, a quadratic);
//   - a crossing of a level is the root of T(t) - level on a piece of the
//     step between those points (the cubic is monotone there, so a sign
//     change holds exactly one root), by Brent's method (airflow/roots).

// eventTol is the absolute tolerance of an event's time, s.
const eventTol = 1e-7

// hermite is the cubic Hermite basis at theta in [0, 1].
func hermite(th float64) (h00, h10, h01, h11 float64) {
	return (1 + 2*th) * (1 - th) * (1 - th), th * (1 - th) * (1 - th), th * th * (3 - 2*th), th * th * (th - 1)
}

// value is component i of the step's interpolant at t (as At).
func (s *Step) value(i int, t float64) float64 {
	h := s.T1 - s.T0
	h00, h10, h01, h11 := hermite((t - s.T0) / h)
	return h00*s.Y0[i] + h*h10*s.DY0[i] + h01*s.Y1[i] + h*h11*s.DY1[i]
}

// slope is the derivative in time of component i of the interpolant at t.
func (s *Step) slope(i int, t float64) float64 {
	h := s.T1 - s.T0
	th := (t - s.T0) / h
	// d/dtheta of the basis, divided by h for d/dt
	d00, d10, d01, d11 := 6*th*(th-1), (1-th)*(1-3*th), 6*th*(1-th), th*(3*th-2)
	return (d00*s.Y0[i]+d01*s.Y1[i])/h + d10*s.DY0[i] + d11*s.DY1[i]
}

// stationary returns the times strictly inside the step where component
// i's interpolant has zero slope, ascending: the real roots in (0, 1) of
// the quadratic A θ² + B θ + C, the interpolant's derivative in
// θ = (t - T0)/h, with A = 6(y0 - y1) + 3h(y0' + y1'),
// B = 6(y1 - y0) - h(4y0' + 2y1'), C = h y0' (the roots by the
// cancellation-free form of the quadratic formula).
func (s *Step) stationary(i int) []float64 {
	h := s.T1 - s.T0
	y0, y1, d0, d1 := s.Y0[i], s.Y1[i], h*s.DY0[i], h*s.DY1[i]
	a, b, c := 6*(y0-y1)+3*(d0+d1), 6*(y1-y0)-4*d0-2*d1, d0
	var th []float64
	switch {
	case a == 0 && b == 0:
	case a == 0:
		th = append(th, -c/b)
	default:
		disc := b*b - 4*a*c
		if disc < 0 {
			break
		}
		q := -0.5 * (b + math.Copysign(math.Sqrt(disc), b))
		th = append(th, q/a)
		if q != 0 {
			th = append(th, c/q)
		}
	}
	var out []float64
	for _, x := range th {
		if x > 0 && x < 1 {
			out = append(out, s.T0+x*h)
		}
	}
	sort.Float64s(out)
	return out
}

// Crossing is an event: a component of the ride passing a level.
type Crossing struct {
	Time float64 // s
	Up   bool    // passing upward (from at or below the level to above it)
}

// crossings returns where component i's interpolant passes level on the
// step, ascending: one root by Brent's method on each monotone piece
// whose ends lie on either side (above: strictly over the level).
func (s *Step) crossings(i int, level float64) ([]Crossing, error) {
	g := func(t float64) float64 { return s.value(i, t) - level }
	knots := append(append([]float64{s.T0}, s.stationary(i)...), s.T1)
	var out []Crossing
	for k := 1; k < len(knots); k++ {
		a, b := knots[k-1], knots[k]
		ga, gb := g(a), g(b)
		if (ga > 0) == (gb > 0) {
			continue
		}
		t, err := roots.Brent(g, a, b, eventTol, 200)
		if err != nil {
			return nil, fmt.Errorf("crossing of %g on the step %g to %g s: %w", level, s.T0, s.T1, err)
		}
		out = append(out, Crossing{Time: t, Up: gb > 0})
	}
	return out, nil
}

// sub is the step restricted to [a, b] within it: the same cubic, given
// by its values and slopes at a and b (a cubic is fixed by both), so the
// restriction is exact to rounding.
func (s *Step) sub(a, b float64) Step {
	n := len(s.Y0)
	buf := make([]float64, 4*n)
	r := Step{T0: a, T1: b, Y0: buf[:n:n], Y1: buf[n : 2*n : 2*n], DY0: buf[2*n : 3*n : 3*n], DY1: buf[3*n:]}
	for i := 0; i < n; i++ {
		r.Y0[i], r.Y1[i] = s.value(i, a), s.value(i, b)
		r.DY0[i], r.DY1[i] = s.slope(i, a), s.slope(i, b)
	}
	return r
}

// clone is a copy of the step that does not share the integrator's
// buffers.
func (s *Step) clone() Step {
	n := len(s.Y0)
	buf := make([]float64, 4*n)
	r := Step{T0: s.T0, T1: s.T1, Y0: buf[:n:n], Y1: buf[n : 2*n : 2*n], DY0: buf[2*n : 3*n : 3*n], DY1: buf[3*n:]}
	copy(r.Y0, s.Y0)
	copy(r.Y1, s.Y1)
	copy(r.DY0, s.DY0)
	copy(r.DY1, s.DY1)
	return r
}

// At writes the dense output of the trace at t (s, from 0 to End) into y
// (the walls, K, and the heat put in and rejected so far, J: four
// components) and reports whether t lies on the trace.
func (tr *Trace) At(t float64, y []float64) bool {
	n := len(tr.Steps)
	if n == 0 || !(t >= tr.Steps[0].T0 && t <= tr.Steps[n-1].T1) {
		return false
	}
	k := sort.Search(n, func(j int) bool { return tr.Steps[j].T1 >= t })
	if k == n {
		k = n - 1
	}
	tr.Steps[k].At(t, y)
	return true
}
