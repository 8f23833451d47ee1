package app

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"strconv"
	"strings"
	"testing"
)

// --version and the version command name the Go version the test binary
// was built with (from the build information, not a constant), and agree.
func TestVersion(t *testing.T) {
	out, errs, code := run(t, "--version")
	if code != 0 || !strings.HasPrefix(out, "finmarch ") || !strings.Contains(out, runtime.Version()) {
		t.Fatalf("--version: exit %d %q %s", code, out, errs)
	}
	js, _, code := run(t, "version", "-f", "json")
	var b BuildInfo
	if err := json.Unmarshal([]byte(js), &b); err != nil || code != 0 || b.Go != runtime.Version() || b.String()+"\n" != out {
		t.Errorf("version -f json: %v %+v against %q", err, b, out)
	}
}

// Without -f the --output extension picks the format; -f overrides it.
func TestFormatFromOutputExtension(t *testing.T) {
	up, _ := designs(t)
	dir := t.TempDir()
	for _, c := range []struct {
		name, flag, starts string
	}{{"e.json", "", "{"}, {"e.csv", "", "quantity,"}, {"e.md", "", "## "}, {"e.txt", "", "demo single"}, {"f.json", "table", "demo single"}} {
		args := []string{"estimate", up, "-q", "--samples", "0", "-o", filepath.Join(dir, c.name)}
		if c.flag != "" {
			args = append(args, "-f", c.flag)
		}
		if _, errs, code := run(t, args...); code != 0 {
			t.Fatalf("%s: exit %d %s", c.name, code, errs)
		}
		b, _ := os.ReadFile(filepath.Join(dir, c.name))
		if !strings.HasPrefix(string(b), c.starts) {
			t.Errorf("%s (-f %q) starts %q, want %q", c.name, c.flag, string(b[:min(len(b), 40)]), c.starts)
		}
	}
}

// A flag a command would ignore is refused, naming the flag and the
// command; the flags it uses still pass.
func TestIgnoredFlagsRefused(t *testing.T) {
	up, _ := designs(t)
	for _, args := range [][]string{
		{"fin", "--speed", "90 km/h", "--profile", "straight-rectangular", "--height", "30mm", "--root-thickness", "3mm", "--h", "50 W/m2K"},
		{"alloys", "--ambient", "40 C"},
		{"report", up, "-f", "csv", "-o", filepath.Join(t.TempDir(), "r.html")},
		{"calibrate", up, "--speed", "90 km/h"},
		{"speeds", up, "--speed", "90 km/h"},
		{"optimise", up, "--limit", "200 C"},
		{"version", "--units", "us"},
	} {
		_, errs, code := run(t, args...)
		if code != ExitUsage || !strings.Contains(errs, "--") {
			t.Errorf("%v: exit %d %s", args, code, errs)
		}
	}
	if _, errs, code := run(t, "alloys", "-f", "csv", "-q"); code != 0 {
		t.Errorf("alloys -f csv: exit %d %s", code, errs)
	}
}

// "-" reads a design from standard input: the same estimate as from its
// file, errors named <stdin>, and only once per run.
func TestDesignFromStdin(t *testing.T) {
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	old := Stdin
	t.Cleanup(func() { Stdin = old })
	Stdin = strings.NewReader(string(src))
	a, errs, code := run(t, "estimate", "-", "-f", "json", "-q", "--samples", "0")
	b, _, _ := run(t, "estimate", up, "-f", "json", "-q", "--samples", "0")
	if code != 0 || strings.Replace(a, `"source": "\u003cstdin\u003e"`, `"source": "`+up+`"`, 1) != b {
		t.Errorf("exit %d %s; stdin and file differ beyond the source's name", code, errs)
	}
	Stdin = strings.NewReader("[air]\nspeed = 90\n")
	if _, errs, code := run(t, "estimate", "-"); code != ExitDesign || !strings.Contains(errs, "<stdin>:") {
		t.Errorf("bad design on stdin: exit %d %s", code, errs)
	}
	Stdin = strings.NewReader(string(src))
	if _, errs, code := run(t, "compare", "-", "-"); code != ExitUsage || !strings.Contains(errs, "give - once") {
		t.Errorf("two designs from stdin: exit %d %s", code, errs)
	}
}

// estimate takes several designs: JSON is the array of the single runs'
// documents, CSV one table with the design first, and the caution once.
func TestEstimateManyDesigns(t *testing.T) {
	up, lo := designs(t)
	one := func(p string) any {
		js, errs, code := run(t, "estimate", p, "-f", "json", "-q", "--samples", "0")
		if code != 0 {
			t.Fatal(errs)
		}
		var v any
		if err := json.Unmarshal([]byte(js), &v); err != nil {
			t.Fatal(err)
		}
		return v
	}
	js, errs, code := run(t, "estimate", up, lo, "-f", "json", "-q", "--samples", "0")
	var both []any
	if err := json.Unmarshal([]byte(js), &both); err != nil || code != 0 || len(both) != 2 {
		t.Fatalf("exit %d %v %s", code, err, errs)
	}
	for i, p := range []string{up, lo} {
		a, _ := json.Marshal(both[i])
		b, _ := json.Marshal(one(p))
		if string(a) != string(b) {
			t.Errorf("design %d differs from its single run", i+1)
		}
	}
	csvOut, _, _ := run(t, "estimate", up, lo, "-f", "csv", "-q", "--samples", "0")
	lines := strings.Split(strings.TrimSpace(csvOut), "\n")
	if !strings.HasPrefix(lines[0], "design,quantity,") || strings.Count(csvOut, "design,") != 1 || !strings.Contains(csvOut, "laid over") {
		t.Errorf("CSV:\n%s", csvOut)
	}
	txt, _, _ := run(t, "estimate", up, lo, "--samples", "0", "-q")
	if strings.Count(txt, "Caution:") != 1 || strings.Count(txt, "Heat balance per fin set") != 2 {
		t.Errorf("table: %d cautions, %d balances", strings.Count(txt, "Caution:"), strings.Count(txt, "Heat balance per fin set"))
	}
}

