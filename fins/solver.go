package fins

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// Shape is the fin's form: a straight fin (per unit width) or an annular
// fin around a cylinder.
type Shape int

const (
	// Straight is a longitudinal or plate fin; results are per metre of width.
	Straight Shape = iota
	// Annular is a circular fin around a barrel or head.
	Annular
)

// Tip is the boundary condition at the fin tip.
type Tip int

const (
	// AdiabaticTip has no heat flow through the tip face.
	AdiabaticTip Tip = iota
	// ConvectiveTip convects from the tip face with the local h.
	ConvectiveTip
)

// Fin describes a one-dimensional fin for Solve.
type Fin struct {
	Shape      Shape
	RootRadius float64                 // m, annular fins only (r1 > 0)
	Length     float64                 // m, root to tip (radial height for annular fins)
	Thickness  func(s float64) float64 // m, at distance s (m) from the root, 0 <= s <= Length
	Tip        Tip
}

// Coefficient gives the heat-transfer coefficient in W/(m2 K) at distance s
// (m) from the root where the fin's excess temperature over the air is theta
// (K). It may depend on either, or neither.
type Coefficient func(s, theta float64) float64

// Uniform returns a Coefficient that is h everywhere.
func Uniform(h float64) Coefficient { return func(float64, float64) float64 { return h } }

// SolveOptions tunes Solve. The zero value is usable.
type SolveOptions struct {
	Cells   int     // finite-volume cells along the fin; default 200
	MaxIter int     // Picard iterations for a temperature-dependent h; default 200
	Tol     float64 // iteration stops when max |d theta| < Tol*|theta_b|; default 1e-10
}

// Solution is the result of Solve.
type Solution struct {
	S          []float64 // m, node positions from the root
	Theta      []float64 // K, excess temperature over the air at each node
	HeatRate   float64   // W (per metre of width for straight fins), from the root into the fin
	Efficiency float64   // HeatRate over the heat of the whole fin at theta_b
	Iterations int       // Picard iterations used (1 for an h independent of theta)
}

// Solve integrates the one-dimensional fin equation
//
//	d/ds( k A_c(s) dtheta/ds ) = h(s, theta) dA_s/ds theta
//
// for any thickness profile, straight (A_c = t(s) per unit width, dA_s/ds =
// 2) or annular (A_c = 2 pi r t(s), dA_s/ds = 4 pi r, r = r1 + s), with
// theta(0) = thetaB and an adiabatic or convective tip (Incropera et al.
// 6th ed. Eq. 3.61, the general fin equation). Method: conservative finite
// volumes on a uniform mesh (Patankar, Numerical Heat Transfer and Fluid
// Flow, 1980, Ch. 4), second order in the cell size; the tridiagonal
// system is solved with gonum's mat.Tridiag. A temperature-dependent h is
// handled by Picard iteration. The closed forms of this package are its
// test oracles. k in W/(m K), thetaB in K (any sign, not zero).
func Solve(f Fin, k float64, h Coefficient, thetaB float64, opt SolveOptions) (Solution, error) {
	if err := f.validate(k, thetaB); err != nil {
		return Solution{}, err
	}
	if h == nil {
		return Solution{}, errors.New("fin solver: no heat-transfer coefficient given")
	}
	n := opt.Cells
	if n == 0 {
		n = 200
	}
	if n < 2 || n > 1_000_000 {
		return Solution{}, fmt.Errorf("fin solver: cells = %d, allowed 2 to 1000000", n)
	}
	maxIter := opt.MaxIter
	if maxIter == 0 {
		maxIter = 200
	}
	tol := opt.Tol
	if tol == 0 {
		tol = 1e-10
	}
	g, area, tipArea, s := f.mesh(k, n)
	theta := make([]float64, n+1)
	for i := range theta {
		theta[i] = thetaB
	}
	hv := make([]float64, n+1)
	dl := make([]float64, n-1)
	d := make([]float64, n)
	du := make([]float64, n-1)
	rhs := mat.NewVecDense(n, nil)
	x := mat.NewVecDense(n, nil)
	iter := 0
	for iter = 1; iter <= maxIter; iter++ {
		for i := range hv {
			hv[i] = h(s[i], theta[i])
			if !(hv[i] >= 0) || math.IsInf(hv[i], 0) {
				return Solution{}, fmt.Errorf("fin solver: h(s = %g m, theta = %g K) = %g W/(m2 K); it must be finite and not negative", s[i], theta[i], hv[i])
			}
		}
		for j := 0; j < n; j++ { // unknown j is node i = j+1
			i := j + 1
			H := hv[i] * area[i]
			gi := 0.0 // no face beyond the tip node
			if i == n {
				H += hv[i] * tipArea
			} else {
				gi = g[i]
			}
			d[j] = g[i-1] + gi + H
			if j > 0 {
				dl[j-1] = -g[i-1]
			}
			if j < n-1 {
				du[j] = -g[i]
			}
			rhs.SetVec(j, 0)
		}
		rhs.SetVec(0, g[0]*thetaB)
		T := mat.NewTridiag(n, dl, d, du)
		if err := T.SolveVecTo(x, false, rhs); err != nil {
			return Solution{}, fmt.Errorf("fin solver: %w", err)
		}
		change := 0.0
		for j := 0; j < n; j++ {
			change = math.Max(change, math.Abs(x.AtVec(j)-theta[j+1]))
			theta[j+1] = x.AtVec(j)
		}
		if change <= tol*math.Abs(thetaB) {
			break
		}
	}
	if iter > maxIter {
		return Solution{}, fmt.Errorf("fin solver: the temperature-dependent h did not converge in %d iterations; try a smoother h(theta)", maxIter)
	}
	q, qb := 0.0, 0.0
	for i := range theta {
		a := area[i]
		if i == n {
			a += tipArea
		}
		q += hv[i] * a * theta[i]
		qb += h(s[i], thetaB) * a * thetaB
	}
	sol := Solution{S: s, Theta: theta, HeatRate: q, Iterations: min(iter, maxIter)}
	if qb != 0 {
		sol.Efficiency = q / qb
	} else {
		sol.Efficiency = 1
	}
	return sol, nil
}

