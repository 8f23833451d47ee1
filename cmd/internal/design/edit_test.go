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
