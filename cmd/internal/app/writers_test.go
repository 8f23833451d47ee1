package app

import (
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
)

// twoReadings are two plug-seat readings of the demo design, enough to fit
// its pressure recovery.
const twoReadings = `
[[measurement]]
speed = "60 km/h"
ambient = "25 C"
head = "180 C"
place = "plug-seat"
offset = "15 K"

[[measurement]]
speed = "90 km/h"
ambient = "25 C"
head = "200 C"
place = "plug-seat"
offset = "15 K"
`

// writeFile writes text to name in dir and returns its path.
func writeFile(t *testing.T, dir, name, text string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// airShapes writes the demo design's [air] table in every shape the parser
// accepts: under its header (as the demo has it), as an inline table on
// one line (with and without the key a calibration sets) or over several
// lines with comments (TOML 1.1), as dotted keys at the top level; each
// also with CRLF line ends.
func airShapes(t *testing.T) map[string]string {
	src := string(demo.Upright)
	start := strings.Index(src, "[air]\n")
	end := start + strings.Index(src[start:], "\n[load]")
	if start < 0 || end < start {
		t.Fatal("the demo design has no [air] table before [load]")
	}
	var keys []string // the [air] keys as written, comments dropped
	for _, l := range strings.Split(src[start:end], "\n")[1:] {
		if k, _, ok := strings.Cut(l, "#"); ok || strings.TrimSpace(l) != "" {
			if k = strings.TrimSpace(k); k != "" {
				keys = append(keys, k)
			}
		}
	}
	without := src[:start] + src[end+1:]
	name := strings.Index(without, "\n\n[cylinder]")
	top := func(lines string) string { return without[:name+1] + lines + without[name+1:] }
	var noRecovery []string
	for _, k := range keys {
		if !strings.HasPrefix(k, "pressure_recovery") {
			noRecovery = append(noRecovery, k)
		}
	}
	shapes := map[string]string{
		"header":                 src,
		"inline":                 top("air = { " + strings.Join(keys, ", ") + " }\n"),
		"inline without the key": top("air = { " + strings.Join(noRecovery, ", ") + " }  # the cooling air\n"),
		"inline over lines":      top("air = {\n  " + strings.Join(noRecovery, ", # a comment\n  ") + ",\n}\n"),
		"dotted":                 top("air." + strings.Join(keys, "\nair.") + "\n"),
		"dotted without the key": top("air." + strings.Join(noRecovery, "\nair.") + "\n"),
	}
	all := map[string]string{}
	for n, s := range shapes {
		all[n], all[n+", CRLF"] = s, strings.ReplaceAll(s, "\n", "\r\n")
	}
	return all
}

// calibrate --write on every shape of a design the parser accepts writes a
// design that parses back with the fitted values (the recovery to the four
// decimals printed, its half-width at two standard errors), and exits 0,
// not 6: an inline [air] table once made the written design unreadable.
func TestCalibrateWritesEveryShape(t *testing.T) {
	dir := t.TempDir()
	for name, src := range airShapes(t) {
		t.Run(name, func(t *testing.T) {
			if _, err := design.Parse([]byte(src), name); err != nil {
				t.Fatalf("the shape does not parse: %v\n%s", err, src)
			}
			slug := strings.NewReplacer(" ", "-", ",", "").Replace(name)
			in := writeFile(t, dir, slug+".toml", src+strings.ReplaceAll(twoReadings, "\n", map[bool]string{true: "\r\n", false: "\n"}[strings.Contains(src, "\r\n")]))
			out := filepath.Join(dir, slug+"-cal.toml")
			js, errs, code := run(t, "calibrate", in, "--write", out, "-f", "json", "-q")
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			var fit struct {
				Parameters []struct {
					Value    float64 `json:"value"`
					StdError float64 `json:"standard_error"`
				}
			}
			if err := json.Unmarshal([]byte(js), &fit); err != nil || len(fit.Parameters) != 1 {
				t.Fatalf("%v: %s", err, js)
			}
			text, err := os.ReadFile(out)
			if err != nil {
				t.Fatal(err)
			}
			d, err := design.Parse(text, out)
			if err != nil {
				t.Fatalf("the calibrated design does not parse: %v\n%s", err, text)
			}
			want, _ := strconv.ParseFloat(strconv.FormatFloat(fit.Parameters[0].Value, 'f', 4, 64), 64)
			if d.Case.Recovery != want {
				t.Errorf("recovery %g written, fitted %g", d.Case.Recovery, fit.Parameters[0].Value)
			}
			if hw := 2 * fit.Parameters[0].StdError; hw < 0.5 && !(d.Band.Spread.Recovery > 0.999*hw && d.Band.Spread.Recovery < 1.001*hw) {
				t.Errorf("half-width %g written, two standard errors %g", d.Band.Spread.Recovery, hw)
			}
			if strings.Contains(src, "\r\n") && strings.Count(string(text), "\n") != strings.Count(string(text), "\r\n") {
				t.Error("the calibrated design mixes line ends")
			}
		})
	}
}

// No two outputs of one run are one file: the calibrated design and the
// results table (same path, the same path spelled otherwise, a link to
// it), or both standard output; each is refused as a bad command line
// before anything is written, even with --force. With --write - the design
// alone goes to standard output, so that it pipes into estimate, and the
// results go to standard error or to the -o file.
func TestCalibrateOutputsDistinct(t *testing.T) {
	dir := t.TempDir()
	in := writeFile(t, dir, "cal.toml", string(demo.Upright)+twoReadings)
	old := writeFile(t, dir, "old.toml", "kept\n")
	link := filepath.Join(dir, "link.toml")
	if err := os.Symlink(old, link); err != nil {
		t.Fatal(err)
	}
	fresh := filepath.Join(dir, "fresh.toml")
	for _, c := range []struct {
		name string
		args []string
		frag string
	}{
		{"same new file", []string{"--write", fresh, "-o", fresh, "--force"}, "name the same file"},
		{"same file spelled otherwise", []string{"--write", fresh, "-o", filepath.Join(dir, ".", "sub", "..", "fresh.toml")}, "name the same file"},
		{"same existing file", []string{"--write", old, "-o", old, "--force"}, "name the same file"},
		{"a link to the other", []string{"--write", link, "-o", old, "--force"}, "name the same file"},
		{"both standard output", []string{"--write", "-", "-o", "-"}, "cannot both take standard output"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, errs, code := run(t, append([]string{"calibrate", in, "-q"}, c.args...)...)
			if code != ExitUsage || !strings.Contains(errs, c.frag) {
				t.Errorf("exit %d: %s", code, errs)
			}
			if b, _ := os.ReadFile(old); string(b) != "kept\n" {
				t.Errorf("%s was replaced", old)
			}
			if _, err := os.Stat(fresh); err == nil {
				t.Errorf("%s was written", fresh)
			}
		})
	}
	out, errs, code := run(t, "calibrate", in, "--write", "-", "-q")
	if code != 0 {
		t.Fatalf("--write -: exit %d %s", code, errs)
	}
	if _, err := design.Parse([]byte(out), "<stdin>"); err != nil {
		t.Errorf("standard output is not the calibrated design alone: %v\n%s", err, out)
	}
	if !strings.Contains(errs, "Fitted parameters") || !strings.Contains(errs, "to standard output") {
		t.Errorf("the results are not on standard error: %s", errs)
	}
	res := filepath.Join(dir, "results.json")
	out, errs, code = run(t, "calibrate", in, "--write", "-", "-o", res, "-q")
	if code != 0 {
		t.Fatalf("--write - -o FILE: exit %d %s", code, errs)
	}
	if _, err := design.Parse([]byte(out), "<stdin>"); err != nil {
		t.Errorf("standard output is not the calibrated design: %v", err)
	}
	if b, err := os.ReadFile(res); err != nil || !json.Valid(b) || strings.Contains(errs, "Fitted parameters") {
		t.Errorf("the results are not the JSON file alone: %v %s", err, errs)
	}
}

