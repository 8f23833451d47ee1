package app

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// The command line and the file layer against hostile input: each case
// runs the real command and checks the exit code (never 6, the bug code,
// for a user's mistake), a fragment of the message naming the flag, key
// or path, and what it must not change. Device nodes, FIFOs and links are
// made in a temporary folder.
func TestHostileCommandLine(t *testing.T) {
	up, _ := designs(t)
	dir := filepath.Dir(up)
	fifo := filepath.Join(dir, "pipe")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	sub := filepath.Join(dir, "sub")
	if err := os.Mkdir(sub, 0o755); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.toml")
	if err := os.Symlink(up, link); err != nil {
		t.Fatal(err)
	}
	dangling := filepath.Join(dir, "dangling")
	if err := os.Symlink(filepath.Join(dir, "nowhere"), dangling); err != nil {
		t.Fatal(err)
	}
	before, _ := os.ReadFile(up)
	cases := []struct {
		name string
		args []string
		code int
		frag string
	}{
		{"segments negative", []string{"--segments", "-5"}, ExitUsage, "--segments -5: allowed 1 to 10000"},
		{"segments zero", []string{"--segments", "0"}, ExitUsage, "--segments 0"},
		{"negative speed on the demo", []string{"demo", "--speed", "-10 km/h"}, ExitUsage, `--speed "-10 km/h"`},
		{"altitude on the report's demo", []string{"report", "--altitude", "20 km", "-o", filepath.Join(dir, "r.html")}, ExitUsage, `--altitude "20 km"`},
		{"limit typo", []string{"optimise", up, "--goal", "light", "--limit", "2200 C"}, ExitUsage, "limits.head: 2200 C is outside the allowed range"},
		{"limit below zero", []string{"optimise", up, "--goal", "light", "--limit", "-300 C"}, ExitUsage, `--limit "-300 C"`},
		{"duplicate vary", []string{"sweep", up, "--vary", "head.pitch=6mm:8mm:2mm", "--vary", "head.pitch=10mm,12mm"}, ExitUsage, "--vary head.pitch is given twice"},
		{"huge worker count", []string{"sweep", up, "--vary", "head.pitch=6mm:8mm:2mm", "--workers", "1000000000"}, ExitUsage, "--workers 1000000000"},
		{"negative worker count", []string{"sweep", up, "--vary", "head.pitch=6mm:8mm:2mm", "--workers", "-3"}, ExitUsage, "--workers -3"},
		{"speed range past the design's", []string{"speeds", up, "--from", "0 km/h", "--to", "900 km/h", "--step", "100 km/h"}, ExitUsage, "--to 900 km/h: allowed 0 to 400 km/h"},
		{"tiny conductivity", []string{"fin", "--height", "30mm", "--root-thickness", "4mm", "--h", "60 W/m2K", "--k", "1e-200 W/mK", "-f", "json"}, ExitUsage, "--k 1e-200 W/mK: allowed 1 to 500"},
		{"output onto the design", []string{"estimate", up, "-o", up, "--force"}, ExitIO, "is the input file"},
		{"output onto a link to the design", []string{"estimate", up, "-o", link, "--force"}, ExitIO, "is the input file"},
		{"output onto a directory", []string{"estimate", up, "-o", sub, "--force"}, ExitIO, "is a directory"},
		{"output onto a dangling link", []string{"estimate", up, "-o", dangling}, ExitIO, "a link to nothing"},
		{"output into a FIFO with no reader", []string{"estimate", up, "-o", fifo}, ExitIO, "cannot write " + fifo},
		{"design is a FIFO", []string{"estimate", fifo}, ExitIO, "a FIFO, not a regular file"},
		{"design is a directory", []string{"estimate", sub}, ExitIO, "a directory, not a regular file"},
		{"design is a character device", []string{"estimate", "/dev/zero"}, ExitIO, "a character device, not a regular file"},
		{"missing design", []string{"estimate", filepath.Join(dir, "none.toml")}, ExitIO, "cannot read the design"},
	}
	if _, err := os.Stat("/dev/full"); err == nil {
		cases = append(cases,
			struct {
				name string
				args []string
				code int
				frag string
			}{"full device", []string{"estimate", up, "-o", "/dev/full"}, ExitIO, "no space left"},
			struct {
				name string
				args []string
				code int
				frag string
			}{"full device, sweep table", []string{"sweep", up, "--vary", "head.pitch=6mm:8mm:2mm", "-o", "/dev/full"}, ExitIO, "no space left"})
	}
	for _, c := range cases {
		done := make(chan struct{})
		var errs string
		var code int
		go func() {
			_, errs, code = run(t, c.args...)
			close(done)
		}()
		select {
		case <-done:
		case <-time.After(20 * time.Second):
			t.Fatalf("%s: hangs", c.name)
		}
		if code != c.code || !strings.Contains(errs, c.frag) {
			t.Errorf("%s: exit %d (want %d), message %q lacks %q", c.name, code, c.code, errs, c.frag)
		}
	}
	if after, _ := os.ReadFile(up); string(after) != string(before) {
		t.Error("the design file was changed")
	}
	if fi, err := os.Lstat(fifo); err != nil || fi.Mode()&os.ModeNamedPipe == 0 {
		t.Error("the FIFO was replaced")
	}
	if fi, err := os.Lstat(link); err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Error("the link was replaced")
	}
}

