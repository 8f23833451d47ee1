package app

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
	"finmarch/fins"
)

// The optimiser keeps every casting limit and every bound, and its optimum
// is no worse than the best point of a fine grid (9 levels on each free
// variable) over the same bounds with the same limits.
func TestOptimiserAgainstFineGrid(t *testing.T) {
	up, _ := designs(t)
	for _, goal := range []string{"cool", "light"} {
		args := []string{"optimise", up, "-f", "json", "--goal", goal, "--process", "permanent-mould",
			"--pitch", "8mm:12mm", "--height", "30mm:50mm", "--root-thickness", "3mm:5mm", "--tip-thickness", "2mm:2mm", "--count", "7:7"}
		if goal == "light" {
			args = append(args, "--limit", "205 C")
		}
		out, errs, code := run(t, args...)
		if code != 0 {
			t.Fatalf("%s: exit %d: %s", goal, code, errs)
		}
		var v struct {
			Optimum struct {
				Pitch  float64 `json:"pitch_m"`
				Height float64 `json:"height_m"`
				Root   float64 `json:"root_thickness_m"`
				Tip    float64 `json:"tip_thickness_m"`
				Count  int     `json:"count"`
				Wall   float64 `json:"wall_temperature_K"`
				Mass   float64 `json:"fin_mass_kg"`
			} `json:"optimum"`
		}
		if err := json.Unmarshal([]byte(out), &v); err != nil {
			t.Fatal(err)
		}
		o := v.Optimum
		p, _ := fins.LookupProcess("permanent-mould")
		d, _ := design.Parse(demo.Upright, "u.toml")
		s := d.Case.Head.Set
		s.Pitch, s.Height, s.RootThickness, s.TipThickness, s.Count = o.Pitch, o.Height, o.Root, o.Tip, o.Count
		if !p.Feasible(s) {
			t.Errorf("%s: optimum breaks a casting limit: %+v", goal, p.Check(s))
		}
		if o.Pitch < 0.008-1e-12 || o.Pitch > 0.012+1e-12 || o.Height < 0.03-1e-12 || o.Height > 0.05+1e-12 || o.Root < 0.003-1e-12 || o.Root > 0.005+1e-12 || o.Count != 7 || math.Abs(o.Tip-0.002) > 1e-12 {
			t.Errorf("%s: optimum outside the bounds: %+v", goal, o)
		}
		limit := 205 + 273.15
		if goal == "light" && o.Wall > limit+1e-6 {
			t.Errorf("light: wall %.3f K above the limit", o.Wall)
		}
		// the fine grid
		best := math.Inf(1)
		for i := 0; i < 9; i++ {
			for j := 0; j < 9; j++ {
				for k := 0; k < 9; k++ {
					q := s
					q.Pitch, q.Height, q.RootThickness = 0.008+0.004*float64(i)/8, 0.03+0.02*float64(j)/8, 0.003+0.002*float64(k)/8
					if !p.Feasible(q) {
						continue
					}
					vd, err := d.With(map[string]float64{"head.pitch": q.Pitch, "head.height": q.Height, "head.root_thickness": q.RootThickness, "head.tip_thickness": 0.002, "head.count": 7})
					if err != nil {
						continue
					}
					r, err := evaluate(vd, vd.Case.Speed)
					if err != nil || r.NoEquilibrium != nil {
						continue
					}
					f := r.Result.Head.WallTemp
					if goal == "light" {
						if f > limit {
							continue
						}
						f = r.Result.Head.FinMass
					}
					best = math.Min(best, f)
				}
			}
		}
		got := o.Wall
		if goal == "light" {
			got = o.Mass
		}
		if math.IsInf(best, 1) {
			t.Fatalf("%s: the fine grid found no feasible point", goal)
		}
		if got > best+1e-9 {
			t.Errorf("%s: optimum %.6f is worse than the fine grid's %.6f", goal, got, best)
		}
		t.Logf("%s: optimum %.5f, fine grid %.5f", goal, got, best)
	}
}

