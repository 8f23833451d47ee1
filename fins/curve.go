package fins

import (
	"math"

	"finmarch/fins/validity"
)

// Curve holds one fin set's fin efficiency against x = h/k, the only
// combination of h and k on which the efficiency of a given profile
// depends (m^2 = 2h/(k t) and the tip term are both in h/k). Nodes lie on a
// geometric grid x_i = x0 r^i (r = 1.2), are computed when first needed by
// Set.FinEfficiency, and hold the efficiency divided by a stand-in for the
// uniform straight fin's tanh(z)/z (ref); that slowly varying ratio is
// interpolated by a cubic
// through four nodes in log x. The error is below 1e-6 for h = 0.5 to
// 1000 W/(m2 K) (TestCurveAccuracy). The march calls it once per segment
// instead of solving the fin again.
type Curve struct {
	s         Set
	g         Geometry
	refScale2 float64 // z^2 = refScale2 x
	vals      [curveNodes]float64
	// for tapered annular fins, the two finite-volume meshes of
	// AnnularTapered built once, so a node costs two Thomas sweeps
	coarse, fine *taperMesh // nil unless the set is tapered annular
	area         float64
}

const (
	curveX0    = 1e-5 // h/k in 1/m: h = 1.5e-3 W/(m2 K) at k = 150 W/(m K)
	curveRatio = 1.2
	curveNodes = 180 // up to x0 r^179, about 1.6e9 1/m
)

var (
	curveLogR    = math.Log(curveRatio)
	curveInvLogR = 1 / curveLogR
	curveLogX0   = math.Log(curveX0)
)

// NewCurve prepares an efficiency curve for the set with geometry g.
func (s Set) NewCurve(g Geometry) *Curve {
	tm := (s.RootThickness + s.TipThickness) / 2
	c := &Curve{s: s, g: g, refScale2: 2 / tm * (s.Height + s.TipThickness/2) * (s.Height + s.TipThickness/2)}
	for i := range c.vals {
		c.vals[i] = math.NaN()
	}
	if s.Style == StyleAnnular && s.TipThickness != s.RootThickness {
		r1 := s.RootDiameter / 2
		p := profile{annular: true, r1: r1, L: s.Height, t0: s.RootThickness, t1: s.TipThickness, tipConv: true}
		coarse, fine := p.mesh(taperCells, nil), p.mesh(2*taperCells, nil)
		c.coarse, c.fine = &coarse, &fine
		r2 := r1 + s.Height
		c.area = 2*math.Pi*(r2*r2-r1*r1) + 2*math.Pi*r2*s.TipThickness
	}
	return c
}

// efficiency is Set.FinEfficiency at x = h/k (k = 1), through the stored
// meshes where the set has them.
func (c *Curve) efficiency(x float64) float64 {
	if c.coarse == nil {
		return c.s.FinEfficiency(c.g, x, 1, nil)
	}
	q := (4*c.fine.heat(x) - c.coarse.heat(x)) / 3
	return q / c.area
}

// ref stands in for the straight uniform fin's tanh(z)/z at the set's mean
// thickness and corrected height, z = m Lc: it carries most of the
// efficiency's shape, so the ratio efficiency/ref that the nodes hold varies
// slowly and interpolates well on a coarse grid. It is the rational form
//
//	ref = sqrt((1 + z^2/5) / (1 + 13 z^2/15 + z^4/5)),
//
// which matches the series of tanh(z)/z through z^4 (1 - z^2/3 + 2 z^4/15),
// falls as 1/z for large z like it, and stays within 1% of it in between
// (checked by TestCurveReference), at the cost of one square root instead
// of a square root and an exponential. Any smooth reference of the right
// shape serves, since the nodes store the ratio to it.
func (c *Curve) ref(x float64) float64 {
	z2 := c.refScale2 * x
	return math.Sqrt((1 + 0.2*z2) / (1 + z2*(13.0/15+0.2*z2)))
}

func (c *Curve) node(i int) float64 {
	v := c.vals[i]
	if v != v { // NaN: not computed yet
		x := curveX0 * math.Exp(float64(i)*curveLogR)
		v = c.efficiency(x) / c.ref(x)
		c.vals[i] = v
	}
	return v
}

// Efficiency returns the fin efficiency at h (W/(m2 K)) and k (W/(m K)),
// as Set.FinEfficiency does, with the same Biot-number check.
func (c *Curve) Efficiency(h, k float64, log *validity.Log) float64 {
	if !(h > 0) {
		return 1
	}
	checkBiot(log, "fin set", h, k, c.s.RootThickness)
	x := h / k
	u := (math.Log(x) - curveLogX0) * curveInvLogR
	if !(u >= 1 && u < curveNodes-3) { // also NaN
		return c.efficiency(x)
	}
	i := int(u) // u >= 1, so truncation is the floor
	t := u - float64(i)
	v := c.vals[i-1 : i+3 : i+3]
	y0, y1, y2, y3 := v[0], v[1], v[2], v[3]
	if y0 != y0 || y1 != y1 || y2 != y2 || y3 != y3 { // a node not yet computed
		y0, y1, y2, y3 = c.node(i-1), c.node(i), c.node(i+1), c.node(i+2)
	}
	// cubic Lagrange through nodes at -1, 0, 1, 2
	const sixth = 1.0 / 6
	tp, tm, tm2 := t+1, t-1, t-2
	r := sixth*(tp*t*tm*y3-t*tm*tm2*y0) + 0.5*tp*tm2*(tm*y1-t*y2)
	return r * c.ref(x)
}
