package cylinder

import (
	"encoding/json"
	"errors"
	"math"

	"finmarch/fins/validity"
)

// Segment is one step of the march along an air path. Heat and areas are
// totals over all parallel paths of the set.
type Segment struct {
	X        float64 `json:"x_m"`       // m, path position at the segment's end
	AirIn    float64 `json:"air_in_K"`  // K
	AirOut   float64 `json:"air_out_K"` // K
	H        float64 `json:"h_W_m2K"`   // W/(m2 K), forced coefficient, segment mean
	FinEff   float64 `json:"fin_eff"`   // -, fin efficiency at that h
	Flux     float64 `json:"flux_W_m2"` // W/m2 of finned surface (fins + base)
	Heat     float64 `json:"heat_W"`    // W
	Reynolds float64 `json:"reynolds"`  // Reynolds number on the plate hydraulic diameter
}

// SetResult is the outcome for one fin set.
type SetResult struct {
	Name         string  `json:"name"`
	Style        string  `json:"style"`
	HeatLoad     float64 `json:"heat_load_W"`
	HeatRejected float64 `json:"heat_rejected_W"`
	ForcedHeat   float64 `json:"forced_heat_W"`   // passages and envelope combined
	PassageHeat  float64 `json:"passage_heat_W"`  // the march along the fin passages
	EnvelopeHeat float64 `json:"envelope_heat_W"` // the air over the fin envelope: its tips and the slots under it
	EnvelopeH    float64 `json:"envelope_h_W_m2K"`
	// FrontHeat is what the front slots of longitudinal fins take from a
	// cross stream through them (front.go), LeadingFaceHeat what the
	// leading face of annular fins takes from an axial one (leading.go):
	// each alone, before the part-by-part mixing (setHeat)
	FrontHeat       float64 `json:"front_slots_heat_W"`
	LeadingFaceHeat float64 `json:"leading_face_heat_W"`
	NaturalHeat     float64 `json:"natural_heat_W"`
	ConvectionHeat  float64 `json:"convection_heat_W"`
	RadiationHeat   float64 `json:"radiation_heat_W"`
	// WallTemp is the wall at the fin roots, K. Without an equilibrium
	// (Equilibrium false) it is the search's cap, SaneWallLimit, where the
	// set falls Shortfall short of its load: not a temperature the set
	// reaches (the JSON gives null).
	WallTemp          float64   `json:"wall_temperature_K"`
	Equilibrium       bool      `json:"equilibrium"`
	Shortfall         float64   `json:"heat_shortfall_W"` // W, load less the heat rejected at the cap, with no equilibrium
	MeanH             float64   `json:"mean_h_W_m2K"`
	NaturalH          float64   `json:"natural_h_W_m2K"`
	FinEfficiency     float64   `json:"fin_efficiency"`
	SurfaceEfficiency float64   `json:"surface_efficiency"`
	AirIn             float64   `json:"air_inlet_K"`
	AirOut            float64   `json:"air_outlet_K"`
	PassageVelocity   float64   `json:"passage_velocity_m_s"` // the channel march's flow through the passages
	ApproachSpeed     float64   `json:"approach_speed_m_s"`   // the road air's speed along the fins as it meets them, sqrt(recovery) times the component (ram air; 0 in a shroud)
	ApproachComponent float64   `json:"approach_component_m_s"`
	Reynolds          float64   `json:"reynolds"`
	Regime            string    `json:"regime"`
	Paths             int       `json:"paths"`
	PathLength        float64   `json:"path_length_m"`
	Series            bool      `json:"series_path"`
	FinArea           float64   `json:"fin_area_m2"`
	TotalArea         float64   `json:"total_area_m2"`
	FinMass           float64   `json:"fin_mass_kg"`
	EnthalpyRise      float64   `json:"air_enthalpy_rise_W"` // mass flow times H(outlet) - H(inlet), apart from the segment sums
	AirImbalance      float64   `json:"air_imbalance"`       // |enthalpy rise - passage heat| / passage heat
	LoadImbalance     float64   `json:"load_imbalance"`      // |heat rejected - load| / load; 0 at fixed walls or no load
	March             []Segment `json:"march,omitempty"`     // omitted when TotalsOnly
}

// MarshalJSON writes the set with a null wall temperature and air outlet,
// and without its march, when it has no equilibrium, so that no script reads the search's cap, or
// the air leaving fins held at it, as a temperature (the heats at the cap
// stay: they are the most the fins reject below it, and the shortfall is
// the load less them).
func (r SetResult) MarshalJSON() ([]byte, error) {
	type plain SetResult
	if r.Equilibrium {
		return json.Marshal(plain(r))
	}
	return json.Marshal(struct {
		plain
		WallTemp *float64  `json:"wall_temperature_K"`
		AirOut   *float64  `json:"air_outlet_K"`
		March    []Segment `json:"march,omitempty"` // a march at the cap: left out
	}{plain: plain(r)})
}

