package app

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/optimise"
	"finmarch/airflow/uncertainty"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
)

func (e *env) optimiseCmd() *cobra.Command {
	var set, goal, process, limit, minThick, maxAspect, draft, stepFlag, write string
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
passes both sets in series. Lengths are searched on whole multiples of --step
(0.5 mm unless given), the sizes a pattern maker works to, so the optimum is
estimated as it would be made; the search starts from the design and from many
points spread over the bounds, so that it finds the same optimum from any bounds
that hold it. It prints the optimum, the constraints that hold it, the trade-off
front of temperature against fin mass from every design it evaluated, and the
optimum's keys for the design file (--write FILE writes the design with them).`,
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
			// each set's own process (its casting key, else
			// cylinder.casting), or --process for both
			procs := [2]fins.Process{d.CastingOf(0), d.CastingOf(1)}
			if process != "" {
				p, err := fins.LookupProcess(process)
				if err != nil {
					return fail(ExitUsage, err)
				}
				procs = [2]fins.Process{p, p}
			}
			for _, o := range []struct {
				flag, s string
				parse   func(string) (float64, error)
			}{
				{"--min-thickness", minThick, design.ParseValue[design.Length]},
				{"--max-aspect", maxAspect, func(s string) (float64, error) { return design.ParseFor("air.pressure_recovery", s) }},
				{"--draft", draft, design.ParseValue[design.Angle]},
			} {
				if o.s == "" {
					continue
				}
				v, err := o.parse(o.s)
				if err == nil && !(v >= 0) {
					err = fmt.Errorf("a negative limit; give 0 or more")
				}
				if err != nil {
					return fail(ExitUsage, fmt.Errorf("%s %q: %v", o.flag, o.s, err))
				}
				for i := range procs {
					adjust(&procs[i], o.flag, v)
				}
			}
			lim := d.HeadLimit
			if set == "barrel" {
				lim = d.BarrelLimit
			}
			if limit != "" && goal != string(optimise.GoalLight) {
				return fail(ExitUsage, fmt.Errorf("--limit %q: only --goal light uses it (--goal %s seeks the coolest wall)", limit, goal))
			}
			if limit != "" {
				// checked by the design file's own rules for the limit key
				// (its range and the alloy's service temperature)
				key := "limits." + map[bool]string{true: "barrel", false: "head"}[set == "barrel"]
				v, err := design.ParseFor(key, limit)
				if err == nil {
					_, err = d.With(map[string]float64{key: v})
				}
				if err != nil {
					return fail(ExitUsage, fmt.Errorf("--limit %q: %v", limit, err))
				}
				lim = v
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
			step, err := design.ParseValue[design.Length](stepFlag)
			if err == nil && !(step >= minStep && step <= maxStep) {
				err = fmt.Errorf("allowed %g to %g mm", minStep*1e3, maxStep*1e3)
			}
			if err != nil {
				return fail(ExitUsage, fmt.Errorf("--step %q: %v", stepFlag, err))
			}
			var vars [][]optimise.Var
			for _, n := range names {
				v, err := optBounds(d, n, procs[map[string]int{"head": 0, "barrel": 1}[n]], ranges, step, stepFlag)
				if err != nil {
					return err
				}
				vars = append(vars, v)
			}
			return e.optimise(d, names, goal, procs, lim, vars, levels, step, write)
		},
	}
	f := cmd.Flags()
	f.StringVar(&set, "set", "head", "fin set to optimise: head, barrel, or both (the head's wall with the barrel's limit kept)")
	f.StringVar(&goal, "goal", "cool", "cool (lowest wall temperature) or light (least fin mass within the limit)")
	f.StringVar(&process, "process", "", "casting process for the sets varied: sand, permanent-mould, die-casting or machined (default: each set's casting key, else the design's cylinder.casting)")
	complete(cmd, "process", processNames)
	complete(cmd, "set", func() []string { return []string{"head", "barrel", "both"} })
	complete(cmd, "goal", func() []string { return []string{"cool", "light"} })
	f.StringVar(&limit, "limit", "", "wall temperature limit for --goal light (default: the design's limit)")
	f.StringVar(&minThick, "min-thickness", "", "override the process's minimum fin thickness")
	f.StringVar(&maxAspect, "max-aspect", "", "override the process's maximum height-to-gap ratio")
	f.StringVar(&draft, "draft", "", "override the process's minimum draft angle per face, e.g. \"1 deg\"")
	f.IntVar(&levels, "levels", 5, "grid levels per variable before the pattern search")
	f.StringVar(&stepFlag, "step", "0.5 mm", fmt.Sprintf("size step of the lengths (pitch, height, thicknesses): the optimum is a whole multiple of it, %g to %g mm", minStep*1e3, maxStep*1e3))
	f.StringVar(&write, "write", "", "write the design with the optimum's fin keys set to this file")
	for _, v := range []string{"pitch", "height", "root-thickness", "tip-thickness", "count"} {
		s := ""
		ranges[v] = &s
		f.StringVar(ranges[v], v, "", "bounds FROM:TO for the "+v+" (default: around the design)")
	}
	return cmd
}

