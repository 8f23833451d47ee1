package demo

import (
	_ "embed"
	"strings"
)

//go:embed upright.toml
var Upright []byte

//go:embed laid-over.toml
var LaidOver []byte

//go:embed scooter-fan.toml
var ScooterFan []byte

// ScooterRam is the fan-cooled scooter's cylinder cooled by ram air alone:
// the same file without its [cooling] table and fan curve, renamed.
func ScooterRam() []byte {
	s := string(ScooterFan)
	if i := strings.Index(s, "# The cooling air:"); i >= 0 {
		s = s[:i]
	}
	return []byte(strings.Replace(s, `name = "demo scooter, fan in a shroud"`, `name = "demo scooter, ram air only"`, 1))
}

// Files lists the demo designs with the names used in messages.
var Files = []struct {
	Name string
	Src  []byte
}{
	{"demo/upright.toml", Upright},
	{"demo/laid-over.toml", LaidOver},
}
