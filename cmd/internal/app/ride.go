package app

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/transient"
	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

// soakHorizon is how long a standstill is followed past the ride's end to
// find when a wall reaches its limit, s.
const soakHorizon = 2 * 3600

func (e *env) rideCmd() *cobra.Command {
	var profile, start, every string
	cmd := e.oneDesign("ride DESIGN.toml", "Heat soak: head and barrel temperature through a ride (a built-in profile or a CSV of time, speed and grade)", func(d *design.Design) error {
		if d.WallFixed {
			return fail(ExitUsage, fmt.Errorf("%s: the design fixes its wall temperatures ([override] head_wall, barrel_wall); a ride needs its heat load", d.Name))
		}
		name, ride, what, err := e.rideProfile(profile)
		if err != nil {
			return err
		}
		dt, err := design.ParseValue[design.Time](every)
		if err != nil || !(dt >= 1 && dt <= 3600) {
			return fail(ExitUsage, fmt.Errorf("--every %q: allowed 1 s to 60 min, with its unit", every))
		}
		return e.ride(d, name, what, ride, start, dt)
	})
	cmd.Long = `ride follows the head and barrel wall temperatures through time: the
cylinder as two lumped masses (the fins from the geometry plus the other metal of
head and barrel, from the design's [ride] table or estimated), heated by the load
at each moment (the road load at the moment's speed and grade, the idle heat when
standing) and cooled by the fins at the present walls (the steady air side,
quasi-steady). It reports the peak of each wall and when, the time over each
limit, and, for the first standstill after moving, the minutes until each wall
reaches its limit standing (or that it never does). These are read from every
step the integrator accepted, not from the rows printed, so --every does not
change them: a peak is the largest of each step's cubic Hermite interpolant
(its ends and any interior extremum), a limit crossing the root of T(t) - limit
on it by Brent's method (event location on the dense output: Hairer, Norsett and
Wanner 1993, Sec. II.6), the time over a limit summed between crossings. A wall
passing 500 C ends the ride there ("runaway at minute X"): no equilibrium, and no
peak is reported.

Built-in profiles (invented scenarios): ` + strings.Join(demo.RideNames(), ", ") + `. A CSV
profile has a header naming time and speed (optionally grade, ambient, head_heat and
barrel_heat), units in the header or the cells: each row's conditions hold until the
next row's time, and the last row's time ends the ride.`
	cmd.Example = `  finmarch ride upright.toml
  finmarch ride upright.toml --profile mountain-pass --start cold
  finmarch ride upright.toml --profile my-ride.csv --every "10 s" -f csv`
	cmd.Flags().StringVar(&profile, "profile", "run-then-jam", "a built-in profile ("+strings.Join(demo.RideNames(), ", ")+") or a CSV file")
	cmd.Flags().StringVar(&start, "start", "cold", `the walls at the start: "cold" (ambient), "steady" (the steady state of the ride's first moment) or a road speed ("90 km/h") to start from its steady state`)
	cmd.Flags().StringVar(&every, "every", "60 s", "output interval, with its unit")
	_ = cmd.RegisterFlagCompletionFunc("profile", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return append(demo.RideNames(), "csv"), cobra.ShellCompDirectiveFilterFileExt
	})
	return cmd
}

// rideProfile is a built-in profile by name, or a CSV ride file.
func (e *env) rideProfile(p string) (string, []transient.Segment, string, error) {
	for _, r := range demo.Rides {
		if r.Name == p {
			return r.Name, r.Segments, r.What + " (a built-in profile)", nil
		}
	}
	if !strings.HasSuffix(strings.ToLower(p), ".csv") {
		return "", nil, "", fail(ExitUsage, fmt.Errorf("--profile %q: use a built-in profile (%s) or a .csv file", p, strings.Join(demo.RideNames(), ", ")))
	}
	src, err := readInput(p, "ride file")
	if err != nil {
		return "", nil, "", err
	}
	e.inputs = append(e.inputs, p)
	segs, err := design.ReadRide(src, p)
	if err != nil {
		return "", nil, "", fail(ExitDesign, err)
	}
	var total float64
	for _, s := range segs {
		total += s.Duration
	}
	return p, segs, fmt.Sprintf("%s: %d rows over %.1f min", p, len(segs)+1, total/60), nil
}

