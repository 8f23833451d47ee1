package design

import (
	"errors"
	"fmt"
	"reflect"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"

	"github.com/BurntSushi/toml"

	"finmarch/airflow/calibrate"
	"finmarch/airflow/cylinder"
	"finmarch/airflow/transient"
	"finmarch/airflow/uncertainty"
	"finmarch/fins"
	"finmarch/materials"
)

// File mirrors the design file. Quantities are Q values in SI.
type File struct {
	Name        string            `toml:"name"`
	Segments    int               `toml:"segments"`
	Cylinder    CylinderT         `toml:"cylinder"`
	Head        FinSetT           `toml:"head"`
	Barrel      FinSetT           `toml:"barrel"`
	Air         AirT              `toml:"air"`
	Load        LoadT             `toml:"load"`
	Limits      LimitsT           `toml:"limits"`
	Override    OverrideT         `toml:"override"`
	Uncertainty UncertaintyT      `toml:"uncertainty"`
	Calibration CalibrationT      `toml:"calibration"`
	Measurement []MeasurementT    `toml:"measurement"`
	Ride        RideT             `toml:"ride"`
	Cooling     CoolingT          `toml:"cooling"`
	FanPoint    []FanPointT       `toml:"fan_point"`
	Alloys      map[string]AlloyT `toml:"alloys"`
}

// CylinderT is the [cylinder] table.
type CylinderT struct {
	Tilt           Q[Angle]  `toml:"tilt"`
	HeadDiameter   Q[Length] `toml:"head_diameter"`
	HeadLength     Q[Length] `toml:"head_length"`
	BarrelDiameter Q[Length] `toml:"barrel_diameter"`
	BarrelLength   Q[Length] `toml:"barrel_length"`
	Casting        string    `toml:"casting"`
}

// FinSetT is a [head] or [barrel] table.
type FinSetT struct {
	Style         string      `toml:"style"`
	Count         int         `toml:"count"`
	Pitch         Q[Length]   `toml:"pitch"`
	Height        Q[Length]   `toml:"height"`
	RootThickness Q[Length]   `toml:"root_thickness"`
	TipThickness  Q[Length]   `toml:"tip_thickness"`
	Alloy         string      `toml:"alloy"`
	Casting       string      `toml:"casting"` // this set's own process, over cylinder.casting
	Finish        string      `toml:"finish"`
	Emissivity    Q[Fraction] `toml:"emissivity"`
}

// AirT is the [air] table.
type AirT struct {
	Speed            Q[Speed]       `toml:"speed"`
	PressureRecovery Q[Fraction]    `toml:"pressure_recovery"`
	Ambient          Q[Temperature] `toml:"ambient"`
	Altitude         Q[Length]      `toml:"altitude"`
	Pressure         Q[Pressure]    `toml:"pressure"`
	Method           string         `toml:"method"` // the air-side method; "" or "auto": the configuration's default
}

// LoadT is the [load] table: either head_heat and barrel_heat, or the road
// load.
type LoadT struct {
	HeadHeat            Q[Power]    `toml:"head_heat"`
	BarrelHeat          Q[Power]    `toml:"barrel_heat"`
	Mass                Q[Mass]     `toml:"mass"`
	CdA                 Q[Area]     `toml:"cda"`
	RollingResistance   Q[Fraction] `toml:"rolling_resistance"`
	DrivelineEfficiency Q[Fraction] `toml:"driveline_efficiency"`
	ThermalEfficiency   Q[Fraction] `toml:"thermal_efficiency"`
	CoolingShare        Q[Fraction] `toml:"cooling_share"`
	HeadShare           Q[Fraction] `toml:"head_share"`
	Cylinders           int         `toml:"cylinders"`
	Grade               Q[Percent]  `toml:"grade"`
	ExtraPower          Q[Power]    `toml:"extra_power"`
	RatedPower          Q[Power]    `toml:"rated_power"`
	TopGearSpeed        Q[Speed]    `toml:"top_gear_speed"`
	IdleHeat            Q[Power]    `toml:"idle_heat"`
}

// LimitsT is the [limits] table.
type LimitsT struct {
	Head   Q[Temperature] `toml:"head"`
	Barrel Q[Temperature] `toml:"barrel"`
}

