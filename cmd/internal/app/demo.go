package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
)

func (e *env) demoCmd() *cobra.Command {
	var fan bool
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run the built-in demo: one cylinder upright against laid over (--fan: a fan-cooled scooter against ram air)",
		Args:  cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			if fan {
				return e.runFanDemo()
			}
			return e.runDemo()
		},
	}
	cmd.Flags().BoolVar(&fan, "fan", false, "the second demo: a laid-over scooter single cooled by a fan in a shroud, against the same cylinder on ram air")
	return cmd
}

// runFanDemo compares the fan-cooled scooter with the same cylinder on ram
// air, at its cruise and at a standstill.
func (e *env) runFanDemo() error {
	var ds []*design.Design
	for _, f := range []struct {
		name string
		src  []byte
	}{{"demo/scooter-fan.toml", demo.ScooterFan}, {"demo/scooter-ram.toml", demo.ScooterRam()}} {
		d, err := e.parse(f.src, f.name)
		if err != nil {
			return internal(fmt.Errorf("built-in demo: %w", err))
		}
		ds = append(ds, d)
	}
	doc, err := e.compareDoc(ds, "finmarch demo --fan: an invented 125 cc-class scooter single, laid over with annular fins, fan-cooled in a shroud against ram air")
	if err != nil {
		return err
	}
	doc.Notes = append(doc.Notes, "Laid over, annular fins face the road air edge-on: ram air cools them little, which is why such engines carry a fan. "+
		"'finmarch new --fan scooter.toml' writes this design; 'finmarch speeds scooter.toml' shows the fan keeping its flow at a standstill, and 'finmarch plot fan scooter.toml -o fan.svg' the fan's curve against the shroud and fins.")
	return e.emit(doc)
}

func (e *env) runDemo() error {
	var ds []*design.Design
	for _, f := range demo.Files {
		d, err := e.parse(f.Src, f.Name)
		if err != nil {
			return internal(fmt.Errorf("built-in demo: %w", err))
		}
		ds = append(ds, d)
	}
	doc, err := e.compareDoc(ds, "finmarch demo: an invented 500 cc-class single at cruise, upright against laid over")
	if err != nil {
		return err
	}
	doc.Notes = append(doc.Notes, "Try your own: 'finmarch new my-cylinder.toml' writes a commented design; "+
		"'finmarch estimate my-cylinder.toml' estimates it; 'finmarch --help' lists the other commands. "+
		"From the source tree, 'go install ./cmd/finmarch' puts finmarch in $(go env GOPATH)/bin (add that to your PATH), "+
		"or put 'go run ./cmd/finmarch' where these say 'finmarch'.")
	return e.emit(doc)
}
