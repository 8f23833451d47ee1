package design

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"slices"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"finmarch/airflow/cylinder"
)

// quantityField is implemented by every Q[D].
type quantityField interface {
	dimension() *dimension
	setSI(v float64)
}

func (q *Q[D]) dimension() *dimension { var d D; return d.dim() }
func (q *Q[D]) setSI(v float64)       { q.SI, q.Set, q.Bare = v, true, false }

// field finds the struct field of f named by a dotted key (toml tags).
func field(f *File, key string) (reflect.Value, error) {
	v := reflect.ValueOf(f).Elem()
	parts := strings.Split(key, ".")
	for i, p := range parts {
		if v.Kind() != reflect.Struct {
			return reflect.Value{}, fmt.Errorf("%q is not a key that can vary", key)
		}
		t := v.Type()
		found := false
		for j := 0; j < t.NumField(); j++ {
			if t.Field(j).Tag.Get("toml") == p {
				v = v.Field(j)
				found = true
				break
			}
		}
		if !found {
			msg := fmt.Sprintf("%q: no key %q under %q", key, p, strings.Join(parts[:i], "."))
			if i == 0 {
				msg = fmt.Sprintf("%q: no table %q", key, p)
			}
			if sug := suggestKey(toml.Key(parts[:i+1])); sug != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", sug)
			}
			return reflect.Value{}, errors.New(msg)
		}
	}
	return v, nil
}

// VaryKeys lists the numeric keys a sweep or the optimiser may vary.
func VaryKeys() []string {
	var out []string
	for tbl, keys := range schema() {
		// the [ride] masses play no part in a steady estimate
		if tbl == "" || strings.Contains(tbl, "*") || tbl == "alloys" || tbl == "ride" || tbl == "fan_point" {
			continue
		}
		for _, k := range keys {
			var f File
			v, err := field(&f, tbl+"."+k)
			if err != nil {
				continue
			}
			if _, ok := v.Addr().Interface().(quantityField); ok || (v.Kind() == reflect.Int && k == "count") {
				out = append(out, tbl+"."+k)
			}
		}
	}
	out = append(out, "segments")
	sort.Strings(out)
	return out
}

// ParseFor parses a value for a varied key, with the key's units ("6 mm"
// for head.pitch); counts take whole numbers.
func ParseFor(key, s string) (float64, error) { return parseFor(key, s, false) }

// operatingKeys are the keys that set the operating point (the road, the
// weather, the rider and luggage, a towed load, a given heat) rather than
// the design: a sweep judges each design by its worst value over them.
var operatingKeys = map[string]bool{"air.speed": true, "air.ambient": true, "air.altitude": true, "air.pressure": true,
	"load.grade": true, "load.mass": true, "load.extra_power": true, "load.head_heat": true, "load.barrel_heat": true}

// Operating reports whether a numeric key sets the operating point rather
// than the design.
func Operating(key string) bool { return operatingKeys[key] }

// SIUnit returns the SI unit in which a numeric key's values are held ("m",
// "K", "Pa", "W/(m2 K)"), "" for a fraction, a count or an unknown key.
func SIUnit(key string) string {
	var f File
	v, err := field(&f, key)
	if err != nil {
		return ""
	}
	if q, ok := v.Addr().Interface().(quantityField); ok {
		if u := q.dimension().si; u != "-" {
			return u
		}
	}
	return ""
}

// ParseDifferenceFor parses a step or difference for a varied key: "5 C"
// for air.ambient is 5 K, not 278.15 K.
func ParseDifferenceFor(key, s string) (float64, error) { return parseFor(key, s, true) }

func parseFor(key, s string, difference bool) (float64, error) {
	var f File
	v, err := field(&f, key)
	if err != nil {
		return 0, err
	}
	if q, ok := v.Addr().Interface().(quantityField); ok {
		return flagValue(s, q.dimension(), difference)
	}
	if v.Kind() == reflect.Int {
		n, err := strconv.Atoi(strings.TrimSpace(s))
		if err != nil {
			return 0, fmt.Errorf("%s takes a whole number, not %q", key, s)
		}
		return float64(n), nil
	}
	return 0, fmt.Errorf("%q is not a numeric key", key)
}

// With returns the design with the given keys (dotted, SI values) changed,
// checked by exactly the rules of Parse. The error lists what is wrong at
// this point of a sweep; line numbers refer to the original file.
func (d *Design) With(values map[string]float64) (*Design, error) {
	if d.file == nil {
		return nil, fmt.Errorf("design %q was not read from a file", d.Name)
	}
	f := *d.file
	for key, val := range values {
		if key == "segments" {
			f.Segments = int(math.Round(val))
			continue
		}
		v, err := field(&f, key)
		if err != nil {
			return nil, err
		}
		if q, ok := v.Addr().Interface().(quantityField); ok {
			q.setSI(val)
			continue
		}
		if v.Kind() == reflect.Int {
			if val != math.Trunc(val) {
				return nil, fmt.Errorf("%s = %g is not a whole number", key, val)
			}
			v.SetInt(int64(val))
			continue
		}
		return nil, fmt.Errorf("%q is not a numeric key", key)
	}
	var errs Errors
	add := func(key, format string, a ...any) {
		errs = append(errs, &Error{File: d.Source, Line: d.loc.line(key), Key: key, Msg: fmt.Sprintf(format, a...)})
	}
	nd := build(&f, d.md, d.Source, add)
	if len(errs) > 0 {
		return nil, errs
	}
	// the variant keeps its own decoded file, so that a variant of it
	// carries this one's changes too
	nd.file, nd.md, nd.loc = &f, d.md, d.loc
	if d.Run.Segments != 0 && !hasKey(values, "segments") && d.segOverride {
		nd.Run.Segments, nd.segOverride = d.Run.Segments, true
	}
	return nd, nil
}

