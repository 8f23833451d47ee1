package cylinder

import "math"

// DiffKind names a quantity that can explain why two designs' walls differ.
type DiffKind int

// The quantities Differences compares, each with its unit.
const (
	DiffAirSpeed    DiffKind = iota // the air's speed along the head fins (Result.AlongSpeed), m/s
	DiffMeanH                       // the head's mean forced coefficient, W/m2K
	DiffAirRise                     // the air's warming along the head fins, K
	DiffBarrelInlet                 // the air reaching the barrel fins, K
	DiffArea                        // the finned surface of both sets, m2
	DiffLoad                        // the heat load of both sets, W
)

// Difference is one reason design B's walls differ from design A's.
type Difference struct {
	Kind   DiffKind
	A, B   float64 // the quantity in each design, in the unit of its kind
	Warmer bool    // it makes B run warmer than A
	// Series is set on the air speed when B's head is on a series path
	// (head then barrel, longitudinal fins) and A's is not: only the road
	// speed's share along the axis drives it. Passage is set when the
	// speed is a passage velocity (the channel march), not an approach
	// speed (a free-stream method).
	Series, Passage bool
}

// Differences lists what makes result b run warmer or cooler than a, in
// the order of the air's path: the air's speed along the head fins (each
// design's Result.AlongSpeed, compared only when both use the same kind of
// method) and mean coefficient (each when it differs by more than 5 %),
// the air's warming along the head fins (more than 3 K; when both use the
// channel march), the air reaching the barrel fins
// (more than 1 K), the finned surface (more than 3 %) and the heat load
// (more than 2 %). The thresholds are ours: what moves a wall temperature
// by a few kelvin on the demo designs, below which a reason is noise.
func Differences(a, b Result) []Difference {
	var out []Difference
	add := func(k DiffKind, va, vb float64, warmer bool) {
		out = append(out, Difference{Kind: k, A: va, B: vb, Warmer: warmer})
	}
	ha, hb := a.Head, b.Head
	pa, pb := a.Method == MethodChannel || a.Supply != nil, b.Method == MethodChannel || b.Supply != nil
	if va, vb := a.AlongSpeed(ha), b.AlongSpeed(hb); pa == pb && math.Abs(vb-va) > 0.05*math.Max(va, 0.1) {
		add(DiffAirSpeed, va, vb, vb < va)
		out[len(out)-1].Series = hb.Series && !ha.Series
		out[len(out)-1].Passage = pa
	}
	if math.Abs(hb.MeanH-ha.MeanH) > 0.05*math.Max(ha.MeanH, 1) {
		add(DiffMeanH, ha.MeanH, hb.MeanH, hb.MeanH < ha.MeanH)
	}
	// the air's warming along the head fins lowers the head's own
	// coefficient's driving difference in the channel march only (a
	// free-stream method refers its h to the approaching air)
	if ra, rb := ha.AirOut-ha.AirIn, hb.AirOut-hb.AirIn; pa && pb && math.Abs(rb-ra) > 3 {
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
