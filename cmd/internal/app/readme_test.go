package app

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
)

// The README's fan paragraph is the tool's output: each figure it gives for
// the demo scooter at 60 km/h and at idle is read from the JSON of an
// estimate and printed at the README's precision (issue 21: a hand-copied
// "57 Pa of shroud loss" stood where the tool computed 214.6 Pa).
func TestReadmeFanFigures(t *testing.T) {
	b, err := os.ReadFile("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	readme := string(b)
	p := filepath.Join(t.TempDir(), "scooter.toml")
	if err := os.WriteFile(p, demo.ScooterFan, 0o644); err != nil {
		t.Fatal(err)
	}
	type fanJSON struct {
		Speed   float64 `json:"speed_rev_s"`
		Flow    float64 `json:"flow_m3_s"`
		Press   float64 `json:"pressure_Pa"`
		Shroud  float64 `json:"shroud_loss_Pa"`
		Drop    float64 `json:"drop_Pa"`
		Power   float64 `json:"shaft_power_W"`
		Warming float64 `json:"inlet_warming_K"`
	}
	at := func(speed string) (fanJSON, float64) {
		var v struct {
			Result struct {
				Head struct {
					Wall float64 `json:"wall_temperature_K"`
				} `json:"head"`
				Supply struct {
					Fan fanJSON `json:"fan"`
				} `json:"supply"`
			} `json:"result"`
		}
		runJSON(t, &v, "estimate", p, "--speed", speed)
		return v.Result.Supply.Fan, v.Result.Head.Wall - 273.15
	}
	f, head := at("60 km/h")
	for _, want := range []string{
		fmt.Sprintf("the fan turns at %.0f rpm and passes %.3f m3/s at %.0f Pa (%.0f Pa across the fins after %.0f Pa of shroud loss", f.Speed*60, f.Flow, f.Press, f.Drop, f.Shroud),
		fmt.Sprintf("costing %.0f W of shaft power, which warms the air it moves by %.2f K before the fins; the head runs at %.0f C", f.Power, f.Warming, head),
	} {
		if !strings.Contains(readme, want) {
			t.Errorf("README should say %q", want)
		}
	}
	f, head = at("0 km/h")
	if want := fmt.Sprintf("Standing at idle the fan still passes %.3f m3/s and holds the head at %.0f C", f.Flow, head); !strings.Contains(readme, want) {
		t.Errorf("README should say %q", want)
	}
}

// The README's figures for the invented 250 cc single (issue "air side
// v3": a head temperature a builder would believe at 100 km/h, with its
// band and each method's figure), for the demo's methods and for the
// 125 cc singles are the tool's own: their estimates now, and (the 250 cc
// single and the demo) at the former default recovery 0.5, printed as the
// README prints them. A change of the physics that moves them fails
// here until the README is brought up to date.
func TestReadmeExample250(t *testing.T) {
	b, err := os.ReadFile("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	readme := string(b)
	src, err := os.ReadFile("../../../testdata/examples/single-250-upright.toml")
	if err != nil {
		t.Fatal(err)
	}
	type methodJSON struct {
		Method string   `json:"method"`
		Head   *float64 `json:"head_wall_temperature_K"`
		Barrel *float64 `json:"barrel_wall_temperature_K"`
	}
	est := func(src []byte) (map[string][2]float64, [2]float64, float64) {
		p := filepath.Join(t.TempDir(), "d.toml")
		if err := os.WriteFile(p, src, 0o644); err != nil {
			t.Fatal(err)
		}
		var v struct {
			Band struct {
				Head struct {
					P5  float64 `json:"p5_K"`
					P95 float64 `json:"p95_K"`
				} `json:"head"`
				Over float64 `json:"head_over_limit_probability"`
			} `json:"band"`
			Result struct {
				Methods []methodJSON `json:"methods"`
			} `json:"result"`
		}
		runJSON(t, &v, "estimate", p)
		m := map[string][2]float64{}
		for _, r := range v.Result.Methods {
			if r.Head != nil && r.Barrel != nil {
				m[r.Method] = [2]float64{*r.Head - 273.15, *r.Barrel - 273.15}
			}
		}
		return m, [2]float64{v.Band.Head.P5 - 273.15, v.Band.Head.P95 - 273.15}, v.Band.Over
	}
	now, band, over := est(src)
	// the former defaults: recovery 0.5, drawn +-0.2 in the band
	old, oldBand, _ := est(design.SetKeys(src, []design.KV{{Key: "air.pressure_recovery", Value: "0.5"}, {Key: "uncertainty.pressure_recovery", Value: "0.2"}}))
	for _, want := range []string{
		fmt.Sprintf("100 km/h on a 35 C day: %.1f C at the head by Gibson (band %.0f to %.0f C, %.0f %% chance over its 250 C limit), %.1f C by Briggs & Young, %.1f C by the channel march; the barrel %.1f C.",
			now["gibson"][0], band[0], band[1], 100*over, now["briggs-young"][0], now["channel"][0], now["gibson"][1]),
		fmt.Sprintf("It was %.1f C (band %.0f to %.0f C), %.1f C and %.1f C at the former default recovery 0.5",
			old["gibson"][0], oldBand[0], oldBand[1], old["briggs-young"][0], old["channel"][0]),
		fmt.Sprintf("so the head runs %.0f K above the barrel", now["gibson"][0]-now["gibson"][1]),
	} {
		if !strings.Contains(readme, want) {
			t.Errorf("README lacks %q", want)
		}
	}
	// the demo's and the 125 cc single's figures by each method, now and
	// (the demo) at the former default recovery 0.5
	up, lo := designs(t)
	methods := func(path, rec string) map[string][2]float64 {
		src, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if rec != "" {
			src = design.SetKeys(src, []design.KV{{Key: "air.pressure_recovery", Value: rec}})
		}
		m, _, _ := est(src)
		return m
	}
	du, dl, ou, ol := methods(up, ""), methods(lo, ""), methods(up, "0.5"), methods(lo, "0.5")
	su, sl := methods("../../../testdata/examples/single-125-upright.toml", ""), methods("../../../testdata/examples/single-125-laid-over.toml", "")
	for _, want := range []string{
		fmt.Sprintf("On the demo at 90 km/h the upright head is %.1f C by Gibson, %.1f C by Briggs & Young and %.1f C by the channel march; laid over, %.1f C by Gibson and %.1f C by the channel march (at the former default recovery 0.5: %.1f, %.1f, %.1f; %.1f and %.1f C).",
			du["gibson"][0], du["briggs-young"][0], du["channel"][0], dl["gibson"][0], dl["channel"][0], ou["gibson"][0], ou["briggs-young"][0], ou["channel"][0], ol["gibson"][0], ol["channel"][0]),
		fmt.Sprintf("upright %.1f C by Gibson, %.1f C by Briggs & Young, %.1f C by the channel march; laid over with 39 longitudinal fins a set, %.1f C by Gibson and %.1f C by the channel march",
			su["gibson"][0], su["briggs-young"][0], su["channel"][0], sl["gibson"][0], sl["channel"][0]),
	} {
		if !strings.Contains(strings.Join(strings.Fields(readme), " "), want) {
			t.Errorf("README lacks %q", want)
		}
	}
	// a builder's belief, in the words: at 100 km/h on a 35 C day
	// the head of an ordinary 250 cc single is no runaway, and sits below
	// the 250 C an aluminium head is held to (common practice)
	if h := now["gibson"][0]; !(h > 150 && h < 250) {
		t.Errorf("the 250 cc head at 100 km/h: %.1f C", h)
	}
}

// The README's prose figures of the demo's ride, speeds and march are the
// tool's own (a newcomer found them left behind by a change of the
// physics): the upright head's peak on the mountain-pass grade and at the
// ride's end, the road speed at which each demo head passes its 220 C
// limit (to 1 km/h, by linear interpolation on a 1 km/h sweep), and the
// air leaving the laid-over head fins in the channel march.
func TestReadmeProseFigures(t *testing.T) {
	b, err := os.ReadFile("../../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	readme := strings.Join(strings.Fields(string(b)), " ")
	up, lo := designs(t)
	var ride struct {
		Samples []struct {
			Grade float64 `json:"grade_percent"`
			Head  float64 `json:"head_wall_temperature_K"`
		} `json:"samples"`
	}
	runJSON(t, &ride, "ride", up, "--profile", "mountain-pass")
	grade := 0.0
	for _, s := range ride.Samples {
		if s.Grade > 0 {
			grade = max(grade, s.Head-273.15)
		}
	}
	end := ride.Samples[len(ride.Samples)-1].Head - 273.15
	crossing := func(path string) float64 {
		var v struct {
			Rows []struct {
				Speed float64 `json:"speed_m_s"`
				Head  struct {
					Wall float64 `json:"wall_temperature_K"`
				} `json:"head"`
			} `json:"rows"`
		}
		runJSON(t, &v, "speeds", path, "--from", "80 km/h", "--to", "140 km/h", "--step", "1 km/h", "--samples", "0")
		lim := 220 + 273.15
		for i := 1; i < len(v.Rows); i++ {
			a, b := v.Rows[i-1], v.Rows[i]
			if a.Head.Wall < lim && b.Head.Wall >= lim {
				return 3.6 * (a.Speed + (b.Speed-a.Speed)*(lim-a.Head.Wall)/(b.Head.Wall-a.Head.Wall))
			}
		}
		t.Fatalf("%s: the head does not pass 220 C between 80 and 140 km/h", path)
		return 0
	}
	var m struct {
		Head struct {
			Out float64 `json:"air_outlet_K"`
		} `json:"head"`
	}
	runJSON(t, &m, "march", lo)
	src, err := os.ReadFile(up)
	if err != nil {
		t.Fatal(err)
	}
	var heads []any
	for _, r := range []string{"0.3", "0.5", "0.8", "1"} {
		p := filepath.Join(t.TempDir(), "r.toml")
		if err := os.WriteFile(p, design.SetKeys(src, []design.KV{{Key: "air.pressure_recovery", Value: r}}), 0o644); err != nil {
			t.Fatal(err)
		}
		w, _, _ := headAt(t, p, "90 km/h", "35 C", 0)
		heads = append(heads, w-273.15, r)
	}
	var est struct {
		Sens []struct {
			Input string     `json:"input"`
			Head  [2]float64 `json:"head_K"`
		} `json:"sensitivity"`
	}
	runJSON(t, &est, "estimate", up)
	if len(est.Sens) < 5 {
		t.Fatalf("sensitivity: %+v", est.Sens)
	}
	sw := func(i int) float64 { return math.Abs(est.Sens[i].Head[1] - est.Sens[i].Head[0]) }
	if math.Round(sw(2)) != math.Round(sw(3)) {
		t.Errorf("the README gives the head share and the thermal efficiency one swing (%.0f K each); now %.1f and %.1f K", math.Round(sw(2)), sw(2), sw(3))
	}
	if est.Sens[0].Input != "forced convection" || est.Sens[1].Input != "cooling share" || est.Sens[4].Input != "pressure recovery" {
		t.Errorf("the demo's sensitivity order changed: %+v", est.Sens)
	}
	for _, want := range []string{
		fmt.Sprintf("(on the demo's head: the forced-convection scatter, %.0f K across +-25 %%, then the cooling share, %.0f K across +-20 %%, the head share and the thermal efficiency, %.0f K each, the pressure recovery, %.0f K across 0.5 to 1)", sw(0), sw(1), sw(2), sw(4)),
		fmt.Sprintf("(the demo's head: %.1f C at %s, %.1f C at %s, %.1f C at %s, %.1f C at %s)", heads...),
		fmt.Sprintf("On the demo the head climbs to about %.0f C on the grade", grade),
		fmt.Sprintf("(%.1f C at the end of the ride)", end),
		fmt.Sprintf("from about %.0f km/h (laid over) and %.0f km/h (upright) the head passes its 220 C limit", crossing(lo), crossing(up)),
		fmt.Sprintf("the air leaves the head fins at about %.0f C", m.Head.Out-273.15),
	} {
		if !strings.Contains(readme, want) {
			t.Errorf("README lacks %q", want)
		}
	}
}
