package optimise

import (
	"math"

	"finmarch/fins"
)

// The search does not move a fin set's five variables directly. Where the
// casting limits and the count that fits tie them together, most moves of
// one variable alone break a limit or change nothing: a finer pitch with
// the same count only narrows the gap, so along the pitch the temperature
// is a saw tooth with a local optimum wherever one more fin fits, and the
// tallest fin a process casts moves with pitch, root and tip. The search
// instead moves
//
//	pitch p                    (as it is)
//	height depth d             the height below the tallest the process
//	                           casts at that pitch, root and tip
//	root thickness r           (as it is)
//	tip thickness t            (as it is)
//	fins short m               the count below as many as fit at that
//	                           pitch and root (fins.Fitting), within the
//	                           count's bounds
//
// so that every move keeps the length filled with fins and the casting
// limits kept wherever it can, and the saw teeth and the limits' ridges
// become the lower bounds of m and d. The map onto the fin variables
// reaches every design within the bounds that keeps the casting limits (d
// and m range over the whole height and count spans), so the optimum is
// the same design the fin variables would have; points it maps outside
// the bounds or past a limit are refused (+Inf).

// setMap maps one varied set's search coordinates to its fin variables.
type setMap struct {
	base fins.Set     // the set as drawn: style, root diameter, length
	vars []Var        // the bounds as searched (on the step)
	proc fins.Process // the casting limits
	step float64      // m, 0 for continuous lengths
}

// in turns a length into a coordinate: whole steps when on a step.
func (m setMap) in(x float64) float64 {
	if m.step > 0 {
		return math.Round(x / m.step)
	}
	return x
}

// length turns a coordinate into metres, to a picometre on a step (so
// that 13 steps of 0.5 mm are the 6.5 mm a design file's "6.5 mm" gives,
// not a bit off).
func (m setMap) length(z float64) float64 {
	if m.step > 0 {
		return math.Round(z*m.step*1e12) / 1e12
	}
	return z
}

// bounds are the search coordinates' bounds.
func (m setMap) bounds() (lo, hi []float64, integer []bool) {
	v := m.vars
	lo = []float64{m.in(v[0].Lo), 0, m.in(v[2].Lo), m.in(v[3].Lo), 0}
	hi = []float64{m.in(v[0].Hi), m.in(v[1].Hi) - m.in(v[1].Lo), m.in(v[2].Hi), m.in(v[3].Hi), v[4].Hi - v[4].Lo}
	on := m.step > 0
	return lo, hi, []bool{on, on, on, on, true}
}

// most is as many fins as fit at pitch p and root r, within the count's
// upper bound.
func (m setMap) most(p, r float64) int {
	s := m.base
	return min(int(m.vars[4].Hi), fins.Fitting(s.Style, p, r, s.Length, s.RootDiameter))
}

// x maps search coordinates z (pitch, height depth, root, tip, fins
// short) to the fin variables (pitch, height, root, tip, count); ok is
// false where they fall outside the bounds or no castable height is left.
func (m setMap) x(z []float64) ([]float64, bool) {
	p, r, t := m.length(z[0]), m.length(z[2]), m.length(z[3])
	if t > r || p <= r {
		return nil, false
	}
	n := m.most(p, r) - int(z[4])
	if float64(n) < m.vars[4].Lo || n < 1 {
		return nil, false
	}
	hm := m.tallest(p, r, t)
	h := m.length(m.in(hm) - z[1])
	if h < m.vars[1].Lo-1e-12 {
		return nil, false
	}
	return []float64{p, h, r, t, float64(n)}, true
}

// z maps fin variables onto search coordinates, clipped into the bounds:
// where the design as drawn starts a search, and the designs a step away
// in the fin variables.
func (m setMap) z(x []float64) []float64 {
	lo, hi, _ := m.bounds()
	clip := func(i int, v float64) float64 { return math.Min(hi[i], math.Max(lo[i], v)) }
	z := []float64{clip(0, m.in(x[0])), 0, clip(2, m.in(x[2])), clip(3, m.in(x[3])), 0}
	p, r, t := m.length(z[0]), m.length(z[2]), m.length(z[3])
	z[4] = clip(4, float64(m.most(p, r))-math.Round(x[4]))
	if hm := m.tallest(p, r, t); hm > 0 {
		z[1] = clip(1, m.in(hm)-m.in(x[1]))
	}
	return z
}

// tallest is the tallest fin within the height bound (on the step) that
// the process casts at pitch p, root r and tip t: the height-to-gap and
// draft limits (fins.Process.Check), 0 when there is none.
func (m setMap) tallest(p, r, t float64) float64 {
	pr := m.proc
	h := math.Min(m.vars[1].Hi, pr.MaxAspect*(p-r))
	if pr.MinDraft > 0 {
		h = math.Min(h, (r-t)/(2*math.Tan(pr.MinDraft)))
	}
	if h <= 0 {
		return 0
	}
	if m.step > 0 { // the tallest on the step, to 1e-9 step for rounding
		h = m.length(math.Floor(h/m.step + 1e-9))
	}
	s := m.base
	s.Pitch, s.Height, s.RootThickness, s.TipThickness = p, h, r, t
	for k := 0; k < 2 && h > 0 && !pr.Feasible(s); k++ { // rounding at the limit: a step lower
		if m.step > 0 {
			h = m.length(math.Round(h/m.step) - 1)
		} else {
			h *= 1 - 1e-9
		}
		s.Height = h
	}
	return math.Max(h, 0)
}
