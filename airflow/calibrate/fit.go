package calibrate

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/mat"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
)

// Point is one measurement: the operating point and the temperature.
type Point struct {
	Speed    float64 // m/s
	Ambient  float64 // K
	Pressure float64 // Pa
	Temp     float64 // K, measured
	Sigma    float64 // K, the measurement's standard uncertainty (0: 5 K)
	Barrel   bool    // measured on the barrel (false: the head)
	Offset   float64 // K, how much hotter the measuring place runs than the mean fin-root wall (a plug seat: stated by the user; 0 at a fin root)
}

// Check lists what is wrong with a measured point (nothing when it is
// usable): speed 0 to 400 km/h (111.1 m/s), ambient -50 to 60 C (223.15 to
// 333.15 K), the reading between the ambient and 500 C (773.15 K), an
// uncertainty 0 to 100 K and an offset -100 to 200 K (our plausibility
// bounds; the estimator's own ranges are wider).
func (p Point) Check() []string {
	switch {
	case !(p.Speed >= 0 && p.Speed <= 400/3.6):
		return []string{"speed missing or outside 0 to 400 km/h"}
	case !(p.Ambient > 223 && p.Ambient < 333):
		return []string{"ambient missing or outside -50 to 60 C"}
	case !(p.Temp > p.Ambient && p.Temp < 773.15):
		return []string{"the measured temperature must lie between the ambient and 500 C"}
	case !(p.Sigma >= 0 && p.Sigma < 100) || !(p.Offset > -100 && p.Offset < 200):
		return []string{"uncertainty 0 to 100 K, offset -100 to 200 K"}
	}
	return nil
}

// DefaultSigma is a point's uncertainty when none is given: a thermocouple
// under a plug or on a fin root reads to a few kelvin, and the engine's
// own scatter between runs adds as much (common practice).
const DefaultSigma = 5.0

// Param is one fitted parameter.
type Param struct {
	Name     string  `json:"name"`
	Value    float64 `json:"value"`
	StdError float64 `json:"standard_error"`
	Lo       float64 `json:"plausible_low"`
	Hi       float64 `json:"plausible_high"`
}

// Fit is the result.
type Fit struct {
	Params     []Param
	Residuals  []float64 // K, model plus the measuring place's offset less the measurement, per point
	Chi2       float64   // sum of squared residuals over sigma^2
	Iterations int
	Warnings   []string // points the fit misses by more than three of their uncertainties
}

// Get returns the fitted value of the named parameter and whether it was
// fitted.
func (f Fit) Get(name string) (float64, bool) {
	for _, p := range f.Params {
		if p.Name == name {
			return p.Value, true
		}
	}
	return 0, false
}

// The parameters a fit may take.
const (
	Recovery     = "pressure recovery"
	ForcedFactor = "forced convection factor"
	LoadFactor   = "heat load factor"
	Offset       = "measuring-place offset" // K, added to every point's stated offset
)

// ErrNotIdentifiable is wrapped when the points cannot separate the
// parameters.
var ErrNotIdentifiable = errors.New("the points cannot identify the parameters")

// ErrAtBound is wrapped when the best fit needs a parameter at the end of
// its plausible range: the model cannot meet the points with plausible
// values, and the fitted numbers would mislead.
var ErrAtBound = errors.New("the fit rests on the end of a plausible range")