// Streams and modes: /dev/null and - take the output as a stream and stay
// what they are; a replaced file keeps its mode; a new one gets 0666 less
// the umask (022 in tests: 0644).
func TestOutputStreamsAndModes(t *testing.T) {
	up, _ := designs(t)
	dir := filepath.Dir(up)
	for _, o := range []string{"/dev/null", "-"} {
		if out, errs, code := run(t, "estimate", up, "-o", o, "--force", "-q"); code != 0 {
			t.Fatalf("-o %s: exit %d %s", o, code, errs)
		} else if o == "-" && !strings.Contains(out, "Heat balance") {
			t.Errorf("-o - wrote nothing to standard output")
		}
	}
	if fi, err := os.Stat("/dev/null"); err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		t.Fatal("/dev/null is no longer a device")
	}
	old := syscall.Umask(0o022)
	defer syscall.Umask(old)
	out := filepath.Join(dir, "out.txt")
	if _, errs, code := run(t, "estimate", up, "-o", out, "-q"); code != 0 {
		t.Fatal(errs)
	}
	if fi, _ := os.Stat(out); fi.Mode().Perm() != 0o644 {
		t.Errorf("new file mode %o, want 644", fi.Mode().Perm())
	}
	if err := os.Chmod(out, 0o600); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "estimate", up, "-o", out, "--force", "-q"); code != 0 {
		t.Fatal(errs)
	}
	if fi, _ := os.Stat(out); fi.Mode().Perm() != 0o600 {
		t.Errorf("replaced file mode %o, want 600 kept", fi.Mode().Perm())
	}
	// a name of 245 characters: the temporary name beside it stays short
	long := filepath.Join(dir, strings.Repeat("n", 241)+".txt")
	if _, errs, code := run(t, "estimate", up, "-o", long, "-q"); code != 0 {
		t.Errorf("a 245-character name: exit %d %s", code, errs)
	}
	if names, _ := filepath.Glob(filepath.Join(dir, ".finmarch-*")); len(names) != 0 {
		t.Errorf("temporary files left: %v", names)
	}
}

// Signals: SIGTERM during a long sweep to a file leaves the earlier file as
// it was and no temporary file; after SIGKILL (which nothing can catch) the
// next run removes the dead run's temporary file once it is a minute old.
func TestSignalsLeaveNoPartialFile(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the command")
	}
	up, _ := designs(t)
	dir := filepath.Dir(up)
	bin := filepath.Join(t.TempDir(), "finmarch")
	if out, err := exec.Command("go", "build", "-o", bin, "finmarch/cmd/finmarch").CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	target := filepath.Join(dir, "big.csv")
	if err := os.WriteFile(target, []byte("earlier\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	long := []string{"sweep", up, "--vary", "head.pitch=5mm:14.99mm:0.01mm", "--vary", "air.speed=30km/h:129km/h:1km/h",
		"-f", "csv", "-o", target, "--force", "-q"}
	temps := func() []string {
		n, _ := filepath.Glob(filepath.Join(dir, ".finmarch-*.tmp"))
		return n
	}
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT, syscall.SIGKILL} {
		cmd := exec.Command(bin, long...)
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		deadline := time.Now().Add(10 * time.Second)
		for len(temps()) == 0 && time.Now().Before(deadline) {
			time.Sleep(20 * time.Millisecond)
		}
		if len(temps()) == 0 {
			t.Fatalf("%v: the sweep made no temporary file", sig)
		}
		_ = cmd.Process.Signal(sig)
		_ = cmd.Wait()
		if b, _ := os.ReadFile(target); string(b) != "earlier\n" {
			t.Errorf("%v: the earlier file changed", sig)
		}
		left := temps()
		if sig != syscall.SIGKILL {
			if len(left) != 0 {
				t.Errorf("%v left %v", sig, left)
			}
			continue
		}
		if len(left) != 1 {
			t.Fatalf("after SIGKILL: %v", left)
		}
		old := time.Now().Add(-2 * time.Minute)
		_ = os.Chtimes(left[0], old, old)
		if out, err := exec.Command(bin, "estimate", up, "-o", filepath.Join(dir, "later.txt"), "-q").CombinedOutput(); err != nil {
			t.Fatalf("later run: %v %s", err, out)
		}
		if l := temps(); len(l) != 0 {
			t.Errorf("a later run left the dead run's file: %v", l)
		}
	}
}

