package optimise

import "math"

// Constraint is one row of the constraints at the optimum, in SI: a
// casting limit, a bound the optimum sits on, or a temperature limit.
type Constraint struct {
	Name   string      `json:"name"`
	Kind   string      `json:"kind"` // casting, bound or temperature
	Unit   string      `json:"unit"` // m, rad, K, - (a ratio) or count
	Limit  float64     `json:"limit"`
	Value  float64     `json:"value"`
	Slack  float64     `json:"slack"` // in Unit; 0 or less is active or broken
	Active bool        `json:"active"`
	Range  *[2]float64 `json:"range,omitempty"` // a bound's variable range
}

// Constraints lists the casting limits, the bounds the optimum sits on
// and the temperature limits at the optimum, each in its own SI unit;
// label names a limit of the k-th varied set (a prefix when both vary).
// A casting limit is active within 2 % of its own size, a temperature
// limit within 1 K, a bound when the optimum sits on it (with a Step, on
// the bound's nearest multiple of the step inside the box).
func (pr Problem) Constraints(sol Solution, label func(k int, name string) string) []Constraint {
	opt := sol.Optimum
	out := []Constraint{}
	for k := range pr.Vars {
		p := pr.ProcessOf(pr.Sets[k])
		vs, err := pr.OnStep(k) // the bounds as the search took them
		if err != nil {
			vs = pr.Vars[k]
		}
		s := pr.Set(k, opt.X)
		for _, v := range p.Check(s) {
			c := Constraint{Name: label(k, v.Constraint), Kind: "casting"}
			switch v.Constraint {
			case "minimum thickness":
				c.Unit, c.Limit, c.Value = "m", p.MinThickness, s.TipThickness
			case "height to gap":
				c.Unit, c.Limit, c.Value = "-", p.MaxAspect, s.Height/(s.Pitch-s.RootThickness)
			case "draft":
				c.Unit, c.Limit, c.Value = "rad", p.MinDraft, math.Atan((s.RootThickness-s.TipThickness)/(2*s.Height))
			}
			c.Slack = c.Value - c.Limit
			if c.Unit == "-" {
				c.Slack = -c.Slack // a most, not a least
			}
			// active: within 2% of the limit's own size (the check's slack)
			scale := map[string]float64{"minimum thickness": p.MinThickness, "height to gap": p.MaxAspect, "draft": math.Tan(p.MinDraft)}[v.Constraint]
			c.Active = v.Slack <= 0.02*scale+1e-9
			out = append(out, c)
		}
		for i, v := range vs {
			xi := opt.X[5*k+i]
			span := v.Hi - v.Lo
			if span > 0 && (xi-v.Lo <= 1e-3*span || v.Hi-xi <= 1e-3*span) {
				c := Constraint{Name: label(k, v.Name+" bound"), Kind: "bound", Unit: "m", Limit: v.Lo, Value: xi, Active: true, Range: &[2]float64{v.Lo, v.Hi}}
				if v.Hi-xi < xi-v.Lo {
					c.Limit = v.Hi
				}
				if v.Integer {
					c.Unit = "count"
				}
				out = append(out, c)
			}
		}
	}
	primary, other := SetNames[pr.Primary()], SetNames[pr.Other()]
	if pr.Goal == GoalLight {
		out = append(out, Constraint{Name: primary + " temperature limit", Kind: "temperature", Unit: "K", Limit: pr.Limit, Value: opt.Wall, Slack: pr.Limit - opt.Wall, Active: pr.Limit-opt.Wall < 1})
	}
	if sol.GuardOther {
		name := other + " temperature limit"
		if !pr.Both() {
			name += " (series air)"
		}
		out = append(out, Constraint{Name: name, Kind: "temperature", Unit: "K", Limit: sol.OtherLimit, Value: opt.Other, Slack: sol.OtherLimit - opt.Other, Active: sol.OtherLimit-opt.Other < 1})
	}
	return out
}
