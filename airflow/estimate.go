package airflow

import (
	"errors"
	"fmt"
	"math"
	"sync"

	"finmarch/airflow/roots"
	"finmarch/fins"
	"finmarch/fins/validity"
	"finmarch/materials"
)

// Model constants with their sources.
const (
	// DefaultSegments is the number of march segments per air path.
	DefaultSegments = 40
	// SegmentGrading spaces the segment ends as L (i/N)^SegmentGrading,
	// finer at the entrance where h falls steeply; the march result moves
	// less with N than on a uniform grid (TestSegmentIndependence).
	SegmentGrading = 2 // the march squares i/N directly
	// DefaultEntryLoss is the loss coefficient of the sharp-edged passage
	// entry, in velocity heads of the passage (Idelchik, Handbook of
	// Hydraulic Resistance, 3rd ed. 1994, Diagram 3-1: 0.5 for a
	// sharp-edged inlet; from memory).
	DefaultEntryLoss = 0.5
	// DefaultExitLoss is the kinetic energy of the passage flow lost at
	// the exit, one velocity head (Borda-Carnot into open air; Idelchik
	// 1994, Diagram 4-1; from memory).
	DefaultExitLoss = 1.0
	// DefaultRecovery is the share of the road speed's dynamic pressure
	// available across the fin passages of an uncowled cylinder, 0.5
	// (common practice; it lumps the blockage of frame, tank and legs and
	// should be calibrated against a measured head temperature).
	DefaultRecovery = 0.5
	// minDrive is the driving pressure (Pa) below which a passage is taken
	// to have no forced flow: a road-speed component under about 1 mm/s,
	// such as cos 90 deg in floating point.
	minDrive = 1e-6
	// balanceTol is the relative heat balance at which the wall search
	// stops: 1e-5 of the load, about 2 mK at a wall 150-250 K above
	// ambient (Q is nearly proportional to the wall excess).
	balanceTol = 1e-5
	// SaneWallLimit is the highest wall temperature the balance searches,
	// 500 C: aluminium heads are long past their limits there.
	SaneWallLimit = 773.15
)

// FinSet is one fin set with its material and finish.
type FinSet struct {
	Name       string // "head" or "barrel"
	Set        fins.Set
	Alloy      materials.Alloy
	Emissivity float64 // -, of the finish
}

// Case is one cylinder in one operating condition.
type Case struct {
	Tilt      float64 // rad, cylinder axis from vertical: 0 upright, pi/2 laid over
	Head      FinSet
	Barrel    FinSet
	Speed     float64 // m/s, road speed (air speed relative to the cylinder)
	Recovery  float64 // -, share of the dynamic pressure available across the fins
	Ambient   float64 // K
	Pressure  float64 // Pa
	Segments  int     // march segments per path; 0 means DefaultSegments
	FixedH    float64 // W/(m2 K), a measured forced-convection coefficient; 0 uses the correlations
	EntryLoss float64 // passage entry loss coefficient; 0 means DefaultEntryLoss
	ExitLoss  float64 // passage exit loss coefficient; 0 means DefaultExitLoss
	// TotalsOnly leaves SetResult.March empty: sweeps and the optimiser
	// need the totals, not the segment-by-segment profile.
	TotalsOnly bool
	// Curves, when set, keeps the fin-efficiency curves of fin sets already
	// seen, so that a sweep over speed, ambient or load does not tabulate
	// the same fins again. It is not safe for concurrent use: give each
	// goroutine its own.
	Curves *CurveCache
}

// CurveCache holds fin-efficiency curves by fin set, at most a few hundred
// (it starts afresh when full, so its memory stays bounded).
type CurveCache struct {
	m    map[fins.Set]*fins.Curve
	segs map[segKey][]segPre // march position terms by path and segment count
}

// NewCurveCache returns an empty cache.
func NewCurveCache() *CurveCache { return &CurveCache{m: map[fins.Set]*fins.Curve{}} }

const curveCacheSize = 256

func (cc *CurveCache) get(s fins.Set, g fins.Geometry) *fins.Curve {
	if cc == nil {
		return s.NewCurve(g)
	}
	if c, ok := cc.m[s]; ok {
		return c
	}
	if len(cc.m) >= curveCacheSize {
		clear(cc.m)
	}
	c := s.NewCurve(g)
	cc.m[s] = c
	return c
}

// Segment is one step of the march along an air path. Heat and areas are
// totals over all parallel paths of the set.
type Segment struct {
	X        float64 `json:"x_m"`       // m, path position at the segment's end
	AirIn    float64 `json:"air_in_K"`  // K
	AirOut   float64 `json:"air_out_K"` // K
	H        float64 `json:"h_W_m2K"`   // W/(m2 K), forced coefficient, segment mean
	FinEff   float64 `json:"fin_eff"`   // -, fin efficiency at that h
	Flux     float64 `json:"flux_W_m2"` // W/m2 of finned surface (fins + base)
	Heat     float64 `json:"heat_W"`    // W
	Reynolds float64 `json:"reynolds"`  // Reynolds number on the plate hydraulic diameter
}

