package plots

import (
	"bytes"
	"math"
	"strings"
	"testing"
)

// A panel's band is drawn as whiskers reaching the 5th and 95th
// percentiles from the bar's top; an end without an equilibrium (NaN) and a
// bar without one (0) draw nothing past the bar.
func TestWhiskers(t *testing.T) {
	pn := Panel{Label: "head", Values: []float64{200, 250, 0}, Low: []float64{150, 180, math.NaN()}, High: []float64{300, math.NaN(), math.NaN()}}
	eb, err := whiskers(pn)
	if err != nil {
		t.Fatal(err)
	}
	want := [][2]float64{{50, 100}, {70, 0}, {0, 0}}
	for i, w := range want {
		if lo, hi := eb.YErrors[i].Low, eb.YErrors[i].High; lo != w[0] || hi != w[1] {
			t.Errorf("bar %d: whisker -%g +%g, want -%g +%g", i, lo, hi, w[0], w[1])
		}
	}
	pn.Limits = []float64{220, 220, 320}
	f, err := Compare("t", []string{"a", "b", "c"}, []Panel{pn})
	if err != nil {
		t.Fatal(err)
	}
	// the axis reaches past the tallest of bars, whiskers and limits
	if y := f.Plots[0].Y.Max; !(y >= 320) {
		t.Errorf("axis top %g clips the 320 limit", y)
	}
	var b bytes.Buffer
	if err := f.Write(&b, "svg"); err != nil || !strings.Contains(b.String(), "<svg") {
		t.Errorf("svg: %v", err)
	}
}
