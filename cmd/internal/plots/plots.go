package plots

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Series is one line: x and y in display units.
type Series struct {
	// Label names the line in the legend. In a figure keyed by design
	// (Chart.Designs) it names the line's kind ("head", "barrel"), drawn
	// once in grey in the kind's line style.
	Label  string
	X, Y   []float64
	Design int  // colour index
	Dashed bool // second fin set of a design
	Thin   bool // a band's edge: thin and dotted
	// Marks are points drawn as crosses (no line), such as where a curve
	// ends because no equilibrium exists beyond it.
	Marks bool
}

// Limit is a horizontal line across the curves: a wall temperature limit.
type Limit struct {
	Label  string // as the legend names it, such as "head limit 220 C"
	Value  float64
	Barrel bool // the barrel's limit, in its own colour and dashes
}

// Chart is one panel of curves with its limits.
type Chart struct {
	Title, XLabel, YLabel string
	// Designs names the designs by colour index. When given, the legend
	// keys each design's colour once and each line kind (a Series label)
	// once in its line style, instead of one entry per line.
	Designs []string
	Lines   []Series
	Limits  []Limit
}

// palette: dark, print-safe colours that stay distinct in grey.
var palette = []color.Color{
	color.RGBA{R: 0x1f, G: 0x4e, B: 0x9c, A: 0xff},
	color.RGBA{R: 0xc2, G: 0x41, B: 0x0c, A: 0xff},
	color.RGBA{R: 0x2f, G: 0x7d, B: 0x32, A: 0xff},
	color.RGBA{R: 0x6a, G: 0x1b, B: 0x9a, A: 0xff},
	color.RGBA{R: 0x5d, G: 0x40, B: 0x37, A: 0xff},
}

func colour(i int) color.Color { return palette[((i%len(palette))+len(palette))%len(palette)] }

// neutral draws a line kind in a legend keyed by design.
var neutral = color.Gray{Y: 0x30}

// limitStyle is the look of a limit line: the head's black in long dashes
// and dots, the barrel's grey in short dots, neither like a curve.
func limitStyle(barrel bool) draw.LineStyle {
	if barrel {
		return draw.LineStyle{Color: color.Gray{Y: 0x80}, Width: vg.Points(1.6), Dashes: []vg.Length{vg.Points(1.5), vg.Points(2.5)}}
	}
	return draw.LineStyle{Color: color.Black, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(9), vg.Points(2.5), vg.Points(1.5), vg.Points(2.5)}}
}

// key is one legend entry: a thumbnail and its words.
type key struct {
	label string
	thumb plot.Thumbnailer
}

// Figure is one or more plots stacked vertically, with one legend below
// them all: outside the plot areas, so no legend ever covers a curve.
type Figure struct {
	Plots  []*plot.Plot
	Width  vg.Length
	Height vg.Length
	// keys are the legend's groups (the designs, the line kinds and
	// limits), each laid out in its own columns
	keys [][]key
}

var (
	titleSize  = vg.Points(11)
	labelSize  = vg.Points(10)
	legendSize = vg.Points(9)
	thumbWidth = vg.Points(22)
	pad        = vg.Millimeter * 2
)

func newPlot(title, x, y string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font.Size = titleSize
	p.X.Label.Text = x
	p.Y.Label.Text = y
	p.X.Label.TextStyle.Font.Size = labelSize
	p.Y.Label.TextStyle.Font.Size = labelSize
	p.Add(plotter.NewGrid())
	return p
}

// newFigure finishes a figure: panels of the given height each, and the
// legend's height added below them.
func newFigure(ps []*plot.Plot, panel vg.Length, keys [][]key) *Figure {
	f := &Figure{Plots: ps, Width: 18 * vg.Centimeter, keys: keys}
	f.Height = vg.Length(len(ps))*panel + f.legendHeight(f.Width)
	return f
}

