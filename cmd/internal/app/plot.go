package app

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"sort"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/cmd/internal/plots"
)

// designsOrDemo loads the named designs, or the built-in demo designs when
// none is named.
func (e *env) designsOrDemo(args []string) ([]*design.Design, error) {
	var ds []*design.Design
	if len(args) == 0 {
		for _, f := range demo.Files {
			d, err := e.parse(f.Src, f.Name)
			if err != nil {
				return nil, internal(err)
			}
			ds = append(ds, d)
		}
		return ds, nil
	}
	return e.loadAll(args)
}

// loadAll reads and checks each named design file.
func (e *env) loadAll(args []string) ([]*design.Design, error) {
	var ds []*design.Design
	for _, a := range args {
		d, err := e.load(a)
		if err != nil {
			return nil, err
		}
		ds = append(ds, d)
	}
	return ds, nil
}

func (e *env) plotCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "plot",
		Short: "Draw figures (SVG or PNG by the --output extension): march, speeds, compare, ride, fan",
		Long: `plot draws a figure to the --output file; its extension (.svg or .png) picks the
format. With no design files it uses the built-in demo designs.

  finmarch plot march -o march.svg                 air temperature and local heat flux along the path
  finmarch plot speeds my.toml -o speeds.png        head and barrel temperature against road speed, with the limits
  finmarch plot compare a.toml b.toml -o cmp.svg    head temperature and heat per mass of fin, design by design
  finmarch plot ride my.toml -o ride.png            head and barrel temperature through a ride (--profile), with the limits
  finmarch plot fan scooter.toml -o fan.svg         a fan-cooled design: the fan's curve against the shroud and fins`,
	}
	var from, to, step string
	march := e.figureCmd("march [DESIGN.toml ...]", "Air temperature and local heat flux along the fin passages", e.marchFigure)
	speeds := &cobra.Command{
		Use: "speeds [DESIGN.toml ...]", Short: "Head and barrel temperature against road speed, with the limits",
		ValidArgsFunction: tomlArgs,
		RunE: func(c *cobra.Command, args []string) error {
			ds, err := e.designsOrDemo(args)
			if err != nil {
				return err
			}
			from, to, step := usRoadRange(c, e.opt.units, from, to, step, "5 mph")
			v, err := parseSpeedRange(from, to, step)
			if err != nil {
				return err
			}
			if !(v[0] >= 0 && v[1] > v[0] && v[2] > 0) || (v[1]-v[0])/v[2] > 400 {
				return fail(ExitUsage, fmt.Errorf("speed range %s to %s by %s: need 0 <= from < to, a positive step, at most 400 points", from, to, step))
			}
			fig, err := e.speedFigure(ds, v[0], v[1], v[2])
			if err != nil {
				return err
			}
			return e.writeFigure(fig)
		},
	}
	speeds.Flags().StringVar(&from, "from", "0 km/h", "lowest road speed (0: the engine at idle, as the speeds table starts)")
	speeds.Flags().StringVar(&to, "to", "140 km/h", "highest road speed (with --units us, 90 mph)")
	speeds.Flags().StringVar(&step, "step", "5 km/h", "speed step (with --units us, 5 mph)")
	compare := e.figureCmd("compare [DESIGN.toml ...]", "Head temperature and heat rejected per mass of fin, design by design", e.compareFigure)
	cmd.AddCommand(march, speeds, compare, e.rideFigureCmd(), e.fanFigureCmd())
	return cmd
}

// figureCmd builds a plot subcommand that draws make's figure of the named
// designs (or the demo).
func (e *env) figureCmd(use, short string, make func([]*design.Design) (*plots.Figure, error)) *cobra.Command {
	return &cobra.Command{
		Use: use, Short: short, ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			ds, err := e.designsOrDemo(args)
			if err != nil {
				return err
			}
			fig, err := make(ds)
			if err != nil {
				return err
			}
			return e.writeFigure(fig)
		},
	}
}

func (e *env) writeFigure(fig *plots.Figure) error {
	if e.opt.out == "" {
		return fail(ExitUsage, fmt.Errorf("plot needs --output FILE.svg or FILE.png"))
	}
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(e.opt.out)), ".")
	if ext != "svg" && ext != "png" {
		return fail(ExitUsage, fmt.Errorf("--output %s: the extension must be .svg or .png", e.opt.out))
	}
	var buf bytes.Buffer
	if err := fig.Write(&buf, ext); err != nil {
		return fail(ExitInternal, err)
	}
	if err := e.write(e.opt.out, buf.Bytes()); err != nil {
		return err
	}
	fmt.Fprintf(e.stdout, "wrote %s\n", e.opt.out)
	return nil
}

func letter(i int) string { return string(rune('A' + i)) }

