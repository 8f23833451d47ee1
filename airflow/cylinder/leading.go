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
// series path of longitudinal fins): the face is the head's first fin
// ring, from root to tip. The barrel's first fin takes none, even where it
// reaches beyond the head's tip circle: that ring stands behind the
// head's rim, in the flow that separates from it, not in a stagnation
// flow. An oblique stream is credited by its component along the axis
// alone (V sin tilt; the component across the axis belongs to the
// passages). These are our assumptions, stated in the README.

// faces sets the leading-face area of each annular set: the head's
// first fin ring.
func (p *prepared) faces() {
	h := &p.sets[head]
	if h.fs.Set.Style == fins.StyleAnnular {
		h.face = math.Pi / 4 * (h.g.TipDiameter*h.g.TipDiameter - h.fs.Set.RootDiameter*h.fs.Set.RootDiameter)
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
