package app

import (
	"bufio"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestSweepCSVAndJSON(t *testing.T) {
	up, _ := designs(t)
	out, errs, code := run(t, "sweep", up, "-f", "csv", "--vary", "head.pitch=6mm:14mm:2mm", "--vary", "air.speed=50km/h,120km/h")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) != 11 || recs[0][0] != "index" || recs[0][1] != "head.pitch (mm)" {
		t.Fatalf("want header and 10 rows, got %d: %v", len(recs), recs[0])
	}
	seen := map[string]bool{}
	for _, r := range recs[1:] {
		seen[r[0]] = true
		if r[len(r)-2] == "invalid" || r[len(r)-2] == "failed" {
			t.Errorf("row %v", r)
		}
	}
	if len(seen) != 10 {
		t.Errorf("indices %v", seen)
	}
	if !strings.Contains(errs, "Coolest heads") {
		t.Error("summary not on stderr")
	}
	// counts follow the pitch: 6 mm fits 12 fins in 72 mm, 14 mm fits 5
	for _, r := range recs[1:] {
		if r[1] == "6.000" && r[3] != "12" || r[1] == "14.000" && r[3] != "5" {
			t.Errorf("fitted count wrong in %v", r)
		}
	}
	// JSON lines
	dir := t.TempDir()
	jl := filepath.Join(dir, "s.jsonl")
	out, errs, code = run(t, "sweep", up, "-f", "json", "-o", jl, "--vary", "head.height=20mm:40mm:10mm", "--vary", "head.pitch=3mm,9mm")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "Lightest fins") {
		t.Error("summary should go to stdout when rows go to a file")
	}
	f, _ := os.Open(jl)
	defer f.Close()
	sc := bufio.NewScanner(f)
	n, invalid := 0, 0
	for sc.Scan() {
		var m map[string]any
		if err := json.Unmarshal(sc.Bytes(), &m); err != nil {
			t.Fatalf("line %q: %v", sc.Text(), err)
		}
		if m["status"] == "invalid" {
			invalid++
			if !strings.Contains(m["note"].(string), "head.pitch") {
				t.Errorf("invalid row without the reason: %v", m)
			}
		}
		n++
	}
	if n != 6 || invalid != 3 {
		t.Errorf("%d lines, %d invalid; want 6 and 3 (3 mm pitch is below the 4 mm root)", n, invalid)
	}
	if _, _, code := run(t, "sweep", up, "-f", "json", "-o", jl, "--vary", "head.height=20mm:40mm:10mm"); code != ExitIO {
		t.Errorf("overwrote without --force: exit %d", code)
	}
	for _, bad := range [][]string{{"--vary", "head.pitch"}, {"--vary", "head.colour=1:2:1"}, {"--vary", "head.pitch=9mm:6mm:1mm"}, {}} {
		if _, _, code := run(t, append([]string{"sweep", up}, bad...)...); code != ExitUsage {
			t.Errorf("%v: exit %d", bad, code)
		}
	}
}

// A temperature step in C or F is a difference, not a temperature.
func TestAxisTemperatureStep(t *testing.T) {
	a, err := parseAxis("air.ambient=20C:30C:5C")
	if err != nil || len(a.Values) != 3 || a.Values[1] != 298.15 {
		t.Fatalf("%v %v", a.Values, err)
	}
	a, err = parseAxis("air.ambient=50F:104F:9F")
	if err != nil || len(a.Values) != 7 {
		t.Fatalf("F: %v %v", a.Values, err)
	}
	a, err = parseAxis("head.pitch=6mm:8mm:1mm")
	if err != nil || len(a.Values) != 3 {
		t.Fatalf("mm: %v %v", a.Values, err)
	}
	a, err = parseAxis("head.count=4,6,8")
	if err != nil || len(a.Values) != 3 || a.Values[2] != 8 {
		t.Fatalf("list: %v %v", a.Values, err)
	}
}

// Range axes hold the decimal values the user wrote, not their binary
// accumulations (30 mm + 5 mm is 0.035 m exactly as printed), and keep
// the count of from:to:step.
func TestAxisValues(t *testing.T) {
	for _, c := range []struct {
		spec string
		want []float64
	}{
		{"head.height=30mm:50mm:5mm", []float64{0.03, 0.035, 0.04, 0.045, 0.05}},
		{"head.pitch=5mm:5.3mm:0.1mm", []float64{0.005, 0.0051, 0.0052, 0.0053}},
		{"air.ambient=20C:22C:1C", []float64{293.15, 294.15, 295.15}},
	} {
		a, err := parseAxis(c.spec)
		if err != nil {
			t.Fatal(err)
		}
		if len(a.Values) != len(c.want) {
			t.Fatalf("%s: %v", c.spec, a.Values)
		}
		for i, v := range a.Values {
			if v != c.want[i] {
				t.Errorf("%s: value %d is %v, want %v", c.spec, i, v, c.want[i])
			}
		}
	}
}

// A bare number for a length, speed, temperature or angle on the command
// line is refused with the unit hint (it would be m, m/s, K or rad); for a
// fraction or a count it is the value.
func TestBareNumbersOnTheCommandLine(t *testing.T) {
	up, _ := designs(t)
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"sweep", up, "--vary", "head.pitch=6:14:2"}, `"6" has no unit; write "6 mm"`},
		{[]string{"sweep", up, "--vary", "head.pitch=6mm:14mm:2"}, `"2" has no unit`},
		{[]string{"estimate", up, "--speed", "110"}, `taken in m/s`},
		{[]string{"estimate", up, "--ambient", "40"}, `write "35 C"`},
		{[]string{"optimise", up, "--goal", "light", "--limit", "200"}, `taken in K`},
		{[]string{"optimise", up, "--pitch", "6:14"}, `has no unit`},
	} {
		_, errs, code := run(t, c.args...)
		if code != ExitUsage || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, %q; want exit %d and %q", c.args[2:], code, errs, ExitUsage, c.want)
		}
	}
	for _, args := range [][]string{
		{"sweep", up, "--vary", "air.pressure_recovery=0.4,0.5", "-f", "csv"},
		{"sweep", up, "--vary", "head.count=7:8:1", "-f", "csv"},
	} {
		if _, errs, code := run(t, args...); code != 0 {
			t.Errorf("%v: exit %d, %s", args[2:], code, errs)
		}
	}
}

// A sweep in which no point is valid says why and exits with the design
// error code, after writing its rows.
func TestSweepAllInvalid(t *testing.T) {
	up, _ := designs(t)
	out, errs, code := run(t, "sweep", up, "--vary", "air.pressure=90kPa:100kPa:5kPa", "-f", "csv")
	if code != ExitDesign || !strings.Contains(errs, "every point of the sweep breaks a design rule") || !strings.Contains(errs, "give altitude or pressure, not both") {
		t.Errorf("exit %d, %s", code, errs)
	}
	if strings.Count(out, "invalid") != 3 {
		t.Errorf("rows: %s", out)
	}
}

// A misspelt --vary key gets the nearest key of the schema.
func TestVaryDidYouMean(t *testing.T) {
	up, _ := designs(t)
	for key, want := range map[string]string{"head.pich": `did you mean "head.pitch"`, "air.sped": `did you mean "air.speed"`} {
		_, errs, code := run(t, "sweep", up, "--vary", key+"=1mm:2mm:1mm")
		if code != ExitUsage || !strings.Contains(errs, want) {
			t.Errorf("%s: exit %d, %q", key, code, errs)
		}
	}
}
