package transient

import (
	"math"
	"testing"

	"finmarch/airflow/cylinder"
)

// A 30-minute ride sampled every second, two ways: a logged ride of 1800
// one-second segments (speed changing every second, the worst case for the
// integrator, which restarts at each change) and a ride of three long
// segments. Run with -cpu 1 for the one-core figure.
func BenchmarkRide30min(b *testing.B) {
	d := roadDemo(b)
	m, err := NewModel(d, cylinder.Settings{}, Metal{})
	if err != nil {
		b.Fatal(err)
	}
	logged := make([]Segment, 1800)
	for i := range logged {
		// stop-and-go: 0 to 50 km/h and back every two minutes
		v := 50 / 3.6 * math.Max(0, math.Sin(2*math.Pi*float64(i)/120))
		logged[i] = Segment{Duration: 1, Speed: v}
	}
	three := []Segment{{Duration: 900, Speed: 120 / 3.6}, {Duration: 600, Speed: 50 / 3.6, Grade: 6}, {Duration: 300}}
	ta := d.Case.Ambient
	for _, c := range []struct {
		name string
		ride []Segment
	}{{"logged-1s", logged}, {"three-segments", three}} {
		b.Run(c.name, func(b *testing.B) {
			evals := 0
			for i := 0; i < b.N; i++ {
				tr, err := m.Run(c.ride, [2]float64{ta, ta}, 1)
				if err != nil || len(tr.Samples) != 1801 {
					b.Fatalf("%v, %d samples", err, len(tr.Samples))
				}
				evals = tr.Evals
			}
			b.ReportMetric(float64(evals), "evals/op")
		})
	}
}