// Three scattered readings leave two standard errors of the recovery
// (0.74) above the half-width a design takes (0.5): the calibrated design
// holds the ceiling, parses, and a note says so; the run succeeds (it
// once ended as an internal error, exit 6).
func TestCalibrateBandAtCeiling(t *testing.T) {
	dir := t.TempDir()
	src := string(demo.Upright)
	for _, r := range [][2]string{{"60 km/h", "150 C"}, {"80 km/h", "235 C"}, {"100 km/h", "150 C"}} {
		src += "\n[[measurement]]\nspeed = \"" + r[0] + "\"\nambient = \"25 C\"\nhead = \"" + r[1] + "\"\n"
	}
	in := writeFile(t, dir, "scattered.toml", src)
	out := filepath.Join(dir, "cal.toml")
	txt, errs, code := run(t, "calibrate", in, "--write", out, "-q")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	flat := strings.Join(strings.Fields(txt), " ")
	if !strings.Contains(flat, "exceed the largest half-width a design takes, 0.50: uncertainty.pressure_recovery is written as 0.50") {
		t.Errorf("no note of the ceiling:\n%s", txt)
	}
	b, _ := os.ReadFile(out)
	d, err := design.Parse(b, out)
	if err != nil || d.Band.Spread.Recovery != 0.5 {
		t.Fatalf("%v: the half-width is not held to the ceiling\n%s", err, b)
	}
}