// OverrideT is the [override] table for measured values.
type OverrideT struct {
	H          Q[HCoef]       `toml:"h"`
	HeadWall   Q[Temperature] `toml:"head_wall"`
	BarrelWall Q[Temperature] `toml:"barrel_wall"`
}

// UncertaintyT is the [uncertainty] table: the band's sample count and
// seed, and the half-widths of the uncertain inputs (absolute for the
// recovery, the head share and the emissivity; fractions for the rest).
type UncertaintyT struct {
	Samples           int         `toml:"samples"`
	Seed              int         `toml:"seed"`
	PressureRecovery  Q[Fraction] `toml:"pressure_recovery"`
	CoolingShare      Q[Fraction] `toml:"cooling_share"`
	ThermalEfficiency Q[Fraction] `toml:"thermal_efficiency"`
	HeadShare         Q[Fraction] `toml:"head_share"`
	ForcedConvection  Q[Fraction] `toml:"forced_convection"`
	NaturalConvection Q[Fraction] `toml:"natural_convection"`
	Conductivity      Q[Fraction] `toml:"conductivity"`
	Emissivity        Q[Fraction] `toml:"emissivity"`
	Methods           *bool       `toml:"methods"` // draw the air-side method among those that apply (default true)
}

// CalibrationT is the [calibration] table: factors fitted to measurements
// by 'finmarch calibrate' (1 when absent).
type CalibrationT struct {
	ForcedConvectionFactor Q[Fraction] `toml:"forced_convection_factor"`
	HeatLoadFactor         Q[Fraction] `toml:"heat_load_factor"`
}

// MeasurementT is one [[measurement]]: a wall temperature measured on the
// running engine, for 'finmarch calibrate'.
type MeasurementT struct {
	Speed    Q[Speed]       `toml:"speed"`
	Ambient  Q[Temperature] `toml:"ambient"`
	Altitude Q[Length]      `toml:"altitude"`
	Head     Q[Temperature] `toml:"head"`
	Barrel   Q[Temperature] `toml:"barrel"`
	Place    string         `toml:"place"`
	Offset   Q[TempDiff]    `toml:"offset"`
	Sigma    Q[TempDiff]    `toml:"uncertainty"`
	// OffsetSigma is the offset's own uncertainty (default: half the
	// offset, calibrate.OffsetShare)
	OffsetSigma Q[TempDiff] `toml:"offset_uncertainty"`
}

// AlloyT is one [alloys.NAME] table: a custom alloy.
type AlloyT struct {
	Conductivity      Q[Conductivity] `toml:"conductivity"`
	Density           Q[Density]      `toml:"density"`
	SpecificHeat      Q[SpecificHeat] `toml:"specific_heat"`
	Emissivity        Q[Fraction]     `toml:"emissivity"`
	EmissivityPainted Q[Fraction]     `toml:"emissivity_painted"`
	MaxService        Q[Temperature]  `toml:"max_service"`
}

// Design is a checked design, ready for the physics.
type Design struct {
	Name        string
	Source      string
	Case        cylinder.Case
	Run         cylinder.Settings // segments; the command line adds caches and totals-only per use
	Load        cylinder.Load
	Casting     fins.Process      // the process the fins are made by (cylinder.casting); every command checks them against its limits
	SetCasting  [2]fins.Process   // each set's process, head and barrel: its own casting key, else Casting
	SetCastKey  [2]bool           // the set's own casting key was given
	Band        BandSpec          // the uncertainty band's samples, seed and spread
	Points      []calibrate.Point // the design's [[measurement]]s
	Metal       transient.Metal   // the [ride] masses and link (zero: the estimates)
	HeadLimit   float64           // K
	BarrelLimit float64           // K
	Altitude    float64           // m (0 when the pressure was given)
	WallFixed   bool
	HeadWall    float64  // K
	BarrelWall  float64  // K
	Defaults    []string // defaults applied, for the report

	file        *File // the decoded file, for With
	md          toml.MetaData
	loc         locator
	segOverride bool
}

// OverrideSegments sets the march segments from the command line; designs
// derived by With keep it.
func (d *Design) OverrideSegments(n int) {
	d.Run.Segments = n
	d.segOverride = true
}

// BandSpec is how a design's uncertainty band is sampled.
type BandSpec struct {
	Samples int                // 0: no band
	Seed    uint64             //
	Spread  uncertainty.Spread // half-widths of the uncertain inputs
}