func (f Fin) validate(k, thetaB float64) error {
	switch {
	case !(f.Length > 0) || math.IsInf(f.Length, 0):
		return fmt.Errorf("fin solver: length = %g m, must be positive", f.Length)
	case f.Shape == Annular && (!(f.RootRadius > 0) || math.IsInf(f.RootRadius, 0)):
		return fmt.Errorf("fin solver: root radius = %g m, must be positive for an annular fin", f.RootRadius)
	case f.Shape != Annular && f.Shape != Straight:
		return fmt.Errorf("fin solver: unknown shape %d", f.Shape)
	case f.Thickness == nil:
		return errors.New("fin solver: no thickness profile given")
	case !(k > 0) || math.IsInf(k, 0):
		return fmt.Errorf("fin solver: conductivity = %g W/(m K), must be positive", k)
	case thetaB == 0 || math.IsNaN(thetaB) || math.IsInf(thetaB, 0):
		return fmt.Errorf("fin solver: base excess temperature = %g K, must be finite and not zero", thetaB)
	}
	if t := f.Thickness(0); !(t > 0) {
		return fmt.Errorf("fin solver: root thickness = %g m, must be positive", t)
	}
	for i := 0; i <= 16; i++ {
		s := f.Length * float64(i) / 16
		if t := f.Thickness(s); !(t >= 0) || math.IsInf(t, 0) {
			return fmt.Errorf("fin solver: thickness at %g m from the root = %g m, must be finite and not negative", s, t)
		}
	}
	return nil
}

// mesh returns face conductances g[i] between nodes i and i+1 (W/K; per
// metre of width for straight fins), the lateral area of each node's
// control volume, the tip-face area and the node positions.
func (f Fin) mesh(k float64, n int) (g, area []float64, tipArea float64, s []float64) {
	dx := f.Length / float64(n)
	g = make([]float64, n)
	area = make([]float64, n+1)
	s = make([]float64, n+1)
	for i := 0; i <= n; i++ {
		s[i] = float64(i) * dx
		a, b := math.Max(0, s[i]-dx/2), math.Min(f.Length, s[i]+dx/2)
		area[i] = f.lateral(a, b)
		if i < n {
			sm := s[i] + dx/2
			g[i] = k * f.crossSection(sm) / dx
		}
	}
	if f.Tip == ConvectiveTip {
		tipArea = f.crossSection(f.Length)
	}
	return g, area, tipArea, s
}

