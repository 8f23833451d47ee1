package design

import (
	"strings"
	"testing"
)

// SetKeys replaces a key where it is written, adds one under its table, and
// adds a table at the end; the result parses to the values set, and the
// rest of the file is unchanged.
func TestSetKeys(t *testing.T) {
	src := strings.Replace(minimal, "[air]", "[air]\npressure_recovery = 0.5  # a guess", 1)
	out := SetKeys([]byte(src), []KV{
		{Key: "air.pressure_recovery", Value: "0.35", Note: "fitted"},
		{Key: "uncertainty.pressure_recovery", Value: "0.04"},
		{Key: "calibration.forced_convection_factor", Value: "1.2"},
	})
	d, err := Parse(out, "x.toml")
	if err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	if d.Case.Recovery != 0.35 || d.Band.Spread.Recovery != 0.04 || d.Run.ForcedFactor != 1.2 {
		t.Errorf("recovery %g, half-width %g, factor %g", d.Case.Recovery, d.Band.Spread.Recovery, d.Run.ForcedFactor)
	}
	if strings.Count(string(out), "pressure_recovery = 0.35  # fitted") != 1 || strings.Contains(string(out), "a guess") {
		t.Errorf("the key was not replaced in place:\n%s", out)
	}
	if !strings.HasPrefix(string(out), src[:strings.Index(src, "[air]")]) {
		t.Error("the text before the edit changed")
	}
}

// editShapes are design files that write the same design in every shape
// the parser accepts for the tables a calibration edits: [air] under a
// header, as an inline table (on one line, or over several with comments
// and a trailing comma, TOML 1.1), as dotted keys at the top level (bare,
// quoted, spaced), with the keys to set present or absent, with traps (a
// multi-line string and comments that look like the keys, a [[measurement]]
// with a speed of its own), without a final line end, and with
// [uncertainty] and [calibration] written inline.
func editShapes() map[string]string {
	fins := minimal[strings.Index(minimal, "[cylinder]"):strings.Index(minimal, "[air]")]
	load := minimal[strings.Index(minimal, "[load]"):]
	const airKeys = `speed = "90 km/h"` + "\n" + `ambient = "35 C"` + "\n"
	shapes := map[string]string{
		"header":                                    "name = \"t\"\n" + fins + "[air]\n" + airKeys + load,
		"header with the key":                       "name = \"t\"\n" + fins + "[air]\n" + airKeys + "pressure_recovery = 0.5 # a guess\n" + load,
		"spaced header, comment":                    "name = \"t\"\n" + fins + "[ air ]   # the cooling air\n" + airKeys + load,
		"header at the end, no final line end":      "name = \"t\"\n" + fins + load + "[air]\n" + strings.TrimSuffix(airKeys, "\n"),
		"inline":                                    "name = \"t\"\nair = { speed = \"90 km/h\", ambient = \"35 C\" }\n" + fins + load,
		"inline with the key":                       "name = \"t\"\nair = { speed = \"90 km/h\", pressure_recovery = 0.6, ambient = \"35 C\" }  # air\n" + fins + load,
		"inline over lines":                         "name = \"t\"\nair = {\n  speed = \"90 km/h\", # cruise\n  ambient = \"35 C\",\n}\n" + fins + load,
		"inline, empty uncertainty and calibration": "name = \"t\"\nair = { speed = \"90 km/h\", ambient = \"35 C\" }\nuncertainty = {}\ncalibration = { }\n" + fins + load,
		"inline uncertainty":                        "name = \"t\"\nuncertainty = { samples = 100, pressure_recovery = 0.2 }\n" + fins + "[air]\n" + airKeys + load,
		"dotted":                                    "name = \"t\"\nair.speed = \"90 km/h\"\nair.ambient = \"35 C\"\n" + fins + load,
		"dotted with the key, comment":              "name = \"t\"\nair.speed = \"90 km/h\"\nair.pressure_recovery = 0.7   # old\nair.ambient = \"35 C\"\n" + fins + load,
		"quoted and spaced dotted":                  "name = \"t\"\n\"air\".\"speed\" = \"90 km/h\"\nair . ambient = \"35 C\"\n" + fins + load,
		"dotted uncertainty and calibration":        "name = \"t\"\nuncertainty.samples = 100\ncalibration.forced_convection_factor = 1.5\n" + fins + "[air]\n" + airKeys + load,
		"traps": "name = '''t # [air]'''\n# air.pressure_recovery = 0.9\n# [air]\n" + fins +
			"[[measurement]]\nspeed = \"60 km/h\"\nambient = \"20 C\"\nhead = \"150 C\"\n" + "[air]\n# pressure_recovery = 0.8\n" + airKeys + load,
		"comment traps": "name = \"t\" # [air]\n# air.pressure_recovery = 0.9\n" + fins + "[air] # pressure_recovery = 0.9\n" + airKeys + load,
		"segments set":  "name = \"t\"\nsegments = 20 # coarse\n" + fins + "[air]\n" + airKeys + load,
	}
	// the same with CRLF line ends
	out := map[string]string{}
	for name, s := range shapes {
		out[name] = s
		if !strings.Contains(name, "end") {
			out[name+", CRLF"] = strings.ReplaceAll(s, "\n", "\r\n")
		}
	}
	return out
}