// The range of --step: from a machinist's hundredth of a millimetre to a
// coarse 5 mm.
const minStep, maxStep = 1e-5, 5e-3

// optBounds returns the variables of one fin set: the library's defaults
// around the design, with the bounds the flags give, narrowed to the
// multiples of step within them (optimise.Problem.OnStep); a bound that
// holds no multiple is an error naming its flag.
func optBounds(d *design.Design, set string, p fins.Process, ranges map[string]*string, step float64, stepFlag string) ([]optimise.Var, error) {
	s := d.Case.Head.Set
	if set == "barrel" {
		s = d.Case.Barrel.Set
	}
	vars := optimise.DefaultVars(s, p)
	for i := range vars {
		v := &vars[i]
		if r := *ranges[v.Name]; r != "" {
			a, b, ok := strings.Cut(r, ":")
			if !ok {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q: write FROM:TO", v.Name, r))
			}
			var err error
			key := set + "." + v.Key
			if v.Lo, err = design.ParseFor(key, a); err == nil {
				v.Hi, err = design.ParseFor(key, b)
			}
			if err != nil {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q: %v", v.Name, r, err))
			}
			if !(v.Hi >= v.Lo) || v.Lo < 0 {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q: need 0 <= FROM <= TO", v.Name, r))
			}
		}
	}
	if *ranges["count"] == "" {
		optimise.FitCount(vars, s)
	}
	on, err := optimise.Problem{Vars: [][]optimise.Var{vars}, Step: step}.OnStep(0)
	if err != nil {
		for _, v := range vars {
			if v.Integer || math.Ceil(v.Lo/step-1e-9) <= math.Floor(v.Hi/step+1e-9) {
				continue
			}
			mm := func(x float64) string { return strconv.FormatFloat(x*1e3, 'g', 6, 64) + " mm" }
			if r := *ranges[v.Name]; r != "" {
				return nil, fail(ExitUsage, fmt.Errorf("--%s %q holds no multiple of --step %s; widen it or give a finer --step", v.Name, r, stepFlag))
			}
			return nil, fail(ExitUsage, fmt.Errorf("--step %q: the %s %s bounds around the design, %s to %s, hold no multiple of it; give a finer --step or set --%s", stepFlag, set, v.Name, mm(v.Lo), mm(v.Hi), v.Name))
		}
		return nil, fail(ExitUsage, err)
	}
	return on, nil
}