// Calibrate fits the named parameters (Recovery, ForcedFactor, LoadFactor,
// Offset; the recovery alone when none is named) of the design to the
// points. s are the estimator's settings (its factors are the starting
// point). It needs at least as many points as parameters, and points that
// move the parameters apart (ErrNotIdentifiable otherwise: the recovery and
// the forced factor both scale the forced coefficient, so only points at
// road speeds far apart, where the passage flow changes regime, can part
// them).
func Calibrate(d cylinder.Design, s cylinder.Settings, pts []Point, names ...string) (Fit, error) {
	if len(pts) == 0 {
		return Fit{}, errors.New("calibrate: no measured point")
	}
	if d.Walls != nil {
		return Fit{}, errors.New("calibrate: the design fixes its walls")
	}
	if len(names) == 0 {
		names = []string{Recovery}
	}
	for i, p := range pts {
		if bad := p.Check(); len(bad) > 0 {
			return Fit{}, fmt.Errorf("calibrate: point %d: %s", i+1, strings.Join(bad, "; "))
		}
	}
	if len(names) > len(pts) {
		return Fit{}, fmt.Errorf("%w: %d parameters from %d points; give at least one point a parameter", ErrNotIdentifiable, len(names), len(pts))
	}
	rec := d.Case.Recovery
	if rec == 0 {
		rec = cylinder.DefaultRecovery
	}
	one := func(v float64) float64 {
		if v == 0 {
			return 1
		}
		return v
	}
	known := map[string]Param{
		Recovery:     {Name: Recovery, Value: rec, Lo: 0.02, Hi: 1},
		ForcedFactor: {Name: ForcedFactor, Value: one(s.ForcedFactor), Lo: 0.3, Hi: 3},
		LoadFactor:   {Name: LoadFactor, Value: 1, Lo: 0.3, Hi: 3},
		Offset:       {Name: Offset, Value: 0, Lo: -50, Hi: 100},
	}
	var ps []Param
	seen := map[string]bool{}
	for _, n := range names {
		p, ok := known[n]
		if !ok || seen[n] {
			return Fit{}, fmt.Errorf("calibrate: parameter %q unknown or named twice", n)
		}
		seen[n] = true
		ps = append(ps, p)
	}
	x := make([]float64, len(ps))
	for i, p := range ps {
		x[i] = p.Value
	}
	model := func(x []float64) ([]float64, error) { return residuals(d, s, pts, ps, x) }
	f, err := levenbergMarquardt(model, x, ps)
	worst := 0.0
	for i := range f.Residuals {
		sig := sigma(pts[i])
		f.Residuals[i] *= sig
		worst = math.Max(worst, math.Abs(f.Residuals[i]))
		if len(pts) > len(ps) && math.Abs(f.Residuals[i]) > 3*sig {
			f.Warnings = append(f.Warnings, fmt.Sprintf("calibrate: point %d misses by %.1f K, more than three times its uncertainty (%.0f K): check its speed, ambient, place and offset", i+1, f.Residuals[i], sig))
		}
	}
	if err != nil {
		return f, err
	}
	// a parameter pinned to the end of its range (within 1e-3 of the range)
	// means the points ask for more than the model can give
	for _, p := range f.Params {
		if w := 1e-3 * (p.Hi - p.Lo); p.Value < p.Lo+w || p.Value > p.Hi-w {
			return f, fmt.Errorf("%w: the %s went to %.3g, the end of its plausible %.3g to %.3g, and the points are still missed by up to %.0f K; the model cannot meet them with plausible values: check each reading's speed, ambient, place and offset, and the design's load",
				ErrAtBound, p.Name, p.Value, p.Lo, p.Hi, worst)
		}
	}
	return f, nil
}

// sigma is a point's uncertainty, DefaultSigma when none is given.
func sigma(p Point) float64 {
	if p.Sigma > 0 {
		return p.Sigma
	}
	return DefaultSigma
}

// Apply returns the design and settings with the fit's parameters: what a
// calibrated design estimates with (the offset belongs to the measuring
// place, not to the design, and is left out).
func (f Fit) Apply(d cylinder.Design, s cylinder.Settings) (cylinder.Design, cylinder.Settings) {
	x := make([]float64, len(f.Params))
	for i, p := range f.Params {
		x[i] = p.Value
	}
	return apply(d, s, f.Params, x)
}

