package design

import (
	"fmt"
	"strings"

	"finmarch/airflow/cylinder"
	"finmarch/fins"
)

// CoolingT is the [cooling] table: where the cooling air comes from (ram
// air when absent; a duct; a fan in a shroud, whose curve is the
// [[fan_point]]s).
type CoolingT struct {
	Source      string      `toml:"source"`
	Drop        Q[Pressure] `toml:"drop"`
	MassFlow    Q[MassFlow] `toml:"mass_flow"`
	Route       string      `toml:"route"`
	CurveSpeed  Q[Rotation] `toml:"fan_curve_speed"`
	FanRatio    Q[Fraction] `toml:"fan_ratio"`
	EngineSpeed Q[Rotation] `toml:"engine_speed"`
	IdleSpeed   Q[Rotation] `toml:"idle_speed"`
	RatedSpeed  Q[Rotation] `toml:"rated_speed"`
	ShroudLoss  Q[Fraction] `toml:"shroud_loss"`
	ShroudArea  Q[Area]     `toml:"shroud_area"`
	Leakage     Q[Fraction] `toml:"leakage"`
}

// FanPointT is one [[fan_point]] of the fan's curve, at fan_curve_speed in
// standard air: flow and pressure at every point, the static efficiency at
// every point or at none.
type FanPointT struct {
	Flow       Q[VolumeFlow] `toml:"flow"`
	Pressure   Q[Pressure]   `toml:"pressure"`
	Efficiency Q[Fraction]   `toml:"efficiency"`
}

// cooling reads the [cooling] table and the [[fan_point]]s into the case's
// air supply: ram air when the table is absent or says so, a duct, or a
// fan in a shroud. A key that the chosen source does not use is an error,
// not ignored.
func (b *builder) cooling() {
	f, d := b.f, b.d
	c := f.Cooling
	src := strings.ToLower(strings.TrimSpace(c.Source))
	if !b.md.IsDefined("cooling") && len(f.FanPoint) == 0 {
		return
	}
	used := map[string]bool{"source": true}
	switch src {
	case "", "ram":
		src = "ram"
	case "duct":
		used["drop"], used["mass_flow"], used["route"] = true, true, true
		s := cylinder.Supply{Kind: cylinder.SupplyDuct}
		switch {
		case c.Drop.Set == c.MassFlow.Set:
			b.add("cooling", "a duct takes drop (the pressure difference across the fins) or mass_flow, one of them")
		case c.Drop.Set:
			s.Drop = b.need("cooling.drop", c.Drop.raw(), true, 10, 20e3, "Pa", 1, 0)
		default:
			s.MassFlow = b.need("cooling.mass_flow", c.MassFlow.raw(), true, 0.001, 10, "kg/s", 1, 0)
		}
		s.Series = b.route(c.Route)
		d.Case.Supply = s
	case "fan":
		for _, k := range []string{"route", "fan_curve_speed", "fan_ratio", "engine_speed", "idle_speed", "rated_speed", "shroud_loss", "shroud_area", "leakage"} {
			used[k] = true
		}
		d.Case.Supply = cylinder.Supply{Kind: cylinder.SupplyFan, Series: b.route(c.Route), Fan: b.fan()}
	default:
		b.add("cooling.source", "%q: use ram (the default), duct or fan", c.Source)
		return
	}
	for _, k := range []string{"drop", "mass_flow", "route", "fan_curve_speed", "fan_ratio", "engine_speed", "idle_speed", "rated_speed", "shroud_loss", "shroud_area", "leakage"} {
		if b.md.IsDefined("cooling", k) && !used[k] {
			b.add("cooling."+k, "not used with source = %q", src)
		}
	}
	if len(f.FanPoint) > 0 && src != "fan" {
		b.add("fan_point[1]", "a fan curve without source = \"fan\" in [cooling]")
	}
}

// route reads cooling.route: parallel (the default) or series, which
// needs longitudinal fins on both sets.
func (b *builder) route(r string) bool {
	switch strings.ToLower(strings.TrimSpace(r)) {
	case "", "parallel":
		return false
	case "series":
		c := b.d.Case
		if c.Head.Set.Style != fins.StyleLongitudinal || c.Barrel.Set.Style != fins.StyleLongitudinal {
			b.add("cooling.route", "series (head fins, then barrel fins) needs longitudinal fins on both sets, passages along the axis")
		}
		return true
	}
	b.add("cooling.route", "%q: use parallel (each set across the supply) or series (head then barrel)", r)
	return false
}

