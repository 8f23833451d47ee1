package app

import (
	"bufio"
	"container/heap"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"runtime/debug"
	"sort"
	"strconv"
	"strings"
	"sync"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
	"finmarch/fins"
)

// axis is one varied key with its values (SI).
type axis struct {
	key  string
	vals []float64
}

// parseAxis reads "key=from:to:step" (units allowed on each part) or
// "key=v1,v2,v3".
func parseAxis(spec string) (axis, error) {
	k, rest, ok := strings.Cut(spec, "=")
	k = strings.TrimSpace(k)
	if !ok || k == "" || strings.TrimSpace(rest) == "" {
		return axis{}, fmt.Errorf("--vary %q: write key=from:to:step, e.g. head.pitch=6mm:12mm:1mm, or key=a,b,c", spec)
	}
	a := axis{key: k}
	parse := func(s string) (float64, error) {
		v, err := design.ParseFor(k, s)
		if err != nil {
			return 0, fmt.Errorf("--vary %s: %w", k, err)
		}
		return v, nil
	}
	if strings.Contains(rest, ":") {
		p := strings.Split(rest, ":")
		if len(p) != 3 {
			return axis{}, fmt.Errorf("--vary %q: a range is from:to:step", spec)
		}
		var v [3]float64
		for i := range p {
			x, err := parse(p[i])
			if i == 2 { // the step is a difference: "5 C" is 5 K
				x, err = design.ParseDifferenceFor(k, p[i])
				if err != nil {
					err = fmt.Errorf("--vary %s: %w", k, err)
				}
			}
			if err != nil {
				return axis{}, err
			}
			v[i] = x
		}
		if !(v[2] > 0) || v[1] < v[0] {
			return axis{}, fmt.Errorf("--vary %q: need from <= to and a positive step", spec)
		}
		n := math.Floor((v[1]-v[0])/v[2]+1e-9) + 1
		if n > 1e7 {
			return axis{}, fmt.Errorf("--vary %q: %g values on one axis; at most 10 million", spec, n)
		}
		for i := 0; i < int(n); i++ {
			// to 12 significant digits, so that 30 mm + 1 x 5 mm is 0.035 m
			// and not 0.034999999999999996 in the JSON and in the design
			x, _ := strconv.ParseFloat(strconv.FormatFloat(v[0]+float64(i)*v[2], 'g', 12, 64), 64)
			a.vals = append(a.vals, x)
		}
		return a, nil
	}
	for _, s := range strings.Split(rest, ",") {
		x, err := parse(s)
		if err != nil {
			return axis{}, err
		}
		a.vals = append(a.vals, x)
	}
	return a, nil
}

type sweepRow struct {
	idx          int
	vals         []float64
	ok           bool
	equilibrium  bool
	msg          string
	headT, barrT float64
	headM, barrM float64
	mass, perKg  float64
	hc, bc       int // fin counts of the evaluated design
	status       string
}

// rowHeap keeps the best n rows by a key (a max-heap on the key, so the
// worst of the kept rows is on top and is dropped first).
type rowHeap struct {
	rows []sweepRow
	key  func(r sweepRow) float64
}

func (h rowHeap) Len() int           { return len(h.rows) }
func (h rowHeap) Less(i, j int) bool { return h.key(h.rows[i]) > h.key(h.rows[j]) }
func (h rowHeap) Swap(i, j int)      { h.rows[i], h.rows[j] = h.rows[j], h.rows[i] }
func (h *rowHeap) Push(x any)        { h.rows = append(h.rows, x.(sweepRow)) }
func (h *rowHeap) Pop() any {
	r := h.rows[len(h.rows)-1]
	h.rows = h.rows[:len(h.rows)-1]
	return r
}

func keep(h *rowHeap, r sweepRow, n int) {
	if h.Len() < n {
		heap.Push(h, r)
		return
	}
	if h.key(r) < h.key(h.rows[0]) {
		h.rows[0] = r
		heap.Fix(h, 0)
	}
}