// rideStart resolves --start into the walls at the ride's start.
func rideStart(m *transient.Model, d *design.Design, ride []transient.Segment, start string) ([2]float64, string, error) {
	ta := d.Case.Ambient
	if ride[0].Ambient > 0 {
		ta = ride[0].Ambient
	}
	first := ride[0]
	what := "the steady state of the ride's first moment"
	switch strings.ToLower(strings.TrimSpace(start)) {
	case "cold":
		return [2]float64{ta, ta}, "cold (ambient)", nil
	case "steady":
	default:
		v, err := design.ParseValue[design.Speed](start)
		if err != nil || !(v >= 0 && v <= 400/3.6) {
			return [2]float64{}, "", fail(ExitUsage, fmt.Errorf(`--start %q: use "cold", "steady" or a road speed from 0 to 400 km/h with its unit`, start))
		}
		first = transient.Segment{Speed: v, Ambient: first.Ambient}
		what = "the steady state at " + start
	}
	w, ok, err := m.Steady(first)
	if err != nil {
		return w, "", modelError(d.Name, err)
	}
	if !ok {
		return w, "", fail(ExitModel, fmt.Errorf("%s: --start: no equilibrium below 500 C at %s to start from; start cold or at another speed", d.Name, what))
	}
	return w, what, nil
}

func (e *env) ride(d *design.Design, name, what string, ride []transient.Segment, start string, every float64) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	set := d.Run
	m, err := transient.NewModel(d.Cylinder(), set, d.Metal)
	if err != nil {
		return fail(ExitDesign, fmt.Errorf("%s: %w", d.Name, err))
	}
	w0, startWhat, err := rideStart(m, d, ride, start)
	if err != nil {
		return err
	}
	tr, err := m.Run(ride, w0, every)
	if err != nil {
		return modelError(d.Name, err)
	}
	lim := cylinder.Limits{Head: d.HeadLimit, Barrel: d.BarrelLimit}
	sum, err := transient.Summarise(tr, lim)
	if err != nil {
		return modelError(d.Name, err)
	}
	soak, err := m.Soak(ride, tr, lim, soakHorizon)
	if err != nil && !errors.Is(err, transient.ErrNoStandstill) {
		return modelError(d.Name, err)
	}
	doc := rideDoc(u, d, m, name, what, startWhat, tr, sum, soak)
	doc.JSON = rideJSON(d, m, name, ride, w0, tr, sum, soak)
	if err := e.emit(doc); err != nil {
		return err
	}
	if tr.Runaway {
		return fail(ExitModel, fmt.Errorf("%s: %w at minute %.1f of the ride", d.Name, transient.ErrRunaway, tr.End/60))
	}
	return nil
}

// reportRide is the ride the report shows.
const reportRide = "run-then-jam"

// rideNotes are the report's heat-soak lines for a design: reportRide from
// cold, its peaks, time over the limits and the standstill (nothing for a
// design with fixed walls; the failure in words when it fails).
func (e *env) rideNotes(u output.Units, d *design.Design) []string {
	if d.WallFixed {
		return nil
	}
	_, ride, what, err := e.rideProfile(reportRide)
	if err != nil {
		return []string{"Heat soak not computed: " + err.Error()}
	}
	m, err := transient.NewModel(d.Cylinder(), d.Run, d.Metal)
	if err != nil {
		return []string{"Heat soak not computed: " + err.Error()}
	}
	ta := d.Case.Ambient
	tr, err := m.Run(ride, [2]float64{ta, ta}, 60)
	if err != nil {
		return []string{"Heat soak not computed: " + err.Error()}
	}
	lim := cylinder.Limits{Head: d.HeadLimit, Barrel: d.BarrelLimit}
	sum, err := transient.Summarise(tr, lim)
	if err != nil {
		return []string{"Heat soak not computed: " + err.Error()}
	}
	soak, _ := m.Soak(ride, tr, lim, soakHorizon)
	doc := rideDoc(u, d, m, reportRide, what, "cold (ambient)", tr, sum, soak)
	var out []string
	for _, n := range doc.Notes {
		for _, p := range []string{"Peak:", "Over the limit:", "Standing at idle", "NO EQUILIBRIUM"} {
			if strings.HasPrefix(n, p) {
				out = append(out, "Heat soak, ride "+reportRide+" from cold: "+n)
			}
		}
	}
	return out
}

