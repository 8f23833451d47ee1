package app

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
	"finmarch/materials"
)

const (
	noteModel = "Model: fin efficiency by exact 1-D fin solutions (Incropera 6th ed. Table 3.5; tapered annular fins by a finite-volume solve), " +
		"passage heat transfer by Stephan (Shah & London 1978) blended to Gnielinski (VDI Heat Atlas 2010), natural convection by " +
		"Bar-Cohen & Rohsenow (1984) combined as Nu^3 = NuF^3 + NuN^3, radiation from the fin envelope; see README 'Model and sources'."
	noteWall = "Wall temperature is the metal at the fin roots, averaged over the fin set; the combustion-side surface and the " +
		"spark-plug seat run hotter."
)

func fmtT(u output.Units, k float64) string  { return output.Num(u.Of(output.Temp, k), 1) }
func fmtDT(u output.Units, k float64) string { return output.Num(u.Of(output.TempDiff, k), 1) }

func (e *env) demoCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "demo",
		Short: "Run the built-in demo: one cylinder upright against laid over",
		Args:  cobra.NoArgs,
		RunE:  func(*cobra.Command, []string) error { return e.runDemo() },
	}
}

func (e *env) runDemo() error {
	var ds []*design.Design
	for _, f := range demo.Files {
		d, err := e.parse(f.Src, f.Name)
		if err != nil {
			return fail(ExitInternal, fmt.Errorf("built-in demo: %w", err))
		}
		ds = append(ds, d)
	}
	doc, err := e.compareDoc(ds, "finmarch demo: an invented 500 cc-class single at cruise, upright against laid over")
	if err != nil {
		return err
	}
	doc.Notes = append(doc.Notes, "Try your own: 'finmarch new my-cylinder.toml' writes a commented design; "+
		"'finmarch estimate my-cylinder.toml' estimates it; 'finmarch --help' lists the other commands.")
	return e.emit(doc)
}

// oneDesign builds a command that reads one design file and runs fn on it.
func (e *env) oneDesign(use, short string, fn func(*design.Design) error) *cobra.Command {
	return &cobra.Command{
		Use:               use,
		Short:             short,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			return fn(d)
		},
	}
}

// parseSpeedRange reads the --from, --to and --step flags of a speed range.
func parseSpeedRange(from, to, step string) ([3]float64, error) {
	var v [3]float64
	for i, s := range []struct{ name, val string }{{"--from", from}, {"--to", to}, {"--step", step}} {
		x, err := design.ParseValue[design.Speed](s.val)
		if err != nil {
			return v, fail(ExitUsage, fmt.Errorf("%s: %w", s.name, err))
		}
		v[i] = x
	}
	return v, nil
}

func (e *env) estimateCmd() *cobra.Command {
	return e.oneDesign("estimate DESIGN.toml", "Estimate head and barrel temperature (or heat rejected at given walls) at cruise", e.estimate)
}

func (e *env) estimate(d *design.Design) error {
	doc, o, err := e.estimateDoc(d)
	if err != nil {
		return err
	}
	if err := e.emit(doc); err != nil {
		return err
	}
	if o.NoEquilibrium != nil {
		return modelError(d.Name, o.NoEquilibrium)
	}
	return nil
}

