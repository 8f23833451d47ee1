package app

import (
	"fmt"
	"strings"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/output"
)

// methodWall is one method's wall for a table: its temperature, or the
// state without an equilibrium.
func methodWall(u output.Units, t float64, eq bool) string {
	if !eq {
		return noValue(u, noEquilibrium)
	}
	return fmtT(u, t)
}

// methodsGrid shows every air-side method's walls and mean coefficients
// beside the estimate's own: the spread between them is the model's own
// uncertainty. Nil when the result has no methods (fixed walls).
func methodsGrid(u output.Units, r cylinder.Result) *output.Grid {
	if len(r.Methods) == 0 {
		return nil
	}
	g := output.Grid{Title: "Air-side methods (the spread between them is model uncertainty)",
		Header: []string{"method", "head (" + u.Name(output.Temp) + ")", "barrel (" + u.Name(output.Temp) + ")",
			"mean h head / barrel (" + u.Name(output.H) + ")", "air at barrel fins (" + u.Name(output.Temp) + ")", "note"}, Left: 1}
	for _, m := range r.Methods {
		if !m.Applies {
			g.Rows = append(g.Rows, []string{string(m.Method), noValue(u, "-"), noValue(u, "-"), noValue(u, "-"), noValue(u, "-"), "does not apply: " + m.Why})
			continue
		}
		note := ""
		switch {
		case m.Used:
			note = "the estimate"
		case len(m.Warnings) == 1:
			note = "1 range warning (JSON)"
		case len(m.Warnings) > 1:
			note = fmt.Sprintf("%d range warnings (JSON)", len(m.Warnings))
		}
		g.Rows = append(g.Rows, []string{string(m.Method), methodWall(u, m.Head, m.HeadEq), methodWall(u, m.Barrel, m.BarrelEq),
			u.N(u.Of(output.H, m.HeadH), 1) + " / " + u.N(u.Of(output.H, m.BarrelH), 1), fmtT(u, m.BarrelAirIn), note})
	}
	return &g
}

// methodNote names the estimate's method and why, and the spread.
func methodNote(u output.Units, r cylinder.Result) string {
	s := fmt.Sprintf("Air-side method: %s (%s), because %s.", r.Method, r.Method.Describe(), strings.TrimSuffix(r.MethodReason, "."))
	if len(r.Methods) == 0 {
		return s
	}
	hs, bs, noEq := r.MethodSpread()
	s += fmt.Sprintf(" Over the %d methods that apply the head spans %s %s and the barrel %s %s", applicable(r), fmtDT(u, hs), u.Name(output.TempDiff), fmtDT(u, bs), u.Name(output.TempDiff))
	if noEq {
		s += ", and at least one finds no equilibrium"
	}
	return s + "; the band draws the method with the other inputs, this one with half the weight, so its middle can sit away from the estimate toward the others."
}

// applicable counts the methods that apply.
func applicable(r cylinder.Result) int {
	n := 0
	for _, m := range r.Methods {
		if m.Applies {
			n++
		}
	}
	return n
}
