package cylinder

import (
	"errors"
	"fmt"
	"math"

	"finmarch/fins"
	"finmarch/fins/validity"
)

// Limits are the wall temperatures the head and the barrel must stay at or
// below, K.
type Limits struct {
	Head   float64 `json:"head_K"`
	Barrel float64 `json:"barrel_K"`
}

// MarginalBand is the margin to a limit below which a design is called
// marginal, 15 K (common practice: about the spread between cylinders of
// one engine and between a hot and a mild day's ride).
const MarginalBand = 15.0

// Status is the verdict on an outcome.
type Status string

// The verdicts, from worst to best.
const (
	StatusNoEquilibrium Status = "NO EQUILIBRIUM" // a set cannot reject its load below SaneWallLimit
	StatusOver          Status = "OVER LIMIT"     // a wall above its limit
	StatusMarginal      Status = "marginal"       // a margin under MarginalBand
	StatusOK            Status = "ok"
	StatusFixed         Status = "fixed walls" // the walls were given; the heat is the answer
)

// Design is a cylinder with its heat load and limits, at the operating
// point of its Case: what a design file describes.
type Design struct {
	Case   Case   `json:"case"`
	Load   Load   `json:"load"`
	Limits Limits `json:"limits"`
	// Walls, when set, fixes the wall temperatures of head and barrel (K):
	// the estimate then gives the heat each set rejects there.
	Walls *[2]float64 `json:"fixed_walls_K,omitempty"`
	// Process is how the fins are made; Castability checks them against
	// its limits (a zero Process checks nothing). BarrelProcess, when it
	// names one, is the barrel fins' own (an iron barrel sand cast under a
	// die-cast alloy head); otherwise Process holds for both sets.
	Process       fins.Process `json:"process"`
	BarrelProcess fins.Process `json:"barrel_process"`
}

// ProcessOf returns the process the fins of set i (0 head, 1 barrel) are
// made by.
func (d Design) ProcessOf(i int) fins.Process {
	if i == barrel && d.BarrelProcess.Name != "" {
		return d.BarrelProcess
	}
	return d.Process
}

// Resolved returns the design with every zero that stands for a sourced
// default (the pressure recovery; the road load's coefficients, shares,
// efficiencies and cylinder count) replaced by that default, so that it
// reads as the estimate uses it. Evaluating it gives the same result as
// evaluating d.
func (d Design) Resolved() Design {
	if d.Case.Recovery == 0 {
		d.Case.Recovery = DefaultRecovery
	}
	if !d.Load.Direct {
		d.Load.Road = d.Load.Road.withDefaults()
	}
	return d
}

// Castability describes each casting limit of Process that a fin set
// breaks, with the limit and the value ("head fins: height to gap 8.0
// over the die-casting limit 10"), and an alloy the process does not make
// fins of (materials.Alloy.ProcessFit: a wrought alloy cast, a pressure
// die-casting alloy poured in sand); nil when every limit holds or no
// process is named. The limits are common practice (fins.Processes).
func (d Design) Castability() []string {
	var out []string
	for i, fs := range []FinSet{d.Case.Head, d.Case.Barrel} {
		p := d.ProcessOf(i)
		if p.Name == "" {
			continue
		}
		s := fs.Set
		if !fs.Alloy.MadeBy(p.Name) {
			_, why := fs.Alloy.ProcessFit(p.Name)
			out = append(out, fs.Name+" fins: "+why)
		}
		for _, v := range p.Check(s) {
			if v.Slack >= -1e-12 {
				continue
			}
			var what string
			switch v.Constraint {
			case "minimum thickness":
				what = fmt.Sprintf("tip %.2f mm, thinner than the %s minimum %.2f mm", s.TipThickness*1e3, p.Name, p.MinThickness*1e3)
			case "height to gap":
				what = fmt.Sprintf("height to root gap %.1f, over the %s limit %.1f", s.Height/(s.Pitch-s.RootThickness), p.Name, p.MaxAspect)
			case "draft":
				what = fmt.Sprintf("face draft %.2f deg, under the %s minimum %.2f deg",
					math.Atan((s.RootThickness-s.TipThickness)/(2*s.Height))*180/math.Pi, p.Name, p.MinDraft*180/math.Pi)
			default:
				what = fmt.Sprintf("%s broken by %.3g", v.Constraint, -v.Slack)
			}
			out = append(out, fs.Name+" fins: "+what)
		}
	}
	return out
}

