package design

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"finmarch/airflow"
	"finmarch/airflow/calibrate"
	"finmarch/airflow/cylinder"
	"finmarch/airflow/uncertainty"
	"finmarch/fins"
	"finmarch/materials"
)

// builder turns a decoded design file into a Design: every range check
// and rule in the file's order, each error through add with its key.
type builder struct {
	f   *File
	md  toml.MetaData
	d   *Design
	add func(key, format string, a ...any)
	// the queued range checks, in a fixed array so that a builder on the
	// stack allocates nothing for them (a design has about 40); more
	// spill to a slice
	checks [64]rangeCheck
	n      int
	spill  []rangeCheck
	// tables with a value outside its range: their cross-field rules would
	// only repeat the range error in a stranger form (+Inf mm of length)
	outOfRange map[string]bool
}

func (b *builder) queue(r rangeCheck) {
	if b.n < len(b.checks) {
		b.checks[b.n] = r
		b.n++
		return
	}
	b.spill = append(b.spill, r)
}

// need reads a required quantity and queues its range check.
func (b *builder) need(key string, q rawQ, set bool, lo, hi float64, unit string, scale, offset float64) float64 {
	b.queue(rangeCheck{key: key, v: q.Or(math.NaN()), lo: lo, hi: hi, unit: unit, scale: scale, offset: offset, set: set, bare: q.IsBare()})
	return q.Or(math.NaN())
}

// opt reads an optional quantity: its default (recorded with why) when
// not set, otherwise the value with its range check queued.
func (b *builder) opt(key string, q rawQ, set bool, dflt, lo, hi float64, unit string, scale, offset float64, why string) float64 {
	if !set {
		b.def(key, why)
		return dflt
	}
	b.queue(rangeCheck{key: key, v: q.Or(dflt), lo: lo, hi: hi, unit: unit, scale: scale, offset: offset, set: true, bare: q.IsBare()})
	return q.Or(dflt)
}

// def records a default applied, for the report.
func (b *builder) def(key, what string) { b.d.Defaults = append(b.d.Defaults, defaultText(key, what)) }

// mm and C are the millimetre in m and 0 C in K, for the ranges below.
const mm, C = 1e-3, 273.15

func build(f *File, md toml.MetaData, name string, add func(key, format string, a ...any)) *Design {
	d := &Design{Name: strings.TrimSpace(f.Name), Source: name}
	if d.Name == "" {
		d.Name = strings.TrimSuffix(baseName(name), ".toml")
		d.Defaults = append(d.Defaults, "name: taken from the file name")
	}
	b := &builder{f: f, md: md, d: d, add: add}
	b.cylinder()
	b.air()
	b.load()
	b.cooling()
	b.limits()
	b.method()
	b.uncertainty()
	b.calibration()
	b.ride()
	b.ranges()
	b.crossRules()
	return d
}

// cylinder reads the [cylinder] dimensions and the two fin sets.
func (b *builder) cylinder() {
	f, c := b.f, &b.d.Case
	b.casting()
	c.Tilt = b.opt("cylinder.tilt", f.Cylinder.Tilt.raw(), f.Cylinder.Tilt.Set, 0, 0, math.Pi/2+1e-12, "deg", math.Pi/180, 0, "0 deg (upright)")
	hd := b.need("cylinder.head_diameter", f.Cylinder.HeadDiameter.raw(), f.Cylinder.HeadDiameter.Set, 20*mm, 400*mm, "mm", mm, 0)
	hl := b.need("cylinder.head_length", f.Cylinder.HeadLength.raw(), f.Cylinder.HeadLength.Set, 5*mm, 500*mm, "mm", mm, 0)
	bd := b.need("cylinder.barrel_diameter", f.Cylinder.BarrelDiameter.raw(), f.Cylinder.BarrelDiameter.Set, 20*mm, 400*mm, "mm", mm, 0)
	bl := b.need("cylinder.barrel_length", f.Cylinder.BarrelLength.raw(), f.Cylinder.BarrelLength.Set, 5*mm, 500*mm, "mm", mm, 0)

	c.Head = b.finSet("head", f.Head, hd, hl)
	c.Barrel = b.finSet("barrel", f.Barrel, bd, bl)
}

