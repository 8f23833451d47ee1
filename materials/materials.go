package materials

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"
)

// Finish selects which emissivity of an alloy applies.
type Finish int

const (
	// AsCast is bare metal as it leaves the mould (lightly oxidised).
	AsCast Finish = iota
	// Painted is a black heat-resistant paint or a dark coating.
	Painted
)

// String names the finish as the design file spells it.
func (f Finish) String() string {
	if f == Painted {
		return "painted"
	}
	return "as-cast"
}

// Point is one conductivity value at one temperature.
type Point struct {
	T float64 `json:"temperature_K"`     // K
	K float64 `json:"conductivity_W_mK"` // W/(m K)
}

// Alloy is one catalogue entry.
type Alloy struct {
	Name        string   `json:"name"`                   // catalogue name, e.g. "A356-T6"
	Aliases     []string `json:"aliases"`                // other spellings accepted by Lookup
	Kind        string   `json:"kind"`                   // e.g. "sand / permanent-mould casting"
	K300        float64  `json:"conductivity_300K_W_mK"` // thermal conductivity at 300 K, W/(m K)
	KTable      []Point  `json:"conductivity_table"`     // conductivity against temperature, sorted by T; may be empty
	Density     float64  `json:"density_kg_m3"`          // kg/m3
	Cp          float64  `json:"specific_heat_J_kgK"`    // specific heat at 300 K, J/(kg K)
	EmissBare   float64  `json:"emissivity_bare"`        // hemispherical emissivity, bare as-cast surface, -
	EmissPaint  float64  `json:"emissivity_painted"`     // hemispherical emissivity, black paint, -
	MaxService  float64  `json:"max_service_K"`          // sensible maximum metal temperature, K
	Source      string   `json:"source"`                 // where K300, Density and Cp come from
	EmissSource string   `json:"emissivity_source"`      // where the emissivities come from
	LimitSource string   `json:"limit_source"`           // where MaxService comes from
	Custom      bool     `json:"custom"`                 // defined by the user, not in the catalogue
	// Made lists the fin-making processes (fins.Process names: sand,
	// permanent-mould, die-casting, machined) the alloy is made by in
	// common practice; empty: any (a custom alloy, pure aluminium)
	Made []string `json:"-"`
}

// ProcessFit says whether fins of the alloy can be made by the named
// process (common practice): false with the reason where they cannot (a
// wrought alloy cast, a pressure die-casting alloy poured in sand); true
// with a note where the pairing needs a word (an alloy for sand and
// permanent moulds named with the die-casting limits, which hold for
// pressure dies: gravity and low-pressure dies take it, pressure dies use
// other alloys); true and "" otherwise.
func (a Alloy) ProcessFit(process string) (bool, string) {
	if process == "" || a.Custom || len(a.Made) == 0 || slices.Contains(a.Made, process) {
		return true, ""
	}
	if a.MadeBy(process) {
		return true, fmt.Sprintf("%s is poured in sand and permanent moulds (gravity or low-pressure dies); the die-casting limits are those of pressure dies, which use alloys such as A380-F (96 W/mK against %.0f, a 200 C service limit): name the alloy your foundry pours (common practice)", a.Name, a.K300)
	}
	var by []string
	for _, m := range a.Made {
		by = append(by, processWords[m])
	}
	return false, fmt.Sprintf("alloy %s (%s) is not made into fins by %s in common practice, only by %s: name the alloy or the process (cylinder.casting, or the set's own casting key) your fins are made of", a.Name, a.Kind, processWords[process], strings.Join(by, " or "))
}

// MadeBy is ProcessFit's verdict alone, without building its words (a
// sweep asks it at every point).
func (a Alloy) MadeBy(process string) bool {
	return process == "" || a.Custom || len(a.Made) == 0 || slices.Contains(a.Made, process) ||
		(process == "die-casting" && slices.Contains(a.Made, "permanent-mould"))
}

// processWords names the fin-making processes in a sentence.
var processWords = map[string]string{"sand": "sand casting", "permanent-mould": "permanent-mould casting", "die-casting": "pressure die casting", "machined": "machining"}