// Outcome is a design evaluated at one operating point.
type Outcome struct {
	Result Result
	Load   HeatLoad // the load balanced (zero when the walls were fixed)
	// NoEquilibrium wraps ErrNoEquilibrium when a set cannot reject its
	// load below SaneWallLimit; Result is still filled, at that wall.
	NoEquilibrium error
	Fixed         bool // the walls were fixed (Design.Walls)
	Limits        Limits
}

// LoadAt is the heat load of the design at its operating point under
// settings s, as Evaluate takes it: the road load plus, with a fan supply,
// the fan's shaft power as crank power (its operating point solved with
// the settings' passage model).
func (d Design) LoadAt(s Settings) (HeatLoad, error) {
	load := d.Load
	if d.Case.Supply.Kind == SupplyFan && !d.Load.Direct {
		op, err := d.Case.FanOperatingPoint(s)
		if err != nil {
			return HeatLoad{}, err
		}
		load.Road.AccessoryPower += op.Power
	}
	return load.At(d.Case)
}

// Evaluate estimates the design with settings s: the wall balance at the
// design's load, or the heat at fixed walls. The absence of an
// equilibrium is part of the outcome; an error is a failure (bad input, a
// solver failure, or a result that is not a finite number).
func (d Design) Evaluate(s Settings) (Outcome, error) {
	o := Outcome{Limits: d.Limits, Fixed: d.Walls != nil}
	var err error
	if d.Walls != nil {
		o.Result, err = d.Case.AtWall(d.Walls[0], d.Walls[1], s)
		if err != nil {
			return o, err
		}
		return o, o.check()
	}
	if d.Case.Supply.Kind == SupplyFan && !d.Load.Direct {
		// the fan's shaft power is crank power: it raises the heat; one
		// preparation solves the fan's point and then the balance
		var log validity.Log
		var p *prepared
		if p, err = d.Case.prepare(s, &log); err != nil {
			return o, err
		}
		load := d.Load
		load.Road.AccessoryPower += p.fan.Power
		if o.Load, err = load.At(d.Case); err != nil {
			return o, err
		}
		o.Result, err = p.balance(o.Load, &log)
	} else {
		if o.Load, err = d.Load.At(d.Case); err != nil {
			return o, err
		}
		o.Result, err = d.Case.Balance(o.Load, s)
	}
	if errors.Is(err, ErrNoEquilibrium) {
		o.NoEquilibrium, err = err, nil
	}
	if err != nil {
		return o, err
	}
	return o, o.check()
}

// HeadMargin is the head limit less the head wall temperature, K; with no
// equilibrium at the head it is the limit less the search's cap, a bound
// (the head runs hotter), and the status says so.
func (o Outcome) HeadMargin() float64 { return o.Limits.Head - o.Result.Head.WallTemp }

// BarrelMargin is the barrel limit less the barrel wall temperature, K
// (a bound with no equilibrium, as HeadMargin).
func (o Outcome) BarrelMargin() float64 { return o.Limits.Barrel - o.Result.Barrel.WallTemp }

// WithinLimits reports whether both walls are at or below their limits.
func (o Outcome) WithinLimits() bool { return o.HeadMargin() >= 0 && o.BarrelMargin() >= 0 }

// Status is the verdict: no equilibrium, fixed walls, over a limit,
// marginal (a margin under MarginalBand) or ok.
func (o Outcome) Status() Status {
	switch {
	case o.NoEquilibrium != nil:
		return StatusNoEquilibrium
	case o.Fixed:
		return StatusFixed
	case o.HeadMargin() < 0 || o.BarrelMargin() < 0:
		return StatusOver
	case o.HeadMargin() < MarginalBand || o.BarrelMargin() < MarginalBand:
		return StatusMarginal
	}
	return StatusOK
}

// ErrNotFinite is returned by Evaluate for a result that is not a finite
// number: a bug in the estimator.
var ErrNotFinite = errors.New("a result is not a finite number; this is a bug, please report it with the design file")

func (o Outcome) check() error {
	h, b := o.Result.Head, o.Result.Barrel
	for _, v := range []float64{h.WallTemp, b.WallTemp, h.HeatRejected, b.HeatRejected, h.MeanH, b.MeanH, h.AirOut, b.AirOut,
		h.FinEfficiency, b.FinEfficiency, h.PassageVelocity, b.PassageVelocity} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%w", ErrNotFinite)
		}
	}
	return nil
}
