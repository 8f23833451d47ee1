package fins

import (
	"fmt"
	"math"
	"strings"

	"finmarch/fins/validity"
)

// Profile is the shape of one fin as the single-fin calculator and a fin
// set name it.
type Profile string

// The profiles, each with its closed form (efficiency.go).
const (
	Rectangular    Profile = "rectangular"     // straight, constant thickness, corrected length
	Triangular     Profile = "triangular"      // straight, tapering to a point
	Trapezoidal    Profile = "trapezoidal"     // straight, tapering to a tip with a convecting tip
	AnnularProfile Profile = "annular"         // annular, constant thickness, corrected length
	AnnularTaper   Profile = "annular-tapered" // annular, tapering, convecting tip
)

// Profiles lists the profiles.
var Profiles = []Profile{Rectangular, Triangular, Trapezoidal, AnnularProfile, AnnularTaper}

// ParseProfile reads a profile name.
func ParseProfile(s string) (Profile, error) {
	for _, p := range Profiles {
		if strings.EqualFold(strings.TrimSpace(s), string(p)) {
			return p, nil
		}
	}
	names := make([]string, len(Profiles))
	for i, p := range Profiles {
		names[i] = string(p)
	}
	return "", fmt.Errorf("profile %q: use %s", s, strings.Join(names, ", "))
}

// Annular reports whether the profile is a ring round a cylinder.
func (p Profile) Annular() bool { return p == AnnularProfile || p == AnnularTaper }

// Single is one fin: its profile, height (root to tip), root and tip
// thickness and, for annular profiles, root radius (m). Straight fins are
// per metre of width, annular fins per fin.
type Single struct {
	Profile       Profile
	Height        float64
	RootThickness float64
	TipThickness  float64 // the profile's own for rectangular (root), triangular (0) and annular (root)
	RootRadius    float64
}

// Efficiency is the profile's closed form (StraightRectangular,
// StraightTriangular, StraightTrapezoidal, AnnularRectangular,
// AnnularTapered) at h (W/(m2 K)) and k (W/(m K)).
func (f Single) Efficiency(h, k float64, log *validity.Log) float64 {
	r1, r2 := f.RootRadius, f.RootRadius+f.Height
	switch f.Profile {
	case Rectangular:
		return StraightRectangular(h, k, f.RootThickness, f.Height, log)
	case Triangular:
		return StraightTriangular(h, k, f.RootThickness, f.Height, log)
	case Trapezoidal:
		return StraightTrapezoidal(h, k, f.RootThickness, f.TipThickness, f.Height, log)
	case AnnularProfile:
		return AnnularRectangular(h, k, f.RootThickness, r1, r2, log)
	}
	return AnnularTapered(h, k, f.RootThickness, f.TipThickness, r1, r2, log)
}

// Area is the heated area the efficiency refers to, m2 (per metre of width
// for straight fins): with the corrected length L + t/2 for rectangular
// and annular fins, with the tip face for the tapered profiles.
func (f Single) Area() float64 {
	L, t0, t1 := f.Height, f.RootThickness, f.TipThickness
	r1, r2 := f.RootRadius, f.RootRadius+f.Height
	switch f.Profile {
	case Rectangular:
		return 2 * (L + t0/2)
	case Triangular:
		return 2 * L
	case Trapezoidal:
		return 2*L + t1
	case AnnularProfile:
		r2c := r2 + t0/2
		return 2 * math.Pi * (r2c*r2c - r1*r1)
	}
	return 2*math.Pi*(r2*r2-r1*r1) + 2*math.Pi*r2*t1
}

// Fin is the same fin for the general solver (Solve): the corrected length
// with an insulated tip where the closed form uses one, the true length with
// a convecting tip otherwise.
func (f Single) Fin() Fin {
	L, t0, t1 := f.Height, f.RootThickness, f.TipThickness
	lin := func(a, b float64) func(float64) float64 { return func(s float64) float64 { return a + (b-a)*s/L } }
	switch f.Profile {
	case Rectangular:
		return Fin{Shape: Straight, Length: L + t0/2, Thickness: lin(t0, t0)}
	case Triangular:
		return Fin{Shape: Straight, Length: L, Thickness: lin(t0, 0)}
	case Trapezoidal:
		return Fin{Shape: Straight, Length: L, Thickness: lin(t0, t1), Tip: ConvectiveTip}
	case AnnularProfile:
		return Fin{Shape: Annular, RootRadius: f.RootRadius, Length: L + t0/2, Thickness: lin(t0, t0)}
	}
	return Fin{Shape: Annular, RootRadius: f.RootRadius, Length: L, Thickness: lin(t0, t1), Tip: ConvectiveTip}
}

// Single returns one fin of the set as the efficiency model takes it:
// longitudinal fins as straight trapezoids, annular fins as constant
// thickness rings when they do not taper and tapered rings when they do.
func (s Set) Single() Single {
	f := Single{Height: s.Height, RootThickness: s.RootThickness, TipThickness: s.TipThickness, RootRadius: s.RootDiameter / 2}
	switch {
	case s.Style == StyleLongitudinal:
		f.Profile = Trapezoidal
	case s.TipThickness == s.RootThickness:
		f.Profile = AnnularProfile
	default:
		f.Profile = AnnularTaper
	}
	return f
}