func (e *env) sweepCmd() *cobra.Command {
	var vary []string
	var workers, top int
	var keepCount bool
	cmd := &cobra.Command{
		Use:   "sweep DESIGN.toml --vary KEY=FROM:TO:STEP [--vary ...]",
		Short: "Sweep any numeric keys over a grid, in parallel, streaming rows to CSV or JSON lines",
		Long: `sweep evaluates the design at every point of a grid over one or more numeric keys
(several --vary flags make a grid) on all cores. With --format csv or json the rows
stream out as they finish (JSON lines for json), in constant memory whatever the
grid size; each row carries its grid index. A summary of the best rows follows (on
stderr when the rows go to stdout). When pitch, root thickness, finned length or
diameter vary and the count does not, each set gets as many fins as fit (use
--keep-count to hold the design's counts). Keys: ` + strings.Join(design.VaryKeys(), ", ") + `.

  finmarch sweep my.toml --vary head.pitch=6mm:14mm:1mm --vary air.speed=40km/h:120km/h:40km/h`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: tomlArgs,
		RunE: func(_ *cobra.Command, args []string) error {
			d, err := e.load(args[0])
			if err != nil {
				return err
			}
			if len(vary) == 0 {
				return fail(ExitUsage, fmt.Errorf("give at least one --vary KEY=FROM:TO:STEP"))
			}
			var axes []axis
			total := 1
			for _, v := range vary {
				a, err := parseAxis(v)
				if err != nil {
					return fail(ExitUsage, err)
				}
				axes = append(axes, a)
				total *= len(a.vals)
				if total > 100_000_000 {
					return fail(ExitUsage, fmt.Errorf("the grid has more than 100 million points"))
				}
			}
			if workers <= 0 {
				workers = runtime.GOMAXPROCS(0)
			}
			if top < 1 || top > 1000 {
				return fail(ExitUsage, fmt.Errorf("--top %d: allowed 1 to 1000", top))
			}
			return e.sweep(d, axes, total, workers, top, keepCount)
		},
	}
	cmd.Flags().StringArrayVar(&vary, "vary", nil, "KEY=FROM:TO:STEP (units allowed) or KEY=A,B,C; repeat for a grid")
	cmd.Flags().IntVar(&workers, "workers", 0, "parallel workers (default: all cores)")
	cmd.Flags().IntVar(&top, "top", 10, "rows in each summary table")
	cmd.Flags().BoolVar(&keepCount, "keep-count", false, "keep the fin counts of the design when pitch, thickness or length vary (default: as many fins as fit)")
	return cmd
}

// runGrid evaluates every grid point on workers goroutines and hands each
// row to sink on the calling goroutine, as the rows finish.
func runGrid(d *design.Design, axes []axis, total, workers int, fit bool, sink func(sweepRow)) {
	// points go to the workers in chunks and come back in batches, so the
	// channels carry one message per chunk rather than one per point; a
	// chunk is small enough that every worker gets many
	chunk := min(max(total/(64*workers), 1), 32)
	// The live heap of a sweep is small and steady (each worker's curve
	// cache, the best-row heaps, the output buffer), while every point
	// allocates a few kilobytes that die at once: collecting at 5 times the
	// live heap instead of twice saves about a tenth of the time
	// (BenchmarkSweep1000*) for a few megabytes more (the 1,000,000-point
	// sweep in DEVELOPERS.md stays near 30 MB).
	if total >= 1000 {
		defer debug.SetGCPercent(debug.SetGCPercent(400))
	}
	type span struct{ lo, hi int }
	jobs := make(chan span, 4*workers)
	rows := make(chan []sweepRow, 4*workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			cache := cylinder.NewWorkspace()
			vals := make(map[string]float64, len(axes)+2)
			for sp := range jobs {
				batch := make([]sweepRow, 0, sp.hi-sp.lo)
				for i := sp.lo; i < sp.hi; i++ {
					clear(vals)
					batch = append(batch, evalPoint(d, axes, i, vals, fit, cache))
				}
				rows <- batch
			}
		}()
	}
	go func() {
		for lo := 0; lo < total; lo += chunk {
			jobs <- span{lo, min(lo+chunk, total)}
		}
		close(jobs)
		wg.Wait()
		close(rows)
	}()
	for b := range rows {
		for _, r := range b {
			sink(r)
		}
	}
}

// fitCounts sets the fin count of each set whose pitch, root thickness,
// length or diameter varies (and whose count does not) to as many fins as
// fit, so that a pitch sweep keeps the finned length filled.
func fitCounts(d *design.Design, vals map[string]float64) {
	for _, s := range []struct {
		name string
		set  fins.Set
	}{{"head", d.Case.Head.Set}, {"barrel", d.Case.Barrel.Set}} {
		if _, fixed := vals[s.name+".count"]; fixed {
			continue
		}
		get := func(key string, def float64) float64 {
			if v, ok := vals[key]; ok {
				return v
			}
			return def
		}
		p := get(s.name+".pitch", s.set.Pitch)
		t := get(s.name+".root_thickness", s.set.RootThickness)
		L := get("cylinder."+s.name+"_length", s.set.Length)
		D := get("cylinder."+s.name+"_diameter", s.set.RootDiameter)
		touched := false
		for _, k := range []string{s.name + ".pitch", s.name + ".root_thickness", "cylinder." + s.name + "_length", "cylinder." + s.name + "_diameter"} {
			_, ok := vals[k]
			touched = touched || ok
		}
		if !touched || !(p > 0) {
			continue
		}
		vals[s.name+".count"] = float64(fins.Fitting(s.set.Style, p, t, L, D))
	}
}