// Result is the outcome for one cylinder.
type Result struct {
	Head      SetResult          `json:"head"`
	Barrel    SetResult          `json:"barrel"`
	Warnings  []validity.Warning `json:"warnings"`
	Ambient   float64            `json:"ambient_K"`
	Pressure  float64            `json:"pressure_Pa"`
	Speed     float64            `json:"speed_m_s"`
	TiltDeg   float64            `json:"tilt_deg"`
	MaxImbal  float64            `json:"energy_imbalance_max"` // the largest air or load imbalance of the two sets
	Converged bool               `json:"converged"`
	Supply    *SupplyResult      `json:"supply,omitempty"` // a duct's or a fan's air; nil for ram air
	// Method is the air-side method of the estimate and MethodReason why
	// it is the one for this configuration; Methods holds every method's
	// walls (nil with Settings.OneMethod or fixed walls).
	Method       Method         `json:"method"`
	MethodReason string         `json:"method_reason"`
	Methods      []MethodResult `json:"methods"`
}

// AlongSpeed is the speed of the air along a set's fins as the result's
// method sees it: the approach speed for a free-stream method, the
// passage velocity for the channel march.
func (r Result) AlongSpeed(s SetResult) float64 {
	if r.Method == MethodChannel || r.Supply != nil {
		return s.PassageVelocity
	}
	return s.ApproachSpeed
}

// MethodSpread returns the spread of the head and barrel walls over the
// applicable methods with an equilibrium, K (max less min), and whether
// any applicable method found no equilibrium.
func (r Result) MethodSpread() (head, barrel float64, noEq bool) {
	hl, hh, bl, bh := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, m := range r.Methods {
		if !m.Applies {
			continue
		}
		if !m.HeadEq || !m.BarrelEq {
			noEq = true
			continue
		}
		hl, hh = math.Min(hl, m.Head), math.Max(hh, m.Head)
		bl, bh = math.Min(bl, m.Barrel), math.Max(bh, m.Barrel)
	}
	if hh < hl {
		return 0, 0, noEq
	}
	return hh - hl, bh - bl, noEq
}

// SupplyResult is the air a duct or a fan drives through the fins.
type SupplyResult struct {
	Kind     SupplyKind      `json:"kind"`
	Drop     float64         `json:"drop_Pa"`        // across the fins
	MassFlow float64         `json:"mass_flow_kg_s"` // through both sets
	Fan      *FanPointResult `json:"fan,omitempty"`
}

// MarshalJSON writes the result with its warnings as a list, empty rather
// than null when there are none.
func (r Result) MarshalJSON() ([]byte, error) {
	type plain Result
	if r.Warnings == nil {
		r.Warnings = []validity.Warning{}
	}
	if r.Methods == nil {
		r.Methods = []MethodResult{}
	}
	return json.Marshal(plain(r))
}

// FinMass is the fin mass of both sets, kg.
func (r Result) FinMass() float64 { return r.Head.FinMass + r.Barrel.FinMass }

// HeatPerFinMass is the heat both sets reject per kilogram of their fins,
// W/kg: the figure of merit for comparing fin designs.
func (r Result) HeatPerFinMass() float64 {
	return (r.Head.HeatRejected + r.Barrel.HeatRejected) / r.FinMass()
}

// ErrNoEquilibrium is wrapped by Balance when the fins cannot reject the
// load at any wall temperature up to SaneWallLimit.
var ErrNoEquilibrium = errors.New("no equilibrium")

// own gives a result its own copy of the march, which setHeat leaves in the
// shared trial buffer.
func own(r *SetResult) {
	r.March = append([]Segment(nil), r.March...)
}

func (p *prepared) result(hr, br SetResult, log *validity.Log, conv bool) Result {
	hr.PassageVelocity, br.PassageVelocity = p.sets[head].vel, p.sets[barrel].vel
	if !p.c.Supply.ducted() {
		hr.ApproachSpeed, br.ApproachSpeed = p.approach(&p.sets[head]), p.approach(&p.sets[barrel])
	}
	r := Result{Head: hr, Barrel: br, Ambient: p.c.Ambient, Pressure: p.c.Pressure, Speed: p.c.Speed,
		TiltDeg: p.c.Tilt * 180 / math.Pi, Converged: conv, Method: p.method}
	if m, why := p.c.DefaultMethod(); m == p.method {
		r.MethodReason = why
	} else {
		r.MethodReason = "it is named in the design ([air] method)"
	}
	r.MaxImbal = max(hr.AirImbalance, br.AirImbalance, hr.LoadImbalance, br.LoadImbalance)
	r.Warnings = log.Warnings()
	if p.c.Supply.ducted() {
		h, b := p.sets[head], p.sets[barrel]
		w := h.mdot * float64(h.pt.Paths)
		if !p.series {
			w += b.mdot * float64(b.pt.Paths)
		}
		r.Supply = &SupplyResult{Kind: p.c.Supply.Kind, Drop: p.drop, MassFlow: w}
		if p.c.Supply.Kind == SupplyFan {
			f := p.fan
			r.Supply.Fan = &f
		}
	}
	return r
}
