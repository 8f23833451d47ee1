package app

import (
	"fmt"
	"math"
	"sort"
	"strings"
	"sync"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/optimise"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
)

type optVar struct {
	name, key string // flag name, design key suffix
	lo, hi    float64
	integer   bool
	isLength  bool
}

func (e *env) optimiseCmd() *cobra.Command {
	var set, goal, process, limit, minThick, maxAspect, draft string
	ranges := map[string]*string{}
	var levels int
	cmd := &cobra.Command{
		Use:     "optimise DESIGN.toml",
		Aliases: []string{"optimize"},
		Short:   "Choose fin pitch, height, thicknesses and count for the coolest head or the lightest fins, within casting limits",
		Long: `optimise varies one fin set's pitch, height, root and tip thickness and count within
bounds (defaults around the design; set them with --pitch 6mm:14mm and so on) at the
design's cruise point (or at --speed, --ambient, --altitude), keeping the casting
limits of a process (minimum thickness, height-to-gap ratio, draft). --goal cool
minimises the set's wall temperature; --goal light minimises its fin mass with the
wall at or below the limit. --set both varies head and barrel fins together (the
bounds flags then apply to both), for the head's wall with the barrel kept within
its limit: the way to win back what laying a cylinder over costs, where the air
passes both sets in series. It prints the optimum, the constraints that hold it, and
the trade-off front of temperature against fin mass from every design it evaluated.`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			if d.WallFixed {
				return fail(ExitUsage, fmt.Errorf("the design fixes the wall temperatures ([override]); remove them to optimise"))
			}
			names := map[string][]string{"head": {"head"}, "barrel": {"barrel"}, "both": {"head", "barrel"}}[set]
			if names == nil {
				return fail(ExitUsage, fmt.Errorf("--set %q: head, barrel or both", set))
			}
			if goal != "cool" && goal != "light" {
				return fail(ExitUsage, fmt.Errorf("--goal %q: cool or light", goal))
			}
			p, err := fins.LookupProcess(process)
			if err != nil {
				return fail(ExitUsage, err)
			}
			for _, o := range []struct {
				flag, s string
				dst     *float64
				parse   func(string) (float64, error)
			}{
				{"--min-thickness", minThick, &p.MinThickness, design.ParseValue[design.Length]},
				{"--max-aspect", maxAspect, &p.MaxAspect, func(s string) (float64, error) { return design.ParseFor("air.pressure_recovery", s) }},
				{"--draft", draft, &p.MinDraft, design.ParseValue[design.Angle]},
			} {
				if o.s == "" {
					continue
				}
				v, err := o.parse(o.s)
				if err != nil || v < 0 {
					return fail(ExitUsage, fmt.Errorf("%s %q: %v", o.flag, o.s, err))
				}
				*o.dst = v
				p.Name += " (adjusted)"
			}
			lim := d.HeadLimit
			if set == "barrel" {
				lim = d.BarrelLimit
			}
			if limit != "" {
				if lim, err = design.ParseValue[design.Temperature](limit); err != nil {
					return fail(ExitUsage, fmt.Errorf("--limit: %w", err))
				}
			}
			if len(names) == 2 && !cmd.Flags().Changed("levels") {
				levels = 3 // 3^10 grid points for ten variables
			}
			if levels < 3 || levels > 9 {
				return fail(ExitUsage, fmt.Errorf("--levels %d: allowed 3 to 9", levels))
			}
			if n := math.Pow(float64(levels), float64(5*len(names))); n > 2e6 {
				return fail(ExitUsage, fmt.Errorf("--levels %d with --set both is a grid of %.0f designs; at most 2 million (use 3 or 4)", levels, n))
			}
			var vars [][]optVar
			for _, n := range names {
				v, err := optBounds(d, n, p, ranges)
				if err != nil {
					return err
				}
				vars = append(vars, v)
			}
			return e.optimise(d, names, goal, p, lim, vars, levels)
		},
	}
	f := cmd.Flags()
	f.StringVar(&set, "set", "head", "fin set to optimise: head, barrel, or both (the head's wall with the barrel's limit kept)")
	f.StringVar(&goal, "goal", "cool", "cool (lowest wall temperature) or light (least fin mass within the limit)")
	f.StringVar(&process, "process", "permanent-mould", "casting process: sand, permanent-mould, die-casting or machined")
	f.StringVar(&limit, "limit", "", "wall temperature limit for --goal light (default: the design's limit)")
	f.StringVar(&minThick, "min-thickness", "", "override the process's minimum fin thickness")
	f.StringVar(&maxAspect, "max-aspect", "", "override the process's maximum height-to-gap ratio")
	f.StringVar(&draft, "draft", "", "override the process's minimum draft angle per face, e.g. \"1 deg\"")
	f.IntVar(&levels, "levels", 5, "grid levels per variable before the pattern search")
	for _, v := range []string{"pitch", "height", "root-thickness", "tip-thickness", "count"} {
		s := ""
		ranges[v] = &s
		f.StringVar(ranges[v], v, "", "bounds FROM:TO for the "+v+" (default: around the design)")
	}
	return cmd
}

