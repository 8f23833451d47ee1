package optimise

import (
	"math"
	"testing"

	"finmarch/airflow/internal/demotest"
	"finmarch/fins"
)

// The constraints at an optimum, computed by hand for one set: a tip at the
// process's minimum thickness is active with zero slack; the height to gap
// ratio H/(p - t_root) against its maximum; the draft atan((t_r - t_t)/(2H))
// against its minimum, in radians; a variable at its bound; and the
// temperature limit of the light goal, its slack limit less wall.
func TestConstraintsByHand(t *testing.T) {
	d := demotest.Upright(t)
	proc, _ := fins.LookupProcess("die-casting")
	vars := DefaultVars(d.Case.Head.Set, proc)
	p := Problem{Base: d, Sets: []int{Head}, Vars: [][]Var{vars}, Goal: GoalLight, Limit: 480, Process: proc}
	x := []float64{0.009, vars[1].Hi, 0.004, proc.MinThickness, 8} // height at its upper bound
	sol := Solution{Found: true, Optimum: Point{X: x, Wall: 479.5, Mass: 1}}
	cs := p.Constraints(sol, func(_ int, s string) string { return s })
	by := map[string]Constraint{}
	for _, c := range cs {
		by[c.Name] = c
	}
	H := vars[1].Hi
	draft := math.Atan((0.004 - proc.MinThickness) / (2 * H))
	for _, w := range []struct {
		name                string
		unit                string
		limit, value, slack float64
		active              bool
	}{
		{"minimum thickness", "m", proc.MinThickness, proc.MinThickness, 0, true},
		{"height to gap", "-", proc.MaxAspect, H / (0.009 - 0.004), proc.MaxAspect - H/(0.009-0.004), proc.MaxAspect-H/(0.009-0.004) <= 0.02*proc.MaxAspect},
		{"draft", "rad", proc.MinDraft, draft, draft - proc.MinDraft, draft-proc.MinDraft <= 0.02*math.Tan(proc.MinDraft)},
		{"height bound", "m", vars[1].Hi, H, 0, true},
		{"head temperature limit", "K", 480, 479.5, 0.5, true},
	} {
		c, ok := by[w.name]
		if !ok {
			t.Errorf("no %q among %+v", w.name, cs)
			continue
		}
		if c.Unit != w.unit || math.Abs(c.Limit-w.limit) > 1e-12 || math.Abs(c.Value-w.value) > 1e-12 || math.Abs(c.Slack-w.slack) > 1e-12 || c.Active != w.active {
			t.Errorf("%s: %+v, want unit %s limit %g value %g slack %g active %v", w.name, c, w.unit, w.limit, w.value, w.slack, w.active)
		}
	}
}