// line is a series drawn as a line (or crosses).
func line(s Series, c color.Color) (plot.Plotter, plot.Thumbnailer, error) {
	xy := make(plotter.XYs, len(s.X))
	for i := range s.X {
		if math.IsNaN(s.X[i]) || math.IsNaN(s.Y[i]) || math.IsInf(s.Y[i], 0) || math.IsInf(s.X[i], 0) {
			return nil, nil, fmt.Errorf("plots: %s has a non-finite point", s.Label)
		}
		xy[i].X, xy[i].Y = s.X[i], s.Y[i]
	}
	if s.Marks {
		sc, err := plotter.NewScatter(xy)
		if err != nil {
			return nil, nil, err
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: c, Radius: vg.Points(4.5), Shape: draw.CrossGlyph{}}
		return sc, sc, nil
	}
	l, err := plotter.NewLine(xy)
	if err != nil {
		return nil, nil, err
	}
	l.Color = c
	l.Width = vg.Points(1.8)
	if s.Dashed {
		l.Dashes = []vg.Length{vg.Points(6), vg.Points(3)}
	}
	if s.Thin {
		l.Width = vg.Points(0.8)
		l.Dashes = []vg.Length{vg.Points(1.5), vg.Points(2)}
	}
	return l, l, nil
}

// addLines adds the series to p and returns their legend: one entry per
// labelled series, or (keyed by design) one per design and one per kind.
func addLines(p *plot.Plot, ss []Series, designs []string) ([][]key, error) {
	var each, kinds []key
	seen := map[string]bool{}
	for _, s := range ss {
		if len(s.X) == 0 {
			continue
		}
		if len(s.X) != len(s.Y) {
			return nil, fmt.Errorf("plots: %s has %d x and %d y", s.Label, len(s.X), len(s.Y))
		}
		pl, th, err := line(s, colour(s.Design))
		if err != nil {
			return nil, err
		}
		p.Add(pl)
		if s.Label == "" {
			continue
		}
		if designs == nil {
			each = append(each, key{s.Label, th})
			continue
		}
		if !seen[s.Label] {
			seen[s.Label] = true
			_, th, _ := line(Series{X: s.X[:1], Y: s.Y[:1], Dashed: s.Dashed, Thin: s.Thin, Marks: s.Marks}, neutral)
			kinds = append(kinds, key{s.Label, th})
		}
	}
	if designs == nil {
		return [][]key{each}, nil
	}
	return [][]key{designKeys(designs, false), kinds}, nil
}

// designKeys are the designs' colours, as lines or as filled boxes.
func designKeys(designs []string, boxes bool) []key {
	var ks []key
	for i, n := range designs {
		if boxes {
			bc, _ := plotter.NewBarChart(plotter.Values{1}, 1)
			bc.Color, bc.LineStyle.Width = colour(i), 0
			ks = append(ks, key{n, bc})
			continue
		}
		l := &plotter.Line{XYs: plotter.XYs{{}}, LineStyle: draw.LineStyle{Color: colour(i), Width: vg.Points(1.8)}}
		ks = append(ks, key{n, l})
	}
	return ks
}

