package app

import (
	"errors"
	"fmt"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
)

// outcome is one design evaluated at one road speed: the estimator's
// outcome with the design it came from.
type outcome struct {
	cylinder.Outcome
	d     *design.Design
	speed float64
}

// evaluate runs the design at road speed v (m/s): the wall-temperature
// balance, or the heat at fixed walls when the design overrides them. It is
// the command line's one evaluate-and-check path: a model failure comes
// back as an exit-1 error naming the design, a result that is not finite
// as an internal error (exit 6); no equilibrium is part of the outcome.
func evaluate(d *design.Design, v float64) (outcome, error) {
	o, err := evaluateWith(d, v, nil, false)
	switch {
	case errors.Is(err, cylinder.ErrNotFinite):
		return o, fail(ExitInternal, err)
	case err != nil:
		return o, modelError(d.Name, err)
	}
	return o, nil
}

// evaluateWith is evaluate with a workspace (nil for none), for a goroutine
// that evaluates many variants, and with totalsOnly leaving out the march
// profile that only single-design reports show; its errors are the
// estimator's own.
func evaluateWith(d *design.Design, v float64, ws *cylinder.Workspace, totalsOnly bool) (outcome, error) {
	cd := d.Cylinder()
	cd.Case.Speed = v
	set := d.Run
	set.Workspace = ws
	set.TotalsOnly = totalsOnly
	set.OneMethod = set.OneMethod || totalsOnly // sweeps and searches need their own method only
	co, err := cd.Evaluate(set)
	return outcome{Outcome: co, d: d, speed: v}, err
}

// warnings are the correlation range warnings and the casting limits the
// design's fins break (its cylinder.casting process), each naming the
// design, so that a run of several designs says whose they are.
func (o outcome) warnings() []string {
	var out []string
	for _, w := range o.Result.Warnings {
		out = append(out, o.d.Name+": "+w.String())
	}
	for _, c := range o.d.Cylinder().Castability() {
		out = append(out, o.d.Name+": casting: "+c)
	}
	return out
}

// modelError is an estimator failure as the command line reports it.
func modelError(name string, err error) error {
	if errors.Is(err, cylinder.ErrNoEquilibrium) {
		return fail(ExitModel, fmt.Errorf("%s: %w", name, err))
	}
	return fail(ExitModel, fmt.Errorf("%s: the model failed: %w", name, err))
}