// Every command and flag typo is a bad command line (exit 2), with a "did
// you mean" where a command is close; a count typed out of its range is
// refused naming the flag and the range (-5 once meant "the design's");
// the help shows no cobra default after a text that states one.
func TestCommandLineTypos(t *testing.T) {
	up, _ := designs(t)
	svg := filepath.Join(t.TempDir(), "x.svg")
	for _, c := range []struct {
		args []string
		frag string
	}{
		{[]string{"estimat", up}, `did you mean "estimate"?`},
		{[]string{"optimse", up}, `did you mean "optimise"?`},
		{[]string{"bogus"}, `unknown command "bogus" for "finmarch"`},
		{[]string{"plot", "bogus", "-o", svg}, `unknown command "bogus" for "finmarch plot"`},
		{[]string{"plot", "marh", "-o", svg}, `did you mean "march"?`},
		{[]string{"plot", "-o", svg}, "needs one of its commands: compare, fan, march, ride, speeds"},
		{[]string{"help", "estmate"}, `did you mean "estimate"?`},
		{[]string{"help", "plot", "bogus"}, `unknown command "bogus" for "finmarch plot"`},
		{[]string{"completion", "bsh"}, `did you mean "bash"?`},
		{[]string{"estimate", up, "--bogus"}, "unknown flag: --bogus"},
		{[]string{"estimate", up, "--samples", "-5"}, "--samples -5: allowed 0 (no band) or 10 to 100000"},
		{[]string{"estimate", up, "--samples", "-1"}, "--samples -1: allowed 0 (no band) or 10 to 100000"},
		{[]string{"estimate", up, "--samples", "5"}, "--samples 5: allowed 0 (no band) or 10 to 100000"},
		{[]string{"speeds", up, "--samples", "200000"}, "--samples 200000"},
		{[]string{"estimate", up, "--segments", "-1"}, "--segments -1: allowed 1 to 10000"},
		{[]string{"estimate", up, "--samples", "ten"}, `"ten" is not a whole number`},
	} {
		out, errs, code := run(t, c.args...)
		if code != ExitUsage || !strings.Contains(errs, c.frag) {
			t.Errorf("%q: exit %d, want %d with %q: %s", c.args, code, ExitUsage, c.frag, errs)
		}
		if strings.Contains(out, "Usage:") {
			t.Errorf("%q: help printed on standard output as if it were the answer", c.args)
		}
	}
	if _, err := os.Stat(svg); err == nil {
		t.Error("a figure was written")
	}
	for _, args := range [][]string{{"estimate", up, "--samples", "0"}, {"help", "plot"}, {"plot", "--help"}} {
		if _, errs, code := run(t, args...); code != 0 {
			t.Errorf("%q: exit %d %s", args, code, errs)
		}
	}
	help, _, _ := run(t, "estimate", "--help")
	for _, l := range strings.Split(help, "\n") {
		if strings.Contains(l, "(default") && strings.Count(l, "default") > 1 {
			t.Errorf("two defaults: %s", l)
		}
	}
}