// March is the figure of the air temperature (top) and the local heat flux
// (bottom) along the air path of each design's fin sets. Where the
// entrance peak of the flux runs off its axis the flux panel says so.
func March(title, xLabel, tLabel, qLabel string, designs []string, temp, flux []Series) (*Figure, error) {
	a := newPlot(title, xLabel, tLabel)
	keys, err := addLines(a, temp, designs)
	if err != nil {
		return nil, err
	}
	b := newPlot("", xLabel, qLabel)
	if _, err := addLines(b, flux, designs); err != nil {
		return nil, err
	}
	a.X.Min, b.X.Min = 0, 0
	b.Y.Min = 0
	// the developing boundary layer makes the flux of the first, shortest
	// segments very large; cut the axis at twice the highest flux met
	// past the first quarter of the segments so the rest of the curve reads
	top := 0.0
	for _, s := range flux {
		for i := len(s.Y) / 4; i < len(s.Y); i++ {
			top = math.Max(top, s.Y[i])
		}
	}
	if peak := maxY(flux); top > 0 && peak > 2*top {
		b.Y.Max = 2 * top
		// say so over the panel: the entrance peak runs off it
		unit := ""
		if i, j := strings.LastIndex(qLabel, "("), strings.LastIndex(qLabel, ")"); i >= 0 && j > i {
			unit = " " + qLabel[i+1:j]
		}
		b.Title.Text = fmt.Sprintf("local heat flux, axis cut at %.3g%s (entrance peak %.3g%s)", b.Y.Max, unit, peak, unit)
		b.Title.TextStyle.Font.Size = labelSize
	}
	if b.X.Max < a.X.Max {
		b.X.Max = a.X.Max
	}
	a.X.Max = b.X.Max
	return newFigure([]*plot.Plot{a, b}, 9*vg.Centimeter, keys), nil
}

// maxY is the largest y of the series.
func maxY(ss []Series) float64 {
	m := 0.0
	for _, s := range ss {
		for _, y := range s.Y {
			m = math.Max(m, y)
		}
	}
	return m
}

// Curves is a figure of one panel of curves with their limits.
func Curves(ch Chart) (*Figure, error) {
	p := newPlot(ch.Title, ch.XLabel, ch.YLabel)
	keys, err := addLines(p, ch.Lines, ch.Designs)
	if err != nil {
		return nil, err
	}
	xmin, xmax := math.Inf(1), math.Inf(-1)
	for _, s := range ch.Lines {
		for _, x := range s.X {
			xmin, xmax = math.Min(xmin, x), math.Max(xmax, x)
		}
	}
	var lks []key
	for _, lm := range ch.Limits {
		if math.IsInf(xmin, 0) {
			break
		}
		if math.IsNaN(lm.Value) || math.IsInf(lm.Value, 0) {
			return nil, fmt.Errorf("plots: %s is not finite", lm.Label)
		}
		l, err := plotter.NewLine(plotter.XYs{{X: xmin, Y: lm.Value}, {X: xmax, Y: lm.Value}})
		if err != nil {
			return nil, err
		}
		l.LineStyle = limitStyle(lm.Barrel)
		p.Add(l)
		lks = append(lks, key{lm.Label, l})
	}
	if len(lks) > 0 {
		if ch.Designs == nil {
			keys[0] = append(keys[0], lks...)
		} else {
			keys[1] = append(keys[1], lks...)
		}
	}
	return newFigure([]*plot.Plot{p}, 10*vg.Centimeter, keys), nil
}

// Speeds is a figure of curves with each limit (by its label) drawn as a
// line: a label starting "barrel" is a barrel limit. The legend has an
// entry per labelled line.
func Speeds(title, xLabel, yLabel string, lines []Series, limits map[string]float64) (*Figure, error) {
	// in name order: a map's order would change the figure from run to run
	names := make([]string, 0, len(limits))
	for name := range limits {
		names = append(names, name)
	}
	sort.Strings(names)
	var ls []Limit
	for _, n := range names {
		ls = append(ls, Limit{Label: n, Value: limits[n], Barrel: strings.HasPrefix(n, "barrel")})
	}
	return Curves(Chart{Title: title, XLabel: xLabel, YLabel: yLabel, Lines: lines, Limits: ls})
}

