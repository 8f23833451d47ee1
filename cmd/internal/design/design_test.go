package design

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"finmarch/cmd/internal/demo"
	"finmarch/fins"
)

// Unit conversions against their definitions (exact by definition unless
// noted): inch 0.0254 m and pound 0.45359237 kg (international yard and
// pound, 1959), mph 0.44704 m/s (exact from the inch), knot 1852/3600 m/s,
// F to K by (F - 32) 5/9 + 273.15, C + 273.15; horsepower 745.69987 W
// (550 ft lbf/s) and psi 6894.757 Pa from NIST SP 811 (2008) Appendix B.
func TestUnits(t *testing.T) {
	cases := []struct {
		in   string
		dim  *dimension
		want float64
		tol  float64
	}{
		{"6 mm", dimLength, 0.006, 0},
		{"0.25 in", dimLength, 0.00635, 1e-15},
		{"0.25in", dimLength, 0.00635, 1e-15},
		{"1 ft", dimLength, 0.3048, 0},
		{"100 km/h", dimSpeed, 100 / 3.6, 1e-12},
		{"60 mph", dimSpeed, 26.8224, 1e-12},
		{"10 kn", dimSpeed, 5.14444, 1e-12},
		{"35 C", dimTemp, 308.15, 1e-12},
		{"95 F", dimTemp, 308.15, 1e-12},
		{"-40 F", dimTemp, 233.15, 1e-12},
		{"300 K", dimTemp, 300, 0},
		{"35 °C", dimTemp, 308.15, 1e-12},
		{"1200 m", dimLength, 1200, 0},
		{"12 kW", dimPower, 12000, 0},
		{"10 hp", dimPower, 7456.9987, 1e-9},
		{"0.55 m2", dimArea, 0.55, 0},
		{"0.55 m²", dimArea, 0.55, 0},
		{"500 lb", dimMass, 226.796185, 1e-9},
		{"14.7 psi", dimPressure, 101352.9279, 1e-3},
		{"101.3 kPa", dimPressure, 101300, 1e-9},
		{"90 deg", dimAngle, math.Pi / 2, 1e-15},
		{"85 W/m2K", dimHCoef, 85, 0},
		{"85 W/(m2 K)", dimHCoef, 85, 0},
		{"25 %", dimFraction, 0.25, 1e-15},
		{"1.5e-3 m", dimLength, 1.5e-3, 0},
		{"2.7 g/cm3", dimDensity, 2700, 1e-9},
		{"150 W/mK", dimConductivity, 150, 0},
		{"0.9 kJ/kgK", dimSpecificHeat, 900, 1e-9},
	}
	for _, c := range cases {
		got, err := parseString(c.in, c.dim)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if math.Abs(got-c.want) > c.tol {
			t.Errorf("%q = %.12g, want %.12g", c.in, got, c.want)
		}
	}
	// Bare TOML numbers are SI; 1.5e-7 must survive (the pitfall of
	// TextUnmarshaler noted in GO-NOTES).
	if v, err := parseQuantity(1.5e-7, dimLength); err != nil || v != 1.5e-7 {
		t.Errorf("bare float: %g %v", v, err)
	}
	if v, err := parseQuantity(int64(3), dimLength); err != nil || v != 3 {
		t.Errorf("bare int: %g %v", v, err)
	}
}

func TestUnitErrors(t *testing.T) {
	bad := []struct {
		in, frag string
		dim      *dimension
	}{
		{"6 furlongs", "not a length unit", dimLength},
		{"6", "has no unit", dimLength},
		{"mm", "has no number", dimLength},
		{"", "empty", dimLength},
		{"35 kg", "not a temperature unit", dimTemp},
		{"1e999 m", "not a number", dimLength},
		{"1.2.3 mm", "not a number", dimLength},
	}
	for _, b := range bad {
		_, err := parseString(b.in, b.dim)
		if err == nil || !strings.Contains(err.Error(), b.frag) {
			t.Errorf("%q: want error with %q, got %v", b.in, b.frag, err)
		}
	}
	if _, err := parseQuantity(true, dimLength); err == nil {
		t.Error("boolean accepted as a length")
	}
	if _, err := parseQuantity(math.NaN(), dimLength); err == nil {
		t.Error("NaN accepted")
	}
}

func TestDemoDesignsParse(t *testing.T) {
	for _, f := range demo.Files {
		d, err := Parse(f.Src, f.Name)
		if err != nil {
			t.Fatalf("%s: %v", f.Name, err)
		}
		if d.Case.Speed != 25 || d.Case.Ambient != 308.15 || d.HeadLimit != 493.15 || d.Load.Direct {
			t.Errorf("%s: read wrong: speed %g ambient %g limit %g", f.Name, d.Case.Speed, d.Case.Ambient, d.HeadLimit)
		}
		if math.Abs(d.Case.Pressure-101325) > 1e-6 {
			t.Errorf("%s: pressure %g", f.Name, d.Case.Pressure)
		}
	}
	d, _ := Parse(demo.LaidOver, "x")
	if d.Case.Head.Set.Style != fins.StyleLongitudinal || d.Case.Tilt != math.Pi/2 {
		t.Error("laid-over demo read wrong")
	}
}

