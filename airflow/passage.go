// Forced convection in a fin passage: the correlations, their blend and
// the PassageModel the cylinder estimator chooses through.

package airflow

import (
	"math"

	"finmarch/fins/validity"
)

// Transition limits of flow in a passage (Gnielinski, VDI Heat Atlas, 2nd
// ed. 2010, Sec. G1, Eq. 30: laminar below 2300, turbulent above 1e4).
const (
	ReLaminar   = 2300.0
	ReTurbulent = 1.0e4
)

// ParallelPlatesNu returns the mean Nusselt number Nu = h Dh / k (Dh = 2 s,
// s the plate spacing) for simultaneously developing laminar flow between
// isothermal parallel plates, by Stephan's correlation as quoted in Shah &
// London, Laminar Flow Forced Convection in Ducts (1978), Sec. VI.C:
//
//	Nu_m = 7.55 + 0.024 x*^-1.14 / (1 + 0.0358 Pr^0.17 x*^-0.64),
//	x* = L / (Dh Re Pr),
//
// with h based on the log-mean temperature difference. Valid Re < 2300 and
// 0.1 <= Pr <= 1000 (Shah & London). Arguments are dimensionless.
func ParallelPlatesNu(xStar, pr float64, log *validity.Log) float64 {
	log.Check("Stephan developing laminar flow (Shah & London 1978)", "Prandtl number", pr, 0.1, 1000)
	// the powers through one logarithm each (math.Pow is several times
	// slower and this sits in the march's inner loop)
	lx := math.Log(xStar)
	return 7.55 + 0.024*math.Exp(-1.14*lx)/(1+0.0358*math.Exp(0.17*math.Log(pr)-0.64*lx))
}

// ParallelPlatesFriction returns the apparent Fanning friction factor f_app
// over a length L of developing laminar flow between parallel plates
// (entrance pressure defect included), by Shah's correlation (Shah & London
// 1978, Eq. 341, with the parallel-plate constants f Re = 24, K(inf) =
// 0.674, C = 0.000029):
//
//	f_app Re = 3.44/sqrt(x+) + (24 + 0.674/(4x+) - 3.44/sqrt(x+)) / (1 + 0.000029/x+^2),
//	x+ = L/(Dh Re).
//
// Valid for laminar flow, Re < 2300 (Dh = 2 s). Dimensionless arguments.
func ParallelPlatesFriction(re, xPlus float64, log *validity.Log) float64 {
	log.Check("Shah apparent friction, parallel plates (Shah & London 1978)", "Reynolds number", re, 0, ReLaminar)
	r := 3.44 / math.Sqrt(xPlus)
	return (r + (24+0.674/(4*xPlus)-r)/(1+0.000029/(xPlus*xPlus))) / re
}

// KonakovFriction returns the Darcy friction factor of a smooth tube in
// fully turbulent flow, xi = (1.8 log10 Re - 1.5)^-2 (Konakov 1946, as the
// VDI Heat Atlas, 2nd ed. 2010, Sec. G1, Eq. 28 gives it for Gnielinski's
// equation; from memory). Valid 1e4 <= Re <= 1e6.
func KonakovFriction(re float64, log *validity.Log) float64 {
	log.Check("Konakov friction factor", "Reynolds number", re, ReTurbulent, 1e6)
	v := 1.8*math.Log10(re) - 1.5
	return 1 / (v * v)
}