func evalPoint(d *design.Design, axes []axis, i int, vals map[string]float64, fit bool, cache *cylinder.Workspace) sweepRow {
	r := sweepRow{idx: i, vals: make([]float64, len(axes))}
	j := i
	for k := len(axes) - 1; k >= 0; k-- {
		a := axes[k]
		r.vals[k] = a.vals[j%len(a.vals)]
		vals[a.key] = r.vals[k]
		j /= len(a.vals)
	}
	if fit {
		fitCounts(d, vals)
	}
	v, err := d.With(vals)
	if err != nil {
		r.status, r.msg = "invalid", firstLine(err.Error())
		return r
	}
	o, err := evaluateWith(v, v.Case.Speed, cache, true)
	if err != nil {
		r.status, r.msg = "failed", firstLine(err.Error())
		return r
	}
	r.ok, r.equilibrium = true, o.NoEquilibrium == nil
	r.hc, r.bc = v.Case.Head.Set.Count, v.Case.Barrel.Set.Count
	r.headT, r.barrT = o.Result.Head.WallTemp, o.Result.Barrel.WallTemp
	r.headM, r.barrM = o.HeadMargin(), o.BarrelMargin()
	r.mass = o.Result.Head.FinMass + o.Result.Barrel.FinMass
	r.perKg = (o.Result.Head.HeatRejected + o.Result.Barrel.HeatRejected) / r.mass
	r.status = string(o.Status())
	if o.NoEquilibrium != nil {
		r.msg = firstLine(o.NoEquilibrium.Error())
	}
	return r
}

func firstLine(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i] + " (and more)"
	}
	return s
}

// displayFor converts a varied key's SI value to the display unit.
func displayFor(u output.Units, key string, v float64) (string, string) {
	switch {
	case strings.HasSuffix(key, ".count") || key == "segments":
		return strconv.Itoa(int(v)), ""
	case strings.HasSuffix(key, "speed"):
		return output.Num(u.Road(v), 2), u.RoadU()
	case strings.HasSuffix(key, "ambient") || strings.HasPrefix(key, "limits.") || strings.HasSuffix(key, "_wall"):
		return output.Num(u.Temp(v), 2), u.TempU()
	case key == "cylinder.tilt":
		return output.Num(v*180/math.Pi, 2), "deg"
	case key == "air.altitude":
		return output.Num(u.Alt(v), 1), u.AltU()
	case strings.HasPrefix(key, "head.") || strings.HasPrefix(key, "barrel.") && !strings.HasSuffix(key, "emissivity") ||
		strings.HasPrefix(key, "cylinder."):
		if strings.HasSuffix(key, "emissivity") {
			return output.Num(v, 3), ""
		}
		return output.Num(u.Len(v), u.LenDec()+2), u.LenU()
	}
	return strconv.FormatFloat(v, 'g', 6, 64), design.SIUnit(key)
}