// A sweep over a key the design does not use (which would give identical
// rows) is refused naming the key and why: cooling.drop on a ram-cooled
// design, cooling.idle_speed with a fixed engine speed, the [ride] metal,
// a half-width of the band, the road's pressure recovery on a fan-cooled
// design. A varied key's column carries its own unit: a rotational speed
// in rpm, in metric and US units alike (it was labelled km/h, 6000 rpm
// written as 360).
func TestSweepVariesOnlyUsedKeys(t *testing.T) {
	up, _ := designs(t)
	dir := t.TempDir()
	fan := writeFile(t, dir, "fan.toml", string(demo.ScooterFan))
	fixed := string(demo.ScooterFan)
	for _, l := range strings.Split(fixed, "\n") {
		if strings.HasPrefix(l, "idle_speed") || strings.HasPrefix(l, "rated_speed") {
			fixed = strings.Replace(fixed, l+"\n", "", 1)
		}
	}
	fixed = strings.Replace(fixed, `# engine_speed = "5000 rpm"`, `engine_speed = "5000 rpm"`, 1)
	fixedPath := writeFile(t, dir, "fixed.toml", fixed)
	for _, c := range []struct {
		design, vary, frag string
	}{
		{up, "cooling.drop=1kPa,2kPa", `cooling.drop: not used with source = "ram"`},
		{fixedPath, "cooling.idle_speed=1500rpm,1700rpm", "cooling.idle_speed: not used with engine_speed"},
		{up, "ride.head_metal=1kg,2kg", "ride.head_metal plays no part in a steady estimate"},
		{up, "uncertainty.pressure_recovery=0.1,0.2", "which a sweep does not draw"},
		{fan, "air.pressure_recovery=0.3,0.6", "air.pressure_recovery plays no part"},
	} {
		_, errs, code := run(t, "sweep", c.design, "--vary", c.vary, "-f", "csv", "-q")
		if code != ExitUsage || !strings.Contains(errs, c.frag) {
			t.Errorf("--vary %s: exit %d, want %d with %q: %s", c.vary, code, ExitUsage, c.frag, errs)
		}
	}
	if _, errs, code := run(t, "sweep", fixedPath, "--vary", "cooling.engine_speed=4000rpm,6000rpm", "-f", "csv", "-q"); code != 0 {
		t.Errorf("a key the design uses was refused: exit %d %s", code, errs)
	}
	for _, units := range []string{"metric", "us"} {
		out, errs, code := run(t, "sweep", fan, "--vary", "cooling.rated_speed=6000rpm,9000rpm", "-f", "csv", "-u", units, "-q", "--workers", "1")
		if code != 0 {
			t.Fatalf("exit %d %s", code, errs)
		}
		lines := strings.Split(strings.TrimSpace(out), "\n")
		if !strings.HasPrefix(lines[0], "index,cooling.rated_speed (rpm),") || len(lines) != 3 {
			t.Fatalf("%s: header %q, %d lines", units, lines[0], len(lines))
		}
		for i, want := range []string{"6000", "9000"} {
			if f := strings.Split(lines[i+1], ","); f[1] != want {
				t.Errorf("%s: row %d gives %s rpm, want %s", units, i+1, f[1], want)
			}
		}
	}
}

// longNumber finds a number with more than 4 decimals or more than 7
// significant digits, standing alone (not part of a word or a path).
var longNumber = regexp.MustCompile(`(?:^|[^\w./-])(-?[0-9]+(?:\.[0-9]+)?)(?:[eE][-+]?[0-9]+)?(?:$|[^\w])`)

