package app

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
)

func (e *env) tiltCmd() *cobra.Command {
	var stepText string
	cmd := e.oneDesign("tilt DESIGN.toml", "Check orientation: the design from upright to laid over, annular against longitudinal fins", func(d *design.Design) error {
		rad, err := design.ParseValue[design.Angle](stepText)
		if err != nil {
			return fail(ExitUsage, fmt.Errorf("--step: %w", err))
		}
		step := math.Round(rad*180/math.Pi*1e9) / 1e9 // "15 deg" is 15, not 14.999999999999998 after the radians
		if !(step >= 1-1e-9 && step <= 90+1e-9) {
			return fail(ExitUsage, fmt.Errorf("--step %s: allowed 1 to 90 deg", stepText))
		}
		return e.tilt(d, step)
	})
	cmd.Long = `tilt runs the design at its cruise condition with the cylinder axis from 0 (upright)
to 90 degrees (laid over), once with both fin sets annular and once with both
longitudinal. The other style keeps the fin height, thicknesses and the mean clear
gap between fins, so the air sees the same fin density (as many fins as the design's
casting process allows). Beside each head temperature is its uncertainty band, the
5th to 95th percentile ([uncertainty] in the design; --samples 0 leaves it out).`
	cmd.Flags().StringVar(&stepText, "step", "15 deg", "tilt step, with its unit")
	return cmd
}

// restyled is the design with both fin sets of style st: a set already
// of that style is kept as drawn (the user's own fins); a set laid the
// other way keeps the mean gap, kept castable by the design's process
// where a count can do it, at sizes a pattern maker draws (pasteable); it
// says which sets it thinned out.
func restyled(d *design.Design, st fins.Style) (*design.Design, []string, error) {
	cp := *d
	var thinned []string
	for i, x := range []struct {
		name string
		dst  *fins.Set
		src  fins.Set
	}{{"head", &cp.Case.Head.Set, d.Case.Head.Set}, {"barrel", &cp.Case.Barrel.Set, d.Case.Barrel.Set}} {
		proc := d.CastingOf(i)
		if x.src.Style == st {
			continue // as drawn
		}
		same, err := x.src.Restyle(st)
		if err != nil {
			return nil, nil, fmt.Errorf("%s fins as %s: %w", x.name, st, err)
		}
		v, _, err := x.src.RestyleFor(st, proc)
		if err != nil {
			return nil, nil, fmt.Errorf("%s fins as %s: %w", x.name, st, err)
		}
		if *x.dst, err = pasteable(v, proc); err != nil {
			return nil, nil, fmt.Errorf("%s fins as %s: %w", x.name, st, err)
		}
		if x.dst.Count < same.Count {
			thinned = append(thinned, fmt.Sprintf("%s %d instead of %d", x.name, x.dst.Count, same.Count))
		}
	}
	if st == fins.StyleAnnular {
		// annular passages run round the cylinder: a duct's series route
		// (head then barrel along the axis) becomes parallel
		cp.Case.Supply.Series = false
	}
	return &cp, thinned, nil
}

// pitchStep is the step of a suggested variant's pitch: 0.1 mm, the
// precision its TOML is printed at (common practice for a pattern
// drawing's fin spacing).
const pitchStep = 1e-4

// pasteable is a restyled set at a pitch on the pitchStep grid, so that
// the TOML printed for it is exactly the set estimated: a longitudinal
// set's root pitch rounded down (the fins still go round the root), an
// annular set's to the nearest step with as many fins as fit; where that
// breaks a casting limit the set loses a fin (or opens a step) until it
// keeps them, as RestyleFor does.
func pasteable(s fins.Set, p fins.Process) (fins.Set, error) {
	out := s
	grid := func(v float64) float64 { return math.Round(v/pitchStep) * pitchStep }
	switch s.Style {
	case fins.StyleLongitudinal:
		out.Pitch = math.Floor(s.Pitch/pitchStep+1e-6) * pitchStep
	default:
		out.Pitch = grid(s.Pitch)
		out.Count = min(s.Count, out.Fitting())
	}
	castable := func(x fins.Set) bool {
		for _, v := range p.Check(x) {
			if v.Slack < -1e-9 {
				return false
			}
		}
		return true
	}
	wasCastable := castable(s)
	for i := 0; i < 200 && wasCastable && !castable(out) && out.Count > 1; i++ {
		if out.Style == fins.StyleLongitudinal {
			out.Count--
			out.Pitch = math.Floor(math.Pi*out.RootDiameter/float64(out.Count)/pitchStep+1e-6) * pitchStep
		} else {
			out.Pitch = grid(out.Pitch + pitchStep)
			out.Count = min(out.Count, out.Fitting())
		}
	}
	if _, err := out.Geometry(); err != nil {
		return fins.Set{}, err
	}
	return out, nil
}

