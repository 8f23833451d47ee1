package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

func (e *env) marchCmd() *cobra.Command {
	return e.oneDesign("march DESIGN.toml", "Show the segment-by-segment march of the cooling air along the fin passages", e.march)
}

func (e *env) march(d *design.Design) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	def, err := evaluate(d, d.Case.Speed)
	if err != nil {
		return err
	}
	// the march is the channel method's: a free-stream method has a mean
	// coefficient, not a path
	o := def
	if def.Result.Method != cylinder.MethodChannel && !def.Fixed {
		ch := *d
		ch.Run.Method = cylinder.MethodChannel
		if o, err = evaluate(&ch, d.Case.Speed); err != nil {
			return err
		}
	}
	T, L := u.Name(output.Temp), u.Name(output.Len)
	g := output.Grid{Title: "March along one air path of each fin set (heat and flux summed over all parallel paths)",
		Header: []string{"set", "segment", "x (" + L + ")", "air in (" + T + ")", "air out (" + T + ")", "h (" + u.Name(output.H) + ")", "fin eff", "flux (" + u.Name(output.Flux) + ")", "heat (" + u.Name(output.Power) + ")"}, Left: 1}
	for _, s := range []cylinder.SetResult{o.Result.Head, o.Result.Barrel} {
		if !s.Equilibrium && !o.Fixed {
			continue // a march at the search's cap is not a state: the note says so
		}
		for i, sg := range s.March {
			g.Rows = append(g.Rows, []string{s.Name, fmt.Sprint(i + 1), u.N(u.Of(output.Len, sg.X), u.Dec(output.Len)), fmtT(u, sg.AirIn), fmtT(u, sg.AirOut),
				u.N(u.Of(output.H, sg.H), 1), u.N(sg.FinEff, 3), u.N(u.Of(output.Flux, sg.Flux), 0), u.N(u.Of(output.Power, sg.Heat), 1)})
		}
	}
	est := ""
	if o.Result.Method != def.Result.Method {
		// the march is the channel method's: say the estimate's own head
		// beside it, so the two never read as a contradiction
		est = fmt.Sprintf("; the estimate, by %s: head %s", def.Result.Method, wallPhrase(u, def.Result.Head))
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: channel march at %s %s (by the channel method: head wall %s, barrel wall %s%s)", d.Name,
		u.N(u.Of(output.Road, d.Case.Speed), 0), u.Name(output.Road), wallPhrase(u, o.Result.Head), wallPhrase(u, o.Result.Barrel), est),
		Grids: []output.Grid{g}, Caution: true}
	for _, s := range []cylinder.SetResult{o.Result.Head, o.Result.Barrel} {
		if len(s.March) == 0 {
			doc.Notes = append(doc.Notes, fmt.Sprintf("The %s fins get no forced flow at this tilt and speed: natural convection and radiation only.", s.Name))
			continue
		}
		if !s.Equilibrium {
			doc.Notes = append(doc.Notes, fmt.Sprintf("%s: no equilibrium below %s: its march would be drawn at that cap, a state the fins never reach, so it is left out of the table and the JSON.", title(s.Name), capText(u)))
			continue
		}
		first, last := s.March[0], s.March[len(s.March)-1]
		doc.Notes = append(doc.Notes, fmt.Sprintf("%s: the air warms from %s to %s %s along %s %s; the local heat flux falls from %s to %s %s (%s%% of its entry value).",
			title(s.Name), fmtT(u, s.AirIn), fmtT(u, s.AirOut), T, u.N(u.Of(output.Len, s.PathLength), 0), L,
			u.N(u.Of(output.Flux, first.Flux), 0), u.N(u.Of(output.Flux, last.Flux), 0), u.Name(output.Flux), u.N(100*last.Flux/first.Flux, 0)))
	}
	if o.NoEquilibrium != nil {
		doc.Notes = append(doc.Notes, "NO EQUILIBRIUM: "+o.NoEquilibrium.Error()+".")
	}
	if o.Result.Method != def.Result.Method {
		doc.Notes = append(doc.Notes, fmt.Sprintf("This is the channel method's march (air along closed fin passages). The estimate itself uses %s (%s), which has a mean coefficient and no path: head %s, barrel %s ('finmarch estimate' compares the methods).",
			def.Result.Method, def.Result.Method.Describe(), wallPhrase(u, def.Result.Head), wallPhrase(u, def.Result.Barrel)))
	}
	doc.Notes = append(doc.Notes, energyNote(o.Result, o.Fixed))
	doc.Warnings = o.warnings()
	doc.JSON = map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "head": o.Result.Head, "barrel": o.Result.Barrel, "energy_imbalance": o.Result.MaxImbal,
		"equilibrium": o.NoEquilibrium == nil, "warnings": doc.Warnings, "caution": output.Caution}
	if err := e.emit(doc); err != nil {
		return err
	}
	if o.NoEquilibrium != nil {
		return modelError(d.Name, o.NoEquilibrium)
	}
	return nil
}

// capText is the search's cap as a threshold in a sentence, "500 C" (whole
// degrees: it is a limit of the search, never a result).
func capText(u output.Units) string {
	return u.N(u.Of(output.Temp, cylinder.SaneWallLimit), 0) + " " + u.Name(output.Temp)
}

// wallPhrase is a set's wall in a sentence: the temperature with its
// unit, or "no equilibrium", never the search's cap.
func wallPhrase(u output.Units, r cylinder.SetResult) string {
	if !r.Equilibrium {
		return noEquilibrium
	}
	return fmtT(u, r.WallTemp) + " " + u.Name(output.Temp)
}