// DefaultCasting is the process fins are taken to be made by when a design
// names none: gravity die casting, the usual way for motorcycle and small
// engine cylinders (common practice).
const DefaultCasting = "permanent-mould"

// casting reads cylinder.casting, the process the fins are made by.
func (b *builder) casting() {
	name := b.f.Cylinder.Casting
	if strings.TrimSpace(name) == "" {
		// a default only where a set takes it: not when both sets name
		// their own process
		if strings.TrimSpace(b.f.Head.Casting) == "" || strings.TrimSpace(b.f.Barrel.Casting) == "" {
			b.def("cylinder.casting", DefaultCasting+" (common practice for motorcycle and small-engine cylinders)")
		}
		name = DefaultCasting
	}
	p, err := fins.LookupProcess(name)
	if err != nil {
		b.add("cylinder.casting", "%v", err)
		return
	}
	b.d.Casting = p
	b.d.SetCasting = [2]fins.Process{p, p}
	// a set's own casting key: an iron barrel sand cast under a die-cast
	// alloy head, say
	for i, t := range []struct {
		tbl, name string
	}{{"head", b.f.Head.Casting}, {"barrel", b.f.Barrel.Casting}} {
		if strings.TrimSpace(t.name) == "" {
			continue
		}
		sp, err := fins.LookupProcess(t.name)
		if err != nil {
			b.add(setKey(t.tbl, "casting"), "%v", err)
			continue
		}
		b.d.SetCasting[i], b.d.SetCastKey[i] = sp, true
	}
}

// alloy returns the alloy named n: a custom [alloys.n] table or the
// catalogue's, with "did you mean" for a misspelt name.
func (b *builder) alloy(key, n string) (materials.Alloy, bool) {
	f := b.f
	if strings.TrimSpace(n) == "" {
		b.add(key, "missing: name an alloy (%s) or define one under [alloys.NAME]", strings.Join(materials.Names(), ", "))
		return materials.Alloy{}, false
	}
	if ca, ok := f.Alloys[n]; ok {
		base := "alloys." + n
		for _, k := range []struct {
			k   string
			set bool
		}{{"conductivity", ca.Conductivity.Set}, {"density", ca.Density.Set}, {"specific_heat", ca.SpecificHeat.Set}} {
			if !k.set {
				b.add(base+"."+k.k, "missing for the custom alloy %q", n)
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
				b.add(k, "%s", strings.TrimPrefix(msg, fmt.Sprintf("custom alloy %q: ", n)))
			}
			return materials.Alloy{}, false
		}
		return a, true
	}
	a, err := materials.Lookup(n)
	if err != nil {
		msg := strings.TrimPrefix(err.Error(), materials.ErrUnknown.Error()+": ")
		b.add(key, "%s, or define it under [alloys.%s]", msg, n)
		return materials.Alloy{}, false
	}
	return a, true
}