// Path says how air reaches a fin set.
type Path struct {
	Component   float64 // m/s, road-speed component along the fin passages
	Paths       int     // parallel air paths through the set
	Length      float64 // m, one path
	FlowArea    float64 // m2, one path's cross-section
	Dh          float64 // m, parallel-plate hydraulic diameter 2 s
	AreaPerPath float64 // m2, finned surface served by one path
	Series      bool    // true when the set sits on the head-then-barrel path
}

// SetResult is the outcome for one fin set.
type SetResult struct {
	Name              string    `json:"name"`
	Style             string    `json:"style"`
	HeatLoad          float64   `json:"heat_load_W"`
	HeatRejected      float64   `json:"heat_rejected_W"`
	ForcedHeat        float64   `json:"forced_heat_W"`
	NaturalHeat       float64   `json:"natural_heat_W"`
	ConvectionHeat    float64   `json:"convection_heat_W"`
	RadiationHeat     float64   `json:"radiation_heat_W"`
	WallTemp          float64   `json:"wall_temperature_K"`
	MeanH             float64   `json:"mean_h_W_m2K"`
	NaturalH          float64   `json:"natural_h_W_m2K"`
	FinEfficiency     float64   `json:"fin_efficiency"`
	SurfaceEfficiency float64   `json:"surface_efficiency"`
	AirIn             float64   `json:"air_inlet_K"`
	AirOut            float64   `json:"air_outlet_K"`
	PassageVelocity   float64   `json:"passage_velocity_m_s"`
	ApproachComponent float64   `json:"approach_component_m_s"`
	Reynolds          float64   `json:"reynolds"`
	Regime            string    `json:"regime"`
	Paths             int       `json:"paths"`
	PathLength        float64   `json:"path_length_m"`
	Series            bool      `json:"series_path"`
	FinArea           float64   `json:"fin_area_m2"`
	TotalArea         float64   `json:"total_area_m2"`
	FinMass           float64   `json:"fin_mass_kg"`
	EnergyImbalance   float64   `json:"energy_imbalance"`
	March             []Segment `json:"march"`
}

// Result is the outcome for one cylinder.
type Result struct {
	Head      SetResult          `json:"head"`
	Barrel    SetResult          `json:"barrel"`
	Warnings  []validity.Warning `json:"warnings"`
	Ambient   float64            `json:"ambient_K"`
	Pressure  float64            `json:"pressure_Pa"`
	Speed     float64            `json:"speed_m_s"`
	TiltDeg   float64            `json:"tilt_deg"`
	MaxImbal  float64            `json:"energy_imbalance_max"`
	Converged bool               `json:"converged"`
}

// ErrNoEquilibrium is wrapped by Balance when the fins cannot reject the
// load at any wall temperature up to SaneWallLimit.
var ErrNoEquilibrium = errors.New("no equilibrium")

type prepared struct {
	c            Case
	hg, bg       fins.Geometry
	hc, bc       *fins.Curve // fin efficiency against h/k, filled as the march needs it
	scratch      validity.Log
	segBuf       []Segment           // the march of the latest trial
	pre          map[segKey][]segPre // position terms by path and segment count
	exactFilm    bool                // film powers exact at every segment (tests)
	hp, bp       Path
	hm, bm       float64 // mass flow per path, kg/s
	hvel, bvel   float64 // passage velocity at inlet density, m/s
	n            int
	amb          Air
	log          *validity.Log
	kin, kout    float64
	seriesActive bool
}

func (c Case) validate() error {
	switch {
	case !(c.Tilt >= 0 && c.Tilt <= math.Pi/2+1e-12):
		return fmt.Errorf("tilt %g deg outside 0 to 90", c.Tilt*180/math.Pi)
	case !(c.Speed >= 0 && c.Speed <= 150):
		return fmt.Errorf("speed %g m/s outside 0 to 150", c.Speed)
	case !(c.Recovery > 0 && c.Recovery <= 1):
		return fmt.Errorf("pressure recovery %g outside 0 (exclusive) to 1", c.Recovery)
	case !(c.Ambient > 200 && c.Ambient < 350):
		return fmt.Errorf("ambient %g K outside 200 to 350 K", c.Ambient)
	case !(c.Pressure > 2e4 && c.Pressure < 1.2e5):
		return fmt.Errorf("pressure %g Pa outside 20 to 120 kPa", c.Pressure)
	case c.Segments < 0 || c.Segments > 100000:
		return fmt.Errorf("segments %d outside 1 to 100000", c.Segments)
	case !(c.FixedH >= 0 && c.FixedH < 1e4):
		return fmt.Errorf("fixed h %g W/(m2 K) outside 0 to 10000", c.FixedH)
	}
	for _, s := range []FinSet{c.Head, c.Barrel} {
		if !(s.Emissivity > 0 && s.Emissivity <= 1) {
			return fmt.Errorf("%s: emissivity %g outside 0 to 1", s.Name, s.Emissivity)
		}
		if !(s.Alloy.K300 > 0) || !(s.Alloy.Density > 0) {
			return fmt.Errorf("%s: alloy %q has no conductivity or density", s.Name, s.Alloy.Name)
		}
	}
	return nil
}