// MarshalJSON writes the alloy with its aliases and conductivity table as
// lists, empty rather than null when it has none.
func (a Alloy) MarshalJSON() ([]byte, error) {
	type plain Alloy
	if a.Aliases == nil {
		a.Aliases = []string{}
	}
	if a.KTable == nil {
		a.KTable = []Point{}
	}
	return json.Marshal(plain(a))
}

// Conductivity returns k(T) in W/(m K) at temperature T in K. Between table
// points it interpolates linearly (the handbook tables are given at 100 K
// steps and vary smoothly); outside the table it holds the end value, since
// extrapolating a handbook table is not safer than holding it. With no
// table it returns K300.
func (a Alloy) Conductivity(T float64) float64 {
	tb := a.KTable
	if len(tb) == 0 {
		return a.K300
	}
	if T <= tb[0].T {
		return tb[0].K
	}
	for i := 1; i < len(tb); i++ {
		if T <= tb[i].T {
			f := (T - tb[i-1].T) / (tb[i].T - tb[i-1].T)
			return tb[i-1].K + f*(tb[i].K-tb[i-1].K)
		}
	}
	return tb[len(tb)-1].K
}

// Emissivity returns the emissivity for a finish.
func (a Alloy) Emissivity(f Finish) float64 {
	if f == Painted {
		return a.EmissPaint
	}
	return a.EmissBare
}

const (
	incropera  = "Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer, 6th ed. (2007), Table A.1 (from memory)"
	asmAl      = "ASM Handbook Vol. 2, Properties and Selection: Nonferrous Alloys (1990), aluminium alloy data sheets (from memory)"
	asmMg      = "ASM Handbook Vol. 2 (1990), magnesium alloy data sheets (from memory)"
	asmFe      = "ASM Handbook Vol. 1, Properties and Selection: Irons, Steels (1990), grey iron, class 30 (from memory)"
	emissAl    = "bare: common practice for rough, oxidised cast aluminium (polished is 0.02-0.05, Incropera 6th ed. Table A.11, from memory); painted: black paint 0.90-0.98, Incropera 6th ed. Table A.11 (from memory)"
	emissMg    = "bare: common practice for oxidised cast magnesium; painted: black paint, Incropera 6th ed. Table A.11 (from memory)"
	emissFe    = "bare: oxidised cast iron about 0.6-0.8 (Incropera 6th ed. Table A.11, from memory); painted: black paint, same table (from memory)"
	limitAlCst = "common practice: aluminium casting alloys lose temper and fatigue strength quickly above about 250 C at the head"
	limitAlWr  = "common practice: heat-treated wrought aluminium over-ages above about 200 C in long service"
	limitFe    = "common practice: grey iron barrels and heads are run to about 400 C"
	limitMg    = "common practice: AZ91 creeps under load above about 150 C"
)