// optimise searches the fin sets names (one set, or head and barrel
// together) for goal at the design's operating point and reports the
// optimum, its constraints and the trade-off front. Each candidate is the
// design with the keys of its fin sets changed, checked by the design
// file's rules (Design.With).
func (e *env) optimise(d *design.Design, names []string, goal string, procs [2]fins.Process, limit float64, vars [][]optimise.Var, levels int, step float64, write string) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	pr := optimise.Problem{Base: d.Cylinder(), Settings: d.Run, Vars: vars, Goal: optimise.Goal(goal), Limit: limit, Process: procs[0], BarrelProcess: procs[1], Levels: levels, Step: step}
	for _, n := range names {
		pr.Sets = append(pr.Sets, map[string]int{"head": optimise.Head, "barrel": optimise.Barrel}[n])
	}
	pr.Variant = func(sets [2]fins.Set) (cylinder.Design, cylinder.Settings, error) {
		vals := map[string]float64{}
		for _, i := range pr.Sets {
			n, s := optimise.SetNames[i], sets[i]
			vals[n+".pitch"], vals[n+".height"], vals[n+".root_thickness"], vals[n+".tip_thickness"], vals[n+".count"] = s.Pitch, s.Height, s.RootThickness, s.TipThickness, float64(s.Count)
		}
		v, err := d.With(vals)
		if err != nil {
			return cylinder.Design{}, cylinder.Settings{}, err
		}
		return v.Cylinder(), v.Run, nil
	}
	sol, err := optimise.Solve(pr)
	if err != nil {
		return fail(ExitUsage, err)
	}
	if !sol.Found {
		return fail(ExitModel, fmt.Errorf("%s: %s", d.Name, e.noOptimum(pr, sol, u)))
	}
	doc := e.optimumDoc(d, pr, sol, u)
	kvs := optimumKeys(pr, sol.Optimum.X)
	// the optimum as a design file gives it, parsed and estimated once for
	// the notes on its other methods and its band
	if nd, err := e.parse(design.SetKeys(e.sources[d.Source], kvs), d.Source); err == nil {
		if after, err := evaluate(nd, nd.Case.Speed); err == nil {
			if n := otherMethodsNote(d, pr, after, u); n != "" {
				doc.Notes = append(doc.Notes, n)
			}
			n, err := e.bandNote(d, nd, after, pr, u, doc.JSON)
			if err != nil {
				return err
			}
			if n != "" {
				doc.Notes = append(doc.Notes, n)
			}
		}
	}
	if write != "" {
		if err := e.writeOptimum(d, pr, sol, kvs, write); err != nil {
			return err
		}
		doc.Notes = append(doc.Notes, fmt.Sprintf("Wrote %s: the design with the optimum's fin keys set; 'finmarch estimate %s' gives the same %s wall temperature (at this run's operating point).", write, write, optimise.SetNames[pr.Primary()]))
	} else {
		doc.Blocks = append(doc.Blocks, output.Block{Caption: "To make it, set these keys in the design (or run with --write FILE for the design with them set):", Text: keysTOML(kvs)})
	}
	return e.emit(doc)
}

// optimumKeys are the design keys of the optimum's fin sets, lengths in
// millimetres as the step left them (to a nanometre).
func optimumKeys(pr optimise.Problem, x []float64) []design.KV {
	mm := func(v float64) string {
		return strconv.Quote(strconv.FormatFloat(math.Round(v*1e9)/1e6, 'f', -1, 64) + " mm")
	}
	var kvs []design.KV
	for k, i := range pr.Sets {
		n, y := optimise.SetNames[i], x[5*k:5*k+5]
		kvs = append(kvs, design.KV{Key: n + ".count", Value: strconv.Itoa(int(y[4]))},
			design.KV{Key: n + ".pitch", Value: mm(y[0])}, design.KV{Key: n + ".height", Value: mm(y[1])},
			design.KV{Key: n + ".root_thickness", Value: mm(y[2])}, design.KV{Key: n + ".tip_thickness", Value: mm(y[3])})
	}
	return kvs
}

// keysTOML writes the keys as TOML lines under their tables' headers,
// text to paste over the same keys of a design file.
func keysTOML(kvs []design.KV) string {
	var b strings.Builder
	tbl := ""
	for _, kv := range kvs {
		t, key, _ := strings.Cut(kv.Key, ".")
		if t != tbl {
			fmt.Fprintf(&b, "[%s]\n", t)
			tbl = t
		}
		fmt.Fprintf(&b, "%s = %s\n", key, kv.Value)
	}
	return b.String()
}

