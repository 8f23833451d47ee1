package airflow

import "testing"

// One full 40-segment march of the upright head with its efficiency curve
// filled: the unit the wall balance repeats.
func BenchmarkMarch(b *testing.B) {
	c := demoCase(b, false)
	p, err := c.prepare(nil)
	if err != nil {
		b.Fatal(err)
	}
	p.setHeat(c.Head, p.hg, p.hc, p.hp, 480, c.Ambient, p.hm, false)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		p.march(c.Head, p.hg, p.hc, p.hp, 480+float64(i&1)*1e-3, c.Ambient, p.hm, false)
	}
}
