package cylinder

import (
	"math"

	"finmarch/fins"
)

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

// path applies the orientation model: annular fins take the road-speed
// component in the fin plane (V cos tilt) and the air runs half the
// circumference at mid-fin radius on each side, two parallel paths per
// passage, each fed with ambient air; longitudinal fins take the component
// along the axis (V sin tilt) over the finned length. The other
// component crosses or runs along the fin envelope (prepared.envelope).
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
