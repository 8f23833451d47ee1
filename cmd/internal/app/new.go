package app

import (
	"fmt"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/demo"
)

func (e *env) newCmd() *cobra.Command {
	var laidOver, fan bool
	cmd := &cobra.Command{
		Use:   "new DESIGN.toml",
		Short: "Write a commented starter design (the upright demo; --laid-over the laid-over one; --fan the fan-cooled scooter) to a new file",
		Args:  cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			if laidOver && fan {
				return fail(ExitUsage, fmt.Errorf("--laid-over and --fan: choose one starter design"))
			}
			src := demo.Upright
			switch {
			case laidOver:
				src = demo.LaidOver
			case fan:
				src = demo.ScooterFan
			}
			if err := e.write(args[0], src); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s; edit it, then run: finmarch estimate %s\n", args[0], args[0])
			return nil
		},
	}
	cmd.Flags().BoolVar(&laidOver, "laid-over", false, "write the demo's laid-over cylinder (longitudinal fins, 90 deg tilt) instead")
	cmd.Flags().BoolVar(&fan, "fan", false, "write the fan-cooled scooter demo (a fan in a shroud, its curve as [[fan_point]]s) instead")
	return cmd
}
