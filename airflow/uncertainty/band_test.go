package uncertainty

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/internal/demotest"
)

// The Harrell-Davis percentiles against scipy.stats.mstats.hdquantiles
// (testdata/reference/gen_hdquantiles.py) to 1e-10 relative (both sum the
// same Beta weights; the difference is rounding), and a percentile whose
// weight reaches samples without an equilibrium is +Inf while the others
// stay finite.
func TestPercentilesAgainstScipy(t *testing.T) {
	f, err := os.Open("../../testdata/reference/hdquantiles.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range rows[1:] {
		p, _ := strconv.ParseFloat(r[1], 64)
		want, _ := strconv.ParseFloat(r[2], 64)
		var xs []float64
		for _, v := range strings.Fields(r[3]) {
			x, _ := strconv.ParseFloat(v, 64)
			xs = append(xs, x)
		}
		q := percentiles(xs)
		got := map[float64]float64{0.05: q.P5, 0.5: q.P50, 0.95: q.P95}[p]
		if math.Abs(got-want) > 1e-10*math.Abs(want) {
			t.Errorf("%s p=%g: %.15g, scipy %.15g", r[0], p, got, want)
		}
	}
	var xs []float64
	for i := 1; i <= 100; i++ {
		xs = append(xs, float64(i))
	}
	xs = append(xs, math.Inf(1), math.Inf(1))
	if q := percentiles(xs); math.IsInf(q.P5, 0) || math.IsInf(q.P50, 0) || !math.IsInf(q.P95, 1) {
		t.Errorf("with two samples without equilibrium: %+v", q)
	}
}

// The Sobol' points (digitally shifted) put one point in each of the 1024
// intervals of every coordinate among the first 1024, and the first two
// coordinates form a (0, 10, 2)-net: every dyadic box of area 1/1024 holds
// exactly one point (the defining property, Niederreiter 1992; it checks
// the direction numbers typed from Joe & Kuo's table).
func TestSobolNets(t *testing.T) {
	const m = 10
	const n = 1 << m
	u := sobol(n, 7)
	for k := 0; k < dims; k++ {
		seen := make([]bool, n)
		for i := range u {
			s := int(u[i][k] * n)
			if seen[s] {
				t.Fatalf("coordinate %d: interval %d twice", k, s)
			}
			seen[s] = true
		}
	}
	for a := 0; a <= m; a++ {
		nx, ny := 1<<a, 1<<(m-a)
		seen := make([]bool, n)
		for i := range u {
			c := int(u[i][0]*float64(nx))*ny + int(u[i][1]*float64(ny))
			if seen[c] {
				t.Fatalf("boxes %d x %d: one holds two points", nx, ny)
			}
			seen[c] = true
		}
	}
}

// With no spread every sample is the design: the band closes on its
// estimate; with the default spread it opens around it, wider for a wider
// spread, and the probability of exceeding the limit follows.
func TestBandAroundTheEstimate(t *testing.T) {
	d := demotest.Upright(t)
	o, err := d.Evaluate(cylinder.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	zero, err := Estimate(d, cylinder.Settings{}, Spread{}, 50, 1, 0)
	if err != nil {
		t.Fatal(err)
	}
	w := o.Result.Head.WallTemp
	if math.Abs(zero.Head.P5-w) > 1e-6 || math.Abs(zero.Head.P95-w) > 1e-6 {
		t.Errorf("no spread: %+v against %.6f K", zero.Head, w)
	}
	b, err := Estimate(d, cylinder.Settings{}, DefaultSpread(), 400, 1, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !(b.Head.P5 < w && w < b.Head.P95) || !(b.Head.P5 < b.Head.P50 && b.Head.P50 < b.Head.P95) {
		t.Errorf("default spread: %+v around %.2f K", b.Head, w)
	}
	half := DefaultSpread()
	half.Forced, half.Recovery = half.Forced/2, half.Recovery/2
	h, _ := Estimate(d, cylinder.Settings{}, half, 400, 1, 0)
	if !(h.Head.P95-h.Head.P5 < b.Head.P95-b.Head.P5) {
		t.Errorf("a narrower spread gives a band of %.1f K against %.1f K", h.Head.P95-h.Head.P5, b.Head.P95-b.Head.P5)
	}
	if !(b.HeadOver > 0 && b.HeadOver < 1) {
		t.Errorf("P(head over %.1f K) = %g for a band %+v", d.Limits.Head, b.HeadOver, b.Head)
	}
}

// At 1000 samples the percentiles move by under 1 K from seed to seed:
// the standard deviation of each of the six over eight seeds (measured
// before the model-form term: 0.1 to 0.4 K, 0.85 K for the head's 95th
// percentile; with each sample drawing its air-side method, the default
// with half the weight, still under 1 K; with equal weights the head's
// 95th percentile moved by 1.41 K).
func TestBandStableBetweenSeeds(t *testing.T) {
	d := demotest.Upright(t)
	var xs [6][]float64
	for seed := uint64(1); seed <= 8; seed++ {
		b, err := Estimate(d, cylinder.Settings{}, DefaultSpread(), 1000, seed, 0)
		if err != nil {
			t.Fatal(err)
		}
		for k, v := range []float64{b.Head.P5, b.Head.P50, b.Head.P95, b.Barrel.P5, b.Barrel.P50, b.Barrel.P95} {
			xs[k] = append(xs[k], v)
		}
	}
	for k, x := range xs {
		mean, v := 0.0, 0.0
		for _, y := range x {
			mean += y / float64(len(x))
		}
		for _, y := range x {
			v += (y - mean) * (y - mean) / float64(len(x)-1)
		}
		if sd := math.Sqrt(v); sd > 1.0 {
			t.Errorf("percentile %d moves by %.2f K (one standard deviation) between seeds", k, sd)
		}
	}
}

// BenchmarkBand1000 is a 1000-sample band of one design on all cores.
func BenchmarkBand1000(b *testing.B) {
	d := demotest.Upright(b)
	for i := 0; i < b.N; i++ {
		if _, err := Estimate(d, cylinder.Settings{}, DefaultSpread(), 1000, 1, 0); err != nil {
			b.Fatal(err)
		}
	}
}

// The model-form draw: the default method takes the lower half of the
// coordinate, the others share the upper half evenly; with one method
// only (a shroud) every sample takes it.
func TestPickMethod(t *testing.T) {
	c := demotest.Upright(t).Case
	count := map[cylinder.Method]int{}
	const n = 1000
	for i := 0; i < n; i++ {
		count[pickMethod(c, (float64(i)+0.5)/n)]++
	}
	def, _ := c.DefaultMethod()
	others := len(c.Applicable()) - 1
	if count[def] != n/2 || others != 2 {
		t.Fatalf("default %s drawn %d times of %d, %d others", def, count[def], n, others)
	}
	for _, m := range c.Applicable() {
		if m != def && count[m] != n/4 {
			t.Errorf("%s drawn %d times, want %d", m, count[m], n/4)
		}
	}
	c.Supply = cylinder.Supply{Kind: cylinder.SupplyDuct, Drop: 300}
	for _, u := range []float64{0, 0.3, 0.7, 0.999} {
		if m := pickMethod(c, u); m != cylinder.MethodChannel {
			t.Errorf("in a shroud u = %g draws %s", u, m)
		}
	}
}
