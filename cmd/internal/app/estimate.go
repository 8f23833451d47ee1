package app

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow"
	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/materials"
)

func (e *env) estimateCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "estimate DESIGN.toml [MORE.toml ...]",
		Short: "Estimate head and barrel temperature (or heat rejected at given walls) at cruise",
		Long: `estimate evaluates each design at its cruise point: a heat balance per fin set, the
band, the margins and the notes, one design after another (JSON: an array when there are
several; CSV: one table with the design in its first column). It exits 1 if any design
finds no equilibrium, after printing them all.`,
		Args:              cobra.MinimumNArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			ds, err := e.loadAll(args)
			if err != nil {
				return err
			}
			return e.estimate(ds...)
		},
	}
}

func (e *env) estimate(ds ...*design.Design) error {
	var docs []output.Doc
	var names []string
	var noEq error
	for _, d := range ds {
		doc, o, err := e.estimateDoc(d)
		if err != nil {
			return err
		}
		docs, names = append(docs, doc), append(names, d.Name)
		if o.NoEquilibrium != nil && noEq == nil {
			noEq = modelError(d.Name, o.NoEquilibrium)
		}
	}
	if err := e.emitAll(docs, names); err != nil {
		return err
	}
	return noEq
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
			u.N(u.Of(output.Road, c.Speed), 0), u.Name(output.Road), fmtT(u, c.Ambient), u.Name(output.Temp),
			u.N(u.Of(output.Alt, d.Altitude), 0), u.Name(output.Alt), u.N(u.Of(output.Press, c.Pressure), 1), u.Name(output.Press), c.Tilt*180/math.Pi),
		Caution: true,
	}
	pair := func(f func(r cylinder.SetResult) string) []string { return []string{f(h), f(b)} }
	row := func(q, unit string, vals []string) []string { return append([]string{q, unit}, vals...) }
	g := output.Grid{Title: "Heat balance per fin set", Header: []string{"quantity", "unit", "head", "barrel"}, Left: 2}
	if o.Fixed {
		g.Rows = append(g.Rows, row("wall temperature (given)", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return fmtT(u, r.WallTemp) })))
	} else {
		g.Rows = append(g.Rows,
			row("heat load", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.HeatLoad), 0) })))
	}
	g.Rows = append(g.Rows,
		row("heat rejected", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.HeatRejected), 0) })),
		row("  by convection", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.ConvectionHeat), 0) })),
		row("    forced alone", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.ForcedHeat), 0) })),
		row("      through the passages", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.PassageHeat), 0) })),
		row("      over the fin envelope", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.EnvelopeHeat), 0) })),
	)
	// the parts with a forced flow of their own, where the design has them
	hr, br := o.Result.Head, o.Result.Barrel
	if hr.FrontHeat > 0 || br.FrontHeat > 0 {
		g.Rows = append(g.Rows, row("      through the front slots", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.FrontHeat), 0) })))
	}
	if hr.LeadingFaceHeat > 0 || br.LeadingFaceHeat > 0 {
		g.Rows = append(g.Rows, row("      on the leading fin face", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.LeadingFaceHeat), 0) })))
	}
	g.Rows = append(g.Rows,
		row("    natural alone", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.NaturalHeat), 0) })),
		row("  by radiation", u.Name(output.Power), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Power, r.RadiationHeat), 0) })),
	)
	if !o.Fixed {
		g.Rows = append(g.Rows,
			row("wall temperature at fin roots", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return wallText(u, r) })),
			row("limit", u.Name(output.Temp), []string{fmtT(u, d.HeadLimit), fmtT(u, d.BarrelLimit)}),
			row("margin to limit", u.Name(output.TempDiff), []string{marginText(u, h, o.HeadMargin()), marginText(u, b, o.BarrelMargin())}),
			row("status", "", []string{setStatus(o.NoEquilibrium, h, o.HeadMargin()), setStatus(o.NoEquilibrium, b, o.BarrelMargin())}),
		)
	}
	g.Rows = append(g.Rows,
		row("air at inlet", u.Name(output.Temp), pair(func(r cylinder.SetResult) string { return fmtT(u, r.AirIn) })),
		row("air at outlet", u.Name(output.Temp), pair(func(r cylinder.SetResult) string {
			if !r.Equilibrium && !o.Fixed {
				return noValue(u, "-") // computed at the search's cap: not a state of the engine
			}
			return fmtT(u, r.AirOut)
		})),
		row("air rise along the path", u.Name(output.TempDiff), pair(func(r cylinder.SetResult) string {
			if !r.Equilibrium && !o.Fixed {
				return noValue(u, "-")
			}
			return fmtDT(u, r.AirOut-r.AirIn)
		})),
		row("road speed along the fins", u.Name(output.Road), pair(func(r cylinder.SetResult) string {
			if o.Result.Supply != nil {
				return noValue(u, "- (shrouded)") // inside a shroud or baffles the road air does not reach the fins
			}
			return u.N(u.Of(output.Road, r.ApproachComponent), 0)
		})),
		row(speedLabel(o.Result), u.Name(output.Vel), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Vel, o.Result.AlongSpeed(r)), 2) })),
		row("Reynolds number (2 x gap)", "-", pair(func(r cylinder.SetResult) string { return u.N(r.Reynolds, 0) })),
		row("flow regime", "", pair(func(r cylinder.SetResult) string { return r.Regime })),
		row("parallel air paths", "", pair(func(r cylinder.SetResult) string { return strconv.Itoa(r.Paths) })),
		row("path length", u.Name(output.Len), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Len, r.PathLength), u.Dec(output.Len)) })),
		row("mean h (forced)", u.Name(output.H), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.H, r.MeanH), 1) })),
		row("fin efficiency", "-", pair(func(r cylinder.SetResult) string { return u.N(r.FinEfficiency, 3) })),
		row("surface efficiency", "-", pair(func(r cylinder.SetResult) string { return u.N(r.SurfaceEfficiency, 3) })),
		row("finned surface (fins + base)", u.Name(output.Area), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Area, r.TotalArea), 3) })),
		row("fin mass", u.Name(output.Mass), pair(func(r cylinder.SetResult) string { return u.N(u.Of(output.Mass, r.FinMass), 2) })),
		row("heat per mass of fin", u.Name(output.PerMass), pair(func(r cylinder.SetResult) string {
			return u.N(u.Of(output.PerMass, r.HeatRejected/r.FinMass), 0)
		})),
	)
	band, err := e.band(d, c.Speed)
	if err != nil {
		return output.Doc{}, o, err
	}
	if !u.Full && !o.Fixed {
		// the answer first; CSV keeps the heat balance as its one grid
		doc.Grids = append(doc.Grids, headlineGrid(u, d, o, band))
	}
	doc.Grids = append(doc.Grids, g)
	if mg := methodsGrid(u, o.Result); mg != nil {
		doc.Grids = append(doc.Grids, *mg)
	}
	if sg := supplyGrid(u, o.Result); sg != nil {
		doc.Grids = append(doc.Grids, *sg)
	}
	var swings []uncertainty.Swing
	if band != nil {
		doc.Grids = append(doc.Grids, bandGrid(u, d, band))
		doc.Notes = append(doc.Notes, bandNote)
		if swings, err = uncertainty.Sensitivity(d.Cylinder(), d.Run, d.Band.Spread); err != nil {
			return output.Doc{}, o, modelError(d.Name, err)
		}
		if !u.Full {
			doc.Grids = append(doc.Grids, swingGrid(u, swings))
		}
	}
	if !o.Fixed && !d.Load.Direct {
		doc.Notes = append(doc.Notes, fmt.Sprintf("Road load at %s %s: %s %s at the wheel, %s %s at the crank, %s %s of fuel; %.0f%% of the fuel power to the fins of %s, %.0f%% of it through the head.",
			u.N(u.Of(output.Road, c.Speed), 0), u.Name(output.Road), u.N(u.Of(output.Engine, o.Load.WheelPower), 2), u.Name(output.Engine),
			u.N(u.Of(output.Engine, o.Load.BrakePower), 2), u.Name(output.Engine), u.N(u.Of(output.Engine, o.Load.FuelPower), 1), u.Name(output.Engine),
			100*d.Load.Road.CoolShare, count(d.Load.Road.Cylinders, "cylinder"), 100*d.Load.Road.HeadShare))
	}
	air := orientationNote(d, o.Result)
	if o.Result.Supply != nil {
		air = supplyNote(u, d, o.Result)
	}
	doc.Notes = append(doc.Notes, methodNote(u, o.Result), air, noteWall, noteMixed,
		energyNote(o.Result, o.Fixed),
		noteModel)
	if o.NoEquilibrium != nil {
		doc.Notes = append(doc.Notes, "NO EQUILIBRIUM: "+o.NoEquilibrium.Error()+".")
	}
	doc.Notes = append(doc.Notes, alloyNotes(d)...)
	doc.Warnings = o.warnings()
	doc.Alerts = limitAlerts(u, o)
	if n := leverNote(u, d, o); n != "" {
		doc.Notes = append(doc.Notes, n)
	}
	if a := overRated(u, d, o); a != "" {
		doc.Alerts = append(doc.Alerts, a)
		doc.Notes = append(doc.Notes, a+".")
	}
	doc.JSON = map[string]any{
		"limit_warnings": doc.Alerts,
		"design":         d.Name, "source": d.Source, "tilt_deg": c.Tilt * 180 / math.Pi, "speed_m_s": c.Speed,
		"ambient_K": c.Ambient, "pressure_Pa": c.Pressure, "altitude_m": d.Altitude,
		"load": o.Load, "result": o.Result, "head_limit_K": d.HeadLimit, "barrel_limit_K": d.BarrelLimit,
		"head_margin_K": marginJSON(h, o.HeadMargin()), "barrel_margin_K": marginJSON(b, o.BarrelMargin()), "status": o.Status(),
		"fixed_walls": o.Fixed, "equilibrium": o.NoEquilibrium == nil, "energy_imbalance": o.Result.MaxImbal, "inputs": d.Cylinder().Resolved(),
		"warnings": doc.Warnings, "defaults_applied": d.Defaults, "caution": output.Caution,
	}
	putBand(doc.JSON.(map[string]any), "band", band)
	if swings != nil {
		doc.JSON.(map[string]any)["sensitivity"] = swings
	}
	return doc, o, nil
}

