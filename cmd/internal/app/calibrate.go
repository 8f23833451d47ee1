package app

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/airflow/calibrate"
	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

func (e *env) calibrateCmd() *cobra.Command {
	var fit, write, points string
	cmd := e.oneDesign("calibrate DESIGN.toml [--points READINGS.csv] [--fit recovery[,forced,load,offset]] [--write CALIBRATED.toml]", "Fit the design's pressure recovery (and more) to head or barrel temperatures measured on the engine", func(d *design.Design) error {
		ducted := d.Case.Supply.Kind != cylinder.SupplyRam
		if fit == "" {
			// a duct or a fan drives the air: the road's pressure recovery
			// plays no part, the forced convection factor takes its place
			fit = map[bool]string{false: "recovery", true: "forced"}[ducted]
		}
		names, err := fitNames(fit)
		if err != nil {
			return err
		}
		if ducted && slices.Contains(names, calibrate.Recovery) {
			return fail(ExitUsage, fmt.Errorf("--fit recovery: %s takes its cooling air from a %s ([cooling]), where the road's pressure recovery plays no part; fit forced (the forced convection factor) instead", d.Name, d.Case.Supply.Kind))
		}
		if points != "" {
			src, err := readInput(points, "points file")
			if err != nil {
				return err
			}
			e.inputs = append(e.inputs, points)
			pts, err := d.ReadPoints(src, points)
			if err != nil {
				return fail(ExitDesign, err)
			}
			d.Points = append(d.Points, pts...)
		}
		return e.calibrate(d, d.Source, names, write)
	})
	cmd.PreRunE = func(*cobra.Command, []string) error { return e.distinctOutputs(write) }
	cmd.Long = `calibrate fits the design's poorly known parameters to the temperatures measured on the
running engine, given in the design as [[measurement]] tables (speed, ambient, altitude,
head or barrel, place fin-root or plug-seat with its offset, uncertainty). It fits the
pressure recovery (with a duct or a fan, [cooling], the forced convection factor instead);
--fit adds the forced convection factor (forced), the heat load factor
(load) or the offset of the measuring place (offset), when the points can tell them
apart, and refuses a fit they cannot. A fit that would need a parameter past its
plausible range is refused too, saying the value the readings need (or that no value
within the estimator's own range reaches them, as with a pressure recovery above 1)
and by how many kelvin the estimate at the end of the range misses them: check the
readings' speed, ambient, place and offset, and the design's load. It prints the fitted
values with their standard errors and each point's residual; --write writes the
calibrated design (the fitted values set, the band's half-widths narrowed to the fit,
at most to each key's ceiling, with a note when the fit leaves a wider band) and never
replaces a file without --force; --write - sends it to standard output, for
'finmarch calibrate cal.toml --write - | finmarch estimate -', and the results go to
standard error (or to the -o file). The two outputs are never the same file.

  [[measurement]]
  speed = "90 km/h"
  ambient = "28 C"
  head = "204 C"
  place = "plug-seat"
  offset = "15 K"      # the seat runs this much hotter than the mean fin root

or in a CSV file given with --points (added to the design's tables): a header row
naming the columns, with a unit in parentheses for bare numbers, then one reading
per row; # starts a comment.

  speed (km/h),ambient (C),head (C),place,offset (K),uncertainty (K)
  90,28,204,plug-seat,15,5
  60,24,168,plug-seat,15,5`
	cmd.Flags().StringVar(&fit, "fit", "", "parameters to fit: recovery, forced, load, offset (comma-separated; default recovery, or forced with a duct or a fan)")
	cmd.Flags().StringVar(&write, "write", "", "write the calibrated design to this file; - for standard output (the results then go to standard error, or to the -o file)")
	cmd.Flags().StringVar(&points, "points", "", "CSV file of measured points, added to the design's [[measurement]] tables")
	return cmd
}

func fitNames(s string) ([]string, error) {
	var out []string
	for _, f := range strings.Split(s, ",") {
		n, ok := map[string]string{"recovery": calibrate.Recovery, "forced": calibrate.ForcedFactor, "load": calibrate.LoadFactor, "offset": calibrate.Offset}[strings.TrimSpace(f)]
		if !ok {
			return nil, fail(ExitUsage, fmt.Errorf("--fit %q: recovery, forced, load or offset, comma-separated", f))
		}
		out = append(out, n)
	}
	return out, nil
}