func optBounds(d *design.Design, set string, p fins.Process, ranges map[string]*string) ([]optVar, error) {
	s := d.Case.Head.Set
	if set == "barrel" {
		s = d.Case.Barrel.Set
	}
	tmin := p.MinThickness
	vars := []optVar{
		{name: "pitch", key: "pitch", lo: math.Max(0.6*s.Pitch, tmin+1e-3), hi: 1.6 * s.Pitch, isLength: true},
		{name: "height", key: "height", lo: 0.5 * s.Height, hi: math.Min(1.5*s.Height, s.RootDiameter), isLength: true},
		{name: "root-thickness", key: "root_thickness", lo: tmin, hi: math.Max(2*s.RootThickness, tmin+1e-3), isLength: true},
		{name: "tip-thickness", key: "tip_thickness", lo: tmin, hi: math.Max(2*s.RootThickness, tmin+1e-3), isLength: true},
		{name: "count", key: "count", lo: 1, integer: true},
	}
	for i := range vars {
		v := &vars[i]
		if r := *ranges[v.name]; r != "" {
			a, b, ok := strings.Cut(r, ":")
			if !ok {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q: write FROM:TO", v.name, r))
			}
			var err error
			key := set + "." + v.key
			if v.lo, err = design.ParseFor(key, a); err == nil {
				v.hi, err = design.ParseFor(key, b)
			}
			if err != nil {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q: %v", v.name, r, err))
			}
			if !(v.hi >= v.lo) || v.lo < 0 {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q: need 0 <= FROM <= TO", v.name, r))
			}
		}
	}
	if *ranges["count"] == "" {
		vars[4].hi = float64(fins.Fitting(s.Style, vars[0].lo, vars[2].lo, s.Length, s.RootDiameter))
	}
	return vars, nil
}

type optPoint struct {
	x        []float64
	t, mass  float64
	feasible bool
}

// optSet is one fin set the optimiser varies: its five variables sit at
// x[off:off+5] (pitch, height, root and tip thickness, count).
type optSet struct {
	name string
	base fins.Set
	vars []optVar
	off  int
}

func (o optSet) set(x []float64) fins.Set {
	s := o.base
	y := x[o.off : o.off+5]
	s.Pitch, s.Height, s.RootThickness, s.TipThickness, s.Count = y[0], y[1], y[2], y[3], int(y[4])
	return s
}

func (o optSet) baseX() []float64 {
	return []float64{o.base.Pitch, o.base.Height, o.base.RootThickness, o.base.TipThickness, float64(o.base.Count)}
}

