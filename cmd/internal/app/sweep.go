package app

import (
	"fmt"
	"math"
	"os"
	"runtime"
	"sort"
	"strconv"
	"strings"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/sweep"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
)

// parseAxis reads "key=from:to:step" (units allowed on each part) or
// "key=v1,v2,v3".
func parseAxis(spec string) (sweep.Axis, error) {
	k, rest, ok := strings.Cut(spec, "=")
	k = strings.TrimSpace(k)
	if !ok || k == "" || strings.TrimSpace(rest) == "" {
		return sweep.Axis{}, fmt.Errorf("--vary %q: write key=from:to:step, e.g. head.pitch=6mm:12mm:1mm, or key=a,b,c", spec)
	}
	a := sweep.Axis{Key: k}
	parse := func(s string) (float64, error) {
		v, err := design.ParseFor(k, s)
		if err != nil {
			return 0, fmt.Errorf("--vary %s: %w", k, err)
		}
		return v, nil
	}
	if strings.Contains(rest, ":") {
		p := strings.Split(rest, ":")
		if len(p) != 3 {
			return sweep.Axis{}, fmt.Errorf("--vary %q: a range is from:to:step", spec)
		}
		var v [3]float64
		for i := range p {
			x, err := parse(p[i])
			if i == 2 { // the step is a difference: "5 C" is 5 K
				x, err = design.ParseDifferenceFor(k, p[i])
				if err != nil {
					err = fmt.Errorf("--vary %s: %w", k, err)
				}
			}
			if err != nil {
				return sweep.Axis{}, err
			}
			v[i] = x
		}
		if !(v[2] > 0) || v[1] < v[0] {
			return sweep.Axis{}, fmt.Errorf("--vary %q: need from <= to and a positive step", spec)
		}
		n := math.Floor((v[1]-v[0])/v[2]+1e-9) + 1
		if n > 1e7 {
			return sweep.Axis{}, fmt.Errorf("--vary %q: %g values on one axis; at most 10 million", spec, n)
		}
		for i := 0; i < int(n); i++ {
			// to 12 significant digits, so that 30 mm + 1 x 5 mm is 0.035 m
			// and not 0.034999999999999996 in the JSON and in the design
			x, _ := strconv.ParseFloat(strconv.FormatFloat(v[0]+float64(i)*v[2], 'g', 12, 64), 64)
			a.Values = append(a.Values, x)
		}
		return a, nil
	}
	for _, s := range strings.Split(rest, ",") {
		x, err := parse(s)
		if err != nil {
			return sweep.Axis{}, err
		}
		a.Values = append(a.Values, x)
	}
	return a, nil
}