// estimateDoc evaluates the design at cruise and builds the estimate's
// document: the heat-balance grid, the notes, the warnings and the JSON.
func (e *env) estimateDoc(d *design.Design) (output.Doc, outcome, error) {
	_, u, err := e.settings()
	if err != nil {
		return output.Doc{}, outcome{}, err
	}
	o, err := evaluate(d, d.Case.Speed)
	if err != nil {
		return output.Doc{}, o, err
	}
	h, b := o.Result.Head, o.Result.Barrel
	c := d.Case
	doc := output.Doc{
		Title: fmt.Sprintf("%s: %s %s, ambient %s %s, altitude %s %s (%s %s), tilt %.0f deg", d.Name,
			output.Num(u.Of(output.Road, c.Speed), 0), u.Name(output.Road), fmtT(u, c.Ambient), u.Name(output.Temp),
			output.Num(u.Of(output.Alt, d.Altitude), 0), u.Name(output.Alt), output.Num(u.Of(output.Press, c.Pressure), 1), u.Name(output.Press), c.Tilt*180/math.Pi),
		Caution: true,
	}
	pair := func(f func(r cylinder.SetResult) string) []string { return []string{f(h), f(b)} }
	row := func(q, unit string, vals []string) []string { return append([]string{q, unit}, vals...) }
	g := output.Grid{Title: "Heat balance per fin set", Header: []string{"quantity", "unit", "head", "barrel"}, Left: 2}
	if o.Fixed {
		g.Rows = append(g.Rows, row("wall temperature (given)", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return fmtT(u, r.WallTemp) })))
	} else {
		g.Rows = append(g.Rows,
			row("heat load", "W", pair(func(r cylinder.SetResult) string { return output.Num(r.HeatLoad, 0) })))
	}
	g.Rows = append(g.Rows,
		row("heat rejected", "W", pair(func(r cylinder.SetResult) string { return output.Num(r.HeatRejected, 0) })),
		row("  by convection", "W", pair(func(r cylinder.SetResult) string { return output.Num(r.ConvectionHeat, 0) })),
		row("    forced alone", "W", pair(func(r cylinder.SetResult) string { return output.Num(r.ForcedHeat, 0) })),
		row("    natural alone", "W", pair(func(r cylinder.SetResult) string { return output.Num(r.NaturalHeat, 0) })),
		row("  by radiation", "W", pair(func(r cylinder.SetResult) string { return output.Num(r.RadiationHeat, 0) })),
	)
	if !o.Fixed {
		g.Rows = append(g.Rows,
			row("wall temperature at fin roots", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return fmtT(u, r.WallTemp) })),
			row("limit", u.Name(output.Temp), []string{fmtT(u, d.HeadLimit), fmtT(u, d.BarrelLimit)}),
			row("margin to limit", u.Name(output.TempDiff), []string{fmtDT(u, o.HeadMargin()), fmtDT(u, o.BarrelMargin())}),
			row("status", "", []string{setStatus(o.NoEquilibrium, h, o.HeadMargin()), setStatus(o.NoEquilibrium, b, o.BarrelMargin())}),
		)
	}
	g.Rows = append(g.Rows,
		row("air at inlet", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return fmtT(u, r.AirIn) })),
		row("air at outlet", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return fmtT(u, r.AirOut) })),
		row("air rise along the path", u.Name(output.TempDiff), pair(func(r cylinder.SetResult) string { return fmtDT(u, r.AirOut-r.AirIn) })),
		row("road speed along the fins", u.Name(output.Road), pair(func(r cylinder.SetResult) string { return output.Num(u.Of(output.Road, r.ApproachComponent), 0) })),
		row("passage velocity", u.Name(output.Vel), pair(func(r cylinder.SetResult) string { return output.Num(u.Of(output.Vel, r.PassageVelocity), 2) })),
		row("Reynolds number (2 x gap)", "-", pair(func(r cylinder.SetResult) string { return output.Num(r.Reynolds, 0) })),
		row("flow regime", "", pair(func(r cylinder.SetResult) string { return r.Regime })),
		row("air paths x path length", u.Name(output.Len), pair(func(r cylinder.SetResult) string {
			dec := 0
			if u.US {
				dec = 1
			}
			return fmt.Sprintf("%d x %s", r.Paths, output.Num(u.Of(output.Len, r.PathLength), dec))
		})),
		row("mean h (forced)", u.Name(output.H), pair(func(r cylinder.SetResult) string { return output.Num(u.Of(output.H, r.MeanH), 1) })),
		row("fin efficiency", "-", pair(func(r cylinder.SetResult) string { return output.Num(r.FinEfficiency, 3) })),
		row("surface efficiency", "-", pair(func(r cylinder.SetResult) string { return output.Num(r.SurfaceEfficiency, 3) })),
		row("finned surface (fins + base)", u.Name(output.Area), pair(func(r cylinder.SetResult) string { return output.Num(u.Of(output.Area, r.TotalArea), 3) })),
		row("fin mass", u.Name(output.Mass), pair(func(r cylinder.SetResult) string { return output.Num(u.Of(output.Mass, r.FinMass), 2) })),
		row("heat per mass of fin", u.Name(output.PerMass), pair(func(r cylinder.SetResult) string {
			return output.Num(u.Of(output.PerMass, r.HeatRejected/r.FinMass), 0)
		})),
	)
	doc.Grids = append(doc.Grids, g)
	if !o.Fixed && !d.Load.Direct {
		doc.Notes = append(doc.Notes, fmt.Sprintf("Road load at %s %s: %.2f kW at the wheel, %.2f kW at the crank, %.1f kW of fuel; %.0f%% of the fuel power to the fins of %d cylinder(s), %.0f%% of it through the head.",
			output.Num(u.Of(output.Road, c.Speed), 0), u.Name(output.Road), o.Load.WheelPower/1e3, o.Load.BrakePower/1e3, o.Load.FuelPower/1e3,
			100*d.Load.Road.CoolShare, d.Load.Road.Cylinders, 100*d.Load.Road.HeadShare))
	}
	doc.Notes = append(doc.Notes, orientationNote(d, o.Result), noteWall, noteMixed,
		energyNote(o.Result.MaxImbal),
		noteModel)
	if o.NoEquilibrium != nil {
		doc.Notes = append(doc.Notes, "NO EQUILIBRIUM: "+o.NoEquilibrium.Error()+".")
	}
	doc.Warnings = o.warnings()
	doc.Alerts = limitAlerts(u, o)
	doc.JSON = map[string]any{
		"limit_warnings": doc.Alerts,
		"design":         d.Name, "source": d.Source, "tilt_deg": c.Tilt * 180 / math.Pi, "speed_m_s": c.Speed,
		"ambient_K": c.Ambient, "pressure_Pa": c.Pressure, "altitude_m": d.Altitude,
		"load": o.Load, "result": o.Result, "head_limit_K": d.HeadLimit, "barrel_limit_K": d.BarrelLimit,
		"head_margin_K": o.HeadMargin(), "barrel_margin_K": o.BarrelMargin(), "status": o.Status(),
		"fixed_walls": o.Fixed, "equilibrium": o.NoEquilibrium == nil, "energy_imbalance": o.Result.MaxImbal,
		"warnings": doc.Warnings, "defaults_applied": d.Defaults, "caution": output.Caution,
	}
	return doc, o, nil
}

