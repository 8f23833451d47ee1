package app

import (
	"fmt"
	"math"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

func (e *env) speedsCmd() *cobra.Command {
	var from, to, step string
	var cmd *cobra.Command
	cmd = e.oneDesign("speeds DESIGN.toml", "Sweep road speed: head and barrel temperature and margin at each speed", func(d *design.Design) error {
		// with --units us and no range given: 0 to 90 mph by 5 mph, not
		// km/h steps shown as 0, 6, 12, 19 mph
		from, to, step := usRoadRange(cmd, e.opt.units, from, to, step, "5 mph")
		v, err := parseSpeedRange(from, to, step)
		if err != nil {
			return err
		}
		if !(v[0] >= 0 && v[1] >= v[0] && v[1] <= 400/3.6 && v[2] > 0) || (v[1]-v[0])/v[2] > 1000 {
			return fail(ExitUsage, fmt.Errorf("speed range %s to %s by %s: need 0 <= from <= to <= 400 km/h, a positive step and at most 1000 rows", from, to, step))
		}
		return e.speeds(d, v[0], v[1], v[2])
	})
	cmd.Flags().StringVar(&from, "from", "0 km/h", "lowest road speed, with unit (with --units us: 0 mph)")
	cmd.Flags().StringVar(&to, "to", "140 km/h", "highest road speed, with unit (with --units us: 90 mph)")
	cmd.Flags().StringVar(&step, "step", "10 km/h", "speed step, with unit (with --units us: 5 mph)")
	return cmd
}

func (e *env) speeds(d *design.Design, from, to, step float64) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	T := u.Name(output.Temp)
	g := output.Grid{Title: "Temperatures against road speed",
		Header: []string{"speed (" + u.Name(output.Road) + ")", "head load (" + u.Name(output.Power) + ")", "barrel load (" + u.Name(output.Power) + ")", "head (" + T + ")", "barrel (" + T + ")", "head margin (" + u.Name(output.TempDiff) + ")", "status"}}
	n, err := e.samples(d)
	if err != nil {
		return err
	}
	fan := d.Case.Supply.Kind == cylinder.SupplyFan
	if fan {
		g.Header = append(g.Header, "fan flow ("+u.Name(output.VolFlow)+")", "fan power ("+u.Name(output.Power)+")")
	}
	if n > 0 && !d.WallFixed {
		g.Header = append(g.Header, "head 5 % to 95 % ("+T+")", "chance over (%)")
	}
	var warns [][]string
	var rows []map[string]any
	stopped := ""
	pastRated := -1.0 // the first speed of the sweep past the engine's rating, m/s
	for i := 0; ; i++ {
		v := from + float64(i)*step
		if v > to+1e-9 {
			break
		}
		o, err := evaluate(d, v)
		if err != nil {
			return err
		}
		if o.Load.OverRated {
			// the engine cannot hold this speed: the sweep stops here
			stopped, pastRated = topSpeedNote(u, d), v
			break
		}
		warns = append(warns, o.warnings())
		ht, bt := wallText(u, o.Result.Head), wallText(u, o.Result.Barrel)
		st, margin := string(o.Status()), marginText(u, o.Result.Head, o.HeadMargin())
		if !o.Fixed && o.Load.Head == 0 && o.Load.Barrel == 0 {
			st, margin, ht, bt = "no load", "-", "-", "-"
		}
		row := []string{u.N(u.Of(output.Road, v), 0), u.N(u.Of(output.Power, o.Result.Head.HeatLoad), 0), u.N(u.Of(output.Power, o.Result.Barrel.HeatLoad), 0),
			ht, bt, margin, st}
		if fan {
			f := o.Result.Supply.Fan
			row = append(row, u.N(u.Of(output.VolFlow, f.Flow), 4), u.N(u.Of(output.Power, f.Power), 1))
		}
		band, err := e.band(d, v)
		if err != nil {
			return err
		}
		if band != nil {
			row = append(row, bandText(u, band.Head), u.N(100*band.HeadOver, 0))
		}
		g.Rows = append(g.Rows, row)
		js := map[string]any{"speed_m_s": v, "load": o.Load, "head": summary(o.Result.Head), "barrel": summary(o.Result.Barrel),
			"head_margin_K": marginJSON(o.Result.Head, o.HeadMargin()), "status": o.Status(), "equilibrium": o.NoEquilibrium == nil}
		if fan {
			js["fan"] = o.Result.Supply.Fan // the operating point the table's fan columns show
		}
		rows = append(rows, putBand(js, "band", band))
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
		if stopped != "" {
			doc.Notes = append(doc.Notes, stopped)
			doc.Alerts = append(doc.Alerts, d.Name+": "+stopped) // on standard error too, where CSV leaves notes out
		}
	} else {
		doc.Notes = append(doc.Notes, "The heat load is the design's fixed head_heat and barrel_heat at every speed.")
	}
	doc.Notes = append(doc.Notes, noteWall)
	doc.Warnings = warningsOf(warns...)
	doc.JSON = map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "rows": rows, "warnings": doc.Warnings, "caution": output.Caution}
	if pastRated >= 0 {
		doc.JSON.(map[string]any)["past_rated_from_m_s"] = pastRated // the sweep stops there: the engine cannot hold it
	}
	return e.emit(doc)
}

// summary drops the march arrays from a set result for compact JSON rows.
func summary(r cylinder.SetResult) cylinder.SetResult {
	r.March = nil
	return r
}
