package app

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/santhosh-tekuri/jsonschema/v6"

	"finmarch/cmd/internal/design"
)

// schemaPath is the committed JSON Schema of every document --format json
// writes (README: "JSON output").
const schemaPath = "../output/schema/finmarch.schema.json"

func compileSchema(t *testing.T) *jsonschema.Schema {
	t.Helper()
	f, err := os.Open(schemaPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	doc, err := jsonschema.UnmarshalJSON(f)
	if err != nil {
		t.Fatal(err)
	}
	c := jsonschema.NewCompiler()
	if err := c.AddResource("finmarch.schema.json", doc); err != nil {
		t.Fatal(err)
	}
	s, err := c.Compile("finmarch.schema.json")
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func validate(s *jsonschema.Schema, js string) error {
	v, err := jsonschema.UnmarshalJSON(strings.NewReader(js))
	if err != nil {
		return err
	}
	return s.Validate(v)
}

// Every command's JSON, in the states it can be in (a band or none, no
// equilibrium, fixed walls, several designs, an invalid sweep point, both
// optimiser goals), validates against the committed schema, validated by a
// maintained JSON Schema library (santhosh-tekuri/jsonschema, draft
// 2020-12), not by the code that writes it.
func TestJSONSchema(t *testing.T) {
	s := compileSchema(t)
	up, lo := designs(t)
	dir := t.TempDir()
	src, _ := os.ReadFile(up)
	edited := func(name string, kv ...string) string {
		p := filepath.Join(dir, name)
		var kvs []design.KV
		for i := 0; i < len(kv); i += 2 {
			kvs = append(kvs, design.KV{Key: kv[i], Value: kv[i+1]})
		}
		if err := os.WriteFile(p, design.SetKeys(src, kvs), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	hot := edited("hot.toml", "load.cda", `"2.5 m2"`)
	fixed := edited("fixed.toml", "override.head_wall", `"200 C"`, "override.barrel_wall", `"150 C"`)
	measured := filepath.Join(dir, "measured.toml")
	if err := os.WriteFile(measured, append(append([]byte{}, src...), "\n[[measurement]]\nspeed = \"60 km/h\"\nambient = \"25 C\"\nhead = \"150 C\"\n\n[[measurement]]\nspeed = \"100 km/h\"\nambient = \"25 C\"\nhead = \"190 C\"\n"...), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := [][]string{
		{},
		{"estimate", up}, {"estimate", lo, "--samples", "0"}, {"estimate", up, lo, "--samples", "50"},
		{"estimate", hot, "--samples", "0"}, {"estimate", fixed, "--samples", "0"},
		{"compare", up, lo, "--samples", "50"}, {"compare", up, hot, "--samples", "0"},
		{"march", up}, {"march", lo},
		{"speeds", up, "--samples", "0"}, {"speeds", lo, "--samples", "20"},
		{"tilt", up, "--samples", "0"}, {"tilt", up, "--samples", "20", "--step", "45 deg"},
		{"sweep", up, "--vary", "head.pitch=4mm:10mm:1mm", "--vary", "air.speed=40km/h,120km/h"},
		{"optimise", up}, {"optimise", lo, "--set", "both", "--goal", "light"},
		{"calibrate", measured},
		{"fin", "--profile", "rectangular", "--height", "20 mm", "--root-thickness", "3 mm", "--h", "60 W/m2K"},
		{"fin", "--profile", "annular-tapered", "--height", "30 mm", "--root-thickness", "3 mm", "--tip-thickness", "1.5 mm", "--root-diameter", "90 mm", "--h", "80 W/m2K"},
		{"alloys"}, {"version"}, {"demo", "--fan", "--samples", "20"},
		{"ride", up, "--every", "5 min"}, {"ride", lo, "--profile", "mountain-pass", "--start", "steady", "--every", "10 min"}, {"ride", up, "--profile", "city-crawl", "--every", "10 min"},
	}
	for _, c := range cases {
		args := append(append([]string{}, c...), "-f", "json", "-q")
		out, errs, code := run(t, args...)
		if out == "" {
			t.Errorf("%v: no JSON (exit %d): %s", c, code, errs)
			continue
		}
		if len(c) > 1 && (c[1] == hot || c[1] == fixed) && !strings.Contains(out, map[bool]string{true: `"equilibrium": false`, false: `"fixed_walls": true`}[c[1] == hot]) {
			t.Errorf("%v: not the state it is meant to show", c)
		}
		docs := []string{out}
		if len(c) > 0 && c[0] == "sweep" {
			docs = strings.Split(strings.TrimSpace(out), "\n")
		}
		for _, d := range docs {
			if err := validate(s, d); err != nil {
				t.Errorf("%v: %v", c, err)
				break
			}
		}
	}
}

// The schema can fail: a key out of style, a list written as null, a
// number where a state belongs, a missing stamp and an unknown command are
// each refused.
func TestJSONSchemaRefuses(t *testing.T) {
	s := compileSchema(t)
	up, _ := designs(t)
	good, _, _ := run(t, "estimate", up, "-f", "json", "-q", "--samples", "0")
	if err := validate(s, good); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ old, new string }{
		{`"head_W"`, `"Head"`},
		{`"warnings": []`, `"warnings": null`},
		{`"status": "`, `"status": "fine`},
		{`"schema_version": 2`, `"schema_version": 1`},
		{`"command": "estimate"`, `"command": "estimates"`},
		{`"fin_mass_kg"`, `"fin_mass"`},
		{`"style": "annular"`, `"style": 0`},
	} {
		bad := strings.Replace(good, c.old, c.new, 1)
		if bad == good {
			t.Fatalf("%s not in the estimate's JSON", c.old)
		}
		if validate(s, bad) == nil {
			t.Errorf("the schema takes %s for %s", c.new, c.old)
		}
	}
	if !bytes.Contains([]byte(good), []byte(`"inputs"`)) {
		t.Error("no design echo")
	}
}
