package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/output"
	"finmarch/materials"
)

func (e *env) alloysCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "alloys",
		Short: "List the alloy catalogue with its sources",
		Args:  cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			_, u, err := e.settings()
			if err != nil {
				return err
			}
			g := output.Grid{Header: []string{"name", "kind", "k at 300 K (" + u.Name(output.Cond) + ")", "density (" + u.Name(output.Density) + ")", "cp (" + u.Name(output.SpecHeat) + ")", "emissivity bare / painted", "max service (" + u.Name(output.Temp) + ")"}, Left: 2}
			var notes []string
			for _, a := range materials.All() {
				g.Rows = append(g.Rows, []string{a.Name, a.Kind, u.N(u.Of(output.Cond, a.K300), 1), u.N(u.Of(output.Density, a.Density), 0), u.N(u.Of(output.SpecHeat, a.Cp), u.Dec(output.SpecHeat)),
					u.N(a.EmissBare, 2) + " / " + u.N(a.EmissPaint, 2), fmtT(u, a.MaxService)})
				notes = append(notes, fmt.Sprintf("%s: %s. Emissivity: %s. Limit: %s.", a.Name, a.Source, a.EmissSource, a.LimitSource))
			}
			return e.emit(output.Doc{Title: "Alloy catalogue", Grids: []output.Grid{g}, Notes: notes, JSON: map[string]any{"alloys": materials.All()}})
		},
	}
}