func (c Case) prepare(log *validity.Log) (*prepared, error) {
	if err := c.validate(); err != nil {
		return nil, err
	}
	p := &prepared{c: c, log: log, n: c.Segments, kin: c.EntryLoss, kout: c.ExitLoss}
	if p.n == 0 {
		p.n = DefaultSegments
	}
	if p.kin == 0 {
		p.kin = DefaultEntryLoss
	}
	if p.kout == 0 {
		p.kout = DefaultExitLoss
	}
	var err error
	if p.hg, err = c.Head.Set.Geometry(); err != nil {
		return nil, fmt.Errorf("head fins: %w", err)
	}
	if p.bg, err = c.Barrel.Set.Geometry(); err != nil {
		return nil, fmt.Errorf("barrel fins: %w", err)
	}
	p.hc, p.bc = c.Curves.get(c.Head.Set, p.hg), c.Curves.get(c.Barrel.Set, p.bg)
	p.amb = Properties(c.Ambient, c.Pressure, log)
	p.hp = path(c.Head.Set, p.hg, c.Speed, c.Tilt)
	p.bp = path(c.Barrel.Set, p.bg, c.Speed, c.Tilt)
	if c.Head.Set.Style == fins.StyleLongitudinal && c.Barrel.Set.Style == fins.StyleLongitudinal {
		p.hp.Series, p.bp.Series = true, true
		p.seriesActive = true
	}
	q := c.Recovery * 0.5 * p.amb.Rho * c.Speed * c.Speed
	if p.seriesActive {
		w, err := p.seriesFlow(q * sq(p.hp.Component/math.Max(c.Speed, 1e-300)))
		if err != nil {
			return nil, err
		}
		p.hm, p.bm = w/float64(p.hp.Paths), w/float64(p.bp.Paths)
	} else {
		var err error
		if p.hm, err = p.parallelFlow(p.hp, q*sq(p.hp.Component/math.Max(c.Speed, 1e-300))); err != nil {
			return nil, fmt.Errorf("head passages: %w", err)
		}
		if p.bm, err = p.parallelFlow(p.bp, q*sq(p.bp.Component/math.Max(c.Speed, 1e-300))); err != nil {
			return nil, fmt.Errorf("barrel passages: %w", err)
		}
	}
	p.hvel = p.hm / (p.amb.Rho * p.hp.FlowArea)
	p.bvel = p.bm / (p.amb.Rho * p.bp.FlowArea)
	return p, nil
}

func sq(x float64) float64 { return x * x }

// path applies the orientation model: annular fins take the road-speed
// component in the fin plane (V cos tilt) and the air runs half the
// circumference at mid-fin radius on each side, two parallel paths per
// passage, each fed with ambient air; longitudinal fins take the component
// along the axis (V sin tilt) over the finned length. The broadside
// component (hitting the fin faces) is assumed to add nothing: a
// conservative simplification, stated in the README.
func path(s fins.Set, g fins.Geometry, v, tilt float64) Path {
	p := Path{FlowArea: g.PassageArea, Dh: g.PlateDiameter}
	if s.Style == fins.StyleAnnular {
		p.Component = v * math.Cos(tilt)
		p.Paths = 2 * g.Passages
		p.Length = math.Pi * (s.RootDiameter/2 + s.Height/2)
	} else {
		p.Component = v * math.Sin(tilt)
		p.Paths = g.Passages
		p.Length = s.Length
	}
	p.AreaPerPath = g.TotalArea / float64(p.Paths)
	return p
}

// lossCoeff is the friction part 4 f_app L/Dh of a passage at velocity v.
func (p *prepared) friction(pt Path, v float64) float64 {
	re := p.amb.Rho * v * pt.Dh / p.amb.Mu
	if re < 1e-9 {
		re = 1e-9
	}
	cf := Channel(re, p.amb.Pr, pt.Length/pt.Dh, nil)
	return 4 * cf.Fapp * pt.Length / pt.Dh
}

// parallelFlow solves the passage velocity at which the available pressure
// dp (Pa) equals entry + exit + developing-flow friction losses,
// dp = 0.5 rho V^2 (K_in + K_out + 4 f_app L/Dh), and returns the mass
// flow per path (kg/s).
func (p *prepared) parallelFlow(pt Path, dp float64) (float64, error) {
	if dp <= minDrive {
		return 0, nil
	}
	rho := p.amb.Rho
	g := func(v float64) float64 {
		return 0.5*rho*v*v*(p.kin+p.kout+p.friction(pt, v)) - dp
	}
	vmax := math.Sqrt(2*dp/(rho*(p.kin+p.kout))) * 1.0001
	v, err := roots.Brent(g, 1e-9*vmax, vmax, 1e-10*vmax, 200)
	if err != nil {
		return 0, fmt.Errorf("passage velocity: %w", err)
	}
	return rho * v * pt.FlowArea, nil
}

