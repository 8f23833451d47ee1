package uncertainty

import (
	"errors"
	"math"
	"runtime"
	"sort"
	"sync"

	"gonum.org/v1/gonum/mathext"

	"finmarch/airflow/cylinder"
)

// Spread holds the half-width of each uncertain input: absolute for the
// recovery, the head share and the emissivity, relative (a fraction of the
// design's value) for the rest. A zero half-width keeps the input as
// designed.
type Spread struct {
	Recovery     float64 // absolute, on the pressure recovery
	CoolShare    float64 // relative, on the cooling share of the fuel power
	Thermal      float64 // relative, on the brake thermal efficiency
	HeadShare    float64 // absolute, on the head's share of the fin heat
	Forced       float64 // relative, on the forced coefficient (the correlations' scatter)
	Natural      float64 // relative, on the natural coefficient
	Conductivity float64 // relative, on the alloys' conductivity
	Emissivity   float64 // absolute, on each finish's emissivity
	// Methods draws the air-side method of each sample among those that
	// apply to the design (the model-form term); false keeps the
	// settings' method.
	Methods bool
}

// DefaultSpread is the spread a design gets unless it states its own:
//   - pressure recovery +-0.3 around the design's, held to 0.05 to 1 (our
//     assumption: around the default 0.8 it spans 0.5, a cylinder half
//     shaded by wheel, frame and legs and the default until 2026-12, to 1,
//     Gibson's open tunnel; it is the first thing to calibrate);
//   - cooling share +-20 % (Heywood, Internal Combustion Engine
//     Fundamentals, 1988, Table 12.1: 17 to 26 % of the fuel energy to the
//     coolant of SI engines; from memory);
//   - brake thermal efficiency +-15 % (Heywood 1988, Ch. 15: 20 to 30 % at
//     part load for small SI engines; from memory);
//   - head share +-0.1 (common practice);
//   - forced and natural convection +-25 % (Incropera et al., Fundamentals
//     of Heat and Mass Transfer, 6th ed., Secs. 7.8 and 8.5: errors as large
//     as 25 % from the correlations; from memory);
//   - conductivity +-5 % (handbook scatter between heats of one alloy;
//     common practice);
//   - emissivity +-0.1 (a finish's spread with age and dirt; common
//     practice);
//   - the air-side method drawn among the published methods that apply,
//     the configuration's default with half the weight and the others
//     sharing the rest (the model-form term; the weighting is ours).
func DefaultSpread() Spread {
	return Spread{Recovery: 0.3, CoolShare: 0.2, Thermal: 0.15, HeadShare: 0.1,
		Forced: 0.25, Natural: 0.25, Conductivity: 0.05, Emissivity: 0.1, Methods: true}
}

// Percentiles are the 5th, 50th and 95th percentile of a wall temperature,
// K (+Inf where more than that share of the samples has no equilibrium).
type Percentiles struct {
	P5, P50, P95 float64
}

// Band is what the samples give.
type Band struct {
	Samples       int
	Seed          uint64
	Head, Barrel  Percentiles
	HeadOver      float64 // probability that the head exceeds its limit (no equilibrium counts as over)
	BarrelOver    float64
	NoEquilibrium int // samples where a set finds no equilibrium below the search's cap
	Failed        int // samples the estimator refused (out of its ranges after the draw)
}

// dims are the sampled inputs, in the order of a sample's coordinates.
const dims = 10

// Estimate samples the design n times (a randomised Sobol' sequence,
// seed fixed) on
// workers goroutines (0: all cores) and returns the band. Each sample
// changes a copy of the design: the case's recovery and emissivities, the
// road load's shares and efficiency (a load given directly is scaled by
// the same cooling-share factor), and the settings' factors. Fixed walls
// take no band (an error).
func Estimate(d cylinder.Design, s cylinder.Settings, sp Spread, n int, seed uint64, workers int) (Band, error) {
	if d.Walls != nil {
		return Band{}, errors.New("uncertainty: a design with fixed walls has no temperature to band")
	}
	if n < 10 || n > 1e6 {
		return Band{}, errors.New("uncertainty: samples outside 10 to 1000000")
	}
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	u := sobol(n, seed)
	head := make([]float64, n)
	barrel := make([]float64, n)
	noEq := make([]bool, n)
	failed := make([]bool, n)
	var wg sync.WaitGroup
	next := make(chan int, 64)
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			set := s
			set.Workspace, set.TotalsOnly = cylinder.NewWorkspace(), true
			for i := range next {
				v, vs := draw(d, set, sp, u[i])
				o, err := v.Evaluate(vs)
				if err != nil {
					failed[i] = true
					continue
				}
				head[i], barrel[i] = o.Result.Head.WallTemp, o.Result.Barrel.WallTemp
				if !o.Result.Head.Equilibrium {
					head[i], noEq[i] = math.Inf(1), true
				}
				if !o.Result.Barrel.Equilibrium {
					barrel[i], noEq[i] = math.Inf(1), true
				}
			}
		}()
	}
	for i := 0; i < n; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
	b := Band{Samples: n, Seed: seed}
	var hs, bs []float64
	for i := 0; i < n; i++ {
		if failed[i] {
			b.Failed++
			continue
		}
		if noEq[i] {
			b.NoEquilibrium++
		}
		hs, bs = append(hs, head[i]), append(bs, barrel[i])
		if head[i] > d.Limits.Head {
			b.HeadOver++
		}
		if barrel[i] > d.Limits.Barrel {
			b.BarrelOver++
		}
	}
	if len(hs) == 0 {
		return b, errors.New("uncertainty: the estimator refused every sample")
	}
	b.HeadOver /= float64(len(hs))
	b.BarrelOver /= float64(len(hs))
	b.Head, b.Barrel = percentiles(hs), percentiles(bs)
	return b, nil
}

