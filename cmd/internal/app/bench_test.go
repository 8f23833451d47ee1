package app

import (
	"runtime"
	"testing"

	"finmarch/airflow/sweep"
	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
)

// grid1000 is a 1000-point sweep of the upright demo: 100 head pitches by
// 10 road speeds.
func grid1000(b *testing.B) (*design.Design, sweep.Grid) {
	d, err := design.Parse(demo.Upright, "u.toml")
	if err != nil {
		b.Fatal(err)
	}
	p, _ := parseAxis("head.pitch=5mm:14.9mm:0.1mm")
	v, _ := parseAxis("air.speed=40km/h:130km/h:10km/h")
	if len(p.Values)*len(v.Values) != 1000 {
		b.Fatalf("grid has %d points", len(p.Values)*len(v.Values))
	}
	return d, sweep.Grid{p, v}
}

// designs1000 is a 1000-point sweep of 1000 distinct head fin designs at
// the demo's cruise: 10 pitches by 10 heights by 10 root thicknesses, so
// every point fills a fresh fin-efficiency curve.
func designs1000(b *testing.B) (*design.Design, sweep.Grid) {
	d, err := design.Parse(demo.Upright, "u.toml")
	if err != nil {
		b.Fatal(err)
	}
	p, _ := parseAxis("head.pitch=7mm:11.5mm:0.5mm")
	h, _ := parseAxis("head.height=30mm:48mm:2mm")
	t, _ := parseAxis("head.root_thickness=2.5mm:4.3mm:0.2mm")
	if len(p.Values)*len(h.Values)*len(t.Values) != 1000 {
		b.Fatalf("grid has %d points", len(p.Values)*len(h.Values)*len(t.Values))
	}
	return d, sweep.Grid{p, h, t}
}

func benchSweep(b *testing.B, workers int) { benchGrid(b, workers, grid1000) }

func benchGrid(b *testing.B, workers int, grid func(*testing.B) (*design.Design, sweep.Grid)) {
	d, axes := grid(b)
	b.ReportAllocs()
	b.ResetTimer()
	n := 0
	for i := 0; i < b.N; i++ {
		sweep.Run(axes, workers, builder(d, axes, true), func(r sweep.Row) {
			if r.Evaluated {
				n++
			}
		})
	}
	b.ReportMetric(float64(1000*b.N)/b.Elapsed().Seconds(), "estimates/s")
	if n == 0 {
		b.Fatal("no point estimated")
	}
}

func BenchmarkSweep1000OneCore(b *testing.B) { benchSweep(b, 1) }
func BenchmarkSweep1000AllCores(b *testing.B) {
	benchSweep(b, runtime.GOMAXPROCS(0))
}

func BenchmarkSweep1000DesignsOneCore(b *testing.B) { benchGrid(b, 1, designs1000) }
func BenchmarkSweep1000DesignsAllCores(b *testing.B) {
	benchGrid(b, runtime.GOMAXPROCS(0), designs1000)
}

// One full cruise estimate through the command-line path (design variant
// build included), for comparison with airflow's BenchmarkEstimate*.
func BenchmarkEstimateWithVariant(b *testing.B) {
	d, _ := design.Parse(demo.Upright, "u.toml")
	vals := map[string]float64{"head.pitch": 0.0095}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		v, err := d.With(vals)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := evaluate(v, v.Case.Speed); err != nil {
			b.Fatal(err)
		}
	}
}
