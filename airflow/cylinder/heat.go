package cylinder

import (
	"math"

	"finmarch/airflow"
	"finmarch/fins"
)

// natural returns the natural-convection heat (W), coefficient and fin
// efficiency of a set at wall temperature tw, with film properties and the
// fin efficiency at that h. By default (Settings.Natural nil) the fins are
// taken at their real orientation (airflow.InclinedFinsH, inclinedFins):
// the horizontal annular fins of an upright cylinder as stacked horizontal
// plates, vertical channels when laid over, the larger of the two views
// between. A NaturalModel in the settings takes the passages as vertical
// channels as tall as the tip diameter (annular) or the finned length
// (longitudinal), whatever the tilt.
func (p *prepared) natural(st *setState, tw float64) (float64, float64, float64) {
	dT := tw - p.c.Ambient
	if dT <= 0 {
		return 0, 0, 1
	}
	fs, g := st.fs, st.g
	air := airflow.Properties(0.5*(tw+p.c.Ambient), p.c.Pressure, p.log)
	var h float64
	if p.set.Natural == nil {
		h, _ = airflow.InclinedFinsH(air, inclinedFins(fs.Set, g, p.c.Tilt), dT, p.log)
	} else {
		L := g.TipDiameter
		if fs.Set.Style == fins.StyleLongitudinal {
			L = fs.Set.Length
		}
		h = p.set.Natural.H(air, g.GapMean, L, dT, p.log)
	}
	h *= p.set.NaturalFactor
	eta := st.cv.Efficiency(h, p.set.ConductivityFactor*fs.Alloy.Conductivity(tw), p.log)
	return h * g.SurfaceEfficiency(eta) * g.TotalArea * dT, h, eta
}

// envelope returns the heat (W) and coefficient of the road air that does
// not run along a set's passages, over the envelope of its fins: for
// annular fins the component along the axis, V sin(tilt), runs along the
// envelope as along a flat plate of the finned length by the VDI form for
// all regimes, sqrt(Nu_lam^2 + Nu_turb^2) (airflow.FlatPlateVDINu; VDI Heat
// Atlas Gd 1 Eq. 3), which adds the turbulent part at every Reynolds
// number: our choice for an envelope whose fin rims disturb the boundary
// layer; for
// longitudinal fins the component across the axis, V cos(tilt), crosses
// the envelope as a cylinder of the tip diameter in crossflow
// (CylinderCrossflowNu, Churchill & Bernstein 1977). The approach speed
// is the component times sqrt(Recovery), the share of dynamic pressure the
// passages get too; properties are at the film temperature of wall and
// ambient, as these correlations were fitted. The coefficient acts on the
// envelope area A_e; spread over the finned surface A_t it is h A_e/A_t,
// which takes the fin efficiency as natural convection does. The gaps
// between the fins are slots under that stream, ventilated near their
// mouths. The envelope coefficient acts on the fin tips, the part of the
// envelope that is metal (A_tip = A_e tipShare), and a share s
// (slotShare) of it on the rest of the finned surface, the slot walls:
//
//	Q = eta_o h (A_tip/A_t + s (1 - A_tip/A_t)) A_t (T_w - T_a);
//
// across longitudinal fins the slots facing the stream carry a flow of
// their own (frontHeat, returned apart as front; setHeat's combine gives
// the envelope's heat to the rest of the surface by area and mixes the
// front slots' share of it with their own flow).
func (p *prepared) envelope(st *setState, tw float64) (spread, front, hOut float64) {
	dT := tw - p.c.Ambient
	if dT <= 0 || p.c.Speed <= 0 || p.c.Supply.ducted() || p.c.FixedH > 0 {
		// inside a shroud or baffles the road air does not reach the fins;
		// a fixed h ([override] h) stands instead of every forced correlation
		return 0, 0, 0
	}
	fs, g := st.fs, st.g
	air := airflow.Properties(0.5*(tw+p.c.Ambient), p.c.Pressure, p.log)
	r := math.Sqrt(p.c.Recovery)
	var h float64
	if fs.Set.Style == fins.StyleLongitudinal {
		v := r * p.c.Speed * math.Cos(p.c.Tilt)
		if v <= 1e-3 {
			return 0, 0, 0
		}
		D := g.TipDiameter
		h = airflow.CylinderCrossflowNu(air.Rho*v*D/air.Mu, air.Pr, p.log) * air.K / D
	} else {
		v := r * p.c.Speed * math.Sin(p.c.Tilt)
		if v <= 1e-3 {
			return 0, 0, 0
		}
		L := fs.Set.Length
		h = airflow.FlatPlateVDINu(air.Rho*v*L/air.Mu, air.Pr, p.log) * air.K / L
	}
	h *= p.set.ForcedFactor
	// the envelope's coefficient on the metal it meets there, the fin
	// tips (the rest of the envelope is the slots' mouths), and a share of
	// it on the slot walls, but for the slots facing a cross stream, which
	// carry a flow of their own (frontHeat)
	tips := g.EnvelopeArea * tipShare(fs.Set, g)
	s := slotShare(g.GapMean, fs.Set.Height)
	hEq := h * (tips/g.TotalArea + s*(1-tips/g.TotalArea))
	eta := st.cv.Efficiency(hEq, p.set.ConductivityFactor*fs.Alloy.Conductivity(tw), p.log)
	// the front slots of longitudinal fins take the cross flow's
	// stagnation pressure through them (front.go)
	return hEq * g.SurfaceEfficiency(eta) * g.TotalArea * dT, p.frontHeat(st, tw), h
}