const minimal = `name = "t"
[cylinder]
head_diameter = "120 mm"
head_length = "72 mm"
barrel_diameter = "92 mm"
barrel_length = "108 mm"
[head]
style = "annular"
count = 8
pitch = "9 mm"
height = "40 mm"
root_thickness = "4 mm"
alloy = "A356-T6"
[barrel]
style = "annular"
count = 12
pitch = "9 mm"
height = "30 mm"
root_thickness = "3.5 mm"
alloy = "A356"
[air]
speed = "90 km/h"
ambient = "35 C"
[load]
head_heat = "2 kW"
barrel_heat = "1 kW"
`

func TestDefaults(t *testing.T) {
	d, err := Parse([]byte(minimal), "m.toml")
	if err != nil {
		t.Fatal(err)
	}
	if d.Case.Tilt != 0 || d.Case.Recovery != 0.8 || d.Run.Segments != 40 || d.Case.Head.Set.TipThickness != 0.004 {
		t.Errorf("defaults wrong: %+v", d.Case)
	}
	if d.HeadLimit != d.Case.Head.Alloy.MaxService || !d.Load.Direct || d.Load.Given.Head != 2000 {
		t.Error("limit or load default wrong")
	}
	if len(d.Defaults) < 4 {
		t.Errorf("defaults not reported: %v", d.Defaults)
	}
	if d.Case.Barrel.Emissivity != 0.2 {
		t.Errorf("as-cast emissivity %g", d.Case.Barrel.Emissivity)
	}
}

func edit(src, old, new string) string {
	if !strings.Contains(src, old) {
		panic("edit: " + old)
	}
	return strings.Replace(src, old, new, 1)
}

// Every error names the key and the line, and suggests a fix.
func TestErrorsNameKeyAndLine(t *testing.T) {
	cases := []struct {
		src  string
		key  string
		line int
		frag string
	}{
		{edit(minimal, `pitch = "9 mm"`, `pich = "9 mm"`), "head.pich", 10, `did you mean "head.pitch"`},
		{edit(minimal, `pitch = "9 mm"`, `pitch = "9 furlongs"`), "head.pitch", 10, "not a length unit"},
		{edit(minimal, `pitch = "9 mm"`, `pitch = "3 mm"`), "head.pitch", 10, "not larger than the root thickness"},
		{edit(minimal, `count = 8`, `count = 8.5`), "head.count", 9, "wrong type"},
		{edit(minimal, `count = 8`, `count = 12`), "head.count", 9, "need"},
		{edit(minimal, `alloy = "A356-T6"`, `alloy = "A365-T6"`), "head.alloy", 13, `did you mean "A356-T6"`},
		{edit(minimal, `ambient = "35 C"`, `ambient = 35`), "air.ambient", 23, "bare number is kelvin"},
		{edit(minimal, `ambient = "35 C"`, `ambient = "-300 C"`), "air.ambient", 23, "outside the allowed range"},
		{edit(minimal, `speed = "90 km/h"`, `speed = "900 km/h"`), "air.speed", 22, "0 to 400 km/h"},
		{edit(minimal, `root_thickness = "4 mm"`, "root_thickness = \"4 mm\"\ntip_thickness = \"5 mm\""), "head.tip_thickness", 13, "thicker than the root"},
		{edit(minimal, `height = "40 mm"`, `height = "140 mm"`), "head.height", 11, "taller than the cylinder is wide"},
		{edit(minimal, `style = "annular"`, `style = "spiral"`), "head.style", 8, "not a fin style"},
		{edit(minimal, "[air]", "[air]\nambiant = 3"), "air.ambiant", 22, `did you mean "air.ambient"`},
		{edit(minimal, `head_heat = "2 kW"`, `head_heat = "2 kW"`+"\nmass = \"200 kg\""), "load.mass", 26, "not used"},
		{edit(minimal, "[load]", "[limits]\nhead = \"30 C\"\n[load]"), "limits.head", 25, "outside the allowed range"},
		{edit(minimal, `name = "t"`, `name = "t`), "name", 1, "cannot contain newlines"},
	}
	for _, c := range cases {
		_, err := Parse([]byte(c.src), "x.toml")
		var es Errors
		if !errors.As(err, &es) || len(es) == 0 {
			t.Errorf("%s: want Errors, got %v", c.key, err)
			continue
		}
		e := es[0]
		if (c.key != "" && e.Key != c.key) || e.Line != c.line || !strings.Contains(e.Error(), c.frag) {
			t.Errorf("want %s at line %d with %q; got key %q line %d: %v", c.key, c.line, c.frag, e.Key, e.Line, e)
		}
	}
}

