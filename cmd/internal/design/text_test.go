package design

import (
	"runtime"
	"strings"
	"testing"
	"time"
)

// Bytes a design file cannot hold are reported with their line: a NUL, a
// Latin-1 degree sign (0xB0, not UTF-8), a raw control character; and a
// terminal escape written as a TOML escape in a string is refused by key.
func TestTextProblems(t *testing.T) {
	for _, c := range []struct {
		src  string
		line int
		frag string
	}{
		{"name = \"x\"\n\n\x00\n", 3, "NUL"},
		{"name = \"x\"\n[air]\n\n\nambient = \"35 \xb0C\"\n", 5, "degree"},
		{"name = \"x\"\nspeed = 3\x07\n", 2, "U+0007"},
		{"name = \"a \\u001b[2J b\"\n", 1, "U+001B"},
		{"name = \"a \\u202e b\"\n", 1, "U+202E"},
	} {
		_, err := Parse([]byte(c.src), "x.toml")
		es, _ := err.(Errors)
		found := false
		for _, e := range es {
			found = found || e.Line == c.line && strings.Contains(e.Msg, c.frag)
		}
		if !found {
			t.Errorf("%q: want line %d with %q, got %v", c.src, c.line, c.frag, err)
		}
	}
	// strings and comments may hold brackets and long lines
	if line, msg := textProblem([]byte("# [[[[[[[[[[[[[[[[[[[[[[[[[[[\nname = \"" + strings.Repeat("[", 2000) + "\"\n")); line != 0 {
		t.Errorf("brackets in a comment and a string refused: line %d %s", line, msg)
	}
}

// A hostile file of up to 1 MiB, whatever its nesting, is refused (or
// parsed) in under a second and 100 MB: 100 000 nested inline tables
// (500 kB), a table header of 60 000 parts (120 kB), arrays nested 400 000
// deep, and 1 MiB of custom-alloy tables. The TOML parser alone takes
// time and memory that grow with the square of the first two.
func TestHostileShapes(t *testing.T) {
	var alloys strings.Builder
	for i := 0; alloys.Len() < MaxFileSize-200; i++ {
		alloys.WriteString("[alloys.a")
		alloys.WriteString(strings.Repeat("x", i%7))
		alloys.WriteString(strings.Repeat("y", i%5))
		alloys.WriteString("]\nconductivity = \"140 W/mK\"\n")
	}
	for _, c := range []struct{ name, src string }{
		{"nested inline tables", "a = " + strings.Repeat("{b = ", 100000) + "1" + strings.Repeat("}", 100000) + "\n"},
		{"long dotted header", "[" + strings.Repeat("a.", 60000) + "a]\n"},
		{"nested arrays", "a = " + strings.Repeat("[", 400000) + strings.Repeat("]", 400000) + "\n"},
		{"many tables", alloys.String()},
	} {
		var before, after runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&before)
		start := time.Now()
		_, err := Parse([]byte(c.src), "x.toml")
		took := time.Since(start)
		runtime.ReadMemStats(&after)
		if err == nil {
			t.Errorf("%s: accepted", c.name)
		}
		mb := float64(after.TotalAlloc-before.TotalAlloc) / 1e6
		t.Logf("%s (%d bytes): %v, %.1f MB", c.name, len(c.src), took, mb)
		if took > time.Second || mb > 100 {
			t.Errorf("%s (%d bytes): %v and %.0f MB", c.name, len(c.src), took, mb)
		}
	}
}

// A multi-line name holding "[head]" does not move the line reported for
// a later key, and the suggestion for a key in the wrong table is the same
// on every run (it was drawn from a map's order).
func TestLocateAndSuggestDeterministic(t *testing.T) {
	src := "name = \"\"\"x\n[head]\nstyle = 3\n\"\"\"\n" + minimal[strings.Index(minimal, "[cylinder]"):]
	src = strings.Replace(src, `style = "annular"`, `style = "hexagonal"`, 1)
	_, err := Parse([]byte(src), "x.toml")
	es, _ := err.(Errors)
	want := 1 + strings.Count(src[:strings.Index(src, `style = "hexagonal"`)], "\n")
	found := false
	for _, e := range es {
		found = found || e.Key == "head.style" && e.Line == want
	}
	if !found {
		t.Errorf("want head.style at line %d, got %v", want, err)
	}
	bad := strings.Replace(minimal, "[load]", "[load]\nhead = \"220 C\"", 1)
	var first string
	for i := 0; i < 50; i++ {
		_, err := Parse([]byte(bad), "x.toml")
		if i == 0 {
			first = err.Error()
		} else if err.Error() != first {
			t.Fatalf("run %d suggests differently:\n%v\n%v", i, first, err)
		}
	}
	if !strings.Contains(first, "limits.head") {
		t.Errorf("no limits.head suggestion: %v", first)
	}
}
