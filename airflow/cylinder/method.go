package cylinder

import (
	"encoding/json"
	"math"

	"finmarch/airflow"
	"finmarch/fins"
	"finmarch/fins/validity"
)

// Method is an air-side method: how the forced convection of the fin sets
// is found. Every method shares the rest of the estimate (fin efficiency,
// natural convection, radiation, the air over the fin envelope, the wall
// balance).
type Method string

// The methods.
const (
	// MethodAuto is the configuration's default (Case.DefaultMethod).
	MethodAuto Method = ""
	// MethodGibson takes the fins' mean coefficient from Gibson's
	// motorcycle-fin correlation (airflow.GibsonH) at the approach speed
	// of the road-speed component along the fins, referred to the air
	// approaching the set.
	MethodGibson Method = "gibson"
	// MethodBriggsYoung takes it from Briggs & Young's annular finned-tube
	// correlation (airflow.BriggsYoungNu) at the approach speed, on the
	// root diameter; annular fins only.
	MethodBriggsYoung Method = "briggs-young"
	// MethodChannel marches the air along the fin passages taken as closed
	// channels driven by the available pressure (march.go): the ducted
	// limit of an open-tipped array.
	MethodChannel Method = "channel"
)

// Methods lists every method, in the order the output shows them.
var Methods = []Method{MethodGibson, MethodBriggsYoung, MethodChannel}

// Describe says in a few words what the method is, with its source.
func (m Method) Describe() string {
	switch m {
	case MethodGibson:
		return "Gibson's motorcycle-fin correlation (Yoshida et al. 2006, Eq. 1) at the approach speed along the fins"
	case MethodBriggsYoung:
		return "Briggs & Young (1963) annular finned tubes at the approach speed, on the root diameter"
	case MethodChannel:
		return "channel march along closed fin passages (Stephan/Gnielinski, VDI Heat Atlas 2010)"
	}
	return string(m)
}

// Applies reports whether method m can estimate case c, and if not why.
func (c Case) Applies(m Method) (bool, string) {
	switch m {
	case MethodChannel:
		return true, ""
	case MethodGibson, MethodBriggsYoung:
		if c.Supply.ducted() {
			return false, "a free-stream correlation: inside a shroud or duct the fins are closed passages"
		}
		if c.FixedH > 0 {
			return false, "the forced coefficient is fixed by [override] h"
		}
		if m == MethodBriggsYoung && (c.Head.Set.Style != fins.StyleAnnular || c.Barrel.Set.Style != fins.StyleAnnular) {
			return false, "fitted to annular fins only"
		}
		return true, ""
	}
	return false, "unknown method"
}

// Applicable lists the methods that apply to c, in the order of Methods.
func (c Case) Applicable() []Method {
	var out []Method
	for _, m := range Methods {
		if ok, _ := c.Applies(m); ok {
			out = append(out, m)
		}
	}
	return out
}

// DefaultMethod returns the method an estimate of c uses when the settings
// name none, with the reason for the choice:
//   - ram air over open fins: Gibson, the one published correlation made on
//     motorcycle finned cylinders in a free stream (for longitudinal fins
//     taken along the axis it is this project's application, stated);
//   - a shroud, a duct or a fan: the channel march, since the shroud closes
//     the passages and the drop across them is known;
//   - a fixed forced coefficient ([override] h): the channel march, which
//     carries that h along the passages and the air's warming.
func (c Case) DefaultMethod() (Method, string) {
	switch {
	case c.Supply.ducted():
		return MethodChannel, "in a shroud the fins are closed passages at a known drop"
	case c.FixedH > 0:
		return MethodChannel, "the forced coefficient is fixed by [override] h, and the channel march carries it and the air's warming"
	}
	return MethodGibson, "the fins stand open in the road air, and Gibson's is the one published correlation made on motorcycle finned cylinders in a free stream (for longitudinal fins along the axis this project applies it beyond the annular fins it was fitted to)"
}

// Method resolves the settings' method for c: MethodAuto is the default,
// and a named method that does not apply falls back to the default.
func (c Case) Method(s Settings) Method {
	if s.Method != MethodAuto {
		if ok, _ := c.Applies(s.Method); ok {
			return s.Method
		}
	}
	m, _ := c.DefaultMethod()
	return m
}

// approach returns the speed at which road air approaches a set's fins
// along their planes, m/s: the road-speed component along the fins times
// sqrt(Recovery), the share of the dynamic pressure that reaches them (the
// same share that drives the channel march).
func (p *prepared) approach(st *setState) float64 {
	return math.Sqrt(p.c.Recovery) * st.pt.Component
}

