package cylinder

import (
	"fmt"
	"math"

	"finmarch/airflow"
)

// RoadLoad describes a vehicle at steady cruise, for the heat the engine
// must reject. SI units. A zero coefficient, efficiency, share or count
// means its sourced default (the Default constants below).
type RoadLoad struct {
	Mass        float64 `json:"mass_kg"`              // kg, vehicle with rider and load
	CdA         float64 `json:"drag_area_m2"`         // m2, drag area
	Crr         float64 `json:"rolling_resistance"`   // rolling-resistance coefficient, -; 0 means DefaultCrr
	Driveline   float64 `json:"driveline_efficiency"` // drivetrain efficiency, wheel power / brake power, -; 0 means DefaultDriveline
	Thermal     float64 `json:"thermal_efficiency"`   // brake thermal efficiency, brake power / fuel power, -; 0 means DefaultThermal
	CoolShare   float64 `json:"cooling_share"`        // share of fuel power rejected through the fins, -; 0 means DefaultCoolShare
	Cylinders   int     `json:"cylinders"`            // number of cylinders sharing the load; 0 means 1
	HeadShare   float64 `json:"head_share"`           // share of one cylinder's fin heat through the head fins, -; 0 means DefaultHeadShare
	GradePct    float64 `json:"grade_percent"`        // road grade, per cent (0 on the level)
	ExtraPowerW float64 `json:"extra_power_W"`        // W at the wheel, e.g. a towed load or headwind allowance
	// IdleHeat is the heat one cylinder's fins reject at idle, W: the
	// least the road load gives (0: no floor).
	IdleHeat float64 `json:"idle_heat_W"`
	// RatedPower is the engine's rated power at the crank, W (0: not
	// given): a road load past it is a speed the engine cannot hold.
	RatedPower float64 `json:"rated_power_W"`
	// TopGearSpeed is the road speed in top gear at the engine's rated
	// (highest allowed) crankshaft speed, m/s (0: not given): a faster
	// road speed is one the engine cannot hold either.
	TopGearSpeed float64 `json:"top_gear_speed_m_s"`
	// AccessoryPower is power the engine drives besides the wheels, at the
	// crank, W: a cooling fan's shaft power (Design.Evaluate sets it from
	// the fan's operating point), so that a bigger fan is not free.
	AccessoryPower float64 `json:"accessory_power_W"`
}

// withDefaults returns r with every zero that has a default replaced by it.
func (r RoadLoad) withDefaults() RoadLoad {
	def := func(v *float64, d float64) {
		if *v == 0 {
			*v = d
		}
	}
	def(&r.Crr, DefaultCrr)
	def(&r.Driveline, DefaultDriveline)
	def(&r.Thermal, DefaultThermal)
	def(&r.CoolShare, DefaultCoolShare)
	def(&r.HeadShare, DefaultHeadShare)
	if r.Cylinders == 0 {
		r.Cylinders = 1
	}
	return r
}

// Road-load defaults with their sources.
const (
	// DefaultDriveline: a chain or belt final drive with gearbox, 0.90
	// (common practice).
	DefaultDriveline = 0.90
	// DefaultThermal: brake thermal efficiency of a small air-cooled
	// spark-ignition engine at part-load cruise, 0.25 (Heywood, Internal
	// Combustion Engine Fundamentals, 1988, Ch. 15, part-load brake
	// efficiency of small SI engines about 20-30%; from memory).
	DefaultThermal = 0.25
	// DefaultCoolShare: share of fuel energy to the cooling system of an SI
	// engine, 0.22 (Heywood 1988, Table 12.1: 17-26%; from memory).
	DefaultCoolShare = 0.22
	// DefaultHeadShare: share of a cylinder's rejected heat through the
	// head, 0.65 (common practice: about two thirds passes through the
	// head and the top of the barrel; Heywood 1988 Sec. 12.1 describes the
	// combustion-chamber surfaces as the main path).
	DefaultHeadShare = 0.65
	// DefaultCrr: a motorcycle tyre on asphalt, 0.02 (common practice).
	DefaultCrr = 0.02
)

// HeatLoad is the heat each fin set of one cylinder must reject.
type HeatLoad struct {
	Head       float64 `json:"head_W"`        // W
	Barrel     float64 `json:"barrel_W"`      // W
	WheelPower float64 `json:"wheel_power_W"` // W at the wheel (0 when given directly)
	BrakePower float64 `json:"brake_power_W"` // W at the crank (0 when given directly)
	FuelPower  float64 `json:"fuel_power_W"`  // W (0 when given directly)
	// OverRated is set when the crank power the road asks exceeds the
	// engine's rated power, or the road speed is past its top-gear speed:
	// the engine cannot hold this speed (the heat is what that speed would
	// need, not what the engine can make).
	OverRated bool `json:"over_rated"`
	// PastRatedSpeed is set when the road speed is past TopGearSpeed (and
	// then OverRated too).
	PastRatedSpeed bool `json:"past_rated_speed"`
}

