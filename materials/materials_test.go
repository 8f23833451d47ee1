package materials

import (
	"errors"
	"strings"
	"testing"
)

// The catalogue covers the alloys fins are cast or cut from: two sand/permanent-mould
// aluminium alloys, one die-casting alloy, two wrought alloys, pure
// aluminium, grey iron and a magnesium alloy.
func TestCatalogueCoverage(t *testing.T) {
	count := map[string]int{}
	for _, a := range All() {
		switch {
		case strings.Contains(a.Kind, "sand") || strings.Contains(a.Kind, "permanent"):
			count["cast"]++
		case strings.Contains(a.Kind, "die") && !strings.Contains(a.Kind, "magnesium"):
			count["die"]++
		case strings.Contains(a.Kind, "wrought"):
			count["wrought"]++
		case a.Kind == "pure metal":
			count["pure"]++
		case strings.Contains(a.Kind, "iron"):
			count["iron"]++
		case strings.Contains(a.Kind, "magnesium"):
			count["mg"]++
		}
	}
	want := map[string]int{"cast": 2, "die": 1, "wrought": 2, "pure": 1, "iron": 1, "mg": 1}
	for k, n := range want {
		if count[k] < n {
			t.Errorf("catalogue has %d %s alloys, want at least %d", count[k], k, n)
		}
	}
}

// Every row names its source and holds physical values.
func TestCatalogueRowsSourced(t *testing.T) {
	for _, a := range All() {
		if a.Source == "" || a.EmissSource == "" || a.LimitSource == "" {
			t.Errorf("%s: missing source", a.Name)
		}
		if a.K300 <= 0 || a.Density <= 0 || a.Cp <= 0 || a.EmissBare <= 0 || a.EmissBare > 1 ||
			a.EmissPaint <= a.EmissBare || a.EmissPaint > 1 || a.MaxService < 373 {
			t.Errorf("%s: implausible row %+v", a.Name, a)
		}
		for i := 1; i < len(a.KTable); i++ {
			if a.KTable[i].T <= a.KTable[i-1].T {
				t.Errorf("%s: conductivity table not sorted", a.Name)
			}
		}
	}
}

// Handbook rows checked against Incropera et al., 6th ed., Table A.1
// (from memory): pure aluminium k = 237, 240, 231 W/(m K) at 300, 400,
// 600 K; 2024-T6 k = 177 at 300 K and 186 at 400 K; rho and cp at 300 K.
func TestHandbookValues(t *testing.T) {
	cases := []struct {
		name string
		T, k float64
	}{
		{"pure-aluminium", 300, 237},
		{"pure-aluminium", 400, 240},
		{"pure-aluminium", 600, 231},
		{"pure-aluminium", 500, 235.5}, // linear between 400 and 600 K
		{"2024-T6", 300, 177},
		{"2024-T6", 400, 186},
		{"2024-T6", 1000, 186}, // held beyond the table
		{"195-cast", 400, 174},
		{"A356-T6", 450, 151}, // no table: constant
	}
	for _, c := range cases {
		a, err := Lookup(c.name)
		if err != nil {
			t.Fatal(err)
		}
		if got := a.Conductivity(c.T); got != c.k {
			t.Errorf("%s k(%g K) = %g, want %g", c.name, c.T, got, c.k)
		}
	}
	al, _ := Lookup("pure-aluminium")
	if al.Density != 2702 || al.Cp != 903 {
		t.Errorf("pure aluminium rho, cp = %g, %g; Incropera Table A.1 gives 2702, 903", al.Density, al.Cp)
	}
}

func TestLookupSpellings(t *testing.T) {
	for _, s := range []string{"a356-t6", "A356", "a356 t6", "GRAY-IRON", "cast_iron", "az91d", "Aluminum", "6061"} {
		if _, err := Lookup(s); err != nil {
			t.Errorf("Lookup(%q): %v", s, err)
		}
	}
}

func TestLookupSuggests(t *testing.T) {
	cases := []struct{ typo, want string }{
		{"A365-T6", "A356-T6"},
		{"grey-irn", "grey-iron"},
		{"6016-T6", "6061-T6"},
		{"AZ19D", "AZ91D"},
	}
	for _, c := range cases {
		_, err := Lookup(c.typo)
		if !errors.Is(err, ErrUnknown) {
			t.Fatalf("%q: want ErrUnknown, got %v", c.typo, err)
		}
		if !strings.Contains(err.Error(), `did you mean "`+c.want+`"`) {
			t.Errorf("%q: message %q lacks suggestion %q", c.typo, err, c.want)
		}
	}
	_, err := Lookup("unobtainium")
	if err == nil || strings.Contains(err.Error(), "did you mean") {
		t.Errorf("far name should get no suggestion: %v", err)
	}
}

