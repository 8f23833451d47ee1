package fins

import (
	"encoding/csv"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"

	"finmarch/fins/validity"
)

type refRow struct {
	profile                  string
	h, k, t0, t1, L, r1, eta float64
}

func loadFinRef(t testing.TB) []refRow {
	f, err := os.Open("../testdata/reference/fin_efficiency.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var rows []refRow
	for _, r := range recs[1:] {
		v := make([]float64, 7)
		for i := range v {
			v[i], err = strconv.ParseFloat(r[i+1], 64)
			if err != nil {
				t.Fatal(err)
			}
		}
		rows = append(rows, refRow{r[0], v[0], v[1], v[2], v[3], v[4], v[5], v[6]})
	}
	return rows
}

// Closed forms against testdata/reference/fin_efficiency.csv, written by
// gen_fin_efficiency.py: Incropera et al. 6th ed. Tables 3.4/3.5 evaluated
// with scipy.special (tolerance 1e-12: the same formula, double precision
// both sides), and the tapered profiles by scipy.integrate.solve_bvp at
// tol 1e-10 (tolerance 1e-6 for AnnularTapered, whose fixed mesh with
// Richardson extrapolation is good to about 4e-7; 1e-9 for the exact
// trapezoidal solution).
func TestClosedFormsAgainstReference(t *testing.T) {
	seen := map[string]int{}
	for _, r := range loadFinRef(t) {
		var got, tol float64
		switch r.profile {
		case "rect":
			got, tol = StraightRectangular(r.h, r.k, r.t0, r.L, nil), 1e-12
		case "rect_tip":
			got, tol = StraightRectangularTip(r.h, r.k, r.t0, r.L, nil), 1e-12
		case "triangular":
			got, tol = StraightTriangular(r.h, r.k, r.t0, r.L, nil), 1e-12
		case "annular_rect":
			got, tol = AnnularRectangular(r.h, r.k, r.t0, r.r1, r.r1+r.L, nil), 1e-12
		case "trapezoidal":
			got, tol = StraightTrapezoidal(r.h, r.k, r.t0, r.t1, r.L, nil), 1e-9
		case "annular_tapered":
			got, tol = AnnularTapered(r.h, r.k, r.t0, r.t1, r.r1, r.r1+r.L, nil), 1e-6
		default:
			t.Fatalf("unknown profile %q", r.profile)
		}
		seen[r.profile]++
		if rel := math.Abs(got-r.eta) / r.eta; !(rel <= tol) {
			t.Errorf("%s h=%g k=%g t=%g/%g L=%g r1=%g: eta = %.12f, reference %.12f (rel %.2g, tol %.0e)",
				r.profile, r.h, r.k, r.t0, r.t1, r.L, r.r1, got, r.eta, rel, tol)
		}
	}
	if len(seen) != 6 {
		t.Fatalf("reference covers %d profiles, want 6", len(seen))
	}
}

// Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed.,
// Example 3.10 (numbers from memory): a 2024-T6 motorcycle cylinder,
// D = 50 mm, H = 0.15 m, at 500 K in 300 K air with h = 50 W/(m2 K), with
// five annular fins t = 6 mm, L = 20 mm; k = 186 W/(m K). The book reads
// eta_f = 0.95 from its Fig. 3.19 chart and gets q_f = 100 W per fin,
// q_total = 688 W with fins, 236 W without, an increase of 452 W. Chart
// reading at abscissa 0.15, on the steep upper left of the chart, is good
// to about 0.03 in eta (the exact solution gives 0.979), so the exact
// solution must land within 4% of the book's figures.
func TestTextbookMotorcycleCylinder(t *testing.T) {
	const (
		h, k, tf, L = 50.0, 186.0, 0.006, 0.020
		r1          = 0.025
		H           = 0.15
		theta       = 200.0
	)
	eta := AnnularRectangular(h, k, tf, r1, r1+L, nil)
	r2c := r1 + L + tf/2
	af := 2 * math.Pi * (r2c*r2c - r1*r1)
	qf := eta * h * af * theta
	qt := 5*qf + h*2*math.Pi*r1*(H-5*tf)*theta
	qwo := h * 2 * math.Pi * r1 * H * theta
	checks := []struct {
		name      string
		got, book float64
	}{
		{"fin efficiency", eta, 0.95},
		{"corrected fin area m2", af, 1.06e-2},
		{"heat per fin W", qf, 100},
		{"total with fins W", qt, 688},
		{"without fins W", qwo, 236},
		{"increase W", qt - qwo, 452},
	}
	for _, c := range checks {
		if rel := math.Abs(c.got-c.book) / c.book; rel > 0.04 {
			t.Errorf("%s = %.4g, book %.4g (%.1f%% off)", c.name, c.got, c.book, 100*rel)
		}
	}
	// The same cylinder through the fin-set geometry.
	s := Set{Style: StyleAnnular, Count: 5, Pitch: 0.03, Height: L, RootThickness: tf, TipThickness: tf, RootDiameter: 2 * r1, Length: H}
	g, err := s.Geometry()
	if err != nil {
		t.Fatal(err)
	}
	eset := s.FinEfficiency(g, h, k, nil)
	qset := (eset*g.FinArea + g.BaseArea) * h * theta
	if rel := math.Abs(qset-688) / 688; rel > 0.04 {
		t.Errorf("fin-set heat = %.4g W, book 688 W", qset)
	}
}

// Incropera 6th ed. Fig. 3.18 (chart, from memory): a straight
// rectangular fin at Lc^(3/2) (h/(k Ap))^(1/2) = 1 reads about 0.63; the
// abscissa x relates to m Lc by m Lc = sqrt(2) x. Tolerance 0.02, a chart
// reading.
func TestChartValue(t *testing.T) {
	const k, tf, L = 200.0, 0.002, 0.02
	lc := L + tf/2
	h := k * tf / (lc * lc)
	if got := StraightRectangular(h, k, tf, L, nil); math.Abs(got-0.63) > 0.02 {
		t.Errorf("rectangular at abscissa 1: %.3f, chart 0.63", got)
	}
}

// The limits that every fin efficiency must respect (closed-form limits of
// the formulas, checked tightly).
func TestLimits(t *testing.T) {
	const k, t0, L, r1 = 150.0, 0.004, 0.03, 0.04
	for _, h := range []float64{1e-9, 1e-7} {
		for name, eta := range map[string]float64{
			"rect":            StraightRectangular(h, k, t0, L, nil),
			"rect tip":        StraightRectangularTip(h, k, t0, L, nil),
			"triangular":      StraightTriangular(h, k, t0, L, nil),
			"trapezoidal":     StraightTrapezoidal(h, k, t0, t0/2, L, nil),
			"annular":         AnnularRectangular(h, k, t0, r1, r1+L, nil),
			"annular tapered": AnnularTapered(h, k, t0, t0/2, r1, r1+L, nil),
		} {
			if math.Abs(eta-1) > 1e-5 {
				t.Errorf("%s at h=%g: eta = %.8f, want -> 1", name, h, eta)
			}
		}
	}
	// Annular tends to straight as r2/r1 -> 1 (radius huge against height).
	for _, h := range []float64{20, 100, 300} {
		a := AnnularRectangular(h, k, t0, 1e4, 1e4+L, nil)
		s := StraightRectangular(h, k, t0, L, nil)
		if math.Abs(a-s) > 1e-5 {
			t.Errorf("h=%g: annular at r1 = 1e4 m %.8f, straight %.8f", h, a, s)
		}
		at := AnnularTapered(h, k, t0, t0/3, 1e4, 1e4+L, nil)
		st := StraightTrapezoidal(h, k, t0, t0/3, L, nil)
		if math.Abs(at-st) > 1e-6 {
			t.Errorf("h=%g: annular tapered at r1 = 1e4 m %.8f, straight trapezoidal %.8f", h, at, st)
		}
	}
	// The trapezoid spans triangular and uniform profiles.
	for _, h := range []float64{20, 100, 300} {
		tri := StraightTriangular(h, k, t0, L, nil)
		if tz := StraightTrapezoidal(h, k, t0, 0, L, nil); math.Abs(tz-tri) > 1e-12 {
			t.Errorf("trapezoid with sharp tip %.12f, triangular %.12f", tz, tri)
		}
		if tz := StraightTrapezoidal(h, k, t0, t0*(1-1e-7), L, nil); math.Abs(tz-StraightRectangularTip(h, k, t0, L, nil)) > 1e-6 {
			t.Errorf("trapezoid near-uniform %.9f, uniform %.9f", tz, StraightRectangularTip(h, k, t0, L, nil))
		}
		if tz := StraightTrapezoidal(h, k, t0, t0, L, nil); tz != StraightRectangularTip(h, k, t0, L, nil) {
			t.Error("uniform trapezoid must be the uniform fin")
		}
		at := AnnularTapered(h, k, t0, t0, r1, r1+L, nil)
		// AnnularTapered with no taper has an exact convecting tip; the
		// corrected radius of AnnularRectangular differs by a few 1e-4
		// for these fins (Incropera Sec. 3.6.4: the approximation is good
		// when (h t/k)^(1/2) is small).
		ar := AnnularRectangular(h, k, t0, r1, r1+L, nil)
		r2, r2c := r1+L, r1+L+t0/2
		qa := at * (2*math.Pi*(r2*r2-r1*r1) + 2*math.Pi*r2*t0)
		qr := ar * 2 * math.Pi * (r2c*r2c - r1*r1)
		if rel := math.Abs(qa-qr) / qr; rel > 2e-3 {
			t.Errorf("h=%g: uniform annular heat %.6g vs corrected-radius %.6g", h, qa, qr)
		}
	}
}

// Efficiency falls as h rises and as the fin lengthens (monotonic trend of
// every closed form: d eta / d(mL) < 0).
func TestMonotonic(t *testing.T) {
	const k, t0, r1 = 150.0, 0.004, 0.04
	prev := map[string]float64{}
	for h := 5.0; h < 1000; h *= 1.3 {
		cur := map[string]float64{
			"rect": StraightRectangular(h, k, t0, 0.03, nil), "tri": StraightTriangular(h, k, t0, 0.03, nil),
			"trap": StraightTrapezoidal(h, k, t0, 0.0015, 0.03, nil), "ann": AnnularRectangular(h, k, t0, r1, r1+0.03, nil),
			"anntap": AnnularTapered(h, k, t0, 0.0015, r1, r1+0.03, nil),
		}
		for n, v := range cur {
			if p, ok := prev[n]; ok && !(v < p) {
				t.Errorf("%s: eta did not fall from %.6f to %.6f at h = %g", n, p, v, h)
			}
			if !(v > 0 && v <= 1) {
				t.Errorf("%s: eta = %g outside (0, 1]", n, v)
			}
		}
		prev = cur
	}
}

func constThick(t float64) func(float64) float64 { return func(float64) float64 { return t } }
func linThick(t0, t1, L float64) func(float64) float64 {
	return func(s float64) float64 { return t0 + (t1-t0)*s/L }
}

// The numeric solver must reproduce every closed form to 1e-4 or better
// (a tenth of the chart-reading scatter of the textbook efficiency charts)
// with the default 200 cells.
func TestSolverReproducesClosedForms(t *testing.T) {
	const k = 160.0
	for _, h := range []float64{15, 60, 200} {
		for _, c := range []struct {
			name string
			fin  Fin
			want float64
		}{
			{"rect adiabatic at Lc", Fin{Shape: Straight, Length: 0.03 + 0.002, Thickness: constThick(0.004)},
				StraightRectangular(h, k, 0.004, 0.03, nil)},
			{"rect convective tip", Fin{Shape: Straight, Length: 0.03, Thickness: constThick(0.004), Tip: ConvectiveTip},
				StraightRectangularTip(h, k, 0.004, 0.03, nil)},
			{"triangular", Fin{Shape: Straight, Length: 0.03, Thickness: linThick(0.004, 0, 0.03)},
				StraightTriangular(h, k, 0.004, 0.03, nil)},
			{"trapezoidal", Fin{Shape: Straight, Length: 0.03, Thickness: linThick(0.004, 0.0015, 0.03), Tip: ConvectiveTip},
				StraightTrapezoidal(h, k, 0.004, 0.0015, 0.03, nil)},
			{"annular adiabatic at r2c", Fin{Shape: Annular, RootRadius: 0.04, Length: 0.03 + 0.002, Thickness: constThick(0.004)},
				AnnularRectangular(h, k, 0.004, 0.04, 0.07, nil)},
		} {
			sol, err := Solve(c.fin, k, Uniform(h), 150, SolveOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if rel := math.Abs(sol.Efficiency-c.want) / c.want; rel > 1e-4 {
				t.Errorf("h=%g %s: solver %.8f, closed form %.8f (rel %.2g)", h, c.name, sol.Efficiency, c.want, rel)
			}
			if sol.Theta[0] != 150 || len(sol.S) != 201 {
				t.Errorf("%s: bad profile output", c.name)
			}
		}
	}
}

// Mesh refinement: the error against the closed form falls about fourfold
// each time the cells double (second-order scheme), so the solver
// converges.
func TestSolverConverges(t *testing.T) {
	const h, k = 120.0, 150.0
	want := AnnularRectangular(h, k, 0.003, 0.035, 0.065, nil)
	fin := Fin{Shape: Annular, RootRadius: 0.035, Length: 0.03 + 0.0015, Thickness: constThick(0.003)}
	prevErr := math.Inf(1)
	for _, n := range []int{10, 20, 40, 80, 160} {
		sol, err := Solve(fin, k, Uniform(h), 1, SolveOptions{Cells: n})
		if err != nil {
			t.Fatal(err)
		}
		e := math.Abs(sol.Efficiency - want)
		if !(e < prevErr/3) {
			t.Errorf("cells %d: error %.3g did not fall below a third of %.3g", n, e, prevErr)
		}
		prevErr = e
	}
}

// A temperature-dependent h = h_b (theta/theta_b)^n on a long uniform fin
// has the exact root heat q = sqrt(4 h_b k t/(n+2)) theta_b per unit width,
// from the first integral of k t theta” = 2 h theta (closed form; the
// power-law case is treated in Kraus, Aziz & Welty 2001, Ch. 6). n = 0.25
// is laminar natural convection.
func TestSolverTemperatureDependentH(t *testing.T) {
	const hb, k, tf, thb = 40.0, 100.0, 0.002, 120.0
	for _, n := range []float64{0, 0.25, 1.0 / 3} {
		hf := func(_, th float64) float64 { return hb * math.Pow(math.Abs(th)/thb, n) }
		m := math.Sqrt(2 * hb / (k * tf))
		fin := Fin{Shape: Straight, Length: 14 / m, Thickness: constThick(tf)}
		sol, err := Solve(fin, k, hf, thb, SolveOptions{Cells: 2000})
		if err != nil {
			t.Fatal(err)
		}
		want := math.Sqrt(4*hb*k*tf/(n+2)) * thb
		if rel := math.Abs(sol.HeatRate-want) / want; rel > 1e-4 {
			t.Errorf("n=%g: q = %.6g, exact %.6g (rel %.2g)", n, sol.HeatRate, want, rel)
		}
		if n > 0 && sol.Iterations < 3 {
			t.Errorf("n=%g: nonlinear h solved in %d iterations", n, sol.Iterations)
		}
	}
}

// The fast fixed-mesh path of AnnularTapered agrees with the general
// solver at a fine mesh.
func TestAnnularTaperedMatchesSolver(t *testing.T) {
	const k = 140.0
	for _, h := range []float64{10, 80, 400} {
		fin := Fin{Shape: Annular, RootRadius: 0.03, Length: 0.035, Thickness: linThick(0.005, 0.0015, 0.035), Tip: ConvectiveTip}
		sol, err := Solve(fin, k, Uniform(h), 1, SolveOptions{Cells: 4000})
		if err != nil {
			t.Fatal(err)
		}
		got := AnnularTapered(h, k, 0.005, 0.0015, 0.03, 0.065, nil)
		if rel := math.Abs(got-sol.Efficiency) / sol.Efficiency; rel > 1e-6 {
			t.Errorf("h=%g: fast %.9f, solver %.9f", h, got, sol.Efficiency)
		}
	}
}

func TestSolverRejectsBadInput(t *testing.T) {
	good := Fin{Shape: Straight, Length: 0.03, Thickness: constThick(0.003)}
	cases := []struct {
		name string
		fin  Fin
		k    float64
		h    Coefficient
		th   float64
		opt  SolveOptions
	}{
		{"zero length", Fin{Shape: Straight, Thickness: constThick(0.003)}, 100, Uniform(10), 1, SolveOptions{}},
		{"annular no radius", Fin{Shape: Annular, Length: 0.03, Thickness: constThick(0.003)}, 100, Uniform(10), 1, SolveOptions{}},
		{"negative thickness", Fin{Shape: Straight, Length: 0.03, Thickness: linThick(0.003, -0.001, 0.03)}, 100, Uniform(10), 1, SolveOptions{}},
		{"zero k", good, 0, Uniform(10), 1, SolveOptions{}},
		{"zero theta", good, 100, Uniform(10), 0, SolveOptions{}},
		{"negative h", good, 100, Uniform(-1), 1, SolveOptions{}},
		{"NaN h", good, 100, Uniform(math.NaN()), 1, SolveOptions{}},
		{"one cell", good, 100, Uniform(10), 1, SolveOptions{Cells: 1}},
		{"nil h", good, 100, nil, 1, SolveOptions{}},
	}
	for _, c := range cases {
		if _, err := Solve(c.fin, c.k, c.h, c.th, c.opt); err == nil {
			t.Errorf("%s: no error", c.name)
		}
	}
}

// Geometry of hand-computable sets (closed-form areas and volumes).
func TestGeometry(t *testing.T) {
	s := Set{Style: StyleAnnular, Count: 5, Pitch: 0.03, Height: 0.02, RootThickness: 0.006, TipThickness: 0.006, RootDiameter: 0.05, Length: 0.15}
	g, err := s.Geometry()
	if err != nil {
		t.Fatal(err)
	}
	r1, r2 := 0.025, 0.045
	near := func(name string, got, want float64) {
		t.Helper()
		if math.Abs(got-want) > 1e-12*math.Max(1, math.Abs(want)) {
			t.Errorf("%s = %.12g, want %.12g", name, got, want)
		}
	}
	near("fin area each", g.FinAreaEach, 2*math.Pi*(r2*r2-r1*r1)+2*math.Pi*r2*0.006)
	near("base area", g.BaseArea, math.Pi*0.05*(0.15-5*0.006))
	near("volume", g.FinVolume, 5*math.Pi*(r2*r2-r1*r1)*0.006)
	near("gap", g.GapMean, 0.024)
	near("Dh", g.HydraulicDiameter, 4*0.024*0.02/(2*0.02+0.024))
	near("envelope", g.EnvelopeArea, math.Pi*0.09*0.15)
	if g.Passages != 4 {
		t.Errorf("passages %d", g.Passages)
	}
	// A tapered annular fin's volume against a numerical integral.
	s.TipThickness = 0.002
	g, _ = s.Geometry()
	v := 0.0
	const n = 100000
	for i := 0; i < n; i++ {
		r := r1 + (float64(i)+0.5)*(r2-r1)/n
		v += 2 * math.Pi * r * (0.006 - 0.004*(r-r1)/(r2-r1)) * (r2 - r1) / n
	}
	if rel := math.Abs(g.FinVolume-5*v) / (5 * v); rel > 1e-8 {
		t.Errorf("tapered volume %.9g vs integral %.9g", g.FinVolume, 5*v)
	}
	// Longitudinal: 12 fins round a 60 mm barrel at 15 mm root pitch (full round = 188 mm).
	l := Set{Style: StyleLongitudinal, Count: 12, Pitch: math.Pi * 0.06 / 12, Height: 0.025, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.06, Length: 0.1}
	gl, err := l.Geometry()
	if err != nil {
		t.Fatal(err)
	}
	near("long volume", gl.FinVolume, 12*0.025*0.003*0.1)
	near("long base", gl.BaseArea, (math.Pi*0.06-12*0.004)*0.1)
	if gl.Passages != 12 {
		t.Errorf("full-round passages %d", gl.Passages)
	}
	if gl.GapTip <= gl.GapRoot {
		t.Error("radial fins must open outward")
	}
	// Overall surface efficiency: Incropera Eq. 3.102 by hand.
	near("eta_o", g.SurfaceEfficiency(0.8), 1-g.FinArea/g.TotalArea*0.2)
}

func TestGeometryErrors(t *testing.T) {
	base := Set{Style: StyleAnnular, Count: 10, Pitch: 0.01, Height: 0.03, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.07, Length: 0.1}
	cases := []struct {
		field string
		mut   func(*Set)
	}{
		{"pitch", func(s *Set) { s.Pitch = 0.004 }},
		{"tip_thickness", func(s *Set) { s.TipThickness = 0.005 }},
		{"count", func(s *Set) { s.Count = 12 }},
		{"count", func(s *Set) { s.Count = 0 }},
		{"height", func(s *Set) { s.Height = -1 }},
		{"root_diameter", func(s *Set) { s.RootDiameter = math.NaN() }},
		{"length", func(s *Set) { s.Length = math.Inf(1) }},
		{"tip_thickness", func(s *Set) { s.TipThickness = -0.001 }},
		{"count", func(s *Set) { s.Style = StyleLongitudinal; s.Count = 30 }},
	}
	for _, c := range cases {
		s := base
		c.mut(&s)
		_, err := s.Geometry()
		fe, ok := err.(*FieldError)
		if !ok || fe.Field != c.field {
			t.Errorf("want FieldError on %s, got %v", c.field, err)
		}
	}
	if _, err := base.Geometry(); err != nil {
		t.Fatal(err)
	}
}

// The Biot-number check warns when the 1-D fin model is stretched.
func TestBiotWarning(t *testing.T) {
	var log validity.Log
	StraightRectangular(50, 150, 0.004, 0.03, &log)
	if log.Len() != 0 {
		t.Fatal("warned inside range")
	}
	AnnularRectangular(5000, 20, 0.004, 0.03, 0.06, &log)
	if log.Len() != 1 {
		t.Fatal("no Biot warning")
	}
}

func TestClosedFormsDoNotAllocate(t *testing.T) {
	fns := map[string]func(){
		"rect":     func() { StraightRectangular(80, 150, 0.003, 0.03, nil) },
		"tri":      func() { StraightTriangular(80, 150, 0.003, 0.03, nil) },
		"trap":     func() { StraightTrapezoidal(80, 150, 0.004, 0.0015, 0.03, nil) },
		"annular":  func() { AnnularRectangular(80, 150, 0.003, 0.04, 0.07, nil) },
		"annTaper": func() { AnnularTapered(80, 150, 0.004, 0.0015, 0.04, 0.07, nil) },
	}
	for n, f := range fns {
		if a := testing.AllocsPerRun(100, f); a != 0 {
			t.Errorf("%s allocates %.0f times per call", n, a)
		}
	}
}

var sink float64

func BenchmarkStraightRectangular(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		sink += StraightRectangular(80+float64(i&15), 150, 0.003, 0.03, nil)
	}
}
func BenchmarkStraightTriangular(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		sink += StraightTriangular(80+float64(i&15), 150, 0.003, 0.03, nil)
	}
}
func BenchmarkStraightTrapezoidal(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		sink += StraightTrapezoidal(80+float64(i&15), 150, 0.004, 0.0015, 0.03, nil)
	}
}
func BenchmarkAnnularRectangular(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		sink += AnnularRectangular(80+float64(i&15), 150, 0.003, 0.04, 0.07, nil)
	}
}
func BenchmarkAnnularTapered(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		sink += AnnularTapered(80+float64(i&15), 150, 0.004, 0.0015, 0.04, 0.07, nil)
	}
}
func BenchmarkSolve200(b *testing.B) {
	b.ReportAllocs()
	fin := Fin{Shape: Annular, RootRadius: 0.04, Length: 0.03, Thickness: linThick(0.004, 0.0015, 0.03), Tip: ConvectiveTip}
	for i := 0; i < b.N; i++ {
		sol, _ := Solve(fin, 150, Uniform(80), 1, SolveOptions{})
		sink += sol.Efficiency
	}
}