// No output prints the search's cap as a temperature: at 170 km/h the
// upright demo's head finds no equilibrium; the table says so, the JSON has
// null for its wall and margin, and the warning gives the heat shortfall
// instead of "runs at 500 C".
func TestNoEquilibriumNeverACap(t *testing.T) {
	up, _ := designs(t)
	out, errs, code := run(t, "estimate", up, "--speed", "170 km/h")
	if code != ExitModel || !strings.Contains(out, "no equilibrium") || strings.Contains(out, "500.0") ||
		strings.Contains(errs, "runs at 500") || !strings.Contains(errs, "W short") {
		t.Errorf("exit %d\n%s\n%s", code, out, errs)
	}
	js, _, _ := run(t, "estimate", up, "--speed", "170 km/h", "-f", "json")
	var v map[string]any
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	head := v["result"].(map[string]any)["head"].(map[string]any)
	if v["head_margin_K"] != nil || head["wall_temperature_K"] != nil || head["equilibrium"] != false {
		t.Errorf("JSON: margin %v, wall %v, equilibrium %v", v["head_margin_K"], head["wall_temperature_K"], head["equilibrium"])
	}
	for _, args := range [][]string{{"speeds", up, "--from", "150 km/h", "--to", "170 km/h", "--step", "20 km/h"}, {"tilt", up}} {
		out, _, _ := run(t, args...)
		if strings.Contains(out, "500.0") || !strings.Contains(out, "no equilibrium") {
			t.Errorf("%s shows the cap:\n%s", args[0], out)
		}
	}
}