// draw applies sample x (coordinates in [0, 1)) to a copy of the design,
// and picks the sample's air-side method by the last coordinate.
// The inputs that move the wall most take the first coordinates, where
// Sobol' points are most even: the forced coefficient, the cooling share,
// the thermal efficiency, the recovery.
func draw(d cylinder.Design, s cylinder.Settings, sp Spread, x [dims]float64) (cylinder.Design, cylinder.Settings) {
	at := func(k int, half float64) float64 { return (2*x[k] - 1) * half } // uniform in [-half, half)
	c := &d.Case
	rec := c.Recovery
	if rec == 0 {
		rec = cylinder.DefaultRecovery
	}
	c.Recovery = clamp(rec+at(3, sp.Recovery), 0.05, 1)
	d.Load = d.Load.Scaled(1 + at(1, sp.CoolShare))
	if r := &d.Load.Road; !d.Load.Direct {
		def := func(v, dflt float64) float64 {
			if v == 0 {
				return dflt
			}
			return v
		}
		r.CoolShare = clamp(r.CoolShare, 0.01, 0.9)
		r.Thermal = clamp(def(r.Thermal, cylinder.DefaultThermal)*(1+at(2, sp.Thermal)), 0.05, 0.6)
		r.HeadShare = clamp(def(r.HeadShare, cylinder.DefaultHeadShare)+at(5, sp.HeadShare), 0.05, 1)
	}
	one := func(v float64) float64 {
		if v == 0 {
			return 1
		}
		return v
	}
	s.ForcedFactor = one(s.ForcedFactor) * (1 + at(0, sp.Forced))
	s.NaturalFactor = one(s.NaturalFactor) * (1 + at(4, sp.Natural))
	s.ConductivityFactor = one(s.ConductivityFactor) * (1 + at(6, sp.Conductivity))
	c.Head.Emissivity = clamp(c.Head.Emissivity+at(7, sp.Emissivity), 0.02, 1)
	c.Barrel.Emissivity = clamp(c.Barrel.Emissivity+at(8, sp.Emissivity), 0.02, 1)
	// the model-form term: each sample takes one of the air-side methods
	// that apply, the configuration's default with half the weight and
	// the others sharing the rest, so that the spread between the
	// published methods widens the band beside the inputs' scatter (a
	// method named in the settings is kept)
	s.OneMethod = true
	if sp.Methods && s.Method == cylinder.MethodAuto {
		s.Method = pickMethod(d.Case, x[9])
	}
	return d, s
}

// pickMethod returns the air-side method of a sample whose coordinate is
// u in [0, 1): the case's default for u < 1/2, else one of the other
// applicable methods, evenly (our weighting: the default is the method
// this project judges the best founded for the configuration, and the
// others widen the band without moving its middle past it).
func pickMethod(c cylinder.Case, u float64) cylinder.Method {
	def, _ := c.DefaultMethod()
	var others []cylinder.Method
	for _, m := range c.Applicable() {
		if m != def {
			others = append(others, m)
		}
	}
	if u < 0.5 || len(others) == 0 {
		return def
	}
	return others[min(int((u-0.5)*2*float64(len(others))), len(others)-1)]
}

func clamp(v, lo, hi float64) float64 { return math.Min(hi, math.Max(lo, v)) }

// percentiles estimates the 5th, 50th and 95th percentile of xs by the
// Harrell-Davis estimator (Harrell & Davis, Biometrika 69, 1982): a
// weighted sum of all order statistics with weights from the Beta(p(n+1),
// (1-p)(n+1)) distribution, much steadier from sample to sample than one
// or two order statistics at the tails. A percentile whose weight falls on
// samples without an equilibrium (+Inf) is +Inf.
func percentiles(xs []float64) Percentiles {
	sort.Float64s(xs)
	n := float64(len(xs))
	q := func(p float64) float64 {
		a, b := p*(n+1), (1-p)*(n+1)
		sum, prev := 0.0, 0.0
		for i, x := range xs {
			c := mathext.RegIncBeta(a, b, float64(i+1)/n)
			w := c - prev
			prev = c
			if w <= 0 {
				continue
			}
			if math.IsInf(x, 1) {
				if w > 1e-6 {
					return math.Inf(1)
				}
				continue
			}
			sum += w * x
		}
		return sum
	}
	return Percentiles{P5: q(0.05), P50: q(0.5), P95: q(0.95)}
}
