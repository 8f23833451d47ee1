package design

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// dimension is a physical kind of quantity with its accepted units.
type dimension struct {
	name  string
	si    string              // SI unit shown in messages
	units map[string]unitConv // lower-case spelling -> conversion to SI
	hint  string              // shown when a bare number is out of range
	// needsUnit marks the dimensions whose SI unit is not the trade's
	// (m against mm, K against C, m/s against km/h, rad against deg): on
	// the command line a bare number for them is refused, not read as SI
	needsUnit bool
	// difference marks a temperature difference: "25 C" or "25 K" is 25 K
	difference bool
}

type unitConv struct {
	scale, offset float64 // SI = value*scale + offset
}

func lin(s float64) unitConv { return unitConv{scale: s} }

var (
	dimLength = &dimension{name: "length", si: "m", units: map[string]unitConv{
		"m": lin(1), "mm": lin(1e-3), "cm": lin(1e-2), "km": lin(1e3), "in": lin(0.0254), "inch": lin(0.0254),
		"\"": lin(0.0254), "ft": lin(0.3048)}, hint: `write "6 mm" or "0.25 in"`, needsUnit: true}
	dimSpeed = &dimension{name: "speed", si: "m/s", units: map[string]unitConv{
		"m/s": lin(1), "km/h": lin(1 / 3.6), "kph": lin(1 / 3.6), "kmh": lin(1 / 3.6), "mph": lin(0.44704),
		"kn": lin(0.514444), "kt": lin(0.514444), "ft/s": lin(0.3048)}, hint: `write "100 km/h" or "60 mph"`, needsUnit: true}
	dimTemp = &dimension{name: "temperature", si: "K", units: map[string]unitConv{
		"k": lin(1), "c": {1, 273.15}, "degc": {1, 273.15}, "°c": {1, 273.15},
		"f": {5.0 / 9, 273.15 - 32*5.0/9}, "degf": {5.0 / 9, 273.15 - 32*5.0/9}, "°f": {5.0 / 9, 273.15 - 32*5.0/9}},
		hint: `a bare number is kelvin; write "35 C" or "95 F"`, needsUnit: true}
	dimPower = &dimension{name: "power", si: "W", units: map[string]unitConv{
		"w": lin(1), "kw": lin(1e3), "hp": lin(745.69987), "ps": lin(735.49875), "btu/h": lin(0.29307107)},
		hint: `write "3 kW"`}
	dimArea = &dimension{name: "area", si: "m2", units: map[string]unitConv{
		"m2": lin(1), "m^2": lin(1), "cm2": lin(1e-4), "mm2": lin(1e-6), "in2": lin(0.00064516), "ft2": lin(0.09290304)},
		hint: `write "0.45 m2"`}
	dimMass = &dimension{name: "mass", si: "kg", units: map[string]unitConv{
		"kg": lin(1), "g": lin(1e-3), "lb": lin(0.45359237), "lbs": lin(0.45359237)}, hint: `write "230 kg" or "500 lb"`}
	dimPressure = &dimension{name: "pressure", si: "Pa", units: map[string]unitConv{
		"pa": lin(1), "hpa": lin(100), "kpa": lin(1e3), "mbar": lin(100), "bar": lin(1e5), "psi": lin(6894.757),
		"inhg": lin(3386.389), "atm": lin(101325), "inh2o": lin(249.08891), "mmh2o": lin(9.80665)}, hint: `write "101.3 kPa" or "29.92 inHg"`}
	dimAngle = &dimension{name: "angle", si: "rad", units: map[string]unitConv{
		"rad": lin(1), "deg": lin(math.Pi / 180), "°": lin(math.Pi / 180), "degrees": lin(math.Pi / 180)},
		hint: `a bare number is radians; write "90 deg"`, needsUnit: true}
	dimHCoef = &dimension{name: "heat-transfer coefficient", si: "W/(m2 K)", units: map[string]unitConv{
		"w/m2k": lin(1), "w/(m2 k)": lin(1), "w/(m2k)": lin(1), "w/m2/k": lin(1), "w/m^2k": lin(1),
		"btu/(h ft2 f)": lin(5.678263), "btu/hft2f": lin(5.678263), "btu/h-ft2-f": lin(5.678263)}, hint: `write "80 W/m2K"`}
	dimFraction = &dimension{name: "fraction", si: "-", units: map[string]unitConv{
		"": lin(1), "%": lin(0.01), "percent": lin(0.01)}, hint: `write 0.25 or "25 %"`}
	dimPercent = &dimension{name: "grade", si: "%", units: map[string]unitConv{
		"%": lin(1), "percent": lin(1)}, hint: `write "3 %"`}
	dimDensity = &dimension{name: "density", si: "kg/m3", units: map[string]unitConv{
		"kg/m3": lin(1), "kg/m^3": lin(1), "g/cm3": lin(1000), "lb/in3": lin(27679.9), "lb/ft3": lin(16.01846)},
		hint: `write "2700 kg/m3"`}
	dimConductivity = &dimension{name: "thermal conductivity", si: "W/(m K)", units: map[string]unitConv{
		"w/mk": lin(1), "w/(m k)": lin(1), "w/(mk)": lin(1), "w/m/k": lin(1), "btu/(h ft f)": lin(1.730735), "btu/h-ft-f": lin(1.730735), "btu/hftf": lin(1.730735)},
		hint: `write "150 W/mK"`}
	dimConductance = &dimension{name: "thermal conductance", si: "W/K", units: map[string]unitConv{
		"w/k": lin(1), "w/c": lin(1), "btu/h-f": lin(0.52752792), "btu/(h f)": lin(0.52752792)}, hint: `write "5 W/K"`}
	dimVolumeFlow = &dimension{name: "volume flow", si: "m3/s", units: map[string]unitConv{
		"m3/s": lin(1), "m^3/s": lin(1), "m3/h": lin(1.0 / 3600), "m3/min": lin(1.0 / 60), "l/s": lin(1e-3), "cfm": lin(0.00047194745)},
		hint: `write "0.05 m3/s" or "100 cfm"`, needsUnit: true}
	dimMassFlow = &dimension{name: "mass flow", si: "kg/s", units: map[string]unitConv{
		"kg/s": lin(1), "g/s": lin(1e-3), "kg/h": lin(1.0 / 3600), "kg/min": lin(1.0 / 60), "lb/min": lin(0.45359237 / 60)},
		hint: `write "0.08 kg/s"`, needsUnit: true}
	dimRotation = &dimension{name: "rotational speed", si: "rev/s", units: map[string]unitConv{
		"rpm": lin(1.0 / 60), "rev/min": lin(1.0 / 60), "rev/s": lin(1), "1/s": lin(1), "hz": lin(1)},
		hint: `write "6000 rpm"`, needsUnit: true}
	dimTime = &dimension{name: "time", si: "s", units: map[string]unitConv{
		"s": lin(1), "sec": lin(1), "min": lin(60), "h": lin(3600)}, hint: `write "90 s" or "15 min"`, needsUnit: true}
	dimSpecificHeat = &dimension{name: "specific heat", si: "J/(kg K)", units: map[string]unitConv{
		"j/kgk": lin(1), "j/(kg k)": lin(1), "j/(kgk)": lin(1), "kj/kgk": lin(1000), "kj/(kg k)": lin(1000),
		"btu/(lb f)": lin(4186.8), "btu/lb-f": lin(4186.8)}, hint: `write "900 J/kgK"`}
)