var catalogue = []Alloy{
	{Name: "A356-T6", Aliases: []string{"A356", "356-T6", "AlSi7Mg"}, Kind: "sand / permanent-mould casting",
		K300: 151, Density: 2685, Cp: 963, EmissBare: 0.20, EmissPaint: 0.90, MaxService: 523.15,
		Source: asmAl, EmissSource: emissAl, LimitSource: limitAlCst, Made: []string{"sand", "permanent-mould"}},
	{Name: "319-F", Aliases: []string{"319", "AlSi6Cu4"}, Kind: "sand / permanent-mould casting",
		K300: 109, Density: 2790, Cp: 963, EmissBare: 0.20, EmissPaint: 0.90, MaxService: 523.15,
		Source: asmAl, EmissSource: emissAl, LimitSource: limitAlCst, Made: []string{"sand", "permanent-mould"}},
	{Name: "195-cast", Aliases: []string{"195", "Al-4.5Cu"}, Kind: "sand casting (Al-4.5% Cu)",
		K300: 168, KTable: []Point{{300, 168}, {400, 174}, {600, 185}}, Density: 2790, Cp: 883,
		EmissBare: 0.20, EmissPaint: 0.90, MaxService: 523.15,
		Source: incropera, EmissSource: emissAl, LimitSource: limitAlCst, Made: []string{"sand"}},
	{Name: "A380-F", Aliases: []string{"A380", "380"}, Kind: "die casting",
		K300: 96.2, Density: 2710, Cp: 963, EmissBare: 0.20, EmissPaint: 0.90, MaxService: 473.15,
		Source: asmAl, EmissSource: emissAl, LimitSource: "common practice: die castings are porous and are not solution treated; about 200 C", Made: []string{"die-casting"}},
	{Name: "6061-T6", Aliases: []string{"6061"}, Kind: "wrought, machined fins",
		K300: 167, Density: 2700, Cp: 896, EmissBare: 0.10, EmissPaint: 0.90, MaxService: 473.15,
		Source: asmAl, EmissSource: "bare: common practice for machined, lightly oxidised aluminium; painted: black paint, Incropera 6th ed. Table A.11 (from memory)", LimitSource: limitAlWr, Made: []string{"machined"}},
	{Name: "2024-T6", Aliases: []string{"2024"}, Kind: "wrought",
		K300: 177, KTable: []Point{{200, 163}, {300, 177}, {400, 186}, {600, 186}}, Density: 2770, Cp: 875,
		EmissBare: 0.10, EmissPaint: 0.90, MaxService: 473.15,
		Source: incropera, EmissSource: "bare: common practice for machined, lightly oxidised aluminium; painted: black paint, Incropera 6th ed. Table A.11 (from memory)", LimitSource: limitAlWr, Made: []string{"machined"}},
	{Name: "pure-aluminium", Aliases: []string{"aluminium", "aluminum", "pure-aluminum", "Al", "1100"}, Kind: "pure metal",
		K300: 237, KTable: []Point{{200, 237}, {300, 237}, {400, 240}, {600, 231}, {800, 218}}, Density: 2702, Cp: 903,
		EmissBare: 0.10, EmissPaint: 0.90, MaxService: 473.15,
		Source: incropera, EmissSource: emissAl, LimitSource: "common practice: pure aluminium is soft; about 200 C"},
	{Name: "grey-iron", Aliases: []string{"gray-iron", "cast-iron", "grey-cast-iron", "class-30"}, Kind: "grey cast iron, class 30",
		K300: 47, Density: 7150, Cp: 490, EmissBare: 0.70, EmissPaint: 0.90, MaxService: 673.15,
		Source: asmFe, EmissSource: emissFe, LimitSource: limitFe, Made: []string{"sand"}},
	{Name: "AZ91D", Aliases: []string{"AZ91", "magnesium"}, Kind: "magnesium die casting",
		K300: 72.7, Density: 1810, Cp: 1050, EmissBare: 0.15, EmissPaint: 0.90, MaxService: 423.15,
		Source: asmMg, EmissSource: emissMg, LimitSource: limitMg, Made: []string{"die-casting"}},
}

// All returns a copy of the catalogue in a stable order.
func All() []Alloy {
	out := make([]Alloy, len(catalogue))
	copy(out, catalogue)
	return out
}

var normReplacer = strings.NewReplacer(" ", "", "-", "", "_", "", ".", "")

func norm(s string) string {
	return normReplacer.Replace(strings.ToLower(strings.TrimSpace(s)))
}

// ErrUnknown is returned (wrapped) by Lookup for a name not in the catalogue.
var ErrUnknown = errors.New("unknown alloy")

// Lookup finds an alloy by name or alias, ignoring case, spaces, hyphens and
// underscores. For an unknown name the error carries a "did you mean"
// suggestion when a catalogue name is close.
func Lookup(name string) (Alloy, error) {
	n := norm(name)
	for _, a := range catalogue {
		if norm(a.Name) == n {
			return a, nil
		}
		for _, al := range a.Aliases {
			if norm(al) == n {
				return a, nil
			}
		}
	}
	msg := fmt.Sprintf("%q is not in the alloy catalogue", name)
	if s := Suggest(name); s != "" {
		msg += fmt.Sprintf(" (did you mean %q?)", s)
	}
	return Alloy{}, fmt.Errorf("%w: %s; known: %s", ErrUnknown, msg, strings.Join(Names(), ", "))
}