// Heat returns the heat load per fin set at road speed v (m/s) and air
// density rho (kg/m3):
//
//	P_wheel = (0.5 rho CdA v^2 + Crr m g cos(a) + m g sin(a)) v + extra
//	P_brake = P_wheel / driveline,  P_fuel = P_brake / thermal
//	Q_fins  = CoolShare P_fuel / cylinders, split HeadShare : 1 - HeadShare
//
// (road-load equation, e.g. Gillespie, Fundamentals of Vehicle Dynamics,
// 1992, Ch. 4). The engine never rejects less than IdleHeat, split the
// same way. At v = 0 the wheel power is zero and the engine is taken at
// idle: give IdleHeat, or the load directly.
func (r RoadLoad) Heat(v, rho float64) (HeatLoad, error) {
	r = r.withDefaults()
	if err := r.check(); err != nil {
		return HeatLoad{}, err
	}
	a := math.Atan(r.GradePct / 100)
	pw := (0.5*rho*r.CdA*v*v+r.Crr*r.Mass*airflow.G0*math.Cos(a)+r.Mass*airflow.G0*math.Sin(a))*v + r.ExtraPowerW
	if pw < 0 {
		pw = 0 // coasting downhill: no load from the road
	}
	pb := pw/r.Driveline + r.AccessoryPower
	pf := pb / r.Thermal
	q := r.CoolShare * pf / float64(r.Cylinders)
	l := HeatLoad{Head: r.HeadShare * q, Barrel: (1 - r.HeadShare) * q, WheelPower: pw, BrakePower: pb, FuelPower: pf,
		OverRated: r.RatedPower > 0 && pb > r.RatedPower*(1+1e-9), PastRatedSpeed: r.TopGearSpeed > 0 && v > r.TopGearSpeed*(1+1e-9)}
	l.OverRated = l.OverRated || l.PastRatedSpeed
	if h := r.HeadShare; r.IdleHeat > 0 && l.Head+l.Barrel < r.IdleHeat {
		l.Head, l.Barrel = h*r.IdleHeat, (1-h)*r.IdleHeat
	}
	return l, nil
}

// TopSpeed returns the highest road speed (m/s) the engine can hold in air
// of density rho (kg/m3): where the crank power the road asks equals the
// rated power (bisection on the road-load equation, whose power rises with
// speed), or TopGearSpeed if that is lower; 0 and false when neither limit
// is given (or the engine cannot even move the vehicle); TopSpeedByGear
// says which sets it.
func (r RoadLoad) TopSpeed(rho float64) (v float64, ok bool) {
	v, ok = r.powerTopSpeed(rho)
	if r.TopGearSpeed > 0 && (!ok || r.TopGearSpeed < v) {
		return r.TopGearSpeed, true
	}
	return v, ok
}

// TopSpeedByGear reports whether the gearing (TopGearSpeed), not the
// rated power, sets TopSpeed.
func (r RoadLoad) TopSpeedByGear(rho float64) bool {
	v, ok := r.powerTopSpeed(rho)
	return r.TopGearSpeed > 0 && (!ok || r.TopGearSpeed < v)
}

// powerTopSpeed is the road speed at which the crank power equals the
// rated power.
func (r RoadLoad) powerTopSpeed(rho float64) (float64, bool) {
	if r.RatedPower <= 0 {
		return 0, false
	}
	brake := func(v float64) float64 {
		l, err := r.Heat(v, rho)
		if err != nil {
			return math.Inf(1)
		}
		return l.BrakePower
	}
	lo, hi := 0.0, 200.0 // m/s: no road vehicle of this tool's kind is faster
	if brake(lo) >= r.RatedPower || brake(hi) <= r.RatedPower {
		return 0, false
	}
	for i := 0; i < 60; i++ {
		mid := 0.5 * (lo + hi)
		if brake(mid) < r.RatedPower {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi), true
}

// Load is the heat load of one cylinder as a design gives it: the heats
// directly, or the road load at the operating point.
type Load struct {
	Direct bool     `json:"direct"` // Given holds the heats; otherwise Road gives them
	Given  HeatLoad `json:"given"`  // W, when Direct
	Road   RoadLoad `json:"road"`
}

// At returns the heat load of the case: Given, or the road load at the
// case's road speed and the density of its ambient air.
// Scaled returns the load with its heat scaled by k: the given heats, or
// the road load's cooling share (its default when unset), so that a
// calibration factor or a sampled scatter acts the same on either kind.
func (l Load) Scaled(k float64) Load {
	if l.Direct {
		l.Given.Head *= k
		l.Given.Barrel *= k
		return l
	}
	cs := l.Road.CoolShare
	if cs == 0 {
		cs = DefaultCoolShare
	}
	l.Road.CoolShare = cs * k
	return l
}

func (l Load) At(c Case) (HeatLoad, error) {
	if l.Direct {
		return HeatLoad{Head: l.Given.Head, Barrel: l.Given.Barrel}, nil
	}
	return l.Road.Heat(c.Speed, c.Pressure/(airflow.RAir*c.Ambient))
}

func (r RoadLoad) check() error {
	for _, c := range []struct {
		k      string
		v      float64
		lo, hi float64
	}{
		{"mass", r.Mass, 1, 50000}, {"cda", r.CdA, 0.01, 20}, {"rolling_resistance", r.Crr, 0, 0.5},
		{"driveline_efficiency", r.Driveline, 0.3, 1}, {"thermal_efficiency", r.Thermal, 0.05, 0.6},
		{"cooling_share", r.CoolShare, 0.01, 0.9}, {"head_share", r.HeadShare, 0, 1}, {"grade", r.GradePct, -30, 30},
		{"extra_power", r.ExtraPowerW, 0, 1e6}, {"idle_heat", r.IdleHeat, 0, 1e6}, {"rated_power", r.RatedPower, 0, 1e7},
		{"top_gear_speed", r.TopGearSpeed, 0, 200},
	} {
		if math.IsNaN(c.v) || c.v < c.lo || c.v > c.hi {
			return fmt.Errorf("road load: %s = %g outside %g to %g", c.k, c.v, c.lo, c.hi)
		}
	}
	if r.Cylinders < 1 || r.Cylinders > 32 {
		return fmt.Errorf("road load: cylinders = %d outside 1 to 32", r.Cylinders)
	}
	return nil
}