// change is the loss, in units of 0.5 rho, where the flow passes from the
// head passages (velocity v1, total area a1) to the barrel passages (v2,
// a2): a sudden expansion loses (v1 - v2)^2 (Borda-Carnot); a sudden
// contraction loses 0.5 (1 - a2/a1) v2^2 (the common approximation of
// Idelchik 1994, Diagram 3-9; from memory).
func change(v1, v2, a1, a2 float64) float64 {
	if v1 >= v2 {
		return sq(v1 - v2)
	}
	return 0.5 * (1 - a2/a1) * v2 * v2
}

// seriesFlow solves the total mass flow (kg/s) through the head passages
// and then the barrel passages: entry loss and friction in the head, the
// loss of the change of passage area, friction and exit loss in the
// barrel.
func (p *prepared) seriesFlow(dp float64) (float64, error) {
	if dp <= minDrive {
		return 0, nil
	}
	rho := p.amb.Rho
	ah := float64(p.hp.Paths) * p.hp.FlowArea
	ab := float64(p.bp.Paths) * p.bp.FlowArea
	g := func(w float64) float64 {
		vh, vb := w/(rho*ah), w/(rho*ab)
		return 0.5*rho*(vh*vh*(p.kin+p.friction(p.hp, vh))+change(vh, vb, ah, ab)+vb*vb*(p.kout+p.friction(p.bp, vb))) - dp
	}
	wmax := math.Sqrt(2*dp*rho/(p.kin/(ah*ah)+p.kout/(ab*ab))) * 1.0001
	w, err := roots.Brent(g, 1e-9*wmax, wmax, 1e-10*wmax, 200)
	if err != nil {
		return 0, fmt.Errorf("series passage flow: %w", err)
	}
	return w, nil
}

// meanCp returns the mean of the Cengel cp cubic over [t1, t2] (K), J/(kg
// K): (H(t2) - H(t1))/(t2 - t1) in closed form, exact for t1 = t2 and free
// of the cancellation of the difference quotient. With cp = (a + bT + cT^2
// + dT^3)/M it is
//
//	(a + b (t1+t2)/2 + c (t1^2+t1 t2+t2^2)/3 + d (t1+t2)(t1^2+t2^2)/4)/M.
func meanCp(t1, t2 float64) float64 {
	s, p := t1+t2, t1*t2
	q := s*s - p // t1^2 + t1 t2 + t2^2
	return h0 + h1*s + h2*q - h3*s*(q-p)
}

// The coefficients of the enthalpy H(T) = T (h0 + T (h1 + T (h2 - T h3)))
// of dry air relative to 0 K, the Cengel cp cubic integrated and divided by
// the molar mass once (J/kg per power of K).
const (
	hScale = 1000 / MolarMassAir
	h0     = 28.11 * hScale
	h1     = 0.1967e-2 / 2 * hScale
	h2     = 0.4802e-5 / 3 * hScale
	h3     = 1.966e-9 / 4 * hScale
)

type marchOut struct {
	q, qMetal, tOut float64
	hA, etaA, area  float64 // area-weighted sums
	re              float64
	regime          string
	seg             []Segment
}

// segPre holds what the march needs at a segment end that depends only on
// its position: x itself, (x/Dh)^-1.14, (x/Dh)^-0.64 and (Dh/x)^(2/3).
type segPre struct{ x, e1, e2, d23 float64 }

type segKey struct {
	length, dh float64
	n          int
}

// gradePow holds, for segment end i of n, r^2 with r = i/n (the graded
// position x/L) and the powers (r^2)^-1.14, (r^2)^-0.64 and (r^2)^(-2/3).
type gradePow struct{ r2, p114, p064, p43 float64 }

// grades keeps the gradePow tables by segment count, shared by all
// goroutines (read-mostly, so a sync.Map).
var grades sync.Map

func gradePowers(n int) []gradePow {
	if g, ok := grades.Load(n); ok {
		return g.([]gradePow)
	}
	g := make([]gradePow, n+1)
	for i := 1; i <= n; i++ {
		r := float64(i) / float64(n)
		r2 := r * r
		l := math.Log(r2)
		c := math.Cbrt(r2)
		g[i] = gradePow{r2: r2, p114: math.Exp(-1.14 * l), p064: math.Exp(-0.64 * l), p43: 1 / (c * c)}
	}
	if n <= 1000 { // the usual counts; a rare huge one is not kept
		grades.Store(n, g)
	}
	return g
}