// finSet reads one fin-set table on a cylinder of root diameter dia and
// finned length length (m).
func (b *builder) finSet(tbl string, t FinSetT, dia, length float64) cylinder.FinSet {
	md := b.md
	key := func(field string) string { return setKey(tbl, field) }
	fs := cylinder.FinSet{Name: tbl}
	if !md.IsDefined(tbl) {
		b.add(tbl, "missing table [%s]: the %s fin set (style, count, pitch, height, root_thickness, alloy)", tbl, tbl)
		return fs
	}
	s := &fs.Set
	switch strings.ToLower(strings.TrimSpace(t.Style)) {
	case "annular", "ring", "rings":
		s.Style = fins.StyleAnnular
	case "longitudinal", "axial":
		s.Style = fins.StyleLongitudinal
	case "":
		b.add(key("style"), `missing: "annular" (rings around the cylinder) or "longitudinal" (plates along the axis)`)
	default:
		b.add(key("style"), `%q is not a fin style; use "annular" or "longitudinal"`, t.Style)
	}
	if !md.IsDefined(tbl, "count") {
		b.add(key("count"), "missing: the number of fins (a whole number)")
	} else if t.Count < 1 || t.Count > 400 {
		b.add(key("count"), "%d fins; allowed 1 to 400", t.Count)
	}
	s.Count = t.Count
	s.Pitch = b.need(key("pitch"), t.Pitch.raw(), t.Pitch.Set, 1*mm, 60*mm, "mm", mm, 0)
	s.Height = b.need(key("height"), t.Height.raw(), t.Height.Set, 2*mm, 150*mm, "mm", mm, 0)
	s.RootThickness = b.need(key("root_thickness"), t.RootThickness.raw(), t.RootThickness.Set, 0.3*mm, 25*mm, "mm", mm, 0)
	s.TipThickness = b.opt(key("tip_thickness"), t.TipThickness.raw(), t.TipThickness.Set, s.RootThickness, 0, 25*mm, "mm", mm, 0, "equal to root_thickness (no taper)")
	s.RootDiameter, s.Length = dia, length
	if a, ok := b.alloy(key("alloy"), t.Alloy); ok {
		fs.Alloy = a
	}
	fin := materials.AsCast
	switch strings.ToLower(strings.TrimSpace(t.Finish)) {
	case "", "as-cast", "ascast", "bare":
		if t.Finish == "" && !t.Emissivity.Set {
			b.def(key("finish"), "as-cast")
		}
	case "painted", "black", "painted-black":
		fin = materials.Painted
	default:
		b.add(key("finish"), `%q is not a finish; use "as-cast" or "painted" (or give emissivity)`, t.Finish)
	}
	fs.Emissivity = fs.Alloy.Emissivity(fin)
	if t.Emissivity.Set {
		fs.Emissivity = b.opt(key("emissivity"), t.Emissivity.raw(), true, 0, 0.01, 1, "", 1, 0, "")
	}
	return fs
}

// air reads [air] and the march segments.
func (b *builder) air() {
	f, md, d, c := b.f, b.md, b.d, &b.d.Case
	c.Speed = b.need("air.speed", f.Air.Speed.raw(), f.Air.Speed.Set, 0, 400/3.6, "km/h", 1/3.6, 0)
	c.Recovery = b.opt("air.pressure_recovery", f.Air.PressureRecovery.raw(), f.Air.PressureRecovery.Set, cylinder.DefaultRecovery, 0.05, 1, "", 1, 0,
		"0.5 (common practice for an uncowled cylinder; calibrate against a measured head temperature)")
	c.Ambient = b.need("air.ambient", f.Air.Ambient.raw(), f.Air.Ambient.Set, -50+C, 60+C, "C", 1, C)
	if f.Air.Pressure.Set && f.Air.Altitude.Set {
		b.add("air.pressure", "give altitude or pressure, not both")
	}
	if f.Air.Pressure.Set {
		c.Pressure = b.opt("air.pressure", f.Air.Pressure.raw(), true, 0, 30e3, 110e3, "kPa", 1e3, 0, "")
	} else {
		d.Altitude = b.opt("air.altitude", f.Air.Altitude.raw(), f.Air.Altitude.Set, 0, -500, 6000, "m", 1, 0, "0 m (sea level, ISA pressure)")
		c.Pressure = airflow.ISA(d.Altitude, nil).P
	}
	if f.Segments != 0 || md.IsDefined("segments") {
		if f.Segments < 1 || f.Segments > 10000 {
			b.add("segments", "%d; allowed 1 to 10000", f.Segments)
		}
		d.Run.Segments = f.Segments
	} else {
		d.Run.Segments = cylinder.DefaultSegments
	}
}

// method reads air.method, the air-side method (cylinder.Method): "auto"
// or absent for the configuration's default; a named method must apply to
// the design (its fin styles, its cooling source, a fixed h).
func (b *builder) method() {
	d := b.d
	switch m := cylinder.Method(b.f.Air.Method); m {
	case "", "auto":
	case cylinder.MethodGibson, cylinder.MethodBriggsYoung, cylinder.MethodChannel:
		if ok, why := d.Case.Applies(m); !ok {
			b.add("air.method", "%q does not apply to this design: %s", m, why)
		}
		d.Run.Method = m
	default:
		b.add("air.method", `%q is not an air-side method; use "auto" (the configuration's default), "gibson", "briggs-young" or "channel"`, b.f.Air.Method)
	}
}