// freeStream is the forced convection of a set by a free-stream method at
// wall temperature tw (K) with air approaching at tin (K): the method's
// mean coefficient h (times the forced factor), the fin efficiency at h,
// and Q = eta_o h A (T_w - T_in). The air that meets the set's fin gaps at
// the approach speed, rho u times their frontal area (frontal), carries the heat away:
// its mixed-out temperature is the air a downstream set (the barrel on a
// series path) meets. That mixing, the whole frontal stream of the fin
// gaps taking the heat, is our assumption: the channel march, where only
// the slower passage flow takes it, is the other bound, and the spread of
// the methods carries the difference.
func (p *prepared) freeStream(st *setState, tw, tin float64) marchOut {
	fs, g := st.fs, st.g
	out := marchOut{tOut: tin}
	u := p.approach(st)
	air := airflow.Properties(tin, p.c.Pressure, p.log)
	var h float64
	meanT := 0.5 * (fs.Set.RootThickness + fs.Set.TipThickness)
	switch p.method {
	case MethodGibson:
		h = airflow.GibsonH(fs.Set.Height, g.GapMean+meanT, u, air.Rho, p.log)
		out.regime = "free stream (Gibson)"
	case MethodBriggsYoung:
		d := fs.Set.RootDiameter
		re := air.Rho * u * d / air.Mu
		h = airflow.BriggsYoungNu(re, air.Pr, g.GapMean, fs.Set.Height, meanT, d, p.log) * air.K / d
		out.regime = "free stream (Briggs & Young)"
	}
	out.re = air.Rho * u * g.PlateDiameter / air.Mu
	if !(h > 0) || tw <= tin {
		out.regime = "no air along the fins"
		if h > 0 {
			out.regime = "free stream, wall below the air"
		}
		return out
	}
	h *= p.set.ForcedFactor
	k := p.set.ConductivityFactor * fs.Alloy.Conductivity(tw)
	eta := st.cv.Efficiency(h, k, p.log)
	a := g.TotalArea
	out.q = g.SurfaceEfficiency(eta) * h * a * (tw - tin)
	out.hA, out.etaA, out.area = h*a, eta*a, a
	out.tOut, out.mdot = mixOut(tin, out.q, p.frontal(st, air.Rho, u)), p.frontal(st, air.Rho, u)
	return out
}

// frontal returns the mass flow (kg/s) of air at density rho approaching a
// set's fin gaps at speed u: through each gap's frontal area, the gap
// times the tip diameter for annular fins in cross flow (the air meeting
// the root's projected width runs round it within the gap), the gap times
// the fin height for longitudinal fins along the axis.
func (p *prepared) frontal(st *setState, rho, u float64) float64 {
	g := st.g
	if st.fs.Set.Style == fins.StyleAnnular {
		return rho * u * float64(g.Passages) * g.GapMean * g.TipDiameter
	}
	return rho * u * float64(st.pt.Paths) * st.pt.FlowArea
}

// mixOut returns the temperature of air at tin (K) whose mass flow mdot
// (kg/s) takes heat q (W): H(t) = H(tin) + q/mdot on the Cengel cp cubic,
// by fixed-point passes on the mean cp over the rise.
func mixOut(tin, q, mdot float64) float64 {
	if !(mdot > 0) || q == 0 {
		return tin
	}
	t := tin + q/(mdot*meanCp(tin, tin))
	for it := 0; it < 20; it++ {
		next := tin + q/(mdot*meanCp(tin, t))
		if math.Abs(next-t) < 1e-9 {
			return next
		}
		t = next
	}
	return t
}

// MethodResult is one method's estimate of the walls, shown beside the
// default's so that the spread between methods, the model's own
// uncertainty, can be read.
type MethodResult struct {
	Method      Method  `json:"method"`
	Used        bool    `json:"used"` // the method the estimate uses (its default, or the one the settings name)
	Applies     bool    `json:"applies"`
	Why         string  `json:"why_not,omitempty"` // why it does not apply
	Head        float64 `json:"head_wall_temperature_K"`
	Barrel      float64 `json:"barrel_wall_temperature_K"`
	HeadEq      bool    `json:"head_equilibrium"`
	BarrelEq    bool    `json:"barrel_equilibrium"`
	HeadH       float64 `json:"head_mean_h_W_m2K"`
	BarrelH     float64 `json:"barrel_mean_h_W_m2K"`
	BarrelAirIn float64 `json:"barrel_air_inlet_K"`
	// Warnings are the range warnings of this method's correlations (an
	// alternative's warnings stay here, not among the estimate's).
	Warnings []validity.Warning `json:"warnings"`
}

// MarshalJSON writes null for a wall without an equilibrium and for every
// figure of a method that does not apply: a state, never a number.
func (m MethodResult) MarshalJSON() ([]byte, error) {
	type plain MethodResult
	num := func(v float64, ok bool) *float64 {
		if !ok || !m.Applies {
			return nil
		}
		return &v
	}
	return json.Marshal(struct {
		plain
		Head        *float64 `json:"head_wall_temperature_K"`
		Barrel      *float64 `json:"barrel_wall_temperature_K"`
		BarrelAirIn *float64 `json:"barrel_air_inlet_K"`
	}{plain(m), num(m.Head, m.HeadEq), num(m.Barrel, m.BarrelEq), num(m.BarrelAirIn, true)})
}

// alternatives estimates the walls of the prepared case under every other
// applicable method, at the same load, with totals only.
func (p *prepared) alternatives(load HeatLoad, primary Result) []MethodResult {
	var out []MethodResult
	for _, m := range Methods {
		ok, why := p.c.Applies(m)
		mr := MethodResult{Method: m, Used: m == p.method, Applies: ok, Why: why, Warnings: []validity.Warning{}}
		var r Result
		switch {
		case !ok:
			out = append(out, mr)
			continue
		case m == p.method:
			r = primary
			mr.Warnings = primary.Warnings // the estimate's own
		default:
			var log validity.Log
			q := *p
			q.method, q.log, q.segBuf, q.scratch = m, &log, nil, validity.Log{}
			q.set.TotalsOnly, q.set.OneMethod = true, true
			if m == MethodChannel {
				q.frictionRanges(&log)
			}
			r, _ = q.balance(load, &log)
			mr.Warnings = r.Warnings
		}
		mr.Head, mr.HeadEq, mr.HeadH = r.Head.WallTemp, r.Head.Equilibrium, r.Head.MeanH
		mr.Barrel, mr.BarrelEq, mr.BarrelH = r.Barrel.WallTemp, r.Barrel.Equilibrium, r.Barrel.MeanH
		mr.BarrelAirIn = r.Barrel.AirIn
		if mr.Warnings == nil {
			mr.Warnings = []validity.Warning{}
		}
		out = append(out, mr)
	}
	return out
}