// variantTOML is the fin keys of a tilt variant's sets laid another way
// than drawn, as design-file text to paste over the same keys of the
// design's tables; "" when the variant is the design as drawn.
func variantTOML(d, v *design.Design) string {
	var b strings.Builder
	for _, x := range []struct {
		name     string
		was, now fins.Set
	}{{"head", d.Case.Head.Set, v.Case.Head.Set}, {"barrel", d.Case.Barrel.Set, v.Case.Barrel.Set}} {
		if x.was.Style == x.now.Style {
			continue
		}
		fmt.Fprintf(&b, "[%s]\nstyle = %q\ncount = %d\npitch = \"%.1f mm\"\n", x.name, x.now.Style.String(), x.now.Count, x.now.Pitch*1e3)
	}
	return b.String()
}

// castNote says how the restyled variants keep the design's casting
// limits, or which they break.
func castNote(process string, thinA, thinL []string, an, lo *design.Design) string {
	var parts []string
	for _, v := range []struct {
		style   string
		thinned []string
		d       *design.Design
	}{{"annular", thinA, an}, {"longitudinal", thinL, lo}} {
		if len(v.thinned) > 0 {
			parts = append(parts, fmt.Sprintf("the %s variant has fewer fins than the same mean gap gives (%s) to keep the %s height-to-gap limit", v.style, strings.Join(v.thinned, ", "), process))
		}
		if c := v.d.Cylinder().Castability(); len(c) > 0 {
			parts = append(parts, fmt.Sprintf("the %s variant cannot keep the %s limits: %s", v.style, process, strings.Join(c, "; ")))
		}
	}
	if len(parts) == 0 {
		return fmt.Sprintf("Both variants keep the %s limits.", process)
	}
	return "Casting: " + strings.Join(parts, "; ") + "."
}