// Compare is a figure of bar charts, one panel per quantity, one bar per
// design lettered A, B, ...; names label the designs' colours in the
// legend.
func Compare(title string, names []string, panels []Panel) (*Figure, error) {
	var ps []*plot.Plot
	var extra []key
	for k, pn := range panels {
		t := ""
		if k == 0 {
			t = title
		}
		p := newPlot(t, "", pn.Label)
		vals := make(plotter.Values, len(pn.Values))
		for i, v := range pn.Values {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("plots: %s of %s is not finite", pn.Label, names[i])
			}
			vals[i] = v
		}
		// one bar per design, in the design's colour (as in the other plots)
		for i, v := range vals {
			bc, err := plotter.NewBarChart(plotter.Values{v}, vg.Points(60))
			if err != nil {
				return nil, err
			}
			bc.XMin = float64(i)
			bc.Color = colour(i)
			bc.LineStyle.Width = 0
			p.Add(bc)
		}
		// each design's limit as a line across its bar
		for i, l := range pn.Limits {
			if math.IsNaN(l) || l <= 0 {
				continue
			}
			ln, err := plotter.NewLine(plotter.XYs{{X: float64(i) - 0.45, Y: l}, {X: float64(i) + 0.45, Y: l}})
			if err != nil {
				return nil, err
			}
			ln.LineStyle = limitStyle(false)
			p.Add(ln)
			if i == 0 && pn.LimitLabel != "" {
				extra = append(extra, key{pn.LimitLabel, ln})
			}
		}
		if len(pn.Low) == len(pn.Values) && len(pn.High) == len(pn.Values) {
			eb, err := whiskers(pn)
			if err != nil {
				return nil, err
			}
			p.Add(eb)
			if pn.BandLabel != "" {
				extra = append(extra, key{pn.BandLabel, whiskerKey{eb.LineStyle}})
			}
		}
		short := make([]string, len(names))
		for i := range names {
			short[i] = fmt.Sprintf("%c", 'A'+i)
		}
		p.NominalX(short...)
		p.X.Min, p.X.Max = -0.7, float64(len(names))-0.3
		p.Y.Min = 0
		// room above the tallest bar, whisker or limit: nothing clipped
		top := 0.0
		for i, v := range vals {
			top = math.Max(top, v)
			if i < len(pn.High) && !math.IsNaN(pn.High[i]) {
				top = math.Max(top, pn.High[i])
			}
			if i < len(pn.Limits) && !math.IsNaN(pn.Limits[i]) {
				top = math.Max(top, pn.Limits[i])
			}
		}
		p.Y.Max = 1.08 * top
		ps = append(ps, p)
	}
	keys := [][]key{designKeys(names, true)}
	if len(extra) > 0 {
		keys = append(keys, extra)
	}
	return newFigure(ps, 8*vg.Centimeter, keys), nil
}

// Panel is one bar-chart panel of Compare. Low and High, when given, are
// a band around each value (its 5th and 95th percentiles), drawn as a
// whisker; NaN leaves that end out (no equilibrium there).
type Panel struct {
	Label     string
	Values    []float64
	Low, High []float64
	Limits    []float64 // each design's limit, drawn across its bar (optional)
	// LimitLabel and BandLabel name the limit lines and the whiskers in
	// the legend (none when empty)
	LimitLabel, BandLabel string
}

// whiskers are a panel's bands as error bars on its bars.
func whiskers(pn Panel) (*plotter.YErrorBars, error) {
	var band struct {
		plotter.XYs
		plotter.YErrors
	}
	for i, v := range pn.Values {
		lo, hi := pn.Low[i], pn.High[i]
		if math.IsNaN(lo) || v == 0 {
			lo = v
		}
		if math.IsNaN(hi) || v == 0 {
			hi = v
		}
		band.XYs = append(band.XYs, plotter.XY{X: float64(i), Y: v})
		band.YErrors = append(band.YErrors, struct{ Low, High float64 }{math.Max(v-lo, 0), math.Max(hi-v, 0)})
	}
	eb, err := plotter.NewYErrorBars(band)
	if err != nil {
		return nil, err
	}
	eb.LineStyle.Width = vg.Points(1.2)
	eb.CapWidth = vg.Points(14)
	return eb, nil
}

// whiskerKey is the legend's thumbnail of a whisker: a vertical line with
// its caps.
type whiskerKey struct{ sty draw.LineStyle }

