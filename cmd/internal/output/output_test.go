package output

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// Display conversions against their definitions: F = C 9/5 + 32, mph =
// 0.44704 m/s, inch = 25.4 mm, lb = 0.45359237 kg (exact by definition);
// 1 Btu/(h ft2 F) = 5.678263 W/(m2 K) (NIST SP 811, 2008, Appendix B).
func TestUnits(t *testing.T) {
	us := Units{US: true}
	m := Units{}
	near := func(name string, got, want float64) {
		t.Helper()
		if math.Abs(got-want) > 1e-9*math.Max(1, math.Abs(want)) {
			t.Errorf("%s = %.12g, want %.12g", name, got, want)
		}
	}
	near("C", m.Of(Temp, 373.15), 100)
	near("F", us.Of(Temp, 373.15), 212)
	near("dF", us.Of(TempDiff, 10), 18)
	near("km/h", m.Of(Road, 25), 90)
	near("mph", us.Of(Road, 26.8224), 60)
	near("in", us.Of(Len, 0.0254), 1)
	near("mm", m.Of(Len, 0.0254), 25.4)
	near("lb", us.Of(Mass, 0.45359237), 1)
	near("Btu h", us.Of(H, 5.678263), 1)
	near("ft2", us.Of(Area, 0.09290304), 1)
	near("inHg", us.Of(Press, 3386.389), 1)
	if _, err := ParseUnits("cubits"); err == nil {
		t.Error("bad units accepted")
	}
}

func TestNum(t *testing.T) {
	cases := map[float64]string{1.25: "1.2", -0.04: "0.0", math.NaN(): "n/a", math.Inf(1): "n/a", 12.36: "12.4"}
	for v, want := range cases {
		if got := Num(v, 1); got != want {
			t.Errorf("Num(%g) = %q, want %q", v, got, want)
		}
	}
}

func TestWriteFormats(t *testing.T) {
	d := Doc{Title: "T", Grids: []Grid{{Title: "g", Header: []string{"q", "v (C)"}, Rows: [][]string{{"a", "1"}, {"b, c", "2"}}, Left: 1}},
		Notes: []string{"note"}, Warnings: []string{"w"}, Caution: true, JSON: map[string]any{"x": 1.5}}
	var b bytes.Buffer
	if err := Write(&b, d, Table); err != nil || !strings.Contains(b.String(), "v (C)") || !strings.Contains(b.String(), "not a measurement") {
		t.Errorf("table: %v\n%s", err, b.String())
	}
	b.Reset()
	if err := Write(&b, d, Markdown); err != nil || !strings.Contains(b.String(), "|:--") || !strings.Contains(b.String(), "> Caution") {
		t.Errorf("markdown: %v\n%s", err, b.String())
	}
	b.Reset()
	if err := Write(&b, d, CSV); err != nil || b.String() != "q,v (C)\na,1\n\"b, c\",2\n" {
		t.Errorf("csv: %v\n%q", err, b.String())
	}
	b.Reset()
	if err := Write(&b, d, JSON); err != nil {
		t.Fatal(err)
	}
	var v map[string]float64
	if json.Unmarshal(b.Bytes(), &v) != nil || v["x"] != 1.5 {
		t.Errorf("json: %s", b.String())
	}
	// NaN never reaches JSON output: encoding refuses it
	b.Reset()
	if err := Write(&b, Doc{JSON: map[string]float64{"x": math.NaN()}}, JSON); err == nil {
		t.Error("NaN encoded")
	}
	if _, err := ParseFormat("xml"); err == nil {
		t.Error("xml accepted")
	}
	if f, _ := ParseFormat("md"); f != Markdown {
		t.Error("md alias")
	}
}

// Every quantity has a metric and a US unit in the table, named, and a
// conversion that is finite and zero-preserving where the unit has no
// offset (temperatures have one: 0 K is -273.15 C, -459.67 F).
func TestUnitTable(t *testing.T) {
	for q := Temp; q <= PerMass; q++ {
		for _, u := range []Units{{}, {US: true}} {
			v := u.Of(q, 1)
			if u.Name(q) == "" || math.IsNaN(v) || math.IsInf(v, 0) || v == 0 {
				t.Errorf("quantity %d US %v: %q, 1 SI -> %g", q, u.US, u.Name(q), v)
			}
		}
	}
	if got := (Units{US: true}).Of(Temp, 0); math.Abs(got+459.67) > 1e-9 {
		t.Errorf("0 K is %g F", got)
	}
}

// A title with markup (a design's name) is escaped in a Markdown heading.
func TestMarkdownTitleEscaped(t *testing.T) {
	var b bytes.Buffer
	if err := Write(&b, Doc{Title: `<img src=x onerror=alert(1)> & co`}, Markdown); err != nil {
		t.Fatal(err)
	}
	if s := b.String(); strings.Contains(s, "<img") || !strings.Contains(s, "&lt;img") || !strings.Contains(s, "&amp; co") {
		t.Errorf("%q", s)
	}
}

// Headers fold at spaces until the table fits TableWidth, widest gain
// first, never between a number and its "%", and the values are never cut:
// a table whose values alone are wider stays as wide as they need.
func TestFitHeaders(t *testing.T) {
	long := "a header that is far wider than its values (C)"
	g := Grid{Header: []string{long, long, long, "head 5 % to 95 % (C)"}, Rows: [][]string{{"1.0", "2.0", "3.0", "154.6 to 308.1"}}}
	var b strings.Builder
	if err := Write(&b, Doc{Grids: []Grid{g}}, Table); err != nil {
		t.Fatal(err)
	}
	for _, l := range strings.Split(strings.TrimSpace(b.String()), "\n") {
		if n := len(l); n > TableWidth {
			t.Errorf("line of %d columns: %s", n, l)
		}
	}
	if !strings.Contains(b.String(), "head 5 %") || !strings.Contains(b.String(), "95 %") {
		t.Errorf("a fold between a number and its %%:\n%s", b.String())
	}
	if !strings.Contains(b.String(), "154.6 to 308.1") {
		t.Error("a value was cut")
	}
	// the space nearest the middle of "band 95 % (C)" is before its "%"
	if f := fitHeaders(Grid{Header: []string{"band 95 % (C)"}, Rows: [][]string{{"1"}}}, 12); f.Header[0] != "band\n95 % (C)" {
		t.Errorf("folded as %q", f.Header[0])
	}
	wide := Grid{Header: []string{"x", "y"}, Rows: [][]string{{strings.Repeat("9", 150), "1"}}}
	if f := fitHeaders(wide, TableWidth); f.Header[0] != "x" || f.Header[1] != "y" {
		t.Errorf("headers folded for nothing: %q", f.Header)
	}
}