// apply sets the parameters x on a copy of the design and settings.
func apply(d cylinder.Design, s cylinder.Settings, ps []Param, x []float64) (cylinder.Design, cylinder.Settings) {
	for i, p := range ps {
		switch p.Name {
		case Recovery:
			d.Case.Recovery = x[i]
		case ForcedFactor:
			s.ForcedFactor = x[i]
		case LoadFactor:
			d.Load = d.Load.Scaled(x[i])
		}
	}
	return d, s
}

// residuals are (model + offset - measured)/sigma at each point (a point
// without an equilibrium counts from the search's cap, a large residual).
func residuals(d cylinder.Design, s cylinder.Settings, pts []Point, ps []Param, x []float64) ([]float64, error) {
	dd, ss := apply(d, s, ps, x)
	extra := 0.0
	for i, p := range ps {
		if p.Name == Offset {
			extra = x[i]
		}
	}
	ss.TotalsOnly = true
	out := make([]float64, len(pts))
	for i, p := range pts {
		c := dd
		c.Case.Speed, c.Case.Ambient, c.Case.Pressure = p.Speed, p.Ambient, p.Pressure
		o, err := c.Evaluate(ss)
		if err != nil {
			return nil, fmt.Errorf("point %d: %w", i+1, err)
		}
		r := o.Result.Head
		if p.Barrel {
			r = o.Result.Barrel
		}
		out[i] = (r.WallTemp + p.Offset + extra - p.Temp) / sigma(p)
	}
	return out, nil
}

// levenbergMarquardt minimises the sum of squared residuals within each
// parameter's bounds (steps projected onto the box), the Jacobian by
// central differences of 1e-4 of each parameter's range.
func levenbergMarquardt(f func([]float64) ([]float64, error), x []float64, ps []Param) (Fit, error) {
	r, err := f(x)
	if err != nil {
		return Fit{}, err
	}
	chi := dot(r, r)
	lambda := 1e-3
	n, m := len(r), len(x)
	var jac *mat.Dense
	it := 0
	for ; it < 100; it++ {
		if jac, err = jacobian(f, x, ps, n); err != nil {
			return Fit{}, err
		}
		if err := identifiable(jac, ps); err != nil {
			return Fit{Params: ps}, err
		}
		var jtj mat.Dense
		jtj.Mul(jac.T(), jac)
		g := mat.NewVecDense(m, nil)
		g.MulVec(jac.T(), mat.NewVecDense(n, r))
		improved := false
		for try := 0; try < 20; try++ {
			a := mat.DenseCopyOf(&jtj)
			for i := 0; i < m; i++ {
				a.Set(i, i, a.At(i, i)*(1+lambda))
			}
			var step mat.VecDense
			if err := step.SolveVec(a, g); err != nil {
				lambda *= 10
				continue
			}
			y := make([]float64, m)
			for i := range y {
				y[i] = math.Min(ps[i].Hi, math.Max(ps[i].Lo, x[i]-step.AtVec(i)))
			}
			ry, err := f(y)
			if err == nil && dot(ry, ry) < chi {
				x, r, chi = y, ry, dot(ry, ry)
				lambda = math.Max(lambda/10, 1e-12)
				improved = true
				break
			}
			lambda *= 10
		}
		if !improved || math.Sqrt(dot(g.RawVector().Data, g.RawVector().Data)) < 1e-10 {
			break
		}
	}
	out := Fit{Chi2: chi, Iterations: it}
	for i := range ps {
		p := ps[i]
		p.Value = x[i]
		out.Params = append(out.Params, p)
	}
	out.Residuals = append(out.Residuals, r...)
	// standard errors: the covariance (J^T J)^-1, scaled by the residual
	// variance per degree of freedom when the points outnumber the
	// parameters (Numerical Recipes Sec. 15.4.2)
	var jtj, cov mat.Dense
	jtj.Mul(jac.T(), jac)
	if err := cov.Inverse(&jtj); err == nil {
		scale := 1.0
		if n > m {
			scale = math.Max(chi/float64(n-m), 1)
		}
		for i := range out.Params {
			out.Params[i].StdError = math.Sqrt(math.Max(cov.At(i, i), 0) * scale)
		}
	}
	// the points identify a parameter when they pin it to within a quarter
	// of its plausible range (one standard error; our criterion): the
	// recovery and the forced factor from two nearby speeds are each free
	// over several times their range
	for _, p := range out.Params {
		if !(p.StdError <= 0.25*(p.Hi-p.Lo)) && m > 1 {
			return out, fmt.Errorf("%w: they leave the %s free (%.3g +- %.3g, against a plausible %.3g to %.3g); add a point at a road speed or load far from these, or fit fewer parameters",
				ErrNotIdentifiable, p.Name, p.Value, p.StdError, p.Lo, p.Hi)
		}
	}
	return out, nil
}