// alloyNotes are the words an alloy and the design's casting process need
// together (materials.Alloy.ProcessFit), once per alloy; a pairing that
// cannot be made is a casting warning instead.
func alloyNotes(d *design.Design) []string {
	var out []string
	for i, a := range []materials.Alloy{d.Case.Head.Alloy, d.Case.Barrel.Alloy} {
		if ok, n := a.ProcessFit(d.CastingOf(i).Name); ok && n != "" && !slices.Contains(out, "Alloy and process: "+n+".") {
			out = append(out, "Alloy and process: "+n+".")
		}
	}
	return out
}

// headlineGrid is the answer in a few cells: each set's wall temperature,
// its band, the limit, the margin, the chance over it and the status, by
// the estimate's own air-side method.
func headlineGrid(u output.Units, d *design.Design, o outcome, band *uncertainty.Band) output.Grid {
	T := u.Name(output.Temp)
	g := output.Grid{Title: fmt.Sprintf("Headline: wall temperature at the fin roots (air-side method: %s)", o.Result.Method),
		Header: []string{"set", "temperature (" + T + ")", "5 % to 95 % (" + T + ")", "limit (" + T + ")", "margin (" + u.Name(output.TempDiff) + ")", "chance over the limit", "status (nominal)"}, Left: 1}
	for _, x := range []struct {
		name   string
		r      cylinder.SetResult
		limit  float64
		margin float64
	}{{"head", o.Result.Head, d.HeadLimit, o.HeadMargin()}, {"barrel", o.Result.Barrel, d.BarrelLimit, o.BarrelMargin()}} {
		bt, over := "-", "-"
		if band != nil {
			p, ov := band.Head, band.HeadOver
			if x.name == "barrel" {
				p, ov = band.Barrel, band.BarrelOver
			}
			bt, over = bandText(u, p), u.N(100*ov, 0)+" %"
		}
		g.Rows = append(g.Rows, []string{x.name, wallText(u, x.r), bt, fmtT(u, x.limit), marginText(u, x.r, x.margin), over, setStatus(o.NoEquilibrium, x.r, x.margin)})
	}
	return g
}

