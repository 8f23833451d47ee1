// External flow over the envelope of a fin set: the correlations the
// cylinder estimator uses for the air that does not run along the fin
// passages (crossing the finned cylinder, or running along it).

package airflow

import (
	"math"

	"finmarch/fins/validity"
)

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

// DiskFacingFlowNu returns the average Nusselt number h D / k over the
// upstream face of a thin disk of diameter D set normal to a uniform
// stream, by Sparrow & Geiger (J. Heat Transfer 107, 1985, 321-326; the
// form as recalled, from memory, not read: medium confidence in the
// constant and the exponents):
//
//	Nu_D = 1.05 Re_D^(1/2) Pr^0.36,
//
// Re_D = rho V D / mu with V the approach velocity, properties at the film
// temperature. Stated range (from memory) 5e3 <= Re_D <= 5e4, Pr of air;
// outside it the form still answers, with a warning. The Re^(1/2) law is
// that of a laminar stagnation-region boundary layer, which grows over
// the face from its centre in a favourable pressure gradient (the flow
// accelerates toward the rim); above 5e4 it is extrapolated on that law
// (our assumption: the face's layer stays laminar, and free-stream
// turbulence would only raise the coefficient). finmarch uses it for the fin face that meets
// the axial road air first on an inclined or laid-over cylinder with
// annular fins (airflow/cylinder: the leading face).
func DiskFacingFlowNu(re, pr float64, log *validity.Log) float64 {
	log.Check("Sparrow-Geiger disk facing the stream (from memory)", "Reynolds number", re, 5e3, 5e4)
	log.Check("Sparrow-Geiger disk facing the stream (from memory)", "Prandtl number", pr, 0.6, 1)
	return 1.05 * math.Sqrt(re) * math.Pow(pr, 0.36)
}