// rideDoc is the ride's table and notes.
func rideDoc(u output.Units, d *design.Design, m *transient.Model, name, what, startWhat string, tr transient.Trace, sum transient.Summary, soak *transient.Soak) output.Doc {
	T, P := u.Name(output.Temp), u.Name(output.Power)
	g := output.Grid{Title: "Wall temperatures through the ride",
		Header: []string{"time (min)", "speed (" + u.Name(output.Road) + ")", "grade (%)", "head heat in (" + P + ")", "head heat out (" + P + ")", "head (" + T + ")", "barrel (" + T + ")"}}
	for _, s := range tr.Samples {
		g.Rows = append(g.Rows, []string{u.N(s.Time/60, 1), u.N(u.Of(output.Road, s.Speed), 0), u.N(s.Grade, 1),
			u.N(u.Of(output.Power, s.HeatIn[0]), 0), u.N(u.Of(output.Power, s.HeatOut[0]), 0), fmtT(u, s.Head), fmtT(u, s.Barrel)})
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: ride %s, ambient %s %s", d.Name, name, fmtT(u, d.Case.Ambient), T), Grids: []output.Grid{g}, Caution: true}
	minutes := func(s float64) string { return u.N(s/60, 1) + " min" }
	deg := func(k float64) string { return fmtT(u, k) + " " + T }
	doc.Notes = append(doc.Notes, "Profile: "+what+". Start: "+startWhat+fmt.Sprintf(", head %s, barrel %s.", deg(tr.Starts[0][0]), deg(tr.Starts[0][1])))
	// the summary is read from the integrator's steps (events on the dense
	// output), not from the rows above: the same at any --every
	if sum.Runaway {
		walls := [2]string{"head", "barrel"}
		ran, other := sum.RunawayWall, 1-sum.RunawayWall
		doc.Notes = append(doc.Notes,
			fmt.Sprintf("Peak: none, runaway at minute %s: the %s passed %s (no equilibrium) and the ride stops there, still climbing; the %s was at %s then (limits %s and %s).",
				u.N(sum.RunawayAt/60, 1), walls[ran], capText(u), walls[other], deg(tr.Final[other]), deg(d.HeadLimit), deg(d.BarrelLimit)),
			fmt.Sprintf("Over the limit: head %s, barrel %s of the ride, up to the runaway at minute %s.", minutes(sum.AboveHead), minutes(sum.AboveBarrel), u.N(sum.RunawayAt/60, 1)))
	} else {
		doc.Notes = append(doc.Notes,
			fmt.Sprintf("Peak: head %s at minute %s, barrel %s at minute %s (limits %s and %s).",
				deg(sum.PeakHead), u.N(sum.PeakHeadAt/60, 1), deg(sum.PeakBarrel), u.N(sum.PeakBarrelAt/60, 1), deg(d.HeadLimit), deg(d.BarrelLimit)),
			fmt.Sprintf("Over the limit: head %s, barrel %s of the ride.", minutes(sum.AboveHead), minutes(sum.AboveBarrel)))
	}
	if soak != nil {
		doc.Notes = append(doc.Notes, soakNote(u, soak, d))
	}
	kg := func(v float64) string { return u.N(u.Of(output.Mass, v), 2) + " " + u.Name(output.Mass) }
	fh, fb := m.Capacity[0]/d.Case.Head.Alloy.Cp-m.Metal.Head, m.Capacity[1]/d.Case.Barrel.Alloy.Cp-m.Metal.Barrel
	source := "given in [ride]"
	if d.Metal.Head == 0 || d.Metal.Barrel == 0 {
		source = "estimated from the geometry where [ride] head_metal or barrel_metal is not given (transient.EstimateMetal: give the masses of your castings)"
	}
	doc.Notes = append(doc.Notes,
		fmt.Sprintf("Thermal masses: head %s J/K (fins %s, other metal %s), barrel %s J/K (fins %s, other metal %s), the other metal %s; head-barrel link %s W/K.",
			u.N(m.Capacity[0], 0), kg(fh), kg(m.Metal.Head), u.N(m.Capacity[1], 0), kg(fb), kg(m.Metal.Barrel), source, u.N(m.Link, 1)),
		"Model: two lumped masses heated by the load of each moment (the road load at its speed and grade, the idle heat when standing) and cooled by the fins at the present walls, by the steady air-side model (quasi-steady); integrated by the Dormand-Prince 5(4) pair with error control (Dormand and Prince 1980).")
	if tr.Runaway {
		doc.Notes = append(doc.Notes, fmt.Sprintf("NO EQUILIBRIUM: the %s passed %s at minute %s; the trace stops there.", [2]string{"head", "barrel"}[tr.RunawayWall], capText(u), u.N(tr.End/60, 1)))
	}
	doc.Warnings = rideWarnings(d, tr)
	if sum.FirstOverHead >= 0 {
		doc.Alerts = append(doc.Alerts, fmt.Sprintf("%s: the head passes its %s limit at minute %s of the ride", d.Name, deg(d.HeadLimit), u.N(sum.FirstOverHead/60, 1)))
	}
	if sum.FirstOverBarrel >= 0 {
		doc.Alerts = append(doc.Alerts, fmt.Sprintf("%s: the barrel passes its %s limit at minute %s of the ride", d.Name, deg(d.BarrelLimit), u.N(sum.FirstOverBarrel/60, 1)))
	}
	return doc
}

// soakNote says how long each wall lasts standing after moving.
func soakNote(u output.Units, s *transient.Soak, d *design.Design) string {
	T := u.Name(output.Temp)
	part := func(set string, t, settle, lim, cooled float64) string {
		switch {
		case t == 0 && cooled > 0:
			return fmt.Sprintf("the %s is already over its %s %s limit when it stops and comes back under it after %s min", set, fmtT(u, lim), T, u.N(cooled/60, 1))
		case t == 0:
			return fmt.Sprintf("the %s is already over its %s %s limit when it stops and stays over it", set, fmtT(u, lim), T)
		case t > 0 && !math.IsInf(t, 1):
			return fmt.Sprintf("the %s reaches its %s %s limit after %s min", set, fmtT(u, lim), T, u.N(t/60, 1))
		case math.IsInf(t, 1):
			return fmt.Sprintf("the %s has not reached its %s %s limit within %s min, though standing it would settle over it", set, fmtT(u, lim), T, u.N(s.Horizon/60, 0))
		}
		if !s.Equilibrium {
			return fmt.Sprintf("the %s stays under its %s %s limit", set, fmtT(u, lim), T)
		}
		return fmt.Sprintf("the %s never reaches its %s %s limit (standing it settles at %s %s)", set, fmtT(u, lim), T, fmtT(u, settle), T)
	}
	return fmt.Sprintf("Standing at idle from minute %s (the first stop after moving): %s; %s.", u.N(s.Start/60, 1),
		part("head", s.Head, s.Settle[0], d.HeadLimit, s.Cooled[0]), part("barrel", s.Barrel, s.Settle[1], d.BarrelLimit, s.Cooled[1]))
}

// rideWarnings are the ride's warnings, each naming the design, as every
// command's warnings do.
func rideWarnings(d *design.Design, tr transient.Trace) []string {
	out := []string{}
	for _, w := range tr.Warnings {
		out = append(out, d.Name+": "+w)
	}
	return out
}

// rideJSON is the ride in SI.
func rideJSON(d *design.Design, m *transient.Model, name string, ride []transient.Segment, w0 [2]float64, tr transient.Trace, sum transient.Summary, soak *transient.Soak) map[string]any {
	segs := make([]map[string]any, 0, len(ride))
	for _, s := range ride {
		sg := map[string]any{"duration_s": s.Duration, "speed_m_s": s.Speed, "grade_percent": s.Grade}
		if s.Ambient > 0 {
			sg["ambient_K"] = s.Ambient
		}
		if s.Heat != nil {
			sg["head_heat_W"], sg["barrel_heat_W"] = s.Heat[0], s.Heat[1]
		}
		segs = append(segs, sg)
	}
	never := func(t float64) any {
		if t < 0 || math.IsInf(t, 1) {
			return nil
		}
		return t
	}
	peak := func(v float64) any {
		if sum.Runaway {
			return nil // no peak: the wall ran away (runaway_at_s)
		}
		return v
	}
	var runawayWall any
	if sum.Runaway {
		runawayWall = [2]string{"head", "barrel"}[sum.RunawayWall]
	}
	js := map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "profile": map[string]any{"name": name, "segments": segs},
		"start_K": w0, "capacity_J_K": m.Capacity, "metal_kg": [2]float64{m.Metal.Head, m.Metal.Barrel}, "link_W_K": m.Link,
		"samples": tr.Samples, "end_s": tr.End, "runaway": tr.Runaway,
		"energy": map[string]any{"in_J": tr.EnergyIn, "out_J": tr.EnergyOut, "stored_J": tr.Stored},
		"summary": map[string]any{"peak_head_K": peak(sum.PeakHead), "peak_head_at_s": peak(sum.PeakHeadAt), "peak_barrel_K": peak(sum.PeakBarrel), "peak_barrel_at_s": peak(sum.PeakBarrelAt),
			"above_head_limit_s": sum.AboveHead, "above_barrel_limit_s": sum.AboveBarrel,
			"first_over_head_limit_s": never(sum.FirstOverHead), "first_over_barrel_limit_s": never(sum.FirstOverBarrel),
			"runaway_at_s": never(sum.RunawayAt), "runaway_wall": runawayWall},
		"head_limit_K": d.HeadLimit, "barrel_limit_K": d.BarrelLimit, "warnings": rideWarnings(d, tr), "caution": output.Caution}
	if soak != nil {
		js["standstill"] = map[string]any{"start_s": soak.Start, "head_to_limit_s": never(soak.Head), "barrel_to_limit_s": never(soak.Barrel),
			"head_never": soak.Head < 0, "barrel_never": soak.Barrel < 0, "settle_K": soak.Settle, "equilibrium": soak.Equilibrium, "horizon_s": soak.Horizon,
			"head_back_under_limit_s": never(soak.Cooled[0]), "barrel_back_under_limit_s": never(soak.Cooled[1])}
	}
	return js
}
