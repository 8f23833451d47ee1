package app

import (
	"math"
	"strings"
	"testing"

	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

// Every unit the tool prints is accepted as input, and means the same: a
// value printed in a display unit reads back to the SI value it came from
// (the quantities a design or a flag can hold; heat flux, heat per mass,
// heat per fin width and the fin parameter are outputs only). The US
// factors are NIST SP 811 (2008) Appendix B: 1 Btu_IT/h = 0.29307107 W,
// 1 hp = 745.69987 W, 1 Btu_IT/(h ft F) = 1.730735 W/(m K), 1 lb/ft3 =
// 16.01846 kg/m3, 1 Btu_IT/(lb F) = 4186.8 J/(kg K).
func TestDisplayUnitsRoundTrip(t *testing.T) {
	for _, c := range []struct {
		q     output.Quantity
		si    float64
		parse func(string) (float64, error)
	}{
		{output.Temp, 400, design.ParseValue[design.Temperature]},
		{output.TempDiff, 15, design.ParseValue[design.TempDiff]},
		{output.Road, 25, design.ParseValue[design.Speed]},
		{output.Vel, 12, design.ParseValue[design.Speed]},
		{output.Len, 0.009, design.ParseValue[design.Length]},
		{output.H, 60, design.ParseValue[design.HCoef]},
		{output.Mass, 230, design.ParseValue[design.Mass]},
		{output.Area, 0.45, design.ParseValue[design.Area]},
		{output.Alt, 1500, design.ParseValue[design.Length]},
		{output.Press, 90e3, design.ParseValue[design.Pressure]},
		{output.Power, 2681, design.ParseValue[design.Power]},
		{output.Engine, 25e3, design.ParseValue[design.Power]},
		{output.Cond, 151, design.ParseValue[design.Conductivity]},
		{output.Density, 2685, design.ParseValue[design.Density]},
		{output.SpecHeat, 963, design.ParseValue[design.SpecificHeat]},
	} {
		for _, u := range []output.Units{{}, {US: true}} {
			text := output.Num(u.Of(c.q, c.si), 9) + " " + u.Name(c.q)
			v, err := c.parse(text)
			if err != nil || math.Abs(v-c.si) > 1e-6*math.Abs(c.si) {
				t.Errorf("%q: %v, %v; want %g (SI)", text, v, err, c.si)
			}
		}
	}
}

// Shell completion offers the values of every enumerated flag and the
// sweep keys.
func TestCompletion(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"optimise", "x.toml", "--process", ""}, "die-casting"},
		{[]string{"optimise", "x.toml", "--goal", ""}, "light"},
		{[]string{"optimise", "x.toml", "--set", ""}, "both"},
		{[]string{"fin", "--alloy", ""}, "A356-T6"},
		{[]string{"fin", "--profile", ""}, "annular-tapered"},
		{[]string{"sweep", "x.toml", "--vary", ""}, "head.pitch="},
		{[]string{"estimate", "--format", ""}, "json"},
	} {
		out, _, _ := run(t, append([]string{"__complete"}, c.args...)...)
		if !strings.Contains(out, c.want+"\n") {
			t.Errorf("%v: %q lacks %q", c.args, out, c.want)
		}
	}
}

// The sweep help wraps its list of keys (it was one line of 40 keys).
func TestSweepHelpWrapped(t *testing.T) {
	out, _, _ := run(t, "sweep", "--help")
	for _, l := range strings.Split(out, "\n") {
		if len(l) > 100 && !strings.HasPrefix(strings.TrimSpace(l), "-") {
			t.Errorf("help line of %d characters: %q", len(l), l)
		}
	}
	if !strings.Contains(out, "head.pitch,") {
		t.Error("the help lists no keys")
	}
}
