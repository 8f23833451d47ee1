package output

import "strings"

// Units converts SI values to display values and names the units.
type Units struct{ US bool }

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

// Temp converts K to C or F.
func (u Units) Temp(k float64) float64 {
	if u.US {
		return (k-273.15)*9/5 + 32
	}
	return k - 273.15
}

// TempDiff converts a temperature difference in K to K or F degrees.
func (u Units) TempDiff(d float64) float64 {
	if u.US {
		return d * 9 / 5
	}
	return d
}

// TempU names the temperature unit.
func (u Units) TempU() string {
	if u.US {
		return "F"
	}
	return "C"
}

// TempDiffU names the unit of a temperature difference.
func (u Units) TempDiffU() string {
	if u.US {
		return "F"
	}
	return "K"
}

// Road converts m/s to km/h or mph.
func (u Units) Road(v float64) float64 {
	if u.US {
		return v / 0.44704
	}
	return v * 3.6
}

// RoadU names the road-speed unit.
func (u Units) RoadU() string {
	if u.US {
		return "mph"
	}
	return "km/h"
}

// Vel converts m/s to m/s or ft/s.
func (u Units) Vel(v float64) float64 {
	if u.US {
		return v / 0.3048
	}
	return v
}

// VelU names the passage-velocity unit.
func (u Units) VelU() string {
	if u.US {
		return "ft/s"
	}
	return "m/s"
}

// Len converts m to mm or in.
func (u Units) Len(m float64) float64 {
	if u.US {
		return m / 0.0254
	}
	return m * 1000
}

// LenU names the small-length unit.
func (u Units) LenU() string {
	if u.US {
		return "in"
	}
	return "mm"
}

// LenDec is the decimals that suit small lengths.
func (u Units) LenDec() int {
	if u.US {
		return 3
	}
	return 1
}

// H converts W/(m2 K) to W/(m2 K) or Btu/(h ft2 F).
func (u Units) H(h float64) float64 {
	if u.US {
		return h / 5.678263
	}
	return h
}

// HU names the heat-transfer-coefficient unit.
func (u Units) HU() string {
	if u.US {
		return "Btu/h-ft2-F"
	}
	return "W/m2K"
}

// Flux converts W/m2 to W/m2 or Btu/(h ft2).
func (u Units) Flux(q float64) float64 {
	if u.US {
		return q / 3.154591
	}
	return q
}

// FluxU names the heat-flux unit.
func (u Units) FluxU() string {
	if u.US {
		return "Btu/h-ft2"
	}
	return "W/m2"
}

// Mass converts kg to kg or lb.
func (u Units) Mass(m float64) float64 {
	if u.US {
		return m / 0.45359237
	}
	return m
}

// MassU names the mass unit.
func (u Units) MassU() string {
	if u.US {
		return "lb"
	}
	return "kg"
}

// Area converts m2 to m2 or ft2.
func (u Units) Area(a float64) float64 {
	if u.US {
		return a / 0.09290304
	}
	return a
}

// AreaU names the area unit.
func (u Units) AreaU() string {
	if u.US {
		return "ft2"
	}
	return "m2"
}

// Alt converts m to m or ft.
func (u Units) Alt(m float64) float64 {
	if u.US {
		return m / 0.3048
	}
	return m
}

// AltU names the altitude unit.
func (u Units) AltU() string {
	if u.US {
		return "ft"
	}
	return "m"
}

// Press converts Pa to kPa or inHg.
func (u Units) Press(p float64) float64 {
	if u.US {
		return p / 3386.389
	}
	return p / 1000
}

// PressU names the pressure unit.
func (u Units) PressU() string {
	if u.US {
		return "inHg"
	}
	return "kPa"
}

// PerMass converts W/kg to W/kg or W/lb.
func (u Units) PerMass(v float64) float64 {
	if u.US {
		return v * 0.45359237
	}
	return v
}

// PerMassU names the heat-per-fin-mass unit.
func (u Units) PerMassU() string {
	if u.US {
		return "W/lb"
	}
	return "W/kg"
}
