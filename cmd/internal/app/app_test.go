package app

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
)

var update = flag.Bool("update", false, "rewrite the golden files of the command-line tests")

const goldenDir = "../../../testdata/golden"

// runJSON runs the command line (args, "-f json" and "-q" added), fails
// the test on a non-zero exit or output that is not JSON, and decodes the
// output into v.
func runJSON(t *testing.T, v any, args ...string) {
	t.Helper()
	js, errs, code := run(t, append(args, "-f", "json", "-q")...)
	if code != 0 {
		t.Fatalf("%v: exit %d %s", args, code, errs)
	}
	if err := json.Unmarshal([]byte(js), v); err != nil {
		t.Fatalf("%v: %v", args, err)
	}
}

func run(t *testing.T, args ...string) (string, string, int) {
	t.Helper()
	var out, errb bytes.Buffer
	code := Run(args, &out, &errb)
	return out.String(), errb.String(), code
}

// designs writes the two demo designs to a temporary folder.
func designs(t *testing.T) (string, string) {
	dir := t.TempDir()
	up := filepath.Join(dir, "upright.toml")
	lo := filepath.Join(dir, "laid-over.toml")
	if err := os.WriteFile(up, demo.Upright, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(lo, demo.LaidOver, 0o644); err != nil {
		t.Fatal(err)
	}
	return up, lo
}

var tmpPath = regexp.MustCompile(`/tmp/[^ ]*/(upright|laid-over)\.toml`)

func golden(t *testing.T, name, got string) {
	t.Helper()
	got = tmpPath.ReplaceAllString(got, "$1.toml")
	path := filepath.Join(goldenDir, name)
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/internal/app -update to create it)", err)
	}
	if string(want) != got {
		t.Errorf("%s differs from the golden file (- golden, + now); if the change is intended, run go test ./cmd/internal/app -update and review the diff.\n%s", name, lineDiff(string(want), got, 40))
	}
}

// Golden tests of every subcommand's output (the numbers are this
// program's own; the golden files catch unintended changes, while the
// physics is checked against outside sources in fins and airflow).
func TestGoldenOutputs(t *testing.T) {
	up, lo := designs(t)
	cases := []struct {
		name string
		args []string
	}{
		{"demo.txt", nil},
		{"estimate.txt", []string{"estimate", up}},
		{"estimate-us.md", []string{"estimate", "--units", "us", "--format", "markdown", lo}},
		{"compare.txt", []string{"compare", up, lo}},
		{"tilt.txt", []string{"tilt", "--step", "30 deg", up}},
		{"march.csv", []string{"march", "--format", "csv", "--segments", "8", lo}},
		{"speeds.txt", []string{"speeds", "--from", "30 km/h", "--to", "150 km/h", "--step", "30 km/h", up}},
		{"fin.txt", []string{"fin", "--profile", "annular-tapered", "--height", "35mm", "--root-thickness", "4mm", "--tip-thickness", "2mm", "--root-diameter", "90mm", "--h", "60 W/m2K"}},
		{"alloys.txt", []string{"alloys"}},
		{"sweep.csv", []string{"sweep", "-f", "csv", "--workers", "1", "--vary", "head.pitch=7mm:11mm:2mm", "--vary", "air.ambient=20C:40C:20C", up}},
		{"optimise.txt", []string{"optimise", "--goal", "cool", "--pitch", "8mm:12mm", "--count", "6:8", up}},
		{"ride.txt", []string{"ride", "--profile", "mountain-pass", "--every", "5 min", up}},
		{"demo-fan.txt", []string{"demo", "--fan"}},
	}
	for _, c := range cases {
		out, errs, code := run(t, c.args...)
		if code != 0 && c.name != "compare.txt" && c.name != "demo.txt" {
			t.Errorf("%s: exit %d: %s", c.name, code, errs)
		}
		golden(t, c.name, out)
	}
}

func TestEstimateJSON(t *testing.T) {
	up, lo := designs(t)
	for _, f := range []string{up, lo} {
		out, errs, code := run(t, "estimate", "--format", "json", f)
		if code != 0 && code != ExitModel {
			t.Fatalf("exit %d: %s", code, errs)
		}
		var v map[string]any
		if err := json.Unmarshal([]byte(out), &v); err != nil {
			t.Fatalf("not JSON: %v\n%s", err, out)
		}
		res := v["result"].(map[string]any)
		for _, set := range []string{"head", "barrel"} {
			s := res[set].(map[string]any)
			keys := []string{"heat_rejected_W", "wall_temperature_K", "mean_h_W_m2K", "fin_efficiency", "air_inlet_K", "air_outlet_K", "passage_velocity_m_s",
				"air_enthalpy_rise_W", "air_imbalance", "load_imbalance"}
			if res["method"] == "channel" {
				keys = append(keys, "march") // a free-stream method has no path to march
			}
			for _, k := range keys {
				if _, ok := s[k]; !ok {
					t.Errorf("%s: JSON lacks %s.%s", f, set, k)
				}
			}
		}
		// the larger of the load check (the balance stops at 1e-5 of the
		// load) and the air check
		if imb := v["energy_imbalance"].(float64); !(imb <= 1e-5) {
			t.Errorf("energy imbalance %g", imb)
		}
		if !strings.Contains(v["caution"].(string), "not a measurement") {
			t.Error("JSON lacks the caution")
		}
	}
}