// setHeat evaluates one fin set at wall temperature tw with air entering
// at tin: the forced heat of the passage march and of the air over the fin
// envelope combined as Q_F^3 = Q_P^3 + Q_E^3 (the asymptotic combination
// of Churchill & Usagi, AIChE J. 18, 1972, with the exponent of the mixed
// rule: our choice), that and natural convection combined as
// Q^3 = Q_F^3 + Q_N^3 (Churchill 1977's rule for assisting mixed
// convection), and radiation from the envelope at the mean fin surface
// temperature T_a + eta_o (T_w - T_a) to surroundings at ambient
// (Incropera 6th ed. Eq. 1.7). The mixing rules are local: they combine
// mechanisms acting on the same surface. Where a part of the set's surface
// has a forced flow of its own (the front slots of longitudinal fins in a
// cross stream, the leading face of annular fins in an axial one: front.go,
// leading.go) that part, a share f of the surface, is combined apart, with
// its share of the passage, envelope and natural heats,
//
//	Q_part = [ (f Q_P)^3 + (f Q_E)^3 + Q_own^3 + (f Q_N)^3 ]^(1/3),
//
// and the parts' heats add (combine rests; with no such part it is the
// rule above unchanged).
func combine(qp, qe, qn float64, parts [][2]float64) (forced, conv float64) {
	rest := 1.0
	add := func(f, own float64) {
		a, b, n := f*qp, f*qe, f*qn
		qf := math.Cbrt(a*a*a + b*b*b + own*own*own)
		forced += qf
		conv += math.Cbrt(qf*qf*qf + n*n*n)
	}
	for _, pt := range parts {
		if pt[1] > 0 && pt[0] > 0 {
			add(pt[0], pt[1])
			rest -= pt[0]
		}
	}
	add(math.Max(rest, 0), 0)
	return forced, conv
}