// segments returns the position terms of the n segment ends of a path,
// computed once per path and segment count.
func (p *prepared) segments(pt Path, n int) []segPre {
	// a sweep's worker keeps them across its points in the curve cache;
	// a lone estimate keeps them for its own trials
	store := &p.pre
	if p.c.Curves != nil {
		store = &p.c.Curves.segs
	}
	k := segKey{pt.Length, pt.Dh, n}
	if s, ok := (*store)[k]; ok {
		return s
	}
	// x_i/Dh = (L/Dh) (i/N)^2, so each term is a power of L/Dh times a
	// power of i/N that serves every path
	g := gradePowers(n)
	ld := pt.Length / pt.Dh
	lld := math.Log(ld)
	a1, a2 := math.Exp(-1.14*lld), math.Exp(-0.64*lld)
	c := math.Cbrt(1 / ld)
	a3 := c * c
	s := make([]segPre, n+1)
	for i := 1; i <= n; i++ {
		q := &g[i]
		s[i] = segPre{x: pt.Length * q.r2, e1: a1 * q.p114, e2: a2 * q.p064, d23: a3 * q.p43}
	}
	if *store == nil || len(*store) >= curveCacheSize {
		*store = map[segKey][]segPre{}
	}
	(*store)[k] = s
	return s
}

// march steps one air path of a set at wall temperature tw (K) from inlet
// temperature tin (K) with mass flow mdot (kg/s) per path. In each of n
// segments it takes film properties at the mean of wall and local air
// temperature, the segment-mean forced coefficient from the developing-flow
// correlation as d(x h_m(x))/dx between the segment ends, the fin
// efficiency at that h, and the exact exponential pick-up of heat,
// T_out = T_w - (T_w - T_in) exp(-NTU), NTU = eta_o h A / (mdot cp), with
// cp the mean over the segment's temperature rise.
func (p *prepared) march(fs FinSet, g fins.Geometry, cv *fins.Curve, pt Path, tw, tin, mdot float64, keep bool) marchOut {
	var out marchOut
	out.tOut = tin
	if mdot <= 0 {
		return out
	}
	n := p.n
	// segment ends x_i = L (i/N)^SegmentGrading crowd the entrance, where
	// the developing-flow coefficient changes fastest
	perLen := pt.AreaPerPath / pt.Length
	k := fs.Alloy.Conductivity(tw)
	paths := float64(pt.Paths)
	if keep {
		if cap(p.segBuf) < n {
			p.segBuf = make([]Segment, 0, n)
		}
		out.seg = p.segBuf[:0]
	}
	pre := p.segments(pt, n)
	reC := mdot / pt.FlowArea * pt.Dh // Re = reC / mu
	t := tin
	prevXNu := 0.0
	xPrev := 0.0
	rise := 0.0 // the previous segment's air temperature rise
	fp := filmPowers{n: -1, exact: p.exactFilm}
	for i := 1; i <= n; i++ {
		// film properties at the mean of wall and local air temperature
		// (Properties, without the pressure check done once in prepare)
		tf := 0.5 * (tw + t)
		p.log.Check(propsName, propsTemp, tf, 250, 1000)
		mu, kAir, cpF := transport(tf)
		pr := mu * cpF / kAir
		re := reC / mu
		x := pre[i].x
		dx := x - xPrev
		aSeg := perLen * dx
		xPrev = x
		var h float64
		if p.c.FixedH > 0 {
			h = p.c.FixedH
		} else {
			// segment mean of the local coefficient, d(x h_m)/dx, from the
			// mean-Nu correlation at both segment ends; the upstream end
			// carries the previous segment's film properties, so the sum of
			// the segments telescopes to the correlation's mean over the path
			// range checks at the path's end, where x/Dh is the whole
			// passage's L/Dh; upstream segments are the correlation's own
			// entrance region
			var nu float64
			if i == n {
				var regime string
				nu, regime = ChannelNu(re, pr, x/pt.Dh, p.log)
				out.regime = regime
			} else {
				fp.step(pr, mu, re)
				sp := &pre[i]
				nu = nuPowers(re, &fp, sp.e1, sp.e2, sp.d23)
			}
			xNuK := x * nu * kAir
			h = (xNuK - prevXNu) / dx / pt.Dh
			prevXNu = xNuK
		}
		etaF := cv.Efficiency(h, k, p.log)
		etaO := g.SurfaceEfficiency(etaF)
		ua := etaO * h * aSeg
		// cp is the mean over the segment's rise, found by fixed-point
		// passes from the previous segment's rise; each pass rescales
		// exp(-NTU) by exp(NTU_old - NTU_new), a small argument summed by
		// its series, so one exponential serves the segment
		cp := meanCp(t, t+rise)
		ntu := ua / (mdot * cp)
		e := math.Exp(-ntu)
		tOut := tw - (tw-t)*e
		for it := 0; it < 8; it++ {
			next := meanCp(t, tOut)
			if math.Abs(next-cp) <= 1e-11*cp {
				break
			}
			nn := ua / (mdot * next)
			d := ntu - nn
			if math.Abs(d) < 1e-3 {
				e *= 1 + d*(1+d*0.5*(1+d*(1.0/3)*(1+d*0.25)))
			} else {
				e = math.Exp(-nn)
			}
			cp, ntu = next, nn
			tOut = tw - (tw-t)*e
		}
		rise = tOut - t
		qAir := mdot * cp * rise // = mdot (H(tOut) - H(t))
		// metal side: UA times the exact mean driving difference of the
		// segment, (1 - exp(-NTU))/NTU, with 1 - e direct where it keeps
		// its digits
		var qMetal float64
		switch {
		case ntu > 1e-3:
			qMetal = ua * (tw - t) * (1 - e) / ntu
		case ntu > 1e-12:
			qMetal = ua * (tw - t) * (-math.Expm1(-ntu)) / ntu
		default:
			qMetal = ua * (tw - t)
		}
		out.q += qAir * paths
		out.qMetal += qMetal * paths
		out.hA += h * aSeg * paths
		out.etaA += etaF * aSeg * paths
		out.area += aSeg * paths
		out.re = re
		if keep {
			out.seg = append(out.seg, Segment{X: x, AirIn: t, AirOut: tOut, H: h, FinEff: etaF,
				Flux: qAir / aSeg, Heat: qAir * paths, Reynolds: re})
		}
		t = tOut
	}
	if p.c.FixedH > 0 {
		out.regime = "fixed h"
	}
	out.tOut = t
	if keep {
		p.segBuf = out.seg // keep the grown buffer for the next trial
	}
	return out
}