// limitAlerts says which wall is over its limit, and by how much.
func limitAlerts(u output.Units, o outcome) []string {
	if o.Fixed {
		return nil
	}
	var out []string
	for _, x := range []struct {
		name   string
		wall   float64
		limit  float64
		margin float64
	}{{"head", o.Result.Head.WallTemp, o.d.HeadLimit, o.HeadMargin()}, {"barrel", o.Result.Barrel.WallTemp, o.d.BarrelLimit, o.BarrelMargin()}} {
		if x.margin < 0 {
			out = append(out, fmt.Sprintf("%s: the %s runs at %s %s, %s %s over its %s %s limit",
				o.d.Name, x.name, fmtT(u, x.wall), u.Name(output.Temp), fmtDT(u, -x.margin), u.Name(output.TempDiff), fmtT(u, x.limit), u.Name(output.Temp)))
		}
	}
	return out
}

// noteMixed explains why the forced and natural rows do not add up.
const noteMixed = "Convection combines forced and natural as Q^3 = QF^3 + QN^3 (Churchill 1977), so the two 'alone' rows do not add up; convection plus radiation is the heat rejected."

// energyNote reports the energy check; below 1e-9 it says so rather than
// print rounding noise.
func energyNote(imb float64) string {
	v := fmt.Sprintf("%.1e", imb)
	if imb < 1e-9 {
		v = "better than 1e-9"
	}
	return "Energy check: heat taken from the metal equals the air's enthalpy rise to " + v + " (relative)."
}

func setStatus(err error, r cylinder.SetResult, margin float64) string {
	switch {
	case err != nil && r.HeatRejected < r.HeatLoad:
		return "NO EQUILIBRIUM"
	case margin < 0:
		return "OVER LIMIT"
	case margin < 15:
		return "marginal"
	}
	return "ok"
}

// orientationNote says in words how the air reaches the fins.
func orientationNote(d *design.Design, r cylinder.Result) string {
	tilt := d.Case.Tilt * 180 / math.Pi
	var parts []string
	for _, s := range []cylinder.SetResult{r.Head, r.Barrel} {
		switch {
		case s.Style == "annular":
			parts = append(parts, fmt.Sprintf("the %s's annular fins take the road-speed share in their plane (cos %.0f deg = %.2f) on %d short paths round half the circumference, each fed with ambient air",
				s.Name, tilt, math.Cos(d.Case.Tilt), s.Paths))
		case s.Series && s.Name == "head":
			parts = append(parts, fmt.Sprintf("the head's longitudinal fins take the share along the axis (sin %.0f deg = %.2f) and pass their warmed air on to the barrel fins", tilt, math.Sin(d.Case.Tilt)))
		case s.Series:
			parts = append(parts, "the barrel's longitudinal fins receive the air the head fins have already warmed")
		default:
			parts = append(parts, fmt.Sprintf("the %s's longitudinal fins take the share along the axis (sin %.0f deg = %.2f)", s.Name, tilt, math.Sin(d.Case.Tilt)))
		}
	}
	return "Orientation: " + strings.Join(parts, "; ") + ". Air striking the fin faces broadside is assumed to add nothing (conservative)."
}

func (e *env) compareCmd() *cobra.Command {
	return &cobra.Command{
		Use:               "compare DESIGN.toml DESIGN.toml [...]",
		Short:             "Compare several designs side by side at their cruise conditions",
		Args:              cobra.MinimumNArgs(2),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			var ds []*design.Design
			for _, a := range args {
				d, err := e.load(a)
				if err != nil {
					return err
				}
				ds = append(ds, d)
			}
			doc, err := e.compareDoc(ds, "Design comparison at cruise")
			if err != nil {
				return err
			}
			return e.emit(doc)
		},
	}
}