func (p *prepared) setHeat(st *setState, tw, tin float64, keep bool) (SetResult, marchOut) {
	fs, g, pt := st.fs, st.g, st.pt
	var m marchOut
	if p.method == MethodChannel {
		m = p.march(st, tw, tin, keep)
	} else {
		m = p.freeStream(st, tw, tin)
	}
	qn, hn, etaN := p.natural(st, tw)
	qe, qfront, he := p.envelope(st, tw)
	qface := p.faceHeat(st, tw)
	qf, qc := combine(m.q, qe, qn, [][2]float64{{FrontShare, qfront}, {st.faceShare(), qface}})
	r := SetResult{Name: fs.Name, Style: fs.Set.Style.String(), WallTemp: tw, AirIn: tin, AirOut: m.tOut,
		ForcedHeat: qf, PassageHeat: m.q, EnvelopeHeat: qe, FrontHeat: qfront, EnvelopeH: he, LeadingFaceHeat: qface,
		NaturalHeat: qn, ConvectionHeat: qc, NaturalH: hn, Paths: pt.Paths, PathLength: pt.Length,
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
	r.RadiationHeat = fs.Emissivity * airflow.Sigma * g.EnvelopeArea * (ts*ts*ts*ts - math.Pow(p.c.Ambient, 4))
	r.HeatRejected = qc + r.RadiationHeat
	// the air's enthalpy rise from its inlet and outlet temperatures
	// alone, against the forced heat summed over the segments: it holds
	// the march's bookkeeping (paths, mass flow, cp) to account; relative
	// to the heat, or to a milliwatt when the heat is nil (a wall at the
	// temperature of its inlet air) and only rounding is left
	mdot := st.mdot * float64(pt.Paths)
	if m.mdot > 0 {
		mdot = m.mdot
	}
	r.EnthalpyRise = mdot * (enthalpy(m.tOut) - enthalpy(tin))
	r.AirImbalance = math.Abs(r.EnthalpyRise-m.q) / math.Max(math.Abs(m.q), 1e-3)
	return r, m
}

// inclinedFins is a set's passages for natural convection at tilt (rad):
// annular fins lie in planes tilt from the horizontal, their passages as
// tall as the tip diameter, their faces annuli of A/P = height/2;
// longitudinal fins run along the axis, tilt from the vertical: their
// passages as long as the finned length rise at cos(tilt), and laid over
// the fins round the cylinder stand at every angle, taken as half facing
// up or down (the faces' mean |cos| over a turn is 2/pi; our assumption),
// their faces Length x Height.
func inclinedFins(s fins.Set, g fins.Geometry, tilt float64) airflow.InclinedFins {
	f := airflow.InclinedFins{Gap: g.GapMean}
	if s.Style == fins.StyleAnnular {
		f.ChannelHeight, f.ChannelSine = g.TipDiameter, math.Sin(tilt)
		f.FaceLength, f.FaceCosine = s.Height/2, math.Cos(tilt)
		return f
	}
	f.ChannelHeight, f.ChannelSine = s.Length, math.Cos(tilt)
	f.FaceLength, f.FaceCosine = s.Length*s.Height/(2*(s.Length+s.Height)), 2/math.Pi*math.Sin(tilt)
	return f
}

// tipShare is the share of a set's envelope that is fin tip: the tip
// thickness over the pitch at the tips (annular: the axial pitch;
// longitudinal: the pitch at the tip circle).
func tipShare(s fins.Set, g fins.Geometry) float64 {
	pitch := s.Pitch
	if s.Style == fins.StyleLongitudinal {
		pitch = s.Pitch * g.TipDiameter / s.RootDiameter
	}
	return math.Min(1, s.TipThickness/pitch)
}

// SlotLip is the share of the outer stream's coefficient the fin surfaces
// take at the mouth of the slot between two fins when the stream passes
// across the slots (broadside air), 0.7, and slot eddies decay with depth
// over one slot width: the cavity and corner-eddy literature as a
// literature pass recalled it, not read (Fox, IJHMT 8, 1965; Haugen &
// Dhanak, J. Heat Transfer 89, 1967: walls near the lip at 0.5 to 1 of the
// flat-plate coefficient; Moffatt, J. Fluid Mech. 18, 1964: eddies in a
// slot weaken by about 350 times per 0.7 width). Low confidence: a stated
// assumption of this project, bracketed 0.5 to 1.0 for the lip and 0.5 to
// 1.5 widths for the decay.
const SlotLip = 0.7

// slotShare returns the mean share of the outer coefficient over the
// walls of a slot of width gap and depth depth (m) swept across its mouth:
// h(y) = SlotLip h_out exp(-y/gap) averaged over the depth,
//
//	s = SlotLip (gap/depth) (1 - exp(-depth/gap)),
//
// about 0.09 for slots eight widths deep (the demo head), 0.17 at four.
func slotShare(gap, depth float64) float64 {
	if !(gap > 0) || !(depth > 0) {
		return 0
	}
	return SlotLip * gap / depth * (1 - math.Exp(-depth/gap))
}