// natural returns the natural-convection heat (W) and coefficient of a set
// at wall temperature tw: the passages are treated as vertical channels of
// height equal to the tip diameter (annular) or the finned length
// (longitudinal) by Bar-Cohen & Rohsenow (1984), with the fin efficiency
// at that h. Orientation effects on free convection are not modelled.
func (p *prepared) natural(fs FinSet, g fins.Geometry, cv *fins.Curve, tw float64) (float64, float64, float64) {
	dT := tw - p.c.Ambient
	if dT <= 0 {
		return 0, 0, 1
	}
	air := Properties(0.5*(tw+p.c.Ambient), p.c.Pressure, p.log)
	L := g.TipDiameter
	if fs.Set.Style == fins.StyleLongitudinal {
		L = fs.Set.Length
	}
	s := g.GapMean
	el := Rayleigh(air, s, dT) * s / L
	h := VerticalChannelNaturalNu(el, p.log) * air.K / s
	eta := cv.Efficiency(h, fs.Alloy.Conductivity(tw), p.log)
	return h * g.SurfaceEfficiency(eta) * g.TotalArea * dT, h, eta
}

// setHeat evaluates one fin set at wall temperature tw with air entering
// at tin: forced march, natural convection combined as
// Q^3 = Q_F^3 + Q_N^3 (Churchill 1977), and radiation from the envelope at
// the mean fin surface temperature T_a + eta_o (T_w - T_a) to surroundings
// at ambient (Incropera 6th ed. Eq. 1.7).
func (p *prepared) setHeat(fs FinSet, g fins.Geometry, cv *fins.Curve, pt Path, tw, tin, mdot float64, keep bool) (SetResult, marchOut) {
	m := p.march(fs, g, cv, pt, tw, tin, mdot, keep)
	qn, hn, etaN := p.natural(fs, g, cv, tw)
	qc := math.Cbrt(m.q*m.q*m.q + qn*qn*qn)
	r := SetResult{Name: fs.Name, Style: fs.Set.Style.String(), WallTemp: tw, AirIn: tin, AirOut: m.tOut,
		ForcedHeat: m.q, NaturalHeat: qn, ConvectionHeat: qc, NaturalH: hn, Paths: pt.Paths, PathLength: pt.Length,
		Series: pt.Series, FinArea: g.FinArea, TotalArea: g.TotalArea, FinMass: g.FinVolume * fs.Alloy.Density,
		ApproachComponent: pt.Component, Reynolds: m.re, Regime: m.regime, March: m.seg}
	if m.area > 0 {
		r.MeanH = m.hA / m.area
		r.FinEfficiency = m.etaA / m.area
	} else {
		r.MeanH, r.FinEfficiency, r.Regime = hn, etaN, "natural only"
	}
	r.SurfaceEfficiency = g.SurfaceEfficiency(r.FinEfficiency)
	ts := p.c.Ambient + r.SurfaceEfficiency*(tw-p.c.Ambient)
	r.RadiationHeat = fs.Emissivity * Sigma * g.EnvelopeArea * (ts*ts*ts*ts - math.Pow(p.c.Ambient, 4))
	r.HeatRejected = qc + r.RadiationHeat
	// relative to the heat, or to a milliwatt when the heat is nil (a wall
	// at the temperature of its inlet air) and only rounding is left
	r.EnergyImbalance = math.Abs(m.qMetal-m.q) / math.Max(math.Abs(m.q), 1e-3)
	return r, m
}

// own gives a result its own copy of the march, which setHeat leaves in the
// shared trial buffer.
func own(r *SetResult) {
	r.March = append([]Segment(nil), r.March...)
}