func (f Fin) crossSection(s float64) float64 {
	t := f.Thickness(s)
	if f.Shape == Annular {
		return 2 * math.Pi * (f.RootRadius + s) * t
	}
	return t
}

func (f Fin) lateral(a, b float64) float64 {
	if f.Shape == Annular {
		ra, rb := f.RootRadius+a, f.RootRadius+b
		return 2 * math.Pi * (rb*rb - ra*ra)
	}
	return 2 * (b - a)
}

// profile is a linearly tapered fin for the allocation-free fast path.
type profile struct {
	annular bool
	r1, L   float64
	t0, t1  float64 // root and tip thickness
	tipConv bool
}

const maxFastCells = 128

// taperMesh is the finite-volume system of Solve for a linear taper, one
// cell count and k = h = 1: face conductances g and convecting areas a (the
// tip face folded into the last node). The heat of the fin at any x = h/k is
// then x-scaled convection against unit conduction, so one mesh serves
// every h and k of a fin set.
type taperMesh struct {
	n    int
	g, a []float64 // n face conductances, n+1 node areas
}

// mesh builds the system for n cells in buf (2n+1 values; nil allocates).
func (p profile) mesh(n int, buf []float64) taperMesh {
	n = min(n, maxFastCells)
	if len(buf) < 2*n+1 {
		buf = make([]float64, 2*n+1)
	}
	m := taperMesh{n: n, g: buf[:n:n], a: buf[n : 2*n+1]}
	dx := p.L / float64(n)
	slope := (p.t1 - p.t0) / p.L
	for i := 0; i <= n; i++ {
		s := float64(i) * dx
		a, b := math.Max(0, s-dx/2), math.Min(p.L, s+dx/2)
		if p.annular {
			ra, rb := p.r1+a, p.r1+b
			m.a[i] = 2 * math.Pi * (rb*rb - ra*ra)
		} else {
			m.a[i] = 2 * (b - a)
		}
		if i < n {
			sm := s + dx/2
			t := p.t0 + slope*sm
			if p.annular {
				m.g[i] = 2 * math.Pi * (p.r1 + sm) * t / dx
			} else {
				m.g[i] = t / dx
			}
		}
	}
	if p.tipConv {
		if p.annular {
			m.a[n] += 2 * math.Pi * (p.r1 + p.L) * p.t1
		} else {
			m.a[n] += p.t1
		}
	}
	return m
}

// heat returns sum(a_i theta_i) at x = h/k for a unit base excess: the
// fin's heat rate over h, so that q = h * heat(x). The Thomas algorithm
// eliminates from the tip toward the root, theta_i = c_i theta_(i-1) with
// theta_0 = 1 and c_i = g_(i-1) / (g_(i-1) + g_i (1 - c_(i+1)) + x a_i).
// Written as c_i = P_i/Q_i with R_i = (Q_i - P_i)/x, the recurrence needs no
// division and adds only positive terms (no cancellation in 1 - c):
//
//	R_i = a_i Q_(i+1) + g_i R_(i+1),  Q_i = g_(i-1) Q_(i+1) + x R_i,
//
// from Q_(n+1) = 1, R_(n+1) = 0. The heat then follows from conservation:
// what nodes 1..n convect is what face 0 conducts, x sum_(i>=1) a_i theta_i
// = g_0 (1 - c_1), so heat = a_0 + g_0 R_1 / Q_1. Q and R are rescaled
// together (their ratio is all that counts) to stay inside float64 range.
func (m *taperMesh) heat(x float64) float64 {
	n := m.n
	q, r := m.g[n-1]+x*m.a[n], m.a[n]
	for i := n - 1; i >= 1; i-- {
		r = m.a[i]*q + m.g[i]*r
		q = m.g[i-1]*q + x*r
		if q > 1e150 {
			q, r = q*1e-150, r*1e-150
		} else if q < 1e-150 {
			q, r = q*1e150, r*1e150
		}
	}
	return m.a[0] + m.g[0]*r/q
}
