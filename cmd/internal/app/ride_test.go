package app

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"finmarch/cmd/internal/design"
)

// The ride command on the demo: the default profile from cold, its samples
// every minute, the standstill's verdict, and a start from a speed's
// steady state that is the estimate's own wall at that speed.
func TestRideCommand(t *testing.T) {
	up, _ := designs(t)
	out, errs, code := run(t, "ride", up)
	if code != 0 || !strings.Contains(out, "Standing at idle from minute 20.0") || !strings.Contains(out, "Start: cold (ambient), head 35.0 C") {
		t.Fatalf("exit %d %s\n%s", code, errs, out)
	}
	js, _, _ := run(t, "ride", up, "--start", "90 km/h", "-f", "json")
	var v struct {
		Samples []struct {
			Head float64 `json:"head_wall_temperature_K"`
		} `json:"samples"`
		Standstill struct {
			Start float64 `json:"start_s"`
		} `json:"standstill"`
	}
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	est, _, _ := run(t, "estimate", up, "-f", "json", "--samples", "0")
	var e struct {
		Result struct {
			Head struct {
				Wall float64 `json:"wall_temperature_K"`
			} `json:"head"`
		} `json:"result"`
	}
	if err := json.Unmarshal([]byte(est), &e); err != nil {
		t.Fatal(err)
	}
	if len(v.Samples) != 36 || math.Abs(v.Samples[0].Head-e.Result.Head.Wall) > 1e-9 || v.Standstill.Start != 1200 {
		t.Errorf("%d samples, start %.3f K (estimate %.3f K), standstill at %g s", len(v.Samples), v.Samples[0].Head, e.Result.Head.Wall, v.Standstill.Start)
	}
	// a steady start at the ride's own first speed stays there while moving
	if math.Abs(v.Samples[19].Head-e.Result.Head.Wall) > 0.01 {
		t.Errorf("minute 19 at 90 km/h from its steady state: %.3f K, want %.3f K", v.Samples[19].Head, e.Result.Head.Wall)
	}
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"--start", "warm"}, ExitUsage, "--start"},
		{[]string{"--every", "0.1 s"}, ExitUsage, "--every"},
		{[]string{"--profile", "commute"}, ExitUsage, "run-then-jam"},
		{[]string{"--samples", "100"}, ExitUsage, "does not use it"},
	} {
		if _, errs, code := run(t, append([]string{"ride", up}, c.args...)...); code != c.code || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d %s", c.args, code, errs)
		}
	}
	src, _ := os.ReadFile(up)
	fixed := filepath.Join(t.TempDir(), "fixed.toml")
	if err := os.WriteFile(fixed, design.SetKeys(src, []design.KV{{Key: "override.head_wall", Value: `"200 C"`}, {Key: "override.barrel_wall", Value: `"150 C"`}}), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "ride", fixed); code != ExitUsage || !strings.Contains(errs, "fixes its wall temperatures") {
		t.Errorf("fixed walls: exit %d %s", code, errs)
	}
}

// A ride file: a logged ride read with its units, and every kind of bad
// file refused with the file, the line and the column; a ride past what
// the fins can reject stops with no equilibrium (exit 1) and says where.
func TestRideFile(t *testing.T) {
	up, _ := designs(t)
	dir := t.TempDir()
	write := func(name, body string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	good := write("commute.csv", "# a commute\ntime (min),speed (km/h),grade (%)\n0,50,0\n10,80,2\n25,0,0\n30,0,0\n")
	out, errs, code := run(t, "ride", up, "--profile", good, "--every", "5 min")
	if code != 0 || !strings.Contains(out, "ride "+good) || !strings.Contains(out, "4 rows over 30.0 min") || !strings.Contains(out, "Standing at idle from minute 25.0") {
		t.Errorf("exit %d %s\n%s", code, errs, out)
	}
	for _, c := range []struct{ body, want string }{
		{"time (s),speed (km/h),gear\n0,50,3\n", "bad.csv:1: gear: unknown column"},
		{"time (s),speed (km/h)\n0,50\n60,40\n30,20\n", "bad.csv:4: time: 30 s is not after the row before"},
		{"time,speed (km/h)\n0,50\n60,40\n", `bad.csv:2: time: "0" has no unit`},
		{"time (s),speed (km/h)\n0,500\n60,40\n", "bad.csv:2: speed: 500 is outside the allowed 0 to 400 km/h"},
		{"time (s),speed (km/h)\n0,50\n", "at least two rows"},
		{"time (s),speed (km/h)\n5,50\n60,40\n", "the ride starts at 0"},
		{"time (s),speed (km/h),head_heat (W)\n0,50,300\n60,40,300\n", "give head_heat and barrel_heat together"},
	} {
		p := write("bad.csv", c.body)
		_, errs, code := run(t, "ride", up, "--profile", p)
		if code != ExitDesign || !strings.Contains(errs, c.want) || !strings.Contains(errs, "bad.csv") {
			t.Errorf("%q: exit %d, %s", c.body, code, errs)
		}
	}
	hot := write("hot.csv", "time (min),speed (km/h)\n0,170\n30,170\n")
	out, errs, code = run(t, "ride", up, "--profile", hot, "--every", "1 min")
	if code != ExitModel || !strings.Contains(errs, "passed 500 C") || !strings.Contains(out, "NO EQUILIBRIUM: a wall passed 500 C at minute") {
		t.Errorf("runaway: exit %d %s\n%s", code, errs, out)
	}
}

// The [ride] table: given masses replace the estimates (and the thermal
// masses say so); a mass out of range is refused with its key and line.
func TestRideTable(t *testing.T) {
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	dir := t.TempDir()
	given := filepath.Join(dir, "given.toml")
	if err := os.WriteFile(given, append(append([]byte{}, src...), "\n[ride]\nhead_metal = \"3 kg\"\nbarrel_metal = \"1 kg\"\nhead_barrel_link = \"4 W/K\"\n"...), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := run(t, "ride", given, "--every", "10 min")
	if code != 0 || !strings.Contains(out, "other metal 3.00 kg") || !strings.Contains(out, "given in [ride]") || !strings.Contains(out, "head-barrel link 4.0 W/K") {
		t.Errorf("exit %d %s\n%s", code, errs, out)
	}
	bad := filepath.Join(dir, "bad.toml")
	if err := os.WriteFile(bad, append(append([]byte{}, src...), "\n[ride]\nhead_metal = \"300 kg\"\n"...), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "ride", bad); code != ExitDesign || !strings.Contains(errs, "ride.head_metal") || !strings.Contains(errs, "100 kg") {
		t.Errorf("exit %d %s", code, errs)
	}
}
