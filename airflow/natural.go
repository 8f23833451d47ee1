// Natural convection from a fin set: the correlation and the NaturalModel
// the cylinder estimator chooses through.

package airflow

import (
	"math"

	"finmarch/fins/validity"
)

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

// NaturalModel is a natural-convection correlation for a fin set: a
// replaceable part of the cylinder estimator (its Settings field Natural;
// nil means BarCohenRohsenow).
type NaturalModel interface {
	// H returns the mean coefficient W/(m2 K) of fins whose passages are
	// gap (m) wide and height (m) tall, dT (K) above the ambient, with air
	// the film properties; it checks its validity ranges in log.
	H(air Air, gap, height, dT float64, log *validity.Log) float64
}

// BarCohenRohsenow takes the passages of a fin set as vertical channels:
// h = Nu_S k/S with Nu_S from VerticalChannelNaturalNu at the Elenbaas
// number El = Ra_S S/L.
type BarCohenRohsenow struct{}

// H is the vertical-channel coefficient of VerticalChannelNaturalNu.
func (BarCohenRohsenow) H(air Air, gap, height, dT float64, log *validity.Log) float64 {
	el := Rayleigh(air, gap, dT) * gap / height
	return VerticalChannelNaturalNu(el, log) * air.K / gap
}