// AtWall evaluates the case with both wall temperatures fixed (K): how much
// heat each set rejects.
func (c Case) AtWall(headT, barrelT float64) (Result, error) {
	var log validity.Log
	p, err := c.prepare(&log)
	if err != nil {
		return Result{}, err
	}
	for _, t := range []float64{headT, barrelT} {
		if !(t > c.Ambient && t < 1000) {
			return Result{}, fmt.Errorf("wall temperature %g K must lie between ambient (%g K) and 1000 K", t, c.Ambient)
		}
	}
	hr, hm := p.setHeat(c.Head, p.hg, p.hc, p.hp, headT, c.Ambient, p.hm, true)
	own(&hr)
	tin := c.Ambient
	if p.seriesActive {
		tin = hm.tOut
	}
	br, _ := p.setHeat(c.Barrel, p.bg, p.bc, p.bp, barrelT, tin, p.bm, true)
	own(&br)
	return p.result(hr, br, &log, true), nil
}

// parabolaRoot solves P(T) = target for the parabola P through the n (3)
// points (x[j], y[j]) by Newton's method from t, and reports whether it
// found a root within the points' span widened by 5 K on which P rises.
// The points come from a secant search near the root, so they are close
// together and P is the march's heat curve to its third-order term.
func parabolaRoot(x, y [3]float64, n int, target, t float64) (float64, bool) {
	if n < 3 || x[0] == x[1] || x[1] == x[2] || x[0] == x[2] {
		return t, false
	}
	// Newton's divided differences: P = y0 + d1 (T - x0) + d2 (T - x0)(T - x1)
	d01 := (y[1] - y[0]) / (x[1] - x[0])
	d12 := (y[2] - y[1]) / (x[2] - x[1])
	d2 := (d12 - d01) / (x[2] - x[0])
	lo := math.Min(x[0], math.Min(x[1], x[2])) - 5
	hi := math.Max(x[0], math.Max(x[1], x[2])) + 5
	for it := 0; it < 20; it++ {
		p := y[0] + (t-x[0])*(d01+d2*(t-x[1])) - target
		dp := d01 + d2*(2*t-x[0]-x[1])
		if !(dp > 0) || !(t >= lo && t <= hi) {
			return t, false
		}
		step := p / dp
		t -= step
		if math.Abs(step) < 1e-9 {
			return t, t >= lo && t <= hi
		}
	}
	return t, false
}

func (p *prepared) result(hr, br SetResult, log *validity.Log, conv bool) Result {
	hr.PassageVelocity, br.PassageVelocity = p.hvel, p.bvel
	r := Result{Head: hr, Barrel: br, Ambient: p.c.Ambient, Pressure: p.c.Pressure, Speed: p.c.Speed,
		TiltDeg: p.c.Tilt * 180 / math.Pi, Converged: conv}
	r.MaxImbal = math.Max(hr.EnergyImbalance, br.EnergyImbalance)
	r.Warnings = log.Warnings()
	return r
}