// Names lists the catalogue names.
func Names() []string {
	out := make([]string, len(catalogue))
	for i, a := range catalogue {
		out[i] = a.Name
	}
	return out
}

// Suggest returns the catalogue name closest to name by edit distance, or ""
// when nothing is close (distance more than a third of the name's length,
// at least 2).
func Suggest(name string) string {
	n := norm(name)
	best, bestD := "", math.MaxInt
	for _, a := range catalogue {
		for _, cand := range append([]string{a.Name}, a.Aliases...) {
			if d := Distance(n, norm(cand)); d < bestD {
				best, bestD = a.Name, d
			}
		}
	}
	lim := len(n) / 3
	if lim < 2 {
		lim = 2
	}
	if bestD > lim {
		return ""
	}
	return best
}

// Distance is the Levenshtein edit distance between a and b (Levenshtein,
// 1966), counted in bytes.
func Distance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			c := 1
			if a[i-1] == b[j-1] {
				c = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+c)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}

// Custom builds a user-defined alloy and checks that every value is
// physical. k in W/(m K), density in kg/m3, cp in J/(kg K), emissivities in
// (0, 1], maxService in K. table may be nil; when given it must be sorted by
// temperature with positive conductivities.
func Custom(name string, k, density, cp, emissBare, emissPaint, maxService float64, table []Point) (Alloy, error) {
	if strings.TrimSpace(name) == "" {
		return Alloy{}, errors.New("custom alloy: name is empty")
	}
	checks := []struct {
		key    string
		v      float64
		lo, hi float64
		unit   string
	}{
		{"conductivity", k, 1, 500, "W/(m K)"},
		{"density", density, 500, 20000, "kg/m3"},
		{"specific_heat", cp, 100, 3000, "J/(kg K)"},
		{"emissivity", emissBare, 0.01, 1, "-"},
		{"emissivity_painted", emissPaint, 0.01, 1, "-"},
		{"max_service", maxService, 300, 1500, "K"},
	}
	for _, c := range checks {
		if math.IsNaN(c.v) || c.v < c.lo || c.v > c.hi {
			return Alloy{}, fmt.Errorf("custom alloy %q: %s = %g is outside %g to %g %s", name, c.key, c.v, c.lo, c.hi, c.unit)
		}
	}
	// a sane ceiling for the family the density says it belongs to (common
	// practice: light alloys lose most of their strength above about
	// 350 C and melt near 600 C; irons, steels and bronzes stay useful to
	// about 700 C)
	family, ceiling := "light alloys (below 3500 kg/m3)", 623.15
	if density >= 3500 {
		family, ceiling = "irons, steels and bronzes", 973.15
	}
	if maxService > ceiling {
		return Alloy{}, fmt.Errorf("custom alloy %q: max_service = %g K (%.0f C) is above the %.0f C that %s keep in service (common practice)", name, maxService, maxService-273.15, ceiling-273.15, family)
	}
	tb := append([]Point(nil), table...)
	sort.SliceStable(tb, func(i, j int) bool { return tb[i].T < tb[j].T })
	for i, p := range tb {
		if math.IsNaN(p.K) || p.K < 1 || p.K > 500 || math.IsNaN(p.T) || p.T <= 0 {
			return Alloy{}, fmt.Errorf("custom alloy %q: conductivity table point %d (T = %g K, k = %g W/(m K)) is not physical", name, i+1, p.T, p.K)
		}
		if i > 0 && p.T == tb[i-1].T {
			return Alloy{}, fmt.Errorf("custom alloy %q: conductivity table repeats T = %g K", name, p.T)
		}
	}
	return Alloy{Name: name, Kind: "user defined", K300: k, KTable: tb, Density: density, Cp: cp,
		EmissBare: emissBare, EmissPaint: emissPaint, MaxService: maxService,
		Source: "user supplied", EmissSource: "user supplied", LimitSource: "user supplied", Custom: true}, nil
}
