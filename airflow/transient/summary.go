package transient

import (
	"errors"
	"math"

	"finmarch/airflow/cylinder"
)

// Summary is what a trace says against the limits, read from the
// integrator's accepted steps and their dense output (dense.go), not from
// the samples: the same whatever the output interval.
type Summary struct {
	// PeakHead and PeakBarrel are the highest walls of the ride, K, and
	// PeakHeadAt and PeakBarrelAt when, s: the largest of each step's end
	// values and of its interpolant at the interior stationary points. In
	// a runaway there is no peak: the walls were still climbing where the
	// ride stopped, so the peaks are 0 K at -1 s (see Runaway).
	PeakHead, PeakHeadAt     float64 // K, s
	PeakBarrel, PeakBarrelAt float64 // K, s
	// AboveHead and AboveBarrel are the time each wall spends above its
	// limit, s: summed between the crossings of the limit (up to the
	// runaway, in one).
	AboveHead, AboveBarrel float64
	// FirstOverHead and FirstOverBarrel are when each wall first passes its
	// limit, s (the start when it starts over); -1 when it never does. A
	// crossing is an event located on the dense output: the root of
	// T(t) - limit on the step's interpolant, by Brent's method.
	FirstOverHead, FirstOverBarrel float64
	// Runaway is set when a wall passed cylinder.SaneWallLimit (no
	// equilibrium): RunawayAt is when, s (-1 without a runaway), and
	// RunawayWall which wall passed first (0 head, 1 barrel).
	Runaway     bool
	RunawayAt   float64
	RunawayWall int
}

// Summarise finds the peaks, the time over each limit and the first
// passing of each, from the trace's steps (its dense output).
func Summarise(tr Trace, lim cylinder.Limits) (Summary, error) {
	s := Summary{FirstOverHead: -1, FirstOverBarrel: -1, RunawayAt: -1}
	if len(tr.Steps) == 0 {
		return s, errors.New("the trace has no steps to summarise")
	}
	peak, at := [2]float64{}, [2]float64{}
	first := [2]float64{-1, -1}
	var above [2]float64
	for i, l := range []float64{lim.Head, lim.Barrel} {
		s0 := &tr.Steps[0]
		peak[i], at[i] = s0.Y0[i], s0.T0
		over, since := s0.Y0[i] > l, s0.T0
		if over {
			first[i] = s0.T0
		}
		for k := range tr.Steps {
			st := &tr.Steps[k]
			for _, t := range append(st.stationary(i), st.T1) {
				if v := st.value(i, t); v > peak[i] {
					peak[i], at[i] = v, t
				}
			}
			cs, err := st.crossings(i, l)
			if err != nil {
				return s, err
			}
			for _, c := range cs {
				if c.Up == over {
					// not expected: the steps join end to end, so the
					// crossings alternate; one that changes nothing is
					// skipped
					continue
				}
				if over {
					above[i] += c.Time - since
				} else if first[i] < 0 {
					first[i] = c.Time
				}
				over, since = c.Up, c.Time
			}
		}
		if end := tr.Steps[len(tr.Steps)-1].T1; over {
			above[i] += end - since
		}
	}
	s.PeakHead, s.PeakHeadAt, s.PeakBarrel, s.PeakBarrelAt = peak[0], at[0], peak[1], at[1]
	s.AboveHead, s.AboveBarrel = above[0], above[1]
	s.FirstOverHead, s.FirstOverBarrel = first[0], first[1]
	if tr.Runaway {
		s.Runaway, s.RunawayAt, s.RunawayWall = true, tr.End, tr.RunawayWall
		s.PeakHead, s.PeakHeadAt, s.PeakBarrel, s.PeakBarrelAt = 0, -1, 0, -1
	}
	return s, nil
}

// backUnder is the first time component i comes back down to level
// after starting over it, s; -1 when it starts at or under it or does not
// come back on the trace (an event on the dense output, as Summarise).
func backUnder(tr Trace, i int, level float64) (float64, error) {
	if len(tr.Steps) == 0 || !(tr.Steps[0].Y0[i] > level) {
		return -1, nil
	}
	for k := range tr.Steps {
		cs, err := tr.Steps[k].crossings(i, level)
		if err != nil {
			return -1, err
		}
		for _, c := range cs {
			if !c.Up {
				return c.Time, nil
			}
		}
	}
	return -1, nil
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
// horizon seconds, until each wall reaches its limit or settles. The
// times are events on the standing run's dense output (see Summarise).
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
	// sampled at its ends only: the summary reads the steps
	st, err := m.Run([]Segment{sg}, tr.Starts[k], horizon)
	if err != nil {
		return nil, err
	}
	s, err := Summarise(st, lim)
	if err != nil {
		return nil, err
	}
	for i, l := range []float64{lim.Head, lim.Barrel} {
		if sk.Cooled[i], err = backUnder(st, i, l); err != nil {
			return nil, err
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
