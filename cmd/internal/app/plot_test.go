package app

import (
	"bytes"
	"fmt"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/plots"
)

// Every figure renders as SVG (with its axis labels, units and legend)
// and as a decodable PNG; --output is required and not overwritten.
func TestPlots(t *testing.T) {
	dir := t.TempDir()
	up, lo := designs(t)
	for _, c := range []struct {
		kind string
		want []string
	}{
		{"march", []string{"position along the air path (mm)", "air temperature (C)", "local heat flux (kW/m2)", "axis cut at", "A: demo single, upright, annular fins; head annular, barrel annular", "B: demo single, laid over, longitudinal fins; head longitudinal, barrel longitudinal", "head", "barrel"}},
		{"speeds", []string{"road speed (km/h)", "wall temperature at the fin roots (C)", "head limit 220 C", "barrel limit 250 C", "A: demo single, upright", "head, 5 % and 95 %", "barrel"}},
		{"compare", []string{"head temperature (C)", "heat per mass of fin (W/kg)", "head limit of each design", "head 5 % to 95 %", "at 90 km/h"}},
		{"ride", []string{"time (min)", "wall temperature at the fin roots (C)", "head limit 220 C", "barrel limit 250 C", "B: demo single, laid over", "run-then-jam"}},
	} {
		svg := filepath.Join(dir, c.kind+".svg")
		if _, errs, code := run(t, "plot", c.kind, up, lo, "-o", svg); code != 0 {
			t.Fatalf("%s: exit %d %s", c.kind, code, errs)
		}
		b, _ := os.ReadFile(svg)
		for _, w := range c.want {
			if !strings.Contains(string(b), w) {
				t.Errorf("%s.svg lacks %q", c.kind, w)
			}
		}
		pngf := filepath.Join(dir, c.kind+".png")
		if _, errs, code := run(t, "plot", c.kind, up, lo, "-o", pngf, "--units", "us"); code != 0 {
			t.Fatalf("%s png: exit %d %s", c.kind, code, errs)
		}
		pb, _ := os.ReadFile(pngf)
		img, err := png.Decode(bytes.NewReader(pb))
		if err != nil || img.Bounds().Dx() < 500 {
			t.Errorf("%s.png: %v", c.kind, err)
		}
		if _, _, code := run(t, "plot", c.kind, up, "-o", svg); code != ExitIO {
			t.Errorf("%s: overwrote without --force (exit %d)", c.kind, code)
		}
	}
	us := filepath.Join(dir, "us.svg")
	run(t, "plot", "speeds", up, "-o", us, "--units", "us")
	b, _ := os.ReadFile(us)
	if !strings.Contains(string(b), "road speed (mph)") || !strings.Contains(string(b), "(F)") {
		t.Error("US units not used in the figure")
	}
	if _, _, code := run(t, "plot", "march", up); code != ExitUsage {
		t.Errorf("no --output: exit %d", code)
	}
	if _, _, code := run(t, "plot", "march", up, "-o", filepath.Join(dir, "x.jpg")); code != ExitUsage {
		t.Errorf("bad extension: exit %d", code)
	}
}

// The layout of each figure and of the report is kept as a golden file:
// the SVG of each plot of the two demo designs, and the report's HTML with
// its date, version and paths masked, so that a change of layout (a
// clipped label, a legend in another order, a lost section) shows in review
// as a diff. The figures are deterministic (TestPlots writes them twice).
func TestFigureAndReportLayout(t *testing.T) {
	dir := t.TempDir()
	up, lo := designs(t)
	for _, kind := range []string{"march", "speeds", "compare", "ride"} {
		var runs [2]string
		for i := range runs {
			p := filepath.Join(dir, fmt.Sprintf("%s-%d.svg", kind, i))
			if _, errs, code := run(t, "plot", kind, up, lo, "-o", p, "-q"); code != 0 {
				t.Fatalf("%s: exit %d %s", kind, code, errs)
			}
			b, _ := os.ReadFile(p)
			runs[i] = string(b)
		}
		if runs[0] != runs[1] {
			t.Errorf("%s: two runs draw different figures", kind)
		}
		golden(t, "plot-"+kind+".svg", runs[0])
	}
	rp := filepath.Join(dir, "report.html")
	if _, errs, code := run(t, "report", up, lo, "-o", rp, "-q"); code != 0 {
		t.Fatalf("report: exit %d %s", code, errs)
	}
	b, _ := os.ReadFile(rp)
	made := regexp.MustCompile(`Written by finmarch [^<]*`)
	golden(t, "report.html", made.ReplaceAllString(string(b), "Written by finmarch VERSION on DATE; command: COMMAND"))
}

