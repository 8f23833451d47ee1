package app

import (
	"fmt"
	"math"
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
		step := rad * 180 / math.Pi
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

// restyled is the design with both fin sets of style st at the same mean
// gap, kept castable by the design's process where a count can do it; it
// says which sets it thinned out.
func restyled(d *design.Design, st fins.Style) (*design.Design, []string, error) {
	cp := *d
	var thinned []string
	for _, x := range []struct {
		name string
		dst  *fins.Set
		src  fins.Set
	}{{"head", &cp.Case.Head.Set, d.Case.Head.Set}, {"barrel", &cp.Case.Barrel.Set, d.Case.Barrel.Set}} {
		same, err := x.src.Restyle(st)
		if err != nil {
			return nil, nil, fmt.Errorf("%s fins as %s: %w", x.name, st, err)
		}
		if *x.dst, _, err = x.src.RestyleFor(st, d.Casting); err != nil {
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
		return fmt.Sprintf("Both variants keep the %s limits (cylinder.casting).", process)
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
	var rows []map[string]any
	rated := "" // the speed past the engine's rated power: the same at every tilt
	cell := func(_ outcome, r cylinder.SetResult) string { return wallText(u, r) }
	var tilts []float64
	for i := 0; float64(i)*step < 90-1e-9; i++ {
		tilts = append(tilts, float64(i)*step) // not a running sum: 15, not 14.999999999999998
	}
	tilts = append(tilts, 90)
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
		better := "annular"
		if math.Max(l.Result.Head.WallTemp, l.Result.Barrel.WallTemp) < math.Max(a.Result.Head.WallTemp, a.Result.Barrel.WallTemp) {
			better = "longitudinal"
		}
		row := []string{u.N(t, 0), cell(a, a.Result.Head), cell(a, a.Result.Barrel), cell(l, l.Result.Head), cell(l, l.Result.Barrel), better}
		if n > 0 {
			row = []string{row[0], row[1], bandText(u, bands[0].Head), row[2], row[3], bandText(u, bands[1].Head), row[4], row[5]}
		}
		if u.Full {
			row = append(row, string(a.Status()), string(l.Status()))
		}
		g.Rows = append(g.Rows, row)
		mrow := []string{u.N(t, 0)}
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
	doc.Notes = append(doc.Notes,
		fmt.Sprintf("Annular variant: head %d fins at %s pitch, barrel %d fins at %s pitch. Longitudinal variant: head %d fins at %s root pitch, barrel %d fins at %s root pitch. Same heights, thicknesses and mean gap.",
			hs.Count, lu(hs.Pitch), bs.Count, lu(bs.Pitch), hl.Count, lu(hl.Pitch), bl.Count, lu(bl.Pitch)),
		castNote(d.Casting.Name, thinA, thinL, an, lo),
		tiltAirNote(d),
		noteWall)
	doc.Warnings = warningsOf(warns...)
	if rated != "" {
		doc.Alerts = append(doc.Alerts, rated)
	}
	doc.JSON = map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "rows": rows, "warnings": doc.Warnings, "caution": output.Caution}
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
