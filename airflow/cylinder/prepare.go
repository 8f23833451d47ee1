package cylinder

import (
	"fmt"
	"math"

	"finmarch/airflow"
	"finmarch/fins"
	"finmarch/fins/validity"
)

// The two fin sets, in the order the air meets them on a series path.
const (
	head = iota
	barrel
)

// setState is one fin set as the estimate sees it: its geometry, its
// efficiency curve, the air path and the mass flow through it.
type setState struct {
	fs   *FinSet // the case's own
	g    fins.Geometry
	cv   *fins.Curve // fin efficiency against h/k, filled as the march needs it
	pt   Path
	mdot float64 // kg/s per path
	vel  float64 // m/s, passage velocity at inlet density
	// the front slots of longitudinal fins in cross flow (front.go): their
	// paths, mass flow per path and path
	front     float64
	frontMdot float64
	frontPath Path
	// face is the area (m2) of the set's fin face that meets the road
	// air's axial component first (leading.go)
	face float64
}

// prepared is a case ready for marches: the geometry, the paths and the
// passage flows, with the resolved settings and the buffers the trials of
// the wall search reuse.
type prepared struct {
	c         Case
	set       Settings // resolved
	passage   airflow.PassageModel
	fast      bool // the built-in passage correlation, by the march's fast path
	sets      [2]setState
	series    bool
	n         int // segments of the current march (the balance's coarse marches lower it)
	amb       airflow.Air
	log       *validity.Log
	scratch   validity.Log
	segBuf    []Segment           // the march of the latest trial
	pre       map[segKey][]segPre // position terms by path and segment count
	exactFilm bool                // film powers exact at every segment (tests)
	meanState bool                // each segment re-evaluated at its own mean air temperature (tests)
	method    Method              // the forced-convection method, resolved
	drop      float64             // Pa across the fins, a ducted supply
	fan       FanPointResult      // a fan supply's operating point
	inlet     float64             // K, the air entering the fins: ambient, warmed by a fan's shaft power
}

func (c Case) prepare(s Settings, log *validity.Log) (*prepared, error) {
	if err := c.validate(s); err != nil {
		return nil, err
	}
	c.Recovery = c.recovery()
	p := &prepared{c: c, set: s.resolved(), log: log, passage: s.Passage, fast: s.Passage == nil, inlet: c.Ambient}
	if p.fast {
		p.passage = airflow.DevelopingPlates{}
	}
	p.n = p.set.Segments
	p.method = c.Method(s)
	for i, fs := range []*FinSet{&p.c.Head, &p.c.Barrel} {
		st := &p.sets[i]
		st.fs = fs
		var err error
		if st.g, err = fs.Set.Geometry(); err != nil {
			return nil, fmt.Errorf("%s fins: %w", fs.Name, err)
		}
		st.cv = p.set.Workspace.curve(fs.Set, st.g)
	}
	p.amb = airflow.Properties(c.Ambient, c.Pressure, log)
	for i := range p.sets {
		st := &p.sets[i]
		st.pt = path(st.fs.Set, st.g, c.Speed, c.Tilt)
	}
	series := c.Series()
	if c.Supply.ducted() {
		series = c.Supply.Series // a shroud or duct routes the air its own way
	}
	if series {
		p.sets[head].pt.Series, p.sets[barrel].pt.Series = true, true
		p.series = true
	}
	if err := p.flows(); err != nil {
		return nil, err
	}
	if err := p.frontFlows(); err != nil {
		return nil, err
	}
	p.faces()
	for i := range p.sets {
		st := &p.sets[i]
		st.vel = st.mdot / (p.amb.Rho * st.pt.FlowArea)
	}
	if p.method == MethodChannel {
		p.frictionRanges(log)
	}
	return p, nil
}

// flows solves the mass flow per path of each set from the share of the
// road speed's dynamic pressure that drives its passages.
func (p *prepared) flows() error {
	c := p.c
	if c.Supply.ducted() {
		return p.ductFlows()
	}
	q := c.Recovery * 0.5 * p.amb.Rho * c.Speed * c.Speed
	drive := func(st *setState) float64 { return q * sq(st.pt.Component/math.Max(c.Speed, 1e-300)) }
	return p.setFlows(drive(&p.sets[head]), drive(&p.sets[barrel]))
}

// setFlows solves the mass flow per path of each set from the pressure
// difference driving its passages (Pa): on a series path the head's drives
// the head and then the barrel passages.
func (p *prepared) setFlows(dpHead, dpBarrel float64) error {
	h, b := &p.sets[head], &p.sets[barrel]
	if p.series {
		w, err := p.seriesFlow(dpHead)
		if err != nil {
			return err
		}
		h.mdot, b.mdot = w/float64(h.pt.Paths), w/float64(b.pt.Paths)
		return nil
	}
	for i, st := range []*setState{h, b} {
		var err error
		if st.mdot, err = p.parallelFlow(st.pt, []float64{dpHead, dpBarrel}[i]); err != nil {
			return fmt.Errorf("%s passages: %w", st.fs.Name, err)
		}
	}
	return nil
}

// frictionRanges checks, at the solved passage flows, the range of the
// friction correlation in use where it states one: Konakov's 1e4 to 1e6
// in turbulent flow (Shah's laminar form holds over all of laminar flow,
// and the transition between is a blend).
func (p *prepared) frictionRanges(log *validity.Log) {
	if !p.fast {
		return
	}
	for i := range p.sets {
		st := &p.sets[i]
		if re := p.amb.Rho * st.vel * st.pt.Dh / p.amb.Mu; st.mdot > 0 && re >= airflow.ReTurbulent {
			log.Check("Konakov friction factor", "Reynolds number", re, airflow.ReTurbulent, 1e6)
		}
	}
}
