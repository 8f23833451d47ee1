package app

import (
	"bytes"
	"image/png"
	"os"
	"path/filepath"
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
		{"speeds", []string{"road speed (km/h)", "wall temperature at the fin roots (C)", "head limit 220 C", "barrel limit 250 C", "B barrel", "B: no equilibrium beyond"}},
		{"compare", []string{"head temperature (C)", "heat per mass of fin (W/kg)", "limit"}},
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
