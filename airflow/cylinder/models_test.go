package cylinder

import (
	"math"
	"testing"

	"finmarch/airflow"
	"finmarch/fins/validity"
)

// The march's fast path (film powers by binomial series, nuPowers) gives
// what the general path gives with the same correlation called through the
// PassageModel interface at every segment: at fixed walls the heats agree
// to 1e-10 (TestNuPowers holds nuPowers to ChannelNu to 1e-12), and the
// balanced walls to 5 mK (the balance stops at 1e-5 of the load, about
// 2 mK).
func TestFastPath(t *testing.T) {
	general := Settings{Method: MethodChannel, Passage: airflow.DevelopingPlates{}}
	for _, lo := range []bool{false, true} {
		c := demoCase(t, lo)
		for _, tw := range [][2]float64{{420, 380}, {500, 410}} {
			a, err := c.AtWall(tw[0], tw[1], Settings{Method: MethodChannel})
			if err != nil {
				t.Fatal(err)
			}
			b, err := c.AtWall(tw[0], tw[1], general)
			if err != nil {
				t.Fatal(err)
			}
			for _, p := range [][2]SetResult{{a.Head, b.Head}, {a.Barrel, b.Barrel}} {
				if rel(p[0].ForcedHeat, p[1].ForcedHeat) > 1e-10 || math.Abs(p[0].AirOut-p[1].AirOut) > 1e-8 {
					t.Errorf("laid over %v %s at %v K: fast %.12g W / %.9f K, general %.12g W / %.9f K",
						lo, p[0].Name, tw, p[0].ForcedHeat, p[0].AirOut, p[1].ForcedHeat, p[1].AirOut)
				}
			}
		}
		a := mustBalance(t, c, demoLoad)
		b := mustBalance(t, c, demoLoad, general)
		if math.Abs(a.Head.WallTemp-b.Head.WallTemp) > 5e-3 || math.Abs(a.Barrel.WallTemp-b.Barrel.WallTemp) > 5e-3 {
			t.Errorf("laid over %v: fast %.4f / %.4f K, general %.4f / %.4f K", lo,
				a.Head.WallTemp, a.Barrel.WallTemp, b.Head.WallTemp, b.Barrel.WallTemp)
		}
	}
}

// doubled is a passage model with twice the built-in Nusselt number and
// the same friction.
type doubled struct{ airflow.DevelopingPlates }

func (d doubled) Nu(re, pr, x, tb, tw float64, log *validity.Log) (float64, string) {
	nu, r := d.DevelopingPlates.Nu(re, pr, x, tb, tw, log)
	return 2 * nu, r
}

// halfNatural is BarCohenRohsenow at half the coefficient.
type halfNatural struct{}

func (halfNatural) H(a airflow.Air, gap, height, dT float64, log *validity.Log) float64 {
	return 0.5 * airflow.BarCohenRohsenow{}.H(a, gap, height, dT, log)
}

// The correlations are replaceable through Settings: a passage model with
// twice the Nusselt number doubles the segment h of the march and the
// passage flow is unchanged (same friction); a natural model at half the
// coefficient halves the idle coefficient.
func TestReplaceableCorrelations(t *testing.T) {
	c := demoCase(t, false)
	a, err := c.AtWall(450, 400, Settings{Method: MethodChannel})
	if err != nil {
		t.Fatal(err)
	}
	b, err := c.AtWall(450, 400, Settings{Method: MethodChannel, Passage: doubled{}})
	if err != nil {
		t.Fatal(err)
	}
	if a.Head.PassageVelocity != b.Head.PassageVelocity {
		t.Errorf("friction changed: %g against %g m/s", b.Head.PassageVelocity, a.Head.PassageVelocity)
	}
	if r := b.Head.March[0].H / a.Head.March[0].H; math.Abs(r-2) > 1e-9 {
		t.Errorf("first segment h ratio %.12f, want 2", r)
	}
	c.Speed = 0
	n, err := c.AtWall(450, 400, Settings{Method: MethodChannel, Natural: airflow.BarCohenRohsenow{}})
	if err != nil {
		t.Fatal(err)
	}
	h, err := c.AtWall(450, 400, Settings{Method: MethodChannel, Natural: halfNatural{}})
	if err != nil {
		t.Fatal(err)
	}
	if r := h.Head.NaturalH / n.Head.NaturalH; math.Abs(r-0.5) > 1e-12 {
		t.Errorf("natural h ratio %.12f, want 0.5", r)
	}
}