// optimise searches the fin sets of vars (one set, or head and barrel
// together) for goal at the design's operating point. The objective
// temperature is the set's wall, or the head's when both vary; limit
// applies to it under goal light. Guards keep other walls at their limits:
// the barrel's when both vary, and on a series path (both sets
// longitudinal) the other set's, whose air the chosen fins change.
func (e *env) optimise(d *design.Design, names []string, goal string, p fins.Process, limit float64, vars [][]optVar, levels int) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	both := len(names) == 2
	var sets []optSet
	var all []optVar
	for i, n := range names {
		b := d.Case.Head.Set
		if n == "barrel" {
			b = d.Case.Barrel.Set
		}
		sets = append(sets, optSet{name: n, base: b, vars: vars[i], off: len(all)})
		all = append(all, vars[i]...)
	}
	primary := names[0] // the head when both vary
	other := map[string]string{"head": "barrel", "barrel": "head"}[primary]
	limitOf := map[string]float64{"head": d.HeadLimit, "barrel": d.BarrelLimit}
	series := d.Case.Head.Set.Style == fins.StyleLongitudinal && d.Case.Barrel.Set.Style == fins.StyleLongitudinal
	guardOther := both || series
	otherLimit := limitOf[other]
	var mu sync.Mutex
	var pts []optPoint
	// measureAs evaluates x: the primary wall, the fin mass of the varied
	// sets, the other wall; cast applies the process limits
	measureAs := func(x []float64, cast bool) (float64, float64, float64, bool) {
		vals := map[string]float64{}
		for _, o := range sets {
			s := o.set(x)
			if s.TipThickness > s.RootThickness || cast && !p.Feasible(s) {
				return 0, 0, 0, false
			}
			y := x[o.off : o.off+5]
			vals[o.name+".pitch"], vals[o.name+".height"], vals[o.name+".root_thickness"], vals[o.name+".tip_thickness"], vals[o.name+".count"] = y[0], y[1], y[2], y[3], y[4]
		}
		v, err := d.With(vals)
		if err != nil {
			return 0, 0, 0, false
		}
		o, err := evaluateWith(v, v.Case.Speed, nil, true)
		if err != nil || o.NoEquilibrium != nil {
			return 0, 0, 0, false
		}
		r, q := o.Result.Head, o.Result.Barrel
		if primary == "barrel" {
			r, q = q, r
		}
		m := r.FinMass
		if both {
			m += q.FinMass
		}
		return r.WallTemp, m, q.WallTemp, true
	}
	measure := func(x []float64) (float64, float64, float64, bool) { return measureAs(x, true) }
	// over is how far a guarded other set runs above its limit, K
	over := func(ot float64) float64 {
		if !guardOther {
			return 0
		}
		return math.Max(0, ot-otherLimit)
	}
	obj := func(x []float64) float64 {
		t, m, ot, ok := measure(x)
		mu.Lock()
		pts = append(pts, optPoint{x: append([]float64(nil), x...), t: t, mass: m, feasible: ok && over(ot) == 0})
		mu.Unlock()
		switch {
		case !ok:
			return math.Inf(1)
		case goal == "cool":
			// the other set's limit by a steep exact penalty, 10 K per K
			return t + 10*over(ot)
		case t > limit || over(ot) > 0:
			// an exact penalty, 1 kg per kelvin over the limit: far steeper
			// than fin mass trades against temperature (a few 10 g per K),
			// so the search walks into the limit and the optimum sits on it
			return m + math.Max(0, t-limit) + over(ot)
		}
		return m
	}
	lo := make([]float64, len(all))
	hi := make([]float64, len(all))
	integer := make([]bool, len(all))
	for i, v := range all {
		lo[i], hi[i], integer[i] = v.lo, v.hi, v.integer
	}
	res := optimise.Minimize(obj, lo, hi, integer, optimise.Options{Levels: levels, Tol: 1e-3}, nil)
	if !math.IsInf(res.F, 1) {
		if t, _, ot, _ := measure(res.X); goal == "light" && t > limit+1e-6 || over(ot) > 1e-6 {
			res.F = math.Inf(1)
		}
	}
	L := func(v float64) string { return output.Num(u.Len(v), u.LenDec()+1) }
	if math.IsInf(res.F, 1) {
		why := "no design within the bounds and casting limits reaches an equilibrium"
		if goal == "light" {
			why = fmt.Sprintf("no design within the bounds and casting limits keeps the %s at or below %s %s", primary, fmtT(u, limit), u.TempU())
		}
		if guardOther {
			why += fmt.Sprintf(" with the %s at or below its %s %s", other, fmtT(u, otherLimit), u.TempU())
		}
		if goal == "light" {
			// say how close it came
			best := optPoint{t: math.Inf(1)}
			for _, q := range pts {
				if q.feasible && q.t < best.t {
					best = q
				}
			}
			if !math.IsInf(best.t, 1) {
				why += fmt.Sprintf(" (the coolest it found runs at %s %s", fmtT(u, best.t), u.TempU())
				for _, o := range sets {
					y := best.x[o.off : o.off+5]
					why += fmt.Sprintf(", %s %d fins at %s %s pitch, %s %s high", o.name, int(y[4]), L(y[0]), u.LenU(), L(y[1]), u.LenU())
				}
				why += ")"
			}
		}
		more := ""
		if series && !both {
			more = fmt.Sprintf("; the air passes the head and then the barrel fins in series here, so the %s fins, which this search keeps as they are, meter it too: 'finmarch sweep --vary %s.pitch=...' shows what they do to the %s, and --set both varies them together", other, other, primary)
		}
		return fail(ExitModel, fmt.Errorf("%s: %s; widen the bounds (--pitch, --height, ...), choose a finer process, or lower the load%s", d.Name, why, more))
	}
	var base []float64
	for _, o := range sets {
		base = append(base, o.baseX()...)
	}
	bt, bm, bo, _ := measure(res.X)
	dt, dm, do, dok := measureAs(base, false)
	var broken []string
	for _, o := range sets {
		for _, v := range p.Check(o.base) {
			if v.Slack < -1e-12 {
				c := v.Constraint
				if both {
					c = o.name + " " + c
				}
				broken = append(broken, c)
			}
		}
	}
	// label prefixes a row with the set's name when both sets vary
	label := func(o optSet, s string) string {
		if both {
			return o.name + " " + s
		}
		return s
	}
	title := fmt.Sprintf("Optimum %s fins (%s, goal %s)", primary, p.Name, goal)
	if both {
		title = fmt.Sprintf("Optimum head and barrel fins (%s, goal %s)", p.Name, goal)
	}
	g := output.Grid{Title: title, Header: []string{"quantity", "unit", "design", "optimum", "bounds"}, Left: 2}
	for _, o := range sets {
		cur := o.baseX()
		for i, v := range o.vars {
			xi := res.X[o.off+i]
			if v.integer {
				g.Rows = append(g.Rows, []string{label(o, v.name), "", fmt.Sprint(int(cur[i])), fmt.Sprint(int(xi)), fmt.Sprintf("%d to %d", int(v.lo), int(v.hi))})
				continue
			}
			g.Rows = append(g.Rows, []string{label(o, v.name), u.LenU(), L(cur[i]), L(xi), L(v.lo) + " to " + L(v.hi)})
		}
	}
	dT, dM, dO := "n/a", "n/a", "n/a"
	if dok {
		dT, dM, dO = fmtT(u, dt), output.Num(u.Mass(dm), 3), fmtT(u, do)
	}
	if both {
		g.Rows = append(g.Rows, []string{"head wall temperature", u.TempU(), dT, fmtT(u, bt), ""},
			[]string{"barrel wall temperature", u.TempU(), dO, fmtT(u, bo), ""},
			[]string{"fin mass, both sets", u.MassU(), dM, output.Num(u.Mass(bm), 3), ""})
	} else {
		g.Rows = append(g.Rows, []string{primary + " wall temperature", u.TempU(), dT, fmtT(u, bt), ""},
			[]string{primary + " fin mass", u.MassU(), dM, output.Num(u.Mass(bm), 3), ""},
			[]string{other + " wall temperature (fins as designed)", u.TempU(), dO, fmtT(u, bo), ""})
	}
	if goal == "light" {
		g.Rows = append(g.Rows, []string{"limit", u.TempU(), "", fmtT(u, limit), ""})
	}
	c := output.Grid{Title: "Constraints at the optimum (slack 0 = active)", Header: []string{"constraint", "limit", "value", "slack", "active"}, Left: 1}
	var checks []fins.Violation
	for _, o := range sets {
		opt := o.set(res.X)
		cs := p.Check(opt)
		checks = append(checks, cs...)
		for _, v := range cs {
			// the slack in the constraint's own unit
			var lim, val, slack string
			switch v.Constraint {
			case "minimum thickness":
				lim, val, slack = L(p.MinThickness)+" "+u.LenU(), L(opt.TipThickness)+" "+u.LenU(), L(v.Slack)+" "+u.LenU()
			case "height to gap":
				lim, val, slack = output.Num(p.MaxAspect, 2), output.Num(opt.Height/(opt.Pitch-opt.RootThickness), 2), output.Num(v.Slack, 2)
			case "draft":
				d := math.Atan((opt.RootThickness - opt.TipThickness) / (2 * opt.Height))
				lim, val, slack = output.Num(p.MinDraft*180/math.Pi, 2)+" deg", output.Num(d*180/math.Pi, 2)+" deg", output.Num((d-p.MinDraft)*180/math.Pi, 2)+" deg"
			default:
				slack = fmt.Sprintf("%.3g", v.Slack)
			}
			// active: within 2% of the limit's own size
			scale := map[string]float64{"minimum thickness": p.MinThickness, "height to gap": p.MaxAspect, "draft": math.Tan(p.MinDraft)}[v.Constraint]
			active := "no"
			if v.Slack <= 0.02*scale+1e-9 {
				active = "yes"
			}
			c.Rows = append(c.Rows, []string{label(o, v.Constraint), lim, val, slack, active})
		}
		for i, v := range o.vars {
			xi := res.X[o.off+i]
			span := v.hi - v.lo
			if span > 0 && (xi-v.lo <= 1e-3*span || v.hi-xi <= 1e-3*span) {
				row := []string{label(o, v.name+" bound"), L(v.lo) + " to " + L(v.hi), L(xi), "0", "yes"}
				if v.integer {
					row = []string{label(o, v.name+" bound"), fmt.Sprintf("%d to %d", int(v.lo), int(v.hi)), fmt.Sprint(int(xi)), "0", "yes"}
				}
				c.Rows = append(c.Rows, row)
			}
		}
	}
	yes := map[bool]string{true: "yes", false: "no"}
	if goal == "light" {
		c.Rows = append(c.Rows, []string{primary + " temperature limit", fmtT(u, limit) + " " + u.TempU(), fmtT(u, bt) + " " + u.TempU(), fmtDT(u, limit-bt), yes[limit-bt < 1]})
	}
	if guardOther {
		name := other + " temperature limit"
		if !both {
			name += " (series air)"
		}
		c.Rows = append(c.Rows, []string{name, fmtT(u, otherLimit) + " " + u.TempU(), fmtT(u, bo) + " " + u.TempU(), fmtDT(u, otherLimit-bo), yes[otherLimit-bo < 1]})
	}
	front := pareto(pts)
	// the optimum always shows, in its place by mass
	optP := optPoint{x: res.X, t: bt, mass: bm, feasible: true}
	k := sort.Search(len(front), func(i int) bool { return front[i].mass >= bm })
	if k >= len(front) || front[k].mass != bm {
		front = append(front[:k], append([]optPoint{optP}, front[k:]...)...)
	}
	massHead := "fin mass (" + u.MassU() + ")"
	if both {
		massHead = "fin mass, both (" + u.MassU() + ")"
	}
	hdr := []string{massHead, primary + " (" + u.TempU() + ")"}
	for _, o := range sets {
		for _, col := range []string{"pitch", "height", "root", "tip"} {
			hdr = append(hdr, label(o, col)+" ("+u.LenU()+")")
		}
		hdr = append(hdr, label(o, "count"))
	}
	fg := output.Grid{Title: "Trade-off front: wall temperature against fin mass (evaluated designs that no other beats on both)", Header: append(hdr, "")}
	for _, q := range front {
		row := []string{output.Num(u.Mass(q.mass), 3), fmtT(u, q.t)}
		for _, o := range sets {
			y := q.x[o.off : o.off+5]
			row = append(row, L(y[0]), L(y[1]), L(y[2]), L(y[3]), fmt.Sprint(int(y[4])))
		}
		mark := ""
		if q.mass == bm && q.t == bt {
			mark = "optimum"
		}
		fg.Rows = append(fg.Rows, append(row, mark))
	}
	keepNote := "The other fin set and everything else stay as the design has them; check the result with 'finmarch estimate' after editing the design."
	if both {
		keepNote = "Everything but the two fin sets stays as the design has it; check the result with 'finmarch estimate' after editing the design."
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: fin optimisation at %s %s, ambient %s %s", d.Name, output.Num(u.Road(d.Case.Speed), 0), u.RoadU(), fmtT(u, d.Case.Ambient), u.TempU()),
		Grids: []output.Grid{g, c, fg}, Caution: true,
		Notes: []string{
			fmt.Sprintf("Casting limits (%s): %s.", p.Name, processSource(p)),
			fmt.Sprintf("%d designs evaluated: a grid of %d levels per variable, then compass search from the best grid points.", res.Evals, levels),
			designNote(broken, p),
			keepNote,
		}}
	setJSON := func(o optSet, x []float64) map[string]any {
		y := x[o.off : o.off+5]
		return map[string]any{"pitch_m": y[0], "height_m": y[1], "root_thickness_m": y[2], "tip_thickness_m": y[3], "count": int(y[4])}
	}
	optimum := map[string]any{"wall_K": bt, "fin_mass_kg": bm, "other_set_wall_K": bo}
	if both {
		optimum = map[string]any{"head": setJSON(sets[0], res.X), "barrel": setJSON(sets[1], res.X), "head_wall_K": bt, "barrel_wall_K": bo, "fin_mass_kg": bm}
	} else {
		for k, v := range setJSON(sets[0], res.X) {
			optimum[k] = v
		}
	}
	setName := primary
	if both {
		setName = "both"
	}
	js := map[string]any{"design": d.Name, "set": setName, "goal": goal, "process": p, "optimum": optimum,
		"constraints": checks, "front": frontJSON(front, sets), "evaluations": res.Evals, "caution": output.Caution,
		"speed_m_s": d.Case.Speed, "ambient_K": d.Case.Ambient, "pressure_Pa": d.Case.Pressure}
	if dok {
		js["as_designed"] = map[string]any{"wall_K": dt, "fin_mass_kg": dm, "other_set_wall_K": do}
	}
	if goal == "light" {
		js["limit_K"] = limit
	}
	doc.JSON = js
	return e.emit(doc)
}

