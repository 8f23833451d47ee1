package app

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
)

// The fan-cooled demo design: its estimate shows the fan's operating point
// and takes its shaft power into the load; at a standstill the fan keeps
// the flow (speeds from 0) and the head is far cooler than the same
// cylinder on ram air; the fan's figure draws both curves.
func TestFanCooledDesign(t *testing.T) {
	dir := t.TempDir()
	sc := filepath.Join(dir, "scooter.toml")
	if _, errs, code := run(t, "new", "--fan", sc); code != 0 {
		t.Fatalf("new --fan: exit %d %s", code, errs)
	}
	out, errs, code := run(t, "estimate", sc, "--samples", "0")
	if code != 0 || !strings.Contains(out, "Cooling air") || !strings.Contains(out, "fan shaft power (from the crank)") || !strings.Contains(out, "Inside the shroud the road air does not reach the fins") {
		t.Fatalf("exit %d %s\n%s", code, errs, out)
	}
	idle := func(path string) (float64, map[string]any) {
		js, errs, code := run(t, "estimate", path, "--speed", "0 km/h", "-f", "json", "--samples", "0", "-q")
		if code != 0 && code != ExitModel {
			t.Fatalf("exit %d %s", code, errs)
		}
		var v struct {
			Result struct {
				Head struct {
					Wall *float64 `json:"wall_temperature_K"`
				} `json:"head"`
				Supply map[string]any `json:"supply"`
			} `json:"result"`
		}
		if err := json.Unmarshal([]byte(js), &v); err != nil {
			t.Fatal(err)
		}
		if v.Result.Head.Wall == nil {
			return 1e9, v.Result.Supply
		}
		return *v.Result.Head.Wall, v.Result.Supply
	}
	ram := filepath.Join(dir, "ram.toml")
	if err := os.WriteFile(ram, demo.ScooterRam(), 0o644); err != nil {
		t.Fatal(err)
	}
	tf, sup := idle(sc)
	tr, _ := idle(ram)
	if sup == nil || !(sup["mass_flow_kg_s"].(float64) > 0) || !(tf < tr-50) {
		t.Errorf("idle: fan-cooled head %.1f K (supply %v), ram-cooled %.1f K", tf, sup, tr)
	}
	out, _, code = run(t, "demo", "--fan")
	if code != 0 || !strings.Contains(out, "A: demo scooter, fan in a shroud") || !strings.Contains(out, "B: demo scooter, ram air only") {
		t.Errorf("demo --fan: exit %d\n%s", code, out)
	}
	svg := filepath.Join(dir, "fan.svg")
	if _, errs, code := run(t, "plot", "fan", sc, "-o", svg); code != 0 {
		t.Fatalf("plot fan: exit %d %s", code, errs)
	}
	b, _ := os.ReadFile(svg)
	for _, w := range []string{"fan flow at its inlet (m3/s)", "static pressure (Pa)", "shroud and fins", "operating point at 60 km/h", "operating point at 0 km/h"} {
		if !strings.Contains(string(b), w) {
			t.Errorf("fan.svg lacks %q", w)
		}
	}
	up, _ := designs(t)
	if _, errs, code := run(t, "plot", "fan", up, "-o", filepath.Join(dir, "x.svg")); code != ExitUsage || !strings.Contains(errs, "no fan") {
		t.Errorf("plot fan of a ram-cooled design: exit %d %s", code, errs)
	}
}

// Bad [cooling] tables and fan curves are refused with the key, the line
// and what is allowed.
func TestCoolingRefused(t *testing.T) {
	src := string(demo.ScooterFan)
	dir := t.TempDir()
	for _, c := range []struct{ old, new, want string }{
		{`source = "fan"`, `source = "blower"`, `cooling.source: "blower": use ram (the default), duct or fan`},
		{`source = "fan"`, `source = "duct"`, "cooling.fan_curve_speed: not used with source = \"duct\""},
		{`pressure = "700 Pa"`, `pressure = "1000 Pa"`, "fan_point[3].pressure: 1000 Pa rises above the point before (900 Pa)"},
		{`flow = "0.10 m3/s"`, `flow = "0.04 m3/s"`, "fan_point[3].flow: 0.04 m3/s is not above the point before"},
		{`flow = "0.10 m3/s"`, `flow = "0.10"`, `fan_point.flow: "0.10" has no unit`},
		{"top_gear_speed = \"95 km/h\"", "", "load.top_gear_speed"},
		{`# route = "parallel"`, `route = "series"`, "cooling.route: series (head fins, then barrel fins) needs longitudinal fins"},
		{`fan_curve_speed = "6000 rpm"`, `fan_curve_speed = "6000"`, "cooling.fan_curve_speed"},
		{`flow = "0.05 m3/s"`, `flow = "-0.05 m3/s"`, "fan_point[2].flow: -0.05"},
	} {
		if !strings.Contains(src, c.old) {
			t.Fatalf("the fan demo lacks %q", c.old)
		}
		p := filepath.Join(dir, "bad.toml")
		if err := os.WriteFile(p, []byte(strings.Replace(src, c.old, c.new, 1)), 0o644); err != nil {
			t.Fatal(err)
		}
		_, errs, code := run(t, "estimate", p)
		if code != ExitDesign || !strings.Contains(errs, c.want) || !strings.Contains(errs, "bad.toml:") {
			t.Errorf("%s -> %s: exit %d %s", c.old, c.new, code, errs)
		}
	}
	// one point: the curve is cut after its first [[fan_point]]
	i := strings.Index(src, "[[fan_point]]")
	j := i + strings.Index(src[i+1:], "[[fan_point]]") + 1
	p := filepath.Join(dir, "one.toml")
	if err := os.WriteFile(p, []byte(src[:j]), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "estimate", p); code != ExitDesign || !strings.Contains(errs, "two or more [[fan_point]] tables") {
		t.Errorf("one point: exit %d %s", code, errs)
	}
}

// Calibrating a fan-cooled design fits the forced convection factor (the
// road's pressure recovery plays no part inside a shroud), and asking for
// the recovery is refused, saying why.
func TestCalibrateFanCooled(t *testing.T) {
	src := string(demo.ScooterFan) + "\n[[measurement]]\nspeed = \"60 km/h\"\nambient = \"30 C\"\nhead = \"150 C\"\n\n[[measurement]]\nspeed = \"80 km/h\"\nambient = \"30 C\"\nhead = \"205 C\"\n"
	p := filepath.Join(t.TempDir(), "measured.toml")
	if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := run(t, "calibrate", p, "-q")
	if code != 0 || !strings.Contains(out, "forced convection factor") || strings.Contains(out, "pressure recovery |") {
		t.Errorf("exit %d %s\n%s", code, errs, out)
	}
	if _, errs, code := run(t, "calibrate", p, "--fit", "recovery"); code != ExitUsage || !strings.Contains(errs, "plays no part") {
		t.Errorf("--fit recovery: exit %d %s", code, errs)
	}
}
