package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/demo"
)

func (e *env) newCmd() *cobra.Command {
	var laidOver bool
	cmd := &cobra.Command{
		Use:   "new DESIGN.toml",
		Short: "Write a commented starter design (the upright demo, or with --laid-over the laid-over one) to a new file",
		Args:  cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			src := demo.Upright
			if laidOver {
				src = demo.LaidOver
			}
			if err := e.write(args[0], src); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s; edit it, then run: finmarch estimate %s\n", args[0], args[0])
			return nil
		},
	}
	cmd.Flags().BoolVar(&laidOver, "laid-over", false, "write the demo's laid-over cylinder (longitudinal fins, 90 deg tilt) instead")
	return cmd
}
