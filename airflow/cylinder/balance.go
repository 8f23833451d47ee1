package cylinder

import (
	"errors"
	"fmt"
	"math"

	"finmarch/airflow/roots"
	"finmarch/fins/validity"
)

// Balance finds the wall temperatures of head and barrel at which the heat
// each set rejects equals its load (W), by the safeguarded secant of
// airflow/roots on Q(T_w) - load between ambient and SaneWallLimit (see
// wallSearch for the coarse-then-full scheme). The head is solved first:
// on a series path its outlet air is the barrel's inlet air. When a set
// cannot reject its load below SaneWallLimit the error wraps
// ErrNoEquilibrium and says what to change; the result is still filled.
func (c Case) Balance(load HeatLoad, s Settings) (Result, error) {
	var log validity.Log
	p, err := c.prepare(s, &log)
	if err != nil {
		return Result{}, err
	}
	return p.balance(load, &log)
}

// balance is Balance on a prepared case (its flows, and a fan's operating
// point, already solved), recording warnings in log.
func (p *prepared) balance(load HeatLoad, log *validity.Log) (Result, error) {
	if !(load.Head >= 0) || !(load.Barrel >= 0) || math.IsInf(load.Head, 0) || math.IsInf(load.Barrel, 0) {
		return Result{}, fmt.Errorf("heat load must be finite and not negative (head %g W, barrel %g W)", load.Head, load.Barrel)
	}
	hr, hm, errH := p.solveWall(&p.sets[head], p.inlet, load.Head)
	tin := p.inlet
	if p.series {
		tin = hm.tOut
	}
	br, _, errB := p.solveWall(&p.sets[barrel], tin, load.Barrel)
	if p.series && errors.Is(errH, ErrNoEquilibrium) {
		// the barrel's air comes from a head at the search's cap, a state
		// the head never reaches: the barrel's wall is not determined
		br.Equilibrium = false
	}
	res := p.result(hr, br, log, errH == nil && errB == nil)
	if !p.set.OneMethod && !p.set.TotalsOnly {
		res.Methods = p.alternatives(load, res)
	}
	return res, errors.Join(errH, errB)
}

// AtWall evaluates the case with both wall temperatures fixed (K): how much
// heat each set rejects.
func (c Case) AtWall(headT, barrelT float64, s Settings) (Result, error) {
	var log validity.Log
	p, err := c.prepare(s, &log)
	if err != nil {
		return Result{}, err
	}
	for _, t := range []float64{headT, barrelT} {
		if !(t > c.Ambient && t < 1000) {
			return Result{}, fmt.Errorf("wall temperature %g K must lie between ambient (%g K) and 1000 K", t, c.Ambient)
		}
	}
	hr, hm := p.setHeat(&p.sets[head], headT, p.inlet, true)
	own(&hr)
	hr.Equilibrium = true // a given wall is a state, not a search
	tin := p.inlet
	if p.series {
		tin = hm.tOut
	}
	br, _ := p.setHeat(&p.sets[barrel], barrelT, tin, true)
	own(&br)
	br.Equilibrium = true
	return p.result(hr, br, &log, true), nil
}

// wallSearch finds one set's wall temperature. Each trial records its
// warnings in a scratch log (the search must not record range warnings for
// trial wall temperatures the answer never takes; the final trial does)
// and its march in a scratch buffer; the answer reuses the last trial when
// the root finder ends on it, and otherwise evaluates once more.
//
// A coarse march (a fifth of the segments) first finds the wall
// temperature cheaply. The full march rejects nearly the same multiple rho
// of the coarse one at every wall temperature (rho moves by about 1e-5 per
// kelvin), so one full march at the coarse root gives rho, the parabola
// through the last three coarse points then solves rho Q_c(T_w) = load,
// and a full march at that point usually balances; if not, the secant on
// the full march goes on from the two full points.
type wallSearch struct {
	p       *prepared
	st      *setState
	tin, q  float64
	keep    *validity.Log // the caller's log
	lo      float64       // the lowest wall searched, K
	full, n int           // segments of the full and the coarse march
	// the latest full trial
	memoX, memoF float64
	memoR        SetResult
	memoM        marchOut
	// the last three distinct coarse points, newest first: they serve the
	// secant's re-asks and then the corrected solve
	hx, hq [3]float64
	nh     int
}

// solveWall finds the wall temperature of one set whose air enters at tin
// (K) and whose load is q (W).
func (p *prepared) solveWall(st *setState, tin, q float64) (SetResult, marchOut, error) {
	if q == 0 {
		// no load: the wall sits at the temperature of the air it meets
		keep := p.log
		p.log = nil
		r, m := p.setHeat(st, tin+1e-9, tin, true)
		own(&r)
		p.log = keep
		r.Equilibrium = true
		return r, m, nil
	}
	w := &wallSearch{p: p, st: st, tin: tin, q: q, keep: p.log, memoX: math.NaN(), full: p.n}
	// On a series path the barrel may sit below the air the head sends it
	// (heat then flows from that air into the barrel and out by natural
	// convection and radiation), so the search starts at ambient.
	w.lo = p.c.Ambient + 1e-6
	t0, t1 := w.start()
	tw, err := roots.Secant(w.f, t0, t1, w.lo, SaneWallLimit, 1e-5, 100)
	if err != nil {
		return w.failed(err)
	}
	if tw != w.memoX {
		w.f(tw)
	}
	w.keep.Merge(&p.scratch)
	r, m := w.memoR, w.memoM
	if !p.set.TotalsOnly {
		r.March = append([]Segment(nil), w.memoM.seg...)
	}
	m.seg = r.March
	r.HeatLoad = q
	r.LoadImbalance = math.Abs(r.HeatRejected-q) / q
	r.Equilibrium = true
	return r, m, nil
}