func (e *env) sweep(d *design.Design, axes []axis, total, workers, top int, keepCount bool) error {
	f, u, err := e.settings()
	if err != nil {
		return err
	}
	streaming := f == output.CSV || f == output.JSON
	var dst io.Writer = e.stdout
	var file *atomicFile
	summaryTo := e.stdout
	if streaming {
		summaryTo = e.stderr
	}
	if e.opt.out != "" {
		if file, err = createAtomic(e.opt.out, e.opt.force); err != nil {
			return err
		}
		defer file.Abort()
		dst = file
		summaryTo = e.stdout
	}
	bw := bufio.NewWriterSize(dst, 1<<16)
	cw := csv.NewWriter(bw)
	T := u.TempU()
	header := []string{"index"}
	for _, a := range axes {
		_, unit := displayFor(u, a.key, a.vals[0])
		if unit != "" {
			header = append(header, a.key+" ("+unit+")")
		} else {
			header = append(header, a.key)
		}
	}
	header = append(header, "head fins", "barrel fins", "head ("+T+")", "barrel ("+T+")", "head margin ("+u.TempDiffU()+")", "barrel margin ("+u.TempDiffU()+")",
		"fin mass ("+u.MassU()+")", "heat per fin mass ("+u.PerMassU()+")", "status", "note")
	if f == output.CSV {
		if err := cw.Write(header); err != nil {
			return fail(ExitIO, err)
		}
	}
	cells := func(r sweepRow) []string {
		c := []string{strconv.Itoa(r.idx)}
		for k, a := range axes {
			s, _ := displayFor(u, a.key, r.vals[k])
			c = append(c, s)
		}
		if !r.ok {
			return append(c, "", "", "", "", "", "", "", "", r.status, r.msg)
		}
		return append(c, strconv.Itoa(r.hc), strconv.Itoa(r.bc), fmtT(u, r.headT), fmtT(u, r.barrT), fmtDT(u, r.headM), fmtDT(u, r.barrM),
			output.Num(u.Mass(r.mass), 3), output.Num(u.PerMass(r.perKg), 0), r.status, r.msg)
	}
	var bar *progressbar.ProgressBar
	if sf, ok := e.stderr.(*os.File); ok && !e.opt.quiet && total >= 200 && term.IsTerminal(int(sf.Fd())) {
		bar = progressbar.NewOptions(total, progressbar.OptionSetWriter(os.Stderr), progressbar.OptionSetDescription("sweep"),
			progressbar.OptionShowCount(), progressbar.OptionThrottle(100_000_000), progressbar.OptionClearOnFinish())
	}
	coolest := &rowHeap{key: func(r sweepRow) float64 { return r.headT }}
	lightest := &rowHeap{key: func(r sweepRow) float64 { return r.mass }}
	counts := map[string]int{}
	var werr error
	firstInvalid := sweepRow{idx: -1} // the invalid point of lowest index
	runGrid(d, axes, total, workers, !keepCount, func(r sweepRow) {
		counts[r.status]++
		if r.status == "invalid" && (firstInvalid.idx < 0 || r.idx < firstInvalid.idx) {
			firstInvalid = r
		}
		if r.ok && r.equilibrium {
			keep(coolest, r, top)
			if r.headM >= 0 && r.barrM >= 0 {
				keep(lightest, r, top)
			}
		}
		if werr == nil {
			switch f {
			case output.CSV:
				werr = cw.Write(cells(r))
			case output.JSON:
				m := map[string]any{"index": r.idx, "status": r.status}
				for k, a := range axes {
					m[a.key] = r.vals[k]
				}
				if r.ok {
					m["head_K"], m["barrel_K"], m["head_margin_K"], m["barrel_margin_K"] = r.headT, r.barrT, r.headM, r.barrM
					m["fin_mass_kg"], m["heat_per_kg_W"], m["equilibrium"] = r.mass, r.perKg, r.equilibrium
					m["head_fins"], m["barrel_fins"] = r.hc, r.bc
				}
				if r.msg != "" {
					m["note"] = r.msg
				}
				var b []byte
				if b, werr = json.Marshal(m); werr == nil {
					b = append(b, '\n')
					_, werr = bw.Write(b)
				}
			}
		}
		if bar != nil {
			_ = bar.Add(1)
		}
	})
	if bar != nil {
		_ = bar.Finish()
	}
	cw.Flush()
	if werr == nil {
		werr = cw.Error()
	}
	if werr == nil {
		werr = bw.Flush()
	}
	if werr != nil {
		return fail(ExitIO, fmt.Errorf("writing the sweep: %w", werr))
	}
	if file != nil {
		if err := file.Commit(); err != nil {
			return err
		}
	}
	// summary
	sorted := func(h *rowHeap) []sweepRow {
		rs := append([]sweepRow(nil), h.rows...)
		sort.Slice(rs, func(i, j int) bool {
			return h.key(rs[i]) < h.key(rs[j]) || h.key(rs[i]) == h.key(rs[j]) && rs[i].idx < rs[j].idx
		})
		return rs
	}
	grid := func(title string, rs []sweepRow) output.Grid {
		g := output.Grid{Title: title, Header: header[:len(header)-1]}
		for _, r := range rs {
			c := cells(r)
			g.Rows = append(g.Rows, c[:len(c)-1])
		}
		return g
	}
	var keys []string
	for k := range counts {
		keys = append(keys, fmt.Sprintf("%s %d", k, counts[k]))
	}
	sort.Strings(keys)
	doc := output.Doc{Title: fmt.Sprintf("%s: sweep of %d points on %d workers (%s)", d.Name, total, workers, strings.Join(keys, ", ")),
		Grids: []output.Grid{grid(fmt.Sprintf("Coolest heads (best %d)", top), sorted(coolest)),
			grid(fmt.Sprintf("Lightest fins within both limits (best %d)", top), sorted(lightest))},
		Caution: true}
	if counts["invalid"] > 0 {
		doc.Notes = append(doc.Notes, fmt.Sprintf("Invalid points break a design rule (the row's note says which) and are not estimated; the first, point %d: %s.",
			firstInvalid.idx, strings.TrimSuffix(firstInvalid.msg, ".")))
	}
	sf := output.Table
	if f == output.Markdown {
		sf = output.Markdown
	}
	if err := output.Write(summaryTo, doc, sf); err != nil {
		return fail(ExitIO, err)
	}
	if counts["invalid"] == total {
		return fail(ExitDesign, fmt.Errorf("every point of the sweep breaks a design rule, so none was estimated; point %d: %s", firstInvalid.idx, firstInvalid.msg))
	}
	return nil
}
