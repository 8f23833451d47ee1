package design

import (
	"errors"
	"strings"
	"testing"
)

// A misspelt table is one error at the table, with the table it meant,
// not one per key under it each suggesting a key of another table
// ("barrel.style" for haed.style); an unknown key in a known table is
// still reported, and suggested, on its own.
func TestUnknownTableOnce(t *testing.T) {
	for _, c := range []struct {
		src, want string
		n         int
	}{
		{edit(minimal, "[head]", "[haed]"), "haed: unknown table [haed]: did you mean [head]? (its 6 keys are not read", 1},
		{edit(edit(minimal, "[head]", "[haed]"), "[air]\n", "[air]\nsped = 1\n"), `air.sped: unknown key (did you mean "air.speed"?)`, 2},
		{edit(minimal, "[load]", "[lood]"), "unknown table [lood]: did you mean [load]?", 1},
		{edit(minimal, "[air]\n", "[air.inlet]\nx = 1\n[air]\n"), "air.inlet: unknown table [air.inlet] (its 1 key is not read", 1},
		{edit(minimal, "name = \"t\"\n", "name = \"t\"\nhaed = { style = \"annular\", count = 8 }\n"), "unknown table [haed]: did you mean [head]? (its 2 keys are not read", 1},
	} {
		_, err := Parse([]byte(c.src), "x.toml")
		var es Errors
		if !errors.As(err, &es) || len(es) != c.n || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "barrel.") {
			t.Errorf("want %d error(s) with %q, got:\n%v", c.n, c.want, err)
		}
	}
}