// limitAlerts says which wall is over its limit, and by how much, or which
// set finds no equilibrium below the search's cap and how much heat it
// cannot reject there.
func limitAlerts(u output.Units, o outcome) []string {
	u.Full = false // a message: the precision shown, not the CSV rows' full one
	if o.Fixed {
		return nil
	}
	var out []string
	for _, x := range []struct {
		name   string
		r      cylinder.SetResult
		limit  float64
		margin float64
	}{{"head", o.Result.Head, o.d.HeadLimit, o.HeadMargin()}, {"barrel", o.Result.Barrel, o.d.BarrelLimit, o.BarrelMargin()}} {
		switch {
		case !x.r.Equilibrium:
			out = append(out, fmt.Sprintf("%s: the %s fins find no equilibrium below %s: there they reject %.0f W of the %.0f W load, %.0f W short",
				o.d.Name, x.name, capText(u), x.r.HeatRejected, x.r.HeatLoad, x.r.Shortfall))
		case x.margin < 0:
			out = append(out, fmt.Sprintf("%s: the %s runs at %s %s, %s %s over its %s %s limit",
				o.d.Name, x.name, fmtT(u, x.r.WallTemp), u.Name(output.Temp), fmtDT(u, -x.margin), u.Name(output.TempDiff), fmtT(u, x.limit), u.Name(output.Temp)))
		}
	}
	return out
}