// Every shape of a design the parser accepts takes the keys a calibration
// writes (a top-level key, keys of an existing table, keys of tables that
// are absent): the result parses, the keys have the values set, every other
// value is kept, the line ends stay as written, and the comments stay.
func TestEditKeysEveryShape(t *testing.T) {
	kvs := []KV{
		{Key: "air.method", Value: `"gibson"`, Note: "the method"},
		{Key: "uncertainty.methods", Value: "false", Note: "no draw"},
		{Key: "air.pressure_recovery", Value: "0.35", Note: "fitted"},
		{Key: "uncertainty.pressure_recovery", Value: "0.04", Note: "two standard errors"},
		{Key: "calibration.forced_convection_factor", Value: "1.2"},
		{Key: "segments", Value: "30"},
	}
	for name, src := range editShapes() {
		t.Run(name, func(t *testing.T) {
			before, err := Parse([]byte(src), "x.toml")
			if err != nil {
				t.Fatalf("the shape does not parse: %v\n%s", err, src)
			}
			out, err := EditKeys([]byte(src), kvs)
			if err != nil {
				t.Fatalf("%v\n%s", err, src)
			}
			d, err := Parse(out, "x.toml")
			if err != nil {
				t.Fatalf("%v\n%s", err, out)
			}
			if d.Case.Recovery != 0.35 || d.Band.Spread.Recovery != 0.04 || d.Run.ForcedFactor != 1.2 || d.Run.Method != "gibson" || d.Band.Spread.Methods || d.Run.Segments != 30 {
				t.Errorf("recovery %g, half-width %g, factor %g, method %q, methods %v, segments %d\n%s",
					d.Case.Recovery, d.Band.Spread.Recovery, d.Run.ForcedFactor, d.Run.Method, d.Band.Spread.Methods, d.Run.Segments, out)
			}
			if d.Case.Speed != before.Case.Speed || d.Case.Ambient != before.Case.Ambient || d.Band.Samples != before.Band.Samples || len(d.Points) != len(before.Points) || d.Name != before.Name {
				t.Errorf("another value changed:\n%s", out)
			}
			if strings.Contains(src, "\r\n") && strings.Count(string(out), "\n") != strings.Count(string(out), "\r\n") {
				t.Errorf("a line end is not CRLF:\n%q", out)
			}
			for _, l := range strings.Split(src, "\n") {
				l = strings.TrimSpace(l)
				if strings.HasPrefix(l, "#") && !strings.Contains(string(out), l) {
					t.Errorf("the comment %q was lost:\n%s", l, out)
				}
			}
			// a second edit of the edited text changes nothing more
			if again := SetKeys(out, kvs); string(again) != string(out) {
				t.Errorf("editing twice differs:\n%s\n---\n%s", out, again)
			}
		})
	}
}

// A key written nowhere in a file that has no table for it goes into a new
// table at the end; lines inside a multi-line string or array are not
// keys; a text the editor cannot read is an error, not a silently changed
// file.
func TestEditKeysText(t *testing.T) {
	src := "x = \"\"\"\n[air]\npressure_recovery = 0.9\n\"\"\"\"\"\ny = [\n  1, # [air]\n  { pressure_recovery = 2 },\n]\n[air]\nspeed = 1\n"
	want := strings.Replace(src, "[air]\nspeed", "[air]\npressure_recovery = 0.3\nspeed", 1)
	if out, err := EditKeys([]byte(src), []KV{{Key: "air.pressure_recovery", Value: "0.3"}}); err != nil || string(out) != want {
		t.Errorf("%v\n%s", err, out)
	}
	if _, err := EditKeys([]byte("a = \"unclosed\n"), []KV{{Key: "air.speed", Value: "1"}}); err == nil {
		t.Error("an unclosed string was edited")
	}
	if _, err := EditKeys([]byte(minimal), []KV{{Key: "air..speed", Value: "1"}}); err == nil {
		t.Error("an empty key part was accepted")
	}
	out, err := EditKeys([]byte(minimal), []KV{{Key: "ride.head_metal", Value: `"2 kg"`}})
	if err != nil || !strings.HasSuffix(string(out), "\n\n[ride]\nhead_metal = \"2 kg\"\n") {
		t.Errorf("%v\n%s", err, out)
	}
}