// The figures of three designs (the demo upright, laid over and the
// scooter with its fan, as 'finmarch report' draws them) keep every title,
// label and legend entry on the canvas and apart, and no curve, limit or
// grid line crosses the legend; each design and line kind is keyed once
// rather than each line; the head and barrel limits are named; the
// comparison gives each design's own speed (the scooter's 60 km/h is not
// the others' 90).
func TestFiguresOfThreeDesigns(t *testing.T) {
	e := &env{stdout: io.Discard, stderr: io.Discard, opt: &options{segments: -1, samples: -1}, sources: map[string][]byte{}}
	var ds []*design.Design
	for _, f := range []struct {
		src  []byte
		name string
	}{{demo.Upright, "a.toml"}, {demo.LaidOver, "b.toml"}, {demo.ScooterFan, "c.toml"}} {
		d, err := e.parse(f.src, f.name)
		if err != nil {
			t.Fatal(err)
		}
		ds = append(ds, d)
	}
	if ds[0].Case.Speed == ds[2].Case.Speed {
		t.Fatal("the demos no longer run at different speeds; pick designs that do")
	}
	_, segs, _, err := e.rideProfile(reportRide)
	if err != nil {
		t.Fatal(err)
	}
	figs := map[string]func() (*plots.Figure, error){
		"march":   func() (*plots.Figure, error) { return e.marchFigure(ds) },
		"speeds":  func() (*plots.Figure, error) { return e.speedFigure(ds, 0, 140/3.6, 5/3.6) },
		"compare": func() (*plots.Figure, error) { return e.compareFigure(ds) },
		"ride":    func() (*plots.Figure, error) { return e.rideFigure(ds, reportRide, segs, "cold") },
		"fan":     func() (*plots.Figure, error) { return e.fanFigure(ds[2]) },
	}
	for _, kind := range []string{"march", "speeds", "compare", "ride", "fan"} {
		f, err := figs[kind]()
		if err != nil {
			t.Fatalf("%s: %v", kind, err)
		}
		if err := f.Check(); err != nil {
			t.Errorf("%s: %v", kind, err)
		}
		var all []string
		for _, g := range f.Legend() {
			all = append(all, g...)
		}
		legend := strings.Join(all, " | ")
		switch kind {
		case "speeds", "ride":
			if len(all) > 12 {
				t.Errorf("%s: %d legend entries: %s", kind, len(all), legend)
			}
			for _, w := range []string{"A: demo single, upright", "C: demo scooter", "head limit 220 C", "barrel limit 250 C"} {
				if !strings.Contains(legend, w) {
					t.Errorf("%s: the legend lacks %q: %s", kind, w, legend)
				}
			}
		case "compare":
			if strings.Contains(f.Plots[0].Title.Text, "at cruise") {
				t.Errorf("compare: title %q says one cruise for all", f.Plots[0].Title.Text)
			}
			for i, d := range ds {
				w := fmt.Sprintf("%s: %s, at %.0f km/h", letter(i), d.Name, d.Case.Speed*3.6)
				if !strings.Contains(legend, w) {
					t.Errorf("compare: the legend lacks %q: %s", w, legend)
				}
			}
		}
	}
}
