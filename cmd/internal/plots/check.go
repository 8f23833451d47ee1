package plots

import (
	"errors"
	"fmt"
	"image"
	"image/color"
	"math"
	"strings"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Check draws the figure on a recording canvas and reports what a reader
// would see as broken: a text that leaves the canvas (a clipped title or
// axis label), two texts that overlap, or a line, bar or text of a panel (a
// curve, a limit, the grid) that crosses the legend. The figures of every
// command are held to it in the tests.
func (f *Figure) Check() error { return f.record().problems() }

// problems are what Check reports of a recorded drawing.
func (r *recorder) problems() error {
	var errs []string
	in := func(b vg.Rectangle) bool {
		const tol = 0.5
		return b.Min.X >= -tol && b.Min.Y >= -tol && b.Max.X <= r.w+tol && b.Max.Y <= r.h+tol
	}
	for _, t := range r.texts {
		if !in(t.box) {
			errs = append(errs, fmt.Sprintf("text %q at x %.1f to %.1f, y %.1f to %.1f leaves the %.1f by %.1f canvas",
				t.s, t.box.Min.X, t.box.Max.X, t.box.Min.Y, t.box.Max.Y, r.w, r.h))
		}
	}
	for i, a := range r.texts {
		for _, b := range r.texts[i+1:] {
			if overlap(a.core, b.core, 0.5) {
				errs = append(errs, fmt.Sprintf("texts %q and %q overlap", a.s, b.s))
			}
		}
	}
	if r.legend.Max.X > r.legend.Min.X {
		for _, p := range r.marks {
			if p.legend {
				continue
			}
			for k := 1; k < len(p.pts); k++ {
				if crosses(p.pts[k-1], p.pts[k], r.legend) {
					errs = append(errs, fmt.Sprintf("a line drawn in %v crosses the legend at %v to %v", p.c, p.pts[k-1], p.pts[k]))
					break
				}
			}
		}
		for _, t := range r.texts {
			if !t.legend && overlap(t.core, r.legend, 0) {
				errs = append(errs, fmt.Sprintf("text %q lies on the legend", t.s))
			}
		}
	}
	if len(errs) > 0 {
		if len(errs) > 12 {
			errs = append(errs[:12], fmt.Sprintf("and %d more", len(errs)-12))
		}
		return errors.New("plots: " + strings.Join(errs, "; "))
	}
	return nil
}

// Legend lists the legend's entries, group by group, as "label" lines.
func (f *Figure) Legend() [][]string {
	var out [][]string
	for _, g := range f.keys {
		var ls []string
		for _, k := range g {
			ls = append(ls, k.label)
		}
		out = append(out, ls)
	}
	return out
}

// record draws the figure on a recorder.
func (f *Figure) record() *recorder {
	r := &recorder{w: f.Width, h: f.Height, m: [6]float64{1, 0, 0, 1, 0, 0}}
	r.legend = f.draw(draw.New(r), func() { r.inLegend = true })
	return r
}

// recorder is a vg.Canvas that keeps, in canvas coordinates, every text's
// box and every stroked or filled path's points with its colour and
// dashes, marking those drawn for the legend.
type recorder struct {
	w, h     vg.Length
	m        [6]float64 // x' = m0 x + m2 y + m4, y' = m1 x + m3 y + m5
	stack    [][6]float64
	c        color.Color
	dash     []vg.Length
	width    vg.Length
	inLegend bool
	legend   vg.Rectangle
	texts    []drawnText
	marks    []drawnPath
}

type drawnText struct {
	s      string
	box    vg.Rectangle // the font's extents
	core   vg.Rectangle // the letters' core
	legend bool
}

type drawnPath struct {
	pts    []vg.Point
	c      color.Color
	dash   []vg.Length
	width  vg.Length
	fill   bool
	legend bool
}

func (r *recorder) Size() (vg.Length, vg.Length)           { return r.w, r.h }
func (r *recorder) SetLineWidth(w vg.Length)               { r.width = w }
func (r *recorder) SetLineDash(d []vg.Length, _ vg.Length) { r.dash = append([]vg.Length(nil), d...) }
func (r *recorder) SetColor(c color.Color)                 { r.c = c }
func (r *recorder) Push()                                  { r.stack = append(r.stack, r.m) }
func (r *recorder) Pop() {
	r.m = r.stack[len(r.stack)-1]
	r.stack = r.stack[:len(r.stack)-1]
}

// then makes t apply before the present transform.
func (r *recorder) then(t [6]float64) {
	m := r.m
	r.m = [6]float64{
		m[0]*t[0] + m[2]*t[1], m[1]*t[0] + m[3]*t[1],
		m[0]*t[2] + m[2]*t[3], m[1]*t[2] + m[3]*t[3],
		m[0]*t[4] + m[2]*t[5] + m[4], m[1]*t[4] + m[3]*t[5] + m[5],
	}
}

func (r *recorder) Rotate(a float64) {
	s, c := math.Sincos(a)
	r.then([6]float64{c, s, -s, c, 0, 0})
}
func (r *recorder) Translate(p vg.Point) { r.then([6]float64{1, 0, 0, 1, float64(p.X), float64(p.Y)}) }
func (r *recorder) Scale(x, y float64)   { r.then([6]float64{x, 0, 0, y, 0, 0}) }

func (r *recorder) at(p vg.Point) vg.Point {
	x, y := float64(p.X), float64(p.Y)
	return vg.Point{X: vg.Length(r.m[0]*x + r.m[2]*y + r.m[4]), Y: vg.Length(r.m[1]*x + r.m[3]*y + r.m[5])}
}

func (r *recorder) path(p vg.Path, fill bool) {
	d := drawnPath{c: r.c, dash: r.dash, width: r.width, fill: fill, legend: r.inLegend}
	for _, pc := range p {
		switch pc.Type {
		case vg.MoveComp, vg.LineComp:
			d.pts = append(d.pts, r.at(pc.Pos))
		case vg.ArcComp:
			for k := 0; k <= 8; k++ {
				a := pc.Start + pc.Angle*float64(k)/8
				d.pts = append(d.pts, r.at(vg.Point{X: pc.Pos.X + pc.Radius*vg.Length(math.Cos(a)), Y: pc.Pos.Y + pc.Radius*vg.Length(math.Sin(a))}))
			}
		case vg.CurveComp:
			d.pts = append(d.pts, r.at(pc.Pos))
		case vg.CloseComp:
			if len(d.pts) > 0 {
				d.pts = append(d.pts, d.pts[0])
			}
		}
	}
	r.marks = append(r.marks, d)
}

func (r *recorder) Stroke(p vg.Path) { r.path(p, false) }
func (r *recorder) Fill(p vg.Path)   { r.path(p, true) }

func (r *recorder) FillString(f font.Face, pt vg.Point, s string) {
	e := f.Extents()
	w := f.Width(s)
	box := vg.Rectangle{Min: vg.Point{X: math.MaxFloat64, Y: math.MaxFloat64}, Max: vg.Point{X: -math.MaxFloat64, Y: -math.MaxFloat64}}
	for _, c := range []vg.Point{{X: pt.X, Y: pt.Y - e.Descent}, {X: pt.X + w, Y: pt.Y - e.Descent}, {X: pt.X, Y: pt.Y + e.Ascent}, {X: pt.X + w, Y: pt.Y + e.Ascent}} {
		q := r.at(c)
		box.Min.X, box.Min.Y = min(box.Min.X, q.X), min(box.Min.Y, q.Y)
		box.Max.X, box.Max.Y = max(box.Max.X, q.X), max(box.Max.Y, q.Y)
	}
	// the letters' core, from below the baseline to the top of the capitals,
	// for overlaps: the extents of the lines of one text touch
	em := f.Font.Size
	core := vg.Rectangle{Min: vg.Point{X: math.MaxFloat64, Y: math.MaxFloat64}, Max: vg.Point{X: -math.MaxFloat64, Y: -math.MaxFloat64}}
	for _, c := range []vg.Point{{X: pt.X, Y: pt.Y - em/5}, {X: pt.X + w, Y: pt.Y - em/5}, {X: pt.X, Y: pt.Y + em*7/10}, {X: pt.X + w, Y: pt.Y + em*7/10}} {
		q := r.at(c)
		core.Min.X, core.Min.Y = min(core.Min.X, q.X), min(core.Min.Y, q.Y)
		core.Max.X, core.Max.Y = max(core.Max.X, q.X), max(core.Max.Y, q.Y)
	}
	r.texts = append(r.texts, drawnText{s: s, box: box, core: core, legend: r.inLegend})
}

func (r *recorder) DrawImage(vg.Rectangle, image.Image) {}

// overlap says whether a and b share more than tol in both directions.
func overlap(a, b vg.Rectangle, tol vg.Length) bool {
	return min(a.Max.X, b.Max.X)-max(a.Min.X, b.Min.X) > tol && min(a.Max.Y, b.Max.Y)-max(a.Min.Y, b.Min.Y) > tol
}

// crosses says whether the segment from p to q passes through the
// rectangle (Liang and Barsky's clipping).
func crosses(p, q vg.Point, b vg.Rectangle) bool {
	t0, t1 := 0.0, 1.0
	dx, dy := float64(q.X-p.X), float64(q.Y-p.Y)
	for _, e := range [4][2]float64{
		{-dx, float64(p.X - b.Min.X)}, {dx, float64(b.Max.X - p.X)},
		{-dy, float64(p.Y - b.Min.Y)}, {dy, float64(b.Max.Y - p.Y)},
	} {
		pp, qq := e[0], e[1]
		if pp == 0 {
			if qq < 0 {
				return false
			}
			continue
		}
		t := qq / pp
		if pp < 0 {
			t0 = math.Max(t0, t)
		} else {
			t1 = math.Min(t1, t)
		}
		if t0 > t1 {
			return false
		}
	}
	return true
}