func (e *env) compareDoc(ds []*design.Design, heading string) (output.Doc, error) {
	_, u, err := e.settings()
	if err != nil {
		return output.Doc{}, err
	}
	var os []outcome
	var warns [][]string
	for _, d := range ds {
		o, err := evaluate(d, d.Case.Speed)
		if err != nil {
			return output.Doc{}, err
		}
		os = append(os, o)
		warns = append(warns, o.warnings())
	}
	g := output.Grid{Header: []string{"quantity", "unit"}, Left: 2}
	for i := range ds {
		g.Header = append(g.Header, fmt.Sprintf("%c: %s", 'A'+i, ds[i].Name))
	}
	add := func(q, unit string, f func(o outcome) string) {
		r := []string{q, unit}
		for _, o := range os {
			r = append(r, f(o))
		}
		g.Rows = append(g.Rows, r)
	}
	add("tilt from vertical", "deg", func(o outcome) string { return output.Num(o.d.Case.Tilt*180/math.Pi, 0) })
	add("fin style head / barrel", "", func(o outcome) string { return o.Result.Head.Style + " / " + o.Result.Barrel.Style })
	add("road speed", u.Name(output.Road), func(o outcome) string { return output.Num(u.Of(output.Road, o.speed), 0) })
	add("ambient", u.Name(output.Temp), func(o outcome) string { return fmtT(u, o.d.Case.Ambient) })
	add("heat load head / barrel", "W", func(o outcome) string {
		return output.Num(o.Result.Head.HeatLoad, 0) + " / " + output.Num(o.Result.Barrel.HeatLoad, 0)
	})
	add("head temperature", u.Name(output.Temp), func(o outcome) string { return fmtT(u, o.Result.Head.WallTemp) })
	add("barrel temperature", u.Name(output.Temp), func(o outcome) string { return fmtT(u, o.Result.Barrel.WallTemp) })
	add("head margin to limit", u.Name(output.TempDiff), func(o outcome) string { return fmtDT(u, o.HeadMargin()) })
	add("barrel margin to limit", u.Name(output.TempDiff), func(o outcome) string { return fmtDT(u, o.BarrelMargin()) })
	add("status", "", func(o outcome) string { return string(o.Status()) })
	add("passage velocity head / barrel", u.Name(output.Vel), func(o outcome) string {
		return output.Num(u.Of(output.Vel, o.Result.Head.PassageVelocity), 1) + " / " + output.Num(u.Of(output.Vel, o.Result.Barrel.PassageVelocity), 1)
	})
	add("air rise head / barrel", u.Name(output.TempDiff), func(o outcome) string {
		return fmtDT(u, o.Result.Head.AirOut-o.Result.Head.AirIn) + " / " + fmtDT(u, o.Result.Barrel.AirOut-o.Result.Barrel.AirIn)
	})
	add("air reaching barrel fins", u.Name(output.Temp), func(o outcome) string { return fmtT(u, o.Result.Barrel.AirIn) })
	add("mean h head / barrel", u.Name(output.H), func(o outcome) string {
		return output.Num(u.Of(output.H, o.Result.Head.MeanH), 1) + " / " + output.Num(u.Of(output.H, o.Result.Barrel.MeanH), 1)
	})
	add("finned surface", u.Name(output.Area), func(o outcome) string {
		return output.Num(u.Of(output.Area, o.Result.Head.TotalArea+o.Result.Barrel.TotalArea), 3)
	})
	add("fin mass", u.Name(output.Mass), func(o outcome) string {
		return output.Num(u.Of(output.Mass, o.Result.Head.FinMass+o.Result.Barrel.FinMass), 2)
	})
	add("heat rejected per mass of fin", u.Name(output.PerMass), func(o outcome) string {
		return output.Num(u.Of(output.PerMass, (o.Result.Head.HeatRejected+o.Result.Barrel.HeatRejected)/(o.Result.Head.FinMass+o.Result.Barrel.FinMass)), 0)
	})
	doc := output.Doc{Title: heading, Grids: []output.Grid{g}, Caution: true}
	for i := 1; i < len(os); i++ {
		doc.Notes = append(doc.Notes, explain(u, os[0], os[i], 'A', rune('A'+i)))
	}
	for i, o := range os {
		if o.NoEquilibrium != nil {
			doc.Notes = append(doc.Notes, fmt.Sprintf("%c: NO EQUILIBRIUM: %v.", 'A'+i, o.NoEquilibrium))
		}
	}
	doc.Notes = append(doc.Notes, noteWall, noteModel)
	doc.Warnings = warningsOf(warns...)
	for _, o := range os {
		doc.Alerts = append(doc.Alerts, limitAlerts(u, o)...)
	}
	var js []map[string]any
	for _, o := range os {
		js = append(js, map[string]any{"design": o.d.Name, "source": o.d.Source, "load": o.Load, "result": o.Result,
			"head_margin_K": o.HeadMargin(), "barrel_margin_K": o.BarrelMargin(), "status": o.Status(),
			"equilibrium": o.NoEquilibrium == nil, "energy_imbalance": o.Result.MaxImbal})
	}
	doc.JSON = map[string]any{"designs": js, "notes": doc.Notes, "warnings": doc.Warnings, "caution": output.Caution}
	return doc, nil
}

