// Correlations kept as cross-checks of the ones the estimator uses and
// for tests: none of them is called by the cylinder estimator. Each is
// tested against its own published reference in convection_test.go.

package airflow

import (
	"math"

	"finmarch/fins/validity"
)

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
