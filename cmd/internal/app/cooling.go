package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/airflow"
	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/cmd/internal/plots"
)

// supplyGrid is the cooling air a duct or a fan drives through the fins
// (nil for ram air).
func supplyGrid(u output.Units, r cylinder.Result) *output.Grid {
	s := r.Supply
	if s == nil {
		return nil
	}
	g := output.Grid{Title: "Cooling air", Header: []string{"quantity", "unit", "value"}, Left: 2}
	add := func(q string, unit output.Quantity, v float64, dec int) {
		g.Rows = append(g.Rows, []string{q, u.Name(unit), u.N(u.Of(unit, v), dec)})
	}
	if f := s.Fan; f != nil {
		add("fan speed", output.Rot, f.Speed, 0)
		add("fan flow (at its inlet)", output.VolFlow, f.Flow, 4)
		add("fan static pressure", output.Drop, f.Pressure, 0)
		add("lost in the shroud", output.Drop, f.Shroud, 0)
		add("fan shaft power (from the crank)", output.Power, f.Power, 1)
		if f.Efficiency > 0 {
			g.Rows = append(g.Rows, []string{"fan efficiency (static)", "-", u.N(f.Efficiency, 2)})
		}
	}
	add("pressure difference across the fins", output.Drop, s.Drop, 0)
	add("mass flow through the fins", output.MassFlow, s.MassFlow, 4)
	return &g
}

// supplyNote says where a ducted supply's air comes from, in place of the
// orientation note of ram air.
func supplyNote(u output.Units, d *design.Design, r cylinder.Result) string {
	s, sr := d.Case.Supply, r.Supply
	route := "each fin set takes the pressure difference across its own passages (parallel)"
	if s.Series {
		route = "the air passes the head fins and then the barrel fins (series)"
	}
	src := fmt.Sprintf("a duct or baffles holding %s %s across the fins", u.N(u.Of(output.Drop, sr.Drop), 0), u.Name(output.Drop))
	if s.MassFlow > 0 {
		src = fmt.Sprintf("a duct passing %s %s through the fins", u.N(u.Of(output.MassFlow, s.MassFlow), 4), u.Name(output.MassFlow))
	}
	if f := sr.Fan; f != nil {
		power := fmt.Sprintf("its shaft power, %s %s at a static efficiency of %.2f, is taken from the crank (it raises the road load's heat)", u.N(u.Of(output.Power, f.Power), 1), u.Name(output.Power), f.Efficiency)
		if f.Efficiency == 0 {
			power = fmt.Sprintf("the curve gives no efficiency, so its shaft power is taken as the air power, %s %s (a lower bound), from the crank", u.N(u.Of(output.Power, f.Power), 1), u.Name(output.Power))
		}
		src = fmt.Sprintf("a fan in a shroud at %s rpm (its curve scaled by the fan laws) meeting the shroud and the fins at %s %s and %s %s; %s",
			u.N(f.Speed*60, 0), u.N(u.Of(output.VolFlow, f.Flow), 4), u.Name(output.VolFlow), u.N(u.Of(output.Drop, f.Pressure), 0), u.Name(output.Drop), power)
	}
	return "Cooling air: " + src + "; " + route + ". Inside the shroud the road air does not reach the fins, whatever the road speed or the tilt."
}

// fanFigureCmd is 'plot fan': the fan's curve against the system's (the
// shroud and the fins) at the design's road speed and at a standstill,
// each operating point marked.
func (e *env) fanFigureCmd() *cobra.Command {
	return &cobra.Command{
		Use: "fan DESIGN.toml", Short: "A fan-cooled design: the fan's curve against the shroud and fins, at cruise and at idle",
		Args: cobra.ExactArgs(1), ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			fig, err := e.fanFigure(d)
			if err != nil {
				return err
			}
			return e.writeFigure(fig)
		},
	}
}

func (e *env) fanFigure(d *design.Design) (*plots.Figure, error) {
	_, u, err := e.settings()
	if err != nil {
		return nil, err
	}
	if d.Case.Supply.Kind != cylinder.SupplyFan {
		return nil, fail(ExitUsage, fmt.Errorf("%s: no fan ([cooling] source = \"fan\" with its [[fan_point]] curve)", d.Name))
	}
	var lines []plots.Series
	for i, v := range []float64{d.Case.Speed, 0} {
		c := d.Cylinder().Case
		c.Speed = v
		op, err := c.FanOperatingPoint(d.Run)
		if err != nil {
			return nil, modelError(d.Name, err)
		}
		f := c.Supply.Fan
		at := fmt.Sprintf("%s %s, fan %s rpm", u.N(u.Of(output.Road, v), 0), u.Name(output.Road), u.N(op.Speed*60, 0))
		fanLine := plots.Series{Label: "fan at " + at, Design: i}
		sys := plots.Series{Label: "shroud and fins", Design: i, Dashed: true}
		qmax := f.Curve[len(f.Curve)-1].Flow * op.Speed / f.CurveSpeed
		rho := c.Pressure / (airflow.RAir * c.Ambient)
		for k := 0; k <= 40; k++ {
			q := qmax * float64(k) / 40
			fanLine.X, fanLine.Y = append(fanLine.X, u.Of(output.VolFlow, q)), append(fanLine.Y, u.Of(output.Drop, f.Pressure(q, op.Speed, rho)))
			if p, err := c.SystemPressure(d.Run, q); err == nil {
				sys.X, sys.Y = append(sys.X, u.Of(output.VolFlow, q)), append(sys.Y, u.Of(output.Drop, p))
			}
		}
		point := plots.Series{Label: fmt.Sprintf("operating point at %s: %s %s, %s %s", u.N(u.Of(output.Road, v), 0)+" "+u.Name(output.Road),
			u.N(u.Of(output.VolFlow, op.Flow), 3), u.Name(output.VolFlow), u.N(u.Of(output.Drop, op.Pressure), 0), u.Name(output.Drop)),
			X: []float64{u.Of(output.VolFlow, op.Flow)}, Y: []float64{u.Of(output.Drop, op.Pressure)}, Design: i, Marks: true}
		lines = append(lines, fanLine, sys, point)
	}
	return plots.Speeds("Fan against shroud and fins\n"+short(d.Name),
		"fan flow at its inlet ("+u.Name(output.VolFlow)+")", "static pressure ("+u.Name(output.Drop)+")", lines, nil)
}