func (w whiskerKey) Thumbnail(c *draw.Canvas) {
	x := (c.Min.X + c.Max.X) / 2
	cw := vg.Points(4)
	c.StrokeLine2(w.sty, x, c.Min.Y, x, c.Max.Y)
	c.StrokeLine2(w.sty, x-cw, c.Min.Y, x+cw, c.Min.Y)
	c.StrokeLine2(w.sty, x-cw, c.Max.Y, x+cw, c.Max.Y)
}

// legendStyle is the legend's text.
func legendStyle() text.Style {
	sty := plot.NewLegend().TextStyle
	sty.Font.Size = legendSize
	return sty
}

// legendRow is the height of a legend line.
func legendRow() vg.Length { return legendStyle().FontExtents().Height * 1.25 }

// legendLayout places a group's entries in columns across width, down
// each column first; an entry too wide for the width wraps onto more lines,
// and then the group takes one column. It returns each entry's column and
// first line, the labels as drawn, the column width and the lines the
// group takes.
func legendLayout(g []key, width vg.Length) (col, line []int, labels []string, colWidth vg.Length, lines int) {
	sty := legendStyle()
	gap := sty.Width("m")
	room := width - 2*pad
	labels = make([]string, len(g))
	wrapped := false
	for i, k := range g {
		labels[i] = wrap(sty, k.label, room-thumbWidth-2*gap)
		wrapped = wrapped || labels[i] != k.label
		colWidth = max(colWidth, thumbWidth+gap+sty.Width(labels[i])+3*gap)
	}
	n := int(room / colWidth)
	if n < 1 || wrapped {
		n = 1
	}
	n = min(n, len(g))
	rows := (len(g) + n - 1) / n
	col, line = make([]int, len(g)), make([]int, len(g))
	at := 0
	for i := range g {
		if i%rows == 0 {
			at = 0
		}
		col[i], line[i] = i/rows, at
		at += strings.Count(labels[i], "\n") + 1
		lines = max(lines, at)
	}
	return col, line, labels, colWidth, lines
}

// legendHeight is the height of the strip the legend takes below the
// panels at the given figure width (0 with no entries).
func (f *Figure) legendHeight(width vg.Length) vg.Length {
	lines := 0
	for _, g := range f.keys {
		if len(g) > 0 {
			_, _, _, _, n := legendLayout(g, width)
			lines += n
		}
	}
	if lines == 0 {
		return 0
	}
	return vg.Length(lines)*legendRow() + 2*pad
}

// drawLegend draws the legend in c, a strip below the panels, and returns
// the rectangle it covers.
func (f *Figure) drawLegend(c draw.Canvas) vg.Rectangle {
	sty := legendStyle()
	sty.YAlign = draw.YTop
	row := legendRow()
	gap := sty.Width("m")
	y := c.Max.Y - pad
	box := vg.Rectangle{Min: vg.Point{X: c.Max.X, Y: c.Max.Y}, Max: vg.Point{X: c.Min.X, Y: c.Min.Y}}
	grow := func(r vg.Rectangle) {
		box.Min.X, box.Min.Y = min(box.Min.X, r.Min.X), min(box.Min.Y, r.Min.Y)
		box.Max.X, box.Max.Y = max(box.Max.X, r.Max.X), max(box.Max.Y, r.Max.Y)
	}
	for _, g := range f.keys {
		if len(g) == 0 {
			continue
		}
		col, line, labels, colWidth, lines := legendLayout(g, c.Max.X-c.Min.X)
		for i, k := range g {
			x := c.Min.X + pad + vg.Length(col[i])*colWidth
			top := y - vg.Length(line[i])*row
			mid := top - row/2
			tc := c
			tc.Rectangle = vg.Rectangle{Min: vg.Point{X: x, Y: mid - row*0.35}, Max: vg.Point{X: x + thumbWidth, Y: mid + row*0.35}}
			k.thumb.Thumbnail(&tc)
			grow(tc.Rectangle)
			tx := x + thumbWidth + gap
			// the first line's middle level with the thumbnail
			c.FillText(sty, vg.Point{X: tx, Y: top - (row-sty.FontExtents().Height)/2}, labels[i])
			grow(vg.Rectangle{Min: vg.Point{X: tx, Y: top - vg.Length(strings.Count(labels[i], "\n")+1)*row}, Max: vg.Point{X: tx + sty.Width(labels[i]), Y: top}})
		}
		y -= vg.Length(lines) * row
	}
	return box
}

