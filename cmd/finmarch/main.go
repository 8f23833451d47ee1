package main

import (
	"os"
	"os/signal"
	"syscall"

	"finmarch/cmd/internal/app"
)

func main() {
	// on SIGINT or SIGTERM, remove the temporary file of an output being
	// written (the earlier file stays as it was) and end as the shell
	// expects: 128 plus the signal's number
	sig := make(chan os.Signal, 1)
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM)
	go func() {
		s := <-sig
		app.RemoveTemporary()
		code := 130
		if s == syscall.SIGTERM {
			code = 143
		}
		os.Exit(code)
	}()
	os.Exit(app.Run(os.Args[1:], os.Stdout, os.Stderr))
}
