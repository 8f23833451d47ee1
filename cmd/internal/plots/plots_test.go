package plots

import (
	"bytes"
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
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

// crowded is a chart whose curves fill the data area corner to corner and
// edge to edge (where an inside legend would have to sit on one of them),
// with three designs of five line kinds each and three limits.
func crowded(designs []string) Chart {
	var ls []Series
	for i := 0; i < 3; i++ {
		o := float64(i) * 10
		ls = append(ls,
			Series{Label: "head", Design: i, X: []float64{0, 50, 100}, Y: []float64{400 - o, 100, 400 - o}},
			Series{Label: "barrel", Design: i, Dashed: true, X: []float64{0, 100}, Y: []float64{50 + o, 390 - o}},
			Series{Label: "head, 5 % and 95 %", Design: i, Thin: true, X: []float64{0, 100}, Y: []float64{400 - o, 60 + o}},
			Series{Design: i, Thin: true, X: []float64{0, 100}, Y: []float64{380 - o, 40 + o}},
			Series{Label: "no equilibrium beyond", Design: i, Marks: true, X: []float64{100}, Y: []float64{400 - o}},
		)
	}
	if designs == nil {
		for k := range ls {
			if ls[k].Label != "" {
				ls[k].Label = fmt.Sprintf("%c %s", 'A'+ls[k].Design, ls[k].Label)
			}
		}
	}
	return Chart{Title: "Wall temperature against road speed", XLabel: "road speed (km/h)", YLabel: "wall temperature at the fin roots (C)",
		Designs: designs, Lines: ls,
		Limits: []Limit{{Label: "head limit 220 C", Value: 220}, {Label: "head limit 230 C (C)", Value: 230}, {Label: "barrel limit 250 C", Value: 250, Barrel: true}}}
}

// The legend sits below the panels, where no curve, limit, grid line or
// axis text passes, whether it keys every line (15 entries here) or each
// design and line kind once; and the check that says so fails when the
// legend is put over the curves.
func TestLegendOffTheCurves(t *testing.T) {
	for _, designs := range [][]string{nil, {"A: first design", "B: second design", "C: third design"}} {
		f, err := Curves(crowded(designs))
		if err != nil {
			t.Fatal(err)
		}
		if err := f.Check(); err != nil {
			t.Errorf("designs %v: %v", designs, err)
		}
		n := 0
		for _, g := range f.Legend() {
			n += len(g)
		}
		want := 3*4 + 3 // every labelled line and the limits
		if designs != nil {
			want = 3 + 4 + 3 // each design, each line kind and each limit once
		}
		if n != want {
			t.Errorf("designs %v: %d legend entries, want %d: %v", designs, n, want, f.Legend())
		}
		// the same drawing with the legend's rectangle moved onto the
		// data area must fail the check
		r := f.record()
		if r.legend.Max.Y <= r.legend.Min.Y {
			t.Fatal("no legend drawn")
		}
		h := r.legend.Max.Y - r.legend.Min.Y
		r.legend.Min.Y, r.legend.Max.Y = f.Height/2, f.Height/2+h
		if r.problems() == nil {
			t.Errorf("designs %v: a legend over the curves passes the check", designs)
		}
	}
}

// The head's and the barrel's limits differ in colour and dashes, in the
// legend and as drawn across the panel, and neither looks like a curve.
func TestLimitStyles(t *testing.T) {
	f, err := Curves(crowded([]string{"A", "B", "C"}))
	if err != nil {
		t.Fatal(err)
	}
	styles := map[string]draw.LineStyle{}
	for _, g := range f.keys {
		for _, k := range g {
			if l, ok := k.thumb.(*plotter.Line); ok {
				styles[k.label] = l.LineStyle
			}
		}
	}
	h, okh := styles["head limit 220 C"]
	b, okb := styles["barrel limit 250 C"]
	if !okh || !okb {
		t.Fatalf("the legend lacks the limits: %v", f.Legend())
	}
	if h.Color == b.Color || fmt.Sprint(h.Dashes) == fmt.Sprint(b.Dashes) {
		t.Errorf("head limit %v and barrel limit %v look alike", h, b)
	}
	for _, s := range []draw.LineStyle{h, b} {
		for _, c := range palette {
			if s.Color == c {
				t.Errorf("a limit is drawn in a design's colour %v", c)
			}
		}
	}
	// across the panel: long horizontal strokes in each limit's style
	r := f.record()
	found := map[string]int{}
	for _, p := range r.marks {
		if p.legend || p.fill || len(p.pts) != 2 || p.pts[0].Y != p.pts[1].Y || p.pts[1].X-p.pts[0].X < f.Width/2 {
			continue
		}
		for name, s := range map[string]draw.LineStyle{"head": h, "barrel": b} {
			if p.c == s.Color && fmt.Sprint(p.dash) == fmt.Sprint(s.Dashes) {
				found[name]++
			}
		}
	}
	if found["head"] != 2 || found["barrel"] != 1 {
		t.Errorf("limit lines drawn across the panel: %v, want 2 head and 1 barrel", found)
	}
}

// Titles and axis labels too long for the figure wrap, so every text
// stays on the canvas; a word too long to wrap is caught by the check.
func TestTextsOnTheCanvas(t *testing.T) {
	long := strings.Repeat("a design with a long name ", 8)
	ch := crowded([]string{"A: " + long, "B: short", "C: " + long})
	ch.Title = "Wall temperature against road speed: " + long
	ch.YLabel = "wall temperature at the fin roots, read at the hottest fin of the set (C)"
	f, err := Curves(ch)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Check(); err != nil {
		t.Error(err)
	}
	if !strings.Contains(f.Plots[0].Title.Text, "\n") || !strings.Contains(f.Plots[0].Y.Label.Text, "\n") {
		t.Errorf("long title or axis label not wrapped: %q, %q", f.Plots[0].Title.Text, f.Plots[0].Y.Label.Text)
	}
	names := []string{"A: " + long, "B: " + long, "C: " + long, "D: four", "E: five"}
	c, err := Compare("Designs, each at its own cruise speed", names, []Panel{{Label: "head temperature (C)", Values: []float64{200, 210, 190, 230, 250}, Limits: []float64{220, 220, 220, 220, 220}, LimitLabel: "head limit of each design"}})
	if err != nil {
		t.Fatal(err)
	}
	if err := c.Check(); err != nil {
		t.Error(err)
	}
	ch.Title = strings.Repeat("x", 300)
	if f, err = Curves(ch); err != nil {
		t.Fatal(err)
	}
	if err := f.Check(); err == nil || !strings.Contains(err.Error(), "leaves the") {
		t.Errorf("a title wider than the canvas passes the check: %v", err)
	}
}

// The flux panel of the march says where its axis is cut, with the unit.
func TestMarchCutSaysSo(t *testing.T) {
	x := []float64{1, 2, 3, 4, 5, 6, 7, 8}
	q := []float64{100, 20, 9, 8, 7, 6, 5, 4}
	f, err := March("t", "position (mm)", "air (C)", "local heat flux (kW/m2)", []string{"A: one"},
		[]Series{{Label: "head", X: x, Y: x}}, []Series{{Label: "head", X: x, Y: q}})
	if err != nil {
		t.Fatal(err)
	}
	if got := f.Plots[1].Title.Text; got != "local heat flux, axis cut at 18 kW/m2 (entrance peak 100 kW/m2)" {
		t.Errorf("flux panel title %q", got)
	}
	if err := f.Check(); err != nil {
		t.Error(err)
	}
}

// Segments through, into, beside and along the edge of a rectangle.
func TestCrosses(t *testing.T) {
	b := vg.Rectangle{Min: vg.Point{X: 10, Y: 10}, Max: vg.Point{X: 20, Y: 20}}
	for _, c := range []struct {
		p, q vg.Point
		want bool
	}{
		{vg.Point{X: 0, Y: 15}, vg.Point{X: 30, Y: 15}, true},  // straight through
		{vg.Point{X: 15, Y: 15}, vg.Point{X: 16, Y: 16}, true}, // inside
		{vg.Point{X: 0, Y: 0}, vg.Point{X: 30, Y: 30}, true},   // the diagonal
		{vg.Point{X: 0, Y: 25}, vg.Point{X: 30, Y: 25}, false}, // above
		{vg.Point{X: 0, Y: 0}, vg.Point{X: 9, Y: 30}, false},   // left of it
		{vg.Point{X: 0, Y: 18}, vg.Point{X: 8, Y: 30}, false},  // towards it, short of it
	} {
		if got := crosses(c.p, c.q, b); got != c.want {
			t.Errorf("%v to %v: crosses %v, want %v", c.p, c.q, got, c.want)
		}
	}
}