// tooPrecise returns the numbers of line printed past what a reader uses:
// more than 4 decimals or 7 significant digits.
func tooPrecise(line string) []string {
	var bad []string
	for _, m := range longNumber.FindAllStringSubmatch(line, -1) {
		num := strings.TrimPrefix(m[1], "-")
		intPart, frac, _ := strings.Cut(num, ".")
		digits := strings.TrimLeft(intPart+frac, "0")
		if len(frac) > 4 || len(digits) > 7 {
			bad = append(bad, m[1])
		}
	}
	return bad
}

// Messages and summaries (standard error, the notes and tables of the
// table format, the sweep's summary beside CSV rows) print numbers at the
// precision shown, never full float precision, whatever the format of the
// data rows and in both unit systems: the main commands on the demo
// designs, hot enough to warn. CSV and JSON rows keep full precision.
func TestMessagesRoundNumbers(t *testing.T) {
	up, lo := designs(t)
	dir := filepath.Dir(up)
	if got := tooPrecise("the head runs at 292.60733996597105 C, 119.99999999987999 km/h; 12345678 W"); len(got) != 3 {
		t.Fatalf("the check misses long numbers: %q", got)
	}
	if got := tooPrecise("seed 1, 1000 samples, 220.5 C, 0.0351, 1.5e-3, upright.toml, x2.5"); len(got) != 0 {
		t.Fatalf("the check flags short numbers: %q", got)
	}
	hot := []string{"--speed", "150 km/h", "--ambient", "45 C"}
	cmds := [][]string{
		append([]string{"estimate", up, "--samples", "100"}, hot...),
		append([]string{"compare", up, lo, "--samples", "0"}, hot...),
		{"sweep", up, "--vary", "head.pitch=7mm:11mm:2mm", "--vary", "air.speed=20mph:80mph:30mph", "--workers", "1"},
		{"speeds", up, "--to", "160 km/h", "--samples", "0", "--ambient", "45 C"},
	}
	for _, c := range cmds {
		for _, f := range []string{"table", "csv", "json"} {
			for _, units := range []string{"metric", "us"} {
				args := append(append([]string{}, c...), "-f", f, "-u", units)
				out, errs, code := run(t, args...)
				if code != 0 {
					t.Fatalf("%q: exit %d %s", args, code, errs)
				}
				if f == "csv" && c[0] == "estimate" && !strings.Contains(errs, "runs at") {
					t.Errorf("%q: no warning to check: %s", args, errs)
				}
				text := errs
				if f == "table" {
					text += out
				}
				for _, l := range strings.Split(strings.ReplaceAll(text, dir, "DIR"), "\n") {
					if bad := tooPrecise(l); len(bad) > 0 {
						t.Errorf("%s %s -u %s: %q in: %s", c[0], f, units, bad, l)
					}
				}
			}
		}
	}
}

// In US units a speed range left to its defaults runs in round mph (it
// came out as 0, 6, 12, 19 mph: 10 km/h steps); a flag the user gave is
// kept, and metric units keep the metric defaults.
func TestUSRoadRange(t *testing.T) {
	c := &cobra.Command{}
	var from, to, step string
	c.Flags().StringVar(&from, "from", "0 km/h", "")
	c.Flags().StringVar(&to, "to", "140 km/h", "")
	c.Flags().StringVar(&step, "step", "10 km/h", "")
	if err := c.Flags().Parse([]string{"--to", "100 km/h"}); err != nil {
		t.Fatal(err)
	}
	if f, tt, s := usRoadRange(c, "us", from, to, step, "5 mph"); f != "0 mph" || tt != "100 km/h" || s != "5 mph" {
		t.Errorf("us: %s to %s by %s", f, tt, s)
	}
	if f, tt, s := usRoadRange(c, "metric", from, to, step, "5 mph"); f != "0 km/h" || tt != "100 km/h" || s != "10 km/h" {
		t.Errorf("metric: %s to %s by %s", f, tt, s)
	}
}
