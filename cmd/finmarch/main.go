package main

import (
	"os"

	"finmarch/cmd/internal/app"
)

func main() {
	os.Exit(app.Run(os.Args[1:], os.Stdout, os.Stderr))
}
