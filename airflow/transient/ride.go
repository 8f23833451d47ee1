package transient

import (
	"errors"
	"fmt"
	"math"

	"finmarch/airflow/cylinder"
)

// Metal is the cylinder's metal besides the fins, and the conduction
// between head and barrel. A zero mass takes the estimate of EstimateMetal
// (a stated assumption, not a measurement: give the masses of your own
// castings).
//
// Link is a conductance between the two masses, W/K, default 0: the steady
// estimate's head share (the share of the heat the head fins reject)
// already holds whatever the head conducts to the barrel at steady
// running, so by default the masses exchange no further heat and a ride at
// constant conditions ends at the steady estimate. A link moves heat from
// the hotter mass in proportion to the difference; with one, a constant
// ride ends nearer equal walls than the steady estimate says.
type Metal struct {
	Head, Barrel float64 // kg of metal besides the fins
	Link         float64 // W/K, conductance between head and barrel
}

// EstimateMetal estimates the metal of head and barrel besides the fins,
// kg, from the geometry. It is this tool's assumption, not a published
// method: the head as a solid cylinder of the head fins' root diameter
// over their finned length, half filled with metal (the combustion
// chamber, ports and valve gear take the rest); the barrel as a tube of the
// barrel fins' root diameter over their finned length with a wall 7.5 % of
// that diameter thick (liner included). Each at its alloy's density.
func EstimateMetal(c cylinder.Case) (head, barrel float64) {
	h, b := c.Head.Set, c.Barrel.Set
	head = 0.5 * math.Pi / 4 * h.RootDiameter * h.RootDiameter * h.Length * c.Head.Alloy.Density
	di := 0.85 * b.RootDiameter
	barrel = math.Pi / 4 * (b.RootDiameter*b.RootDiameter - di*di) * b.Length * c.Barrel.Alloy.Density
	return head, barrel
}

// Model is a cylinder as two lumped thermal masses, head and barrel, each
// at its fin-root wall temperature:
//
//	C_h dT_h/dt = Q_in,h - Q_out,h(T_h, T_b) - G (T_h - T_b)
//	C_b dT_b/dt = Q_in,b - Q_out,b(T_h, T_b) + G (T_h - T_b)
//
// C = (fin mass + other metal) c_p of the set's alloy (J/K); Q_in the heat
// load at each moment (the road load at the moment's speed and grade, or a
// given heat); Q_out the heat the fins reject at the present walls by the
// steady air-side model of airflow/cylinder (quasi-steady: the air and the
// fins' own temperature profile follow the wall at once, which holds while
// the air's transit time and the fins' own time constant, seconds, are
// short against the masses', minutes); G the head-barrel conductance.
type Model struct {
	Design   cylinder.Design
	Settings cylinder.Settings
	Capacity [2]float64 // J/K, head and barrel
	Link     float64    // W/K
	Metal    Metal      // as resolved (kg, W/K)
	// Air, when set, replaces the air side: the heat each set rejects at
	// walls th and tb under case c, W (tests hold it fixed and linear).
	Air func(c cylinder.Case, th, tb float64) ([2]float64, error)
}

// NewModel resolves the masses of d and returns its model.
func NewModel(d cylinder.Design, s cylinder.Settings, m Metal) (*Model, error) {
	hm, bm := EstimateMetal(d.Case)
	if m.Head == 0 {
		m.Head = hm
	}
	if m.Barrel == 0 {
		m.Barrel = bm
	}
	var capa [2]float64
	for i, fs := range []cylinder.FinSet{d.Case.Head, d.Case.Barrel} {
		g, err := fs.Set.Geometry()
		if err != nil {
			return nil, fmt.Errorf("%s fins: %w", fs.Name, err)
		}
		metal := []float64{m.Head, m.Barrel}[i]
		capa[i] = (g.FinVolume*fs.Alloy.Density + metal) * fs.Alloy.Cp
	}
	if !(m.Head >= 0 && m.Barrel >= 0 && m.Link >= 0) || !(capa[0] > 0 && capa[1] > 0) {
		return nil, fmt.Errorf("metal %g and %g kg, link %g W/K: not physical", m.Head, m.Barrel, m.Link)
	}
	if s.Workspace == nil {
		s.Workspace = cylinder.NewWorkspace()
	}
	s.TotalsOnly = true
	return &Model{Design: d, Settings: s, Capacity: capa, Link: m.Link, Metal: m}, nil
}

// Segment is a stretch of a ride at steady conditions.
type Segment struct {
	Duration float64     // s
	Speed    float64     // m/s (0: standing, idling)
	Grade    float64     // per cent, uphill positive
	Ambient  float64     // K; 0: the design's
	Heat     *[2]float64 // W to head and barrel fins; nil: the design's load at this speed and grade
}