// fan reads the fan: its [[fan_point]] curve, the speeds that drive it and
// the shroud.
func (b *builder) fan() *cylinder.Fan {
	f, c := b.f, b.f.Cooling
	fan := &cylinder.Fan{}
	if len(f.FanPoint) < 2 {
		b.add("fan_point", "a fan needs its curve: two or more [[fan_point]] tables, each with flow and pressure (and efficiency at every point or at none), at fan_curve_speed")
	}
	if len(f.FanPoint) > 50 {
		b.add(fmt.Sprintf("fan_point[%d]", len(f.FanPoint)), "at most 50 points")
		return fan
	}
	for i, p := range f.FanPoint {
		key := fmt.Sprintf("fan_point[%d]", i+1)
		q := cylinder.FanPoint{
			Flow:     b.need(key+".flow", p.Flow.raw(), p.Flow.Set, 0, 100, "m3/s", 1, 0),
			Pressure: b.need(key+".pressure", p.Pressure.raw(), p.Pressure.Set, 0, 20e3, "Pa", 1, 0),
		}
		if p.Efficiency.Set {
			q.Efficiency = b.opt(key+".efficiency", p.Efficiency.raw(), true, 0, 0.01, 0.95, "", 1, 0, "")
		}
		if i > 0 && p.Flow.Set && p.Pressure.Set {
			prev := f.FanPoint[i-1]
			if prev.Flow.Set && !(p.Flow.SI > prev.Flow.SI) {
				b.add(key+".flow", "%g m3/s is not above the point before (%g m3/s): list the points in order of flow", p.Flow.SI, prev.Flow.SI)
			}
			if prev.Pressure.Set && p.Pressure.SI > prev.Pressure.SI {
				b.add(key+".pressure", "%g Pa rises above the point before (%g Pa): give the falling part of the curve, right of its peak", p.Pressure.SI, prev.Pressure.SI)
			}
		}
		fan.Curve = append(fan.Curve, q)
	}
	// an efficiency given at some points only would be dropped where the
	// curve has too few to interpolate, and would make up the rest where
	// it has enough: the curve gives it at every point or at none
	var given []string
	for i, p := range f.FanPoint {
		if p.Efficiency.Set {
			given = append(given, fmt.Sprint(i+1))
		}
	}
	if len(given) > 0 && len(given) < len(f.FanPoint) {
		at := "point " + given[0] + " only"
		if len(given) > 1 {
			at = "points " + strings.Join(given, ", ")
		}
		for i, p := range f.FanPoint {
			if !p.Efficiency.Set {
				b.add(fmt.Sprintf("fan_point[%d].efficiency", i+1), "missing: the curve gives the efficiency at %s; give it at every point (0.01 to 0.95) or at none (the air power then stands for the shaft power, a lower bound)", at)
			}
		}
	}
	const rpm = 1.0 / 60
	fan.CurveSpeed = b.need("cooling.fan_curve_speed", c.CurveSpeed.raw(), c.CurveSpeed.Set, 100*rpm, 30000*rpm, "rpm", rpm, 0)
	fan.Ratio = b.opt("cooling.fan_ratio", c.FanRatio.raw(), c.FanRatio.Set, 1, 0.1, 10, "", 1, 0, "1 (the fan on the crankshaft)")
	fan.ShroudLoss = b.opt("cooling.shroud_loss", c.ShroudLoss.raw(), c.ShroudLoss.Set, 0, 0, 20, "", 1, 0, "0: no shroud loss (give your shroud's entry, bend and exit losses in velocity heads, with shroud_area)")
	if c.ShroudLoss.Set || c.ShroudArea.Set {
		fan.ShroudArea = b.need("cooling.shroud_area", c.ShroudArea.raw(), c.ShroudArea.Set, 1e-4, 1, "cm2", 1e-4, 0)
	}
	fan.Leakage = b.opt("cooling.leakage", c.Leakage.raw(), c.Leakage.Set, 0, 0, 0.8, "", 1, 0, "0: no air bypasses the fins (give your shroud's leakage share)")
	switch {
	case c.EngineSpeed.Set:
		fan.EngineSpeed = b.need("cooling.engine_speed", c.EngineSpeed.raw(), true, 300*rpm, 20000*rpm, "rpm", rpm, 0)
		for _, k := range []string{"idle_speed", "rated_speed"} {
			if b.md.IsDefined("cooling", k) {
				b.add("cooling."+k, "not used with engine_speed: give the engine speed, or idle_speed and rated_speed with load.top_gear_speed")
			}
		}
	default:
		fan.IdleSpeed = b.need("cooling.idle_speed", c.IdleSpeed.raw(), c.IdleSpeed.Set, 300*rpm, 5000*rpm, "rpm", rpm, 0)
		fan.RatedSpeed = b.need("cooling.rated_speed", c.RatedSpeed.raw(), c.RatedSpeed.Set, 1000*rpm, 20000*rpm, "rpm", rpm, 0)
		if c.IdleSpeed.Set && c.RatedSpeed.Set && !(fan.RatedSpeed > fan.IdleSpeed) {
			b.add("cooling.rated_speed", "%.6g rpm is not above idle_speed (%.6g rpm): the engine speeds up from idle to rated_speed at load.top_gear_speed", fan.RatedSpeed/rpm, fan.IdleSpeed/rpm)
		}
		fan.TopGearSpeed = b.d.Load.Road.TopGearSpeed
		if b.d.Load.Direct || fan.TopGearSpeed == 0 {
			b.add("cooling", "the fan's speed follows the road speed through load.top_gear_speed (with idle_speed and rated_speed); give it, or give engine_speed")
		}
	}
	return fan
}
