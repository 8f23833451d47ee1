package app

import (
	"errors"
	"fmt"
	"math"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
)

// outcome is one design evaluated at one condition.
type outcome struct {
	d     *design.Design
	load  cylinder.HeatLoad
	res   cylinder.Result
	err   error // ErrNoEquilibrium (result still filled) or nil
	fixed bool  // wall temperatures were given; heat is the result
	speed float64
}

// evaluate runs the design at road speed v (m/s): the wall-temperature
// balance, or the heat at fixed walls when the design overrides them. A
// hard failure (not the absence of an equilibrium) is returned as error.
func evaluate(d *design.Design, v float64) (outcome, error) {
	return evaluateWith(d, v, nil, false)
}

// evaluateWith is evaluate with a fin-efficiency curve cache (nil for none),
// for a goroutine that evaluates many variants, and with totalsOnly leaving
// out the march profile that only single-design reports show.
func evaluateWith(d *design.Design, v float64, cache *cylinder.Workspace, totalsOnly bool) (outcome, error) {
	c := d.Case
	c.Speed = v
	set := d.Run
	set.Workspace = cache
	set.TotalsOnly = totalsOnly
	o := outcome{d: d, speed: v, fixed: d.WallFixed}
	if d.WallFixed {
		r, err := c.AtWall(d.HeadWall, d.BarrelWall, set)
		if err != nil {
			return o, err
		}
		o.res = r
		return o, nil
	}
	load, err := d.Load.At(c)
	if err != nil {
		return o, err
	}
	o.load = load
	r, err := c.Balance(load, set)
	o.res = r
	if err != nil {
		if errors.Is(err, cylinder.ErrNoEquilibrium) {
			o.err = err
			return o, nil
		}
		return o, err
	}
	return o, nil
}

func (o outcome) warnings() []string {
	var out []string
	for _, w := range o.res.Warnings {
		out = append(out, w.String())
	}
	return out
}

// margin is limit minus wall temperature, K.
func (o outcome) headMargin() float64   { return o.d.HeadLimit - o.res.Head.WallTemp }
func (o outcome) barrelMargin() float64 { return o.d.BarrelLimit - o.res.Barrel.WallTemp }

func (o outcome) status() string {
	switch {
	case o.err != nil:
		return "NO EQUILIBRIUM"
	case o.fixed:
		return "fixed walls"
	case o.headMargin() < 0 || o.barrelMargin() < 0:
		return "OVER LIMIT"
	case o.headMargin() < 15 || o.barrelMargin() < 15:
		return "marginal"
	}
	return "ok"
}

func finite(vs ...float64) error {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("a result is not a finite number; this is a bug, please report it with the design file")
		}
	}
	return nil
}

func (o outcome) check() error {
	h, b := o.res.Head, o.res.Barrel
	return finite(h.WallTemp, b.WallTemp, h.HeatRejected, b.HeatRejected, h.MeanH, b.MeanH, h.AirOut, b.AirOut,
		h.FinEfficiency, b.FinEfficiency, h.PassageVelocity, b.PassageVelocity)
}