// overRated says when the road asks more crank power than the engine's
// rated power, or a speed past its top-gear speed: the speed cannot be
// held, and the top speed it can.
func overRated(u output.Units, d *design.Design, o outcome) string {
	u.Full = false // a message: the precision shown, not the CSV rows' full one
	if !o.Load.OverRated {
		return ""
	}
	r := d.Load.Road
	at := u.N(u.Of(output.Road, o.speed), 0) + " " + u.Name(output.Road)
	var s string
	if o.Load.PastRatedSpeed {
		s = fmt.Sprintf("%s: %s is past the road speed in top gear at the engine's rated speed, %s %s (load.top_gear_speed): the engine cannot hold this speed, and these temperatures are what it would need",
			d.Name, at, u.N(u.Of(output.Road, r.TopGearSpeed), 0), u.Name(output.Road))
	} else {
		s = fmt.Sprintf("%s: at %s the road asks %s %s at the crank, more than the rated %s %s (load.rated_power): the engine cannot hold this speed, and these temperatures are what it would need",
			d.Name, at, u.N(u.Of(output.Engine, o.Load.BrakePower), 1), u.Name(output.Engine), u.N(u.Of(output.Engine, r.RatedPower), 1), u.Name(output.Engine))
	}
	if v, ok := r.TopSpeed(d.Case.Pressure / (airflow.RAir * d.Case.Ambient)); ok {
		s += fmt.Sprintf("; its top speed here is %s %s", u.N(u.Of(output.Road, v), 0), u.Name(output.Road))
	}
	return s
}

// topSpeedNote says where and why a speed sweep stops.
func topSpeedNote(u output.Units, d *design.Design) string {
	u.Full = false // a message: the precision shown, not the CSV rows' full one
	r, rho := d.Load.Road, d.Case.Pressure/(airflow.RAir*d.Case.Ambient)
	top, _ := r.TopSpeed(rho)
	why := fmt.Sprintf("past it the road asks more than the rated %s %s (load.rated_power)", u.N(u.Of(output.Engine, r.RatedPower), 1), u.Name(output.Engine))
	if r.TopSpeedByGear(rho) {
		why = "past it the engine would turn faster than its rated speed in top gear (load.top_gear_speed)"
	}
	return fmt.Sprintf("The table stops at the engine's top speed, %s %s: %s.", u.N(u.Of(output.Road, top), 0), u.Name(output.Road), why)
}

// noteMixed explains why the forced and natural rows do not add up.
const noteMixed = "Convection combines the forced and natural heats as Q^3 = QF^3 + QN^3 (Churchill 1977's rule for assisting flows), and the forced heat its passage and envelope parts the same way, so the 'alone' rows do not add up; where a part of the surface has a forced flow of its own (front slots, leading fin face) that part is combined apart with its area's share of the others and the parts add; convection plus radiation is the heat rejected."