func jacobian(f func([]float64) ([]float64, error), x []float64, ps []Param, n int) (*mat.Dense, error) {
	j := mat.NewDense(n, len(x), nil)
	for k := range x {
		h := 1e-4 * (ps[k].Hi - ps[k].Lo)
		lo, hi := append([]float64(nil), x...), append([]float64(nil), x...)
		lo[k] = math.Max(ps[k].Lo, x[k]-h)
		hi[k] = math.Min(ps[k].Hi, x[k]+h)
		rl, err := f(lo)
		if err != nil {
			return nil, err
		}
		rh, err := f(hi)
		if err != nil {
			return nil, err
		}
		for i := 0; i < n; i++ {
			j.Set(i, k, (rh[i]-rl[i])/(hi[k]-lo[k]))
		}
	}
	return j, nil
}

// identifiable refuses a Jacobian whose columns, each scaled by its
// parameter's range, are dependent: the smallest singular value under 1e-6
// of the largest (or a parameter that moves no point). A fit that is only
// weakly identified is refused after it converges (levenbergMarquardt).
func identifiable(j *mat.Dense, ps []Param) error {
	n, m := j.Dims()
	s := mat.NewDense(n, m, nil)
	for k := 0; k < m; k++ {
		for i := 0; i < n; i++ {
			s.Set(i, k, j.At(i, k)*(ps[k].Hi-ps[k].Lo))
		}
	}
	var svd mat.SVD
	if !svd.Factorize(s, mat.SVDThin) {
		return fmt.Errorf("%w: the fit's matrix cannot be factorised", ErrNotIdentifiable)
	}
	v := svd.Values(nil)
	if v[0] == 0 || v[len(v)-1] < 1e-6*v[0] {
		names := make([]string, len(ps))
		for i, p := range ps {
			names[i] = p.Name
		}
		return fmt.Errorf("%w: these points move %v together, so no fit can tell them apart; add a point at another road speed or ambient, or fit fewer parameters", ErrNotIdentifiable, names)
	}
	return nil
}

func dot(a, b []float64) float64 {
	s := 0.0
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

// Narrow returns the band's spread sp as the fit leaves it: each fitted
// input's half-width narrowed to two standard errors (the recovery's
// absolute, the forced and load factors' relative to their value, the load
// factor on the cooling share); and, when the recovery is fitted, the inputs
// it has absorbed at the measured points (cooling share, thermal efficiency,
// head share and forced convection, unless fitted themselves) set to zero.
// Natural convection, conductivity and emissivity keep their half-widths.
// The offset belongs to the measuring place and narrows nothing.
func (f Fit) Narrow(sp uncertainty.Spread) uncertainty.Spread {
	for _, p := range f.Params {
		switch p.Name {
		case Recovery:
			sp.Recovery = 2 * p.StdError
			_, forced := f.Get(ForcedFactor)
			_, load := f.Get(LoadFactor)
			if !forced {
				sp.Forced = 0
			}
			if !load {
				sp.CoolShare = 0
			}
			sp.Thermal, sp.HeadShare = 0, 0
		case ForcedFactor:
			sp.Forced = 2 * p.StdError / p.Value
		case LoadFactor:
			sp.CoolShare = 2 * p.StdError / p.Value
		}
	}
	return sp
}