// short cuts a design name for a figure title.
func short(s string) string {
	r := []rune(s)
	if len(r) > 44 {
		return string(r[:43]) + "…"
	}
	return s
}

// marchFigure evaluates each design at its cruise point and draws the air
// temperature and the local heat flux along each fin set's path; on a
// series path the barrel continues where the head ends. The march is the
// channel method's, whatever the design's own method (a free-stream method
// has a mean coefficient, not a path). The legend keys each design's
// colour once, with its fin styles, and the head and barrel lines once.
func (e *env) marchFigure(ds []*design.Design) (*plots.Figure, error) {
	_, u, err := e.settings()
	if err != nil {
		return nil, err
	}
	var temp, flux []plots.Series
	var names []string
	for i, d := range ds {
		ch := *d
		ch.Run.Method = cylinder.MethodChannel
		o, err := evaluate(&ch, d.Case.Speed)
		if err != nil {
			return nil, err
		}
		var sets []string
		for k, s := range []cylinder.SetResult{o.Result.Head, o.Result.Barrel} {
			if len(s.March) == 0 {
				continue
			}
			off := 0.0
			if s.Series && s.Name == "barrel" {
				off = o.Result.Head.PathLength
			}
			set := fmt.Sprintf("%s %s", s.Name, s.Style)
			if !s.Equilibrium {
				set += fmt.Sprintf(" (no equilibrium: drawn at the %s %s cap)", fmtT(u, cylinder.SaneWallLimit), u.Name(output.Temp))
			}
			sets = append(sets, set)
			t := plots.Series{Label: s.Name, Design: i, Dashed: k == 1}
			q := t
			t.X, t.Y = []float64{u.Of(output.Len, off)}, []float64{u.Of(output.Temp, s.AirIn)}
			for j, sg := range s.March {
				t.X = append(t.X, u.Of(output.Len, off+sg.X))
				t.Y = append(t.Y, u.Of(output.Temp, sg.AirOut))
				start := 0.0
				if j > 0 {
					start = s.March[j-1].X
				}
				q.X = append(q.X, u.Of(output.Len, off+(start+sg.X)/2))
				q.Y = append(q.Y, u.Of(output.Flux, sg.Flux)/1000)
			}
			temp, flux = append(temp, t), append(flux, q)
		}
		name := letter(i) + ": " + short(d.Name)
		if len(sets) > 0 {
			name += "; " + strings.Join(sets, ", ")
		} else {
			name += "; no forced flow along the fins"
		}
		names = append(names, name)
	}
	if len(temp) == 0 {
		return nil, fail(ExitModel, fmt.Errorf("no fin set has forced flow at these conditions, so there is no march to draw"))
	}
	return plots.March("Cooling air along the fin passages (channel method), each design at its own cruise speed",
		"position along the air path ("+u.Name(output.Len)+")", "air temperature ("+u.Name(output.Temp)+")", "local heat flux (k"+u.Name(output.Flux)+")", names, temp, flux)
}

// limitLines are the designs' head and barrel limits as lines, by their
// labels: designs with the same limit share a line, and a limit not every
// design has names the designs whose it is.
func limitLines(u output.Units, ds []*design.Design) []plots.Limit {
	type lim struct {
		l     plots.Limit
		whose []string
	}
	var ls []*lim
	by := map[string]*lim{}
	for i, d := range ds {
		for _, s := range []struct {
			set string
			k   float64
		}{{"head", d.HeadLimit}, {"barrel", d.BarrelLimit}} {
			label := fmt.Sprintf("%s limit %s %s", s.set, u.N(u.Of(output.Temp, s.k), 0), u.Name(output.Temp))
			if by[label] == nil {
				by[label] = &lim{l: plots.Limit{Label: label, Value: u.Of(output.Temp, s.k), Barrel: s.set == "barrel"}}
				ls = append(ls, by[label])
			}
			by[label].whose = append(by[label].whose, letter(i))
		}
	}
	// heads first, then barrels, each from the lowest limit up
	sort.SliceStable(ls, func(a, b int) bool {
		if ls[a].l.Barrel != ls[b].l.Barrel {
			return !ls[a].l.Barrel
		}
		return ls[a].l.Value < ls[b].l.Value
	})
	out := make([]plots.Limit, len(ls))
	for i, l := range ls {
		out[i] = l.l
		if len(l.whose) < len(ds) {
			out[i].Label += " (" + strings.Join(l.whose, ", ") + ")"
		}
	}
	return out
}