// Levenshtein distances of textbook pairs (kitten/sitting = 3 is the classic
// example in Levenshtein's 1966 paper's literature; flaw/lawn = 2).
func TestDistance(t *testing.T) {
	cases := []struct {
		a, b string
		d    int
	}{{"kitten", "sitting", 3}, {"flaw", "lawn", 2}, {"", "abc", 3}, {"same", "same", 0}}
	for _, c := range cases {
		if got := Distance(c.a, c.b); got != c.d {
			t.Errorf("Distance(%q,%q) = %d, want %d", c.a, c.b, got, c.d)
		}
	}
}

func TestCustom(t *testing.T) {
	a, err := Custom("shop alloy", 140, 2700, 900, 0.3, 0.9, 520, []Point{{500, 150}, {300, 140}})
	if err != nil {
		t.Fatal(err)
	}
	if !a.Custom || a.KTable[0].T != 300 || a.Conductivity(400) != 145 {
		t.Fatalf("custom alloy wrong: %+v", a)
	}
	bad := []struct {
		name                    string
		k, rho, cp, eb, ep, max float64
		table                   []Point
		frag                    string
	}{
		{"x", -1, 2700, 900, 0.2, 0.9, 500, nil, "conductivity"},
		{"x", 100, 0, 900, 0.2, 0.9, 500, nil, "density"},
		{"x", 100, 2700, 900, 1.5, 0.9, 500, nil, "emissivity"},
		{"x", 100, 2700, 900, 0.2, 0.9, 100, nil, "max_service"},
		{"x", 100, 2700, 900, 0.2, 0.9, 500, []Point{{300, 100}, {300, 110}}, "repeats"},
		{"", 100, 2700, 900, 0.2, 0.9, 500, nil, "name is empty"},
	}
	for _, b := range bad {
		_, err := Custom(b.name, b.k, b.rho, b.cp, b.eb, b.ep, b.max, b.table)
		if err == nil || !strings.Contains(err.Error(), b.frag) {
			t.Errorf("want error with %q, got %v", b.frag, err)
		}
	}
}

// Alloy against process (common practice, issue 22): every catalogue row
// names the processes its fins are made by, each a fins.Process name; a
// wrought alloy refuses casting, a pressure die-casting alloy refuses sand,
// a sand and permanent-mould alloy takes die-casting with a note (gravity
// dies are permanent moulds), and a custom alloy takes any process.
func TestProcessFit(t *testing.T) {
	known := map[string]bool{"sand": true, "permanent-mould": true, "die-casting": true, "machined": true}
	for _, a := range All() {
		for _, m := range a.Made {
			if !known[m] {
				t.Errorf("%s: unknown process %q", a.Name, m)
			}
		}
		if a.Name != "pure-aluminium" && len(a.Made) == 0 {
			t.Errorf("%s names no process", a.Name)
		}
	}
	get := func(n string) Alloy {
		a, err := Lookup(n)
		if err != nil {
			t.Fatal(err)
		}
		return a
	}
	for _, c := range []struct {
		alloy, process string
		ok, note       bool
	}{
		{"6061-T6", "sand", false, true}, {"6061-T6", "die-casting", false, true}, {"6061-T6", "machined", true, false},
		{"A380-F", "sand", false, true}, {"A380-F", "die-casting", true, false},
		{"A356-T6", "permanent-mould", true, false}, {"A356-T6", "die-casting", true, true}, {"A356-T6", "machined", false, true},
		{"grey-iron", "sand", true, false}, {"A356-T6", "", true, false},
	} {
		ok, note := get(c.alloy).ProcessFit(c.process)
		if ok != c.ok || (note != "") != c.note || get(c.alloy).MadeBy(c.process) != ok {
			t.Errorf("%s by %q: fits %v, note %q", c.alloy, c.process, ok, note)
		}
	}
	if ok, note := (Alloy{Name: "shop-mix", Custom: true}).ProcessFit("sand"); !ok || note != "" {
		t.Errorf("a custom alloy: %v %q", ok, note)
	}
}
