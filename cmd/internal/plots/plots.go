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
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Series is one line: x and y in display units.
type Series struct {
	Label  string
	X, Y   []float64
	Design int  // colour index
	Dashed bool // second fin set of a design
	Thin   bool // a band's edge: thin and dotted
	// Marks are points drawn as crosses (no line), such as where a curve
	// ends because no equilibrium exists beyond it.
	Marks bool
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

// Figure is one or more plots stacked vertically.
type Figure struct {
	Plots  []*plot.Plot
	Width  vg.Length
	Height vg.Length
}

func newPlot(title, x, y string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font.Size = vg.Points(11)
	p.X.Label.Text = x
	p.Y.Label.Text = y
	p.Add(plotter.NewGrid())
	p.Legend.Top = true
	p.Legend.Left = true
	p.Legend.XOffs = vg.Millimeter * 3
	p.Legend.TextStyle.Font.Size = vg.Points(9)
	return p
}

func addLines(p *plot.Plot, ss []Series) error {
	for _, s := range ss {
		if len(s.X) == 0 {
			continue
		}
		xy := make(plotter.XYs, len(s.X))
		for i := range s.X {
			if math.IsNaN(s.X[i]) || math.IsNaN(s.Y[i]) || math.IsInf(s.Y[i], 0) {
				return fmt.Errorf("plots: %s has a non-finite point", s.Label)
			}
			xy[i].X, xy[i].Y = s.X[i], s.Y[i]
		}
		if s.Marks {
			sc, err := plotter.NewScatter(xy)
			if err != nil {
				return err
			}
			sc.GlyphStyle = draw.GlyphStyle{Color: colour(s.Design), Radius: vg.Points(4.5), Shape: draw.CrossGlyph{}}
			p.Add(sc)
			if s.Label != "" {
				p.Legend.Add(s.Label, sc)
			}
			continue
		}
		l, err := plotter.NewLine(xy)
		if err != nil {
			return err
		}
		l.Color = colour(s.Design)
		l.Width = vg.Points(1.8)
		if s.Dashed {
			l.Dashes = []vg.Length{vg.Points(6), vg.Points(3)}
		}
		if s.Thin {
			l.Width = vg.Points(0.8)
			l.Dashes = []vg.Length{vg.Points(1.5), vg.Points(2)}
		}
		p.Add(l)
		if s.Label != "" {
			p.Legend.Add(s.Label, l)
		}
	}
	return nil
}

// March is the figure of the air temperature (top) and the local heat flux
// (bottom) along the air path of each design's fin sets.
func March(title, xLabel, tLabel, qLabel string, temp, flux []Series) (*Figure, error) {
	a := newPlot(title, xLabel, tLabel)
	if err := addLines(a, temp); err != nil {
		return nil, err
	}
	b := newPlot("", xLabel, qLabel)
	if err := addLines(b, flux); err != nil {
		return nil, err
	}
	// rising air temperature leaves the upper left free, falling flux
	// the upper right; both panels start at the path entry
	b.Legend.Left = false
	b.Legend.XOffs = -vg.Millimeter * 3
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
		// say so on the axis: the entrance peak runs off the panel
		b.Y.Label.Text += fmt.Sprintf(", cut at %.3g (entrance peak %.3g)", b.Y.Max, peak)
	}
	if b.X.Max < a.X.Max {
		b.X.Max = a.X.Max
	}
	a.X.Max = b.X.Max
	return &Figure{Plots: []*plot.Plot{a, b}, Width: 18 * vg.Centimeter, Height: 20 * vg.Centimeter}, nil
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

// Speeds is the figure of head and barrel temperature against road speed,
// with each limit drawn as a dotted line.
func Speeds(title, xLabel, tLabel string, lines []Series, limits map[string]float64) (*Figure, error) {
	p := newPlot(title, xLabel, tLabel)
	if err := addLines(p, lines); err != nil {
		return nil, err
	}
	xmin, xmax := math.Inf(1), math.Inf(-1)
	for _, s := range lines {
		for _, x := range s.X {
			xmin, xmax = math.Min(xmin, x), math.Max(xmax, x)
		}
	}
	// in name order: a map's order would change the figure from run to run
	names := make([]string, 0, len(limits))
	for name := range limits {
		names = append(names, name)
	}
	sort.Strings(names)
	for i, name := range names {
		v := limits[name]
		if math.IsInf(xmin, 0) {
			break
		}
		l, err := plotter.NewLine(plotter.XYs{{X: xmin, Y: v}, {X: xmax, Y: v}})
		if err != nil {
			return nil, err
		}
		l.Color = color.Gray{Y: 0x55}
		l.Dashes = []vg.Length{vg.Points(1.5), vg.Points(2.5)}
		l.Width = vg.Points(1.4 - 0.4*float64(i))
		p.Add(l)
		p.Legend.Add(name, l)
	}
	return &Figure{Plots: []*plot.Plot{p}, Width: 18 * vg.Centimeter, Height: 11 * vg.Centimeter}, nil
}

// Compare is a figure of bar charts, one panel per quantity, one bar per
// design.
func Compare(title string, names []string, panels []Panel) (*Figure, error) {
	var ps []*plot.Plot
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
		// each design's limit as a dashed line across its bar
		for i, l := range pn.Limits {
			if math.IsNaN(l) || l <= 0 {
				continue
			}
			ln, err := plotter.NewLine(plotter.XYs{{X: float64(i) - 0.45, Y: l}, {X: float64(i) + 0.45, Y: l}})
			if err != nil {
				return nil, err
			}
			ln.Color = color.Gray{Y: 0x33}
			ln.Dashes = []vg.Length{vg.Points(3), vg.Points(2)}
			ln.Width = vg.Points(1.5)
			p.Add(ln)
			if i == 0 {
				p.Legend.Add("limit", ln)
			}
		}
		if len(pn.Low) == len(pn.Values) && len(pn.High) == len(pn.Values) {
			eb, err := whiskers(pn)
			if err != nil {
				return nil, err
			}
			p.Add(eb)
		}
		// bars are lettered A, B, ... as in the comparison table; the
		// caller's caption names them
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
		p.Legend.Top = false
		ps = append(ps, p)
	}
	return &Figure{Plots: ps, Width: 18 * vg.Centimeter, Height: vg.Length(len(ps)) * 8 * vg.Centimeter}, nil
}

// Panel is one bar-chart panel of Compare. Low and High, when given, are
// a band around each value (its 5th and 95th percentiles), drawn as a
// whisker; NaN leaves that end out (no equilibrium there).
type Panel struct {
	Label     string
	Values    []float64
	Low, High []float64
	Limits    []float64 // each design's limit, drawn across its bar (optional)
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
	rows := make([][]*plot.Plot, len(f.Plots))
	for i, p := range f.Plots {
		rows[i] = []*plot.Plot{p}
	}
	tiles := draw.Tiles{Rows: len(f.Plots), Cols: 1, PadY: vg.Millimeter * 4, PadTop: vg.Millimeter * 2, PadBottom: vg.Millimeter * 2, PadLeft: vg.Millimeter * 2, PadRight: vg.Millimeter * 3}
	canvases := plot.Align(rows, tiles, c)
	for i, p := range f.Plots {
		p.Draw(canvases[i][0])
	}
	_, err := out.WriteTo(w)
	return err
}
