package transient

import (
	"math"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/internal/demotest"
)

// roadDemo is the upright demo with the road load of the demo's design
// file (an invented scenario): the heat follows speed and grade, with an
// idle floor.
func roadDemo(t testing.TB) cylinder.Design {
	d := demotest.Upright(t)
	d.Load = cylinder.Load{Road: cylinder.RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.18, HeadShare: 0.65, Cylinders: 1, IdleHeat: 500, RatedPower: 25e3}}
	return d
}

// A constant ride converges to the steady estimate of the same point
// (airflow/cylinder's balance) to 0.1 K, from cold and from hot.
func TestConstantRideConverges(t *testing.T) {
	d := roadDemo(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	sg := Segment{Duration: 3 * 3600, Speed: d.Case.Speed}
	want, ok, err := m.Steady(sg)
	if err != nil || !ok {
		t.Fatalf("steady: %v %v", ok, err)
	}
	for _, start := range [][2]float64{{d.Case.Ambient, d.Case.Ambient}, {want[0] + 80, want[1] + 60}} {
		tr, err := m.Run([]Segment{sg}, start, 60)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(tr.Final[0]-want[0]) > 0.1 || math.Abs(tr.Final[1]-want[1]) > 0.1 {
			t.Errorf("from %v K: after 3 h %.3f / %.3f K, steady %.3f / %.3f K", start, tr.Final[0], tr.Final[1], want[0], want[1])
		}
	}
}

// A step in load with the air side held fixed and linear (h A per set, no
// link between them) is the lumped solution T = T_a + Q/(hA) (1 -
// exp(-t hA / C)), time constant C/(hA), to 1 % of the rise at every sample
// (in fact to the integrator's tolerance).
func TestStepIsTheLumpedExponential(t *testing.T) {
	d := demotest.Upright(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	ua := [2]float64{18, 11} // W/K
	m.Air = func(c cylinder.Case, th, tb float64) ([2]float64, error) {
		return [2]float64{ua[0] * (th - c.Ambient), ua[1] * (tb - c.Ambient)}, nil
	}
	q := [2]float64{2000, 900}
	ta := d.Case.Ambient
	tr, err := m.Run([]Segment{{Duration: 1800, Speed: 25, Heat: &q}}, [2]float64{ta, ta}, 10)
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for _, s := range tr.Samples {
		for i, got := range []float64{s.Head, s.Barrel} {
			rise := q[i] / ua[i]
			want := ta + rise*(1-math.Exp(-s.Time*ua[i]/m.Capacity[i]))
			worst = math.Max(worst, math.Abs(got-want)/rise)
		}
	}
	if worst > 0.01 || len(tr.Samples) != 181 {
		t.Errorf("largest error %.3g of the rise over %d samples", worst, len(tr.Samples))
	}
	t.Logf("time constants %.0f s and %.0f s; largest error %.2g of the rise", m.Capacity[0]/ua[0], m.Capacity[1]/ua[1], worst)
}

// Energy over a whole ride (a fast run, a climb, a standstill): the heat
// put in (the load times each segment's duration, summed apart from the
// integrator) less the heat rejected (the air-side model evaluated again
// at the sampled temperatures, every second, and integrated by Simpson's
// rule segment by segment) equals the change in stored heat C dT to 1e-6
// of the heat put in.
func TestRideEnergy(t *testing.T) {
	d := roadDemo(t)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		t.Fatal(err)
	}
	old := Tol
	Tol = Tolerances{Abs: 1e-7, Rel: 1e-10}
	defer func() { Tol = old }()
	ride := []Segment{{Duration: 600, Speed: 120 / 3.6}, {Duration: 400, Speed: 50 / 3.6, Grade: 6}, {Duration: 300, Speed: 0}}
	ta := d.Case.Ambient
	tr, err := m.Run(ride, [2]float64{ta, ta}, 1)
	if err != nil {
		t.Fatal(err)
	}
	var in, out float64
	k := 0 // sample index at the segment's start
	for _, sg := range ride {
		qin, _, err := m.HeatIn(sg)
		if err != nil {
			t.Fatal(err)
		}
		in += (qin[0] + qin[1]) * sg.Duration
		n := int(sg.Duration) // intervals of 1 s; even
		f := func(j int) float64 { s := tr.Samples[k+j]; return s.HeatOut[0] + s.HeatOut[1] }
		sum := f(0) + f(n)
		for j := 1; j < n; j++ {
			sum += float64(2+2*(j%2)) * f(j)
		}
		// the sample at a boundary belongs to the segment before it: its
		// heat out is evaluated at the earlier conditions, so the next
		// segment's first value is evaluated again at its own
		first := tr.Samples[k]
		if k > 0 {
			c := m.at(sg).Case
			q, err := m.HeatOut(c, first.Head, first.Barrel)
			if err != nil {
				t.Fatal(err)
			}
			sum += q[0] + q[1] - f(0)
		}
		out += sum / 3
		k += n
	}
	if d := math.Abs(in - out - tr.Stored); d > 1e-6*in {
		t.Errorf("in %.1f J - out %.1f J = %.1f J, stored %.1f J: off by %.2g of the heat in", in, out, in-out, tr.Stored, d/in)
	}
	if d := math.Abs(tr.EnergyIn - in); d > 1e-9*in {
		t.Errorf("integrated heat in %.3f J, summed %.3f J", tr.EnergyIn, in)
	}
	t.Logf("in %.0f J, out %.0f J, stored %.0f J, %d air-side evaluations", in, out, tr.Stored, tr.Evals)
}