// f is the full march's heat rejected less the load, W, zero once balanced
// to balanceTol (so that the root finder stops there).
func (w *wallSearch) f(tw float64) float64 {
	if tw == w.memoX {
		return w.memoF
	}
	p := w.p
	p.scratch.Reset()
	p.log = &p.scratch
	w.memoR, w.memoM = p.setHeat(w.st, tw, w.tin, !p.set.TotalsOnly)
	p.log = w.keep
	w.memoX, w.memoF = tw, w.memoR.HeatRejected-w.q
	if math.Abs(w.memoF) <= balanceTol*w.q {
		w.memoF = 0
	}
	return w.memoF
}

// coarseHeat is the heat rejected on the coarse march, W.
func (w *wallSearch) coarseHeat(tw float64) float64 {
	for j := 0; j < w.nh; j++ {
		if w.hx[j] == tw {
			return w.hq[j]
		}
	}
	p := w.p
	p.n, p.log = w.n, nil
	r, _ := p.setHeat(w.st, tw, w.tin, false)
	p.n, p.log = w.full, w.keep
	copy(w.hx[1:], w.hx[:2])
	copy(w.hq[1:], w.hq[:2])
	w.hx[0], w.hq[0] = tw, r.HeatRejected
	w.nh = min(w.nh+1, 3)
	return w.hq[0]
}

func (w *wallSearch) coarse(tw float64) float64 {
	r := w.coarseHeat(tw) - w.q
	if math.Abs(r) <= 1e-5*w.q {
		return 0
	}
	return r
}

// guess returns the second point of a secant from t0: Q(T_w) is smooth and
// nearly linear in T_w - T_a, so a trial at t0 gives a conductance whose
// balance point is the guess.
func (w *wallSearch) guess(f func(float64) float64, t0 float64) float64 {
	amb := w.p.c.Ambient
	ua := (f(t0) + w.q) / (t0 - amb)
	t1 := SaneWallLimit
	if ua > 0 {
		t1 = math.Min(amb+w.q/ua, SaneWallLimit)
	}
	if t1 == t0 {
		t1 = t0 - 1
	}
	return t1
}

// start returns the two points from which the secant on the full march
// begins: from the coarse search and its corrected solve where the march
// has segments enough, or from a first trial 100 K above the inlet.
func (w *wallSearch) start() (float64, float64) {
	t0 := math.Min(math.Max(w.tin, w.p.c.Ambient)+100, SaneWallLimit-1)
	w.n = w.full / 5
	if w.n < 8 || w.st.mdot <= 0 {
		return t0, w.guess(w.f, t0)
	}
	tc, err := roots.Secant(w.coarse, t0, w.guess(w.coarse, t0), w.lo, SaneWallLimit, 1e-3, 100)
	if err != nil {
		return t0, w.guess(w.f, t0)
	}
	qc := w.coarseHeat(tc)
	ff := w.f(tc)
	if !(qc > 0 && ff != 0) {
		return tc, tc + 1e-4
	}
	return tc, w.corrected(tc, (ff+w.q)/qc)
}

// corrected solves rho Q_c(T_w) = q on the parabola through the last three
// coarse points (which the secant left within a few kelvin of tc), by
// Newton's method on the parabola: no further march; failing that, by the
// secant on the coarse march.
func (w *wallSearch) corrected(tc, rho float64) float64 {
	t1, solved := parabolaRoot(w.hx, w.hq, w.nh, w.q/rho, tc)
	var err error
	if !solved {
		corr := func(tw float64) float64 {
			r := rho*w.coarseHeat(tw) - w.q
			if math.Abs(r) <= 0.1*balanceTol*w.q {
				return 0
			}
			return r
		}
		t1, err = roots.Secant(corr, tc, tc+math.Copysign(0.5, SaneWallLimit-1-tc), w.lo, SaneWallLimit, 1e-6, 100)
	}
	if err != nil || !(t1 > w.lo && t1 < SaneWallLimit) || t1 == tc {
		t1 = tc + 1e-4
	}
	return t1
}

// failed reports a search that found no root: no equilibrium when even the
// hottest wall searched rejects less than the load, otherwise the root
// finder's error.
func (w *wallSearch) failed(err error) (SetResult, marchOut, error) {
	p, fs := w.p, w.st.fs
	if errors.Is(err, roots.ErrNoBracket) && w.f(SaneWallLimit) < 0 {
		r, m := p.setHeat(w.st, SaneWallLimit, w.tin, true)
		own(&r)
		r.HeatLoad = w.q
		r.LoadImbalance = math.Abs(r.HeatRejected-w.q) / w.q
		r.Shortfall = w.q - r.HeatRejected
		// the heat rejected at a fixed wall grows about in proportion to
		// the fins' conductance, so the shortfall says by how much the
		// area or h would have to grow, or the set's heat shrink
		more := 100 * (w.q/math.Max(r.HeatRejected, 1e-9) - 1)
		less := 100 * (1 - r.HeatRejected/w.q)
		return r, m, fmt.Errorf("%w for the %s fins: at %.0f C wall temperature they reject only %.0f W of the %.0f W load; an equilibrium there needs about %.0f%% more finned area or forced h (add fin area, improve the air supply to the fins: pressure recovery, ducting), or about %.0f%% less heat to these fins (the head share, the cooling share, the speed or the load)",
			ErrNoEquilibrium, fs.Name, SaneWallLimit-273.15, r.HeatRejected, w.q, more, less)
	}
	return SetResult{}, marchOut{}, fmt.Errorf("%s wall temperature: %w", fs.Name, err)
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