func TestMissingAndEmpty(t *testing.T) {
	for _, c := range []struct{ src, frag string }{
		{"", "empty"},
		{"\x00\x01\x02binary", "not text"},
		{strings.Replace(minimal, "[head]", "[headx]", 1), "unknown key"},
		{"name = \"x\"\n", "missing"},
	} {
		_, err := Parse([]byte(c.src), "x.toml")
		if err == nil || !strings.Contains(err.Error(), c.frag) {
			t.Errorf("want %q, got %v", c.frag, err)
		}
	}
}

func TestCustomAlloy(t *testing.T) {
	src := edit(minimal, `alloy = "A356-T6"`, `alloy = "shop"`) + "[alloys.shop]\nconductivity = \"140 W/mK\"\ndensity = \"2.7 g/cm3\"\nspecific_heat = \"900 J/kgK\"\n"
	d, err := Parse([]byte(src), "x.toml")
	if err != nil {
		t.Fatal(err)
	}
	if a := d.Case.Head.Alloy; !a.Custom || a.K300 != 140 || math.Abs(a.Density-2700) > 1e-9 {
		t.Errorf("custom alloy %+v", a)
	}
	bad := edit(src, `conductivity = "140 W/mK"`, `conductivity = "-1 W/mK"`)
	if _, err := Parse([]byte(bad), "x.toml"); err == nil || !strings.Contains(err.Error(), "alloys.shop.conductivity") {
		t.Errorf("bad custom alloy: %v", err)
	}
}

// FuzzParse: no input makes the parser panic, and an accepted design has
// finite, physical values.
func FuzzParse(f *testing.F) {
	// seeds: the demo designs and every file of the bad-input corpus
	ents, _ := os.ReadDir("../../../testdata/bad")
	for _, e := range ents {
		if strings.HasSuffix(e.Name(), ".toml") {
			if b, err := os.ReadFile(filepath.Join("../../../testdata/bad", e.Name())); err == nil {
				f.Add(b)
			}
		}
	}
	f.Add([]byte(minimal))
	f.Add(demo.Upright)
	f.Add(demo.LaidOver)
	f.Add([]byte(edit(minimal, `pitch = "9 mm"`, `pitch = "nan mm"`)))
	f.Add([]byte("[head]\ncount = 1e400\n"))
	f.Fuzz(func(t *testing.T, b []byte) {
		// a budget per input: any file up to the size limit parses or is
		// refused in well under a second (TestHostileShapes measures the
		// worst shapes at milliseconds; 2 s leaves room for a loaded machine)
		start := time.Now()
		d, err := Parse(b, "fuzz.toml")
		if took := time.Since(start); took > 2*time.Second {
			t.Fatalf("%d bytes took %v", len(b), took)
		}
		if err != nil {
			return
		}
		c := d.Case
		for _, v := range []float64{c.Speed, c.Ambient, c.Pressure, c.Tilt, c.Head.Set.Pitch, c.Barrel.Set.Height, d.HeadLimit} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("accepted non-finite value in %q", b)
			}
		}
	})
}

func FuzzQuantity(f *testing.F) {
	for _, s := range []string{"6 mm", "0.25 in", "35 C", "-40 F", "1e308 km", "1_000 m", ".5mm", "e5 m"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		for _, d := range []*dimension{dimLength, dimTemp, dimSpeed, dimHCoef} {
			v, err := parseString(s, d)
			if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
				t.Fatalf("%q gave %g", s, v)
			}
		}
	})
}

// The idle heat is the floor of the road load and the load at speed 0.
func TestIdleHeat(t *testing.T) {
	d, err := Parse(demo.Upright, "u.toml")
	if err != nil {
		t.Fatal(err)
	}
	if d.Load.Road.IdleHeat != 500 {
		t.Fatalf("idle heat %g", d.Load.Road.IdleHeat)
	}
	for _, v := range []float64{0, 3, 25} {
		l, err := d.Heat(v)
		if err != nil {
			t.Fatal(err)
		}
		if l.Head+l.Barrel < 500-1e-9 {
			t.Errorf("at %g m/s the load %g W is below idle", v, l.Head+l.Barrel)
		}
	}
	if l, _ := d.Heat(25); l.Head+l.Barrel <= 500 {
		t.Error("cruise load should exceed idle")
	}
}

