package app

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"finmarch/airflow/cylinder"
	"finmarch/cmd/internal/demo"
	"finmarch/cmd/internal/design"
)

// FuzzEstimate: any design the parser accepts must estimate without a
// panic, give finite numbers or a plain no-equilibrium, and render in every
// format without NaN or Inf. Seeds: the demo designs and the bad corpus.
func FuzzEstimate(f *testing.F) {
	f.Add(demo.Upright)
	f.Add(demo.LaidOver)
	f.Add([]byte(strings.Replace(string(demo.Upright), `speed = "90 km/h"`, `speed = "0 km/h"`, 1)))
	f.Add([]byte(strings.Replace(string(demo.LaidOver), `tilt = "90 deg"`, `tilt = "1 deg"`, 1)))
	ents, _ := os.ReadDir(badDir)
	for _, e := range ents {
		if b, err := os.ReadFile(filepath.Join(badDir, e.Name())); err == nil && strings.HasSuffix(e.Name(), ".toml") {
			f.Add(b)
		}
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		d, err := design.Parse(b, "fuzz.toml")
		if err != nil {
			return
		}
		_, err = evaluate(d, d.Case.Speed)
		if errors.Is(err, cylinder.ErrNotFinite) {
			t.Fatalf("%v for\n%s", err, b)
		}
		if err != nil {
			return // a plain model failure is an answer; a panic is not
		}
		e := &env{stdout: &bytes.Buffer{}, stderr: &bytes.Buffer{}, opt: &options{format: "table", units: "metric"}}
		for _, f := range []string{"table", "json", "csv"} {
			var out bytes.Buffer
			e.stdout, e.opt.format = &out, f
			_ = e.estimate(d)
			s := out.String()
			if strings.Contains(s, "NaN") || strings.Contains(s, "Inf") {
				t.Fatalf("%s output holds NaN or Inf:\n%s", f, s)
			}
		}
	})
}