// Cylinder is the design as the estimator takes it: the case, the load,
// the limits and any fixed walls.
func (d *Design) Cylinder() cylinder.Design {
	cd := cylinder.Design{Case: d.Case, Load: d.Load, Limits: cylinder.Limits{Head: d.HeadLimit, Barrel: d.BarrelLimit}, Process: d.CastingOf(0), BarrelProcess: d.CastingOf(1)}
	if d.WallFixed {
		cd.Walls = &[2]float64{d.HeadWall, d.BarrelWall}
	}
	return cd
}

// Heat returns the heat load at speed v (m/s) in the design's air.
func (d *Design) Heat(v float64) (cylinder.HeatLoad, error) {
	c := d.Case
	c.Speed = v
	return d.Load.At(c)
}

// Error is one problem in a design file.
type Error struct {
	File string
	Line int // 0 when unknown
	Key  string
	Msg  string
}

func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
	}
	b.WriteString(": ")
	if e.Key != "" {
		b.WriteString(e.Key + ": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}

// Errors is the list of problems found in one file.
type Errors []*Error

func (es Errors) Error() string {
	s := make([]string, len(es))
	for i, e := range es {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

var lineKeyRe = regexp.MustCompile(`^toml: line (\d+)(?: \(last key "([^"]*)"\))?: (.*)$`)

// MaxFileSize is the largest design file accepted (design files are a few
// kilobytes; this stops a mistaken path to a huge file early).
const MaxFileSize = 1 << 20

// TooLarge is the error for a design file of size bytes, over MaxFileSize.
func TooLarge(name string, size int64) error {
	return Errors{{File: name, Msg: fmt.Sprintf("file is %d bytes; a design file is at most %d bytes", size, MaxFileSize)}}
}

// Parse reads a design file. name is used in messages.
func Parse(src []byte, name string) (*Design, error) {
	if len(src) > MaxFileSize {
		return nil, TooLarge(name, int64(len(src)))
	}
	if strings.TrimSpace(string(src)) == "" {
		return nil, Errors{{File: name, Msg: "file is empty; write a starter design with `finmarch new design.toml`"}}
	}
	if line, msg := textProblem(src); line > 0 {
		return nil, Errors{{File: name, Line: line, Msg: msg}}
	}
	var f File
	md, err := toml.Decode(string(src), &f)
	if err != nil {
		return nil, Errors{decodeError(err, name, src)}
	}
	loc := locate(string(src))
	var errs Errors
	add := func(key, format string, a ...any) {
		errs = append(errs, &Error{File: name, Line: loc.line(key), Key: key, Msg: fmt.Sprintf(format, a...)})
	}
	undecoded := md.Undecoded()
	for _, k := range undecoded {
		key := k.String()
		// an unknown table is reported once, at the table, not once per
		// key under it (each key's "did you mean" would point elsewhere)
		under, inside := 0, false
		for _, o := range undecoded {
			switch {
			case len(o) > len(k) && o[:len(k)].String() == key:
				under++
			case len(o) < len(k) && k[:len(o)].String() == o.String() && (md.Type(o...) == "Hash" || md.Type(o...) == "ArrayHash"):
				inside = true
			}
		}
		if inside {
			continue
		}
		if t := md.Type(k...); t == "Hash" || t == "ArrayHash" {
			brackets := map[bool][2]string{false: {"[", "]"}, true: {"[[", "]]"}}[t == "ArrayHash"]
			msg := "unknown table " + brackets[0] + key + brackets[1]
			if s := suggestKey(k); s != "" && isTable(s) {
				msg += ": did you mean [" + s + "]?"
			} else if s != "" {
				msg += fmt.Sprintf(": did you mean %q?", s)
			}
			if under > 0 {
				msg += fmt.Sprintf(" (%s not read: an unknown key is an error, never ignored)", map[bool]string{true: "its 1 key is", false: fmt.Sprintf("its %d keys are", under)}[under == 1])
			}
			add(key, "%s", msg)
			continue
		}
		msg := "unknown key"
		if s := suggestKey(k); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		add(key, "%s", msg)
	}
	if len(errs) > 0 {
		return nil, errs
	}
	checkStrings(&f, add)
	d := build(&f, md, name, add)
	if len(errs) > 0 {
		sort.SliceStable(errs, func(i, j int) bool { return errs[i].Line < errs[j].Line })
		return nil, errs
	}
	d.file, d.md, d.loc = &f, md, loc
	return d, nil
}

// checkStrings refuses control characters in the design's strings (a
// terminal escape in a shared design's name could hide "OVER LIMIT").
func checkStrings(f *File, add func(key, format string, a ...any)) {
	check := func(key, s string) {
		if r := controlChar(s); r >= 0 {
			add(key, "holds the control character U+%04X; names and words in a design are plain text", r)
		}
	}
	check("name", f.Name)
	for _, t := range []struct {
		tbl string
		s   FinSetT
	}{{"head", f.Head}, {"barrel", f.Barrel}} {
		check(t.tbl+".style", t.s.Style)
		check(t.tbl+".alloy", t.s.Alloy)
		check(t.tbl+".finish", t.s.Finish)
	}
	for n := range f.Alloys {
		if r := controlChar(n); r >= 0 {
			add("alloys", "an alloy name holds the control character U+%04X; names are plain text", r)
		}
	}
}

func decodeError(err error, name string, src []byte) *Error {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		msg := pe.Message
		if pe.Usage != "" {
			msg += "; " + strings.TrimSpace(pe.Usage)
		}
		// a bad table header: the line as written, not the parser's last
		// good key (it was reported under the table before it)
		lines := strings.Split(string(src), "\n")
		l := pe.Position.Line
		if strings.Contains(msg, "table name") {
			// an unclosed header is found on the line after it: back to
			// the nearest line that opens a header
			for k := min(l, len(lines)); k >= 1; k-- {
				if strings.HasPrefix(strings.TrimSpace(lines[k-1]), "[") {
					l = k
					break
				}
			}
		}
		if l >= 1 && l <= len(lines) {
			if text := strings.TrimSpace(strings.TrimSuffix(lines[l-1], "\r")); strings.HasPrefix(text, "[") && len(text) <= 120 {
				return &Error{File: name, Line: l, Msg: fmt.Sprintf("%s (the table header reads %q)", msg, text)}
			}
		}
		return &Error{File: name, Line: pe.Position.Line, Key: pe.LastKey, Msg: msg}
	}
	if m := lineKeyRe.FindStringSubmatch(err.Error()); m != nil {
		line, _ := strconv.Atoi(m[1])
		msg := m[3]
		msg = strings.Replace(msg, "incompatible types: TOML value has type ", "wrong type: the file has a ", 1)
		msg = strings.Replace(msg, "; destination has type ", " where this key takes a ", 1)
		// in the trade's words, not Go's type names
		field := m[2][strings.LastIndex(m[2], ".")+1:]
		for _, r := range [][2]string{{"a float64 where this key takes a integer", "a number with a fraction where this key takes a whole number (write it without a decimal point, e.g. " + field + " = 8)"},
			{"a string where this key takes a integer", "a string where this key takes a whole number (write it bare, e.g. " + field + " = 8)"},
			{"a float64 where this key takes a string", "a number where this key takes a quoted name"},
			{"a int64 where this key takes a string", "a number where this key takes a quoted name"},
			{"a bool where", "true or false where"}, {"where this key takes a integer", "where this key takes a whole number"},
			{"where this key takes a string", "where this key takes a quoted name"}, {"the file has a float64", "the file has a number"},
			{"the file has a int64", "the file has a whole number"}} {
			msg = strings.Replace(msg, r[0], r[1], 1)
		}
		return &Error{File: name, Line: line, Key: m[2], Msg: msg}
	}
	return &Error{File: name, Msg: err.Error()}
}

// schema lists the known keys per table from the struct tags, for the
// "did you mean" of unknown keys.
func schema() map[string][]string {
	out := map[string][]string{}
	var walk func(prefix string, t reflect.Type)
	walk = func(prefix string, t reflect.Type) {
		for i := 0; i < t.NumField(); i++ {
			f := t.Field(i)
			tag := f.Tag.Get("toml")
			if tag == "" || tag == "-" {
				continue
			}
			out[prefix] = append(out[prefix], tag)
			ft := f.Type
			if ft.Kind() == reflect.Struct && !strings.HasPrefix(ft.Name(), "Q[") {
				walk(strings.TrimPrefix(prefix+"."+tag, "."), ft)
			}
			if ft.Kind() == reflect.Map {
				walk(strings.TrimPrefix(prefix+"."+tag+".*", "."), ft.Elem())
			}
		}
	}
	walk("", reflect.TypeOf(File{}))
	return out
}

// isTable reports whether a dotted key names a table of the schema.
func isTable(key string) bool {
	_, ok := schema()[key]
	return ok
}

func suggestKey(k toml.Key) string {
	if len(k) == 0 {
		return ""
	}
	parent := strings.Join(k[:len(k)-1], ".")
	if len(k) >= 3 && k[0] == "alloys" {
		parent = "alloys.*"
	}
	leaf := k[len(k)-1]
	sc := schema()
	best, bd := "", 1<<30
	for _, cand := range sc[parent] {
		if d := materials.Distance(strings.ToLower(leaf), cand); d < bd {
			best, bd = cand, d
		}
	}
	// a key placed in the wrong table: the first table that has it, in
	// sorted order with the top level last (its entries are tables, not
	// values), so that the suggestion is the same on every run
	if bd > 2 {
		tables := make([]string, 0, len(sc))
		for tbl := range sc {
			tables = append(tables, tbl)
		}
		sort.Slice(tables, func(i, j int) bool {
			if (tables[i] == "") != (tables[j] == "") {
				return tables[j] == ""
			}
			return tables[i] < tables[j]
		})
		for _, tbl := range tables {
			for _, cand := range sc[tbl] {
				if cand == leaf && tbl != parent && !strings.Contains(tbl, "*") {
					return strings.TrimPrefix(tbl+"."+cand, ".")
				}
			}
		}
	}
	if bd <= max(2, len(leaf)/3) {
		if parent == "" {
			return best
		}
		return strings.Replace(parent, "*", k[1], 1) + "." + best
	}
	return ""
}

// rng checks that v (SI) lies in [lo, hi] and reports the range in the
// user's display unit.
type rangeCheck struct {
	key    string
	v      float64
	lo, hi float64
	unit   string  // display unit
	scale  float64 // SI per display unit
	offset float64
	set    bool
	bare   bool
}

func (r rangeCheck) show(v float64) string {
	return strconv.FormatFloat((v-r.offset)/r.scale, 'g', 5, 64)
}

func rangeText(r rangeCheck) string {
	u := r.unit
	if u != "" {
		u = " " + u
	}
	return fmt.Sprintf("%s to %s%s", r.show(r.lo), r.show(r.hi), u)
}

func unitHint(key string) string {
	switch {
	case strings.HasSuffix(key, "ambient") || strings.HasPrefix(key, "limits.") || strings.HasSuffix(key, "_wall"):
		return dimTemp.hint
	case key == "cylinder.tilt":
		return dimAngle.hint
	}
	return ""
}

func baseName(p string) string {
	if i := strings.LastIndexAny(p, `/\`); i >= 0 {
		return p[i+1:]
	}
	return p
}

// setKey returns tbl + "." + field, from a table for the two fin sets so
// that building a design variant does not allocate its key names.
func setKey(tbl, field string) string {
	if k, ok := setKeys[[2]string{tbl, field}]; ok {
		return k
	}
	return tbl + "." + field
}

var setKeys = func() map[[2]string]string {
	m := map[[2]string]string{}
	for _, t := range []string{"head", "barrel"} {
		for _, f := range []string{"style", "count", "pitch", "height", "root_thickness", "tip_thickness", "alloy", "finish", "emissivity"} {
			m[[2]string{t, f}] = t + "." + f
		}
	}
	return m
}()

// defaultText returns "key: what" for the list of defaults applied, kept
// once per pair (nearly all are fixed texts; at most 1024 are kept).
func defaultText(key, what string) string {
	k := [2]string{key, what}
	if s, ok := defaultTexts.Load(k); ok {
		return s.(string)
	}
	s := key + ": " + what
	if defaultCount.Add(1) <= 1024 {
		defaultTexts.Store(k, s)
	}
	return s
}

var (
	defaultTexts sync.Map
	defaultCount atomic.Int64
)

// CastingOf returns the process the fins of set i (0 head, 1 barrel) are
// made by: the set's own casting key, else cylinder.casting.
func (d *Design) CastingOf(i int) fins.Process {
	if d.SetCasting[i].Name != "" {
		return d.SetCasting[i]
	}
	return d.Casting
}

// OneCasting reports whether both fin sets are made by one process.
func (d *Design) OneCasting() bool { return d.CastingOf(0).Name == d.CastingOf(1).Name }