func (e *env) calibrate(d *design.Design, path string, names []string, write string) error {
	_, u, err := e.settings()
	if err != nil {
		return err
	}
	if len(d.Points) == 0 {
		return fail(ExitDesign, fmt.Errorf("%s: no [[measurement]] to calibrate against; add one, or give a points file with --points (finmarch calibrate --help)", path))
	}
	f, err := calibrate.Calibrate(d.Cylinder(), d.Run, d.Points, names...)
	if err != nil {
		return fail(ExitModel, fmt.Errorf("%s: %w", d.Name, err))
	}
	T := u.Name(output.Temp)
	pg := output.Grid{Title: "Fitted parameters", Header: []string{"parameter", "value", "standard error", "plausible range"}, Left: 1}
	for _, p := range f.Params {
		pg.Rows = append(pg.Rows, []string{p.Name, u.N(p.Value, 4), u.N(p.StdError, 4), u.N(p.Lo, 2) + " to " + u.N(p.Hi, 2)})
	}
	rg := output.Grid{Title: "Measured points", Header: []string{"point", "speed (" + u.Name(output.Road) + ")", "ambient (" + T + ")", "set", "measured (" + T + ")", "offset (" + u.Name(output.TempDiff) + ")", "residual (" + u.Name(output.TempDiff) + ")"}, Left: 1}
	for i, p := range d.Points {
		set := "head"
		if p.Barrel {
			set = "barrel"
		}
		rg.Rows = append(rg.Rows, []string{fmt.Sprint(i + 1), u.N(u.Of(output.Road, p.Speed), 0), fmtT(u, p.Ambient), set,
			fmtT(u, p.Temp), fmtDT(u, p.Offset), fmtDT(u, f.Residuals[i])})
	}
	doc := output.Doc{Title: fmt.Sprintf("%s: calibration against %s", d.Name, count(len(d.Points), "measured point")), Grids: []output.Grid{pg, rg}, Caution: true,
		Notes: []string{"A residual is the model (plus the measuring place's offset) less the measurement; a plug seat runs hotter than the mean fin root the model gives.",
			"Standard errors come from the fit's covariance, scaled by the residuals when the points outnumber the parameters and by the points' stated uncertainty (5 K unless given); the measuring place's offset is one error shared by its readings, so the fit is repeated with every offset moved by its own uncertainty (offset_uncertainty, else half the offset: a guessed plug-seat offset is known to about half its size, our assumption) and the parameters' move is added to their standard errors otherwise."}}
	kvs, clamped := calibratedKeys(f, d.Band.Spread, d.Case.Method(d.Run))
	doc.Notes = append(doc.Notes, clamped...)
	doc.Notes = append(doc.Notes, calibratedNotes(u, d, f)...)
	doc.JSON = map[string]any{"design": d.Name, "inputs": d.Cylinder().Resolved(), "parameters": f.Params, "residuals_K": f.Residuals, "chi2": f.Chi2, "warnings": f.Warnings, "caution": output.Caution}
	doc.Warnings = f.Warnings
	if write != "" {
		if e.opt.strict && len(doc.Warnings) > 0 {
			return e.emit(doc) // refused by --strict: nothing written
		}
		out, err := design.EditKeys(e.sources[path], kvs)
		if err == nil {
			err = checkCalibrated(out, write, kvs)
		}
		if err != nil {
			return fail(ExitInternal, fmt.Errorf("the calibrated design: %w", err))
		}
		if err := e.write(write, out); err != nil {
			return err
		}
		if write == "-" {
			doc.Notes = append(doc.Notes, "Wrote the calibrated design to standard output (these results to standard error): the fitted values set and the band's half-widths narrowed to two standard errors; pipe it to 'finmarch estimate -' to predict with them.")
			if e.opt.out == "" {
				stdout := e.stdout
				e.stdout = e.stderr
				defer func() { e.stdout = stdout }()
			}
		} else {
			doc.Notes = append(doc.Notes, fmt.Sprintf("Wrote %s: the fitted values set and the band's half-widths narrowed to two standard errors; 'finmarch estimate %s' predicts with them.", write, write))
		}
	} else {
		var keys []string
		for _, kv := range kvs {
			keys = append(keys, kv.Key+" = "+kv.Value)
		}
		doc.Notes = append(doc.Notes, "To use the fit, set in the design: "+strings.Join(keys, "; ")+" (or run with --write FILE).")
	}
	return e.emit(doc)
}