func (e *env) sweepCmd() *cobra.Command {
	var vary []string
	var workers, top int
	var keepCount bool
	cmd := &cobra.Command{
		Use:   "sweep DESIGN.toml --vary KEY=FROM:TO:STEP [--vary ...]",
		Short: "Sweep any numeric keys over a grid, in parallel, streaming rows to CSV or JSON lines",
		Long: `sweep evaluates the design at every point of a grid over one or more numeric keys
(several --vary flags make a grid) on all cores. With --format csv or json the rows
stream out as they finish (JSON lines for json), in constant memory whatever the
grid size; each row carries its grid index. A summary of the best rows follows (on
stderr when the rows go to stdout). When pitch, root thickness, finned length or
diameter vary and the count does not, each set gets as many fins as fit (use
--keep-count to hold the design's counts). The keys:

` + wrapList(design.VaryKeys(), 88, "  ") + `

  finmarch sweep my.toml --vary head.pitch=6mm:14mm:1mm --vary air.speed=40km/h:120km/h:40km/h`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			if len(vary) == 0 {
				return fail(ExitUsage, fmt.Errorf("give at least one --vary KEY=FROM:TO:STEP"))
			}
			var axes sweep.Grid
			total := 1
			for _, v := range vary {
				a, err := parseAxis(v)
				if err != nil {
					return fail(ExitUsage, err)
				}
				for _, b := range axes {
					if b.Key == a.Key {
						return fail(ExitUsage, fmt.Errorf("--vary %s is given twice; give each key once (several values: %s=A,B,C)", a.Key, a.Key))
					}
				}
				// a key the design does not use would give identical rows
				if err := d.CheckVary(e.sources[d.Source], a.Key, a.Values); err != nil {
					return fail(ExitUsage, fmt.Errorf("--vary %w", err))
				}
				axes = append(axes, a)
				total *= len(a.Values)
				if total > 100_000_000 {
					return fail(ExitUsage, fmt.Errorf("the grid has more than 100 million points"))
				}
			}
			// more workers than cores gain nothing and cost memory
			maxWorkers := 4 * runtime.NumCPU()
			if workers < 0 || workers > maxWorkers {
				return fail(ExitUsage, fmt.Errorf("--workers %d: allowed 0 (one per core) to %d (four per core)", workers, maxWorkers))
			}
			if workers == 0 {
				workers = runtime.GOMAXPROCS(0)
			}
			if top < 1 || top > 1000 {
				return fail(ExitUsage, fmt.Errorf("--top %d: allowed 1 to 1000", top))
			}
			return e.sweep(d, axes, total, workers, top, keepCount)
		},
	}
	cmd.Flags().StringArrayVar(&vary, "vary", nil, "KEY=FROM:TO:STEP (units allowed) or KEY=A,B,C; repeat for a grid")
	_ = cmd.RegisterFlagCompletionFunc("vary", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		var keys []string
		for _, k := range design.VaryKeys() {
			keys = append(keys, k+"=")
		}
		return keys, cobra.ShellCompDirectiveNoFileComp | cobra.ShellCompDirectiveNoSpace
	})
	cmd.Flags().IntVar(&workers, "workers", 0, "parallel workers (default: all cores)")
	cmd.Flags().IntVar(&top, "top", 10, "rows in each summary table")
	cmd.Flags().BoolVar(&keepCount, "keep-count", false, "keep the fin counts of the design when pitch, thickness or length vary (default: as many fins as fit)")
	return cmd
}

// builder returns a sweep.Builder for one worker: the design file with
// the grid point's keys changed (fin counts fitted unless fit is false),
// checked by the parser's rules (Design.With).
func builder(d *design.Design, axes sweep.Grid, fit bool) func() sweep.Builder {
	return func() sweep.Builder {
		vals := make(map[string]float64, len(axes)+2)
		return func(x []float64) (cylinder.Design, cylinder.Settings, error) {
			clear(vals)
			for k, a := range axes {
				vals[a.Key] = x[k]
			}
			if fit {
				fitCounts(d, vals)
			}
			v, err := d.With(vals)
			if err != nil {
				return cylinder.Design{}, cylinder.Settings{}, err
			}
			return v.Cylinder(), v.Run, nil
		}
	}
}

// fitCounts sets the fin count of each set whose pitch, root thickness,
// length or diameter varies (and whose count does not) to as many fins as
// fit, so that a pitch sweep keeps the finned length filled.
func fitCounts(d *design.Design, vals map[string]float64) {
	for _, s := range []struct {
		name string
		set  fins.Set
	}{{"head", d.Case.Head.Set}, {"barrel", d.Case.Barrel.Set}} {
		if _, fixed := vals[s.name+".count"]; fixed {
			continue
		}
		get := func(key string, def float64) float64 {
			if v, ok := vals[key]; ok {
				return v
			}
			return def
		}
		p := get(s.name+".pitch", s.set.Pitch)
		t := get(s.name+".root_thickness", s.set.RootThickness)
		L := get("cylinder."+s.name+"_length", s.set.Length)
		D := get("cylinder."+s.name+"_diameter", s.set.RootDiameter)
		touched := false
		for _, k := range []string{s.name + ".pitch", s.name + ".root_thickness", "cylinder." + s.name + "_length", "cylinder." + s.name + "_diameter"} {
			_, ok := vals[k]
			touched = touched || ok
		}
		if !touched || !(p > 0) {
			continue
		}
		vals[s.name+".count"] = float64(fins.Fitting(s.set.Style, p, t, L, D))
	}
}