func TestWith(t *testing.T) {
	d, err := Parse(demo.Upright, "u.toml")
	if err != nil {
		t.Fatal(err)
	}
	v, err := d.With(map[string]float64{"head.pitch": 0.01, "head.count": 7, "air.ambient": 313.15, "air.speed": 30})
	if err != nil {
		t.Fatal(err)
	}
	if v.Case.Head.Set.Pitch != 0.01 || v.Case.Head.Set.Count != 7 || v.Case.Ambient != 313.15 || v.Case.Speed != 30 {
		t.Errorf("With did not apply: %+v", v.Case.Head.Set)
	}
	if math.Abs(d.Case.Head.Set.Pitch-0.009) > 1e-15 {
		t.Error("With changed the original")
	}
	// the same rules as Parse: a pitch below the root thickness is refused with the key and the line
	_, err = d.With(map[string]float64{"head.pitch": 0.003})
	line := 1 + strings.Count(string(demo.Upright)[:strings.Index(string(demo.Upright), `pitch = "9 mm"`)], "\n")
	if err == nil || !strings.Contains(err.Error(), fmt.Sprintf("u.toml:%d: head.pitch", line)) {
		t.Errorf("bad variant: %v", err)
	}
	if _, err := d.With(map[string]float64{"head.count": 7.5}); err == nil {
		t.Error("fractional count accepted")
	}
	if _, err := d.With(map[string]float64{"head.colour": 1}); err == nil {
		t.Error("unknown key accepted")
	}
	if x, err := ParseFor("head.pitch", "7 mm"); err != nil || x != 0.007 {
		t.Errorf("ParseFor: %g %v", x, err)
	}
	if x, err := ParseFor("air.speed", "60 mph"); err != nil || math.Abs(x-26.8224) > 1e-9 {
		t.Errorf("ParseFor speed: %g %v", x, err)
	}
	keys := VaryKeys()
	for _, k := range []string{"head.pitch", "barrel.count", "air.ambient", "cylinder.tilt", "load.mass"} {
		found := false
		for _, kk := range keys {
			found = found || kk == k
		}
		if !found {
			t.Errorf("VaryKeys lacks %s: %v", k, keys)
		}
	}
}

// One variant of a design: what a sweep or the optimiser pays per point
// before the estimate.
func BenchmarkWith(b *testing.B) {
	d, err := Parse(demo.Upright, "u.toml")
	if err != nil {
		b.Fatal(err)
	}
	vals := map[string]float64{"head.pitch": 0.0095, "air.speed": 25}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := d.With(vals); err != nil {
			b.Fatal(err)
		}
	}
}

// A variant of a variant keeps the first variant's changes.
func TestWithChained(t *testing.T) {
	d, err := Parse(demo.Upright, "u.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := d.With(map[string]float64{"air.speed": 30})
	if err != nil {
		t.Fatal(err)
	}
	b, err := a.With(map[string]float64{"head.pitch": 0.0095})
	if err != nil {
		t.Fatal(err)
	}
	if b.Case.Speed != 30 || b.Case.Head.Set.Pitch != 0.0095 || d.Case.Speed == 30 || a.Case.Head.Set.Pitch == 0.0095 {
		t.Errorf("speeds %g/%g/%g, pitches %g/%g/%g", d.Case.Speed, a.Case.Speed, b.Case.Speed,
			d.Case.Head.Set.Pitch, a.Case.Head.Set.Pitch, b.Case.Head.Set.Pitch)
	}
}

// cylinder.casting's default is listed as applied only where a set takes
// it: with both fin sets naming their own process it is not, and each set
// keeps its own.
func TestCastingDefaultOnlyWhereTaken(t *testing.T) {
	src := strings.Replace(minimal, "[barrel]\n", "[barrel]\ncasting = \"sand\"\n", 1)
	src = strings.Replace(src, "[head]\n", "[head]\ncasting = \"die-casting\"\n", 1)
	d, err := Parse([]byte(src), "m.toml")
	if err != nil {
		t.Fatal(err)
	}
	for _, def := range d.Defaults {
		if strings.HasPrefix(def, "cylinder.casting") {
			t.Errorf("default listed though no set takes it: %s", def)
		}
	}
	if d.CastingOf(0).Name != "die-casting" || d.CastingOf(1).Name != "sand" || !d.SetCastKey[0] || !d.SetCastKey[1] {
		t.Errorf("sets' processes %q and %q", d.CastingOf(0).Name, d.CastingOf(1).Name)
	}
	one, err := Parse([]byte(strings.Replace(minimal, "[barrel]\n", "[barrel]\ncasting = \"sand\"\n", 1)), "m.toml")
	if err != nil {
		t.Fatal(err)
	}
	listed := false
	for _, def := range one.Defaults {
		listed = listed || strings.HasPrefix(def, "cylinder.casting")
	}
	if !listed || one.CastingOf(0).Name != DefaultCasting {
		t.Errorf("the head takes the default (%q) and it is listed: %v", one.CastingOf(0).Name, listed)
	}
}
