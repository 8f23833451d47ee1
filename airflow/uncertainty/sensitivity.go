package uncertainty

import (
	"encoding/json"
	"math"
	"sort"

	"finmarch/airflow/cylinder"
)

// Swing is what one uncertain input does to the walls on its own: the
// design evaluated with that input at each end of its half-width and every
// other input as designed (the default air-side method), K. A wall
// without an equilibrium below the search's cap is +Inf.
type Swing struct {
	Input    string     `json:"input"`
	Half     float64    `json:"half_width"` // as the Spread states it (absolute or relative, Relative says which)
	Relative bool       `json:"relative"`
	Head     [2]float64 `json:"head_K"`   // at the low and the high end of the input
	Barrel   [2]float64 `json:"barrel_K"` // the same
}

// HeadSwing is the larger minus the smaller head wall of the two ends
// (+Inf when one end finds no equilibrium).
func (w Swing) HeadSwing() float64 {
	return math.Max(w.Head[0], w.Head[1]) - math.Min(w.Head[0], w.Head[1])
}

// Sensitivity evaluates the design with each uncertain input of the band
// alone at the two ends of its half-width (a one-at-a-time study: the
// band's own draw, with that input's coordinate at 0 and 1 and the others
// at the middle, which is the design as given), largest head swing
// first. It shows which input decides a wall: the band mixes them all, and
// a builder asks which one to pin down or which lever to pull. Inputs
// with a zero half-width are left out, and so are the thermal efficiency
// and the head share of a load given per set, and the recovery of fins fed
// by a fan or a duct; the emissivities of the two finishes move together. It takes 2 estimates per input, about 16 in all.
func Sensitivity(d cylinder.Design, s cylinder.Settings, sp Spread) ([]Swing, error) {
	s.Workspace, s.TotalsOnly = cylinder.NewWorkspace(), true
	sp.Methods = false // the default method throughout: the methods' spread is shown apart
	type input struct {
		name     string
		half     float64
		relative bool
		coords   []int
	}
	inputs := []input{
		{"pressure recovery", sp.Recovery, false, []int{3}},
		{"cooling share", sp.CoolShare, true, []int{1}},
		{"brake thermal efficiency", sp.Thermal, true, []int{2}},
		{"head share", sp.HeadShare, false, []int{5}},
		{"forced convection", sp.Forced, true, []int{0}},
		{"natural convection", sp.Natural, true, []int{4}},
		{"conductivity", sp.Conductivity, true, []int{6}},
		{"emissivity", sp.Emissivity, false, []int{7, 8}},
	}
	var out []Swing
	for _, in := range inputs {
		if !(in.half > 0) {
			continue
		}
		if d.Load.Direct && (in.name == "brake thermal efficiency" || in.name == "head share") {
			continue // a load given per set has no efficiency or share to move
		}
		if in.name == "pressure recovery" && d.Case.Supply.Kind != cylinder.SupplyRam {
			continue // a shroud or a duct feeds the fins, not the road's pressure
		}
		w := Swing{Input: in.name, Half: in.half, Relative: in.relative}
		for end, u := range []float64{0, 1} {
			var x [dims]float64
			for k := range x {
				x[k] = 0.5
			}
			for _, k := range in.coords {
				x[k] = u
			}
			v, vs := draw(d, s, sp, x)
			o, err := v.Evaluate(vs)
			if err != nil {
				return nil, err
			}
			w.Head[end], w.Barrel[end] = o.Result.Head.WallTemp, o.Result.Barrel.WallTemp
			if !o.Result.Head.Equilibrium {
				w.Head[end] = math.Inf(1)
			}
			if !o.Result.Barrel.Equilibrium {
				w.Barrel[end] = math.Inf(1)
			}
		}
		out = append(out, w)
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].HeadSwing() > out[j].HeadSwing() })
	return out, nil
}

// MarshalJSON writes a wall without an equilibrium as null: a state, not
// a number (JSON has no infinity).
func (w Swing) MarshalJSON() ([]byte, error) {
	num := func(v [2]float64) [2]*float64 {
		var out [2]*float64
		for i := range v {
			if !math.IsInf(v[i], 0) && !math.IsNaN(v[i]) {
				x := v[i]
				out[i] = &x
			}
		}
		return out
	}
	return json.Marshal(struct {
		Input    string      `json:"input"`
		Half     float64     `json:"half_width"`
		Relative bool        `json:"relative"`
		Head     [2]*float64 `json:"head_K"`
		Barrel   [2]*float64 `json:"barrel_K"`
	}{w.Input, w.Half, w.Relative, num(w.Head), num(w.Barrel)})
}