// unitList returns the accepted spellings for messages.
func (d *dimension) unitList() string {
	var u []string
	for k := range d.units {
		if k != "" && k != "\"" {
			u = append(u, k)
		}
	}
	sort.Strings(u)
	return strings.Join(u, ", ")
}

// normUnit folds case and the spaces users put in compound units.
func normUnit(u string) string {
	u = strings.ToLower(strings.TrimSpace(u))
	u = strings.ReplaceAll(u, "·", " ")
	u = strings.ReplaceAll(u, "²", "2")
	u = strings.ReplaceAll(u, "³", "3")
	u = strings.Join(strings.Fields(u), " ")
	return u
}

// ParseQuantity converts a value as the TOML decoder hands it (int64,
// float64 or string such as "6 mm") to SI for dimension d. A bare number
// is taken as SI already.
func parseQuantity(v any, d *dimension) (float64, error) {
	switch x := v.(type) {
	case int64:
		return float64(x), nil
	case float64:
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return 0, fmt.Errorf("%v is not a finite number", x)
		}
		return x, nil
	case string:
		return parseString(x, d)
	default:
		return 0, fmt.Errorf("want a number or a quoted %s with its unit (%s), got a %T", d.name, d.hint, v)
	}
}

func parseString(s string, d *dimension) (float64, error) { return parseText(s, d, d.difference) }

// parseText converts "6 mm" to SI; with difference set it converts a
// difference ("5 C" is 5 K), leaving out the unit's offset.
func parseText(s string, d *dimension, difference bool) (float64, error) {
	t := strings.TrimSpace(s)
	if t == "" {
		return 0, fmt.Errorf("empty %s; %s", d.name, d.hint)
	}
	// split the leading number from the unit
	i := 0
	for i < len(t) && strings.ContainsRune("+-0123456789.eE_", rune(t[i])) {
		// an 'e' is part of the number only when followed by a digit or sign
		if (t[i] == 'e' || t[i] == 'E') && (i+1 >= len(t) || !strings.ContainsRune("+-0123456789", rune(t[i+1]))) {
			break
		}
		i++
	}
	num := strings.ReplaceAll(t[:i], "_", "")
	unit := normUnit(t[i:])
	if num == "" {
		return 0, fmt.Errorf("%q has no number; %s", s, d.hint)
	}
	val, err := strconv.ParseFloat(num, 64)
	if err != nil || math.IsNaN(val) || math.IsInf(val, 0) {
		return 0, fmt.Errorf("%q: %q is not a number", s, num)
	}
	conv, ok := d.units[unit]
	if !ok {
		// accept "W/m2K" written with spaces removed or added
		conv, ok = d.units[strings.ReplaceAll(unit, " ", "")]
	}
	if !ok {
		if unit == "" {
			return 0, fmt.Errorf("%q has no unit; %s (units: %s)", s, d.hint, d.unitList())
		}
		return 0, fmt.Errorf("%q: unit %q is not a %s unit (use %s)", s, strings.TrimSpace(t[i:]), d.name, d.unitList())
	}
	si := val * conv.scale
	if !difference {
		si += conv.offset
	}
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return 0, fmt.Errorf("%q is out of the number range", s)
	}
	return si, nil
}

