package airflow

import (
	"math"

	"finmarch/fins/validity"
)

// Physical constants.
const (
	// RAir is the specific gas constant of dry air, J/(kg K) (ICAO Doc 7488,
	// Manual of the ICAO Standard Atmosphere, 3rd ed. 1993: 287.05287).
	RAir = 287.05287
	// G0 is standard gravity, m/s2 (ICAO Doc 7488).
	G0 = 9.80665
	// Sigma is the Stefan-Boltzmann constant, W/(m2 K4) (CODATA 2018).
	Sigma = 5.670374419e-8
	// MolarMassAir is the molar mass of dry air, kg/kmol (ICAO Doc 7488).
	MolarMassAir = 28.9644
)

// Air holds dry-air properties at one state.
type Air struct {
	T     float64 // K
	P     float64 // Pa
	Rho   float64 // kg/m3
	Mu    float64 // dynamic viscosity, Pa s
	K     float64 // thermal conductivity, W/(m K)
	Cp    float64 // specific heat at constant pressure, J/(kg K)
	Pr    float64 // Prandtl number, -
	Nu    float64 // kinematic viscosity, m2/s
	Alpha float64 // thermal diffusivity, m2/s
	Beta  float64 // expansion coefficient 1/T for an ideal gas, 1/K
}

// Properties returns dry-air properties at temperature T (K) and pressure
// p (Pa):
//   - density from the ideal gas law, rho = p/(R T);
//   - viscosity by Sutherland's law mu = mu0 (T/T0)^1.5 (T0+S)/(T+S) with
//     mu0 = 1.716e-5 Pa s, T0 = 273.15 K, S = 110.4 K, and conductivity by
//     the same form with k0 = 0.0241 W/(m K), S = 194 K (White, Viscous
//     Fluid Flow, 3rd ed. 2006, Tables 1-2 and 1-3: about +-2% over
//     160-1000 K, from memory);
//   - cp from the cubic cp = (a + bT + cT^2 + dT^3)/M, a = 28.11,
//     b = 0.1967e-2, c = 0.4802e-5, d = -1.966e-9 kJ/(kmol K) (Cengel &
//     Boles, Thermodynamics, Table A-2c, 273-1800 K, max error 0.72%, from
//     memory).
//
// Valid 250-1000 K (checked, with a warning outside) and any pressure at
// which air is an ideal gas (checked 1 kPa to 1 MPa).
func Properties(T, p float64, log *validity.Log) Air {
	log.Check(PropertiesName, PropertiesTemperature, T, 250, 1000)
	log.Check("air properties (ideal gas)", "pressure Pa", p, 1e3, 1e6)
	var a Air
	a.T, a.P = T, p
	a.Rho = p / (RAir * T)
	a.Mu, a.K, a.Cp = Transport(T)
	a.Pr = a.Mu * a.Cp / a.K
	a.Nu = a.Mu / a.Rho
	a.Alpha = a.K / (a.Rho * a.Cp)
	a.Beta = 1 / T
	return a
}

// The name and quantity under which Properties checks its temperature
// range, for callers of Transport that check it themselves.
const (
	PropertiesName        = "air properties (Sutherland / Cengel cp)"
	PropertiesTemperature = "temperature K"
)

// Transport returns the viscosity (Pa s), conductivity (W/(m K)) and cp
// (J/(kg K)) of Properties at T (K), for callers that need no more (the
// march's inner loop). It checks no range: check T against 250-1000 K
// under PropertiesName where a warning is wanted.
func Transport(T float64) (mu, k, cp float64) {
	r := T / 273.15
	r15 := r * math.Sqrt(r) // (T/T0)^1.5
	mu = 1.716e-5 * r15 * (273.15 + 110.4) / (T + 110.4)
	k = 0.0241 * r15 * (273.15 + 194) / (T + 194)
	cp = 1000 * (28.11 + T*(0.1967e-2+T*(0.4802e-5-T*1.966e-9))) / MolarMassAir
	return mu, k, cp
}

// Atmosphere is a point of the standard atmosphere.
type Atmosphere struct {
	T   float64 // K
	P   float64 // Pa
	Rho float64 // kg/m3
}

// ISA returns the International Standard Atmosphere in the troposphere at
// geopotential altitude z (m): T = T0 - L z, p = p0 (T/T0)^(g0/(R L)), with
// T0 = 288.15 K, p0 = 101325 Pa, L = 0.0065 K/m (ICAO Doc 7488, 3rd ed.
// 1993; identical below 11 km to the U.S. Standard Atmosphere 1976). Valid
// -610 m to 11000 m; outside it is extrapolated with a warning.
func ISA(z float64, log *validity.Log) Atmosphere {
	log.Check("ISA troposphere", "altitude m", z, -610, 11000)
	const T0, p0, L = 288.15, 101325.0, 0.0065
	T := T0 - L*z
	p := p0 * math.Pow(T/T0, G0/(RAir*L))
	return Atmosphere{T: T, P: p, Rho: p / (RAir * T)}
}
