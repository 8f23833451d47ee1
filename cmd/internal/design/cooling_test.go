package design

import (
	"regexp"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
)

// A fan curve's efficiency is given at every point or at none: at some
// points only it is refused at each point lacking it (it was once dropped
// when only one point gave it), never made up or ignored.
func TestFanEfficiencyEveryPointOrNone(t *testing.T) {
	src := string(demo.ScooterFan)
	effs := regexp.MustCompile(`(?m)^efficiency = .*\n`)
	if n := len(effs.FindAllString(src, -1)); n != 5 {
		t.Fatalf("the demo fan gives %d efficiencies, want 5", n)
	}
	d, err := Parse([]byte(src), "fan.toml")
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range d.Case.Supply.Fan.Curve {
		if !(p.Efficiency > 0) {
			t.Errorf("point %d: efficiency %g", i+1, p.Efficiency)
		}
	}
	none := effs.ReplaceAllString(src, "")
	d, err = Parse([]byte(none), "fan.toml")
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range d.Case.Supply.Fan.Curve {
		if p.Efficiency != 0 {
			t.Errorf("point %d: efficiency %g, none given", i+1, p.Efficiency)
		}
	}
	// keep the first and the fourth only
	n := 0
	some := effs.ReplaceAllStringFunc(src, func(s string) string {
		n++
		if n == 1 || n == 4 {
			return s
		}
		return ""
	})
	_, err = Parse([]byte(some), "fan.toml")
	if err == nil {
		t.Fatal("efficiency at two of five points accepted")
	}
	for _, k := range []string{"fan_point[2]", "fan_point[3]", "fan_point[5]"} {
		if !strings.Contains(err.Error(), k+".efficiency: missing: the curve gives the efficiency at points 1, 4") {
			t.Errorf("%v: lacks %s", err, k)
		}
	}
	if strings.Contains(err.Error(), "fan_point[1].efficiency") || strings.Contains(err.Error(), "fan_point[4].efficiency") {
		t.Errorf("%v: blames a point that gives it", err)
	}
	// a typed efficiency of 0 is refused with its range, not "not given"
	_, err = Parse([]byte(strings.Replace(src, "efficiency = 0.1\n", "efficiency = 0\n", 1)), "fan.toml")
	if err == nil || !strings.Contains(err.Error(), "fan_point[1].efficiency") || !strings.Contains(err.Error(), "0.01") {
		t.Errorf("efficiency 0: %v", err)
	}
}

// The engine speeds up from idle_speed to rated_speed: a rated speed not
// above the idle is refused at parse time (the estimator refused it later,
// as a failed solve).
func TestFanRatedAboveIdle(t *testing.T) {
	src := strings.Replace(string(demo.ScooterFan), `rated_speed = "7500 rpm"`, `rated_speed = "1700 rpm"`, 1)
	_, err := Parse([]byte(src), "fan.toml")
	if err == nil || !strings.Contains(err.Error(), "cooling.rated_speed: 1700 rpm is not above idle_speed (1700 rpm)") {
		t.Errorf("%v", err)
	}
}
