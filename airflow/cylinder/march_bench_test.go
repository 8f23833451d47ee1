package cylinder

import "testing"

// One full 40-segment march of the upright head with its efficiency curve
// filled: the unit the wall balance repeats.
func BenchmarkMarch(b *testing.B) {
	c := demoCase(b, false)
	p, err := c.prepare(Settings{Method: MethodChannel}, nil)
	if err != nil {
		b.Fatal(err)
	}
	st := &p.sets[head]
	p.setHeat(st, 480, c.Ambient, false)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		p.march(st, 480+float64(i&1)*1e-3, c.Ambient, false)
	}
}