// wrap breaks each line of s wider than width at spaces.
func wrap(sty text.Style, s string, width vg.Length) string {
	var out []string
	for _, ln := range strings.Split(s, "\n") {
		cur := ""
		for _, w := range strings.Split(ln, " ") {
			next := w
			if cur != "" {
				next = cur + " " + w
			}
			if cur != "" && sty.Width(next) > width {
				out = append(out, cur)
				next = w
			}
			cur = next
		}
		out = append(out, cur)
	}
	return strings.Join(out, "\n")
}

// Write renders the figure as "svg" or "png" to w.
func (f *Figure) Write(w io.Writer, format string) error {
	var c draw.Canvas
	var out io.WriterTo
	switch strings.ToLower(format) {
	case "svg":
		s := vgsvg.New(f.Width, f.Height)
		c, out = draw.New(s), s
	case "png":
		img := vgimg.NewWith(vgimg.UseWH(f.Width, f.Height), vgimg.UseDPI(150))
		c, out = draw.New(img), vgimg.PngCanvas{Canvas: img}
	default:
		return fmt.Errorf("plots: format %q: use svg or png", format)
	}
	f.draw(c, nil)
	_, err := out.WriteTo(w)
	return err
}

// draw draws the panels and the legend below them on c; mark, if not nil,
// is called between the two (the tests tell the legend's strokes apart).
// It returns the legend's rectangle.
func (f *Figure) draw(c draw.Canvas, mark func()) vg.Rectangle {
	legend := c
	legend.Max.Y = c.Min.Y + f.legendHeight(c.Max.X-c.Min.X)
	panels := c
	panels.Min.Y = legend.Max.Y
	rows := make([][]*plot.Plot, len(f.Plots))
	for i, p := range f.Plots {
		rows[i] = []*plot.Plot{p}
	}
	tiles := draw.Tiles{Rows: len(f.Plots), Cols: 1, PadY: vg.Millimeter * 4, PadTop: pad, PadBottom: pad, PadLeft: pad, PadRight: vg.Millimeter * 3}
	// titles wrap to the width (a little short of it: a viewer's
	// substitute font may run wider); axis labels longer than their axis
	// wrap too, then the panels are laid out again
	for _, p := range f.Plots {
		p.Title.Text = wrap(p.Title.TextStyle, p.Title.Text, 0.9*(c.Max.X-c.Min.X-2*pad))
		p.X.Label.Text = wrap(p.X.Label.TextStyle, p.X.Label.Text, 0.9*(c.Max.X-c.Min.X-2*pad))
	}
	canvases := plot.Align(rows, tiles, panels)
	relaid := false
	for i, p := range f.Plots {
		dc := p.DataCanvas(canvases[i][0])
		if l := 0.95 * (dc.Max.Y - dc.Min.Y); p.Y.Label.TextStyle.Width(p.Y.Label.Text) > l {
			p.Y.Label.Text = wrap(p.Y.Label.TextStyle, p.Y.Label.Text, l)
			relaid = true
		}
	}
	if relaid {
		canvases = plot.Align(rows, tiles, panels)
	}
	for i, p := range f.Plots {
		p.Draw(canvases[i][0])
	}
	if mark != nil {
		mark()
	}
	if legend.Max.Y <= legend.Min.Y {
		return vg.Rectangle{}
	}
	return f.drawLegend(legend)
}