// distinctOutputs refuses a calibration whose two outputs, the calibrated
// design (--write) and the results (-o, else standard output), are one
// file or both standard output, before anything is written.
func (e *env) distinctOutputs(write string) error {
	if write == "" {
		return nil
	}
	if write == "-" && e.opt.out == "-" {
		return fail(ExitUsage, fmt.Errorf("--write - and -o - cannot both take standard output: with --write - the results go to standard error, or give -o FILE for them"))
	}
	if write != "-" && sameOutput(write, e.opt.out) {
		return fail(ExitUsage, fmt.Errorf("--write %s and -o %s name the same file: the calibrated design and the results need a file each", write, e.opt.out))
	}
	return nil
}

// checkCalibrated checks the calibrated design text before it is written:
// it parses, and each key written reads back as the value set.
func checkCalibrated(out []byte, name string, kvs []design.KV) error {
	d, err := design.Parse(out, name)
	if err != nil {
		return fmt.Errorf("does not parse: %w", err)
	}
	got := map[string]float64{"air.pressure_recovery": d.Case.Recovery, "calibration.forced_convection_factor": d.Run.ForcedFactor,
		"uncertainty.pressure_recovery": d.Band.Spread.Recovery, "uncertainty.forced_convection": d.Band.Spread.Forced,
		"uncertainty.cooling_share": d.Band.Spread.CoolShare, "uncertainty.thermal_efficiency": d.Band.Spread.Thermal, "uncertainty.head_share": d.Band.Spread.HeadShare}
	for _, kv := range kvs {
		want, err := strconv.ParseFloat(kv.Value, 64)
		have, ok := got[kv.Key]
		if err != nil || !ok {
			continue // the load factor scales the load; the method and switches are words
		}
		if math.Abs(have-want) > 1e-12*math.Max(1, math.Abs(want)) {
			return fmt.Errorf("%s reads back as %s, not %s", kv.Key, strconv.FormatFloat(have, 'g', 6, 64), kv.Value)
		}
	}
	return nil
}

// calibratedKeys are the design keys a fit sets: each fitted value, and
// the band's half-widths as the fit leaves them (calibrate.Fit.Narrow on
// the design's spread sp), each at most its key's ceiling; notes say where
// a half-width was held to its ceiling.
func calibratedKeys(f calibrate.Fit, sp uncertainty.Spread, m cylinder.Method) ([]design.KV, []string) {
	var notes []string
	var kvs []design.KV
	if after := f.Narrow(sp); sp.Methods && !after.Methods {
		// the fit anchors its own air-side method: the calibrated design keeps it
		kvs = append(kvs, design.KV{Key: "air.method", Value: strconv.Quote(string(m)), Note: "the air-side method the calibration was made with"},
			design.KV{Key: "uncertainty.methods", Value: "false", Note: "the readings anchor the method; no draw among methods"})
	}
	fittedBy := map[string]string{}
	for _, p := range f.Params {
		kv := design.KV{Value: output.Num(p.Value, 4), Note: "fitted by finmarch calibrate"}
		switch p.Name {
		case calibrate.Recovery:
			kv.Key, fittedBy["pressure_recovery"] = "air.pressure_recovery", p.Name
		case calibrate.ForcedFactor:
			kv.Key, fittedBy["forced_convection"] = "calibration.forced_convection_factor", p.Name
		case calibrate.LoadFactor:
			kv.Key, fittedBy["cooling_share"] = "calibration.heat_load_factor", p.Name
		default:
			continue // the offset belongs to the measuring place
		}
		kvs = append(kvs, kv)
	}
	after := f.Narrow(sp)
	for _, h := range []struct {
		key           string
		before, after float64
	}{{"pressure_recovery", sp.Recovery, after.Recovery}, {"forced_convection", sp.Forced, after.Forced},
		{"cooling_share", sp.CoolShare, after.CoolShare}, {"thermal_efficiency", sp.Thermal, after.Thermal}, {"head_share", sp.HeadShare, after.HeadShare}} {
		note := "absorbed by the fit"
		if fittedBy[h.key] != "" {
			note = "two standard errors of the fit"
		} else if h.after == h.before {
			continue
		}
		key := "uncertainty." + h.key
		if hi, ok := design.HalfWidthCeiling(key); ok && !(h.after <= hi) {
			// scattered readings: two standard errors wider than a design
			// may state; the band is written at the ceiling, and says so
			notes = append(notes, fmt.Sprintf("The fit's two standard errors of the %s, %s, exceed the largest half-width a design takes, %s: %s is written as %s, so the band understates how loosely the readings hold it; readings over a wider range of speeds, or more of them, narrow it.",
				strings.ReplaceAll(h.key, "_", " "), halfWidthText(h.after), output.Num(hi, 2), key, output.Num(hi, 2)))
			h.after, note = hi, "the fit's two standard errors, held to the ceiling"
		}
		kvs = append(kvs, design.KV{Key: key, Value: strconv.FormatFloat(h.after, 'g', 4, 64), Note: note})
	}
	return kvs, notes
}