// otherMethodsNote says how the optimised set runs by the air-side
// methods the search did not use, against the design as drawn: an
// optimum of one method can be worse by another, and the spread is the
// model's own uncertainty. "" when only one method applies.
func otherMethodsNote(d *design.Design, pr optimise.Problem, after outcome, u output.Units) string {
	before, err := evaluate(d, d.Case.Speed)
	if err != nil {
		return ""
	}
	set := pr.Primary()
	var parts []string
	for i, m := range after.Result.Methods {
		if m.Used || !m.Applies || i >= len(before.Result.Methods) {
			continue
		}
		b := before.Result.Methods[i]
		wa, wb, eqa, eqb := m.Head, b.Head, m.HeadEq, b.HeadEq
		if set == 1 {
			wa, wb, eqa, eqb = m.Barrel, b.Barrel, m.BarrelEq, b.BarrelEq
		}
		parts = append(parts, fmt.Sprintf("%s %s %s (as drawn %s)", m.Method, methodWall(u, wa, eqa), u.Name(output.Temp), methodWall(u, wb, eqb)))
	}
	if len(parts) == 0 {
		return ""
	}
	return fmt.Sprintf("The search used %s's method; by the others the optimum's %s runs at %s. An optimum of one method can be worse by another: the spread is the model's own uncertainty ('finmarch estimate' on the result shows every method and the band).",
		after.Result.Method, optimise.SetNames[set], strings.Join(parts, ", "))
}

// writeOptimum writes the design with the optimum's keys set, after
// checking that the text parses and estimates (at this run's operating
// point) to the optimum's own temperatures: what is written is what was
// reported.
func (e *env) writeOptimum(d *design.Design, pr optimise.Problem, sol optimise.Solution, kvs []design.KV, path string) error {
	out := design.SetKeys(e.sources[d.Source], kvs)
	nd, err := e.parse(out, path)
	if err != nil {
		return fail(ExitInternal, fmt.Errorf("the optimised design does not parse: %w", err))
	}
	o, err := evaluate(nd, nd.Case.Speed)
	if err != nil {
		return err
	}
	walls := [2]float64{o.Result.Head.WallTemp, o.Result.Barrel.WallTemp}
	if got := walls[pr.Primary()]; math.Abs(got-sol.Optimum.Wall) > 1e-6 {
		return fail(ExitInternal, fmt.Errorf("the optimised design estimates to %.4f K, the search to %.4f K", got, sol.Optimum.Wall))
	}
	return e.write(path, out)
}

// noOptimum says why no design holds the limits, how close the search
// came, and what to change.
func (e *env) noOptimum(pr optimise.Problem, sol optimise.Solution, u output.Units) string {
	primary, other := optimise.SetNames[pr.Primary()], optimise.SetNames[pr.Other()]
	L := func(v float64) string { return u.N(u.Of(output.Len, v), u.Dec(output.Len)+1) }
	why := "no design within the bounds and casting limits reaches an equilibrium"
	if pr.Goal == optimise.GoalLight {
		why = fmt.Sprintf("no design within the bounds and casting limits keeps the %s at or below %s %s", primary, fmtT(u, pr.Limit), u.Name(output.Temp))
	}
	if sol.GuardOther {
		why += fmt.Sprintf(" with the %s at or below its %s %s", other, fmtT(u, sol.OtherLimit), u.Name(output.Temp))
	}
	if best := sol.Closest; best != nil {
		why += fmt.Sprintf(" (the coolest it found runs at %s %s", fmtT(u, best.Wall), u.Name(output.Temp))
		for k, i := range pr.Sets {
			y := best.X[5*k : 5*k+5]
			why += fmt.Sprintf(", %s %d fins at %s %s pitch, %s %s high", optimise.SetNames[i], int(y[4]), L(y[0]), u.Name(output.Len), L(y[1]), u.Name(output.Len))
		}
		why += ")"
	}
	more := ""
	if sol.Series && !pr.Both() {
		more = fmt.Sprintf("; the air passes the head and then the barrel fins in series here, so the %s fins, which this search keeps as they are, meter it too: 'finmarch sweep --vary %s.pitch=...' shows what they do to the %s, and --set both varies them together", other, other, primary)
	}
	return fmt.Sprintf("%s; widen the bounds (--pitch, --height, ...), choose a finer process, or lower the load%s", why, more)
}

