package cylinder

import (
	"errors"
	"math"
	"testing"

	"finmarch/airflow"
	"finmarch/fins/validity"
)

// bruteMarch is an independent march of one path in the plainest form:
// m uniform segments, each at the bulk properties of the air entering it
// (airflow.Properties), its own mean coefficient from ChannelNu at that
// state as the difference of x Nu_m(x) over the segment, the gas heating
// factor of the wall-to-bulk ratio, the fin efficiency straight from the
// set's closed form (no tabulated curve), and the exponential pick-up with
// the cp of the entering air. It returns the outlet air (K) and the heat
// of all paths (W).
func bruteMarch(p *prepared, st *setState, tw, tin float64, m int) (float64, float64) {
	pt := st.pt
	k := st.fs.Alloy.Conductivity(tw)
	perLen := pt.AreaPerPath / pt.Length
	t, q := tin, 0.0
	x0, xn0 := 0.0, 0.0
	for i := 1; i <= m; i++ {
		x := pt.Length * float64(i) / float64(m)
		a := airflow.Properties(t, p.c.Pressure, nil)
		re := st.mdot / pt.FlowArea * pt.Dh / a.Mu
		kh := 1.0
		if re > airflow.ReLaminar {
			kh = airflow.GasHeatingFactor(t, tw, nil)
		}
		nu1, _ := airflow.ChannelNu(re, a.Pr, x/pt.Dh, kh, nil)
		if i > 1 {
			xn0, _ = airflow.ChannelNu(re, a.Pr, x0/pt.Dh, kh, nil)
			xn0 *= x0
		}
		h := a.K / pt.Dh * (x*nu1 - xn0) / (x - x0)
		eta := st.g.SurfaceEfficiency(st.fs.Set.FinEfficiency(st.g, h, k, nil))
		ua := eta * h * perLen * (x - x0)
		tOut := tw - (tw-t)*math.Exp(-ua/(st.mdot*a.Cp))
		q += st.mdot * a.Cp * (tOut - t) * float64(pt.Paths)
		t, x0 = tOut, x
	}
	return t, q
}

// Each segment's coefficient comes from its own state: the graded
// 40-segment march with its fast path (bulk properties predicted from the
// previous rise, film powers by series, the tabulated efficiency curve)
// gives the outlet air and the forced heat of a brute-force march of 4000
// uniform segments at local properties (bruteMarch) to 0.15 % of the air's
// rise and of the heat, for both demo designs and both fin sets, at a cool
// and a hot wall and at three road speeds (laminar to turbulent passages).
// Measured: 0.02 to 0.06 %, the same at 16000 brute-force steps, so it is
// the 40-segment march's own discretisation.
func TestMarchAgainstLocalBruteForce(t *testing.T) {
	for _, lo := range []bool{false, true} {
		for _, v := range []float64{30 / 3.6, 90 / 3.6, 140 / 3.6} {
			c := demoCase(t, lo)
			c.Speed = v
			p, err := c.prepare(Settings{Method: MethodChannel}, nil)
			if err != nil {
				t.Fatal(err)
			}
			for i := range p.sets {
				st := &p.sets[i]
				for _, tw := range []float64{380, 520} {
					m := p.march(st, tw, c.Ambient, false)
					bt, bq := bruteMarch(p, st, tw, c.Ambient, 4000)
					rise := bt - c.Ambient
					if math.Abs(m.tOut-bt) > 1.5e-3*rise || math.Abs(m.q-bq) > 1.5e-3*bq {
						t.Errorf("laid over %v, %.0f km/h, %s at %.0f K: march %.3f K / %.2f W, brute force %.3f K / %.2f W",
							lo, v*3.6, st.fs.Name, tw, m.tOut, m.q, bt, bq)
					}
				}
			}
		}
	}
}

// At a fixed air flow a hotter wall does not raise the forced coefficient
// at cruise (60 to 140 km/h, transitional and turbulent passages): bulk
// properties with the gas heating factor make it fall (VDI Heat Atlas G1;
// Kays & Crawford), where the film-property evaluation used to make it
// rise. Laminar passages (30 km/h) take no heating factor (n = 0) and rise
// only with the bulk air's own conductivity as the air warms; held here
// under 12 % from a 100 C to a 330 C wall.
func TestForcedHWithWallTemperature(t *testing.T) {
	for _, v := range []float64{30, 60, 90, 140} {
		c := demoCase(t, false)
		c.Speed = v / 3.6
		var prev float64
		for j, tw := range []float64{373.15, 473.15, 603.15} {
			r, err := c.AtWall(tw, tw-50, Settings{Method: MethodChannel})
			if err != nil {
				t.Fatal(err)
			}
			h := r.Head.MeanH
			switch {
			case j == 0:
			case v >= 60 && !(h <= prev):
				t.Errorf("%.0f km/h: h rose from %.2f to %.2f W/m2K as the wall heated to %.0f K", v, prev, h, tw)
			case v < 60 && !(h <= prev*1.12):
				t.Errorf("%.0f km/h: h rose from %.2f to %.2f W/m2K", v, prev, h)
			}
			if j == 0 || v >= 60 {
				prev = h
			}
		}
	}
}

// The march takes each segment's bulk state at its mean air temperature
// predicted from the previous segment's rise. Re-evaluating every segment
// at the mean of its own inlet and outlet (a corrector pass, by the
// general path of the same correlation) moves the balanced walls by less
// than 0.1 K on both demo designs from 30 to 130 km/h (measured up to
// 0.02 K): what README's "predicted from the previous segment's rise"
// costs. The corrector must move something, or it did not run.
func TestPredictedSegmentState(t *testing.T) {
	load := HeatLoad{Head: 2700, Barrel: 1450}
	moved := 0.0
	defer func() {
		if !(moved > 1e-5) {
			t.Errorf("the corrected march moved no wall (%.2g K)", moved)
		}
	}()
	for _, lo := range []bool{false, true} {
		for _, v := range []float64{30 / 3.6, 90 / 3.6, 130 / 3.6} {
			c := demoCase(t, lo)
			c.Speed = v
			set := Settings{Method: MethodChannel, Passage: airflow.DevelopingPlates{}, OneMethod: true}
			var walls [2][2]float64
			for k, mean := range []bool{false, true} {
				var log validity.Log
				p, err := c.prepare(set, &log)
				if err != nil {
					t.Fatal(err)
				}
				p.meanState = mean
				r, err := p.balance(load, &log)
				if err != nil && !errors.Is(err, ErrNoEquilibrium) {
					t.Fatal(err)
				}
				walls[k] = [2]float64{r.Head.WallTemp, r.Barrel.WallTemp}
			}
			for j := range 2 {
				d := math.Abs(walls[0][j] - walls[1][j])
				moved = math.Max(moved, d)
				if d > 0.1 {
					t.Errorf("laid over %v, %.0f km/h, set %d: predicted %.3f K, corrected %.3f K", lo, v*3.6, j, walls[0][j], walls[1][j])
				} else {
					t.Logf("laid over %v, %.0f km/h, set %d: %.4f K", lo, v*3.6, j, d)
				}
			}
		}
	}
}
