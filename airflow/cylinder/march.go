package cylinder

import (
	"math"
	"sync"

	"finmarch/airflow"
)

// enthalpy returns H(T) = T (h0 + T (h1 + T (h2 - T h3))), the enthalpy of
// dry air relative to 0 K by the Cengel cp cubic, J/kg (T in K).
func enthalpy(t float64) float64 { return t * (h0 + t*(h1+t*(h2-t*h3))) }

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
	hScale = 1000 / airflow.MolarMassAir
	h0     = 28.11 * hScale
	h1     = 0.1967e-2 / 2 * hScale
	h2     = 0.4802e-5 / 3 * hScale
	h3     = 1.966e-9 / 4 * hScale
)

// The names under which airflow's correlations record their ranges, so
// that the march's own checks of them merge with theirs.
const (
	gnielinskiName = "Gnielinski turbulent duct flow (VDI Heat Atlas G1)"
	heatingName    = "gas heating factor (VDI Heat Atlas G1)"
)

type marchOut struct {
	q, tOut        float64
	hA, etaA, area float64 // area-weighted sums
	re             float64
	regime         string
	mdot           float64 // kg/s taking the heat, all paths: a free-stream method's frontal stream (0: the passage flow)
	seg            []Segment
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
	// a sweep's worker keeps them across its points in its workspace;
	// a lone estimate keeps them for its own trials
	store := &p.pre
	if p.set.Workspace != nil {
		store = &p.set.Workspace.segs
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
	if *store == nil || len(*store) >= workspaceSize {
		*store = map[segKey][]segPre{}
	}
	(*store)[k] = s
	return s
}

// segmentH returns segment i's mean forced coefficient, W/(m2 K), from
// its own state: the passage model's mean Nusselt number at the segment's
// bulk Reynolds and Prandtl numbers at both of its ends, as the segment
// mean of the local coefficient,
//
//	h = k/Dh (x_i Nu(x_i) - x_(i-1) Nu(x_(i-1))) / (x_i - x_(i-1)),
//
// (x Nu_m(x) is the integral of the local Nusselt number from the
// entrance), and at the path's last segment the regime, with the model's
// ranges checked there (where x/Dh is the whole passage's L/Dh; upstream
// segments are the correlation's own entrance region). The built-in
// correlation goes by its fast path (nuState).
func (p *prepared) segmentH(fp *filmPowers, pre []segPre, i, n int, re, pr, mu, kAir, tb, tw, dh float64) (float64, string) {
	x1, x0 := pre[i].x, pre[i-1].x
	var nu1, nu0 float64
	if p.fast {
		fp.step(pr, mu, re)
		k := 1.0
		if re > airflow.ReLaminar {
			k = fp.heating(tb, tw)
		}
		st := newNuState(re, k, fp)
		nu1 = st.at(&pre[i])
		if i > 1 {
			nu0 = st.at(&pre[i-1])
		}
	} else {
		nu1, _ = p.passage.Nu(re, pr, x1/dh, tb, tw, nil)
		if i > 1 {
			nu0, _ = p.passage.Nu(re, pr, x0/dh, tb, tw, nil)
		}
	}
	regime := ""
	if i == n {
		_, regime = p.passage.Nu(re, pr, x1/dh, tb, tw, p.log)
	}
	return kAir / dh * (x1*nu1 - x0*nu0) / (x1 - x0), regime
}

// pickUp returns the air temperature leaving a segment whose air enters at
// t (K) with mass flow mdot (kg/s) past conductance ua (W/K) on a wall at
// tw (K), the exact exponential T_out = T_w - (T_w - t) exp(-NTU), NTU =
// ua/(mdot cp), with cp the mean over the segment's rise; and that cp.
// rise is the previous segment's rise, the first guess.
func pickUp(ua, mdot, tw, t, rise float64) (tOut, cp float64) {
	// cp is found by fixed-point passes from the previous segment's rise;
	// each pass rescales exp(-NTU) by exp(NTU_old - NTU_new), a small
	// argument summed by its series, so one exponential serves the segment
	cp = meanCp(t, t+rise)
	ntu := ua / (mdot * cp)
	e := math.Exp(-ntu)
	tOut = tw - (tw-t)*e
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
	return tOut, cp
}

// march steps one air path of a set at wall temperature tw (K) from inlet
// temperature tin (K) with mass flow mdot (kg/s) per path. In each of n
// segments it takes bulk properties at the segment's mean air temperature,
// the segment-mean forced coefficient from the passage model at that state
// (segmentH, with the gas heating factor of the wall-to-bulk ratio), the fin
// efficiency at that h, and the exact exponential pick-up of heat,
// T_out = T_w - (T_w - T_in) exp(-NTU), NTU = eta_o h A / (mdot cp), with
// cp the mean over the segment's temperature rise.
func (p *prepared) march(st *setState, tw, tin float64, keep bool) marchOut {
	fs, g, cv, pt, mdot := st.fs, st.g, st.cv, st.pt, st.mdot
	var out marchOut
	out.tOut = tin
	if mdot <= 0 {
		return out
	}
	n := p.n
	// segment ends x_i = L (i/N)^SegmentGrading crowd the entrance, where
	// the developing-flow coefficient changes fastest
	perLen := pt.AreaPerPath / pt.Length
	k := p.set.ConductivityFactor * fs.Alloy.Conductivity(tw)
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
	xPrev := 0.0
	rise := 0.0 // the previous segment's air temperature rise
	fp := filmPowers{n: -1, exact: p.exactFilm}
	for i := 1; i <= n; i++ {
		// bulk properties at the segment's mean air temperature, predicted
		// from the previous segment's rise (Properties, without the
		// pressure check done once in prepare)
		tb := t + 0.5*rise
		p.log.Check(airflow.PropertiesName, airflow.PropertiesTemperature, tb, 250, 1000)
		mu, kAir, cpB := airflow.Transport(tb)
		pr := mu * cpB / kAir
		re := reC / mu
		x := pre[i].x
		dx := x - xPrev
		aSeg := perLen * dx
		xPrev = x
		var h float64
		if p.c.FixedH > 0 {
			h = p.c.FixedH
		} else {
			if p.fast && re > airflow.ReLaminar {
				// the ranges the built-in correlation's turbulent end is
				// used over: Gnielinski's entrance factor on the passage
				// (the segment means integrate the same correlation from
				// the entrance, at every mesh), and the gas heating factor
				// at every segment
				if i == 1 {
					p.log.Check(gnielinskiName, "Dh/L", pt.Dh/pt.Length, 0, 1)
				}
				if tw > tb {
					p.log.Check(heatingName, "Tb/Tw", tb/tw, 0.5, 1)
				}
			}
			h, out.regime = p.segmentH(&fp, pre, i, n, re, pr, mu, kAir, tb, tw, pt.Dh)
			h *= p.set.ForcedFactor
		}
		etaF := cv.Efficiency(h, k, p.log)
		etaO := g.SurfaceEfficiency(etaF)
		ua := etaO * h * aSeg
		tOut, cp := pickUp(ua, mdot, tw, t, rise)
		if p.meanState && !p.fast && p.c.FixedH == 0 {
			// the segment again at the mean of its own inlet and outlet
			// (tests: TestPredictedSegmentState bounds what the predictor
			// costs)
			tb = 0.5 * (t + tOut)
			mu, kAir, cpB = airflow.Transport(tb)
			re = reC / mu
			h, _ = p.segmentH(&fp, pre, i, n, re, mu*cpB/kAir, mu, kAir, tb, tw, pt.Dh)
			h *= p.set.ForcedFactor
			etaF = cv.Efficiency(h, k, p.log)
			ua = g.SurfaceEfficiency(etaF) * h * aSeg
			tOut, cp = pickUp(ua, mdot, tw, t, tOut-t)
		}
		rise = tOut - t
		qAir := mdot * cp * rise // = mdot (H(tOut) - H(t))
		out.q += qAir * paths
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