// load reads [load]: the heats directly, or the road load.
func (b *builder) load() {
	f, md, d := b.f, b.md, b.d
	l := f.Load
	if !md.IsDefined("load") {
		b.add("load", "missing table [load]: give head_heat and barrel_heat, or the road load (mass, cda)")
	} else if l.HeadHeat.Set || l.BarrelHeat.Set {
		d.Load.Direct = true
		d.Load.Given.Head = b.need("load.head_heat", l.HeadHeat.raw(), l.HeadHeat.Set, 0, 50e3, "kW", 1e3, 0)
		d.Load.Given.Barrel = b.need("load.barrel_heat", l.BarrelHeat.raw(), l.BarrelHeat.Set, 0, 50e3, "kW", 1e3, 0)
		for _, k := range []struct {
			k   string
			set bool
		}{{"mass", l.Mass.Set}, {"cda", l.CdA.Set}, {"thermal_efficiency", l.ThermalEfficiency.Set}, {"cooling_share", l.CoolingShare.Set}} {
			if k.set {
				b.add("load."+k.k, "not used when head_heat and barrel_heat are given; remove one way of giving the load")
			}
		}
	} else {
		r := &d.Load.Road
		r.Mass = b.need("load.mass", l.Mass.raw(), l.Mass.Set, 30, 5000, "kg", 1, 0)
		r.CdA = b.need("load.cda", l.CdA.raw(), l.CdA.Set, 0.05, 5, "m2", 1, 0)
		r.Crr = b.opt("load.rolling_resistance", l.RollingResistance.raw(), l.RollingResistance.Set, cylinder.DefaultCrr, 0.002, 0.1, "", 1, 0, "0.02 (common practice, road tyre on asphalt)")
		r.Driveline = b.opt("load.driveline_efficiency", l.DrivelineEfficiency.raw(), l.DrivelineEfficiency.Set, cylinder.DefaultDriveline, 0.5, 1, "", 1, 0, "0.90 (common practice, chain or belt drive)")
		r.Thermal = b.opt("load.thermal_efficiency", l.ThermalEfficiency.raw(), l.ThermalEfficiency.Set, cylinder.DefaultThermal, 0.1, 0.45, "", 1, 0, "0.25 (Heywood 1988, part-load SI; from memory)")
		r.CoolShare = b.opt("load.cooling_share", l.CoolingShare.raw(), l.CoolingShare.Set, cylinder.DefaultCoolShare, 0.05, 0.6, "", 1, 0, "0.22 (Heywood 1988 Table 12.1; from memory)")
		r.HeadShare = b.opt("load.head_share", l.HeadShare.raw(), l.HeadShare.Set, cylinder.DefaultHeadShare, 0.05, 1, "", 1, 0, "0.65 (common practice)")
		r.GradePct = b.opt("load.grade", l.Grade.raw(), l.Grade.Set, 0, -20, 20, "%", 1, 0, "0 % (level road)")
		if l.IdleHeat.Set {
			r.IdleHeat = b.opt("load.idle_heat", l.IdleHeat.raw(), true, 0, 0, 20e3, "kW", 1e3, 0, "")
		}
		r.ExtraPowerW = b.opt("load.extra_power", l.ExtraPower.raw(), l.ExtraPower.Set, 0, 0, 100e3, "kW", 1e3, 0, "0 W")
		if l.RatedPower.Set {
			r.RatedPower = b.opt("load.rated_power", l.RatedPower.raw(), true, 0, 0.5e3, 1000e3, "kW", 1e3, 0, "")
		}
		if l.TopGearSpeed.Set {
			r.TopGearSpeed = b.opt("load.top_gear_speed", l.TopGearSpeed.raw(), true, 0, 10/3.6, 400/3.6, "km/h", 1/3.6, 0, "")
		}
		r.Cylinders = 1
		if md.IsDefined("load", "cylinders") {
			if l.Cylinders < 1 || l.Cylinders > 16 {
				b.add("load.cylinders", "%d; allowed 1 to 16", l.Cylinders)
			}
			r.Cylinders = l.Cylinders
		} else {
			b.def("load.cylinders", "1")
		}
	}
}

