package transient

import (
	"math"
	"testing"

	"finmarch/airflow/cylinder"
)

// Peaks, time over a limit and the first passing, from samples joined by
// straight lines: a head rising 10 K a second from 400 K and falling back,
// against a 425 K limit, crosses at 2.5 s and 7.5 s.
func TestSummarise(t *testing.T) {
	var tr Trace
	for i := 0; i <= 10; i++ {
		h := 400 + 10*math.Min(float64(i), float64(10-i))
		tr.Samples = append(tr.Samples, Sample{Time: float64(i), Head: h, Barrel: 350})
	}
	s := Summarise(tr, cylinder.Limits{Head: 425, Barrel: 360})
	if s.PeakHead != 450 || s.PeakHeadAt != 5 || math.Abs(s.AboveHead-5) > 1e-12 || math.Abs(s.FirstOverHead-2.5) > 1e-12 {
		t.Errorf("%+v", s)
	}
	if s.AboveBarrel != 0 || s.FirstOverBarrel != -1 || s.PeakBarrel != 350 {
		t.Errorf("barrel: %+v", s)
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
