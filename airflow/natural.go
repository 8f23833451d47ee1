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
// 1984, 116-123; citation from memory; C1 = 576, C2 = 2.873 for symmetric
// isothermal plates, as the Fortran function nu_vertical_channel quoted in
// the reference pack has it; Incropera et al. 6th ed. Eq. 9.37 prints C2
// rounded to 2.87, from memory):
//
//	Nu_S = [576/El^2 + 2.873/El^(1/2)]^(-1/2),  El = Ra_S S / L,
//
// the Elenbaas number. It spans the fully developed limit El/24 and the
// isolated-plate limit 0.59 El^(1/4) (Elenbaas, Physica 9, 1942). Valid
// 1e-1 <= El <= 1e5 (Elenbaas's data); dimensionless argument.
func VerticalChannelNaturalNu(el float64, log *validity.Log) float64 {
	log.Check("Bar-Cohen & Rohsenow vertical channel", "Elenbaas number", el, 0.1, 1e5)
	return 1 / math.Sqrt(576/(el*el)+2.873/math.Sqrt(el))
}

// Rayleigh returns g beta |dT| L^3 / (nu alpha) for air a, length L (m) and
// temperature difference dT (K).
func Rayleigh(a Air, L, dT float64) float64 {
	return G0 * a.Beta * math.Abs(dT) * L * L * L / (a.Nu * a.Alpha)
}

// NaturalModel is a natural-convection correlation for a fin set: a
// replaceable part of the cylinder estimator (its Settings field Natural;
// nil means the fins at their real orientation, InclinedFinsH).
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

// InclinedFins describes a fin set's passages for natural convection at
// the set's real orientation: the gap, and the two views of its fins.
type InclinedFins struct {
	Gap float64 // m, clear gap between fins
	// ChannelHeight is the height of a passage taken as a vertical channel
	// (m) and ChannelSine the sine of the passages' slope from the
	// horizontal: the share of gravity along them.
	ChannelHeight, ChannelSine float64
	// FaceLength is A/P of one fin face (m) and FaceCosine the cosine of
	// the faces' slope from the horizontal: the share of gravity normal to
	// them.
	FaceLength, FaceCosine float64
}

// InclinedFinsH returns the natural-convection coefficient W/(m2 K) of
// fins dT (K) above the ambient air (air: film properties) at their real
// orientation, and which view gives it ("vertical channels" or
// "horizontal fins"), by the rule for inclined surfaces of Raithby &
// Hollands (Handbook of Heat Transfer, 3rd ed. 1998, ch. 4; from memory):
// the larger of
//
//   - the vertical-channel coefficient (VerticalChannelNaturalNu, Bar-Cohen
//     & Rohsenow 1984) with g replaced by its component along the passages,
//     g ChannelSine (Incropera et al. 6th ed. Sec. 9.6.2: g cos(angle from
//     vertical) for inclined plates), and
//   - the horizontal-plate coefficient of McAdams (Heat Transmission, 3rd
//     ed. 1954; HorizontalPlateMcAdamsNu), the mean of a hot face up and a
//     hot face down, on L = A/P, with g replaced by g FaceCosine; stacked
//     fins breathe only through the gap between them, so it is taken no
//     larger than the vertical-channel coefficient of the same fins
//     standing vertical (ChannelHeight under full gravity): horizontal fins
//     do no better than vertical ones at the same gap. Our assumption,
//     after Senapati, Dash & Roy (Int. J. Thermal Sci. 111, 2017, and Int.
//     J. Heat Mass Transfer 96, 2016; abstracts read): horizontal annular
//     fins on a vertical cylinder are best at 7.0 to 7.7 mm of spacing,
//     vertical annular fins on a horizontal one at 5 to 6 mm, so the
//     horizontal fins need wider gaps to breathe as well.
//
// Units: m, K; air at film properties. The correlations check their own
// ranges in log.
func InclinedFinsH(air Air, f InclinedFins, dT float64, log *validity.Log) (float64, string) {
	if !(dT > 0) || !(f.Gap > 0) {
		return 0, "none"
	}
	// both views without a log, then the one chosen again with it: only
	// the correlation that sets the answer reports its ranges
	hv, hh := inclinedViews(air, f, dT, nil)
	if hh > hv {
		inclinedViews(air, InclinedFins{Gap: f.Gap, FaceLength: f.FaceLength, FaceCosine: f.FaceCosine, ChannelHeight: f.ChannelHeight}, dT, log)
		return hh, "horizontal fins"
	}
	inclinedViews(air, InclinedFins{Gap: f.Gap, ChannelHeight: f.ChannelHeight, ChannelSine: f.ChannelSine}, dT, log)
	return hv, "vertical channels"
}

// inclinedViews returns the vertical-channel and horizontal-fin
// coefficients of InclinedFinsH, W/(m2 K) (0 for a view that does not
// arise).
func inclinedViews(air Air, f InclinedFins, dT float64, log *validity.Log) (hv, hh float64) {
	if sv := math.Abs(f.ChannelSine); sv > 1e-9 && f.ChannelHeight > 0 {
		el := sv * Rayleigh(air, f.Gap, dT) * f.Gap / f.ChannelHeight
		hv = VerticalChannelNaturalNu(el, log) * air.K / f.Gap
	}
	if ch := math.Abs(f.FaceCosine); ch > 1e-9 && f.FaceLength > 0 && f.ChannelHeight > 0 {
		ra := ch * Rayleigh(air, f.FaceLength, dT)
		plate := func(log *validity.Log) float64 {
			return 0.5 * (HorizontalPlateMcAdamsNu(ra, true, log) + HorizontalPlateMcAdamsNu(ra, false, log)) * air.K / f.FaceLength
		}
		el := Rayleigh(air, f.Gap, dT) * f.Gap / f.ChannelHeight
		standing := func(log *validity.Log) float64 { return VerticalChannelNaturalNu(el, log) * air.K / f.Gap }
		// the one that sets the answer reports its ranges
		if hh = plate(nil); hh < standing(nil) {
			plate(log)
		} else {
			hh = standing(log)
		}
	}
	return hv, hh
}
