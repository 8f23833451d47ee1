package cylinder

import (
	"math"

	"finmarch/airflow"
	"finmarch/fins"
)

// The leading face of annular fins in an axial stream. On an inclined or
// laid-over cylinder the road air's component along the axis, V sin tilt,
// meets the first annular fin face on: a disk facing the stream, with a
// stagnation-point boundary layer over it, where the fins behind it stand
// in slots the envelope stream passes over. The head leads (as on the
// series path of longitudinal fins): the face is the head's first fin, and
// of the barrel's first fin the ring outside the head's tip circle, if its
// fins reach beyond the head's (our assumptions, stated in the README).

// faces sets the leading-face area of each annular set.
func (p *prepared) faces() {
	h, b := &p.sets[head], &p.sets[barrel]
	ring := func(outer, inner float64) float64 {
		if outer <= inner {
			return 0
		}
		return math.Pi / 4 * (outer*outer - inner*inner)
	}
	if h.fs.Set.Style == fins.StyleAnnular {
		h.face = ring(h.g.TipDiameter, h.fs.Set.RootDiameter)
	}
	if b.fs.Set.Style == fins.StyleAnnular {
		b.face = ring(b.g.TipDiameter, math.Max(b.fs.Set.RootDiameter, h.g.TipDiameter))
	}
}

// faceShare is the share of the set's finned surface that is its leading
// face.
func (st *setState) faceShare() float64 {
	if st.face <= 0 {
		return 0
	}
	return math.Min(1, st.face/st.g.TotalArea)
}

// faceHeat returns the heat (W) of a set's leading face at wall tw (K): the
// disk-facing-a-stream coefficient of Sparrow & Geiger (1985, from memory;
// airflow.DiskFacingFlowNu) on the fins' tip diameter at the approach
// speed sqrt(Recovery) V sin(tilt), film properties, the forced-convection
// factor, and the fin efficiency at that coefficient (the face is fin
// surface: Q = eta h A_face (T_w - T_a)). Nil in a shroud or duct, with a
// fixed h, or without an axial component.
func (p *prepared) faceHeat(st *setState, tw float64) float64 {
	dT := tw - p.c.Ambient
	if st.face <= 0 || dT <= 0 || p.c.Supply.ducted() || p.c.FixedH > 0 {
		return 0
	}
	v := math.Sqrt(p.c.Recovery) * p.c.Speed * math.Sin(p.c.Tilt)
	if v <= 1e-3 {
		return 0
	}
	air := airflow.Properties(0.5*(tw+p.c.Ambient), p.c.Pressure, p.log)
	D := st.g.TipDiameter
	h := p.set.ForcedFactor * airflow.DiskFacingFlowNu(air.Rho*v*D/air.Mu, air.Pr, p.log) * air.K / D
	eta := st.cv.Efficiency(h, p.set.ConductivityFactor*st.fs.Alloy.Conductivity(tw), p.log)
	return eta * h * st.face * dT
}
