package fins

import (
	"math"
	"testing"

	"finmarch/fins/validity"
)

// Kern & Kraus (1972) annular fin efficiency, the docstring example of
// CalebBell/ht:ht/core.py (fin_efficiency_Kern_Kraus; read for the
// reference pack @f9c60c4): D_o = 0.0254 m, D_fin = 0.05715 m, t = 3.8e-4
// m, k = 200 W/(m K), h = 58 W/(m2 K) -> 0.8412588620231153 (the pack
// prints 0.841258862023; mpmath at 30 digits gives 0.84125886202311523).
// The value is printed to full double precision; the tolerance 1e-13
// relative is the accuracy fins/bessel is held to against mpmath
// (TestAgainstReference), allowing for two Bessel implementations' last
// digits (the difference found is 3e-16), and is far below the effect of
// any change of the inputs in their printed digits.
func TestAnnularKernKrausExample(t *testing.T) {
	got := AnnularKernKraus(58, 200, 3.8e-4, 0.0254/2, 0.05715/2, nil)
	if r := math.Abs(got-0.8412588620231153) / 0.8412588620231153; r > 1e-13 {
		t.Errorf("eta = %.17g, want 0.8412588620231153 (relative error %.2g)", got, r)
	}
}

// The same Bessel solution as AnnularRectangular (Incropera Table 3.5)
// with the tip at r2 instead of r2 + t/2: AnnularKernKraus(r2) =
// AnnularRectangular(r2 - t/2), an identity of the formulas, held from a
// short stiff fin to a long weak one (m r2 up to about 600, where the
// unscaled Bessel functions would overflow). And the closed-form limits:
// eta -> 1 as h -> 0, and the straight fin's tanh(m L)/(m L) (Incropera
// Table 3.4, insulated tip) as r1 grows at fixed L = r2 - r1, approached
// from below.
func TestAnnularKernKrausAgainstRectangular(t *testing.T) {
	for _, c := range []struct{ h, k, t, r1, r2 float64 }{
		{58, 200, 3.8e-4, 0.0127, 0.028575},
		{150, 160, 2e-3, 0.04, 0.07},
		{20, 15, 1e-3, 0.01, 0.2},
		{2000, 10, 5e-4, 0.05, 0.2},
	} {
		kk := AnnularKernKraus(c.h, c.k, c.t, c.r1, c.r2, nil)
		ar := AnnularRectangular(c.h, c.k, c.t, c.r1, c.r2-c.t/2, nil)
		if math.IsNaN(kk) || math.Abs(kk-ar) > 1e-12*ar {
			t.Errorf("%+v: Kern-Kraus %.15g, AnnularRectangular at r2 - t/2 %.15g", c, kk, ar)
		}
	}
	if got := AnnularKernKraus(1e-9, 200, 1e-3, 0.02, 0.05, nil); math.Abs(got-1) > 1e-6 {
		t.Errorf("h -> 0: eta = %g, want 1", got)
	}
	// r1 = 1 m, L = 10 mm: nearly straight; eta within 0.5 % of
	// tanh(mL)/(mL) (the annular fin is slightly less efficient).
	h, k, th, L := 100.0, 200.0, 1e-3, 0.01
	m := math.Sqrt(2 * h / (k * th))
	straight := math.Tanh(m*L) / (m * L)
	if got := AnnularKernKraus(h, k, th, 1, 1+L, nil); math.Abs(got-straight)/straight > 0.005 || got > straight {
		t.Errorf("large radius: eta = %.6f, straight fin %.6f", got, straight)
	}
	var log validity.Log
	AnnularKernKraus(5000, 10, 2e-3, 0.02, 0.05, &log)
	if log.Len() != 1 {
		t.Errorf("Biot 0.5 must warn: %v", log.Warnings())
	}
}