// --speed and --ambient move the operating point: the design as drawn is
// then evaluated there too (its wall equals a one-point sweep at that
// speed and ambient), and the JSON says where it optimised.
func TestOptimiseOperatingPoint(t *testing.T) {
	up, _ := designs(t)
	js, errs, code := run(t, "optimise", up, "--speed", "60 km/h", "--ambient", "30 C", "--levels", "3", "-f", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var o struct {
		Speed      float64 `json:"speed_m_s"`
		Ambient    float64 `json:"ambient_K"`
		AsDesigned struct {
			Wall float64 `json:"wall_temperature_K"`
		} `json:"as_designed"`
	}
	if err := json.Unmarshal([]byte(js), &o); err != nil {
		t.Fatal(err)
	}
	if math.Abs(o.Speed-60/3.6) > 1e-9 || math.Abs(o.Ambient-303.15) > 1e-9 {
		t.Errorf("optimised at %g m/s, %g K", o.Speed, o.Ambient)
	}
	sw, errs, code := run(t, "sweep", up, "--vary", "air.speed=60km/h", "--vary", "air.ambient=30C", "-f", "json", "-q")
	if code != 0 {
		t.Fatalf("sweep exit %d: %s", code, errs)
	}
	var row struct {
		Head float64 `json:"head_wall_temperature_K"`
	}
	if err := json.Unmarshal([]byte(strings.SplitN(sw, "\n", 2)[0]), &row); err != nil {
		t.Fatal(err)
	}
	if math.Abs(row.Head-o.AsDesigned.Wall) > 1e-9 {
		t.Errorf("design as drawn at 60 km/h, 30 C: optimise says %.6f K, sweep %.6f K", o.AsDesigned.Wall, row.Head)
	}
	if _, errs, code := run(t, "optimise", up, "--speed", "900 km/h"); code != ExitUsage || !strings.Contains(errs, "air.speed") {
		t.Errorf("900 km/h: exit %d, %s", code, errs)
	}
}

// A limit no design reaches: exit 1 with how close the search came and,
// on the laid-over cylinder's series path, the other set's part in it.
func TestOptimiseUnreachableLimit(t *testing.T) {
	_, lo := designs(t)
	_, errs, code := run(t, "optimise", lo, "--goal", "light", "--limit", "150 C", "--levels", "3")
	if code != ExitModel || !strings.Contains(errs, "the coolest it found runs at") || !strings.Contains(errs, "in series here, so the barrel fins") {
		t.Errorf("exit %d: %s", code, errs)
	}
}

// On a series path the head fins change the air the barrel gets: the
// optimiser keeps the barrel at or below its limit as well (here a tight
// 150 C, which the coolest head alone would break: 160 C).
func TestOptimiseSeriesKeepsOtherLimit(t *testing.T) {
	dir := t.TempDir()
	src := strings.Replace(string(demo.LaidOver), "[limits]", "[limits]\nbarrel = \"150 C\"", 1)
	path := filepath.Join(dir, "tight.toml")
	if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	js, errs, code := run(t, "optimise", path, "--goal", "cool", "--levels", "3", "-f", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var o struct {
		Optimum struct {
			Wall  float64 `json:"wall_temperature_K"`
			Other float64 `json:"other_set_wall_K"`
		} `json:"optimum"`
	}
	if err := json.Unmarshal([]byte(js), &o); err != nil {
		t.Fatal(err)
	}
	if o.Optimum.Other > 150+273.15+1e-6 {
		t.Errorf("barrel at %.2f C over its 150 C limit (head %.2f C)", o.Optimum.Other-273.15, o.Optimum.Wall-273.15)
	}
}

// --set both varies head and barrel fins together. On the laid-over demo,
// with every variable but the two pitches held (the bounds flags apply to
// both sets), the optimum keeps the casting limits and the barrel's limit
// on both sets and is no worse than the best point of a 17 x 17 grid of
// head pitch by barrel pitch over the same bounds.
func TestOptimiseBothAgainstFineGrid(t *testing.T) {
	_, lo := designs(t)
	out, errs, code := run(t, "optimise", lo, "--set", "both", "--goal", "cool", "-f", "json",
		"--pitch", "8mm:12mm", "--height", "30mm:30mm", "--root-thickness", "3.5mm:3.5mm", "--tip-thickness", "2mm:2mm", "--count", "22:22")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	type setJ struct {
		Pitch float64 `json:"pitch_m"`
		Count int     `json:"count"`
	}
	var v struct {
		Optimum struct {
			Head, Barrel setJ
			HeadWall     float64 `json:"head_wall_K"`
			BarrelWall   float64 `json:"barrel_wall_K"`
		} `json:"optimum"`
	}
	if err := json.Unmarshal([]byte(out), &v); err != nil {
		t.Fatal(err)
	}
	o := v.Optimum
	d, _ := design.Parse(demo.LaidOver, "l.toml")
	p, _ := fins.LookupProcess("permanent-mould")
	vals := func(hp, bp float64) map[string]float64 {
		m := map[string]float64{"head.pitch": hp, "barrel.pitch": bp}
		for _, s := range []string{"head", "barrel"} {
			m[s+".height"], m[s+".root_thickness"], m[s+".tip_thickness"], m[s+".count"] = 0.03, 0.0035, 0.002, 22
		}
		return m
	}
	for _, q := range []struct {
		name string
		s    fins.Set
		p    float64
	}{{"head", d.Case.Head.Set, o.Head.Pitch}, {"barrel", d.Case.Barrel.Set, o.Barrel.Pitch}} {
		s := q.s
		s.Pitch, s.Height, s.RootThickness, s.TipThickness, s.Count = q.p, 0.03, 0.0035, 0.002, 22
		if !p.Feasible(s) || q.p < 0.008-1e-12 || q.p > 0.012+1e-12 {
			t.Errorf("%s at %.5f m pitch: outside the bounds or the casting limits %+v", q.name, q.p, p.Check(s))
		}
	}
	if o.BarrelWall > d.BarrelLimit+1e-6 {
		t.Errorf("barrel %.2f K over its limit", o.BarrelWall)
	}
	best, bx := math.Inf(1), [2]float64{}
	for i := 0; i <= 16; i++ {
		for j := 0; j <= 16; j++ {
			hp, bp := 0.008+0.004*float64(i)/16, 0.008+0.004*float64(j)/16
			vd, err := d.With(vals(hp, bp))
			if err != nil {
				continue
			}
			r, err := evaluate(vd, vd.Case.Speed)
			if err != nil || r.NoEquilibrium != nil || r.Result.Barrel.WallTemp > d.BarrelLimit {
				continue
			}
			if r.Result.Head.WallTemp < best {
				best, bx = r.Result.Head.WallTemp, [2]float64{hp, bp}
			}
		}
	}
	if o.HeadWall > best+1e-6 {
		t.Errorf("optimum head %.3f K at pitches %.5f/%.5f m; the grid has %.3f K at %.5f/%.5f m", o.HeadWall, o.Head.Pitch, o.Barrel.Pitch, best, bx[0], bx[1])
	}
	// ten variables at five levels is too big a grid
	if _, errs, code := run(t, "optimise", lo, "--set", "both", "--levels", "5"); code != ExitUsage || !strings.Contains(errs, "at most 2 million") {
		t.Errorf("--levels 5: exit %d, %s", code, errs)
	}
}
