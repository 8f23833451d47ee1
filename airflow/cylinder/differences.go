package cylinder

import "math"

// DiffKind names a quantity that can explain why two designs' walls differ.
type DiffKind int

// The quantities Differences compares, each with its unit.
const (
	DiffPassageVelocity DiffKind = iota // the head's passage velocity, m/s
	DiffMeanH                           // the head's mean forced coefficient, W/m2K
	DiffAirRise                         // the air's warming along the head fins, K
	DiffBarrelInlet                     // the air reaching the barrel fins, K
	DiffArea                            // the finned surface of both sets, m2
	DiffLoad                            // the heat load of both sets, W
)

// Difference is one reason design B's walls differ from design A's.
type Difference struct {
	Kind   DiffKind
	A, B   float64 // the quantity in each design, in the unit of its kind
	Warmer bool    // it makes B run warmer than A
	// Series is set on the passage velocity when B's head is on a series
	// path (head then barrel, longitudinal fins) and A's is not: only the
	// road speed's share along the axis drives it.
	Series bool
}

// Differences lists what makes result b run warmer or cooler than a, in
// the order of the air's path: the head passage velocity and mean
// coefficient (each when it differs by more than 5 %), the air's warming
// along the head fins (more than 3 K), the air reaching the barrel fins
// (more than 1 K), the finned surface (more than 3 %) and the heat load
// (more than 2 %). The thresholds are ours: what moves a wall temperature
// by a few kelvin on the demo designs, below which a reason is noise.
func Differences(a, b Result) []Difference {
	var out []Difference
	add := func(k DiffKind, va, vb float64, warmer bool) {
		out = append(out, Difference{Kind: k, A: va, B: vb, Warmer: warmer})
	}
	ha, hb := a.Head, b.Head
	if math.Abs(hb.PassageVelocity-ha.PassageVelocity) > 0.05*math.Max(ha.PassageVelocity, 0.1) {
		add(DiffPassageVelocity, ha.PassageVelocity, hb.PassageVelocity, hb.PassageVelocity < ha.PassageVelocity)
		out[len(out)-1].Series = hb.Series && !ha.Series
	}
	if math.Abs(hb.MeanH-ha.MeanH) > 0.05*math.Max(ha.MeanH, 1) {
		add(DiffMeanH, ha.MeanH, hb.MeanH, hb.MeanH < ha.MeanH)
	}
	if ra, rb := ha.AirOut-ha.AirIn, hb.AirOut-hb.AirIn; math.Abs(rb-ra) > 3 {
		add(DiffAirRise, ra, rb, rb > ra)
	}
	if ia, ib := a.Barrel.AirIn, b.Barrel.AirIn; math.Abs(ib-ia) > 1 {
		add(DiffBarrelInlet, ia, ib, ib > ia)
	}
	if aa, ab := ha.TotalArea+a.Barrel.TotalArea, hb.TotalArea+b.Barrel.TotalArea; math.Abs(ab-aa) > 0.03*aa {
		add(DiffArea, aa, ab, ab < aa)
	}
	if la, lb := ha.HeatLoad+a.Barrel.HeatLoad, hb.HeatLoad+b.Barrel.HeatLoad; math.Abs(lb-la) > 0.02*math.Max(la, 1) {
		add(DiffLoad, la, lb, lb > la)
	}
	return out
}
