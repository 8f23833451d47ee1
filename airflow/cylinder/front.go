package cylinder

import (
	"fmt"
	"math"

	"finmarch/airflow"
	"finmarch/fins"
)

// The front slots of longitudinal fins in cross flow. Where the road air
// crosses a cylinder with longitudinal fins (V cos tilt), the slots facing
// it take the stagnation pressure across their open tips and vent it
// along the axis through their open ends: a channel flow driven by the
// front of the pressure distribution round a cylinder.
const (
	// FrontShare is the share of the slots that face the stream: those
	// within 30 deg of the front stagnation line, where the pressure
	// coefficient of a cylinder in cross flow, Cp = 1 - 4 sin^2(phi)
	// (potential flow, which real flow follows near the front; White,
	// Fluid Mechanics, Eq. 8.34, and Incropera et al. 6th ed. Fig. 7.7,
	// from memory), is above zero.
	FrontShare = 1.0 / 6
	// FrontCp is the mean of that Cp over +-30 deg, 1 - 4 (1/2 -
	// sin(pi/3)/(2 pi/3)) = 0.654 (closed form). The slots' ends are taken
	// at the ambient static pressure (Cp = 0), below which the real base
	// pressure lies: the drive errs low (our assumption).
	FrontCp = 1 - 4*(0.5-0.8660254037844386/(2*math.Pi/3))
	// FrontTurnLoss is the loss of the air's turn from the slot's tip
	// opening into its length, one velocity head of the slot (a sharp
	// 90 deg turn; Idelchik, Handbook of Hydraulic Resistance, 3rd ed.
	// 1994, Diagram 6-5, order of magnitude; from memory).
	FrontTurnLoss = 1.0
)

// frontFlows solves the mass flow through each front slot of each
// longitudinal set under ram air: a path of half the finned length (the
// air leaves by both ends), driven by Recovery FrontCp 0.5 rho (V cos
// tilt)^2 against entry, turn, exit and friction losses.
func (p *prepared) frontFlows() error {
	c := p.c
	if c.Supply.ducted() || c.FixedH > 0 {
		return nil
	}
	vc := c.Speed * math.Cos(c.Tilt)
	for i := range p.sets {
		st := &p.sets[i]
		if st.fs.Set.Style != fins.StyleLongitudinal {
			continue
		}
		st.front = 2 * FrontShare * float64(st.g.Passages)
		pt := st.pt
		pt.Length = st.fs.Set.Length / 2
		pt.AreaPerPath = st.g.TotalArea / float64(2*st.g.Passages)
		st.frontPath = pt
		dp := c.Recovery * FrontCp * 0.5 * p.amb.Rho * vc * vc
		var err error
		if st.frontMdot, err = p.parallelFlowK(pt, dp, FrontTurnLoss); err != nil {
			return fmt.Errorf("%s front slots: %w", st.fs.Name, err)
		}
	}
	return nil
}

// frontHeat is the heat (W) the front slots of a set take from a wall at
// tw (K), fed with ambient air: each path's mean coefficient by the
// channel correlation (airflow.ChannelNu at the ambient air's properties
// over half the finned length, the gas heating factor at the inlet air),
// the fin efficiency at it, and the exact pick-up m cp (T_w - T_a)(1 -
// exp(-NTU)).
func (p *prepared) frontHeat(st *setState, tw float64) float64 {
	if st.frontMdot <= 0 || tw <= p.c.Ambient {
		return 0
	}
	pt, a := st.frontPath, p.amb
	re := st.frontMdot / pt.FlowArea * pt.Dh / a.Mu
	nu, _ := airflow.ChannelNu(re, a.Pr, pt.Length/pt.Dh, airflow.GasHeatingFactor(a.T, tw, p.log), p.log)
	h := p.set.ForcedFactor * nu * a.K / pt.Dh
	eta := st.cv.Efficiency(h, p.set.ConductivityFactor*st.fs.Alloy.Conductivity(tw), p.log)
	ua := st.g.SurfaceEfficiency(eta) * h * pt.AreaPerPath
	cp := meanCp(a.T, a.T)
	return st.front * st.frontMdot * cp * (tw - a.T) * (1 - math.Exp(-ua/(st.frontMdot*cp)))
}