// displayFor converts a varied key's SI value to its own display unit
// (by the key's kind of quantity: a rotational speed in rpm, a road speed
// in km/h or mph, a pressure drop in Pa), with its unit's name.
func displayFor(u output.Units, key string, v float64) (string, string) {
	q, dec := output.Quantity(-1), 0
	switch dim := design.Dimension(key); {
	case dim == "count":
		return strconv.Itoa(int(v)), ""
	case dim == "angle":
		return u.N(v*180/math.Pi, 2), "deg"
	case key == "air.altitude":
		q, dec = output.Alt, 1
	case dim == "length":
		q, dec = output.Len, min(u.Dec(output.Len)+2, 4) // 0.001 mm, 0.0001 in
	case dim == "speed":
		q, dec = output.Road, 2
	case dim == "temperature":
		q, dec = output.Temp, 2
	case dim == "rotational speed":
		q, dec = output.Rot, 0
	case dim == "pressure" && key == "air.pressure":
		q, dec = output.Press, 2
	case dim == "pressure":
		q, dec = output.Drop, 1
	case dim == "power":
		q, dec = output.Power, 0
	case dim == "mass":
		q, dec = output.Mass, 1
	case dim == "heat-transfer coefficient":
		q, dec = output.H, 1
	case dim == "volume flow":
		q, dec = output.VolFlow, 4
	case dim == "mass flow":
		q, dec = output.MassFlow, 4
	case dim == "area" && key == "load.cda":
		q, dec = output.Area, 3
	case dim == "fraction":
		return u.N(v, 3), ""
	}
	if q < 0 {
		if u.Full {
			return u.N(v, 0), design.SIUnit(key)
		}
		return strconv.FormatFloat(v, 'g', 6, 64), design.SIUnit(key)
	}
	return u.N(u.Of(q, v), dec), u.Name(q)
}

func (e *env) sweep(d *design.Design, axes sweep.Grid, total, workers, top int, keepCount bool) error {
	f, u, err := e.settings()
	if err != nil {
		return err
	}
	streaming := f == output.CSV || f == output.JSON
	summaryTo := e.stdout
	if streaming {
		summaryTo = e.stderr
	}
	dst, err := e.openOutput(e.opt.out, e.opt.force)
	if err != nil {
		return err
	}
	defer dst.Abort()
	if e.opt.out != "" && e.opt.out != "-" {
		// rows to the file and the summary to the screen; a table or
		// Markdown sweep has no rows, so its summary is the file
		summaryTo = e.stdout
		if !streaming {
			summaryTo = dst
		}
	}
	header := sweepHeader(axes, u)
	st := output.NewStream(dst, f, header)
	var bar *progressbar.ProgressBar
	if sf, ok := e.stderr.(*os.File); ok && !e.opt.quiet && total >= 200 && term.IsTerminal(int(sf.Fd())) {
		bar = progressbar.NewOptions(total, progressbar.OptionSetWriter(os.Stderr), progressbar.OptionSetDescription("sweep"),
			progressbar.OptionShowCount(), progressbar.OptionThrottle(100_000_000), progressbar.OptionClearOnFinish())
	}
	// with operating keys beside design keys the summary ranks designs by
	// their worst operating point, and the grid runs design by design
	op, nOp := make([]bool, len(axes)), 0
	for k, a := range axes {
		if op[k] = design.Operating(a.Key); op[k] {
			nOp++
		}
	}
	sum, order := sweep.NewSummary(top), func(j int) int { return j }
	if nOp > 0 && nOp < len(axes) {
		sum, order = sweep.NewGroupedSummary(top, axes, op), axes.Grouped(op)
	} else {
		op = nil
	}
	sweep.RunOrdered(axes, order, workers, builder(d, axes, !keepCount), func(r sweep.Row) {
		sum.Add(r)
		st.Row(func() []string { return sweepCells(r, axes, u) }, func() map[string]any { return sweepJSON(r, axes) })
		if bar != nil {
			_ = bar.Add(1)
		}
	})
	if bar != nil {
		_ = bar.Finish()
	}
	if err := st.Close(); err != nil {
		return fail(ExitIO, fmt.Errorf("writing the sweep: %w", err))
	}
	if streaming { // the rows are safe before the summary goes to the screen
		if err := dst.Commit(); err != nil {
			return err
		}
	}
	sf := output.Table
	if f == output.Markdown {
		sf = output.Markdown
	}
	// the summary is for reading: display precision, whatever the rows'
	u.Full = false
	if err := output.Write(summaryTo, sweepSummary(d, axes, op, sum, total, workers, top, u), sf); err != nil {
		return fail(ExitIO, err)
	}
	if !streaming {
		if err := dst.Commit(); err != nil {
			return err
		}
	}
	if fi := sum.FirstInvalid; sum.Counts[sweep.StatusInvalid] == total && fi != nil {
		return fail(ExitDesign, fmt.Errorf("every point of the sweep breaks a design rule, so none was estimated; point %d: %s", fi.Index, fi.Note))
	}
	return nil
}