func (e *env) speedFigure(ds []*design.Design, from, to, step float64) (*plots.Figure, error) {
	_, u, err := e.settings()
	if err != nil {
		return nil, err
	}
	var lines []plots.Series
	var names []string
	for i, d := range ds {
		h := plots.Series{Label: "head", Design: i}
		b := plots.Series{Label: "barrel", Design: i, Dashed: true}
		lo := plots.Series{Label: "head, 5 % and 95 %", Design: i, Thin: true}
		hi := plots.Series{Design: i, Thin: true}
		end := plots.Series{Label: "no equilibrium beyond", Design: i, Marks: true}
		ended := false
		for k := 0; ; k++ {
			v := from + float64(k)*step
			if v > to+1e-9 {
				break
			}
			o, err := evaluate(d, v)
			if errors.Is(err, cylinder.ErrNotFinite) {
				continue // leave a gap, as for no equilibrium
			}
			if err != nil {
				return nil, err
			}
			if o.Load.OverRated {
				break // past the engine's top speed: the curves stop
			}
			if o.NoEquilibrium != nil && len(h.X) > 0 && !ended {
				// the curve ends here: mark its last point
				ended = true
				end.X, end.Y = append(end.X, h.X[len(h.X)-1]), append(end.Y, h.Y[len(h.Y)-1])
			}
			if o.NoEquilibrium != nil || (!o.Fixed && o.Load.Head+o.Load.Barrel == 0) {
				continue // no equilibrium or no load at this speed: leave a gap at the end
			}
			h.X, h.Y = append(h.X, u.Of(output.Road, v)), append(h.Y, u.Of(output.Temp, o.Result.Head.WallTemp))
			b.X, b.Y = append(b.X, u.Of(output.Road, v)), append(b.Y, u.Of(output.Temp, o.Result.Barrel.WallTemp))
			band, err := e.band(d, v)
			if err != nil {
				return nil, err
			}
			// the band's edges, where its samples reach an equilibrium
			if band != nil && band.Head.P95 <= cylinder.SaneWallLimit {
				lo.X, lo.Y = append(lo.X, u.Of(output.Road, v)), append(lo.Y, u.Of(output.Temp, band.Head.P5))
				hi.X, hi.Y = append(hi.X, u.Of(output.Road, v)), append(hi.Y, u.Of(output.Temp, band.Head.P95))
			}
		}
		lines = append(lines, h, b, lo, hi, end)
		names = append(names, letter(i)+": "+short(d.Name))
	}
	return plots.Curves(plots.Chart{Title: "Wall temperature against road speed",
		XLabel: "road speed (" + u.Name(output.Road) + ")", YLabel: "wall temperature at the fin roots (" + u.Name(output.Temp) + ")",
		Designs: names, Lines: lines, Limits: limitLines(u, ds)})
}

func (e *env) compareFigure(ds []*design.Design) (*plots.Figure, error) {
	_, u, err := e.settings()
	if err != nil {
		return nil, err
	}
	var names []string
	var ht, lo, hi, perKg, lim []float64
	banded := false
	for i, d := range ds {
		o, err := evaluate(d, d.Case.Speed)
		if err != nil {
			return nil, err
		}
		b, err := e.band(d, d.Case.Speed)
		if err != nil {
			return nil, err
		}
		// each design at its own cruise speed, which its label gives
		name := letter(i) + ": " + short(d.Name) + ", at " + u.N(u.Of(output.Road, d.Case.Speed), 0) + " " + u.Name(output.Road)
		head := u.Of(output.Temp, o.Result.Head.WallTemp)
		if !o.Result.Head.Equilibrium {
			// a state, not a temperature: no bar
			name, head = name+" (no equilibrium)", 0
		}
		l, h := math.NaN(), math.NaN()
		if b != nil {
			banded = true
			if b.Head.P5 <= cylinder.SaneWallLimit {
				l = u.Of(output.Temp, b.Head.P5)
			}
			if b.Head.P95 <= cylinder.SaneWallLimit {
				h = u.Of(output.Temp, b.Head.P95)
			} else if o.Result.Head.Equilibrium {
				// an open band: the whisker runs to the top of the chart's
				// reach, and the name says why, so the less certain design
				// never looks the tighter one
				h = u.Of(output.Temp, cylinder.SaneWallLimit)
				name += " (95 %: no equilibrium, whisker open)"
			}
		}
		names = append(names, name)
		ht, lo, hi = append(ht, head), append(lo, l), append(hi, h)
		lim = append(lim, u.Of(output.Temp, d.HeadLimit))
		perKg = append(perKg, u.Of(output.PerMass, o.Result.HeatPerFinMass()))
	}
	band := ""
	if banded {
		band = "head 5 % to 95 %"
	} else {
		lo, hi = nil, nil
	}
	return plots.Compare("Designs, each at its own cruise speed", names, []plots.Panel{
		{Label: "head temperature (" + u.Name(output.Temp) + ")", Values: ht, Low: lo, High: hi, Limits: lim, LimitLabel: "head limit of each design", BandLabel: band},
		{Label: "heat per mass of fin (" + u.Name(output.PerMass) + ")", Values: perKg},
	})
}
