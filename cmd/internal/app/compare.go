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
)

func (e *env) compareCmd() *cobra.Command {
	return &cobra.Command{
		Use:               "compare DESIGN.toml DESIGN.toml [...]",
		Short:             "Compare several designs side by side at their cruise conditions",
		Args:              cobra.MinimumNArgs(2),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			ds, err := e.loadAll(args)
			if err != nil {
				return err
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
	bands := map[*design.Design]*uncertainty.Band{}
	for _, d := range ds {
		o, err := evaluate(d, d.Case.Speed)
		if err != nil {
			return output.Doc{}, err
		}
		os = append(os, o)
		warns = append(warns, o.warnings())
		if bands[d], err = e.band(d, d.Case.Speed); err != nil {
			return output.Doc{}, err
		}
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
	add("tilt from vertical", "deg", func(o outcome) string { return u.N(o.d.Case.Tilt*180/math.Pi, 0) })
	add("fin style head / barrel", "", func(o outcome) string { return o.Result.Head.Style + " / " + o.Result.Barrel.Style })
	add("road speed", u.Name(output.Road), func(o outcome) string { return u.N(u.Of(output.Road, o.speed), 0) })
	add("ambient", u.Name(output.Temp), func(o outcome) string { return fmtT(u, o.d.Case.Ambient) })
	add("heat load head / barrel", u.Name(output.Power), func(o outcome) string {
		return u.N(u.Of(output.Power, o.Result.Head.HeatLoad), 0) + " / " + u.N(u.Of(output.Power, o.Result.Barrel.HeatLoad), 0)
	})
	add("head temperature", u.Name(output.Temp), func(o outcome) string { return wallText(u, o.Result.Head) })
	add("barrel temperature", u.Name(output.Temp), func(o outcome) string { return wallText(u, o.Result.Barrel) })
	add("head margin to limit", u.Name(output.TempDiff), func(o outcome) string { return marginText(u, o.Result.Head, o.HeadMargin()) })
	add("barrel margin to limit", u.Name(output.TempDiff), func(o outcome) string { return marginText(u, o.Result.Barrel, o.BarrelMargin()) })
	add("status", "", func(o outcome) string { return string(o.Status()) })
	add("air-side method", "", func(o outcome) string { return string(o.Result.Method) })
	for _, m := range cylinder.Methods {
		add("head / barrel by "+string(m), u.Name(output.Temp), func(o outcome) string {
			for _, r := range o.Result.Methods {
				if r.Method == m && r.Applies {
					return methodWall(u, r.Head, r.HeadEq) + " / " + methodWall(u, r.Barrel, r.BarrelEq)
				}
			}
			return noValue(u, "-")
		})
	}
	withBand := func(f func(b *uncertainty.Band) string) func(o outcome) string {
		return func(o outcome) string {
			if b := bands[o.d]; b != nil {
				return f(b)
			}
			return noValue(u, "-")
		}
	}
	if bands[ds[0]] != nil {
		add("head, 5 % to 95 %", u.Name(output.Temp), withBand(func(b *uncertainty.Band) string { return bandText(u, b.Head) }))
		add("chance the head is over its limit", "%", withBand(func(b *uncertainty.Band) string { return u.N(100*b.HeadOver, 0) }))
	}
	add("air speed along the fins head / barrel", u.Name(output.Vel), func(o outcome) string {
		return u.N(u.Of(output.Vel, o.Result.AlongSpeed(o.Result.Head)), 1) + " / " + u.N(u.Of(output.Vel, o.Result.AlongSpeed(o.Result.Barrel)), 1)
	})
	add("air rise head / barrel", u.Name(output.TempDiff), func(o outcome) string {
		return fmtDT(u, o.Result.Head.AirOut-o.Result.Head.AirIn) + " / " + fmtDT(u, o.Result.Barrel.AirOut-o.Result.Barrel.AirIn)
	})
	add("air reaching barrel fins", u.Name(output.Temp), func(o outcome) string { return fmtT(u, o.Result.Barrel.AirIn) })
	add("mean h head / barrel", u.Name(output.H), func(o outcome) string {
		return u.N(u.Of(output.H, o.Result.Head.MeanH), 1) + " / " + u.N(u.Of(output.H, o.Result.Barrel.MeanH), 1)
	})
	add("finned surface", u.Name(output.Area), func(o outcome) string {
		return u.N(u.Of(output.Area, o.Result.Head.TotalArea+o.Result.Barrel.TotalArea), 3)
	})
	add("fin mass", u.Name(output.Mass), func(o outcome) string {
		return u.N(u.Of(output.Mass, o.Result.FinMass()), 2)
	})
	add("heat rejected per mass of fin", u.Name(output.PerMass), func(o outcome) string {
		if !o.Fixed && o.NoEquilibrium != nil {
			return noValue(u, "-") // the heat at the search's cap: not a state of the engine
		}
		return u.N(u.Of(output.PerMass, o.Result.HeatPerFinMass()), 0)
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
	if bands[ds[0]] != nil {
		doc.Notes = append(doc.Notes, bandNote)
	}
	doc.Warnings = warningsOf(warns...)
	for _, o := range os {
		doc.Alerts = append(doc.Alerts, limitAlerts(u, o)...)
		if a := overRated(u, o.d, o); a != "" {
			doc.Alerts = append(doc.Alerts, a)
		}
	}
	var js []map[string]any
	for _, o := range os {
		js = append(js, putBand(map[string]any{"design": o.d.Name, "source": o.d.Source, "inputs": o.d.Cylinder().Resolved(), "load": o.Load, "result": o.Result,
			"head_margin_K": marginJSON(o.Result.Head, o.HeadMargin()), "barrel_margin_K": marginJSON(o.Result.Barrel, o.BarrelMargin()), "status": o.Status(),
			"equilibrium": o.NoEquilibrium == nil, "energy_imbalance": o.Result.MaxImbal}, "band", bands[o.d]))
	}
	doc.JSON = map[string]any{"designs": js, "notes": doc.Notes, "warnings": doc.Warnings, "caution": output.Caution}
	return doc, nil
}

// explain says how much hotter or cooler design b runs than a, and why.
func explain(u output.Units, a, b outcome, la, lb rune) string {
	dh := b.Result.Head.WallTemp - a.Result.Head.WallTemp
	db := b.Result.Barrel.WallTemp - a.Result.Barrel.WallTemp
	// each set's difference, or which side has no equilibrium (its wall
	// is the search's cap, not a temperature)
	cap := capText(u)
	word := func(set string, ra, rb cylinder.SetResult, d float64) string {
		switch {
		case !ra.Equilibrium && !rb.Equilibrium:
			return fmt.Sprintf("the %s finds no equilibrium in either", set)
		case !rb.Equilibrium:
			return fmt.Sprintf("the %s finds no equilibrium below %s in %c (in %c it runs at %s %s)", set, cap, lb, la, fmtT(u, ra.WallTemp), u.Name(output.Temp))
		case !ra.Equilibrium:
			return fmt.Sprintf("the %s runs at %s %s in %c, where %c finds no equilibrium below %s", set, fmtT(u, rb.WallTemp), u.Name(output.Temp), lb, la, cap)
		case d >= 0:
			return fmt.Sprintf("the %s runs %s %s hotter", set, u.N(u.Of(output.TempDiff, d), 0), u.Name(output.TempDiff))
		}
		return fmt.Sprintf("the %s runs %s %s cooler", set, u.N(u.Of(output.TempDiff, -d), 0), u.Name(output.TempDiff))
	}
	s := fmt.Sprintf("%c against %c: %s and %s.", lb, la, word("head", a.Result.Head, b.Result.Head, dh), word("barrel", a.Result.Barrel, b.Result.Barrel, db))
	var worse, better []string // what makes b hotter, what makes it cooler
	side := func(bWorse bool, text string) {
		if bWorse {
			worse = append(worse, text)
		} else {
			better = append(better, text)
		}
	}
	for _, df := range cylinder.Differences(a.Result, b.Result) {
		pair := func(q output.Quantity, dec int) string {
			return u.N(u.Of(q, df.B), dec) + " against " + u.N(u.Of(q, df.A), dec) + " " + u.Name(q)
		}
		var w string
		switch df.Kind {
		case cylinder.DiffAirSpeed:
			if df.Passage {
				w = "head passage air at " + pair(output.Vel, 1)
				if df.Series {
					w += " (only the share of road speed along the axis drives it, through head and barrel passages in series)"
				}
			} else {
				w = "road air along the head fins at " + pair(output.Vel, 1)
			}
		case cylinder.DiffMeanH:
			w = "mean h on the head " + pair(output.H, 0)
		case cylinder.DiffAirRise:
			w = fmt.Sprintf("air warming %s %s along the head fins against %s", u.N(u.Of(output.TempDiff, df.B), 0), u.Name(output.TempDiff), u.N(u.Of(output.TempDiff, df.A), 0))
		case cylinder.DiffBarrelInlet:
			w = fmt.Sprintf("air reaching the barrel fins at %s %s against %s (on a series path the head has warmed it)", fmtT(u, df.B), u.Name(output.Temp), fmtT(u, df.A))
		case cylinder.DiffArea:
			w = "finned surface " + pair(output.Area, 3)
		case cylinder.DiffLoad:
			w = fmt.Sprintf("heat load %s against %s %s", u.N(u.Of(output.Power, df.B), 0), u.N(u.Of(output.Power, df.A), 0), u.Name(output.Power))
		}
		side(df.Warmer, w)
	}
	if len(worse) > 0 {
		s += fmt.Sprintf(" Working against %c: %s.", lb, strings.Join(worse, "; "))
	}
	if len(better) > 0 {
		s += fmt.Sprintf(" In %c's favour: %s.", lb, strings.Join(better, "; "))
	}
	return s
}