// explain says how much hotter or cooler design b runs than a, and why.
func explain(u output.Units, a, b outcome, la, lb rune) string {
	dh := b.Result.Head.WallTemp - a.Result.Head.WallTemp
	db := b.Result.Barrel.WallTemp - a.Result.Barrel.WallTemp
	word := func(d float64) string {
		if d >= 0 {
			return fmt.Sprintf("%s %s hotter", output.Num(u.Of(output.TempDiff, d), 0), u.Name(output.TempDiff))
		}
		return fmt.Sprintf("%s %s cooler", output.Num(u.Of(output.TempDiff, -d), 0), u.Name(output.TempDiff))
	}
	s := fmt.Sprintf("%c against %c: the head runs %s and the barrel %s.", lb, la, word(dh), word(db))
	var worse, better []string // what makes b hotter, what makes it cooler
	side := func(bWorse bool, text string) {
		if bWorse {
			worse = append(worse, text)
		} else {
			better = append(better, text)
		}
	}
	ha, hb := a.Result.Head, b.Result.Head
	if math.Abs(hb.PassageVelocity-ha.PassageVelocity) > 0.05*math.Max(ha.PassageVelocity, 0.1) {
		w := fmt.Sprintf("head passage air at %s against %s %s", output.Num(u.Of(output.Vel, hb.PassageVelocity), 1), output.Num(u.Of(output.Vel, ha.PassageVelocity), 1), u.Name(output.Vel))
		if hb.Series && !ha.Series {
			w += " (only the share of road speed along the axis drives it, through head and barrel passages in series)"
		}
		side(hb.PassageVelocity < ha.PassageVelocity, w)
	}
	if math.Abs(hb.MeanH-ha.MeanH) > 0.05*math.Max(ha.MeanH, 1) {
		side(hb.MeanH < ha.MeanH, fmt.Sprintf("mean h on the head %s against %s %s", output.Num(u.Of(output.H, hb.MeanH), 0), output.Num(u.Of(output.H, ha.MeanH), 0), u.Name(output.H)))
	}
	ra, rb := ha.AirOut-ha.AirIn, hb.AirOut-hb.AirIn
	if math.Abs(rb-ra) > 3 {
		side(rb > ra, fmt.Sprintf("air warming %s %s along the head fins against %s", output.Num(u.Of(output.TempDiff, rb), 0), u.Name(output.TempDiff), output.Num(u.Of(output.TempDiff, ra), 0)))
	}
	if math.Abs(b.Result.Barrel.AirIn-a.Result.Barrel.AirIn) > 1 {
		side(b.Result.Barrel.AirIn > a.Result.Barrel.AirIn, fmt.Sprintf("air reaching the barrel fins at %s %s against %s (on a series path the head has warmed it)",
			fmtT(u, b.Result.Barrel.AirIn), u.Name(output.Temp), fmtT(u, a.Result.Barrel.AirIn)))
	}
	aa, ab := ha.TotalArea+a.Result.Barrel.TotalArea, hb.TotalArea+b.Result.Barrel.TotalArea
	if math.Abs(ab-aa) > 0.03*aa {
		side(ab < aa, fmt.Sprintf("finned surface %s against %s %s", output.Num(u.Of(output.Area, ab), 3), output.Num(u.Of(output.Area, aa), 3), u.Name(output.Area)))
	}
	lda, ldb := ha.HeatLoad+a.Result.Barrel.HeatLoad, hb.HeatLoad+b.Result.Barrel.HeatLoad
	if math.Abs(ldb-lda) > 0.02*math.Max(lda, 1) {
		side(ldb > lda, fmt.Sprintf("heat load %s against %s W", output.Num(ldb, 0), output.Num(lda, 0)))
	}
	if len(worse) > 0 {
		s += fmt.Sprintf(" Against %c: %s.", lb, strings.Join(worse, "; "))
	}
	if len(better) > 0 {
		s += fmt.Sprintf(" In %c's favour: %s.", lb, strings.Join(better, "; "))
	}
	return s
}