// DefaultSamples is the band's sample count when a design names none:
// percentiles within 1 K between seeds (airflow/uncertainty).
const DefaultSamples = 1000

// uncertainty reads [uncertainty]: the sample count, the seed and any
// half-width that replaces its default (uncertainty.DefaultSpread).
func (b *builder) uncertainty() {
	u, d := b.f.Uncertainty, b.d
	d.Band = BandSpec{Samples: DefaultSamples, Seed: 1, Spread: uncertainty.DefaultSpread()}
	if b.md.IsDefined("uncertainty", "samples") {
		if u.Samples != 0 && (u.Samples < 10 || u.Samples > 100000) {
			b.add("uncertainty.samples", "%d; allowed 0 (no band) or 10 to 100000", u.Samples)
		}
		d.Band.Samples = u.Samples
	}
	if b.md.IsDefined("uncertainty", "seed") {
		if u.Seed < 0 {
			b.add("uncertainty.seed", "%d; a seed is a whole number from 0", u.Seed)
		}
		d.Band.Seed = uint64(max(u.Seed, 0))
	}
	sp := &d.Band.Spread
	if u.Methods != nil {
		sp.Methods = *u.Methods
	}
	for _, h := range []struct {
		key string
		q   Q[Fraction]
		dst *float64
	}{
		{"pressure_recovery", u.PressureRecovery, &sp.Recovery}, {"cooling_share", u.CoolingShare, &sp.CoolShare},
		{"thermal_efficiency", u.ThermalEfficiency, &sp.Thermal}, {"head_share", u.HeadShare, &sp.HeadShare},
		{"forced_convection", u.ForcedConvection, &sp.Forced}, {"natural_convection", u.NaturalConvection, &sp.Natural},
		{"conductivity", u.Conductivity, &sp.Conductivity}, {"emissivity", u.Emissivity, &sp.Emissivity},
	} {
		if h.q.Set {
			*h.dst = b.opt("uncertainty."+h.key, h.q.raw(), true, 0, 0, halfWidthCeiling[h.key], "", 1, 0, "")
		}
	}
}

// ride reads the [ride] table: the metal besides the fins (0 when absent:
// transient.EstimateMetal) and the head-barrel link (0: none).
func (b *builder) ride() {
	r, m := b.f.Ride, &b.d.Metal
	if r.HeadMetal.Set {
		m.Head = b.opt("ride.head_metal", r.HeadMetal.raw(), true, 0, 0.05, 100, "kg", 1, 0, "")
	}
	if r.BarrelMetal.Set {
		m.Barrel = b.opt("ride.barrel_metal", r.BarrelMetal.raw(), true, 0, 0.05, 100, "kg", 1, 0, "")
	}
	if r.Link.Set {
		m.Link = b.opt("ride.head_barrel_link", r.Link.raw(), true, 0, 0, 1000, "W/K", 1, 0, "")
	}
}

// calibration reads the [calibration] factors and the [[measurement]]s.
func (b *builder) calibration() {
	f, d := b.f, b.d
	cal := f.Calibration
	if cal.ForcedConvectionFactor.Set {
		d.Run.ForcedFactor = b.opt("calibration.forced_convection_factor", cal.ForcedConvectionFactor.raw(), true, 1, 0.3, 3, "", 1, 0, "")
	}
	if cal.HeatLoadFactor.Set {
		d.Load = d.Load.Scaled(b.opt("calibration.heat_load_factor", cal.HeatLoadFactor.raw(), true, 1, 0.3, 3, "", 1, 0, ""))
	}
	if n := len(f.Measurement); n > MaxPointRows {
		b.add(fmt.Sprintf("measurement[%d]", MaxPointRows+1), "%d [[measurement]] tables; a design holds at most %d", n, MaxPointRows)
		return
	}
	for i, m := range f.Measurement {
		key := fmt.Sprintf("measurement[%d]", i+1)
		p, problems := measuredPoint(m, d.Case.Pressure)
		for _, pb := range problems {
			k := key
			if pb.field != "" {
				k += "." + pb.field
			}
			b.add(k, "%s", pb.msg)
		}
		d.Points = append(d.Points, p)
	}
}

