package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
)

func (e *env) demoCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "demo",
		Short: "Run the built-in demo: one cylinder upright against laid over",
		Args:  cobra.NoArgs,
		RunE:  func(*cobra.Command, []string) error { return e.runDemo() },
	}
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
		"'finmarch estimate my-cylinder.toml' estimates it; 'finmarch --help' lists the other commands.")
	return e.emit(doc)
}