// sweepHeader is the header of the sweep's rows: the index, each varied
// key in its display unit, the results, status and note.
func sweepHeader(axes sweep.Grid, u output.Units) []string {
	T := u.Name(output.Temp)
	header := []string{"index"}
	for _, a := range axes {
		_, unit := displayFor(u, a.Key, a.Values[0])
		if unit != "" {
			header = append(header, a.Key+" ("+unit+")")
		} else {
			header = append(header, a.Key)
		}
	}
	return append(header, "head fins", "barrel fins", "head ("+T+")", "barrel ("+T+")", "head margin ("+u.Name(output.TempDiff)+")", "barrel margin ("+u.Name(output.TempDiff)+")",
		"fin mass ("+u.Name(output.Mass)+")", "heat per fin mass ("+u.Name(output.PerMass)+")", "status", "note")
}

// sweepCells is a row in display units.
func sweepCells(r sweep.Row, axes sweep.Grid, u output.Units) []string {
	c := []string{strconv.Itoa(r.Index)}
	for k, a := range axes {
		s, _ := displayFor(u, a.Key, r.Values[k])
		c = append(c, s)
	}
	if !r.Evaluated {
		return append(c, "", "", "", "", "", "", "", "", r.Status, r.Note)
	}
	wall := func(ok bool, t, m float64) (string, string) {
		if !ok {
			return noValue(u, noEquilibrium), noValue(u, "-")
		}
		return fmtT(u, t), fmtDT(u, m)
	}
	ht, hm := wall(r.HeadEquilibrium, r.HeadWall, r.HeadMargin)
	bt, bm := wall(r.BarrelEquilibrium, r.BarrelWall, r.BarrelMargin)
	status, note := r.Status, r.Note
	if len(r.Uncastable) > 0 {
		// never ranked as best without saying so
		status += ", uncastable"
		note = strings.TrimPrefix(note+"; "+strings.Join(r.Uncastable, "; "), "; ")
	}
	if r.OverRated {
		status += ", past rated"
		note = strings.TrimPrefix(note+"; the engine cannot hold this speed (load.rated_power or load.top_gear_speed)", "; ")
	}
	return append(c, strconv.Itoa(r.HeadFins), strconv.Itoa(r.BarrelFins), ht, bt, hm, bm,
		u.N(u.Of(output.Mass, r.FinMass), 3), u.N(u.Of(output.PerMass, r.HeatPerFinMass), 0), status, note)
}

// sweepJSON is a row as a JSON-lines object (SI), stamped like every JSON
// document (stampJSON): each line stands alone. A varied key carries its
// SI unit as a suffix ("head.pitch_m").
func sweepJSON(r sweep.Row, axes sweep.Grid) map[string]any {
	m := map[string]any{"index": r.Index, "status": r.Status}
	for k, a := range axes {
		m[a.Key+unitSuffix(design.SIUnit(a.Key))] = r.Values[k]
	}
	if r.Evaluated {
		m["head_wall_temperature_K"], m["barrel_wall_temperature_K"], m["head_margin_K"], m["barrel_margin_K"] = r.HeadWall, r.BarrelWall, r.HeadMargin, r.BarrelMargin
		// a state, not a temperature, where a set has no equilibrium
		if !r.HeadEquilibrium {
			m["head_wall_temperature_K"], m["head_margin_K"] = nil, nil
		}
		if !r.BarrelEquilibrium {
			m["barrel_wall_temperature_K"], m["barrel_margin_K"] = nil, nil
		}
		m["fin_mass_kg"], m["heat_per_fin_mass_W_kg"], m["equilibrium"] = r.FinMass, r.HeatPerFinMass, r.Equilibrium
		m["head_fins"], m["barrel_fins"] = r.HeadFins, r.BarrelFins
	}
	if r.Note != "" {
		m["note"] = r.Note
	}
	m["uncastable"] = r.Uncastable
	if r.Evaluated {
		m["over_rated"] = r.OverRated
	}
	stampJSON(m, "sweep")
	return m
}