// problem is what is wrong with one key of a measurement (or column of a
// points file).
type problem struct{ field, msg string }

// Ranges of a measurement's keys (our plausibility bounds, within those of
// calibrate.Point.Check; the estimator's own ranges are wider).
const (
	minSigma, maxSigma = 0.1, 50.0 // K: no reading on a running engine is better than a tenth of a kelvin; one worse than 50 K tells the fit nothing
)

// measuredPoint checks one measurement (from a [[measurement]] table or a
// row of a points file) and makes its calibration point; pressure (Pa) is
// the air pressure for a measurement that gives no altitude. Each problem
// names its key. A key left out takes its stated default (altitude: the
// pressure given; place fin-root; offset 0 K at a fin root; uncertainty
// calibrate.DefaultSigma), and a value given is used as given or refused
// with its allowed range: none is a "not set" mark.
func measuredPoint(m MeasurementT, pressure float64) (calibrate.Point, []problem) {
	var bad []problem
	add := func(field, format string, a ...any) { bad = append(bad, problem{field, fmt.Sprintf(format, a...)}) }
	temp := func(x float64) string { return strconv.FormatFloat(x-C, 'g', 6, 64) + " C" }
	p := calibrate.Point{Speed: m.Speed.Or(math.NaN()), Ambient: m.Ambient.Or(math.NaN()), Barrel: m.Barrel.Set,
		Offset: m.Offset.Or(0), Sigma: m.Sigma.Or(calibrate.DefaultSigma), OffsetSigma: m.OffsetSigma.Or(-1), Pressure: pressure}
	switch {
	case !m.Speed.Set:
		add("speed", "missing; every reading needs its road speed, 0 to 400 km/h")
	case m.Speed.Bare:
		add("speed", "%s", bareSpeed(p.Speed)) // as air.speed
	case !(p.Speed >= 0 && p.Speed <= 400/3.6):
		add("speed", "%s km/h is outside the allowed 0 to 400 km/h", strconv.FormatFloat(p.Speed*3.6, 'g', 6, 64))
	}
	ambOK := false
	switch {
	case !m.Ambient.Set:
		add("ambient", "missing; every reading needs its ambient, -50 to 60 C")
	case !(p.Ambient >= C-50 && p.Ambient <= C+60):
		add("ambient", "%s is outside the allowed -50 to 60 C", temp(p.Ambient))
	default:
		ambOK = true
	}
	switch {
	case m.Head.Set && m.Barrel.Set:
		add("head", "a reading is of the head or of the barrel, not both: give each its own reading")
	case !m.Head.Set && !m.Barrel.Set:
		add("head", "missing; give the head or the barrel temperature measured (one of them), between the ambient and 500 C")
	default:
		field, t := "head", m.Head.SI
		if m.Barrel.Set {
			field, t = "barrel", m.Barrel.SI
		}
		p.Temp = t
		switch {
		case !(t < C+500):
			add(field, "%s is outside the allowed range: the measured temperature must lie between the ambient and 500 C", temp(t))
		case ambOK && !(t > p.Ambient):
			add(field, "%s: the measured temperature must lie between the ambient (%s) and 500 C", temp(t), temp(p.Ambient))
		}
	}
	if m.Altitude.Set {
		alt := m.Altitude.SI
		if !(alt >= -500 && alt <= 6000) {
			add("altitude", "%s m is outside the allowed -500 to 6000 m", strconv.FormatFloat(alt, 'g', 6, 64))
			alt = 0
		}
		p.Pressure = airflow.ISA(alt, nil).P
	}
	switch strings.ToLower(strings.TrimSpace(m.Place)) {
	case "", "fin-root", "fin root":
	case "plug-seat", "plug seat", "spark-plug-seat":
		if !m.Offset.Set {
			add("offset", "missing: a plug-seat reading needs offset, how much hotter the seat runs than the mean fin root, above -100 K and below 200 K (measure both once, or fit it: finmarch calibrate --fit recovery,offset)")
		}
	default:
		add("place", "%q: fin-root (the default) or plug-seat", m.Place)
	}
	if m.Offset.Set && !(p.Offset > -100 && p.Offset < 200) {
		add("offset", "%s K is outside the allowed range, above -100 K and below 200 K", strconv.FormatFloat(p.Offset, 'g', 6, 64))
	}
	if m.OffsetSigma.Set && !(p.OffsetSigma >= 0 && p.OffsetSigma <= maxSigma) {
		add("offset_uncertainty", "%s K is outside the allowed 0 to %g K (leave it out for half the offset)", strconv.FormatFloat(p.OffsetSigma, 'g', 6, 64), maxSigma)
	}
	if m.Sigma.Set && !(p.Sigma >= minSigma && p.Sigma <= maxSigma) {
		add("uncertainty", "%s K is outside the allowed %g to %g K (leave it out for %g K)", strconv.FormatFloat(p.Sigma, 'g', 6, 64), minSigma, maxSigma, calibrate.DefaultSigma)
	}
	if !(p.Pressure > 0) || math.IsInf(p.Pressure, 0) {
		add("altitude", "no air pressure for this reading: give its altitude, -500 to 6000 m")
	}
	if len(bad) == 0 {
		// the library's own check, a guard: the ranges above lie within
		// it, but for its open ends
		for _, msg := range p.Check() {
			field := ""
			for _, f := range []string{"speed", "ambient", "uncertainty"} {
				if strings.HasPrefix(msg, f) {
					field = f
				}
			}
			if strings.HasPrefix(msg, "the measured") {
				field = map[bool]string{false: "head", true: "barrel"}[p.Barrel]
			}
			add(field, "%s", msg)
		}
	}
	return p, bad
}

