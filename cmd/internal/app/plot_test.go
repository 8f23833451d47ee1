package app

import (
	"bytes"
	"fmt"
	"image/png"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
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
		{"march", []string{"position along the air path (mm)", "air temperature (C)", "local heat flux (kW/m2), cut at", "A head (annular)", "B barrel (longitudinal)"}},
		{"speeds", []string{"road speed (km/h)", "wall temperature at the fin roots (C)", "head limit 220 C", "barrel limit 250 C", "A head", "B barrel"}},
		{"compare", []string{"head temperature (C)", "heat per mass of fin (W/kg)", "limit"}},
		{"ride", []string{"time (min)", "wall temperature at the fin roots (C)", "head limit 220 C", "B barrel", "run-then-jam"}},
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