// optimumDoc is the optimiser's report: the optimum against the design,
// the constraints that hold it, the trade-off front, and the JSON.
func (e *env) optimumDoc(d *design.Design, pr optimise.Problem, sol optimise.Solution, u output.Units) output.Doc {
	both, goal := pr.Both(), string(pr.Goal)
	p := pr.ProcessOf(pr.Primary())
	if both && pr.ProcessOf(optimise.Barrel).Name != pr.Process.Name {
		// two processes: named by set wherever one name is written
		p.Name = fmt.Sprintf("head %s, barrel %s", pr.Process.Name, pr.ProcessOf(optimise.Barrel).Name)
	}
	primary, other := optimise.SetNames[pr.Primary()], optimise.SetNames[pr.Other()]
	L := func(v float64) string { return u.N(u.Of(output.Len, v), u.Dec(output.Len)+1) }
	opt := sol.Optimum
	bt, bm, bo := opt.Wall, opt.Mass, opt.Other
	// label prefixes a row with the set's name when both sets vary
	label := func(k int, s string) string {
		if both {
			return optimise.SetNames[pr.Sets[k]] + " " + s
		}
		return s
	}
	title := fmt.Sprintf("Optimum %s fins (%s, goal %s)", primary, p.Name, goal)
	if both {
		title = fmt.Sprintf("Optimum head and barrel fins (%s, goal %s)", p.Name, goal)
	}
	g := output.Grid{Title: title, Header: []string{"quantity", "unit", "design", "optimum", "bounds"}, Left: 2}
	cur := pr.X()
	for k, vs := range pr.Vars {
		for i, v := range vs {
			xi, ci := opt.X[5*k+i], cur[5*k+i]
			if v.Integer {
				g.Rows = append(g.Rows, []string{label(k, v.Name), "", fmt.Sprint(int(ci)), fmt.Sprint(int(xi)), fmt.Sprintf("%d to %d", int(v.Lo), int(v.Hi))})
				continue
			}
			g.Rows = append(g.Rows, []string{label(k, v.Name), u.Name(output.Len), L(ci), L(xi), L(v.Lo) + " to " + L(v.Hi)})
		}
	}
	ad := sol.AsDesigned
	dT, dM, dO := "n/a", "n/a", "n/a"
	if ad.Feasible {
		dT, dM, dO = fmtT(u, ad.Wall), u.N(u.Of(output.Mass, ad.Mass), 3), fmtT(u, ad.Other)
	}
	if both {
		g.Rows = append(g.Rows, []string{"head wall temperature", u.Name(output.Temp), dT, fmtT(u, bt), ""},
			[]string{"barrel wall temperature", u.Name(output.Temp), dO, fmtT(u, bo), ""},
			[]string{"fin mass, both sets", u.Name(output.Mass), dM, u.N(u.Of(output.Mass, bm), 3), ""})
	} else {
		g.Rows = append(g.Rows, []string{primary + " wall temperature", u.Name(output.Temp), dT, fmtT(u, bt), ""},
			[]string{primary + " fin mass", u.Name(output.Mass), dM, u.N(u.Of(output.Mass, bm), 3), ""},
			[]string{other + " wall temperature (fins as designed)", u.Name(output.Temp), dO, fmtT(u, bo), ""})
	}
	if goal == "light" {
		g.Rows = append(g.Rows, []string{"limit", u.Name(output.Temp), "", fmtT(u, pr.Limit), ""})
	}
	checks := pr.Constraints(sol, label)
	c := constraintGrid(checks, u)
	fg := frontGrid(pr, sol, u, label)
	keepNote := "The other fin set and everything else stay as the design has them; check the result with 'finmarch estimate' after editing the design."
	if both {
		keepNote = "Everything but the two fin sets stays as the design has it; check the result with 'finmarch estimate' after editing the design."
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: fin optimisation at %s %s, ambient %s %s", d.Name, u.N(u.Of(output.Road, d.Case.Speed), 0), u.Name(output.Road), fmtT(u, d.Case.Ambient), u.Name(output.Temp)),
		Grids: []output.Grid{g, c, fg}, Caution: true,
		Notes: []string{
			castingLimitsNote(pr, p),
			fmt.Sprintf("Sizes are whole multiples of %s %s (--step), as a pattern maker works to: the optimum and every design on the front were estimated at those sizes, and no design a step away (in any combination of each set's pitch, height, thicknesses and count) does better.", strconv.FormatFloat(u.Of(output.Len, pr.Step), 'g', 4, 64), u.Name(output.Len)),
			fmt.Sprintf("%d designs evaluated: a grid of %d levels per variable and %d points spread over the bounds, then compass search from %d starts (the design as drawn and the best points apart from each other).", sol.Evals, pr.Levels, sol.Sample, sol.Starts),
			designNote(sol.Broken, p),
			keepNote,
		}}
	setJSON := func(k int, x []float64) map[string]any {
		y := x[5*k : 5*k+5]
		return map[string]any{"pitch_m": y[0], "height_m": y[1], "root_thickness_m": y[2], "tip_thickness_m": y[3], "count": int(y[4])}
	}
	optimum := map[string]any{"wall_temperature_K": bt, "fin_mass_kg": bm, "other_set_wall_temperature_K": bo, "step_m": pr.Step}
	if both {
		optimum = map[string]any{"head": setJSON(0, opt.X), "barrel": setJSON(1, opt.X), "head_wall_temperature_K": bt, "barrel_wall_temperature_K": bo, "fin_mass_kg": bm, "step_m": pr.Step}
	} else {
		for k, v := range setJSON(0, opt.X) {
			optimum[k] = v
		}
	}
	setName := primary
	if both {
		setName = "both"
	}
	// the process of the varied set (the head's under --set both), and
	// the barrel's own under --set both: real limits, not a joined name
	js := map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "set": setName, "goal": goal, "process": pr.ProcessOf(pr.Primary()), "optimum": optimum,
		"constraints": checks, "front": frontJSON(sol.Front, pr), "evaluations": sol.Evals, "caution": output.Caution,
		"speed_m_s": d.Case.Speed, "ambient_K": d.Case.Ambient, "pressure_Pa": d.Case.Pressure}
	if both {
		js["barrel_process"] = pr.ProcessOf(optimise.Barrel)
	}
	if ad.Feasible {
		js["as_designed"] = map[string]any{"wall_temperature_K": ad.Wall, "fin_mass_kg": ad.Mass, "other_set_wall_temperature_K": ad.Other}
	}
	if goal == "light" {
		js["limit_K"] = pr.Limit
	}
	doc.JSON = js
	return doc
}