// Dim is implemented by the dimension markers of Q.
type Dim interface{ dim() *dimension }

// Marker types for the dimensions.
type (
	Length       struct{}
	Speed        struct{}
	Temperature  struct{}
	Power        struct{}
	Area         struct{}
	Mass         struct{}
	Pressure     struct{}
	Angle        struct{}
	HCoef        struct{}
	Fraction     struct{}
	Percent      struct{}
	Density      struct{}
	Conductivity struct{}
	SpecificHeat struct{}
	Conductance  struct{} // W/K
	VolumeFlow   struct{} // m3/s
	MassFlow     struct{} // kg/s
	Rotation     struct{} // rev/s
	Time         struct{} // s
	TempDiff     struct{} // a temperature difference, K
)

func (Length) dim() *dimension       { return dimLength }
func (Speed) dim() *dimension        { return dimSpeed }
func (Temperature) dim() *dimension  { return dimTemp }
func (Power) dim() *dimension        { return dimPower }
func (Area) dim() *dimension         { return dimArea }
func (Mass) dim() *dimension         { return dimMass }
func (Pressure) dim() *dimension     { return dimPressure }
func (Angle) dim() *dimension        { return dimAngle }
func (HCoef) dim() *dimension        { return dimHCoef }
func (Fraction) dim() *dimension     { return dimFraction }
func (Percent) dim() *dimension      { return dimPercent }
func (Density) dim() *dimension      { return dimDensity }
func (Conductivity) dim() *dimension { return dimConductivity }
func (SpecificHeat) dim() *dimension { return dimSpecificHeat }
func (Conductance) dim() *dimension  { return dimConductance }
func (VolumeFlow) dim() *dimension   { return dimVolumeFlow }
func (MassFlow) dim() *dimension     { return dimMassFlow }
func (Rotation) dim() *dimension     { return dimRotation }
func (Time) dim() *dimension         { return dimTime }
func (TempDiff) dim() *dimension     { return dimTempDiff }

// dimTempDiff is a temperature difference: the temperature units without
// their offsets.
var dimTempDiff = func() *dimension {
	d := *dimTemp
	d.name, d.difference = "temperature difference", true
	return &d
}()

// Q is a quantity read from the design file, held in SI. Set records
// whether the key was present.
type Q[D Dim] struct {
	SI   float64
	Set  bool
	Bare bool // written as a bare number (taken as SI)
}

// UnmarshalTOML implements toml.Unmarshaler.
func (q *Q[D]) UnmarshalTOML(v any) error {
	var d D
	si, err := parseQuantity(v, d.dim())
	if err != nil {
		return err
	}
	_, isStr := v.(string)
	q.SI, q.Set, q.Bare = si, true, !isStr
	return nil
}

// rawQ is a Q without its dimension, for code that treats every quantity
// alike (a plain struct, so passing it allocates nothing).
type rawQ struct {
	SI        float64
	Set, Bare bool
}

func (q Q[D]) raw() rawQ { return rawQ(q) }

// IsBare reports a value written without a unit.
func (q rawQ) IsBare() bool { return q.Bare }

// Or returns the value, or def when the key was absent.
func (q rawQ) Or(def float64) float64 {
	if q.Set {
		return q.SI
	}
	return def
}

// IsBare reports a value written without a unit.
func (q Q[D]) IsBare() bool { return q.Bare }

// Or returns the value, or def when the key was absent.
func (q Q[D]) Or(def float64) float64 {
	if q.Set {
		return q.SI
	}
	return def
}

// ParseValue converts a string such as "6 mm" for the dimension of D; used by
// the command-line flags, so a bare number is refused for a length, speed,
// temperature or angle (see flagValue).
func ParseValue[D Dim](s string) (float64, error) {
	var d D
	return flagValue(s, d.dim(), d.dim().difference)
}

// flagValue parses a command-line value for dimension d (a difference, such
// as a sweep step, with difference set). A bare number is SI, except for
// the dimensions marked needsUnit, where "6" for a fin pitch or "110" for
// a speed would be 6 m or 110 m/s: those are refused with the unit hint.
func flagValue(s string, d *dimension, difference bool) (float64, error) {
	if v, err := strconv.ParseFloat(strings.TrimSpace(s), 64); err == nil {
		if d.needsUnit {
			return 0, fmt.Errorf("%q has no unit; %s (a bare number here would be taken in %s)", strings.TrimSpace(s), strings.TrimPrefix(strings.TrimPrefix(d.hint, "a bare number is kelvin; "), "a bare number is radians; "), d.si)
		}
		return parseQuantity(v, d)
	}
	return parseText(s, d, difference)
}
