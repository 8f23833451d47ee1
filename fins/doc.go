// Package fins holds the fin physics: closed-form fin efficiencies for the
// profiles air-cooled cylinders use, a general one-dimensional fin solver
// for any thickness profile, and the geometry of a fin set (areas, passage
// gap, hydraulic diameter, mass, overall surface efficiency).
//
// Where things are: efficiency.go, the closed forms (Incropera Table 3.5
// and the Bessel solutions); solver.go, the finite-volume solver;
// geometry.go, the fin-set arithmetic in one place (Set.Geometry, the count
// that fits, Fitting, and Restyle); curve.go, a set's efficiency against
// h/k tabulated for the march; casting.go, the casting processes' limits.
// A new fin profile is a case in Set.Geometry and Set.FinEfficiency plus a
// test against a closed form or scipy (testdata/reference).
//
// All arguments are SI: h in W/(m2 K), k in W/(m K), lengths in m. Straight
// fins are per unit width (the width along the root is much larger than
// the thickness, so the perimeter is twice the width). The one-dimensional
// fin model (Gardner, Trans. ASME 67, 1945; Incropera et al., Fundamentals
// of Heat and Mass Transfer, 6th ed., 2007, Sec. 3.6) holds when the Biot
// number h t/(2k) is small, below about 0.1; each function returns that
// Biot number check through the validity log.
package fins