// constraintGrid shows the constraints in the display units.
func constraintGrid(cs []optimise.Constraint, u output.Units) output.Grid {
	L := func(v float64) string {
		return u.N(u.Of(output.Len, v), u.Dec(output.Len)+1) + " " + u.Name(output.Len)
	}
	deg := func(v float64) string { return u.N(v*180/math.Pi, 2) + " deg" }
	yes := map[bool]string{true: "yes", false: "no"}
	g := output.Grid{Title: "Constraints at the optimum (slack 0 = active)", Header: []string{"constraint", "limit", "value", "slack", "active"}, Left: 1}
	for _, c := range cs {
		var lim, val, slack string
		switch c.Unit {
		case "m":
			lim, val, slack = L(c.Limit), L(c.Value), L(c.Slack)
			if c.Range != nil {
				lim = strings.TrimSuffix(L(c.Range[0]), " "+u.Name(output.Len)) + " to " + L(c.Range[1])
			}
		case "count":
			lim, val, slack = fmt.Sprintf("%d to %d", int(c.Range[0]), int(c.Range[1])), fmt.Sprint(int(c.Value)), "0"
		case "rad":
			lim, val, slack = deg(c.Limit), deg(c.Value), deg(c.Slack)
		case "K":
			lim, val, slack = fmtT(u, c.Limit)+" "+u.Name(output.Temp), fmtT(u, c.Value)+" "+u.Name(output.Temp), fmtDT(u, c.Slack)
		default:
			lim, val, slack = u.N(c.Limit, 2), u.N(c.Value, 2), u.N(c.Slack, 2)
		}
		if c.Kind == "bound" {
			slack = "0"
		}
		g.Rows = append(g.Rows, []string{c.Name, lim, val, slack, yes[c.Active]})
	}
	return g
}