func designNote(broken []string, p fins.Process) string {
	if len(broken) == 0 {
		return "The design itself keeps the " + p.Name + " limits."
	}
	return "The design itself breaks the " + p.Name + " limits on " + strings.Join(broken, " and ") + "; its column shows it as drawn."
}

func processSource(p fins.Process) string {
	for _, q := range fins.Processes {
		if strings.HasPrefix(p.Name, q.Name) {
			return q.Source
		}
	}
	return "user supplied"
}

// pareto returns the feasible points not dominated in (mass, temperature),
// lightest first, thinned to at most 12 rows spread along the front.
func pareto(pts []optPoint) []optPoint {
	var f []optPoint
	for _, p := range pts {
		if p.feasible {
			f = append(f, p)
		}
	}
	sort.Slice(f, func(i, j int) bool { return f[i].mass < f[j].mass || f[i].mass == f[j].mass && f[i].t < f[j].t })
	var front []optPoint
	best := math.Inf(1)
	for _, p := range f {
		if p.t < best-1e-9 {
			front = append(front, p)
			best = p.t
		}
	}
	if len(front) <= 12 {
		return front
	}
	// twelve rows spread evenly in fin mass (the search crowds the front
	// near its optimum), always keeping both ends
	lo, hi := front[0].mass, front[len(front)-1].mass
	out := make([]optPoint, 0, 12)
	j := 0
	for i := 0; i < 12; i++ {
		target := lo + (hi-lo)*float64(i)/11
		for j < len(front)-1 && math.Abs(front[j+1].mass-target) <= math.Abs(front[j].mass-target) {
			j++
		}
		if len(out) == 0 || out[len(out)-1].mass != front[j].mass {
			out = append(out, front[j])
		}
	}
	return out
}

func frontJSON(f []optPoint, sets []optSet) []map[string]float64 {
	var out []map[string]float64
	for _, p := range f {
		m := map[string]float64{"fin_mass_kg": p.mass, "wall_K": p.t}
		for _, o := range sets {
			pre := ""
			if len(sets) > 1 {
				pre = o.name + "_"
			}
			y := p.x[o.off : o.off+5]
			m[pre+"pitch_m"], m[pre+"height_m"], m[pre+"root_thickness_m"], m[pre+"tip_thickness_m"], m[pre+"count"] = y[0], y[1], y[2], y[3], y[4]
		}
		out = append(out, m)
	}
	return out
}