func TestExitCodesAndFiles(t *testing.T) {
	up, _ := designs(t)
	dir := filepath.Dir(up)
	if _, _, code := run(t, "estimate"); code != ExitUsage {
		t.Errorf("missing argument: exit %d", code)
	}
	if _, _, code := run(t, "frobnicate"); code != ExitUsage {
		t.Errorf("unknown command: exit %d", code)
	}
	if _, e, code := run(t, "estimate", filepath.Join(dir, "nope.toml")); code != ExitIO || !strings.Contains(e, "cannot read") {
		t.Errorf("missing file: exit %d %s", code, e)
	}
	bad := filepath.Join(dir, "bad.toml")
	os.WriteFile(bad, []byte(strings.Replace(string(demo.Upright), `pitch = "9 mm"`, `pitch = "9 mmm"`, 1)), 0o644)
	line := 1 + strings.Count(string(demo.Upright)[:strings.Index(string(demo.Upright), `pitch = "9 mm"`)], "\n")
	if _, e, code := run(t, "estimate", bad); code != ExitDesign || !strings.Contains(e, fmt.Sprintf("bad.toml:%d: head.pitch", line)) {
		t.Errorf("bad design: exit %d %s", code, e)
	}
	// new refuses to overwrite; --force allows it
	if _, e, code := run(t, "new", up); code != ExitIO || !strings.Contains(e, "already exists") {
		t.Errorf("new over an existing file: exit %d %s", code, e)
	}
	fresh := filepath.Join(dir, "fresh.toml")
	if _, _, code := run(t, "new", fresh); code != 0 {
		t.Fatal("new failed")
	}
	if _, _, code := run(t, "estimate", fresh); code != 0 {
		t.Error("the starter design does not estimate cleanly")
	}
	// --output writes atomically and does not overwrite without --force
	outf := filepath.Join(dir, "r.csv")
	if _, _, code := run(t, "estimate", "-f", "csv", "-o", outf, up); code != 0 {
		t.Fatal("--output failed")
	}
	before, _ := os.ReadFile(outf)
	if _, _, code := run(t, "estimate", "-f", "json", "-o", outf, up); code != ExitIO {
		t.Errorf("overwrote without --force: exit %d", code)
	}
	after, _ := os.ReadFile(outf)
	if !bytes.Equal(before, after) {
		t.Error("file changed without --force")
	}
	if _, _, code := run(t, "estimate", "-f", "json", "-o", outf, "--force", up); code != 0 {
		t.Error("--force refused")
	}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file left behind: %s", e.Name())
		}
	}
	if _, _, code := run(t, "estimate", "--format", "xml", up); code != ExitUsage {
		t.Errorf("bad format: exit %d", code)
	}
}

