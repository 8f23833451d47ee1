package demo

import _ "embed"

//go:embed upright.toml
var Upright []byte

//go:embed laid-over.toml
var LaidOver []byte

// Files lists the demo designs with the names used in messages.
var Files = []struct {
	Name string
	Src  []byte
}{
	{"demo/upright.toml", Upright},
	{"demo/laid-over.toml", LaidOver},
}