// halfWidthText is a half-width for a message: 4 significant digits.
func halfWidthText(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "unbounded"
	}
	return strconv.FormatFloat(v, 'g', 4, 64)
}

// calibratedNotes say what the fit means for the design: its head and
// barrel at the design's own point (speed, ambient) before and after, and,
// when the fitted recovery lies further from the design's than the band's
// half-width, what the readings say about the cylinder's air.
func calibratedNotes(u output.Units, d *design.Design, f calibrate.Fit) []string {
	var notes []string
	before, err1 := d.Cylinder().Evaluate(d.Run)
	cd, cs := f.Apply(d.Cylinder(), d.Run)
	after, err2 := cd.Evaluate(cs)
	at := fmt.Sprintf("%s %s, %s", u.N(u.Of(output.Road, d.Case.Speed), 0), u.Name(output.Road), fmtT(u, d.Case.Ambient)+" "+u.Name(output.Temp))
	wall := func(o cylinder.Outcome, err error, r cylinder.SetResult) string {
		if err != nil || !r.Equilibrium {
			return "no equilibrium"
		}
		return fmtT(u, r.WallTemp) + " " + u.Name(output.Temp)
	}
	notes = append(notes, fmt.Sprintf("At the design's own point (%s) the calibrated design puts the head at %s and the barrel at %s; as it stood, %s and %s.",
		at, wall(after, err2, after.Result.Head), wall(after, err2, after.Result.Barrel), wall(before, err1, before.Result.Head), wall(before, err1, before.Result.Barrel)))
	_, loadFitted := f.Get(calibrate.LoadFactor)
	if r, ok := f.Get(calibrate.Recovery); ok && !loadFitted {
		was := d.Case.Recovery
		if was == 0 {
			was = cylinder.DefaultRecovery
		}
		half := d.Band.Spread.Recovery
		if half <= 0 {
			half = uncertainty.DefaultSpread().Recovery
		}
		switch {
		case r < was-half:
			notes = append(notes, fmt.Sprintf("The readings need a pressure recovery of %s against the design's %s: less air reaches the fins than assumed (a wheel, mudguard, fairing, legs or luggage shading the cylinder), or more heat reaches them than the road-load shares give (a richer or harder-worked engine, a smaller oil share): the fit cannot tell which, and puts it all on the air.", output.Num(r, 2), output.Num(was, 2)))
		case r > was+half:
			notes = append(notes, fmt.Sprintf("The readings need a pressure recovery of %s against the design's %s: the fins get more air than assumed, or less heat than the road-load shares give (an oil cooler, a leaner or lightly loaded engine): the fit cannot tell which, and puts it all on the air.", output.Num(r, 2), output.Num(was, 2)))
		}
	}
	return notes
}