// Sample is the state at one output time.
type Sample struct {
	Time    float64    `json:"time_s"`
	Speed   float64    `json:"speed_m_s"`
	Grade   float64    `json:"grade_percent"`
	Ambient float64    `json:"ambient_K"`
	Head    float64    `json:"head_wall_temperature_K"`
	Barrel  float64    `json:"barrel_wall_temperature_K"`
	HeatIn  [2]float64 `json:"heat_in_W"`  // head, barrel
	HeatOut [2]float64 `json:"heat_out_W"` // head, barrel, rejected by the fins
}

// Trace is a ride's result.
type Trace struct {
	Samples []Sample
	// EnergyIn and EnergyOut are the heat put in and rejected over the
	// ride, J (integrated with the temperatures); Stored is the change of
	// the masses' heat, sum C (T_end - T_start), J, at End (s): the ride's
	// end, or where a runaway stopped it.
	EnergyIn, EnergyOut, Stored, End float64
	Final                            [2]float64   // K, the walls at End
	Starts                           [][2]float64 // K, the walls at each segment's start
	Evals                            int          // air-side evaluations
	// Runaway is set when a wall passed cylinder.SaneWallLimit: the trace
	// stops there (no equilibrium below 500 C). End is then the time it
	// passed, located on the dense output (an event: the root of
	// T(t) - SaneWallLimit on the step's interpolant), and RunawayWall is
	// the wall that passed first (0 head, 1 barrel); Final is the walls
	// there and the last sample is taken there.
	Runaway     bool
	RunawayWall int
	// Steps are the integrator's accepted steps end to end from 0 to End
	// (the last cut at a runaway): the dense output the summary reads
	// (Summarise, Trace.At), apart from the samples and the same whatever
	// the output interval.
	Steps    []Step
	Warnings []string
}

// ambientBand is the wall excess over ambient below which the heat out is
// taken linear in the excess (the air-side model is evaluated above
// ambient only; every mechanism vanishes with the excess).
const ambientBand = 0.5

// Tol is the step control of Run: temperatures to about a millikelvin.
var Tol = Tolerances{Abs: 1e-4, Rel: 1e-7}

// at returns the design at a segment's conditions.
func (m *Model) at(sg Segment) cylinder.Design {
	d := m.Design
	d.Case.Speed = sg.Speed
	if sg.Ambient > 0 {
		d.Case.Ambient = sg.Ambient
	}
	d.Load.Road.GradePct = sg.Grade
	return d
}

// HeatIn is the heat load of a segment, W to head and barrel, and whether
// the road asks more than the engine's rating there.
func (m *Model) HeatIn(sg Segment) ([2]float64, bool, error) {
	if sg.Heat != nil {
		return *sg.Heat, false, nil
	}
	d := m.at(sg)
	l, err := d.LoadAt(m.Settings) // a fan's shaft power included, as the steady estimate takes it
	if err != nil {
		return [2]float64{}, false, err
	}
	return [2]float64{l.Head, l.Barrel}, l.OverRated, nil
}

// HeatOut is the heat each set rejects at walls th and tb (K) under the
// case c, W.
func (m *Model) HeatOut(c cylinder.Case, th, tb float64) ([2]float64, error) {
	if m.Air != nil {
		return m.Air(c, th, tb)
	}
	// below ambient + ambientBand: linear in the excess from the value there
	eh, eb := math.Max(th, c.Ambient+ambientBand), math.Max(tb, c.Ambient+ambientBand)
	r, err := c.AtWall(eh, eb, m.Settings)
	if err != nil {
		return [2]float64{}, err
	}
	q := [2]float64{r.Head.HeatRejected, r.Barrel.HeatRejected}
	for i, w := range []float64{th, tb} {
		if w < c.Ambient+ambientBand {
			q[i] *= (w - c.Ambient) / ambientBand
		}
	}
	return q, nil
}

// ErrRunaway marks a trace stopped where a wall passed the search's cap.
var ErrRunaway = errors.New("a wall passed 500 C: no equilibrium")