// The README's first two commands: the demo and the tests.
func TestReadmeCommands(t *testing.T) {
	b, err := os.ReadFile("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	var cmds []string
	in := false
	for _, l := range strings.Split(string(b), "\n") {
		if strings.HasPrefix(l, "```") {
			in = !in
			continue
		}
		if in && strings.TrimSpace(l) != "" {
			cmds = append(cmds, strings.TrimSpace(l))
		}
		if len(cmds) >= 2 {
			break
		}
	}
	if len(cmds) < 2 || cmds[0] != "go run ./cmd/finmarch" || cmds[1] != "go test ./..." {
		t.Fatalf("README must open with the demo and test commands, found %q", cmds)
	}
	out, _, code := run(t)
	if code != 0 || !strings.Contains(out, "upright against laid over") || !strings.Contains(out, "not a measurement") {
		t.Errorf("the demo (README's first command) failed: exit %d\n%s", code, out)
	}
}

// --strict turns a range warning into exit 4 and writes no output; without
// it the same run succeeds and warns once per cause on stderr.
func TestStrict(t *testing.T) {
	dir := t.TempDir()
	// a -45 C ambient takes the air properties below their stated 250 K
	p := filepath.Join(dir, "cold.toml")
	src := strings.Replace(string(demo.Upright), `ambient = "35 C"`, `ambient = "-45 C"`, 1)
	os.WriteFile(p, []byte(src), 0o644)
	out, errs, code := run(t, "estimate", p)
	// every warning names the design it belongs to (issue 21)
	if code != 0 || !strings.Contains(errs, "warning: demo single, upright, annular fins: air properties") || out == "" {
		t.Fatalf("without --strict: exit %d, stderr %s", code, errs)
	}
	if n := strings.Count(errs, "air properties (Sutherland"); n != 1 {
		t.Errorf("the same cause warned %d times", n)
	}
	out, errs, code = run(t, "estimate", "--strict", p)
	if code != ExitStrict || out != "" || !strings.Contains(errs, "--strict") {
		t.Errorf("with --strict: exit %d, stdout %q, stderr %s", code, out, errs)
	}
	js, _, _ := run(t, "estimate", "-f", "json", p)
	if !strings.Contains(js, `"warnings": [`) || !strings.Contains(js, "air properties") {
		t.Error("JSON lacks the warnings")
	}
}

// The README's "What the demo prints" block is the demo's real output.
func TestReadmeDemoBlock(t *testing.T) {
	b, err := os.ReadFile("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	const head = "## What the demo prints\n\n```\n"
	i := strings.Index(s, head)
	if i < 0 {
		t.Fatal("README lacks the demo section")
	}
	block := s[i+len(head):]
	block = block[:strings.Index(block, "```")]
	out, _, _ := run(t)
	if strings.TrimSpace(block) != strings.TrimSpace(out) {
		t.Errorf("README demo block is stale; paste the output of 'go run ./cmd/finmarch'.\n--- demo prints ---\n%s", out)
	}
}

// A wall over its limit is said on stderr and in the JSON, whatever --strict.
func TestLimitAlert(t *testing.T) {
	_, lo := designs(t)
	_, errs, code := run(t, "estimate", lo, "--speed", "130 km/h")
	if code != 0 || !strings.Contains(errs, "warning: demo single, laid over, longitudinal fins: the head runs at") || !strings.Contains(errs, "over its 220.0 C limit") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	js, _, _ := run(t, "estimate", "-f", "json", lo, "--speed", "130 km/h")
	if !strings.Contains(js, `"limit_warnings": [`) {
		t.Error("JSON lacks limit_warnings")
	}
}

// readmeRun matches a command block of the README and the output block
// after it.
var readmeRun = regexp.MustCompile("(?s)```\nfinmarch ((?:sweep|optimise|ride) [^\n]*)\n```\n\n```\n(.*?)```")

var workersNote = regexp.MustCompile(`on \d+ workers?`)

// The sweep and optimiser examples of the README are what those commands
// print on the starter designs (run from a folder holding them as
// upright.toml and laid-over.toml); -update rewrites them. The worker count in the sweep's
// title depends on the machine and is not compared.
func TestReadmeExamples(t *testing.T) {
	readme, err := filepath.Abs("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(readme)
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	ms := readmeRun.FindAllStringSubmatchIndex(s, -1)
	if len(ms) < 2 {
		t.Fatalf("README has %d sweep/optimise examples, want at least 2", len(ms))
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "upright.toml"), demo.Upright, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "laid-over.toml"), demo.LaidOver, 0o644); err != nil {
		t.Fatal(err)
	}
	t.Chdir(dir)
	var fixed strings.Builder
	last := 0
	for _, m := range ms {
		line, block := s[m[2]:m[3]], s[m[4]:m[5]]
		out, errs, code := run(t, shellWords(line)...)
		if code != 0 {
			t.Fatalf("finmarch %s: exit %d, %s", line, code, errs)
		}
		fixed.WriteString(s[last:m[4]])
		fixed.WriteString(out)
		last = m[5]
		norm := func(x string) string { return strings.TrimSpace(workersNote.ReplaceAllString(x, "on N workers")) }
		if !*update && norm(out) != norm(block) {
			t.Errorf("README example 'finmarch %s' is stale (go test ./cmd/internal/app -update rewrites it); - README, + now:\n%s", line, lineDiff(norm(block), norm(out), 40))
		}
	}
	fixed.WriteString(s[last:])
	if *update {
		if err := os.WriteFile(readme, []byte(fixed.String()), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// shellWords splits a README command line on spaces, keeping double-quoted
// words whole.
func shellWords(s string) []string {
	var out []string
	var w strings.Builder
	in, have := false, false
	for _, r := range s {
		switch {
		case r == '"':
			in, have = !in, true
		case r == ' ' && !in:
			if have {
				out = append(out, w.String())
				w.Reset()
				have = false
			}
		default:
			w.WriteRune(r)
			have = true
		}
	}
	if have {
		out = append(out, w.String())
	}
	return out
}