// limits reads [limits] and [override].
func (b *builder) limits() {
	f, d, c := b.f, b.d, &b.d.Case
	var headWhy, barrelWhy string // built only when the default applies
	if !f.Limits.Head.Set {
		headWhy = fmt.Sprintf("the head alloy's maximum service temperature, %.0f C (%s)", c.Head.Alloy.MaxService-C, c.Head.Alloy.LimitSource)
	}
	if !f.Limits.Barrel.Set {
		barrelWhy = fmt.Sprintf("the barrel alloy's maximum service temperature, %.0f C", c.Barrel.Alloy.MaxService-C)
	}
	d.HeadLimit = b.opt("limits.head", f.Limits.Head.raw(), f.Limits.Head.Set, c.Head.Alloy.MaxService, 60+C, 450+C, "C", 1, C, headWhy)
	d.BarrelLimit = b.opt("limits.barrel", f.Limits.Barrel.raw(), f.Limits.Barrel.Set, c.Barrel.Alloy.MaxService, 60+C, 450+C, "C", 1, C, barrelWhy)
	if f.Override.H.Set {
		c.FixedH = b.opt("override.h", f.Override.H.raw(), true, 0, 1, 2000, "W/m2K", 1, 0, "")
	}
	if f.Override.HeadWall.Set || f.Override.BarrelWall.Set {
		d.WallFixed = true
		d.HeadWall = b.need("override.head_wall", f.Override.HeadWall.raw(), f.Override.HeadWall.Set, 0+C, 500+C, "C", 1, C)
		d.BarrelWall = b.need("override.barrel_wall", f.Override.BarrelWall.raw(), f.Override.BarrelWall.Set, 0+C, 500+C, "C", 1, C)
	}
}

// ranges reports every queued range check that failed.
func (b *builder) ranges() {
	checks := append(b.checks[:b.n:b.n], b.spill...)
	for _, r := range checks {
		switch {
		case !r.set:
			b.add(r.key, "missing (%s)", rangeText(r))
		case r.bare && r.unit == "km/h":
			b.add(r.key, "%s", bareSpeed(r.v))
		case math.IsNaN(r.v) || r.v < r.lo || r.v > r.hi:
			msg := fmt.Sprintf("%s %s is outside the allowed range %s", r.show(r.v), r.unit, rangeText(r))
			if hint := unitHint(r.key); hint != "" && r.bare {
				msg += "; " + hint
			} else if r.bare && r.unit != "" && r.scale != 1 {
				// a bare number is SI: "pitch = 9" is 9 m
				msg += fmt.Sprintf("; a bare number is read in SI units (here %s %s); did you mean \"%s %s\"?", strconv.FormatFloat(r.v, 'g', 5, 64), siUnit(r.unit), strconv.FormatFloat(r.v, 'g', 5, 64), r.unit)
			}
			b.add(r.key, "%s", strings.Replace(msg, "  ", " ", -1))
			if b.outOfRange == nil {
				b.outOfRange = map[string]bool{}
			}
			tbl, _, _ := strings.Cut(r.key, ".")
			b.outOfRange[tbl] = true
		}
	}
}

