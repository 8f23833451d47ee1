package optimise

import (
	"testing"

	"finmarch/airflow/internal/demotest"
	"finmarch/fins"
)

// The search's coordinates reach every design the fin variables would: on
// the upright demo's head with die-casting limits and a 0.5 mm step, every
// pitch, height, root and tip on the step within a box, and every count
// from 1 to as many as fit, that keeps the casting limits maps to search
// coordinates within their bounds that map back to the same design; and
// no coordinates map to a design outside the box, past a casting limit,
// or with more fins than fit.
func TestCoordsReachEveryCastableDesign(t *testing.T) {
	d := demotest.Upright(t)
	proc, _ := fins.LookupProcess("die-casting")
	s := d.Case.Head.Set
	vars := DefaultVars(s, proc)
	vars[0].Lo, vars[0].Hi = 0.0055, 0.009
	vars[1].Lo, vars[1].Hi = 0.020, 0.035
	vars[2].Lo, vars[2].Hi = 0.0015, 0.004
	vars[3].Lo, vars[3].Hi = 0.0015, 0.003
	FitCount(vars, s)
	m := setMap{base: s, vars: vars, proc: proc, step: 0.0005}
	lo, hi, _ := m.bounds()
	reached := 0
	for p := 11.0; p <= 18; p++ {
		for h := 40.0; h <= 70; h++ {
			for r := 3.0; r <= 8; r++ {
				for tt := 3.0; tt <= 6 && tt <= r; tt++ {
					q := s
					q.Pitch, q.Height, q.RootThickness, q.TipThickness = m.length(p), m.length(h), m.length(r), m.length(tt)
					if !proc.Feasible(q) {
						continue
					}
					for n := 1; n <= min(int(vars[4].Hi), q.Fitting()); n++ {
						x := []float64{q.Pitch, q.Height, q.RootThickness, q.TipThickness, float64(n)}
						z := m.z(x)
						for i := range z {
							if z[i] < lo[i] || z[i] > hi[i] {
								t.Fatalf("%v maps to %v, outside %v to %v", x, z, lo, hi)
							}
						}
						y, ok := m.x(z)
						if !ok || y[0] != x[0] || y[1] != x[1] || y[2] != x[2] || y[3] != x[3] || y[4] != x[4] {
							t.Fatalf("%v maps to %v and back to %v (%v)", x, z, y, ok)
						}
						reached++
					}
				}
			}
		}
	}
	if reached < 1000 {
		t.Fatalf("only %d designs checked", reached)
	}
	// every point of the coordinates' box maps to a castable design in
	// the bounds, or is refused
	mapped := 0
	for a := lo[0]; a <= hi[0]; a++ {
		for b := lo[1]; b <= hi[1]; b += 3 {
			for r := lo[2]; r <= hi[2]; r++ {
				for tt := lo[3]; tt <= hi[3]; tt++ {
					for k := lo[4]; k <= hi[4]; k += 2 {
						x, ok := m.x([]float64{a, b, r, tt, k})
						if !ok {
							continue
						}
						q := s
						q.Pitch, q.Height, q.RootThickness, q.TipThickness, q.Count = x[0], x[1], x[2], x[3], int(x[4])
						for i, v := range vars {
							if x[i] < v.Lo-1e-12 || x[i] > v.Hi+1e-12 {
								t.Fatalf("%v outside the %s bounds", x, v.Name)
							}
						}
						if !proc.Feasible(q) || q.Count > q.Fitting() {
							t.Fatalf("%v breaks a casting limit or does not fit: %+v", x, proc.Check(q))
						}
						mapped++
					}
				}
			}
		}
	}
	if mapped < 100 {
		t.Fatalf("only %d coordinates mapped", mapped)
	}
	t.Logf("%d designs reached, %d coordinates mapped", reached, mapped)
}