func (e *env) tilt(d *design.Design, step float64) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	an, thinA, err := restyled(d, fins.StyleAnnular)
	if err != nil {
		return fail(ExitDesign, err)
	}
	lo, thinL, err := restyled(d, fins.StyleLongitudinal)
	if err != nil {
		return fail(ExitDesign, err)
	}
	// which columns are the design as drawn: the style of both its sets
	drawn := ""
	if hs, bs := d.Case.Head.Set.Style, d.Case.Barrel.Set.Style; hs == bs {
		drawn = hs.String()
	}
	T := u.Name(output.Temp)
	g := output.Grid{Title: "Head and barrel temperature against tilt",
		Header: []string{"tilt (deg)", "annular head (" + T + ")", "annular barrel (" + T + ")", "longitudinal head (" + T + ")", "longitudinal barrel (" + T + ")", "cooler style"}}
	n, err := e.samples(d)
	if err != nil {
		return err
	}
	if n > 0 {
		g.Header = []string{"tilt (deg)", "annular head (" + T + ")", "annular head 5 % to 95 % (" + T + ")", "annular barrel (" + T + ")",
			"longitudinal head (" + T + ")", "longitudinal head 5 % to 95 % (" + T + ")", "longitudinal barrel (" + T + ")", "cooler style"}
	}
	if u.Full {
		// CSV: the states in columns of their own, the temperatures numbers
		g.Header = append(g.Header, "annular status", "longitudinal status")
	}
	// the head by each air-side method that applies to each style
	mg := output.Grid{Title: "Head temperature by air-side method against tilt (the spread is model uncertainty)", Header: []string{"tilt (deg)"}}
	type col struct {
		style int
		m     cylinder.Method
	}
	var cols []col
	for k, v := range []*design.Design{an, lo} {
		for _, m := range v.Case.Applicable() {
			cols = append(cols, col{k, m})
			mg.Header = append(mg.Header, []string{"annular", "longitudinal"}[k]+" by "+string(m)+" ("+T+")")
		}
	}
	var warns [][]string
	var noEq []string // the rows without an equilibrium, and how short
	var rows []map[string]any
	rated := "" // the speed past the engine's rated power: the same at every tilt
	cell := func(_ outcome, r cylinder.SetResult) string { return wallText(u, r) }
	var tilts []float64
	for i := 0; float64(i)*step < 90-1e-9; i++ {
		tilts = append(tilts, float64(i)*step) // not a running sum: 15, not 14.999999999999998
	}
	tilts = append(tilts, 90)
	own := math.Round(d.Case.Tilt*180/math.Pi*1e6) / 1e6 // the design's own tilt: a row of its own
	if !slices.ContainsFunc(tilts, func(t float64) bool { return math.Abs(t-own) < 1e-6 }) {
		tilts = append(tilts, own)
		slices.Sort(tilts)
	}
	for _, t := range tilts {
		var outs []outcome
		var bands [2]*uncertainty.Band
		for k, v := range []*design.Design{an, lo} {
			cp := *v
			cp.Case.Tilt = t * math.Pi / 180
			o, err := evaluate(&cp, cp.Case.Speed)
			if err != nil {
				return err
			}
			if bands[k], err = e.band(&cp, cp.Case.Speed); err != nil {
				return err
			}
			outs = append(outs, o)
			warns = append(warns, o.warnings())
			if a := overRated(u, &cp, o); a != "" {
				rated = a
			}
		}
		a, l := outs[0], outs[1]
		for k, o := range outs {
			for _, r := range []cylinder.SetResult{o.Result.Head, o.Result.Barrel} {
				if !r.Equilibrium && r.HeatLoad > 0 && r.Shortfall > 0 {
					short := fmt.Sprintf("%.0f %%", 100*r.Shortfall/r.HeatLoad)
					if r.Shortfall < 0.01*r.HeatLoad {
						short = fmt.Sprintf("%.0f W (under 1 %%)", r.Shortfall)
					}
					noEq = append(noEq, fmt.Sprintf("%s %s at %s deg %s short", []string{"annular", "longitudinal"}[k], r.Name, tiltLabel(u, t, step), short))
				}
			}
		}
		better := "annular"
		if math.Max(l.Result.Head.WallTemp, l.Result.Barrel.WallTemp) < math.Max(a.Result.Head.WallTemp, a.Result.Barrel.WallTemp) {
			better = "longitudinal"
		}
		label := tiltLabel(u, t, step)
		if math.Abs(t-own) < 1e-6 && !u.Full && drawn != "" {
			label += " (yours)"
		}
		row := []string{label, cell(a, a.Result.Head), cell(a, a.Result.Barrel), cell(l, l.Result.Head), cell(l, l.Result.Barrel), better}
		if n > 0 {
			row = []string{row[0], row[1], bandText(u, bands[0].Head), row[2], row[3], bandText(u, bands[1].Head), row[4], row[5]}
		}
		if u.Full {
			row = append(row, string(a.Status()), string(l.Status()))
		}
		g.Rows = append(g.Rows, row)
		mrow := []string{label}
		for _, c := range cols {
			cellText := noValue(u, "-")
			for _, r := range outs[c.style].Result.Methods {
				if r.Method == c.m && r.Applies {
					cellText = methodWall(u, r.Head, r.HeadEq)
				}
			}
			mrow = append(mrow, cellText)
		}
		mg.Rows = append(mg.Rows, mrow)
		js := map[string]any{"tilt_deg": t, "annular": a.Result, "longitudinal": l.Result,
			"annular_equilibrium": a.NoEquilibrium == nil, "longitudinal_equilibrium": l.NoEquilibrium == nil,
		}
		putBand(js, "annular_band", bands[0])
		rows = append(rows, putBand(js, "longitudinal_band", bands[1]))
	}
	hs, bs := an.Case.Head.Set, an.Case.Barrel.Set
	hl, bl := lo.Case.Head.Set, lo.Case.Barrel.Set
	lu := func(v float64) string {
		return u.N(u.Of(output.Len, v), u.Dec(output.Len)) + " " + u.Name(output.Len)
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: orientation check at %s %s, ambient %s %s", d.Name,
		u.N(u.Of(output.Road, d.Case.Speed), 0), u.Name(output.Road), fmtT(u, d.Case.Ambient), u.Name(output.Temp)), Grids: []output.Grid{g}, Caution: true}
	if len(cols) > 2 && !u.Full { // CSV keeps the one main table; JSON has every method in each row's result
		doc.Grids = append(doc.Grids, mg)
		doc.Notes = append(doc.Notes, "By method: Briggs & Young applies to annular fins only. Where a style's along-fin share of the road speed is nil (annular at 90 deg, longitudinal at 0 deg) the methods agree, because only what they share is left there: the broadside credit, natural convection and radiation; that agreement is not certainty.")
	}
	yours := "Your design mixes the styles, so neither column is it as drawn ('finmarch estimate' gives it); each column lays the other set the same way."
	if drawn != "" {
		yours = fmt.Sprintf("The %s columns are your design as drawn (the row at its own tilt, %s deg, marked, is what 'finmarch estimate' gives); the %s columns are a variant with its fins laid the other way.",
			drawn, u.N(own, 0), map[string]string{"annular": "longitudinal", "longitudinal": "annular"}[drawn])
	}
	doc.Notes = append(doc.Notes, yours,
		fmt.Sprintf("Annular: head %d fins at %s pitch, barrel %d fins at %s pitch. Longitudinal: head %d fins at %s root pitch, barrel %d fins at %s root pitch. Same heights, thicknesses and mean gap.",
			hs.Count, lu(hs.Pitch), bs.Count, lu(bs.Pitch), hl.Count, lu(hl.Pitch), bl.Count, lu(bl.Pitch)))
	variants := map[string]any{}
	for _, v := range []struct {
		name string
		d    *design.Design
	}{{"annular", an}, {"longitudinal", lo}} {
		if t := variantTOML(d, v.d); t != "" {
			variants[v.name] = t
			doc.Blocks = append(doc.Blocks, output.Block{Caption: fmt.Sprintf("The %s variant as design keys (paste them over the same keys of your tables; the rest stays as it is):", v.name), Text: t})
		}
	}
	if len(noEq) > 0 {
		doc.Notes = append(doc.Notes, fmt.Sprintf("No equilibrium below %s: %s of the load at %s (the shortfall is the fins' area or h that is missing there; a set behind one without an equilibrium has none either, its air unknown). Those rows rest on the broadside credits, the least certain part of the model (README 'Limitations').",
			capText(u), strings.Join(noEq, ", "), capText(u)))
	}
	doc.Notes = append(doc.Notes,
		castNote(castingName(d), thinA, thinL, an, lo),
		tiltAirNote(d),
		noteWall)
	doc.Warnings = warningsOf(warns...)
	if rated != "" {
		doc.Alerts = append(doc.Alerts, rated)
	}
	doc.JSON = map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "rows": rows, "variants": variants, "over_rated": rated != "", "warnings": doc.Warnings, "caution": output.Caution}
	return e.emit(doc)
}

