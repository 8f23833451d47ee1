package transient

import (
	"math"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/internal/demotest"
)

// handStep is a step of a hand-made trace: the walls' values and slopes
// at both ends.
func handStep(t0, t1 float64, y0, y1, dy0, dy1 [2]float64) Step {
	return Step{T0: t0, T1: t1, Y0: y0[:], Y1: y1[:], DY0: dy0[:], DY1: dy1[:]}
}

// Peaks, time over a limit and the first passing, from the steps' cubic
// interpolants: a head at 400 K at both ends of a 2 s step, leaving at
// +50 K/s and arriving at -50 K/s, is 400 + 100 θ(1 - θ) (θ = t/2 s), a
// hump to 425 K at 1 s that no sample at the step's ends sees; against a
// 415 K limit it is over from 1 - sqrt(0.4) to 1 + sqrt(0.4) s. A second
// step holds 400 K. The barrel, at 350 K, stays under its 360 K limit.
func TestSummarise(t *testing.T) {
	tr := Trace{End: 4, Steps: []Step{
		handStep(0, 2, [2]float64{400, 350}, [2]float64{400, 350}, [2]float64{50, 0}, [2]float64{-50, 0}),
		handStep(2, 4, [2]float64{400, 350}, [2]float64{400, 350}, [2]float64{}, [2]float64{}),
	}}
	s, err := Summarise(tr, cylinder.Limits{Head: 415, Barrel: 360})
	if err != nil {
		t.Fatal(err)
	}
	r := math.Sqrt(0.4)
	if math.Abs(s.PeakHead-425) > 1e-9 || math.Abs(s.PeakHeadAt-1) > 1e-9 || math.Abs(s.AboveHead-2*r) > 1e-6 || math.Abs(s.FirstOverHead-(1-r)) > 1e-6 {
		t.Errorf("head: %+v; want a peak of 425 K at 1 s, over from %.6f s for %.6f s", s, 1-r, 2*r)
	}
	if s.AboveBarrel != 0 || s.FirstOverBarrel != -1 || s.PeakBarrel != 350 || s.Runaway || s.RunawayAt != -1 {
		t.Errorf("barrel: %+v", s)
	}
	// a head over its limit from the start: first over at 0, and the time
	// over runs to where it comes back under (1 + sqrt(0.4) s)
	s, err = Summarise(tr, cylinder.Limits{Head: 399, Barrel: 360})
	if err != nil {
		t.Fatal(err)
	}
	if s.FirstOverHead != 0 || math.Abs(s.AboveHead-4) > 1e-9 {
		t.Errorf("over from the start: first %g s, %g s over; want 0 s and 4 s", s.FirstOverHead, s.AboveHead)
	}
	if _, err := Summarise(Trace{}, cylinder.Limits{}); err == nil {
		t.Error("a trace without steps summarised")
	}
}

