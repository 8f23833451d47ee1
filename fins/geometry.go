package fins

import (
	"fmt"
	"math"

	"finmarch/fins/validity"
)

// Style is how a fin set is laid on the cylinder.
type Style int

const (
	// StyleAnnular fins are rings around the barrel or head, stacked along
	// the cylinder axis at the pitch.
	StyleAnnular Style = iota
	// StyleLongitudinal fins are radial plates running along the axis,
	// spaced around the circumference at the pitch (measured at the root).
	StyleLongitudinal
)

// String names the style as the design file spells it.
func (s Style) String() string {
	if s == StyleLongitudinal {
		return "longitudinal"
	}
	return "annular"
}

// MarshalText writes the style as the design file spells it (for JSON).
func (s Style) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// Set is one fin set: the head's or the barrel's fins. Lengths in m.
type Set struct {
	Style         Style   `json:"style"`
	Count         int     `json:"count"`            // number of fins
	Pitch         float64 `json:"pitch_m"`          // m: axial centre-to-centre spacing (annular) or circumferential spacing at the root (longitudinal)
	Height        float64 `json:"height_m"`         // m, root to tip, radial
	RootThickness float64 `json:"root_thickness_m"` // m
	TipThickness  float64 `json:"tip_thickness_m"`  // m, not more than RootThickness (as-cast taper)
	RootDiameter  float64 `json:"root_diameter_m"`  // m, diameter of the cylinder at the fin roots
	Length        float64 `json:"length_m"`         // m, finned length along the cylinder axis
}

// FieldError names the fin-set value that makes a geometry impossible.
type FieldError struct {
	Field string // count, pitch, height, root_thickness, tip_thickness, root_diameter, length
	Msg   string
}

func (e *FieldError) Error() string { return e.Field + ": " + e.Msg }

func ferr(field, format string, a ...any) error {
	return &FieldError{Field: field, Msg: fmt.Sprintf(format, a...)}
}

func mm(v float64) string { return fmt.Sprintf("%.4g mm", v*1000) }

// Geometry is what a fin set presents to the air and the metal.
type Geometry struct {
	FinAreaEach       float64 // m2, one fin: both faces, tip face (and end faces of longitudinal fins)
	FinArea           float64 // m2, all fins
	BaseArea          float64 // m2, exposed root surface between the fins
	TotalArea         float64 // m2, FinArea + BaseArea
	EnvelopeArea      float64 // m2, outer envelope over the fin tips (radiation)
	GapRoot           float64 // m, clear gap between neighbouring fins at the root
	GapTip            float64 // m, at the tip
	GapMean           float64 // m, at mid-height
	HydraulicDiameter float64 // m, of one open-tipped passage: 4 s H / (2H + s) at the mean gap s
	PlateDiameter     float64 // m, parallel-plate hydraulic diameter 2 s at the mean gap
	PassageArea       float64 // m2, flow cross-section of one passage, s H
	Passages          int     // number of passages between fins
	FinVolume         float64 // m3, all fins
	TipDiameter       float64 // m, over the fin tips
}

