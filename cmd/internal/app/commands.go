package app

import (
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
)

const (
	noteModel = "Model: fin efficiency by exact 1-D fin solutions (Incropera 6th ed. Table 3.5; tapered annular fins by a finite-volume solve); " +
		"forced convection by the air-side method named above: Gibson's motorcycle-fin correlation (as quoted by Yoshida et al. 2006), Briggs & Young (1963), " +
		"or the channel march (Stephan, Shah & London 1978, blended to Gnielinski with the gas heating factor, VDI Heat Atlas 2010); " +
		"natural convection at the fins' real orientation (Bar-Cohen & Rohsenow 1984 vertical channels, McAdams horizontal plates, the larger by Raithby & Hollands' rule) " +
		"combined with the forced heat as Q^3 = QF^3 + QN^3; radiation from the fin envelope; see README 'Model and sources'."
	noteWall = "Wall temperature is the metal at the fin roots, averaged over the fin set; the combustion-side surface and the " +
		"spark-plug seat run hotter."
)

func fmtT(u output.Units, k float64) string  { return u.N(u.Of(output.Temp, k), 1) }
func fmtDT(u output.Units, k float64) string { return u.N(u.Of(output.TempDiff, k), 1) }

// noEquilibrium is what the tables show for a set's wall temperature when
// it has none below the search's cap: a state, never a temperature.
const noEquilibrium = "no equilibrium"

// noValue is the cell of a number that has no value: noEquilibrium (or
// "-" for what follows from it) for a reader, an empty cell in CSV, where a
// numeric column holds numbers only and the state is in a status column.
func noValue(u output.Units, text string) string {
	if u.Full {
		return ""
	}
	return text
}

// wallText is a set's wall temperature, or noEquilibrium.
func wallText(u output.Units, r cylinder.SetResult) string {
	if !r.Equilibrium {
		return noValue(u, noEquilibrium)
	}
	return fmtT(u, r.WallTemp)
}

// marginText is a set's margin to its limit, or "-" without an equilibrium.
func marginText(u output.Units, r cylinder.SetResult, margin float64) string {
	if !r.Equilibrium {
		return noValue(u, "-")
	}
	return fmtDT(u, margin)
}

// marginJSON is a margin for the JSON: null without an equilibrium.
func marginJSON(r cylinder.SetResult, margin float64) any {
	if !r.Equilibrium {
		return nil
	}
	return margin
}

// oneDesign builds a command that reads one design file and runs fn on it.
func (e *env) oneDesign(use, short string, fn func(*design.Design) error) *cobra.Command {
	return &cobra.Command{
		Use:               use,
		Short:             short,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			return fn(d)
		},
	}
}

// parseSpeedRange reads the --from, --to and --step flags of a speed range.
func parseSpeedRange(from, to, step string) ([3]float64, error) {
	var v [3]float64
	for i, s := range []struct{ name, val string }{{"--from", from}, {"--to", to}, {"--step", step}} {
		x, err := design.ParseValue[design.Speed](s.val)
		if err != nil {
			return v, fail(ExitUsage, fmt.Errorf("%s: %w", s.name, err))
		}
		// the range of the design file's air.speed
		if i < 2 && !(x >= 0 && x <= 400/3.6) {
			return v, fail(ExitUsage, fmt.Errorf("%s %s: allowed 0 to 400 km/h (the range of air.speed)", s.name, s.val))
		}
		v[i] = x
	}
	return v, nil
}

// usRoadRange is the road-speed range of a speed table or figure: the
// flags as given, but in US units the range the user left to its metric
// default (0 to 140 km/h) runs from 0 to 90 mph in round steps of
// usStep, not in steps of 6.2 mph (10 km/h).
func usRoadRange(c *cobra.Command, units, from, to, step, usStep string) (string, string, string) {
	if u, err := output.ParseUnits(units); err != nil || !u.US {
		return from, to, step
	}
	if !c.Flags().Changed("from") {
		from = "0 mph"
	}
	if !c.Flags().Changed("to") {
		to = "90 mph"
	}
	if !c.Flags().Changed("step") {
		step = usStep
	}
	return from, to, step
}

// count is "1 point" or "3 points": a number with its noun, singular or
// plural (the plural adds s).
func count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// complete offers a fixed list of values for a flag of c.
func complete(c *cobra.Command, flag string, values func() []string) {
	_ = c.RegisterFlagCompletionFunc(flag, func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return values(), cobra.ShellCompDirectiveNoFileComp
	})
}

// processNames are the casting processes' names.
func processNames() []string {
	var out []string
	for _, p := range fins.Processes {
		out = append(out, p.Name)
	}
	return out
}

// wrapList joins items with ", " into lines of at most width characters,
// each starting with indent.
func wrapList(items []string, width int, indent string) string {
	var lines []string
	line := indent
	for i, it := range items {
		if i < len(items)-1 {
			it += ","
		}
		if len(line)+len(it)+1 > width && line != indent {
			lines = append(lines, strings.TrimRight(line, " "))
			line = indent
		}
		line += it + " "
	}
	return strings.Join(append(lines, strings.TrimRight(line, " ")), "\n")
}