// GnielinskiNu returns the mean Nusselt number of fully turbulent flow in a
// duct of hydraulic diameter Dh and length L, Gnielinski's equation in the
// form of the VDI Heat Atlas (2nd ed. 2010, Sec. G1, Eqs. 27-28; from
// memory):
//
//	Nu = (xi/8) Re Pr / (1 + 12.7 sqrt(xi/8) (Pr^(2/3) - 1)) * (1 + (Dh/L)^(2/3)),
//
// with xi the Konakov factor (KonakovFriction); the last factor is the
// entrance correction for a developing flow. Constant properties: see
// GasHeatingFactor for a heated gas. Valid 1e4 <= Re <= 1e6, 0.1 <= Pr <=
// 1000, Dh/L <= 1. dhOverL is dimensionless (0 for a fully developed flow).
// The 1976 form with (Re - 1000) and Petukhov's factor (Gnielinski, Int.
// Chem. Eng. 16, 1976) is about 8 % lower at Re = 1e4; the Atlas form is
// the one whose transition blend (Eq. 30) the channel model uses.
func GnielinskiNu(re, pr, dhOverL float64, log *validity.Log) float64 {
	log.Check("Gnielinski turbulent duct flow (VDI Heat Atlas G1)", "Reynolds number", re, ReTurbulent, 1e6)
	log.Check("Gnielinski turbulent duct flow (VDI Heat Atlas G1)", "Prandtl number", pr, 0.1, 1000)
	log.Check("Gnielinski turbulent duct flow (VDI Heat Atlas G1)", "Dh/L", dhOverL, 0, 1)
	f8 := KonakovFriction(re, nil) / 8
	c := math.Cbrt(pr)
	nu := f8 * re * pr / (1 + 12.7*math.Sqrt(f8)*(c*c-1))
	d := math.Cbrt(dhOverL)
	return nu * (1 + d*d)
}

// GasHeatingFactor returns the factor on a turbulent Nusselt number for a
// gas heated by the wall, K = (T_b/T_w)^0.45 with T_b the bulk and T_w the
// wall temperature (K), so that the correlation is evaluated at bulk
// properties (Gnielinski, VDI Heat Atlas 2010, Sec. G1, Eq. 35, for 0.5 <
// T_b/T_w < 1; from memory). Laminar gas flows take no correction (Kays &
// Crawford, Convective Heat and Mass Transfer, 3rd ed. 1993, Sec. 14,
// temperature-ratio exponent n = 0 for laminar heating; from memory). A
// cooled gas (T_w < T_b) takes 1.
func GasHeatingFactor(tb, tw float64, log *validity.Log) float64 {
	if !(tw > tb) || !(tb > 0) {
		return 1
	}
	r := tb / tw
	log.Check("gas heating factor (VDI Heat Atlas G1)", "Tb/Tw", r, 0.5, 1)
	return math.Exp(0.45 * math.Log(r))
}

// PetukhovFriction returns the Darcy friction factor of a smooth duct in
// turbulent flow, f = (0.790 ln Re - 1.64)^-2 (Petukhov 1970; Incropera et
// al. 6th ed. Eq. 8.21). Valid 3000 <= Re <= 5e6. A cross-check of
// KonakovFriction (TestKonakovAgainstPetukhov); the estimator uses Konakov.
func PetukhovFriction(re float64, log *validity.Log) float64 {
	log.Check("Petukhov friction factor", "Reynolds number", re, 3000, 5e6)
	v := 0.790*math.Log(re) - 1.64
	return 1 / (v * v)
}

// ChannelFlow is the heat-transfer and friction state of flow through a fin
// passage modelled as parallel plates.
type ChannelFlow struct {
	Nu     float64 // mean Nusselt number h Dh / k (log-mean basis)
	Fapp   float64 // apparent Fanning friction factor over the passage length
	Regime string  // "laminar", "transition" or "turbulent"
}

// Channel returns the mean Nusselt number and apparent friction factor of a
// passage of hydraulic diameter Dh = 2 s and length L at Reynolds number Re
// (based on Dh) and Prandtl number Pr: ChannelNu (constant properties) and
// ChannelFriction. lOverDh is L/Dh.
func Channel(re, pr, lOverDh float64, log *validity.Log) ChannelFlow {
	nu, regime := ChannelNu(re, pr, lOverDh, 1, log)
	return ChannelFlow{Nu: nu, Fapp: ChannelFriction(re, lOverDh, log), Regime: regime}
}

// blend is the position of Re in the laminar-turbulent transition, g =
// (Re - 2300)/7700, for the linear blend X = (1 - g) X_lam(2300) + g
// X_turb(1e4), continuous at both ends. Gnielinski gives it for the
// Nusselt number (VDI Heat Atlas 2010, G1 Eq. 30); for the friction factor
// the same blend is our choice (the Atlas gives none for friction). The
// one statement of the blend, for both.
func blend(re float64) float64 { return (re - ReLaminar) / (ReTurbulent - ReLaminar) }

