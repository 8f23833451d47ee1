package app

import (
	"encoding/json"
	"fmt"
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
	if code != ExitModel || !strings.Contains(errs, "passed 500 C") || !strings.Contains(out, "NO EQUILIBRIUM: the head passed 500 C at minute") || !strings.Contains(out, "Peak: none, runaway at minute") {
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

// rideSummary is the summary and standstill of a ride's JSON.
type rideSummary struct {
	Summary    map[string]any `json:"summary"`
	Standstill map[string]any `json:"standstill"`
	End        float64        `json:"end_s"`
	Runaway    bool           `json:"runaway"`
	Samples    []struct {
		Time float64 `json:"time_s"`
		Head float64 `json:"head_wall_temperature_K"`
	} `json:"samples"`
}

func rideJSONOf(t *testing.T, args ...string) (rideSummary, string, int) {
	t.Helper()
	out, errs, code := run(t, append(append([]string{"ride"}, args...), "-f", "json", "-q")...)
	var v rideSummary
	if err := json.Unmarshal([]byte(out), &v); err != nil {
		t.Fatalf("%v: exit %d %s: %v", args, code, errs, err)
	}
	return v, out, code
}

// sameSummary compares two JSON summaries (or standstills) key by key:
// times (keys ending _s) to 0.5 s, temperatures (_K) to 0.05 K, the rest
// exactly; it returns the differences.
func sameSummary(a, b map[string]any) []string {
	var diffs []string
	for k, va := range a {
		vb, ok := b[k]
		fa, na := va.(float64)
		fb, nb := vb.(float64)
		tol := 0.0
		switch {
		case strings.HasSuffix(k, "_s"):
			tol = 0.5
		case strings.HasSuffix(k, "_K"):
			tol = 0.05
		}
		switch {
		case !ok:
			diffs = append(diffs, k+" missing")
		case na && nb:
			if math.Abs(fa-fb) > tol {
				diffs = append(diffs, fmt.Sprintf("%s: %.3f against %.3f", k, fa, fb))
			}
		case fmt.Sprint(va) != fmt.Sprint(vb):
			diffs = append(diffs, fmt.Sprintf("%s: %v against %v", k, va, vb))
		}
	}
	return diffs
}

// The print interval does not change a ride's summary: the demo with a
// 180 C head limit on mountain-pass (the head passes it climbing and is
// still over it standing) and with a heat its fins cannot reject (a
// runaway) gives the same summary and standstill at --every 1 s, 60 s and
// 300 s, times to 0.5 s and temperatures to 0.05 K. (Read from the
// printed samples, the first passing of the limit was 482.9 s at 1 s and
// 542.6 s at 300 s.)
func TestRideSummaryEvery(t *testing.T) {
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	dir := t.TempDir()
	low := filepath.Join(dir, "low-limit.toml")
	if err := os.WriteFile(low, design.SetKeys(src, []design.KV{{Key: "limits.head", Value: `"180 C"`}}), 0o644); err != nil {
		t.Fatal(err)
	}
	hot := runawayDesign(t, src, dir)
	for _, c := range []struct {
		file    string
		runaway bool
	}{{low, false}, {hot, true}} {
		base, _, _ := rideJSONOf(t, c.file, "--profile", "mountain-pass", "--every", "1 s")
		first, _ := base.Summary["first_over_head_limit_s"].(float64)
		above, _ := base.Summary["above_head_limit_s"].(float64)
		if first <= 0 || above <= 0 || base.Runaway != c.runaway || (base.Standstill == nil) == !c.runaway {
			t.Fatalf("%s: not the case meant: %+v", c.file, base.Summary)
		}
		for _, every := range []string{"60 s", "300 s"} {
			v, _, _ := rideJSONOf(t, c.file, "--profile", "mountain-pass", "--every", every)
			if d := sameSummary(v.Summary, base.Summary); len(d) > 0 || len(v.Summary) != len(base.Summary) {
				t.Errorf("%s --every %s: the summary differs from --every 1 s: %v", filepath.Base(c.file), every, d)
			}
			if d := sameSummary(v.Standstill, base.Standstill); len(d) > 0 {
				t.Errorf("%s --every %s: the standstill differs from --every 1 s: %v", filepath.Base(c.file), every, d)
			}
		}
	}
}

// runawayDesign is the demo with a heat load its fins cannot reject: 20 kW
// to the head and 2 kW to the barrel instead of the road load.
func runawayDesign(t *testing.T, src []byte, dir string) string {
	t.Helper()
	var keep []string
	in := false
	for _, l := range strings.Split(string(src), "\n") {
		if strings.HasPrefix(l, "[") {
			in = strings.HasPrefix(l, "[load]")
		}
		if in && !strings.HasPrefix(l, "[") && !strings.HasPrefix(strings.TrimSpace(l), "#") {
			continue
		}
		keep = append(keep, l)
	}
	p := filepath.Join(dir, "runaway.toml")
	body := design.SetKeys([]byte(strings.Join(keep, "\n")), []design.KV{{Key: "load.head_heat", Value: `"20 kW"`}, {Key: "load.barrel_heat", Value: `"2 kW"`}})
	if err := os.WriteFile(p, body, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// A ride that runs away says so in its summary, with the time, and
// reports no peak: the table's peak line is "Peak: none, runaway at
// minute X" with X the JSON's runaway_at_s (the trace's end, and its last
// sample, at the 500 C cap); the JSON has no peaks (null), names the
// wall, and validates against the schema.
func TestRideRunaway(t *testing.T) {
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	hot := runawayDesign(t, src, t.TempDir())
	v, js, code := rideJSONOf(t, hot, "--profile", "mountain-pass")
	at, ok := v.Summary["runaway_at_s"].(float64)
	if code != ExitModel || !v.Runaway || !ok || at <= 0 || math.Abs(at-v.End) > 1e-9 || v.Summary["runaway_wall"] != "head" {
		t.Fatalf("exit %d, runaway %v, summary %v, end %g s", code, v.Runaway, v.Summary, v.End)
	}
	for _, k := range []string{"peak_head_K", "peak_head_at_s", "peak_barrel_K", "peak_barrel_at_s"} {
		if x, there := v.Summary[k]; !there || x != nil {
			t.Errorf("a runaway reports %s = %v", k, x)
		}
	}
	last := v.Samples[len(v.Samples)-1]
	if math.Abs(last.Time-at) > 1e-9 || math.Abs(last.Head-773.15) > 1e-3 {
		t.Errorf("last sample %.3f K at %.3f s; want the cap at the runaway, %.3f s", last.Head, last.Time, at)
	}
	if err := validate(compileSchema(t), js); err != nil {
		t.Errorf("schema: %v", err)
	}
	out, _, _ := run(t, "ride", hot, "--profile", "mountain-pass")
	want := fmt.Sprintf("Peak: none, runaway at minute %.1f: the head passed 500 C", at/60)
	if !strings.Contains(out, want) || strings.Contains(out, "Peak: head") || !strings.Contains(out, fmt.Sprintf("up to the runaway at minute %.1f", at/60)) {
		t.Errorf("want %q, no peak\n%s", want, out)
	}
}