// unitSuffix is the JSON key suffix of an SI unit: "_m" for m, "_W_m2K" for
// W/(m2 K), "" for none.
func unitSuffix(unit string) string {
	if unit == "" {
		return ""
	}
	return "_" + strings.NewReplacer("/(", "_", "/", "_", "(", "", ")", "", " ", "").Replace(unit)
}

// sweepSummary is the document of the best rows, in columns narrow enough
// for a terminal (the margins and the heat per fin mass are in the rows).
// With operating axes (op non-nil) the rows are designs, each at its worst
// operating point.
func sweepSummary(d *design.Design, axes sweep.Grid, op []bool, sum *sweep.Summary, total, workers, top int, u output.Units) output.Doc {
	T := u.Name(output.Temp)
	header := append([]string{"index"}, sweepHeader(axes, u)[1:1+len(axes)]...)
	header = append(header, "fins", "head ("+T+")", "barrel ("+T+")", "fin mass ("+u.Name(output.Mass)+")", "status")
	grid := func(title string, rs []sweep.Row) output.Grid {
		g := output.Grid{Title: title, Header: header}
		for _, r := range rs {
			c := sweepCells(r, axes, u)
			n := 1 + len(axes)
			// index and axes, fins, head, barrel, fin mass, status
			g.Rows = append(g.Rows, append(c[:n:n], c[n]+" / "+c[n+1], c[n+2], c[n+3], c[n+6], c[n+8]))
		}
		return g
	}
	var keys []string
	for k := range sum.Counts {
		keys = append(keys, fmt.Sprintf("%s %d", k, sum.Counts[k]))
	}
	sort.Strings(keys)
	cool, light := fmt.Sprintf("Coolest heads (best %d)", top), fmt.Sprintf("Lightest fins within both limits (best %d)", top)
	var opKeys []string
	for k, o := range op {
		if o {
			opKeys = append(opKeys, axes[k].Key)
		}
	}
	if op != nil {
		cool = fmt.Sprintf("Coolest heads at each design's hottest operating point (best %d designs)", top)
		light = fmt.Sprintf("Lightest fins within both limits at every operating point (best %d designs)", top)
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: sweep of %s on %s (%s)", d.Name, count(total, "point"), count(workers, "worker"), strings.Join(keys, ", ")), Caution: true}
	what := map[bool]string{true: "design", false: "point"}[op != nil]
	for _, l := range []struct {
		title string
		rows  []sweep.Row
		none  string
	}{{cool, sum.Coolest.Rows(), "No " + what + " reaches an equilibrium"}, {light, sum.Lightest.Rows(), "No " + what + " stays within both limits"}} {
		if len(l.rows) == 0 {
			doc.Notes = append(doc.Notes, l.title+": none. "+l.none+map[bool]string{true: " at every operating point.", false: "."}[op != nil])
			continue
		}
		doc.Grids = append(doc.Grids, grid(l.title, l.rows))
	}
	if op != nil {
		verb := "sets"
		if len(opKeys) > 1 {
			verb = "set"
		}
		doc.Notes = append(doc.Notes, fmt.Sprintf("%s %s the operating point, the other keys the design: each design is shown at the point of its hottest head (the %s there), with its hottest barrel and worst status over all its operating points; a design with an invalid point is not ranked.",
			strings.Join(opKeys, " and "), verb, strings.Join(opKeys, " and ")))
	}
	doc.Notes = append(doc.Notes, fmt.Sprintf("Fins: head / barrel. Limits: head %s %s, barrel %s %s; the margins and the heat per fin mass are in the rows (--format csv or json).",
		fmtT(u, d.HeadLimit), T, fmtT(u, d.BarrelLimit), T))
	doc.Notes = append(doc.Notes, fmt.Sprintf("Casting limits: %s; a row marked uncastable breaks them (its note in the full rows says how).", castingName(d)))
	if fi := sum.FirstInvalid; fi != nil {
		doc.Notes = append(doc.Notes, fmt.Sprintf("Invalid points break a design rule (the row's note says which) and are not estimated; the first, point %d: %s.",
			fi.Index, strings.TrimSuffix(fi.Note, ".")))
	}
	return doc
}