// frontGrid is the trade-off front, the optimum marked.
func frontGrid(pr optimise.Problem, sol optimise.Solution, u output.Units, label func(int, string) string) output.Grid {
	L := func(v float64) string { return u.N(u.Of(output.Len, v), u.Dec(output.Len)+1) }
	massHead := "fin mass (" + u.Name(output.Mass) + ")"
	if pr.Both() {
		massHead = "fin mass, both (" + u.Name(output.Mass) + ")"
	}
	hdr := []string{massHead, optimise.SetNames[pr.Primary()] + " (" + u.Name(output.Temp) + ")"}
	for k := range pr.Sets {
		for _, col := range []string{"pitch", "height", "root", "tip"} {
			hdr = append(hdr, label(k, col)+" ("+u.Name(output.Len)+")")
		}
		hdr = append(hdr, label(k, "count"))
	}
	fg := output.Grid{Title: "Trade-off front: wall temperature against fin mass (evaluated designs that no other beats on both)", Header: append(hdr, "")}
	for _, q := range sol.Front {
		row := []string{u.N(u.Of(output.Mass, q.Mass), 3), fmtT(u, q.Wall)}
		for k := range pr.Sets {
			y := q.X[5*k : 5*k+5]
			row = append(row, L(y[0]), L(y[1]), L(y[2]), L(y[3]), fmt.Sprint(int(y[4])))
		}
		mark := ""
		if q.Mass == sol.Optimum.Mass && q.Wall == sol.Optimum.Wall {
			mark = "optimum"
		}
		fg.Rows = append(fg.Rows, append(row, mark))
	}
	return fg
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

func frontJSON(f []optimise.Point, pr optimise.Problem) []map[string]float64 {
	var out []map[string]float64
	for _, p := range f {
		m := map[string]float64{"fin_mass_kg": p.Mass, "wall_temperature_K": p.Wall}
		for k, i := range pr.Sets {
			pre := ""
			if pr.Both() {
				pre = optimise.SetNames[i] + "_"
			}
			y := p.X[5*k : 5*k+5]
			m[pre+"pitch_m"], m[pre+"height_m"], m[pre+"root_thickness_m"], m[pre+"tip_thickness_m"], m[pre+"count"] = y[0], y[1], y[2], y[3], y[4]
		}
		out = append(out, m)
	}
	return out
}

// adjust sets the limit a process flag overrides (--min-thickness,
// --max-aspect, --draft) on p, and marks its name adjusted once.
func adjust(p *fins.Process, flag string, v float64) {
	switch flag {
	case "--min-thickness":
		p.MinThickness = v
	case "--max-aspect":
		p.MaxAspect = v
	case "--draft":
		p.MinDraft = v
	}
	if !strings.HasSuffix(p.Name, " (adjusted)") {
		p.Name += " (adjusted)"
	}
}

// castingLimitsNote names the casting limits the search kept and their
// source: one process, or each set's when they differ.
func castingLimitsNote(pr optimise.Problem, p fins.Process) string {
	h, b := pr.ProcessOf(optimise.Head), pr.ProcessOf(optimise.Barrel)
	if !pr.Both() || h.Name == b.Name {
		return fmt.Sprintf("Casting limits (%s): %s.", p.Name, processSource(p))
	}
	return fmt.Sprintf("Casting limits: head %s (%s); barrel %s (%s).", h.Name, processSource(h), b.Name, processSource(b))
}

// bandNote gives the band of the optimum nd (estimated as o) beside the
// design's as drawn: the objective wall's 5th to 95th percentile and its
// chance over the limit the search held. The search holds the nominal
// estimate at the limit, so under --goal light the optimum goes over it
// at least half the time; the note says how far below a limit the nominal
// wall must sit for a 5 % chance (the band's 95th percentile above the
// nominal wall), or, where that is too far, to calibrate first. The band
// goes into the JSON as "band". "" without a band (--samples 0).
func (e *env) bandNote(d, nd *design.Design, o outcome, pr optimise.Problem, u output.Units, js any) (string, error) {
	set := pr.Primary()
	// the chance is counted over the limit the search held (--limit under
	// --goal light), for the optimum and the design as drawn alike
	lim := nd.HeadLimit
	if set == optimise.Barrel {
		lim = nd.BarrelLimit
	}
	if pr.Goal == optimise.GoalLight {
		lim = pr.Limit
	}
	held := func(x *design.Design) *design.Design {
		c := *x
		if set == optimise.Barrel {
			c.BarrelLimit = lim
		} else {
			c.HeadLimit = lim
		}
		return &c
	}
	after, err := e.band(held(nd), nd.Case.Speed)
	if err != nil || after == nil {
		return "", err
	}
	before, err := e.band(held(d), d.Case.Speed)
	if err != nil || before == nil {
		return "", err
	}
	pick := func(b *uncertainty.Band) (uncertainty.Percentiles, float64) {
		if set == optimise.Barrel {
			return b.Barrel, b.BarrelOver
		}
		return b.Head, b.HeadOver
	}
	pa, oa := pick(after)
	pb, ob := pick(before)
	wall := o.Result.Head.WallTemp
	if set == optimise.Barrel {
		wall = o.Result.Barrel.WallTemp
	}
	if m, ok := js.(map[string]any); ok {
		putBand(m, "band", after)
	}
	T := u.Name(output.Temp)
	name := optimise.SetNames[set]
	note := fmt.Sprintf("The band (%d samples, as 'finmarch estimate' draws it): the optimum's %s %s %s, a %.0f %% chance over its %s %s limit; as drawn %s %s, %.0f %%.",
		after.Samples, name, bandText(u, pa), T, 100*oa, fmtT(u, lim), T, bandText(u, pb), T, 100*ob)
	if pr.Goal == optimise.GoalLight && pa.P95 > wall && oa > 0.05 {
		note += " The search holds the nominal estimate at the limit, so the band puts the lightest fins over it that often"
		switch excess := pa.P95 - wall; {
		case math.IsInf(pa.P95, 1):
			note += ", and more than 5 % of it finds no equilibrium: do not cut a pattern from it before a measurement."
		case wall-excess > nd.Case.Ambient+0.5*(wall-nd.Case.Ambient):
			note += fmt.Sprintf(": for a 5 %% chance the nominal wall must sit about %s %s below the limit you mean to keep (the band's 95th percentile above the nominal wall), so run with --limit that much below it, and read the result's chance against your limit, not the --limit.",
				fmtDT(u, excess), u.Name(output.TempDiff))
		default:
			note += fmt.Sprintf("; the band's 95th percentile lies %s %s above the nominal wall, too far for a lower --limit to buy back: a reading on the running engine narrows the band ('finmarch calibrate'), and the optimum of the calibrated design can be held to its limit.",
				fmtDT(u, excess), u.Name(output.TempDiff))
		}
	}
	return note, nil
}