// Geometry checks the set and returns its areas, gaps and volume. An
// impossible set (pitch not larger than the root thickness, tip thicker than
// root, fins that do not fit the length or the circumference) is a
// *FieldError naming the value at fault.
func (s Set) Geometry() (Geometry, error) {
	pos := func(field string, v float64) error {
		if !(v > 0) || math.IsInf(v, 0) {
			return ferr(field, "%g m must be a positive length", v)
		}
		return nil
	}
	if s.Count < 1 || s.Count > 10000 {
		return Geometry{}, ferr("count", "%d fins; allowed 1 to 10000", s.Count)
	}
	for _, c := range []struct {
		f string
		v float64
	}{{"pitch", s.Pitch}, {"height", s.Height}, {"root_thickness", s.RootThickness}, {"root_diameter", s.RootDiameter}, {"length", s.Length}} {
		if err := pos(c.f, c.v); err != nil {
			return Geometry{}, err
		}
	}
	if !(s.TipThickness >= 0) || math.IsInf(s.TipThickness, 0) {
		return Geometry{}, ferr("tip_thickness", "%g m must be zero (sharp) or a positive length", s.TipThickness)
	}
	if s.TipThickness > s.RootThickness {
		return Geometry{}, ferr("tip_thickness", "%s is thicker than the root (%s); a fin tapers from root to tip", mm(s.TipThickness), mm(s.RootThickness))
	}
	if s.Pitch <= s.RootThickness {
		return Geometry{}, ferr("pitch", "%s is not larger than the root thickness %s, so no air gap is left between fins", mm(s.Pitch), mm(s.RootThickness))
	}
	r1 := s.RootDiameter / 2
	r2 := r1 + s.Height
	H := s.Height
	n := float64(s.Count)
	var g Geometry
	g.TipDiameter = 2 * r2
	tm := (s.RootThickness + s.TipThickness) / 2
	switch s.Style {
	case StyleAnnular:
		need := (n-1)*s.Pitch + s.RootThickness
		if need > s.Length*(1+1e-9) {
			return Geometry{}, ferr("count", "%d fins at %s pitch need %s of finned length, but the length is %s", s.Count, mm(s.Pitch), mm(need), mm(s.Length))
		}
		g.FinAreaEach = 2*math.Pi*(r2*r2-r1*r1) + 2*math.Pi*r2*s.TipThickness
		g.BaseArea = math.Pi * s.RootDiameter * (s.Length - n*s.RootThickness)
		g.EnvelopeArea = math.Pi * g.TipDiameter * s.Length
		g.GapRoot = s.Pitch - s.RootThickness
		g.GapTip = s.Pitch - s.TipThickness
		g.GapMean = s.Pitch - tm
		g.Passages = max(s.Count-1, 1)
		slope := (s.TipThickness - s.RootThickness) / H
		g.FinVolume = n * 2 * math.Pi * (s.RootThickness*(r2*r2-r1*r1)/2 +
			slope*((r2*r2*r2-r1*r1*r1)/3-r1*(r2*r2-r1*r1)/2))
	case StyleLongitudinal:
		circ := math.Pi * s.RootDiameter
		if n*s.Pitch > circ*(1+1e-9) {
			return Geometry{}, ferr("count", "%d fins at %s pitch need %s of root circumference, but the root diameter of %s gives %s", s.Count, mm(s.Pitch), mm(n*s.Pitch), mm(s.RootDiameter), mm(circ))
		}
		g.FinAreaEach = 2*H*s.Length + s.TipThickness*s.Length + 2*tm*H
		g.BaseArea = n * (s.Pitch - s.RootThickness) * s.Length
		g.EnvelopeArea = n * s.Pitch * (r2 / r1) * s.Length
		g.GapRoot = s.Pitch - s.RootThickness
		g.GapTip = s.Pitch*r2/r1 - s.TipThickness
		g.GapMean = s.Pitch*(r1+H/2)/r1 - tm
		g.Passages = s.Count
		if n*s.Pitch < circ*(1-1e-9) {
			g.Passages = max(s.Count-1, 1) // a sector, not the full round
		}
		g.FinVolume = n * H * tm * s.Length
	default:
		return Geometry{}, ferr("style", "unknown fin style %d", s.Style)
	}
	g.FinArea = n * g.FinAreaEach
	g.TotalArea = g.FinArea + g.BaseArea
	sg := g.GapMean
	g.HydraulicDiameter = 4 * sg * H / (2*H + sg)
	g.PlateDiameter = 2 * sg
	g.PassageArea = sg * H
	return g, nil
}

// FinEfficiency returns the efficiency of one fin of the set at a uniform
// h (W/(m2 K)) and conductivity k (W/(m K)), relative to FinAreaEach, by the
// closed form that fits its profile: annular fins by AnnularRectangular
// (uniform) or AnnularTapered; longitudinal fins by StraightTrapezoidal
// (which covers uniform and sharp-tipped fins), times the fin length.
func (s Set) FinEfficiency(g Geometry, h, k float64, log *validity.Log) float64 {
	if !(h > 0) {
		return 1
	}
	f := s.Single()
	eta := f.Efficiency(h, k, log)
	switch f.Profile {
	case Trapezoidal:
		// the closed form is relative to (2H + tip) per metre; the end
		// faces in FinAreaEach carry no conduction model and are counted
		// as fully effective (they are a few per cent of the area)
		model := f.Area() * s.Length
		ends := g.FinAreaEach - model
		return (eta*model + ends) / g.FinAreaEach
	case AnnularProfile:
		return eta * f.Area() / g.FinAreaEach
	}
	return eta
}

