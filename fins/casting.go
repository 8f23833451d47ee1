package fins

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// Process holds the limits a manufacturing process puts on fins. These are
// common practice for aluminium cylinder fins, not the figures of one
// published standard: foundries quote their own, and the command line
// lets a user override each.
type Process struct {
	Name         string  `json:"name"`
	MinThickness float64 `json:"min_thickness_m"`   // m, thinnest section anywhere on the fin (the tip)
	MaxAspect    float64 `json:"max_height_to_gap"` // -, fin height over the clear gap at the root
	MinDraft     float64 `json:"min_draft_rad"`     // rad, taper of each fin face from the pull direction
	Source       string  `json:"source"`
}

// Processes lists the built-in processes.
var Processes = []Process{
	{Name: "sand", MinThickness: 3.0e-3, MaxAspect: 5, MinDraft: 1.5 * math.Pi / 180,
		Source: "common practice: sand-cast fins 3 mm and thicker, about 5:1 height to gap, 1 to 2 deg draft"},
	{Name: "permanent-mould", MinThickness: 2.0e-3, MaxAspect: 7, MinDraft: 1.0 * math.Pi / 180,
		Source: "common practice: gravity die (permanent-mould) fins 2 mm and thicker, about 7:1, 1 deg draft"},
	{Name: "die-casting", MinThickness: 1.2e-3, MaxAspect: 10, MinDraft: 1.0 * math.Pi / 180,
		Source: "common practice: pressure die-cast fins 1.2 mm and thicker, about 10:1, 1 deg draft"},
	{Name: "machined", MinThickness: 0.8e-3, MaxAspect: 15, MinDraft: 0,
		Source: "common practice: fins cut from solid 0.8 mm and thicker, about 15:1 for the cutter's reach, no draft"},
}

// LookupProcess finds a process by name.
func LookupProcess(name string) (Process, error) {
	n := strings.ToLower(strings.TrimSpace(name))
	n = strings.ReplaceAll(n, "_", "-")
	if n == "permanent-mold" || n == "gravity-die" {
		n = "permanent-mould"
	}
	var names []string
	for _, p := range Processes {
		if p.Name == n {
			return p, nil
		}
		names = append(names, p.Name)
	}
	return Process{}, fmt.Errorf("process %q: use %s", name, strings.Join(names, ", "))
}

// Violation is one casting limit a set breaks, with its slack (negative
// when broken) in the constraint's own units.
type Violation struct {
	Constraint string
	Slack      float64
}

// Check returns the slack of each of the process's limits for the set:
// tip thickness minus the minimum (m), the maximum aspect minus height over
// root gap (-), and the face taper (t_root - t_tip)/(2 H) minus tan(draft)
// (-). A negative slack is a broken limit. The result is sorted by name.
func (p Process) Check(s Set) []Violation {
	gap := s.Pitch - s.RootThickness
	aspect := math.Inf(1)
	if gap > 0 {
		aspect = s.Height / gap
	}
	taper := (s.RootThickness - s.TipThickness) / (2 * s.Height)
	out := []Violation{
		{"minimum thickness", s.TipThickness - p.MinThickness},
		{"height to gap", p.MaxAspect - aspect},
		{"draft", taper - math.Tan(p.MinDraft)},
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Constraint < out[j].Constraint })
	return out
}

// Feasible reports whether the set keeps every limit (to a tolerance of
// 1e-12 in each slack).
func (p Process) Feasible(s Set) bool {
	for _, v := range p.Check(s) {
		if v.Slack < -1e-12 {
			return false
		}
	}
	return true
}
