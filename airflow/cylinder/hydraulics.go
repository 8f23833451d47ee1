package cylinder

import (
	"fmt"
	"math"

	"finmarch/airflow/roots"
)

// friction is the friction part 4 f_app L/Dh of a passage's loss at
// velocity v, in velocity heads of the passage.
func (p *prepared) friction(pt Path, v float64) float64 {
	re := p.amb.Rho * v * pt.Dh / p.amb.Mu
	if re < 1e-9 {
		re = 1e-9
	}
	return 4 * p.passage.Friction(re, p.amb.Pr, pt.Length/pt.Dh) * pt.Length / pt.Dh
}

// parallelFlow solves the passage velocity at which the available pressure
// dp (Pa) equals entry + exit + developing-flow friction losses,
// dp = 0.5 rho V^2 (K_in + K_out + 4 f_app L/Dh), by Brent's method, and
// returns the mass flow per path (kg/s).
func (p *prepared) parallelFlow(pt Path, dp float64) (float64, error) {
	return p.parallelFlowK(pt, dp, 0)
}

// parallelFlowK is parallelFlow with extra velocity heads of loss (a turn
// on the way in).
func (p *prepared) parallelFlowK(pt Path, dp, extra float64) (float64, error) {
	if dp <= minDrive {
		return 0, nil
	}
	rho := p.amb.Rho
	kin, kout := p.set.EntryLoss+extra, p.set.ExitLoss
	g := func(v float64) float64 {
		return 0.5*rho*v*v*(kin+kout+p.friction(pt, v)) - dp
	}
	vmax := math.Sqrt(2*dp/(rho*(kin+kout))) * 1.0001
	v, err := roots.Brent(g, 1e-9*vmax, vmax, 1e-10*vmax, 200)
	if err != nil {
		return 0, fmt.Errorf("passage velocity: %w", err)
	}
	return rho * v * pt.FlowArea, nil
}

// change is the loss, in units of 0.5 rho, where the flow passes from the
// head passages (velocity v1, total area a1) to the barrel passages (v2,
// a2): a sudden expansion loses (v1 - v2)^2 (Borda-Carnot); a sudden
// contraction loses 0.5 (1 - a2/a1) v2^2 (the common approximation of
// Idelchik 1994, Diagram 3-9; from memory).
func change(v1, v2, a1, a2 float64) float64 {
	if v1 >= v2 {
		return sq(v1 - v2)
	}
	return 0.5 * (1 - a2/a1) * v2 * v2
}

// seriesFlow solves, by Brent's method, the total mass flow (kg/s)
// through the head passages and then the barrel passages: entry loss and
// friction in the head, the loss of the change of passage area, friction
// and exit loss in the barrel.
func (p *prepared) seriesFlow(dp float64) (float64, error) {
	if dp <= minDrive {
		return 0, nil
	}
	rho := p.amb.Rho
	hp, bp := p.sets[head].pt, p.sets[barrel].pt
	kin, kout := p.set.EntryLoss, p.set.ExitLoss
	ah := float64(hp.Paths) * hp.FlowArea
	ab := float64(bp.Paths) * bp.FlowArea
	g := func(w float64) float64 {
		vh, vb := w/(rho*ah), w/(rho*ab)
		return 0.5*rho*(vh*vh*(kin+p.friction(hp, vh))+change(vh, vb, ah, ab)+vb*vb*(kout+p.friction(bp, vb))) - dp
	}
	wmax := math.Sqrt(2*dp*rho/(kin/(ah*ah)+kout/(ab*ab))) * 1.0001
	w, err := roots.Brent(g, 1e-9*wmax, wmax, 1e-10*wmax, 200)
	if err != nil {
		return 0, fmt.Errorf("series passage flow: %w", err)
	}
	return w, nil
}

func sq(x float64) float64 { return x * x }