func (e *env) tiltCmd() *cobra.Command {
	var step float64
	cmd := &cobra.Command{
		Use:   "tilt DESIGN.toml",
		Short: "Check orientation: the design from upright to laid over, annular against longitudinal fins",
		Long: `tilt runs the design at its cruise condition with the cylinder axis from 0 (upright)
to 90 degrees (laid over), once with both fin sets annular and once with both
longitudinal. The other style keeps the fin height, thicknesses and the mean clear
gap between fins, so the air sees the same fin density.`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			if !(step >= 1 && step <= 90) {
				return fail(ExitUsage, fmt.Errorf("--step %g deg: allowed 1 to 90", step))
			}
			return e.tilt(d, step)
		},
	}
	cmd.Flags().Float64Var(&step, "step", 15, "tilt step in degrees")
	return cmd
}

func restyled(d *design.Design, st fins.Style) (*design.Design, error) {
	cp := *d
	var err error
	if cp.Case.Head.Set, err = d.Case.Head.Set.Restyle(st); err != nil {
		return nil, fmt.Errorf("head fins as %s: %w", st, err)
	}
	if cp.Case.Barrel.Set, err = d.Case.Barrel.Set.Restyle(st); err != nil {
		return nil, fmt.Errorf("barrel fins as %s: %w", st, err)
	}
	return &cp, nil
}

func (e *env) tilt(d *design.Design, step float64) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	an, err := restyled(d, fins.StyleAnnular)
	if err != nil {
		return fail(ExitDesign, err)
	}
	lo, err := restyled(d, fins.StyleLongitudinal)
	if err != nil {
		return fail(ExitDesign, err)
	}
	T := u.Name(output.Temp)
	g := output.Grid{Title: "Head and barrel temperature against tilt",
		Header: []string{"tilt (deg)", "annular head (" + T + ")", "annular barrel (" + T + ")", "longitudinal head (" + T + ")", "longitudinal barrel (" + T + ")", "cooler style"}}
	var warns [][]string
	var rows []map[string]any
	cell := func(o outcome, r cylinder.SetResult) string {
		if o.NoEquilibrium != nil && r.HeatRejected < r.HeatLoad {
			return "over " + fmtT(u, cylinder.SaneWallLimit)
		}
		return fmtT(u, r.WallTemp)
	}
	var tilts []float64
	for t := 0.0; t < 90-1e-9; t += step {
		tilts = append(tilts, t)
	}
	tilts = append(tilts, 90)
	for _, t := range tilts {
		var outs []outcome
		for _, v := range []*design.Design{an, lo} {
			cp := *v
			cp.Case.Tilt = t * math.Pi / 180
			o, err := evaluate(&cp, cp.Case.Speed)
			if err != nil {
				return err
			}
			outs = append(outs, o)
			warns = append(warns, o.warnings())
		}
		a, l := outs[0], outs[1]
		better := "annular"
		if math.Max(l.Result.Head.WallTemp, l.Result.Barrel.WallTemp) < math.Max(a.Result.Head.WallTemp, a.Result.Barrel.WallTemp) {
			better = "longitudinal"
		}
		g.Rows = append(g.Rows, []string{output.Num(t, 0), cell(a, a.Result.Head), cell(a, a.Result.Barrel), cell(l, l.Result.Head), cell(l, l.Result.Barrel), better})
		rows = append(rows, map[string]any{"tilt_deg": t, "annular": a.Result, "longitudinal": l.Result,
			"annular_equilibrium": a.NoEquilibrium == nil, "longitudinal_equilibrium": l.NoEquilibrium == nil})
	}
	hs, bs := an.Case.Head.Set, an.Case.Barrel.Set
	hl, bl := lo.Case.Head.Set, lo.Case.Barrel.Set
	lu := func(v float64) string {
		return output.Num(u.Of(output.Len, v), u.Dec(output.Len)) + " " + u.Name(output.Len)
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: orientation check at %s %s, ambient %s %s", d.Name,
		output.Num(u.Of(output.Road, d.Case.Speed), 0), u.Name(output.Road), fmtT(u, d.Case.Ambient), u.Name(output.Temp)), Grids: []output.Grid{g}, Caution: true}
	doc.Notes = append(doc.Notes,
		fmt.Sprintf("Annular variant: head %d fins at %s pitch, barrel %d fins at %s pitch. Longitudinal variant: head %d fins at %s root pitch, barrel %d fins at %s root pitch. Same heights, thicknesses and mean gap.",
			hs.Count, lu(hs.Pitch), bs.Count, lu(bs.Pitch), hl.Count, lu(hl.Pitch), bl.Count, lu(bl.Pitch)),
		"Annular fins take the road-speed share in their plane (cos tilt); longitudinal fins the share along the axis (sin tilt), head first then barrel in series. "+
			"Broadside air is assumed to add nothing, so each style ends on natural convection and radiation alone at its unfavourable extreme.",
		noteWall)
	doc.Warnings = warningsOf(warns...)
	doc.JSON = map[string]any{"design": d.Name, "rows": rows, "warnings": doc.Warnings, "caution": output.Caution}
	return e.emit(doc)
}