// tiltAirNote says how the tilt reaches the cooling air: through the road
// air's share along the passages, or, inside a shroud or baffles, not at
// all.
func tiltAirNote(d *design.Design) string {
	if d.Case.Supply.Kind != cylinder.SupplyRam {
		return "The cooling air comes from a " + string(d.Case.Supply.Kind) + " ([cooling]): the shroud or baffles route it whatever the tilt, so the tilt changes only natural convection's part (by the fins' orientation); the styles differ by their passages."
	}
	return "Annular fins take the road-speed share in their plane (cos tilt); longitudinal fins the share along the axis (sin tilt), head first then barrel in series. " +
		"The rest of the road air crosses the fins broadside: it is credited over the fin envelope, in the slots between the fins near their mouths and, across longitudinal fins, through the slots facing the stream; these rest on stated assumptions (README 'Model and sources'), so each style's unfavourable extreme is its least certain row."
}

// castingName names the process the fins are made by, for a note: one
// name with its key, or each set's when they differ.
func castingName(d *design.Design) string {
	key := func(i int) string {
		if d.SetCastKey[i] {
			return []string{"head", "barrel"}[i] + ".casting"
		}
		return "cylinder.casting"
	}
	if d.OneCasting() {
		k := key(0)
		if key(1) != k {
			k += " and " + key(1)
		}
		return d.CastingOf(0).Name + " (" + k + ")"
	}
	return fmt.Sprintf("head %s (%s) and barrel %s (%s)", d.CastingOf(0).Name, key(0), d.CastingOf(1).Name, key(1))
}

// tiltLabel writes a tilt of the table with as many decimals as the step
// needs (7.5 deg steps give 7.5, 22.5, ...; 15 deg steps whole degrees).
func tiltLabel(u output.Units, t, step float64) string {
	for dec := 0; dec < 3; dec++ {
		p := math.Pow(10, float64(dec))
		if math.Abs(step*p-math.Round(step*p)) < 1e-6 {
			return u.N(t, dec)
		}
	}
	return u.N(t, 3)
}