func hasKey(m map[string]float64, k string) bool { _, ok := m[k]; return ok }

// halfWidthCeiling is the largest half-width each [uncertainty] key takes:
// the parser's rule, and the ceiling of the band a calibration writes.
var halfWidthCeiling = map[string]float64{
	"pressure_recovery": 0.5, "cooling_share": 0.9, "thermal_efficiency": 0.9, "head_share": 0.5,
	"forced_convection": 0.9, "natural_convection": 0.9, "conductivity": 0.5, "emissivity": 0.5,
}

// HalfWidthCeiling returns the largest value an uncertainty key (such as
// "uncertainty.pressure_recovery") takes in a design file, and whether the
// key is one of them.
func HalfWidthCeiling(key string) (float64, bool) {
	k, ok := strings.CutPrefix(key, "uncertainty.")
	if !ok {
		return 0, false
	}
	hi, ok := halfWidthCeiling[k]
	return hi, ok
}

// Dimension names the kind of quantity a numeric key holds ("length",
// "speed", "temperature", "rotational speed", "fraction", ...; the names
// of the design's units), "count" for a whole number, "" for an unknown
// key.
func Dimension(key string) string {
	if key == "segments" {
		return "count"
	}
	var f File
	v, err := field(&f, key)
	if err != nil {
		return ""
	}
	if q, ok := v.Addr().Interface().(quantityField); ok {
		return q.dimension().name
	}
	if v.Kind() == reflect.Int {
		return "count"
	}
	return ""
}

// CheckVary refuses a sweep over a key that changes nothing the design
// computes, so that a sweep never gives identical rows for a key the
// design file itself would refuse: a key outside VaryKeys (the [ride]
// metal, which only the heat soak uses), a half-width of the uncertainty
// band (a sweep's rows are single estimates, no band), the pressure
// recovery of a design whose air comes from a duct or a fan, and a key
// that the design's cooling source or settings do not use (cooling.drop
// on a ram-cooled design, cooling.idle_speed with a fixed engine speed):
// the design text src with the key written in is parsed by the parser's
// own rules, at the first of the axis's values (SI) that the design takes.
func (d *Design) CheckVary(src []byte, key string, values []float64) error {
	if key == "segments" {
		return nil
	}
	if !slices.Contains(VaryKeys(), key) {
		if _, err := field(&File{}, key); err != nil {
			return err
		}
		if strings.HasPrefix(key, "ride.") {
			return fmt.Errorf("%s plays no part in a steady estimate (only 'finmarch ride', the heat soak, uses it); 'finmarch sweep --help' lists the keys a sweep varies", key)
		}
		return fmt.Errorf("%s is not a key a sweep varies; 'finmarch sweep --help' lists them", key)
	}
	if strings.HasPrefix(key, "uncertainty.") {
		return fmt.Errorf("%s is a half-width of the uncertainty band, which a sweep does not draw (each row is one estimate); give it in the design and see the band with 'finmarch estimate'", key)
	}
	if key == "air.pressure_recovery" && d.Case.Supply.Kind != cylinder.SupplyRam {
		return fmt.Errorf("%s plays no part in %s: its cooling air comes from a %s ([cooling] source), not from the road's pressure", key, d.Name, d.Case.Supply.Kind)
	}
	if src == nil {
		return nil
	}
	for _, v := range values {
		if _, err := d.With(map[string]float64{key: v}); err != nil {
			continue // an invalid point: its row says why
		}
		text := siText(key, v)
		edited, err := EditKeys(src, []KV{{Key: key, Value: text}})
		if err != nil {
			return nil // the editor cannot place it; the parser's rules hold for the rows
		}
		_, err = Parse(edited, d.Source)
		var es Errors
		if err == nil || !errors.As(err, &es) {
			return nil
		}
		var why []string
		for _, e := range es {
			why = append(why, e.Key+": "+e.Msg)
		}
		return fmt.Errorf("%s is not used by %s, and the design file itself would refuse it (%s); a sweep varies only keys the design's cooling source and settings use", key, d.Name, strings.Join(why, "; "))
	}
	return nil
}

// siText writes the SI value v of a numeric key as design text: a whole
// number for a count, the value with its SI unit where the dimension has
// one to write ("16.67 m/s": a bare speed is refused), else bare.
func siText(key string, v float64) string {
	if Dimension(key) == "count" {
		return strconv.Itoa(int(math.Round(v)))
	}
	num := strconv.FormatFloat(v, 'g', -1, 64)
	var f File
	if fv, err := field(&f, key); err == nil {
		if q, ok := fv.Addr().Interface().(quantityField); ok {
			if d := q.dimension(); d.si != "" {
				if _, ok := d.units[strings.ToLower(d.si)]; ok {
					return strconv.Quote(num + " " + d.si)
				}
			}
		}
	}
	return num
}