// SurfaceEfficiency is the overall surface efficiency of a finned surface,
//
//	eta_o = 1 - (A_f / A_t)(1 - eta_f)
//
// (Incropera et al. 6th ed. Eq. 3.102), with A_f the fin area and A_t the
// fin plus exposed base area of g.
func (g Geometry) SurfaceEfficiency(etaFin float64) float64 {
	if g.TotalArea == 0 {
		return 1
	}
	return 1 - g.FinArea/g.TotalArea*(1-etaFin)
}

// Fitting returns the most fins of a style that fit, at least one: annular
// fins of root thickness t at axial pitch p along a finned length L,
// (n - 1) p + t <= L; longitudinal fins at root pitch p round a root
// diameter D, n p <= pi D (lengths in m). The one count-that-fits rule of
// the project (Restyle, sweeps, the optimiser's bounds).
func Fitting(style Style, p, t, L, D float64) int {
	if style == StyleAnnular {
		return max(1, int(math.Floor((L-t)/p+1e-9))+1)
	}
	return max(1, int(math.Floor(math.Pi*D/p+1e-9)))
}

// Fitting returns as many fins as fit the set's length or circumference
// at its pitch and root thickness (the package function Fitting).
func (s Set) Fitting() int {
	return Fitting(s.Style, s.Pitch, s.RootThickness, s.Length, s.RootDiameter)
}

// RestyleFor is Restyle kept within process p's height-to-gap limit: where
// the same mean gap would give a root gap too narrow to cast (longitudinal
// fins crowd at the root), the set gets fewer fins, at the root gap
// height/MaxAspect. It reports whether the result keeps every limit of p
// (a fin thinner or with less draft than p allows stays so: only the count
// and pitch change). A zero p restyles only.
func (s Set) RestyleFor(style Style, p Process) (Set, bool, error) {
	out, err := s.Restyle(style)
	if err != nil || p.Name == "" {
		return out, err == nil, err
	}
	if gap := out.Pitch - out.RootThickness; gap > 0 && out.Height/gap > p.MaxAspect {
		need := out.RootThickness + out.Height/p.MaxAspect // the narrowest root pitch p casts
		if style == StyleLongitudinal {
			circ := math.Pi * out.RootDiameter
			out.Count = max(1, int(math.Floor(circ/need*(1+1e-9))))
			out.Pitch = circ / float64(out.Count)
		} else {
			out.Pitch = need * (1 + 1e-9)
			out.Count = out.Fitting()
		}
		if _, err := out.Geometry(); err != nil {
			return Set{}, false, err
		}
	}
	for _, v := range p.Check(out) {
		if v.Slack < -1e-9 {
			return out, false, nil
		}
	}
	return out, true, nil
}

// Restyle returns the set laid the other way at the same fin height,
// thicknesses, root diameter, length and mean clear gap (so the same fin
// density as the air sees it): annular fins are stacked along the length
// at pitch gap + mean thickness; longitudinal fins go round the full
// circumference with the mean gap at mid-height. The count is as many as
// fit, at least one.
func (s Set) Restyle(style Style) (Set, error) {
	g, err := s.Geometry()
	if err != nil {
		return Set{}, err
	}
	if style == s.Style {
		return s, nil
	}
	out := s
	out.Style = style
	tm := (s.RootThickness + s.TipThickness) / 2
	mid := g.GapMean + tm
	switch style {
	case StyleAnnular:
		out.Pitch = mid
		out.Count = out.Fitting()
	case StyleLongitudinal:
		r1 := s.RootDiameter / 2
		rootPitch := mid * r1 / (r1 + s.Height/2)
		out.Count = Fitting(style, rootPitch, s.RootThickness, s.Length, s.RootDiameter)
		out.Pitch = math.Pi * s.RootDiameter / float64(out.Count)
	}
	if _, err := out.Geometry(); err != nil {
		return Set{}, err
	}
	return out, nil
}
