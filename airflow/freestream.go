// Free-stream correlations of finned cylinders: the forced coefficient of
// a finned cylinder standing in the road air with its fin tips open, as
// published for motorcycle cylinders (Gibson) and for annular finned tubes
// in cross flow (Briggs & Young). The cylinder estimator runs them beside
// its channel march (airflow/cylinder, method.go).

package airflow

import (
	"math"

	"finmarch/fins/validity"
)

// GibsonRefDensity is the air density at which Gibson's correlation is
// taken to hold, kg/m3: air at 20 C and 101.325 kPa (1.204 kg/m3), the
// still air of a laboratory wind tunnel. This is our assumption: the
// correlation as quoted carries no air state. Elsewhere GibsonH scales the
// speed by rho/GibsonRefDensity, the mass-velocity (rho V) similarity under
// which the NACA finned-cylinder work correlated its data (Ellerbrock &
// Biermann, NACA Report 676, 1939, summary: a factor involving "the
// velocity, the density and the viscosity of the cooling air"; read in
// part), applied here by this project.
const GibsonRefDensity = 1.204

// gibsonFloor is the least value of Gibson's bracket, 0.2 of its constant
// 0.0247: the bracket reaches zero near 95 mm of fin at 8 mm pitch, far
// outside the fins the formula was fitted to; the floor keeps a finite
// coefficient there (our choice; a range warning always goes with it).
const gibsonFloor = 0.2 * 0.0247

// Gibson's correlation's range as this project checks it. The source's own
// range is in the unread part of the paper; these are the motorcycle fins
// of the correlation's title over which this project holds it against its
// other methods (README, Validation): an assumption, not a published range.
const (
	gibsonMinSpeed, gibsonMaxSpeed   = 10 / 3.6, 150 / 3.6 // m/s
	gibsonMinPitch, gibsonMaxPitch   = 5e-3, 15e-3         // m
	gibsonMinLength, gibsonMaxLength = 15e-3, 50e-3        // m
)

// GibsonH returns the mean fin-surface heat-transfer coefficient, W/(m2 K),
// of a motorcycle cylinder's fins in a free air stream by Gibson's
// correlation (A. H. Gibson, "The air cooling of petrol engines", Proc.
// Inst. Automobile Engineers, c. 1920; from memory), as quoted by Yoshida,
// Ishihara, Murakami, Nakashima & Yamamoto, "Air-cooling effects of fins on
// a motorcycle engine", JSME Int. J. Ser. B 49(3), 2006, Eq. (1):
//
//	alpha = 241.7 [0.0247 - 0.00148 h^0.8 / p^0.4] u^0.73,
//
// h the fin length (root to tip) in mm, p the fin pitch in mm, u the air
// speed in km/h. The units of h, p and u are inferred, not read (the quote
// stops at "h: Fin leng"): in mm the fin-length term matters, in m it
// would not; 241.7 is 340.70 (Btu/(ft2 min F) to W/(m2 K)) over
// 1.609344^0.73 (mph to km/h) to 0.4 %. The coefficient is referred to the
// approaching air's temperature; it has no natural-convection floor.
//
// Arguments in SI: finLength and pitch in m, speed in m/s, rho the
// approaching air's density in kg/m3 (the speed is scaled by
// rho/GibsonRefDensity; 0 means GibsonRefDensity). The checked range (an
// assumption, see the constants above): speed 10 to 150 km/h, pitch 5 to
// 15 mm, fin length 15 to 50 mm; no air (speed 0) is 0 without a
// warning. Where the bracket would fall below a fifth of its constant
// (from about 57 mm of fin at 5 mm pitch to 99 mm at 15 mm) it is held
// there.
func GibsonH(finLength, pitch, speed, rho float64, log *validity.Log) float64 {
	const name = "Gibson motorcycle-fin correlation (Yoshida et al. 2006, Eq. 1)"
	if rho <= 0 {
		rho = GibsonRefDensity
	}
	u := speed * rho / GibsonRefDensity
	if !(u > 1e-6) {
		return 0 // no air along the fins: no forced coefficient, and no range to check
	}
	log.Check(name, "air speed (m/s, density-scaled)", u, gibsonMinSpeed, gibsonMaxSpeed)
	log.Check(name, "fin pitch (m)", pitch, gibsonMinPitch, gibsonMaxPitch)
	log.Check(name, "fin length (m)", finLength, gibsonMinLength, gibsonMaxLength)
	hmm, pmm, kmh := finLength*1e3, pitch*1e3, u*3.6
	b := 0.0247 - 0.00148*math.Pow(hmm, 0.8)/math.Pow(pmm, 0.4)
	b = math.Max(b, gibsonFloor)
	return 241.7 * b * math.Pow(kmh, 0.73)
}

// BriggsYoungNu returns the Nusselt number h D_o / k of annular finned
// tubes in cross flow by Briggs & Young ("Convection heat transfer and
// pressure drop of air flowing across triangular banks of finned tubes",
// Chem. Eng. Prog. Symp. Ser. 59(41), 1963; as implemented in ht,
// CalebBell/ht:ht/air_cooler.py@f9c60c4, h_Briggs_Young):
//
//	Nu = 0.134 Re^0.681 Pr^(1/3) (s/l)^0.2 (s/t)^0.1134,
//
// Re = rho V D_o / mu on the bare (root) diameter D_o, s the clear gap
// between fins, l the fin height, t the fin thickness (all m). The
// coefficient applies to fins and bare tube alike and is referred to the
// air's bulk temperature. Fitted to banks of tubes, V the velocity in the
// bank's minimum flow area; for a lone finned cylinder this project takes
// the approach velocity (an assumption). Ranges as ht states them: 1000 <
// Re < 8000, 11.13 mm < D_o < 40.89 mm, 1.42 mm < l < 16.57 mm, 0.33 mm <
// t < 2.02 mm, fin pitch 1.30 to 4.06 mm (from memory the original's Re
// range is 1100 to 18 000 and the 1.30 to 4.06 mm range is of the
// spacing). An engine cylinder lies outside most of them.
func BriggsYoungNu(re, pr, gap, height, thickness, rootDiameter float64, log *validity.Log) float64 {
	const name = "Briggs & Young annular finned tubes (1963)"
	if !(re > 1e-6) {
		return 0 // no air across the tubes
	}
	log.Check(name, "Reynolds number on the root diameter", re, 1000, 8000)
	log.Check(name, "root diameter (m)", rootDiameter, 11.13e-3, 40.89e-3)
	log.Check(name, "fin height (m)", height, 1.42e-3, 16.57e-3)
	log.Check(name, "fin thickness (m)", thickness, 0.33e-3, 2.02e-3)
	log.Check(name, "fin pitch (m)", gap+thickness, 1.30e-3, 4.06e-3)
	return 0.134 * math.Pow(re, 0.681) * math.Cbrt(pr) * math.Pow(gap/height, 0.2) * math.Pow(gap/thickness, 0.1134)
}
