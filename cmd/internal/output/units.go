package output

import (
	"math"
	"strconv"
	"strings"
)

// Units converts SI values to display values and names the units.
type Units struct {
	US bool
	// Full writes every number at full precision (the shortest text that
	// reads back to the same float64) instead of the display's decimals:
	// set for CSV, where a spreadsheet takes the values, not a reader.
	Full bool
}

// N formats v (already in display units) with dec decimals, or at full
// precision when u.Full.
func (u Units) N(v float64, dec int) string {
	if u.Full && !math.IsNaN(v) && !math.IsInf(v, 0) {
		if v == 0 {
			return "0" // not "-0"
		}
		return strconv.FormatFloat(v, 'g', -1, 64)
	}
	return Num(v, dec)
}

// ParseUnits checks a --units value.
func ParseUnits(s string) (Units, error) {
	switch strings.ToLower(s) {
	case "metric", "si", "":
		return Units{}, nil
	case "us", "imperial":
		return Units{US: true}, nil
	}
	return Units{}, errUnits(s)
}

type errUnits string

func (e errUnits) Error() string { return "units " + string(e) + ": use metric or us" }

// Quantity is a kind of quantity the tool prints.
type Quantity int

// The quantities, each with its metric and US display unit.
const (
	Temp     Quantity = iota // temperature: C or F
	TempDiff                 // temperature difference: K or F
	Road                     // road speed: km/h or mph
	Vel                      // passage velocity: m/s or ft/s
	Len                      // small length (fins): mm or in
	H                        // heat-transfer coefficient: W/m2K or Btu/h-ft2-F
	Flux                     // heat flux: W/m2 or Btu/h-ft2
	Mass                     // kg or lb
	Area                     // m2 or ft2
	Alt                      // altitude: m or ft
	Press                    // pressure: kPa or inHg
	PerMass                  // heat per fin mass: W/kg or Btu/h-lb
	Power                    // heat rate: W or Btu/h
	Cond                     // thermal conductivity: W/mK or Btu/h-ft-F
	PerLen                   // fin parameter m: 1/m or 1/ft
	Density                  // kg/m3 or lb/ft3
	SpecHeat                 // specific heat: J/kgK or Btu/lb-F
	PerWidth                 // heat rate per width of a straight fin: W/m or Btu/h-ft
	Engine                   // engine and road power: kW or hp
	VolFlow                  // volume flow: m3/s or cfm
	Drop                     // a fan's or duct's pressure: Pa or inH2O
	Rot                      // rotational speed: rpm (both)
	MassFlow                 // kg/s or lb/min
)

// display is one display unit: value = (SI - off) mul / div + add, written
// so that each conversion is the one arithmetic it always was; dec is the
// decimals that suit the unit where it needs its own (small lengths, a
// specific heat in Btu/lb-F; 0 elsewhere: callers choose).
type display struct {
	unit               string
	off, mul, div, add float64
	dec                int
}

// units holds the metric and the US display unit of each quantity (US
// factors: NIST SP 811, 2008, Appendix B; the inHg factor at 0 C).
var units = [...][2]display{
	Temp:     {{"C", 273.15, 1, 1, 0, 0}, {"F", 273.15, 9, 5, 32, 0}},
	TempDiff: {{"K", 0, 1, 1, 0, 0}, {"F", 0, 9, 5, 0, 0}},
	Road:     {{"km/h", 0, 3.6, 1, 0, 0}, {"mph", 0, 1, 0.44704, 0, 0}},
	Vel:      {{"m/s", 0, 1, 1, 0, 0}, {"ft/s", 0, 1, 0.3048, 0, 0}},
	Len:      {{"mm", 0, 1000, 1, 0, 1}, {"in", 0, 1, 0.0254, 0, 3}},
	H:        {{"W/m2K", 0, 1, 1, 0, 0}, {"Btu/h-ft2-F", 0, 1, 5.678263, 0, 0}},
	Flux:     {{"W/m2", 0, 1, 1, 0, 0}, {"Btu/h-ft2", 0, 1, 3.154591, 0, 0}},
	Mass:     {{"kg", 0, 1, 1, 0, 0}, {"lb", 0, 1, 0.45359237, 0, 0}},
	Area:     {{"m2", 0, 1, 1, 0, 0}, {"ft2", 0, 1, 0.09290304, 0, 0}},
	Alt:      {{"m", 0, 1, 1, 0, 0}, {"ft", 0, 1, 0.3048, 0, 0}},
	Press:    {{"kPa", 0, 1, 1000, 0, 0}, {"inHg", 0, 1, 3386.389, 0, 0}},
	PerMass:  {{"W/kg", 0, 1, 1, 0, 0}, {"Btu/h-lb", 0, 0.45359237, 0.29307107, 0, 0}},
	Power:    {{"W", 0, 1, 1, 0, 0}, {"Btu/h", 0, 1, 0.29307107, 0, 0}},
	Cond:     {{"W/mK", 0, 1, 1, 0, 0}, {"Btu/h-ft-F", 0, 1, 1.730735, 0, 0}},
	PerLen:   {{"1/m", 0, 1, 1, 0, 0}, {"1/ft", 0, 0.3048, 1, 0, 0}},
	Density:  {{"kg/m3", 0, 1, 1, 0, 0}, {"lb/ft3", 0, 1, 16.01846, 0, 0}},
	SpecHeat: {{"J/kgK", 0, 1, 1, 0, 0}, {"Btu/lb-F", 0, 1, 4186.8, 0, 3}},
	PerWidth: {{"W/m", 0, 1, 1, 0, 0}, {"Btu/h-ft", 0, 0.3048, 0.29307107, 0, 0}},
	Engine:   {{"kW", 0, 1, 1000, 0, 0}, {"hp", 0, 1, 745.69987, 0, 0}},
	VolFlow:  {{"m3/s", 0, 1, 1, 0, 0}, {"cfm", 0, 1, 0.00047194745, 0, 0}},
	Drop:     {{"Pa", 0, 1, 1, 0, 0}, {"inH2O", 0, 1, 249.08891, 0, 0}},
	Rot:      {{"rpm", 0, 60, 1, 0, 0}, {"rpm", 0, 60, 1, 0, 0}},
	MassFlow: {{"kg/s", 0, 1, 1, 0, 0}, {"lb/min", 0, 60, 0.45359237, 0, 0}},
}

func (u Units) display(q Quantity) display {
	if u.US {
		return units[q][1]
	}
	return units[q][0]
}

// Of converts the SI value v of quantity q to its display unit.
func (u Units) Of(q Quantity, v float64) float64 {
	d := u.display(q)
	return (v-d.off)*d.mul/d.div + d.add
}

// Name names the display unit of q.
func (u Units) Name(q Quantity) string { return u.display(q).unit }

// Dec is the decimals that suit q in its display unit.
func (u Units) Dec(q Quantity) int { return u.display(q).dec }
