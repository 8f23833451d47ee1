package cylinder

import (
	"errors"
	"fmt"

	"finmarch/airflow/roots"
)

// SupplyKind is where the cooling air comes from.
type SupplyKind string

// The supplies. Ram air is the default: the road speed's dynamic pressure
// times the pressure recovery, shared between the fin sets by orientation,
// with the rest of the road air over the fin envelope. A duct or a fan
// drives the air through the fin passages inside a shroud or baffles: the
// road air does not reach the fins, whatever the road speed or the tilt.
const (
	SupplyRam  SupplyKind = ""
	SupplyDuct SupplyKind = "duct" // a known pressure difference across the fins, or a known mass flow
	SupplyFan  SupplyKind = "fan"  // a fan's curve against the shroud's losses and the fins
)

// MarshalText names the kind, "ram" for the zero value.
func (k SupplyKind) MarshalText() ([]byte, error) {
	if k == SupplyRam {
		return []byte("ram"), nil
	}
	return []byte(k), nil
}

// Supply is the cooling air's source. The zero value is ram air.
type Supply struct {
	Kind SupplyKind `json:"kind"`
	// Drop is a duct's static pressure difference across the fins, Pa (the
	// way baffled aircraft cylinders are specified); MassFlow instead a
	// known mass flow through the fins, kg/s (both sets together).
	Drop     float64 `json:"drop_Pa"`
	MassFlow float64 `json:"mass_flow_kg_s"`
	// Series routes the air through the head fins and then the barrel fins
	// (both sets longitudinal, passages along the axis); otherwise each set
	// takes the supply's pressure difference across its own passages.
	Series bool `json:"series"`
	Fan    *Fan `json:"fan,omitempty"`
}

// ducted reports whether the air comes through a shroud or baffles.
func (s Supply) ducted() bool { return s.Kind == SupplyDuct || s.Kind == SupplyFan }

func (s Supply) validate(c Case) error {
	switch s.Kind {
	case SupplyRam:
		return nil
	case SupplyDuct:
		if (s.Drop > 0) == (s.MassFlow > 0) {
			return errors.New("a duct supply takes a pressure drop or a mass flow, one of them")
		}
		if !(s.Drop >= 0 && s.Drop <= 20e3) || !(s.MassFlow >= 0 && s.MassFlow <= 10) {
			return fmt.Errorf("duct: drop %g Pa (0 to 20 kPa), mass flow %g kg/s (0 to 10)", s.Drop, s.MassFlow)
		}
	case SupplyFan:
		if s.Fan == nil {
			return errors.New("a fan supply needs its fan")
		}
		if err := s.Fan.validate(); err != nil {
			return err
		}
	default:
		return fmt.Errorf("supply %q: use ram, duct or fan", s.Kind)
	}
	if s.Series && !c.Series() {
		return errors.New("a series route needs longitudinal fins on both head and barrel (passages along the axis)")
	}
	return nil
}

// ductFlows solves the mass flow per path of each set under a ducted
// supply: the pressure difference across the fins given or found (a given
// mass flow; a fan's operating point), then the passages' own hydraulics.
func (p *prepared) ductFlows() error {
	s := p.c.Supply
	dp := s.Drop
	switch {
	case s.Kind == SupplyFan:
		op, err := p.fanPoint()
		if err != nil {
			return err
		}
		// the fan's shaft power ends as heat in the air it moves (its
		// losses at once, the air power as the pressure is lost in the
		// shroud and the fins): counted all at the fins' inlet, which
		// overstates the first segments' air temperature by at most that
		// rise (a conservative simplification: about 1 K at cruise)
		if op.Flow > 0 && op.Power > 0 {
			p.inlet = mixOut(p.c.Ambient, op.Power, p.amb.Rho*op.Flow)
			op.Warming = p.inlet - p.c.Ambient
		}
		p.fan = op
		dp = op.Drop
	case s.MassFlow > 0:
		var err error
		if dp, err = p.dropFor(s.MassFlow); err != nil {
			return err
		}
	}
	p.drop = dp
	return p.setFlows(dp, dp)
}

// totalFlow is the mass flow through both fin sets at a pressure
// difference dp across the fins, kg/s.
func (p *prepared) totalFlow(dp float64) (float64, error) {
	if p.c.Supply.Series {
		return p.seriesFlow(dp)
	}
	var w float64
	for _, st := range []*setState{&p.sets[head], &p.sets[barrel]} {
		m, err := p.parallelFlow(st.pt, dp)
		if err != nil {
			return 0, err
		}
		w += m * float64(st.pt.Paths)
	}
	return w, nil
}

// dropFor is the pressure difference across the fins that passes mass
// flow w (kg/s), by Brent's method on totalFlow (which rises with it).
func (p *prepared) dropFor(w float64) (float64, error) {
	hi := 100.0
	for {
		f, err := p.totalFlow(hi)
		if err != nil {
			return 0, err
		}
		if f >= w {
			break
		}
		if hi *= 4; hi > 1e6 {
			return 0, fmt.Errorf("duct: %g kg/s needs more than 1 MPa across the fins", w)
		}
	}
	var ferr error
	g := func(dp float64) float64 {
		f, err := p.totalFlow(dp)
		if err != nil {
			ferr = err
		}
		return f - w
	}
	dp, err := roots.Brent(g, 0, hi, 1e-9*hi, 200)
	if ferr != nil {
		return 0, ferr
	}
	return dp, err
}