// ChannelNu returns the mean Nusselt number h Dh/k over the first L =
// lOverDh Dh of a passage at Reynolds number Re (on Dh) and Prandtl number
// Pr, at bulk properties, and the regime: Stephan (ParallelPlatesNu) below
// Re = 2300, Gnielinski (GnielinskiNu with its entrance correction) times
// the gas heating factor k (GasHeatingFactor; 1 for constant properties)
// above 1e4, and the linear blend between (see blend). Each correlation's
// ranges are checked in its own regime.
func ChannelNu(re, pr, lOverDh, k float64, log *validity.Log) (float64, string) {
	if re <= ReLaminar {
		return ParallelPlatesNu(lOverDh/(re*pr), pr, log), "laminar"
	}
	dh := 1 / lOverDh
	if re >= ReTurbulent {
		return k * GnielinskiNu(re, pr, dh, log), "turbulent"
	}
	nl := ParallelPlatesNu(lOverDh/(ReLaminar*pr), pr, nil)
	nt := k * GnielinskiNu(ReTurbulent, pr, dh, log)
	g := blend(re)
	return (1-g)*nl + g*nt, "transition"
}

// ChannelFriction returns the apparent Fanning friction factor over a
// passage of length L = lOverDh Dh at Reynolds number Re: Shah's
// developing laminar flow (ParallelPlatesFriction, with its entrance
// pressure defect) below Re = 2300, the Konakov Fanning factor xi/4 above
// 1e4, and the linear blend between (see blend). A turbulent profile
// develops within about ten hydraulic diameters and its entrance excess is
// small beside the sharp entry's own loss, which the hydraulics count apart
// (Idelchik 1994), so none is added (the laminar excess K(inf) = 0.674 of
// Shah & London belongs to laminar flow only).
func ChannelFriction(re, lOverDh float64, log *validity.Log) float64 {
	if re <= ReLaminar {
		return ParallelPlatesFriction(re, lOverDh/re, log)
	}
	if re >= ReTurbulent {
		return KonakovFriction(re, nil) / 4
	}
	fl := ParallelPlatesFriction(ReLaminar, lOverDh/ReLaminar, nil)
	g := blend(re)
	return (1-g)*fl + g*KonakovFriction(ReTurbulent, nil)/4
}

// PassageModel is a forced-convection correlation for the air in one fin
// passage: a replaceable part of the cylinder estimator (its Settings
// field Passage; nil means DevelopingPlates).
type PassageModel interface {
	// Nu returns the mean Nusselt number h Dh/k over the first x =
	// xOverDh Dh of a passage at Reynolds number re (on Dh) and Prandtl
	// number pr at bulk properties, with the bulk air at tb and the wall at
	// tw (K) for a property-ratio correction, and a name of the regime; it
	// checks its validity ranges in log (nil for none).
	Nu(re, pr, xOverDh, tb, tw float64, log *validity.Log) (float64, string)
	// Friction returns the apparent Fanning friction factor over a
	// passage of length lOverDh Dh at Reynolds number re and Prandtl
	// number pr (isothermal: the hydraulics run before the wall
	// temperature is known).
	Friction(re, pr, lOverDh float64) float64
}

// DevelopingPlates is the passage model of simultaneously developing flow
// between parallel plates: ChannelNu with the gas heating factor, and
// ChannelFriction (Stephan and Shah laminar, Gnielinski and Konakov
// turbulent; the Nusselt number by Gnielinski's linear blend between, the
// friction factor by the same blend, our choice).
type DevelopingPlates struct{}

// Nu is ChannelNu with GasHeatingFactor(tb, tw).
func (DevelopingPlates) Nu(re, pr, xOverDh, tb, tw float64, log *validity.Log) (float64, string) {
	return ChannelNu(re, pr, xOverDh, GasHeatingFactor(tb, tw, nil), log)
}

// Friction is ChannelFriction, without range checks (the estimator checks
// the friction correlations' ranges at the solved passage flow).
func (DevelopingPlates) Friction(re, _, lOverDh float64) float64 {
	return ChannelFriction(re, lOverDh, nil)
}