// A hot cylinder standing after a run, with the air side held linear: the
// head heats from the run's steady wall towards the standing one with time
// constant C/(hA), so it reaches a limit between them at
// t = tau ln((T_s - T_0)/(T_s - T_lim)), to a second; a limit above the
// standing wall is never reached.
func TestSoakTime(t *testing.T) {
	d := roadDemo(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	// h A grows with speed: 6 W/K standing, 24 W/K at 25 m/s (head; the
	// barrel half of it)
	ua := func(v float64) [2]float64 { return [2]float64{6 + 0.72*v, 3 + 0.36*v} }
	m.Air = func(c cylinder.Case, th, tb float64) ([2]float64, error) {
		u := ua(c.Speed)
		return [2]float64{u[0] * (th - c.Ambient), u[1] * (tb - c.Ambient)}, nil
	}
	ta := d.Case.Ambient
	run, stand := [2]float64{3000, 1500}, [2]float64{1200, 600}
	ride := []Segment{{Duration: 3600, Speed: 25, Heat: &run}, {Duration: 600, Heat: &stand}}
	tr, err := m.Run(ride, [2]float64{ta, ta}, 10)
	if err != nil {
		t.Fatal(err)
	}
	// the run settles (an hour is 28 time constants) at Q/(hA) over ambient
	t0 := ta + run[0]/ua(25)[0]
	ts := ta + stand[0]/ua(0)[0]
	lim := (t0 + ts) / 2
	tau := m.Capacity[0] / ua(0)[0]
	want := tau * math.Log((ts-t0)/(ts-lim))
	// Steady uses the real air side; the linear air side's steady walls
	// are the ones that matter here, so judge by the crossing only
	sk, err := m.Soak(ride, tr, cylinder.Limits{Head: lim, Barrel: 2000}, 7200)
	if err != nil {
		t.Fatal(err)
	}
	if sk.Start != 3600 || math.Abs(sk.Head-want) > 1 {
		t.Errorf("standing from %g s, the head reaches %.1f K after %.1f s; want %.1f s (tau %.0f s)", sk.Start, lim, sk.Head, want, tau)
	}
	if math.Abs(tr.Starts[1][0]-t0) > 0.01 {
		t.Errorf("wall at the standstill %.3f K, want %.3f K", tr.Starts[1][0], t0)
	}
	// standing with less heat than the run's fins rejected: an over-limit
	// head comes back under a limit halfway down after tau ln 2
	cool := [2]float64{600, 300}
	ride2 := []Segment{ride[0], {Duration: 600, Heat: &cool}}
	tr2, err := m.Run(ride2, [2]float64{ta, ta}, 10)
	if err != nil {
		t.Fatal(err)
	}
	ts2 := ta + cool[0]/ua(0)[0]
	sk2, err := m.Soak(ride2, tr2, cylinder.Limits{Head: (t0 + ts2) / 2, Barrel: 2000}, 7200)
	if err != nil {
		t.Fatal(err)
	}
	if sk2.Head != 0 || math.Abs(sk2.Cooled[0]-tau*math.Ln2) > 1 || sk2.Cooled[1] != -1 {
		t.Errorf("over at the stop (%g), back under after %.1f s, want %.1f s; barrel %g", sk2.Head, sk2.Cooled[0], tau*math.Ln2, sk2.Cooled[1])
	}
	if _, err := m.Soak(ride[:1], tr, cylinder.Limits{Head: lim, Barrel: 2000}, 7200); err != ErrNoStandstill {
		t.Errorf("a ride without a standstill: %v", err)
	}
}

// climbAndCool is a ride of the road demo that passes both limits of
// limitsClimb going up and comes back under them: 5 min at 80 km/h, 20 min
// at 60 km/h up a 7 % grade, 10 min standing, 15 min at 40 km/h on the
// level (an invented scenario).
var climbAndCool = []Segment{{Duration: 300, Speed: 80 / 3.6}, {Duration: 1200, Speed: 60 / 3.6, Grade: 7}, {Duration: 600}, {Duration: 900, Speed: 40 / 3.6}}

// limitsClimb are limits the road demo passes on climbAndCool: the head
// 175 C, the barrel 105 C.
var limitsClimb = cylinder.Limits{Head: 175 + 273.15, Barrel: 105 + 273.15}

// The summary does not depend on the output interval: the same ride
// sampled every 1 s, 60 s and 300 s gives the same peaks, first passings
// and times over the limits to 0.5 s and 0.05 K, on a ride that passes
// both limits and comes back under them, and on one that runs away. (Read
// from the samples, the head's first passing moved by about a minute
// between 1 s and 300 s.)
func TestSummaryIndependentOfEvery(t *testing.T) {
	d := roadDemo(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	ta := d.Case.Ambient
	hot := [2]float64{20e3, 2e3}
	runaway := []Segment{{Duration: 300, Speed: 80 / 3.6, Heat: &hot}, {Duration: 600, Speed: 60 / 3.6, Heat: &hot}}
	for _, c := range []struct {
		name string
		ride []Segment
	}{{"climb-and-cool", climbAndCool}, {"runaway", runaway}} {
		var base Summary
		for k, every := range []float64{1, 60, 300} {
			tr, err := m.Run(c.ride, [2]float64{ta, ta}, every)
			if err != nil {
				t.Fatal(err)
			}
			s, err := Summarise(tr, limitsClimb)
			if err != nil {
				t.Fatal(err)
			}
			if k == 0 {
				base = s
				// the case shows what it is meant to: both walls pass
				// their limits and the head comes back under its own, or
				// the head passes its limit and runs away
				meant := s.FirstOverHead > 0 && s.FirstOverBarrel > 0 && s.FirstOverHead+s.AboveHead < tr.End-1 && !tr.Runaway
				if c.name == "runaway" {
					meant = s.FirstOverHead > 0 && s.AboveHead > 0 && tr.Runaway && s.RunawayAt > s.FirstOverHead
				}
				if !meant {
					t.Fatalf("%s: not the case meant: %+v, end %g s", c.name, s, tr.End)
				}
				continue
			}
			times := [][2]float64{{s.PeakHeadAt, base.PeakHeadAt}, {s.PeakBarrelAt, base.PeakBarrelAt}, {s.FirstOverHead, base.FirstOverHead},
				{s.FirstOverBarrel, base.FirstOverBarrel}, {s.AboveHead, base.AboveHead}, {s.AboveBarrel, base.AboveBarrel}, {s.RunawayAt, base.RunawayAt}}
			for j, p := range times {
				if math.Abs(p[0]-p[1]) > 0.5 {
					t.Errorf("%s every %g s: time %d is %.3f s, every 1 s %.3f s", c.name, every, j, p[0], p[1])
				}
			}
			if math.Abs(s.PeakHead-base.PeakHead) > 0.05 || math.Abs(s.PeakBarrel-base.PeakBarrel) > 0.05 || s.Runaway != base.Runaway {
				t.Errorf("%s every %g s: peaks %.3f / %.3f K, every 1 s %.3f / %.3f K", c.name, every, s.PeakHead, s.PeakBarrel, base.PeakHead, base.PeakBarrel)
			}
		}
		t.Logf("%s: %+v", c.name, base)
	}
}

// The events against an independent reading of the same dense output:
// Trace.At on a 0.01 s grid over the whole ride, the first grid interval
// where the head goes over its limit bisected (on Trace.At, to 1e-9 s),
// the time over each limit as the grid points over it times 0.01 s, and
// the peak as the highest grid value. The event location (Brent's method
// on each monotone piece of each step's cubic) agrees with the bisection
// to 1e-5 s, the time over to 0.01 s per crossing, the peak to 1e-3 K
// (and no grid value above it). Read from samples a minute apart and
// joined by straight lines, the first passing is off by seconds.
func TestEventsOnTheDenseOutput(t *testing.T) {
	d := roadDemo(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	ta := d.Case.Ambient
	tr, err := m.Run(climbAndCool, [2]float64{ta, ta}, 60)
	if err != nil {
		t.Fatal(err)
	}
	s, err := Summarise(tr, limitsClimb)
	if err != nil {
		t.Fatal(err)
	}
	y := make([]float64, 4)
	wall := func(i int, t float64) float64 {
		if !tr.At(t, y) {
			return math.NaN()
		}
		return y[i]
	}
	const dt = 0.01
	n := int(math.Round(tr.End / dt))
	for i, l := range []float64{limitsClimb.Head, limitsClimb.Barrel} {
		first, over, crossings, peak := -1.0, 0, 0, math.Inf(-1)
		prev := wall(i, 0) > l
		for j := 0; j <= n; j++ {
			tj := math.Min(float64(j)*dt, tr.End)
			v := wall(i, tj)
			if math.IsNaN(v) {
				t.Fatalf("no dense output at %g s", tj)
			}
			peak = math.Max(peak, v)
			up := v > l
			if up != prev {
				crossings++
			}
			if up && !prev && first < 0 {
				// bisect [tj - dt, tj] on the dense output
				a, b := tj-dt, tj
				for b-a > 1e-9 {
					if c := (a + b) / 2; wall(i, c) > l {
						b = c
					} else {
						a = c
					}
				}
				first = b
			}
			if up && j < n {
				over++
			}
			prev = up
		}
		got := [][3]float64{{s.FirstOverHead, s.AboveHead, s.PeakHead}, {s.FirstOverBarrel, s.AboveBarrel, s.PeakBarrel}}[i]
		if first < 0 || math.Abs(got[0]-first) > 1e-5 {
			t.Errorf("wall %d: first over its limit at %.6f s, bisection on the grid %.6f s", i, got[0], first)
		}
		if grid := float64(over) * dt; math.Abs(got[1]-grid) > dt*float64(crossings) || crossings < 2 {
			t.Errorf("wall %d: %.3f s over its limit, the grid %.3f s (%d crossings)", i, got[1], grid, crossings)
		}
		if peak > got[2]+1e-9 || got[2]-peak > 1e-3 {
			t.Errorf("wall %d: peak %.6f K, the grid's highest %.6f K", i, got[2], peak)
		}
		t.Logf("wall %d: first over at %.6f s (bisection %.6f s), %.3f s over (grid %.3f s, %d crossings)", i, got[0], first, got[1], float64(over)*dt, crossings)
	}
}

// A ride the fins cannot cool (the air side held linear, h A 18 W/K on the
// head, 20 kW into it, so the head would settle 1100 K over ambient)
// runs away: the head reaches the model's cap at
// t = tau ln(R / (R - (T_cap - T_a))), R = Q/(hA), tau = C/(hA), to 0.5 s,
// and passes a 500 K limit at the same form's time; the trace ends there,
// its last sample at the cap; the summary names the runaway, its time and
// the head, and reports no peak (the walls were still climbing).
func TestRunawaySummary(t *testing.T) {
	d := demotest.Upright(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	ua := [2]float64{18, 11} // W/K
	m.Air = func(c cylinder.Case, th, tb float64) ([2]float64, error) {
		return [2]float64{ua[0] * (th - c.Ambient), ua[1] * (tb - c.Ambient)}, nil
	}
	q := [2]float64{20e3, 2e3}
	ta := d.Case.Ambient
	tr, err := m.Run([]Segment{{Duration: 600, Speed: 25, Heat: &q}}, [2]float64{ta, ta}, 60)
	if err != nil {
		t.Fatal(err)
	}
	lim := cylinder.Limits{Head: 500, Barrel: 450}
	s, err := Summarise(tr, lim)
	if err != nil {
		t.Fatal(err)
	}
	rise, tau := q[0]/ua[0], m.Capacity[0]/ua[0]
	at := func(level float64) float64 { return tau * math.Log(rise/(rise-(level-ta))) }
	want := at(cylinder.SaneWallLimit)
	if !tr.Runaway || !s.Runaway || s.RunawayWall != 0 || math.Abs(s.RunawayAt-want) > 0.5 || s.RunawayAt != tr.End {
		t.Errorf("runaway %v/%v of wall %d at %.2f s (trace ends %.2f s); want the head at %.2f s", tr.Runaway, s.Runaway, s.RunawayWall, s.RunawayAt, tr.End, want)
	}
	if s.PeakHeadAt != -1 || s.PeakBarrelAt != -1 || s.PeakHead != 0 || s.PeakBarrel != 0 {
		t.Errorf("a runaway reports peaks: head %.1f K at %g s, barrel %.1f K at %g s", s.PeakHead, s.PeakHeadAt, s.PeakBarrel, s.PeakBarrelAt)
	}
	last := tr.Samples[len(tr.Samples)-1]
	if math.Abs(last.Time-tr.End) > 1e-9 || math.Abs(last.Head-cylinder.SaneWallLimit) > 1e-6 || math.Abs(tr.Final[0]-cylinder.SaneWallLimit) > 1e-6 {
		t.Errorf("last sample %.3f K at %.3f s, final %.3f K; want the cap %.2f K at %.3f s", last.Head, last.Time, tr.Final[0], cylinder.SaneWallLimit, tr.End)
	}
	if w := at(lim.Head); math.Abs(s.FirstOverHead-w) > 0.5 || math.Abs(s.AboveHead-(s.RunawayAt-s.FirstOverHead)) > 1e-6 || s.FirstOverBarrel != -1 {
		t.Errorf("over the head limit from %.2f s (want %.2f s) for %.2f s; barrel first over %g s", s.FirstOverHead, w, s.AboveHead, s.FirstOverBarrel)
	}
	t.Logf("runaway at %.3f s (closed form %.3f s), %d samples", s.RunawayAt, want, len(tr.Samples))
}