// The CSV of estimate, compare, speeds, tilt, march and sweep holds one
// value per cell: no pair "a / b", no range "a to b", no padded label; a
// column whose header names a unit holds numbers or nothing (a state such
// as "no equilibrium" goes to a status column); and the numbers are at full
// precision: the head's wall temperature reads back to the JSON's value.
func TestCSVOneValuePerCell(t *testing.T) {
	up, lo := designs(t)
	two := regexp.MustCompile(`^-?[0-9.]+ *(/|to|x) *-?[0-9.]+$`)
	unitCol := regexp.MustCompile(`\((C|K|W|km/h|mm|kg|W/kg|W/m2|W/m2K|m/s|deg)\)$`)
	for _, args := range [][]string{
		{"estimate", up}, {"estimate", up, lo}, {"compare", up, lo},
		{"speeds", up, "--from", "60 km/h", "--to", "100 km/h", "--step", "20 km/h"},
		{"tilt", up, "--step", "45 deg", "--samples", "100", "--speed", "150 km/h"},
		{"march", lo},
		{"sweep", up, "--vary", "head.pitch=4mm:10mm:2mm", "--vary", "air.speed=30km/h,150km/h"},
	} {
		out, errs, code := run(t, append(args, "-f", "csv", "-q")...)
		if code != 0 && code != ExitModel {
			t.Fatalf("%v: exit %d %s", args, code, errs)
		}
		rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
		if err != nil || len(rows) < 2 {
			t.Fatalf("%v: %v, %d rows", args, err, len(rows))
		}
		for i, r := range rows {
			for j, c := range r {
				if two.MatchString(c) || c != strings.TrimSpace(c) || c == noEquilibrium || c == "-" && rows[0][j] != "unit" {
					t.Errorf("%v: cell %q", args[0], c)
				}
				if _, err := strconv.ParseFloat(c, 64); i > 0 && unitCol.MatchString(rows[0][j]) && c != "" && err != nil {
					t.Errorf("%v: %q in the numeric column %q", args[0], c, rows[0][j])
				}
			}
		}
		if args[0] == "tilt" && !strings.Contains(out, "NO EQUILIBRIUM") {
			t.Errorf("tilt CSV without its status columns:\n%s", out)
		}
	}
	out, _, _ := run(t, "estimate", up, "-f", "csv", "-q", "--samples", "0")
	js, _, _ := run(t, "estimate", up, "-f", "json", "-q", "--samples", "0")
	var v struct {
		Result struct {
			Head struct {
				Wall float64 `json:"wall_temperature_K"`
			} `json:"head"`
		} `json:"result"`
	}
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	want := strconv.FormatFloat(v.Result.Head.Wall-273.15, 'g', -1, 64)
	if !strings.Contains(out, "wall temperature at fin roots,C,"+want+",") {
		t.Errorf("CSV head wall is not %s C at full precision:\n%s", want, out)
	}
}

// Every command's JSON document is an object carrying the schema version
// and the tool's version (estimate of several designs: each element).
func TestJSONStamped(t *testing.T) {
	up, lo := designs(t)
	for _, args := range [][]string{
		{"estimate", up, "--samples", "0"}, {"compare", up, lo, "--samples", "0"}, {"tilt", up, "--step", "45 deg", "--samples", "0"},
		{"speeds", up, "--from", "60 km/h", "--to", "80 km/h", "--samples", "0"}, {"march", up}, {"calibrate", up, "--points", ""},
		{"fin", "--height", "30mm", "--root-thickness", "3mm", "--root-diameter", "90mm", "--h", "50 W/m2K"}, {"alloys"}, {"version"},
		{"optimise", up, "--pitch", "8mm:9mm", "--height", "30mm:32mm", "--levels", "3"},
	} {
		if args[0] == "calibrate" {
			csvPath := filepath.Join(t.TempDir(), "p.csv")
			if err := os.WriteFile(csvPath, []byte("speed (km/h),ambient (C),head (C)\n90,28,190\n"), 0o644); err != nil {
				t.Fatal(err)
			}
			args[3] = csvPath
		}
		out, errs, code := run(t, append(args, "-f", "json", "-q")...)
		if code != 0 {
			t.Errorf("%v: exit %d %s", args, code, errs)
			continue
		}
		var v map[string]any
		if err := json.Unmarshal([]byte(out), &v); err != nil || v["schema_version"] != float64(SchemaVersion) || !strings.HasPrefix(fmt.Sprint(v["finmarch_version"]), "finmarch ") {
			t.Errorf("%v: %v; schema %v, version %v", args[0], err, v["schema_version"], v["finmarch_version"])
		}
	}
}