// Balance finds the wall temperatures of head and barrel at which the heat
// each set rejects equals its load (W), by Brent's method on the wall
// temperature between ambient and SaneWallLimit. The head is solved first:
// on a series path its outlet air is the barrel's inlet air. When a set
// cannot reject its load below SaneWallLimit the error wraps
// ErrNoEquilibrium and says what to change.
func (c Case) Balance(load HeatLoad) (Result, error) {
	var log validity.Log
	p, err := c.prepare(&log)
	if err != nil {
		return Result{}, err
	}
	if !(load.Head >= 0) || !(load.Barrel >= 0) || math.IsInf(load.Head, 0) || math.IsInf(load.Barrel, 0) {
		return Result{}, fmt.Errorf("heat load must be finite and not negative (head %g W, barrel %g W)", load.Head, load.Barrel)
	}
	solve := func(fs FinSet, g fins.Geometry, cv *fins.Curve, pt Path, tin, mdot, q float64) (SetResult, marchOut, error) {
		if q == 0 {
			// no load: the wall sits at the temperature of the air it meets
			keep := p.log
			p.log = nil
			r, m := p.setHeat(fs, g, cv, pt, tin+1e-9, tin, mdot, true)
			own(&r)
			p.log = keep
			return r, m, nil
		}
		// the search must not record range warnings for trial wall
		// temperatures the answer never takes; the final call does
		// Each trial records its warnings in a scratch log and its march
		// in a scratch buffer; the answer reuses the last trial when the
		// root finder ends on it, and otherwise evaluates once more.
		memoX, memoF := math.NaN(), 0.0
		var memoR SetResult
		var memoM marchOut
		keep := p.log
		f := func(tw float64) float64 {
			if tw == memoX {
				return memoF
			}
			p.scratch.Reset()
			p.log = &p.scratch
			memoR, memoM = p.setHeat(fs, g, cv, pt, tw, tin, mdot, !c.TotalsOnly)
			p.log = keep
			memoX, memoF = tw, memoR.HeatRejected-q
			if math.Abs(memoF) <= balanceTol*q {
				memoF = 0 // balanced: the root finder stops here
			}
			return memoF
		}
		// On a series path the barrel may sit below the air the head sends
		// it (heat then flows from that air into the barrel and out by
		// natural convection and radiation), so the search starts at ambient.
		lo := c.Ambient + 1e-6
		// Q(T_w) is smooth and nearly linear in T_w - T_a: a trial at
		// 100 K above the inlet gives a conductance, whose balance point is
		// the second guess; the safeguarded secant then needs a few steps.
		t0 := math.Min(math.Max(tin, c.Ambient)+100, SaneWallLimit-1)
		var t1 float64
		guess := func(f func(float64) float64) {
			ua := (f(t0) + q) / (t0 - c.Ambient)
			t1 = SaneWallLimit
			if ua > 0 {
				t1 = math.Min(c.Ambient+q/ua, SaneWallLimit)
			}
			if t1 == t0 {
				t1 = t0 - 1
			}
		}
		// A coarse march (a fifth of the segments) finds the wall
		// temperature cheaply. The full march rejects nearly the same
		// multiple rho of the coarse one at every wall temperature (rho
		// moves by about 1e-5 per kelvin), so one full march at the coarse
		// root gives rho, the parabola through the last three coarse points
		// then solves rho Q_c(T_w) = load, and a full march at that point
		// usually balances; if not, the secant on the full march goes on
		// from the two full points.
		full := p.n
		if nc := full / 5; nc >= 8 && mdot > 0 {
			p.n = nc
			// the last three distinct coarse points, newest first, serve the
			// secant's re-asks and then the corrected solve
			var hx, hq [3]float64
			nh := 0
			coarseHeat := func(tw float64) float64 {
				for j := 0; j < nh; j++ {
					if hx[j] == tw {
						return hq[j]
					}
				}
				p.log = nil
				r, _ := p.setHeat(fs, g, cv, pt, tw, tin, mdot, false)
				p.log = keep
				copy(hx[1:], hx[:2])
				copy(hq[1:], hq[:2])
				hx[0], hq[0] = tw, r.HeatRejected
				nh = min(nh+1, 3)
				return hq[0]
			}
			coarse := func(tw float64) float64 {
				r := coarseHeat(tw) - q
				if math.Abs(r) <= 1e-5*q {
					return 0
				}
				return r
			}
			guess(coarse)
			tc, err := roots.Secant(coarse, t0, t1, lo, SaneWallLimit, 1e-3, 100)
			p.n = full
			ok := err == nil
			var qc, ff float64
			if ok {
				p.n = nc
				qc = coarseHeat(tc)
				p.n = full
				ff = f(tc)
				ok = qc > 0 && ff != 0
			}
			if ok {
				rho := (ff + q) / qc
				t0 = tc
				// rho Q_c(T_w) = q on the parabola through the last three
				// coarse points (which the secant left within a few kelvin
				// of tc), by Newton's method on the parabola: no further
				// march; failing that, the secant on the coarse march
				var solved bool
				if t1, solved = parabolaRoot(hx, hq, nh, q/rho, tc); !solved {
					p.n = nc
					corr := func(tw float64) float64 {
						r := rho*coarseHeat(tw) - q
						if math.Abs(r) <= 0.1*balanceTol*q {
							return 0
						}
						return r
					}
					t1, err = roots.Secant(corr, tc, tc+math.Copysign(0.5, SaneWallLimit-1-tc), lo, SaneWallLimit, 1e-6, 100)
					p.n = full
				}
				if err != nil || !(t1 > lo && t1 < SaneWallLimit) || t1 == t0 {
					t1 = t0 + 1e-4
				}
			} else if err == nil {
				t0 = tc
				t1 = tc + 1e-4
			} else {
				guess(f)
			}
		} else {
			guess(f)
		}
		tw, err := roots.Secant(f, t0, t1, lo, SaneWallLimit, 1e-5, 100)
		if err != nil {
			if errors.Is(err, roots.ErrNoBracket) && f(SaneWallLimit) < 0 {
				r, m := p.setHeat(fs, g, cv, pt, SaneWallLimit, tin, mdot, true)
				own(&r)
				r.HeatLoad = q
				return r, m, fmt.Errorf("%w for the %s fins: at %.0f C wall temperature they reject only %.0f W of the %.0f W load; add fin area, improve the air supply to the fins (pressure recovery, ducting), or lower the heat load",
					ErrNoEquilibrium, fs.Name, SaneWallLimit-273.15, r.HeatRejected, q)
			}
			return SetResult{}, marchOut{}, fmt.Errorf("%s wall temperature: %w", fs.Name, err)
		}
		if tw != memoX {
			f(tw)
		}
		keep.Merge(&p.scratch)
		r, m := memoR, memoM
		if !c.TotalsOnly {
			r.March = append([]Segment(nil), memoM.seg...)
		}
		m.seg = r.March
		r.HeatLoad = q
		return r, m, nil
	}
	hr, hm, errH := solve(c.Head, p.hg, p.hc, p.hp, c.Ambient, p.hm, load.Head)
	tin := c.Ambient
	if p.seriesActive {
		tin = hm.tOut
	}
	br, _, errB := solve(c.Barrel, p.bg, p.bc, p.bp, tin, p.bm, load.Barrel)
	res := p.result(hr, br, &log, errH == nil && errB == nil)
	return res, errors.Join(errH, errB)
}