// Run integrates the ride from the wall temperatures start (K, head and
// barrel) with the Dormand–Prince pair (Integrate), segment by segment
// (the conditions change only between segments, so no step straddles a
// change), keeps every accepted step (Trace.Steps, the dense output), and
// samples the state every `every` seconds and at the end. The output
// interval changes the samples only: the steps, and so the summary read
// from them, do not depend on it.
//
// A wall passing cylinder.SaneWallLimit anywhere on a step's interpolant
// stops the ride at the first such time (event location on the dense
// output, Brent's method): the trace is Runaway and ends there.
func (m *Model) Run(ride []Segment, start [2]float64, every float64) (Trace, error) {
	var tr Trace
	if !(every > 0) || math.IsInf(every, 1) {
		return tr, errors.New("the output interval must be positive")
	}
	if !(start[0] <= cylinder.SaneWallLimit && start[1] <= cylinder.SaneWallLimit) {
		return tr, fmt.Errorf("the walls at the start, %g and %g K, are not below the model's %g K cap", start[0], start[1], cylinder.SaneWallLimit)
	}
	y := []float64{start[0], start[1], 0, 0}
	t0, h := 0.0, 10.0 // s, the first trial step
	next := 0.0
	sample := func(t float64, th, tb float64, sg Segment, qin [2]float64) error {
		d := m.at(sg)
		q, err := m.HeatOut(d.Case, th, tb)
		if err != nil {
			return err
		}
		tr.Evals++
		tr.Samples = append(tr.Samples, Sample{Time: t, Speed: sg.Speed, Grade: sg.Grade, Ambient: d.Case.Ambient, Head: th, Barrel: tb, HeatIn: qin, HeatOut: q})
		return nil
	}
	overRated, reached := false, 0.0
	stopAt := make([]float64, 4) // the state where a runaway stops the ride
	for si, sg := range ride {
		if !(sg.Duration > 0) {
			return tr, fmt.Errorf("segment %d: duration %g s must be positive", si+1, sg.Duration)
		}
		qin, over, err := m.HeatIn(sg)
		if err != nil {
			return tr, fmt.Errorf("segment %d: %w", si+1, err)
		}
		overRated = overRated || over
		c := m.at(sg).Case
		tr.Starts = append(tr.Starts, [2]float64{y[0], y[1]})
		f := func(_ float64, y, dy []float64) error {
			// a trial stage may overshoot far: the air side is evaluated
			// no higher than 990 K there (the step control rejects such a
			// step); a runaway is judged on accepted steps only
			q, err := m.HeatOut(c, math.Min(y[0], 990), math.Min(y[1], 990))
			if err != nil {
				return err
			}
			link := m.Link * (y[0] - y[1])
			dy[0] = (qin[0] - q[0] - link) / m.Capacity[0]
			dy[1] = (qin[1] - q[1] + link) / m.Capacity[1]
			dy[2] = qin[0] + qin[1]
			dy[3] = q[0] + q[1]
			return nil
		}
		if si == 0 {
			if err := sample(0, y[0], y[1], sg, qin); err != nil {
				return tr, err
			}
			next = every
		}
		t1 := t0 + sg.Duration
		out := make([]float64, 4)
		n, hl, err := Integrate(f, t0, t1, y, h, Tolerances{Abs: Tol.Abs, Rel: Tol.Rel, MaxStep: sg.Duration}, func(s *Step) error {
			stop, wall := s.T1, -1
			for i := 0; i < 2; i++ {
				cs, err := s.crossings(i, cylinder.SaneWallLimit)
				if err != nil {
					return err
				}
				// the step starts at or below the cap, so its first
				// crossing is upward
				if len(cs) > 0 && (wall < 0 || cs[0].Time < stop) {
					stop, wall = cs[0].Time, i
				}
			}
			end := s.T1
			if wall >= 0 {
				end = stop
				if end > s.T0 {
					tr.Steps = append(tr.Steps, s.sub(s.T0, end))
				}
			} else {
				tr.Steps = append(tr.Steps, s.clone())
			}
			reached = end
			for next <= end+1e-9 {
				s.At(next, out)
				if err := sample(next, out[0], out[1], sg, qin); err != nil {
					return err
				}
				next += every
			}
			if wall >= 0 {
				tr.Runaway, tr.RunawayWall = true, wall
				s.At(end, out)
				if tr.Samples[len(tr.Samples)-1].Time < end-1e-9 {
					if err := sample(end, out[0], out[1], sg, qin); err != nil {
						return err
					}
				}
				copy(stopAt, out)
				return ErrRunaway
			}
			return nil
		})
		tr.Evals += n
		if errors.Is(err, ErrRunaway) {
			copy(y, stopAt)
			break
		}
		if err != nil {
			return tr, fmt.Errorf("segment %d: %w", si+1, err)
		}
		t0, h = t1, hl
		if si == len(ride)-1 && (len(tr.Samples) == 0 || tr.Samples[len(tr.Samples)-1].Time < t1-1e-9) {
			if err := sample(t1, y[0], y[1], sg, qin); err != nil {
				return tr, err
			}
		}
	}
	tr.EnergyIn, tr.EnergyOut, tr.End, tr.Final = y[2], y[3], reached, [2]float64{y[0], y[1]}
	tr.Stored = m.Capacity[0]*(y[0]-start[0]) + m.Capacity[1]*(y[1]-start[1])
	if overRated {
		tr.Warnings = append(tr.Warnings, "the road asks more than the engine's rated power (or speed) in part of the ride, a speed the engine cannot hold: the heat there is what that speed would need")
	}
	return tr, nil
}

// Steady returns the steady wall temperatures of the design at a
// segment's conditions (the balance of airflow/cylinder), and whether there
// is an equilibrium below 500 C.
func (m *Model) Steady(sg Segment) ([2]float64, bool, error) {
	d := m.at(sg)
	if sg.Heat != nil {
		d.Load = cylinder.Load{Direct: true, Given: cylinder.HeatLoad{Head: sg.Heat[0], Barrel: sg.Heat[1]}}
	}
	o, err := d.Evaluate(m.Settings)
	if err != nil {
		return [2]float64{}, false, err
	}
	return [2]float64{o.Result.Head.WallTemp, o.Result.Barrel.WallTemp}, o.NoEquilibrium == nil, nil
}
