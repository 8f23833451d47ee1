package design

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"

	"github.com/BurntSushi/toml"

	"finmarch/airflow"
	"finmarch/airflow/cylinder"
	"finmarch/fins"
	"finmarch/materials"
)

// File mirrors the design file. Quantities are Q values in SI.
type File struct {
	Name     string            `toml:"name"`
	Segments int               `toml:"segments"`
	Cylinder CylinderT         `toml:"cylinder"`
	Head     FinSetT           `toml:"head"`
	Barrel   FinSetT           `toml:"barrel"`
	Air      AirT              `toml:"air"`
	Load     LoadT             `toml:"load"`
	Limits   LimitsT           `toml:"limits"`
	Override OverrideT         `toml:"override"`
	Alloys   map[string]AlloyT `toml:"alloys"`
}

// CylinderT is the [cylinder] table.
type CylinderT struct {
	Tilt           Q[Angle]  `toml:"tilt"`
	HeadDiameter   Q[Length] `toml:"head_diameter"`
	HeadLength     Q[Length] `toml:"head_length"`
	BarrelDiameter Q[Length] `toml:"barrel_diameter"`
	BarrelLength   Q[Length] `toml:"barrel_length"`
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
	HeadLimit   float64 // K
	BarrelLimit float64 // K
	Altitude    float64 // m (0 when the pressure was given)
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

// Cylinder is the design as the estimator takes it: the case, the load,
// the limits and any fixed walls.
func (d *Design) Cylinder() cylinder.Design {
	cd := cylinder.Design{Case: d.Case, Load: d.Load, Limits: cylinder.Limits{Head: d.HeadLimit, Barrel: d.BarrelLimit}}
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

// Parse reads a design file. name is used in messages.
func Parse(src []byte, name string) (*Design, error) {
	if len(src) > MaxFileSize {
		return nil, Errors{{File: name, Msg: fmt.Sprintf("file is %d bytes; a design file is at most %d bytes", len(src), MaxFileSize)}}
	}
	if strings.TrimSpace(string(src)) == "" {
		return nil, Errors{{File: name, Msg: "file is empty; write a starter design with `finmarch new design.toml`"}}
	}
	if !isText(src) {
		return nil, Errors{{File: name, Msg: "file is not text (binary data or an unknown encoding); a design file is UTF-8 TOML"}}
	}
	var f File
	md, err := toml.Decode(string(src), &f)
	if err != nil {
		return nil, Errors{decodeError(err, name)}
	}
	loc := locate(string(src))
	var errs Errors
	add := func(key, format string, a ...any) {
		errs = append(errs, &Error{File: name, Line: loc.line(key), Key: key, Msg: fmt.Sprintf(format, a...)})
	}
	for _, k := range md.Undecoded() {
		key := k.String()
		msg := "unknown key"
		if s := suggestKey(k); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		add(key, "%s", msg)
	}
	if len(errs) > 0 {
		return nil, errs
	}
	d := build(&f, md, name, add)
	if len(errs) > 0 {
		sort.SliceStable(errs, func(i, j int) bool { return errs[i].Line < errs[j].Line })
		return nil, errs
	}
	d.file, d.md, d.loc = &f, md, loc
	return d, nil
}

func isText(b []byte) bool {
	if strings.ContainsRune(string(b), 0) {
		return false
	}
	s := string(b)
	bad := 0
	for _, r := range s {
		if r == '\uFFFD' || (r < 32 && r != '\n' && r != '\r' && r != '\t') {
			bad++
		}
	}
	return bad == 0
}

func decodeError(err error, name string) *Error {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		msg := pe.Message
		if pe.Usage != "" {
			msg += "; " + strings.TrimSpace(pe.Usage)
		}
		return &Error{File: name, Line: pe.Position.Line, Key: pe.LastKey, Msg: msg}
	}
	if m := lineKeyRe.FindStringSubmatch(err.Error()); m != nil {
		line, _ := strconv.Atoi(m[1])
		msg := m[3]
		msg = strings.Replace(msg, "incompatible types: TOML value has type ", "wrong type: the file has a ", 1)
		msg = strings.Replace(msg, "; destination has type ", " where this key takes a ", 1)
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
	// a key placed in the wrong table
	if bd > 2 {
		for tbl, keys := range sc {
			for _, cand := range keys {
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

// locator maps dotted keys to their line in the source.
type locator map[string]int

func (l locator) line(key string) int {
	for k := key; k != ""; {
		if n, ok := l[k]; ok {
			return n
		}
		i := strings.LastIndex(k, ".")
		if i < 0 {
			break
		}
		k = k[:i]
	}
	return 0
}

func locate(src string) locator {
	l := locator{}
	table := ""
	for i, raw := range strings.Split(src, "\n") {
		s := strings.TrimSpace(raw)
		if s == "" || s[0] == '#' {
			continue
		}
		if strings.HasPrefix(s, "[") {
			end := strings.Index(s, "]")
			if end > 0 {
				table = strings.Trim(strings.TrimSpace(s[1:end]), "[] ")
				table = strings.ReplaceAll(table, "\"", "")
				table = strings.ReplaceAll(table, " ", "")
				if _, ok := l[table]; !ok {
					l[table] = i + 1
				}
			}
			continue
		}
		if eq := strings.Index(s, "="); eq > 0 {
			key := strings.Trim(strings.TrimSpace(s[:eq]), "\"'")
			full := key
			if table != "" {
				full = table + "." + key
			}
			if _, ok := l[full]; !ok {
				l[full] = i + 1
			}
		}
	}
	return l
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

func build(f *File, md toml.MetaData, name string, add func(key, format string, a ...any)) *Design {
	d := &Design{Name: strings.TrimSpace(f.Name), Source: name}
	if d.Name == "" {
		d.Name = strings.TrimSuffix(baseName(name), ".toml")
		d.Defaults = append(d.Defaults, "name: taken from the file name")
	}
	def := func(key, what string) { d.Defaults = append(d.Defaults, defaultText(key, what)) }
	checks := make([]rangeCheck, 0, 48)
	type quantity = rawQ
	need := func(key string, q quantity, set bool, lo, hi float64, unit string, scale, offset float64) float64 {
		checks = append(checks, rangeCheck{key: key, v: q.Or(math.NaN()), lo: lo, hi: hi, unit: unit, scale: scale, offset: offset, set: set, bare: q.IsBare()})
		return q.Or(math.NaN())
	}
	opt := func(key string, q quantity, set bool, dflt, lo, hi float64, unit string, scale, offset float64, why string) float64 {
		if !set {
			def(key, why)
			return dflt
		}
		checks = append(checks, rangeCheck{key: key, v: q.Or(dflt), lo: lo, hi: hi, unit: unit, scale: scale, offset: offset, set: true, bare: q.IsBare()})
		return q.Or(dflt)
	}
	const mm, C = 1e-3, 273.15

	c := &d.Case
	c.Tilt = opt("cylinder.tilt", f.Cylinder.Tilt.raw(), f.Cylinder.Tilt.Set, 0, 0, math.Pi/2+1e-12, "deg", math.Pi/180, 0, "0 deg (upright)")
	hd := need("cylinder.head_diameter", f.Cylinder.HeadDiameter.raw(), f.Cylinder.HeadDiameter.Set, 20*mm, 400*mm, "mm", mm, 0)
	hl := need("cylinder.head_length", f.Cylinder.HeadLength.raw(), f.Cylinder.HeadLength.Set, 5*mm, 500*mm, "mm", mm, 0)
	bd := need("cylinder.barrel_diameter", f.Cylinder.BarrelDiameter.raw(), f.Cylinder.BarrelDiameter.Set, 20*mm, 400*mm, "mm", mm, 0)
	bl := need("cylinder.barrel_length", f.Cylinder.BarrelLength.raw(), f.Cylinder.BarrelLength.Set, 5*mm, 500*mm, "mm", mm, 0)

	alloyOf := func(key, n string) (materials.Alloy, bool) {
		if strings.TrimSpace(n) == "" {
			add(key, "missing: name an alloy (%s) or define one under [alloys.NAME]", strings.Join(materials.Names(), ", "))
			return materials.Alloy{}, false
		}
		if ca, ok := f.Alloys[n]; ok {
			base := "alloys." + n
			for _, k := range []struct {
				k   string
				set bool
			}{{"conductivity", ca.Conductivity.Set}, {"density", ca.Density.Set}, {"specific_heat", ca.SpecificHeat.Set}} {
				if !k.set {
					add(base+"."+k.k, "missing for the custom alloy %q", n)
				}
			}
			a, err := materials.Custom(n, ca.Conductivity.Or(0), ca.Density.Or(0), ca.SpecificHeat.Or(0),
				ca.Emissivity.Or(0.2), ca.EmissivityPainted.Or(0.9), ca.MaxService.Or(250+C), nil)
			if err != nil {
				if ca.Conductivity.Set && ca.Density.Set && ca.SpecificHeat.Set {
					msg := err.Error()
					k := base
					for _, field := range []string{"conductivity", "density", "specific_heat", "emissivity_painted", "emissivity", "max_service"} {
						if strings.Contains(msg, ": "+field+" ") {
							k = base + "." + field
							break
						}
					}
					add(k, "%s", strings.TrimPrefix(msg, fmt.Sprintf("custom alloy %q: ", n)))
				}
				return materials.Alloy{}, false
			}
			return a, true
		}
		a, err := materials.Lookup(n)
		if err != nil {
			msg := strings.TrimPrefix(err.Error(), materials.ErrUnknown.Error()+": ")
			add(key, "%s, or define it under [alloys.%s]", msg, n)
			return materials.Alloy{}, false
		}
		return a, true
	}

	finSet := func(tbl string, t FinSetT, dia, length float64) cylinder.FinSet {
		key := func(field string) string { return setKey(tbl, field) }
		fs := cylinder.FinSet{Name: tbl}
		if !md.IsDefined(tbl) {
			add(tbl, "missing table [%s]: the %s fin set (style, count, pitch, height, root_thickness, alloy)", tbl, tbl)
			return fs
		}
		s := &fs.Set
		switch strings.ToLower(strings.TrimSpace(t.Style)) {
		case "annular", "ring", "rings":
			s.Style = fins.StyleAnnular
		case "longitudinal", "axial":
			s.Style = fins.StyleLongitudinal
		case "":
			add(key("style"), `missing: "annular" (rings around the cylinder) or "longitudinal" (plates along the axis)`)
		default:
			add(key("style"), `%q is not a fin style; use "annular" or "longitudinal"`, t.Style)
		}
		if !md.IsDefined(tbl, "count") {
			add(key("count"), "missing: the number of fins (a whole number)")
		} else if t.Count < 1 || t.Count > 400 {
			add(key("count"), "%d fins; allowed 1 to 400", t.Count)
		}
		s.Count = t.Count
		s.Pitch = need(key("pitch"), t.Pitch.raw(), t.Pitch.Set, 1*mm, 60*mm, "mm", mm, 0)
		s.Height = need(key("height"), t.Height.raw(), t.Height.Set, 2*mm, 150*mm, "mm", mm, 0)
		s.RootThickness = need(key("root_thickness"), t.RootThickness.raw(), t.RootThickness.Set, 0.3*mm, 25*mm, "mm", mm, 0)
		s.TipThickness = opt(key("tip_thickness"), t.TipThickness.raw(), t.TipThickness.Set, s.RootThickness, 0, 25*mm, "mm", mm, 0, "equal to root_thickness (no taper)")
		s.RootDiameter, s.Length = dia, length
		if a, ok := alloyOf(key("alloy"), t.Alloy); ok {
			fs.Alloy = a
		}
		fin := materials.AsCast
		switch strings.ToLower(strings.TrimSpace(t.Finish)) {
		case "", "as-cast", "ascast", "bare":
			if t.Finish == "" && !t.Emissivity.Set {
				def(key("finish"), "as-cast")
			}
		case "painted", "black", "painted-black":
			fin = materials.Painted
		default:
			add(key("finish"), `%q is not a finish; use "as-cast" or "painted" (or give emissivity)`, t.Finish)
		}
		fs.Emissivity = fs.Alloy.Emissivity(fin)
		if t.Emissivity.Set {
			fs.Emissivity = opt(key("emissivity"), t.Emissivity.raw(), true, 0, 0.01, 1, "", 1, 0, "")
		}
		return fs
	}
	c.Head = finSet("head", f.Head, hd, hl)
	c.Barrel = finSet("barrel", f.Barrel, bd, bl)

	// air
	c.Speed = need("air.speed", f.Air.Speed.raw(), f.Air.Speed.Set, 0, 400/3.6, "km/h", 1/3.6, 0)
	c.Recovery = opt("air.pressure_recovery", f.Air.PressureRecovery.raw(), f.Air.PressureRecovery.Set, cylinder.DefaultRecovery, 0.05, 1, "", 1, 0,
		"0.5 (common practice for an uncowled cylinder; calibrate against a measured head temperature)")
	c.Ambient = need("air.ambient", f.Air.Ambient.raw(), f.Air.Ambient.Set, -50+C, 60+C, "C", 1, C)
	if f.Air.Pressure.Set && f.Air.Altitude.Set {
		add("air.pressure", "give altitude or pressure, not both")
	}
	if f.Air.Pressure.Set {
		c.Pressure = opt("air.pressure", f.Air.Pressure.raw(), true, 0, 30e3, 110e3, "kPa", 1e3, 0, "")
	} else {
		d.Altitude = opt("air.altitude", f.Air.Altitude.raw(), f.Air.Altitude.Set, 0, -500, 6000, "m", 1, 0, "0 m (sea level, ISA pressure)")
		c.Pressure = airflow.ISA(d.Altitude, nil).P
	}
	if f.Segments != 0 || md.IsDefined("segments") {
		if f.Segments < 1 || f.Segments > 10000 {
			add("segments", "%d; allowed 1 to 10000", f.Segments)
		}
		d.Run.Segments = f.Segments
	} else {
		d.Run.Segments = cylinder.DefaultSegments
	}

	// load
	l := f.Load
	if !md.IsDefined("load") {
		add("load", "missing table [load]: give head_heat and barrel_heat, or the road load (mass, cda)")
	} else if l.HeadHeat.Set || l.BarrelHeat.Set {
		d.Load.Direct = true
		d.Load.Given.Head = need("load.head_heat", l.HeadHeat.raw(), l.HeadHeat.Set, 0, 50e3, "kW", 1e3, 0)
		d.Load.Given.Barrel = need("load.barrel_heat", l.BarrelHeat.raw(), l.BarrelHeat.Set, 0, 50e3, "kW", 1e3, 0)
		for _, k := range []struct {
			k   string
			set bool
		}{{"mass", l.Mass.Set}, {"cda", l.CdA.Set}, {"thermal_efficiency", l.ThermalEfficiency.Set}, {"cooling_share", l.CoolingShare.Set}} {
			if k.set {
				add("load."+k.k, "not used when head_heat and barrel_heat are given; remove one way of giving the load")
			}
		}
	} else {
		r := &d.Load.Road
		r.Mass = need("load.mass", l.Mass.raw(), l.Mass.Set, 30, 5000, "kg", 1, 0)
		r.CdA = need("load.cda", l.CdA.raw(), l.CdA.Set, 0.05, 5, "m2", 1, 0)
		r.Crr = opt("load.rolling_resistance", l.RollingResistance.raw(), l.RollingResistance.Set, cylinder.DefaultCrr, 0.002, 0.1, "", 1, 0, "0.02 (common practice, road tyre on asphalt)")
		r.Driveline = opt("load.driveline_efficiency", l.DrivelineEfficiency.raw(), l.DrivelineEfficiency.Set, cylinder.DefaultDriveline, 0.5, 1, "", 1, 0, "0.90 (common practice, chain or belt drive)")
		r.Thermal = opt("load.thermal_efficiency", l.ThermalEfficiency.raw(), l.ThermalEfficiency.Set, cylinder.DefaultThermal, 0.1, 0.45, "", 1, 0, "0.25 (Heywood 1988, part-load SI; from memory)")
		r.CoolShare = opt("load.cooling_share", l.CoolingShare.raw(), l.CoolingShare.Set, cylinder.DefaultCoolShare, 0.05, 0.6, "", 1, 0, "0.22 (Heywood 1988 Table 12.1; from memory)")
		r.HeadShare = opt("load.head_share", l.HeadShare.raw(), l.HeadShare.Set, cylinder.DefaultHeadShare, 0.05, 1, "", 1, 0, "0.65 (common practice)")
		r.GradePct = opt("load.grade", l.Grade.raw(), l.Grade.Set, 0, -20, 20, "%", 1, 0, "0 % (level road)")
		if l.IdleHeat.Set {
			r.IdleHeat = opt("load.idle_heat", l.IdleHeat.raw(), true, 0, 0, 20e3, "kW", 1e3, 0, "")
		}
		r.ExtraPowerW = opt("load.extra_power", l.ExtraPower.raw(), l.ExtraPower.Set, 0, 0, 100e3, "kW", 1e3, 0, "0 W")
		r.Cylinders = 1
		if md.IsDefined("load", "cylinders") {
			if l.Cylinders < 1 || l.Cylinders > 16 {
				add("load.cylinders", "%d; allowed 1 to 16", l.Cylinders)
			}
			r.Cylinders = l.Cylinders
		} else {
			def("load.cylinders", "1")
		}
	}

	// limits and overrides
	var headWhy, barrelWhy string // built only when the default applies
	if !f.Limits.Head.Set {
		headWhy = fmt.Sprintf("the head alloy's maximum service temperature, %.0f C (%s)", c.Head.Alloy.MaxService-C, c.Head.Alloy.LimitSource)
	}
	if !f.Limits.Barrel.Set {
		barrelWhy = fmt.Sprintf("the barrel alloy's maximum service temperature, %.0f C", c.Barrel.Alloy.MaxService-C)
	}
	d.HeadLimit = opt("limits.head", f.Limits.Head.raw(), f.Limits.Head.Set, c.Head.Alloy.MaxService, 60+C, 450+C, "C", 1, C, headWhy)
	d.BarrelLimit = opt("limits.barrel", f.Limits.Barrel.raw(), f.Limits.Barrel.Set, c.Barrel.Alloy.MaxService, 60+C, 450+C, "C", 1, C, barrelWhy)
	if f.Override.H.Set {
		c.FixedH = opt("override.h", f.Override.H.raw(), true, 0, 1, 2000, "W/m2K", 1, 0, "")
	}
	if f.Override.HeadWall.Set || f.Override.BarrelWall.Set {
		d.WallFixed = true
		d.HeadWall = need("override.head_wall", f.Override.HeadWall.raw(), f.Override.HeadWall.Set, 0+C, 500+C, "C", 1, C)
		d.BarrelWall = need("override.barrel_wall", f.Override.BarrelWall.raw(), f.Override.BarrelWall.Set, 0+C, 500+C, "C", 1, C)
	}

	for _, r := range checks {
		switch {
		case !r.set:
			add(r.key, "missing (%s)", rangeText(r))
		case math.IsNaN(r.v) || r.v < r.lo || r.v > r.hi:
			msg := fmt.Sprintf("%s %s is outside the allowed range %s", r.show(r.v), r.unit, rangeText(r))
			if hint := unitHint(r.key); hint != "" && r.bare {
				msg += "; " + hint
			}
			add(r.key, "%s", strings.Replace(msg, "  ", " ", -1))
		}
	}
	// cross-field rules
	for _, s := range []struct {
		tbl string
		fs  cylinder.FinSet
	}{{"head", c.Head}, {"barrel", c.Barrel}} {
		set := s.fs.Set
		if set.Height > 0 && set.RootDiameter > 0 && set.Height > set.RootDiameter {
			add(setKey(s.tbl, "height"), "%.4g mm fins on a %.4g mm root diameter are taller than the cylinder is wide; fins of this kind stay below the root diameter (common practice)", set.Height/mm, set.RootDiameter/mm)
		}
		if set.Count >= 1 && set.Pitch > 0 && set.Height > 0 && set.RootThickness > 0 && set.RootDiameter > 0 && set.Length > 0 && set.TipThickness >= 0 {
			if _, err := set.Geometry(); err != nil {
				var fe *fins.FieldError
				if errors.As(err, &fe) {
					key := s.tbl + "." + fe.Field
					switch fe.Field {
					case "root_diameter":
						key = "cylinder." + s.tbl + "_diameter"
					case "length":
						key = "cylinder." + s.tbl + "_length"
					}
					add(key, "%s", fe.Msg)
				} else {
					add(s.tbl, "%v", err)
				}
			}
		}
	}
	if c.Ambient > 0 && d.HeadLimit > 0 && c.Ambient >= d.HeadLimit {
		add("limits.head", "the head limit %.4g C is not above the ambient %.4g C; no cooling can hold it", d.HeadLimit-C, c.Ambient-C)
	}
	if d.WallFixed {
		if d.HeadWall <= c.Ambient {
			add("override.head_wall", "%.4g C is not above the ambient %.4g C", d.HeadWall-C, c.Ambient-C)
		}
		if d.BarrelWall <= c.Ambient {
			add("override.barrel_wall", "%.4g C is not above the ambient %.4g C", d.BarrelWall-C, c.Ambient-C)
		}
	}
	return d
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