// energyNote reports the two energy checks: the heat rejected against the
// load (the wall balance's own tolerance), and the air's enthalpy rise from
// its inlet and outlet temperatures against the forced heat summed over the
// segments; below 1e-9 it says so rather than print rounding noise.
func energyNote(r cylinder.Result, fixed bool) string {
	show := func(v float64) string {
		if v < 1e-9 {
			return "better than 1e-9"
		}
		return fmt.Sprintf("%.1e", v)
	}
	air := show(math.Max(r.Head.AirImbalance, r.Barrel.AirImbalance))
	if r.Method != cylinder.MethodChannel && r.Supply == nil {
		// a free-stream method's air warming is computed from its heat: no
		// independent check is left of it
		if fixed {
			return "Energy check: none applies at fixed walls under a free-stream method (the air's enthalpy check belongs to the channel march)."
		}
		return "Energy check: heat rejected equals the load to " + show(math.Max(r.Head.LoadImbalance, r.Barrel.LoadImbalance)) + " (relative); the air's enthalpy check belongs to the channel march (a free-stream method's air warming is computed from its heat)."
	}
	if fixed {
		return "Energy check: the air's enthalpy rise (from inlet and outlet) equals the forced heat to " + air + " (relative)."
	}
	load := show(math.Max(r.Head.LoadImbalance, r.Barrel.LoadImbalance))
	return "Energy checks: heat rejected equals the load to " + load + ", and the air's enthalpy rise (from inlet and outlet) equals the forced heat to " + air + " (relative)."
}

func setStatus(err error, r cylinder.SetResult, margin float64) string {
	switch {
	case err != nil && r.HeatRejected < r.HeatLoad:
		return "NO EQUILIBRIUM"
	case margin < 0:
		return "OVER LIMIT"
	case margin < cylinder.MarginalBand:
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
			if r.Method == cylinder.MethodChannel {
				parts = append(parts, fmt.Sprintf("the %s's annular fins take the road-speed share in their plane (cos %.0f deg = %.2f) on %d paths round half the circumference, each fed with ambient air",
					s.Name, tilt, math.Cos(d.Case.Tilt), s.Paths))
			} else {
				parts = append(parts, fmt.Sprintf("the %s's annular fins take the road-speed share in their plane (cos %.0f deg = %.2f), with ambient air",
					s.Name, tilt, math.Cos(d.Case.Tilt)))
			}
		case s.Series && s.Name == "head":
			parts = append(parts, fmt.Sprintf("the head's longitudinal fins take the share along the axis (sin %.0f deg = %.2f) and pass their warmed air on to the barrel fins", tilt, math.Sin(d.Case.Tilt)))
		case s.Series:
			parts = append(parts, "the barrel's longitudinal fins receive the air the head fins have already warmed")
		default:
			parts = append(parts, fmt.Sprintf("the %s's longitudinal fins take the share along the axis (sin %.0f deg = %.2f)", s.Name, tilt, math.Sin(d.Case.Tilt)))
		}
	}
	return "Orientation: " + strings.Join(parts, "; ") + ". The rest of the road air crosses the fins broadside: over the fin envelope, in the slots near their mouths and, across longitudinal fins, through the slots facing the stream (stated assumptions)."
}

// speedLabel names the air speed along the fins as the estimate's method
// sees it.
func speedLabel(r cylinder.Result) string {
	if r.Method == cylinder.MethodChannel || r.Supply != nil {
		return "passage velocity"
	}
	return "road air along the fins (approach)"
}

// leverNote, for a head over its limit on the road load, says what its
// temperature rests on and what moves it: the heat (the cooling share and
// the head's share of it) and the fins' conductance (area, h, the
// recovery), and that a measured head temperature anchors both.
func leverNote(u output.Units, d *design.Design, o outcome) string {
	h := o.Result.Head
	if o.Fixed || d.Load.Direct || !h.Equilibrium || o.HeadMargin() >= 0 {
		return ""
	}
	r := d.Load.Road
	need := 100 * (h.WallTemp - d.HeadLimit) / (h.WallTemp - d.Case.Ambient)
	return fmt.Sprintf("To bring the head to its limit: about %.0f%% less heat to the head fins, or that much more conductance (fin area, h, the air's pressure recovery), since the head's rise over the ambient scales with the heat over the conductance. Its %s %s is %.0f%% of the fuel power to the fins (load.cooling_share, the default %.0f%% from a handbook range of 17 to 26%%; an oil cooler takes part of it) and %.0f%% of that through the head (load.head_share); a head temperature measured on the engine ('finmarch calibrate') anchors both the heat and the air side.",
		need, u.N(u.Of(output.Power, h.HeatLoad), 0), u.Name(output.Power), 100*r.CoolShare, 100*cylinder.DefaultCoolShare, 100*r.HeadShare)
}