func (e *env) marchCmd() *cobra.Command {
	return e.oneDesign("march DESIGN.toml", "Show the segment-by-segment march of the cooling air along the fin passages", e.march)
}

func (e *env) march(d *design.Design) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	o, err := evaluate(d, d.Case.Speed)
	if err != nil {
		return err
	}
	T, L := u.Name(output.Temp), u.Name(output.Len)
	g := output.Grid{Title: "March along one air path of each fin set (heat and flux summed over all parallel paths)",
		Header: []string{"set", "segment", "x (" + L + ")", "air in (" + T + ")", "air out (" + T + ")", "h (" + u.Name(output.H) + ")", "fin eff", "flux (" + u.Name(output.Flux) + ")", "heat (W)"}, Left: 1}
	for _, s := range []cylinder.SetResult{o.Result.Head, o.Result.Barrel} {
		for i, sg := range s.March {
			g.Rows = append(g.Rows, []string{s.Name, fmt.Sprint(i + 1), output.Num(u.Of(output.Len, sg.X), u.Dec(output.Len)), fmtT(u, sg.AirIn), fmtT(u, sg.AirOut),
				output.Num(u.Of(output.H, sg.H), 1), output.Num(sg.FinEff, 3), output.Num(u.Of(output.Flux, sg.Flux), 0), output.Num(sg.Heat, 1)})
		}
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: march at %s %s (head wall %s %s, barrel wall %s %s)", d.Name,
		output.Num(u.Of(output.Road, d.Case.Speed), 0), u.Name(output.Road), fmtT(u, o.Result.Head.WallTemp), T, fmtT(u, o.Result.Barrel.WallTemp), T),
		Grids: []output.Grid{g}, Caution: true}
	for _, s := range []cylinder.SetResult{o.Result.Head, o.Result.Barrel} {
		if len(s.March) == 0 {
			doc.Notes = append(doc.Notes, fmt.Sprintf("The %s fins get no forced flow at this tilt and speed: natural convection and radiation only.", s.Name))
			continue
		}
		first, last := s.March[0], s.March[len(s.March)-1]
		doc.Notes = append(doc.Notes, fmt.Sprintf("%s: the air warms from %s to %s %s along %s %s; the local heat flux falls from %s to %s %s (%s%% of its entry value).",
			title(s.Name), fmtT(u, s.AirIn), fmtT(u, s.AirOut), T, output.Num(u.Of(output.Len, s.PathLength), 0), L,
			output.Num(u.Of(output.Flux, first.Flux), 0), output.Num(u.Of(output.Flux, last.Flux), 0), u.Name(output.Flux), output.Num(100*last.Flux/first.Flux, 0)))
	}
	if o.NoEquilibrium != nil {
		doc.Notes = append(doc.Notes, "NO EQUILIBRIUM: "+o.NoEquilibrium.Error()+"; the march is shown at the search limit.")
	}
	doc.Notes = append(doc.Notes, energyNote(o.Result.MaxImbal))
	doc.Warnings = o.warnings()
	doc.JSON = map[string]any{"design": d.Name, "head": o.Result.Head, "barrel": o.Result.Barrel, "energy_imbalance": o.Result.MaxImbal,
		"equilibrium": o.NoEquilibrium == nil, "warnings": doc.Warnings, "caution": output.Caution}
	if err := e.emit(doc); err != nil {
		return err
	}
	if o.NoEquilibrium != nil {
		return modelError(d.Name, o.NoEquilibrium)
	}
	return nil
}

func (e *env) speedsCmd() *cobra.Command {
	var from, to, step string
	cmd := &cobra.Command{
		Use:               "speeds DESIGN.toml",
		Short:             "Sweep road speed: head and barrel temperature and margin at each speed",
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			v, err := parseSpeedRange(from, to, step)
			if err != nil {
				return err
			}
			if !(v[0] >= 0 && v[1] >= v[0] && v[1] <= 400/3.6 && v[2] > 0) || (v[1]-v[0])/v[2] > 1000 {
				return fail(ExitUsage, fmt.Errorf("speed range %s to %s by %s: need 0 <= from <= to <= 400 km/h, a positive step and at most 1000 rows", from, to, step))
			}
			return e.speeds(d, v[0], v[1], v[2])
		},
	}
	cmd.Flags().StringVar(&from, "from", "0 km/h", "lowest road speed, with unit")
	cmd.Flags().StringVar(&to, "to", "140 km/h", "highest road speed, with unit")
	cmd.Flags().StringVar(&step, "step", "10 km/h", "speed step, with unit")
	return cmd
}

