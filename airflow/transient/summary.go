package transient

import (
	"errors"
	"math"

	"finmarch/airflow/cylinder"
)

// Summary is what a trace says against the limits.
type Summary struct {
	PeakHead, PeakHeadAt     float64 // K, s
	PeakBarrel, PeakBarrelAt float64 // K, s
	// AboveHead and AboveBarrel are the time each wall spends above its
	// limit, s (the samples joined by straight lines).
	AboveHead, AboveBarrel float64
	// FirstOverHead and FirstOverBarrel are when each wall first passes its
	// limit, s; -1 when it never does.
	FirstOverHead, FirstOverBarrel float64
}

// Summarise finds the peaks, the time over each limit and the first
// passing of each, from the trace's samples.
func Summarise(tr Trace, lim cylinder.Limits) Summary {
	s := Summary{FirstOverHead: -1, FirstOverBarrel: -1}
	for i, p := range tr.Samples {
		if p.Head > s.PeakHead || i == 0 {
			s.PeakHead, s.PeakHeadAt = p.Head, p.Time
		}
		if p.Barrel > s.PeakBarrel || i == 0 {
			s.PeakBarrel, s.PeakBarrelAt = p.Barrel, p.Time
		}
		if i == 0 {
			continue
		}
		q := tr.Samples[i-1]
		above, first := overSpan(q.Time, p.Time, q.Head-lim.Head, p.Head-lim.Head)
		s.AboveHead += above
		if s.FirstOverHead < 0 && first >= 0 {
			s.FirstOverHead = first
		}
		above, first = overSpan(q.Time, p.Time, q.Barrel-lim.Barrel, p.Barrel-lim.Barrel)
		s.AboveBarrel += above
		if s.FirstOverBarrel < 0 && first >= 0 {
			s.FirstOverBarrel = first
		}
	}
	if len(tr.Samples) > 0 {
		if p := tr.Samples[0]; p.Head > lim.Head {
			s.FirstOverHead = p.Time
		}
		if p := tr.Samples[0]; p.Barrel > lim.Barrel {
			s.FirstOverBarrel = p.Time
		}
	}
	return s
}

// overSpan is the time above zero of a quantity going linearly from a at
// t0 to b at t1, and when it first passes zero upward (-1: it does not).
func overSpan(t0, t1, a, b float64) (above, first float64) {
	switch {
	case a > 0 && b > 0:
		return t1 - t0, -1
	case a <= 0 && b <= 0:
		return 0, -1
	}
	tc := t0 + (t1-t0)*a/(a-b) // the zero crossing
	if b > 0 {
		return t1 - tc, tc
	}
	return tc - t0, -1
}

// Soak is how a hot cylinder fares standing still at idle after moving.
type Soak struct {
	Segment int     // the standing segment (0-based) after the first moving one
	Start   float64 // s into the ride
	// Head and Barrel are the time from Start until each wall reaches its
	// limit standing (followed past the ride's end up to the horizon), s;
	// -1 when the wall settles below its limit, +Inf when it has not
	// reached it within the horizon though its steady standing wall is
	// over the limit (or has no equilibrium).
	Head, Barrel float64
	// Cooled is, for a wall already over its limit when the standstill
	// starts, the time until it is back at its limit, s; -1 when it does
	// not come back within the horizon (or was not over).
	Cooled [2]float64
	// Settle is the steady standing walls, K (meaningless without an
	// Equilibrium).
	Settle      [2]float64
	Equilibrium bool
	Horizon     float64 // s
}

// ErrNoStandstill is returned by Soak for a ride with no standing segment
// after a moving one.
var ErrNoStandstill = errors.New("the ride has no standstill after moving")

// Soak follows the first standstill after moving in the ride: from the
// walls at its start (tr.Starts), the standing segment continued for up to
// horizon seconds, until each wall reaches its limit or settles.
func (m *Model) Soak(ride []Segment, tr Trace, lim cylinder.Limits, horizon float64) (*Soak, error) {
	k := -1
	for i := 1; i < len(ride) && i < len(tr.Starts); i++ {
		if ride[i].Speed == 0 && ride[i-1].Speed > 0 {
			k = i
			break
		}
	}
	if k < 0 {
		return nil, ErrNoStandstill
	}
	sk := &Soak{Segment: k, Horizon: horizon, Head: -1, Barrel: -1}
	for i := 0; i < k; i++ {
		sk.Start += ride[i].Duration
	}
	sg := ride[k]
	settle, eq, err := m.Steady(sg)
	if err != nil {
		return nil, err
	}
	sk.Settle, sk.Equilibrium = settle, eq
	sg.Duration = horizon
	st, err := m.Run([]Segment{sg}, tr.Starts[k], 1)
	if err != nil {
		return nil, err
	}
	s := Summarise(st, lim)
	sk.Cooled = [2]float64{-1, -1}
	for i, l := range []float64{lim.Head, lim.Barrel} {
		for j, p := range st.Samples {
			w := []float64{p.Head, p.Barrel}[i]
			if j == 0 && w <= l {
				break // not over when it stops
			}
			if w <= l {
				q := st.Samples[j-1]
				wq := []float64{q.Head, q.Barrel}[i]
				sk.Cooled[i] = q.Time + (p.Time-q.Time)*(wq-l)/(wq-w)
				break
			}
		}
	}
	for i, w := range []*float64{&sk.Head, &sk.Barrel} {
		first, l := []float64{s.FirstOverHead, s.FirstOverBarrel}[i], []float64{lim.Head, lim.Barrel}[i]
		switch {
		case first >= 0:
			*w = first
		case !eq || settle[i] > l:
			*w = math.Inf(1)
		}
	}
	return sk, nil
}
