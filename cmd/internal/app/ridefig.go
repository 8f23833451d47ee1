package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/airflow/transient"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/cmd/internal/plots"
)

// rideFigureCmd is 'plot ride': head and barrel temperature through a
// ride, design by design, with the limits.
func (e *env) rideFigureCmd() *cobra.Command {
	var profile, start string
	cmd := &cobra.Command{
		Use: "ride [DESIGN.toml ...]", Short: "Head and barrel temperature through a ride, with the limits",
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			ds, err := e.designsOrDemo(args)
			if err != nil {
				return err
			}
			name, ride, _, err := e.rideProfile(profile)
			if err != nil {
				return err
			}
			fig, err := e.rideFigure(ds, name, ride, start)
			if err != nil {
				return err
			}
			return e.writeFigure(fig)
		},
	}
	cmd.Flags().StringVar(&profile, "profile", "run-then-jam", "a built-in profile or a CSV ride file (as 'finmarch ride')")
	cmd.Flags().StringVar(&start, "start", "cold", `"cold", "steady" or a road speed (as 'finmarch ride')`)
	return cmd
}

// rideFigure runs the ride on each design (sampled every 10 s) and draws
// the walls against time with each design's limits.
func (e *env) rideFigure(ds []*design.Design, name string, ride []transient.Segment, start string) (*plots.Figure, error) {
	_, u, err := e.settings()
	if err != nil {
		return nil, err
	}
	var lines []plots.Series
	var names []string
	for i, d := range ds {
		if d.WallFixed {
			return nil, fail(ExitUsage, fmt.Errorf("%s: the design fixes its wall temperatures; a ride needs its heat load", d.Name))
		}
		m, err := transient.NewModel(d.Cylinder(), d.Run, d.Metal)
		if err != nil {
			return nil, fail(ExitDesign, fmt.Errorf("%s: %w", d.Name, err))
		}
		w0, _, err := rideStart(m, d, ride, start)
		if err != nil {
			return nil, err
		}
		tr, err := m.Run(ride, w0, 10)
		if err != nil {
			return nil, modelError(d.Name, err)
		}
		h := plots.Series{Label: "head", Design: i}
		b := plots.Series{Label: "barrel", Design: i, Dashed: true}
		for _, s := range tr.Samples {
			h.X, h.Y = append(h.X, s.Time/60), append(h.Y, u.Of(output.Temp, s.Head))
			b.X, b.Y = append(b.X, s.Time/60), append(b.Y, u.Of(output.Temp, s.Barrel))
		}
		lines = append(lines, h, b)
		if tr.Runaway {
			n := len(tr.Samples) - 1
			lines = append(lines, plots.Series{Label: "no equilibrium beyond", X: []float64{tr.Samples[n].Time / 60}, Y: []float64{u.Of(output.Temp, tr.Samples[n].Head)}, Design: i, Marks: true})
		}
		names = append(names, letter(i)+": "+short(d.Name))
	}
	return plots.Curves(plots.Chart{Title: "Wall temperature through the ride " + name,
		XLabel: "time (min)", YLabel: "wall temperature at the fin roots (" + u.Name(output.Temp) + ")",
		Designs: names, Lines: lines, Limits: limitLines(u, ds)})
}