// Restyle keeps heights, thicknesses and the mean gap, and gives a valid
// set of the other style; a round trip returns close to the start.
func TestRestyle(t *testing.T) {
	a := Set{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	ga, _ := a.Geometry()
	l, err := a.Restyle(StyleLongitudinal)
	if err != nil {
		t.Fatal(err)
	}
	gl, _ := l.Geometry()
	if l.Style != StyleLongitudinal || l.Height != a.Height || l.RootThickness != a.RootThickness {
		t.Fatalf("restyle changed the wrong things: %+v", l)
	}
	// the count is rounded down, so the gap can only grow, by less than one pitch's share
	if !(gl.GapMean >= ga.GapMean-1e-12 && gl.GapMean < ga.GapMean*1.05) {
		t.Errorf("mean gap %.3f mm against %.3f mm", gl.GapMean*1e3, ga.GapMean*1e3)
	}
	back, err := l.Restyle(StyleAnnular)
	if err != nil || back.Count < a.Count-1 || back.Count > a.Count {
		t.Errorf("round trip: %+v %v", back, err)
	}
	if same, _ := a.Restyle(StyleAnnular); same != a {
		t.Error("restyle to the same style must not change the set")
	}
}

// The lazily tabulated curve matches the direct fin efficiency to 1e-6 over
// the h and k range of air-cooled fins, for every profile a set can have.
func TestCurveAccuracy(t *testing.T) {
	sets := []Set{
		{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072},
		{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04, RootThickness: 0.004, TipThickness: 0.004, RootDiameter: 0.12, Length: 0.072},
		{Style: StyleLongitudinal, Count: 40, Pitch: 0.009, Height: 0.035, RootThickness: 0.004, TipThickness: 0.0015, RootDiameter: 0.12, Length: 0.072},
		{Style: StyleLongitudinal, Count: 40, Pitch: 0.009, Height: 0.035, RootThickness: 0.004, TipThickness: 0, RootDiameter: 0.12, Length: 0.072},
	}
	for _, s := range sets {
		g, err := s.Geometry()
		if err != nil {
			t.Fatal(err)
		}
		c := s.NewCurve(g)
		worst := 0.0
		for h := 0.5; h < 1000; h *= 1.0371 {
			for _, k := range []float64{47, 96, 151, 237} {
				want := s.FinEfficiency(g, h, k, nil)
				got := c.Efficiency(h, k, nil)
				worst = math.Max(worst, math.Abs(got-want))
			}
		}
		if worst > 1e-6 {
			t.Errorf("%v taper %g: worst error %.2g", s.Style, s.TipThickness, worst)
		}
	}
}

// The curve's reference function against tanh(z)/z (closed form): within
// 1% everywhere, and equal to its Maclaurin series 1 - z^2/3 + 2 z^4/15
// - 17 z^6/315 to O(z^6) near zero (the z^6 term differs, so the check at
// small z allows a few times z^6).
func TestCurveReference(t *testing.T) {
	c := &Curve{refScale2: 1}
	for z := 1e-3; z < 100; z *= 1.05 {
		want := math.Tanh(z) / z
		got := c.ref(z * z)
		if r := math.Abs(got/want - 1); r > 0.01 {
			t.Errorf("z = %g: ref %g, tanh(z)/z %g (%.2g%%)", z, got, want, 100*r)
		}
		if z < 0.2 {
			series := 1 - z*z/3 + 2*math.Pow(z, 4)/15
			if d := math.Abs(got - series); d > 0.1*math.Pow(z, 6)+1e-15 { // plus rounding
				t.Errorf("z = %g: ref %.15g, series %.15g", z, got, series)
			}
		}
	}
}

func BenchmarkCurve(b *testing.B) {
	s := Set{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	g, _ := s.Geometry()
	c := s.NewCurve(g)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		sink += c.Efficiency(50+float64(i&63), 151, nil)
	}
}

// Casting limits: slacks computed by hand for one set.
func TestCastingCheck(t *testing.T) {
	p, err := LookupProcess("permanent-mold")
	if err != nil {
		t.Fatal(err)
	}
	s := Set{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	v := p.Check(s)
	want := map[string]float64{
		"minimum thickness": 0, // the 2 mm tip sits at the 2 mm minimum
		"height to gap":     7 - 0.04/0.005,
		"draft":             0.002/(2*0.04) - math.Tan(math.Pi/180),
	}
	for _, x := range v {
		if math.Abs(x.Slack-want[x.Constraint]) > 1e-12 {
			t.Errorf("%s slack %g, want %g", x.Constraint, x.Slack, want[x.Constraint])
		}
	}
	if p.Feasible(s) {
		t.Error("8:1 fins pass a 7:1 limit")
	}
	m, _ := LookupProcess("machined")
	if !m.Feasible(s) {
		t.Error("the set is machinable")
	}
	if _, err := LookupProcess("forged"); err == nil {
		t.Error("unknown process accepted")
	}
}

// The stored meshes of a curve give AnnularTapered's efficiency exactly
// (the same system, assembled once).
func TestCurveMeshMatchesAnnularTapered(t *testing.T) {
	s := Set{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	g, _ := s.Geometry()
	c := s.NewCurve(g)
	for h := 1.0; h < 2000; h *= 1.7 {
		for _, k := range []float64{47, 151} {
			want := AnnularTapered(h, k, 0.004, 0.002, 0.06, 0.1, nil)
			if got := c.efficiency(h / k); math.Abs(got-want) > 1e-13 {
				t.Fatalf("h=%g k=%g: mesh %.15f, AnnularTapered %.15f", h, k, got, want)
			}
		}
	}
}

// Fitting is the count that fits: Geometry accepts that many fins and
// refuses one more, for both styles over random sets (the two rules must
// agree), and an exact fit counts the last fin (7 pitches of 9 mm plus a
// 4 mm root make 67 mm: 8 fins).
func TestFittingAgreesWithGeometry(t *testing.T) {
	if n := Fitting(StyleAnnular, 0.009, 0.004, 0.067, 0.1); n != 8 {
		t.Errorf("exact fit: %d fins, want 8", n)
	}
	r := rand.New(rand.NewPCG(3, 5))
	for i := 0; i < 2000; i++ {
		s := Set{Style: Style(r.IntN(2)), RootThickness: 0.001 + 0.005*r.Float64(), Height: 0.005 + 0.03*r.Float64(),
			RootDiameter: 0.04 + 0.15*r.Float64(), Length: 0.02 + 0.15*r.Float64()}
		s.TipThickness = s.RootThickness
		s.Pitch = s.RootThickness + 0.001 + 0.02*r.Float64()
		s.Count = s.Fitting()
		if _, err := s.Geometry(); err != nil {
			t.Fatalf("%+v: %d fins fit by Fitting, refused by Geometry: %v", s, s.Count, err)
		}
		s.Count++
		if _, err := s.Geometry(); err == nil {
			t.Fatalf("%+v: Geometry accepts one more fin than Fitting", s)
		}
	}
}

// Each profile's closed form and the same fin given to the general
// solver (Single.Fin) agree to 1e-3 at 400 cells (the solver converges at
// second order; TestSolverReproducesClosedForms holds it tighter at its
// own fins), so the calculator's closed form and its check describe one
// fin; and ParseProfile reads every listed name.
func TestSingleProfiles(t *testing.T) {
	for _, p := range Profiles {
		q, err := ParseProfile(" " + strings.ToUpper(string(p)))
		if err != nil || q != p {
			t.Fatalf("ParseProfile(%q): %v %v", p, q, err)
		}
		f := Single{Profile: p, Height: 0.03, RootThickness: 0.004, TipThickness: 0.002, RootRadius: 0.05}
		if p == Rectangular || p == AnnularProfile {
			f.TipThickness = f.RootThickness
		}
		eta := f.Efficiency(60, 150, nil)
		sol, err := Solve(f.Fin(), 150, Uniform(60), 100, SolveOptions{Cells: 400})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(sol.Efficiency-eta) > 1e-3 {
			t.Errorf("%s: closed form %.5f, solver %.5f", p, eta, sol.Efficiency)
		}
	}
	if _, err := ParseProfile("hexagonal"); err == nil {
		t.Error("unknown profile accepted")
	}
}

// RestyleFor keeps the process's height-to-gap limit with as many fins as
// it allows (one more would break it), and reports a set whose thickness
// no count can mend; with no process it is Restyle.
func TestRestyleFor(t *testing.T) {
	up := Set{Style: StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.040, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	die, _ := LookupProcess("die-casting")
	lo, ok, err := up.RestyleFor(StyleLongitudinal, die)
	if err != nil || !ok {
		t.Fatalf("%v %v", ok, err)
	}
	same, _ := up.Restyle(StyleLongitudinal)
	if lo.Count >= same.Count {
		t.Errorf("not thinned: %d fins against %d", lo.Count, same.Count)
	}
	for _, v := range die.Check(lo) {
		if v.Slack < -1e-9 {
			t.Errorf("breaks %s", v.Constraint)
		}
	}
	more := lo
	more.Count++
	more.Pitch = math.Pi * more.RootDiameter / float64(more.Count)
	if more.Height/(more.Pitch-more.RootThickness) <= die.MaxAspect {
		t.Errorf("%d fins would still cast: not the most", more.Count)
	}
	pm, _ := LookupProcess("permanent-mould")
	thin := up
	thin.TipThickness = 0.0015
	if _, ok, err := thin.RestyleFor(StyleLongitudinal, pm); err != nil || ok {
		t.Errorf("a 1.5 mm tip passed permanent-mould's 2 mm: %v %v", ok, err)
	}
	if plain, _, _ := up.RestyleFor(StyleLongitudinal, Process{}); plain != same {
		t.Error("with no process it is not Restyle")
	}
}
