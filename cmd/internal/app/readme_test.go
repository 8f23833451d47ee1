package app

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
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
		js, errs, code := run(t, "estimate", p, "--speed", speed, "-f", "json", "-q")
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errs)
		}
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
		if err := json.Unmarshal([]byte(js), &v); err != nil {
			t.Fatal(err)
		}
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
// band and each method's figure) and for the demo's methods are the tool's
// own: its estimate now, and at the former default recovery 0.5, printed
// as the README prints them. A change of the physics that moves them fails
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
		js, errs, code := run(t, "estimate", p, "-f", "json", "-q")
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errs)
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
		if err := json.Unmarshal([]byte(js), &v); err != nil {
			t.Fatal(err)
		}
		m := map[string][2]float64{}
		for _, r := range v.Result.Methods {
			if r.Head != nil && r.Barrel != nil {
				m[r.Method] = [2]float64{*r.Head - 273.15, *r.Barrel - 273.15}
			}
		}
		return m, [2]float64{v.Band.Head.P5 - 273.15, v.Band.Head.P95 - 273.15}, v.Band.Over
	}
	now, band, over := est(src)
	old, oldBand, _ := est([]byte(strings.Replace(string(src), "[air]\n", "[air]\npressure_recovery = 0.5\n", 1)))
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
	// a builder's belief, in the words: at 100 km/h on a 35 C day
	// the head of an ordinary 250 cc single is no runaway, and sits below
	// the 250 C an aluminium head is held to (common practice)
	if h := now["gibson"][0]; !(h > 150 && h < 250) {
		t.Errorf("the 250 cc head at 100 km/h: %.1f C", h)
	}
}
