// Command finmarch estimates how well the fins of an air-cooled engine
// cylinder cool it. Run it with no arguments for the built-in demo, or see
// 'finmarch --help'.
package main

import (
	"os"

	"finmarch/cmd/internal/app"
)

func main() {
	os.Exit(app.Run(os.Args[1:], os.Stdout, os.Stderr))
}