// crossRules checks the rules between fields: fins that fit and stand on
// their cylinder, a limit above the ambient, fixed walls above it.
func (b *builder) crossRules() {
	d, c := b.d, &b.d.Case
	for _, s := range []struct {
		tbl string
		fs  cylinder.FinSet
	}{{"head", c.Head}, {"barrel", c.Barrel}} {
		set := s.fs.Set
		if set.Height > 0 && set.RootDiameter > 0 && set.Height > set.RootDiameter {
			b.add(setKey(s.tbl, "height"), "%.4g mm fins on a %.4g mm root diameter are taller than the cylinder is wide; fins of this kind stay below the root diameter (common practice)", set.Height/mm, set.RootDiameter/mm)
		}
		if !b.outOfRange[s.tbl] && !b.outOfRange["cylinder"] && set.Count >= 1 && set.Pitch > 0 && set.Height > 0 && set.RootThickness > 0 && set.RootDiameter > 0 && set.Length > 0 && set.TipThickness >= 0 {
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
					b.add(key, "%s", fe.Msg)
				} else {
					b.add(s.tbl, "%v", err)
				}
			}
		}
	}
	// a limit above the catalogue alloy's own service temperature would
	// let the tool call an overheated head ok (a custom alloy's ceiling is
	// checked with the alloy)
	for _, l := range []struct {
		key   string
		v     float64
		alloy materials.Alloy
	}{{"limits.head", d.HeadLimit, c.Head.Alloy}, {"limits.barrel", d.BarrelLimit, c.Barrel.Alloy}} {
		if a := l.alloy; a.Name != "" && !a.Custom && a.MaxService > 0 && l.v > a.MaxService+1e-9 {
			b.add(l.key, "%.4g C is above the maximum service temperature of %s, %.4g C (%s); a lower limit, or another alloy", l.v-C, a.Name, a.MaxService-C, a.LimitSource)
		}
	}
	if c.Ambient > 0 && d.HeadLimit > 0 && c.Ambient >= d.HeadLimit {
		b.add("limits.head", "the head limit %.4g C is not above the ambient %.4g C; no cooling can hold it", d.HeadLimit-C, c.Ambient-C)
	}
	if d.WallFixed {
		if d.HeadWall <= c.Ambient {
			b.add("override.head_wall", "%.4g C is not above the ambient %.4g C", d.HeadWall-C, c.Ambient-C)
		}
		if d.BarrelWall <= c.Ambient {
			b.add("override.barrel_wall", "%.4g C is not above the ambient %.4g C", d.BarrelWall-C, c.Ambient-C)
		}
	}
}

// siUnit names the SI unit a display unit of a range check stands for.
func siUnit(display string) string {
	for _, d := range []*dimension{dimLength, dimSpeed, dimPower, dimArea, dimMass, dimPressure, dimHCoef, dimDensity, dimConductivity, dimConductance, dimVolumeFlow, dimMassFlow} {
		if _, ok := d.units[strings.ToLower(display)]; ok {
			return d.si
		}
	}
	return "SI units"
}

// bareSpeed is the refusal of a speed written without its unit: a bare
// number is m/s, and road speeds in km/h or mph are in range as m/s too
// ("speed = 90" would be 324 km/h).
func bareSpeed(v float64) string {
	n := strconv.FormatFloat(v, 'g', 6, 64)
	return fmt.Sprintf("%s has no unit: a bare number would be %s m/s (%s km/h); write \"%s km/h\", \"%s mph\" or \"%s m/s\"",
		n, n, strconv.FormatFloat(v*3.6, 'g', 4, 64), n, n, n)
}