// Castability in the command line: a design that names no process is held
// to permanent-mould's limits, warned with the limit and the value, an
// error under --strict; a sweep marks its rows uncastable.
func TestCastabilityWarnings(t *testing.T) {
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	pm := filepath.Join(filepath.Dir(up), "pm.toml")
	if err := os.WriteFile(pm, []byte(strings.Replace(string(src), `casting = "die-casting"`, "", 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "estimate", pm); code != 0 || !strings.Contains(errs, "casting: head fins: height to root gap 8.0, over the permanent-mould limit 7.0") {
		t.Errorf("exit %d: %s", code, errs)
	}
	if _, errs, code := run(t, "estimate", pm, "--strict"); code != ExitStrict {
		t.Errorf("--strict: exit %d %s", code, errs)
	}
	if _, errs, _ := run(t, "estimate", up); strings.Contains(errs, "casting:") {
		t.Errorf("the die-cast demo warned: %s", errs)
	}
	out, _, _ := run(t, "sweep", pm, "--vary", "head.pitch=8mm,12mm")
	if !strings.Contains(out, "ok, uncastable") && !strings.Contains(out, "marginal, uncastable") && !strings.Contains(out, "LIMIT, uncastable") {
		t.Errorf("no uncastable row:\n%s", out)
	}
}

// The band in the command line: the estimate's JSON carries its
// percentiles (ordered, around the estimate) and chances; --samples 0
// turns it off; a sample count outside its range is refused by name.
func TestBandInTheCommandLine(t *testing.T) {
	up, _ := designs(t)
	js, errs, code := run(t, "estimate", up, "-f", "json", "-q")
	if code != 0 {
		t.Fatal(errs)
	}
	var v map[string]any
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	band, ok := v["band"].(map[string]any)
	if !ok {
		t.Fatalf("no band: %v", v["band"])
	}
	h := band["head"].(map[string]any)
	wall := v["result"].(map[string]any)["head"].(map[string]any)["wall_temperature_K"].(float64)
	p5, p50, p95 := h["p5_K"].(float64), h["p50_K"].(float64), h["p95_K"].(float64)
	if !(p5 < wall && wall < p95 && p5 < p50 && p50 < p95) || band["samples"].(float64) != 1000 {
		t.Errorf("band %v %v %v around %v", p5, p50, p95, wall)
	}
	js, _, _ = run(t, "estimate", up, "-f", "json", "-q", "--samples", "0")
	if strings.Contains(js, `"band"`) || !strings.Contains(js, `"wall_temperature_K"`) {
		t.Error("--samples 0 left a band")
	}
	if _, errs, code := run(t, "estimate", up, "--samples", "5"); code != ExitUsage || !strings.Contains(errs, "--samples 5") {
		t.Errorf("exit %d %s", code, errs)
	}
}

// Calibration through the command line: a plug-seat reading with its
// offset fits the recovery, the written design predicts the measured fin
// root at the measured point (the band narrow around it), the source is
// not touched, and fits the points cannot carry are refused.
func TestCalibrateCommand(t *testing.T) {
	up, _ := designs(t)
	dir := filepath.Dir(up)
	src, _ := os.ReadFile(up)
	meas := string(src) + "\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\nplace = \"plug-seat\"\noffset = \"15 K\"\n"
	in := filepath.Join(dir, "measured.toml")
	if err := os.WriteFile(in, []byte(meas), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "calibrated.toml")
	if _, errs, code := run(t, "calibrate", in, "--write", out, "-q"); code != 0 {
		t.Fatalf("exit %d %s", code, errs)
	}
	if b, _ := os.ReadFile(in); string(b) != meas {
		t.Error("the measured design was changed")
	}
	js, errs, code := run(t, "estimate", out, "--ambient", "28 C", "-f", "json", "-q")
	if code != 0 {
		t.Fatal(errs)
	}
	var v map[string]any
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	wall := v["result"].(map[string]any)["head"].(map[string]any)["wall_temperature_K"].(float64)
	if math.Abs(wall-(204+273.15-15)) > 0.05 {
		t.Errorf("calibrated head %.3f K, measured fin root %.3f K", wall, 204+273.15-15)
	}
	band := v["band"].(map[string]any)["head"].(map[string]any)
	// about four of the point's uncertainties wide: 5 K and half the
	// 15 K offset in quadrature, 9 K (calibrate.OffsetShare)
	if w := band["p95_K"].(float64) - band["p5_K"].(float64); !(w < 4*math.Hypot(5, 7.5)) {
		t.Errorf("a calibrated band %.1f K wide", w)
	}
	if _, errs, code := run(t, "calibrate", in, "--fit", "recovery,forced"); code != ExitModel || !strings.Contains(errs, "cannot identify") {
		t.Errorf("two parameters from one point: exit %d %s", code, errs)
	}
	if _, errs, code := run(t, "calibrate", up); code != ExitDesign || !strings.Contains(errs, "no [[measurement]]") {
		t.Errorf("no measurement: exit %d %s", code, errs)
	}
}

// The README's calibration example ("Anchoring the estimate to a
// measurement") states the figures these commands give: its measurement
// table is taken from the README itself, so the text and the tool cannot
// drift apart.
func TestReadmeCalibrationFigures(t *testing.T) {
	b, err := os.ReadFile("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	readme := string(b)
	i := strings.Index(readme, "## Anchoring the estimate to a measurement")
	j := strings.Index(readme[i:], "```\n[[measurement]]")
	if i < 0 || j < 0 {
		t.Fatal("README lacks the calibration example")
	}
	table := readme[i+j+4:]
	table = table[:strings.Index(table, "```")]
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	dir := t.TempDir()
	in, out := filepath.Join(dir, "up.toml"), filepath.Join(dir, "up-cal.toml")
	if err := os.WriteFile(in, append(src, "\n"+table...), 0o644); err != nil {
		t.Fatal(err)
	}
	js, errs, code := run(t, "calibrate", in, "--write", out, "-f", "json", "-q")
	if code != 0 {
		t.Fatalf("exit %d %s", code, errs)
	}
	var fit struct {
		Parameters []struct {
			Value    float64 `json:"value"`
			StdError float64 `json:"standard_error"`
		}
	}
	if err := json.Unmarshal([]byte(js), &fit); err != nil || len(fit.Parameters) != 1 {
		t.Fatalf("%v %s", err, js)
	}
	p := fit.Parameters[0]
	want := fmt.Sprintf("fits the pressure recovery to %.3f (standard error %.3f)", p.Value, p.StdError)
	if !strings.Contains(readme, want) {
		t.Errorf("README should say %q", want)
	}
	js, errs, code = run(t, "estimate", out, "--ambient", "40 C", "-f", "json", "-q")
	if code != 0 {
		t.Fatal(errs)
	}
	var v map[string]any
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	wall := v["result"].(map[string]any)["head"].(map[string]any)["wall_temperature_K"].(float64) - 273.15
	band := v["band"].(map[string]any)["head"].(map[string]any)
	want = fmt.Sprintf("%.1f C at the fin roots with a band of %.0f to %.0f C", wall, band["p5_K"].(float64)-273.15, band["p95_K"].(float64)-273.15)
	if !strings.Contains(readme, want) {
		t.Errorf("README should say %q", want)
	}
}

// tilt carries each style's head band at every tilt, and the nominal head
// lies inside it wherever both have an equilibrium (the band samples the
// inputs around the nominal values, so a band beside the wrong variant or
// tilt would miss it).
func TestTiltBand(t *testing.T) {
	up, _ := designs(t)
	js, errs, code := run(t, "tilt", up, "--step", "45 deg", "-f", "json", "-q", "--samples", "200")
	if code != 0 {
		t.Fatalf("exit %d %s", code, errs)
	}
	var v struct{ Rows []map[string]any }
	if err := json.Unmarshal([]byte(js), &v); err != nil || len(v.Rows) != 3 {
		t.Fatalf("%v: %d rows", err, len(v.Rows))
	}
	checked := 0
	for _, r := range v.Rows {
		for _, style := range []string{"annular", "longitudinal"} {
			b, ok := r[style+"_band"].(map[string]any)
			if !ok {
				t.Fatalf("tilt %v: no %s band", r["tilt_deg"], style)
			}
			head := r[style].(map[string]any)["head"].(map[string]any)
			p := b["head"].(map[string]any)
			p5, ok5 := p["p5_K"].(float64)
			p95, ok95 := p["p95_K"].(float64)
			if head["equilibrium"] != true || !ok5 {
				continue
			}
			wall := head["wall_temperature_K"].(float64)
			if wall < p5 || (ok95 && wall > p95) {
				t.Errorf("tilt %v %s: head %.1f K outside its band %.1f to %.1f K", r["tilt_deg"], style, wall, p5, p95)
			}
			checked++
		}
	}
	if checked < 3 {
		t.Errorf("only %d bands checked", checked)
	}
}

// calibrate --points reads the same readings from a CSV file as from the
// design's tables (the same fit), refuses to write over it, and names the
// line of a bad row.
func TestCalibratePointsFile(t *testing.T) {
	up, _ := designs(t)
	dir := t.TempDir()
	src, _ := os.ReadFile(up)
	tables := filepath.Join(dir, "tables.toml")
	rows := []string{"90 km/h", "28 C", "204 C"}
	meas := fmt.Sprintf("\n[[measurement]]\nspeed = %q\nambient = %q\nhead = %q\nplace = \"plug-seat\"\noffset = \"15 K\"\n", rows[0], rows[1], rows[2])
	if err := os.WriteFile(tables, append(src, meas...), 0o644); err != nil {
		t.Fatal(err)
	}
	csvPath := filepath.Join(dir, "runs.csv")
	if err := os.WriteFile(csvPath, []byte("# the test road\nspeed,ambient,head (C),place,offset (K)\n90 km/h,28 C,204,plug-seat,15\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	a, errs, code := run(t, "calibrate", tables, "-f", "json", "-q")
	if code != 0 {
		t.Fatal(errs)
	}
	b, errs, code := run(t, "calibrate", up, "--points", csvPath, "-f", "json", "-q")
	if code != 0 {
		t.Fatal(errs)
	}
	if a != b {
		t.Errorf("tables and points file differ:\n%s\n%s", a, b)
	}
	if _, errs, code := run(t, "calibrate", up, "--points", csvPath, "--write", csvPath, "--force"); code != ExitIO || !strings.Contains(errs, "is the input file") {
		t.Errorf("write over the points file: exit %d %s", code, errs)
	}
	if err := os.WriteFile(csvPath, []byte("speed (km/h),ambient (C),head (C)\n90,28,204\n90,28,900\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errs, code := run(t, "calibrate", up, "--points", csvPath); code != ExitDesign || !strings.Contains(errs, "runs.csv:3:") {
		t.Errorf("bad row: exit %d %s", code, errs)
	}
}
