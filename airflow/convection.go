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

// fTurb is the Petukhov factor at the turbulent end of transition.
var fTurb = PetukhovFriction(ReTurbulent, nil)

var sqrtF8Turb = math.Sqrt(fTurb / 8)

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

// PetukhovFriction returns the Darcy friction factor of a smooth duct in
// turbulent flow, f = (0.790 ln Re - 1.64)^-2 (Petukhov 1970; Incropera et
// al. 6th ed. Eq. 8.21). Valid 3000 <= Re <= 5e6.
func PetukhovFriction(re float64, log *validity.Log) float64 {
	log.Check("Petukhov friction factor", "Reynolds number", re, 3000, 5e6)
	v := 0.790*math.Log(re) - 1.64
	return 1 / (v * v)
}

// GnielinskiNu returns the mean Nusselt number of turbulent flow in a duct
// of hydraulic diameter Dh and length L:
//
//	Nu = (f/8)(Re - 1000) Pr / (1 + 12.7 sqrt(f/8) (Pr^(2/3) - 1)) * (1 + (Dh/L)^(2/3)),
//
// with f the Petukhov Darcy factor; the last factor is Gnielinski's
// entrance correction for a developing flow (Gnielinski, Int. Chem. Eng. 16,
// 1976; Incropera et al. 6th ed. Eq. 8.62; VDI Heat Atlas 2010, G1 Eq. 28).
// Valid 3000 <= Re <= 5e6, 0.5 <= Pr <= 2000, Dh/L <= 1. dhOverL is
// dimensionless (pass 0 for a fully developed flow).
func GnielinskiNu(re, pr, dhOverL float64, log *validity.Log) float64 {
	log.Check("Gnielinski turbulent duct flow", "Reynolds number", re, 3000, 5e6)
	log.Check("Gnielinski turbulent duct flow", "Prandtl number", pr, 0.5, 2000)
	log.Check("Gnielinski turbulent duct flow", "Dh/L", dhOverL, 0, 1)
	var f float64
	if re == ReTurbulent {
		f = fTurb // the transition blend's fixed end
	} else {
		f = PetukhovFriction(math.Max(re, 3000), nil)
	}
	f8 := f / 8
	c := math.Cbrt(pr)
	nu := f8 * (re - 1000) * pr / (1 + 12.7*math.Sqrt(f8)*(c*c-1))
	d := math.Cbrt(dhOverL)
	return nu * (1 + d*d)
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
// (based on Dh) and Prandtl number Pr: Stephan and Shah below Re = 2300,
// Gnielinski and Petukhov (Fanning f = f_Darcy/4, plus the laminar
// entrance excess K(inf)/(4 x+) of Shah) above 1e4, and between them the
// linear blend in Re that Gnielinski recommends (VDI Heat Atlas 2010, G1
// Eq. 30), Nu = (1 - g) Nu_lam(2300) + g Nu_turb(1e4), g = (Re - 2300)/7700,
// which is continuous at both ends. lOverDh is L/Dh.
func Channel(re, pr, lOverDh float64, log *validity.Log) ChannelFlow {
	if re <= ReLaminar {
		return ChannelFlow{
			Nu:     ParallelPlatesNu(lOverDh/(re*pr), pr, log),
			Fapp:   ParallelPlatesFriction(re, lOverDh/re, log),
			Regime: "laminar",
		}
	}
	turb := func(r float64) (float64, float64) {
		nu := GnielinskiNu(r, pr, 1/lOverDh, log)
		f := PetukhovFriction(r, nil)/4 + 0.674/(4*lOverDh) // entrance excess, Shah & London
		return nu, f
	}
	if re >= ReTurbulent {
		nu, f := turb(re)
		return ChannelFlow{Nu: nu, Fapp: f, Regime: "turbulent"}
	}
	nl := ParallelPlatesNu(lOverDh/(ReLaminar*pr), pr, nil)
	fl := ParallelPlatesFriction(ReLaminar, lOverDh/ReLaminar, nil)
	nt, ft := turb(ReTurbulent)
	g := (re - ReLaminar) / (ReTurbulent - ReLaminar)
	return ChannelFlow{Nu: (1-g)*nl + g*nt, Fapp: (1-g)*fl + g*ft, Regime: "transition"}
}

// ChannelNu is the Nusselt number of Channel without the friction factor,
// for the march, which needs only heat transfer.
func ChannelNu(re, pr, lOverDh float64, log *validity.Log) (float64, string) {
	if re <= ReLaminar {
		return ParallelPlatesNu(lOverDh/(re*pr), pr, log), "laminar"
	}
	dh := 1 / lOverDh
	if re >= ReTurbulent {
		return GnielinskiNu(re, pr, dh, log), "turbulent"
	}
	nl := ParallelPlatesNu(lOverDh/(ReLaminar*pr), pr, nil)
	nt := GnielinskiNu(ReTurbulent, pr, dh, log)
	g := (re - ReLaminar) / (ReTurbulent - ReLaminar)
	return (1-g)*nl + g*nt, "transition"
}

// TeertstraNu returns the channel-average Nusselt number Nu_b = h b / k of
// a plate-fin passage of spacing b and length L by the composite model of
// Teertstra, Yovanovich & Culham (Analytical forced convection modeling of
// plate fin heat sinks, Proc. 15th IEEE SEMI-THERM, 1999, Eq. 12):
//
//	Nu_b = [ (Re* Pr / 2)^-3 + (0.664 sqrt(Re*) Pr^(1/3) sqrt(1 + 3.65/sqrt(Re*)))^-3 ]^(-1/3),
//	Re* = Re_b b / L,  Re_b = V b / nu,
//
// with h based on the wall-to-inlet temperature difference. Valid 0.1 <
// Re* < 100 (the authors' comparison range). Kept as a cross-check of the
// Stephan correlation, not used in the march.
func TeertstraNu(reStar, pr float64, log *validity.Log) float64 {
	log.Check("Teertstra-Yovanovich-Culham composite", "Re* = Re_b b/L", reStar, 0.1, 100)
	fd := reStar * pr / 2
	dev := 0.664 * math.Sqrt(reStar) * math.Cbrt(pr) * math.Sqrt(1+3.65/math.Sqrt(reStar))
	return math.Pow(math.Pow(fd, -3)+math.Pow(dev, -3), -1.0/3)
}

// FlatPlateNu returns the average Nusselt number h L / k of a flat plate in
// parallel flow at Re_L and Pr: laminar 0.664 Re^(1/2) Pr^(1/3) below
// Re = 5e5, mixed (0.037 Re^(4/5) - 871) Pr^(1/3) above (Incropera et al.
// 6th ed. Eqs. 7.30 and 7.38). Valid Pr >= 0.6, Re_L <= 1e8.
func FlatPlateNu(re, pr float64, log *validity.Log) float64 {
	log.Check("flat plate (Incropera 7.30/7.38)", "Prandtl number", pr, 0.6, 60)
	log.Check("flat plate (Incropera 7.30/7.38)", "Reynolds number", re, 0, 1e8)
	if re <= 5e5 {
		return 0.664 * math.Sqrt(re) * math.Cbrt(pr)
	}
	return (0.037*math.Pow(re, 0.8) - 871) * math.Cbrt(pr)
}

// CylinderCrossflowNu returns the average Nusselt number h D / k of a
// cylinder in cross flow by Churchill & Bernstein (J. Heat Transfer 99,
// 1977; Incropera et al. 6th ed. Eq. 7.54):
//
//	Nu = 0.3 + 0.62 Re^(1/2) Pr^(1/3) / [1 + (0.4/Pr)^(2/3)]^(1/4) * [1 + (Re/282000)^(5/8)]^(4/5).
//
// Valid Re Pr >= 0.2, Re <= 1e7.
func CylinderCrossflowNu(re, pr float64, log *validity.Log) float64 {
	log.Check("Churchill-Bernstein cylinder in cross flow", "Re Pr", re*pr, 0.2, 1e7)
	a := 0.62 * math.Sqrt(re) * math.Cbrt(pr) / math.Pow(1+math.Pow(0.4/pr, 2.0/3), 0.25)
	return 0.3 + a*math.Pow(1+math.Pow(re/282000, 5.0/8), 0.8)
}

// HorizontalCylinderNaturalNu returns the average Nusselt number h D / k of
// a long isothermal horizontal cylinder in free convection by Churchill &
// Chu (Int. J. Heat Mass Transfer 18, 1975; Incropera et al. 6th ed.
// Eq. 9.34):
//
//	Nu = {0.60 + 0.387 Ra^(1/6) / [1 + (0.559/Pr)^(9/16)]^(8/27)}^2.
//
// Valid Ra_D <= 1e12.
func HorizontalCylinderNaturalNu(ra, pr float64, log *validity.Log) float64 {
	log.Check("Churchill-Chu horizontal cylinder", "Rayleigh number", ra, 0, 1e12)
	v := 0.60 + 0.387*math.Pow(ra, 1.0/6)/math.Pow(1+math.Pow(0.559/pr, 9.0/16), 8.0/27)
	return v * v
}

// VerticalPlateNaturalNu returns the average Nusselt number h L / k of an
// isothermal vertical plate of height L in free convection by Churchill &
// Chu (Int. J. Heat Mass Transfer 18, 1975; Incropera et al. 6th ed.
// Eq. 9.26):
//
//	Nu = {0.825 + 0.387 Ra^(1/6) / [1 + (0.492/Pr)^(9/16)]^(8/27)}^2,
//
// valid for all Ra_L (checked to 1e13).
func VerticalPlateNaturalNu(ra, pr float64, log *validity.Log) float64 {
	log.Check("Churchill-Chu vertical plate", "Rayleigh number", ra, 0, 1e13)
	v := 0.825 + 0.387*math.Pow(ra, 1.0/6)/math.Pow(1+math.Pow(0.492/pr, 9.0/16), 8.0/27)
	return v * v
}

// VerticalChannelNaturalNu returns the Nusselt number h S / k of a channel
// between isothermal vertical parallel plates (fins) at spacing S and height
// L in free convection, by Bar-Cohen & Rohsenow (J. Heat Transfer 106,
// 1984; Incropera et al. 6th ed. Eq. 9.37 with C1 = 576, C2 = 2.87 for
// symmetric isothermal plates):
//
//	Nu_S = [576/El^2 + 2.87/El^(1/2)]^(-1/2),  El = Ra_S S / L,
//
// the Elenbaas number. It spans the fully developed limit El/24 and the
// isolated-plate limit 0.59 El^(1/4) (Elenbaas, Physica 9, 1942). Valid
// 1e-1 <= El <= 1e5 (Elenbaas's data); dimensionless argument.
func VerticalChannelNaturalNu(el float64, log *validity.Log) float64 {
	log.Check("Bar-Cohen & Rohsenow vertical channel", "Elenbaas number", el, 0.1, 1e5)
	return 1 / math.Sqrt(576/(el*el)+2.87/math.Sqrt(el))
}

// Rayleigh returns g beta |dT| L^3 / (nu alpha) for air a, length L (m) and
// temperature difference dT (K).
func Rayleigh(a Air, L, dT float64) float64 {
	return G0 * a.Beta * math.Abs(dT) * L * L * L / (a.Nu * a.Alpha)
}

// CombineMixed combines forced and natural convection Nusselt numbers,
// Nu^3 = NuF^3 + NuN^3 (Churchill 1977, AIChE J. 23; Incropera et al. 6th
// ed. Eq. 9.66, n = 3, for assisting and transverse flows).
func CombineMixed(nuF, nuN float64) float64 {
	return math.Cbrt(nuF*nuF*nuF + nuN*nuN*nuN)
}

// RadiationH returns the linearised radiation coefficient of a small grey
// surface of emissivity eps at Tw (K) in large surroundings at Ts (K),
// h_r = eps sigma (Tw + Ts)(Tw^2 + Ts^2) W/(m2 K), so that the exchange is
// h_r (Tw - Ts) (Incropera et al. 6th ed. Eq. 1.9). Valid 0 < eps <= 1.
func RadiationH(eps, tw, ts float64, log *validity.Log) float64 {
	log.Check("grey-body radiation", "emissivity", eps, 0, 1)
	return eps * Sigma * (tw + ts) * (tw*tw + ts*ts)
}
