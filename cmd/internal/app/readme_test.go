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
