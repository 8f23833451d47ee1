package app

import (
	"fmt"
	"math"

	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

// samples is the band's sample count for d: --samples, or the design's.
func (e *env) samples(d *design.Design) (int, error) {
	n := d.Band.Samples
	if e.opt.samples >= 0 {
		n = e.opt.samples
		if n != 0 && (n < 10 || n > 100000) {
			return 0, fail(ExitUsage, fmt.Errorf("--samples %d: allowed 0 (no band) or 10 to 100000", n))
		}
	}
	return n, nil
}

// band samples the design's uncertain inputs at road speed v; nil when the
// band is off (no samples) or the walls are fixed.
func (e *env) band(d *design.Design, v float64) (*uncertainty.Band, error) {
	n, err := e.samples(d)
	if err != nil || n == 0 || d.WallFixed {
		return nil, err
	}
	cd := d.Cylinder()
	cd.Case.Speed = v
	b, err := uncertainty.Estimate(cd, d.Run, d.Band.Spread, n, d.Band.Seed, 0)
	if err != nil {
		return nil, fail(ExitModel, fmt.Errorf("%s: %w", d.Name, err))
	}
	return &b, nil
}

// bandText is a 5th-95th percentile range in display units.
func bandText(u output.Units, p uncertainty.Percentiles) string {
	if p.P5 > cylinder.SaneWallLimit {
		return noValue(u, noEquilibrium)
	}
	return percentileText(u, p.P5) + " to " + percentileText(u, p.P95)
}

// percentileText is one percentile of the band in display units, or the
// state where its samples found no equilibrium.
func percentileText(u output.Units, k float64) string {
	if k > cylinder.SaneWallLimit {
		return noValue(u, noEquilibrium)
	}
	return fmtT(u, k)
}

// bandGrid is the band as a table: each set's percentiles and the
// probability of going over its limit.
func bandGrid(u output.Units, d *design.Design, b *uncertainty.Band) output.Grid {
	T := u.Name(output.Temp)
	g := output.Grid{Title: fmt.Sprintf("Uncertainty band (%d samples, seed %d; [uncertainty] in the design)", b.Samples, b.Seed),
		Header: []string{"set", "5 % (" + T + ")", "50 % (" + T + ")", "95 % (" + T + ")", "limit (" + T + ")", "chance over the limit"}, Left: 1}
	t := func(k float64) string { return percentileText(u, k) }
	for _, r := range []struct {
		name  string
		p     uncertainty.Percentiles
		limit float64
		over  float64
	}{{"head", b.Head, d.HeadLimit, b.HeadOver}, {"barrel", b.Barrel, d.BarrelLimit, b.BarrelOver}} {
		g.Rows = append(g.Rows, []string{r.name, t(r.p.P5), t(r.p.P50), t(r.p.P95), fmtT(u, r.limit), u.N(100*r.over, 0) + " %"})
	}
	return g
}

// bandNote says what the band covers.
const bandNote = "The band samples the poorly known inputs within stated half-widths (pressure recovery, cooling share, thermal efficiency, head share, " +
	"forced and natural convection scatter, conductivity, emissivity, and the air-side method among those that apply; defaults and sources in 'go doc finmarch/airflow/uncertainty'); " +
	"to narrow it, measure the head on the running engine, add the reading as a [[measurement]] table and run 'finmarch calibrate DESIGN --write CALIBRATED.toml'."

// putBand puts the band into the JSON object m under key, and leaves the
// key out when the band is off; it returns m.
func putBand(m map[string]any, key string, b *uncertainty.Band) map[string]any {
	if b != nil {
		m[key] = bandJSON(b)
	}
	return m
}

// bandJSON is the band for the JSON: each percentile null where that
// share of the samples found no equilibrium.
func bandJSON(b *uncertainty.Band) map[string]any {
	pj := func(p uncertainty.Percentiles) map[string]any {
		v := func(k float64) any {
			if k > cylinder.SaneWallLimit {
				return nil // no equilibrium at that percentile
			}
			return k
		}
		return map[string]any{"p5_K": v(p.P5), "p50_K": v(p.P50), "p95_K": v(p.P95)}
	}
	return map[string]any{"samples": b.Samples, "seed": b.Seed, "head": pj(b.Head), "barrel": pj(b.Barrel),
		"head_over_limit_probability": b.HeadOver, "barrel_over_limit_probability": b.BarrelOver,
		"no_equilibrium_samples": b.NoEquilibrium, "failed_samples": b.Failed}
}

// swingGrid is the one-at-a-time study (uncertainty.Sensitivity): each
// input alone at the ends of its half-width, the head's and barrel's
// walls there, largest head swing first.
func swingGrid(u output.Units, ws []uncertainty.Swing) output.Grid {
	T, dT := u.Name(output.Temp), u.Name(output.TempDiff)
	g := output.Grid{Title: "What moves the walls: each input alone at the ends of its half-width (the estimate's method)",
		Header: []string{"input", "half-width", "head, low end (" + T + ")", "head, high end (" + T + ")", "head swing (" + dT + ")", "barrel swing (" + dT + ")"}, Left: 1}
	swing := func(v [2]float64) string {
		if math.IsInf(v[0], 0) || math.IsInf(v[1], 0) {
			return "to no equilibrium"
		}
		return u.N(math.Abs(v[1]-v[0]), 1)
	}
	for _, w := range ws {
		half := "+-" + u.N(w.Half, 2)
		if w.Relative {
			half = "+-" + u.N(100*w.Half, 0) + " %"
		}
		g.Rows = append(g.Rows, []string{w.Input, half, percentileText(u, w.Head[0]), percentileText(u, w.Head[1]), swing(w.Head), swing(w.Barrel)})
	}
	return g
}