func (e *env) speeds(d *design.Design, from, to, step float64) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	T := u.Name(output.Temp)
	g := output.Grid{Title: "Temperatures against road speed",
		Header: []string{"speed (" + u.Name(output.Road) + ")", "head load (W)", "barrel load (W)", "head (" + T + ")", "barrel (" + T + ")", "head margin (" + u.Name(output.TempDiff) + ")", "status"}}
	var warns [][]string
	var rows []map[string]any
	for i := 0; ; i++ {
		v := from + float64(i)*step
		if v > to+1e-9 {
			break
		}
		o, err := evaluate(d, v)
		if err != nil {
			return err
		}
		warns = append(warns, o.warnings())
		ht, bt := fmtT(u, o.Result.Head.WallTemp), fmtT(u, o.Result.Barrel.WallTemp)
		if o.NoEquilibrium != nil {
			if o.Result.Head.HeatRejected < o.Result.Head.HeatLoad {
				ht = "over " + fmtT(u, cylinder.SaneWallLimit)
			}
			if o.Result.Barrel.HeatRejected < o.Result.Barrel.HeatLoad {
				bt = "over " + fmtT(u, cylinder.SaneWallLimit)
			}
		}
		st, margin := string(o.Status()), fmtDT(u, o.HeadMargin())
		if !o.Fixed && o.Load.Head == 0 && o.Load.Barrel == 0 {
			st, margin, ht, bt = "no load", "-", "-", "-"
		}
		g.Rows = append(g.Rows, []string{output.Num(u.Of(output.Road, v), 0), output.Num(o.Result.Head.HeatLoad, 0), output.Num(o.Result.Barrel.HeatLoad, 0),
			ht, bt, margin, st})
		rows = append(rows, map[string]any{"speed_m_s": v, "load": o.Load, "head": summary(o.Result.Head), "barrel": summary(o.Result.Barrel),
			"head_margin_K": o.HeadMargin(), "status": o.Status(), "equilibrium": o.NoEquilibrium == nil})
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: road-speed sweep, ambient %s %s, tilt %.0f deg", d.Name, fmtT(u, d.Case.Ambient), T, d.Case.Tilt*180/math.Pi),
		Grids: []output.Grid{g}, Caution: true}
	if !d.Load.Direct {
		note := "The heat load follows the road load at each speed."
		if d.Load.Road.IdleHeat > 0 {
			note += fmt.Sprintf(" It never falls below load.idle_heat = %.0f W, the engine at idle.", d.Load.Road.IdleHeat)
		} else if from == 0 {
			note += " At 0 speed the road load is nil: set load.idle_heat (heat to the fins at idle) for an idle check."
		}
		doc.Notes = append(doc.Notes, note)
	} else {
		doc.Notes = append(doc.Notes, "The heat load is the design's fixed head_heat and barrel_heat at every speed.")
	}
	doc.Notes = append(doc.Notes, noteWall)
	doc.Warnings = warningsOf(warns...)
	doc.JSON = map[string]any{"design": d.Name, "rows": rows, "warnings": doc.Warnings, "caution": output.Caution}
	return e.emit(doc)
}

// summary drops the march arrays from a set result for compact JSON rows.
func summary(r cylinder.SetResult) cylinder.SetResult {
	r.March = nil
	return r
}

func (e *env) alloysCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "alloys",
		Short: "List the alloy catalogue with its sources",
		Args:  cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			_, u, err := e.settings()
			if err != nil {
				return err
			}
			g := output.Grid{Header: []string{"name", "kind", "k at 300 K (W/mK)", "density (kg/m3)", "cp (J/kgK)", "emissivity bare / painted", "max service (" + u.Name(output.Temp) + ")"}, Left: 2}
			var notes []string
			for _, a := range materials.All() {
				g.Rows = append(g.Rows, []string{a.Name, a.Kind, output.Num(a.K300, 1), output.Num(a.Density, 0), output.Num(a.Cp, 0),
					output.Num(a.EmissBare, 2) + " / " + output.Num(a.EmissPaint, 2), fmtT(u, a.MaxService)})
				notes = append(notes, fmt.Sprintf("%s: %s. Emissivity: %s. Limit: %s.", a.Name, a.Source, a.EmissSource, a.LimitSource))
			}
			return e.emit(output.Doc{Title: "Alloy catalogue", Grids: []output.Grid{g}, Notes: notes, JSON: materials.All()})
		},
	}
}

func (e *env) newCmd() *cobra.Command {
	var laidOver bool
	cmd := &cobra.Command{
		Use:   "new DESIGN.toml",
		Short: "Write a commented starter design (the upright demo, or with --laid-over the laid-over one) to a new file",
		Args:  cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			src := demo.Upright
			if laidOver {
				src = demo.LaidOver
			}
			if err := writeFile(args[0], src, e.opt.force); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s; edit it, then run: finmarch estimate %s\n", args[0], args[0])
			return nil
		},
	}
	cmd.Flags().BoolVar(&laidOver, "laid-over", false, "write the demo's laid-over cylinder (longitudinal fins, 90 deg tilt) instead")
	return cmd
}
