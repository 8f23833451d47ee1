package app

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A set's own casting key: an iron barrel sand cast under the demo's
// die-cast alloy head (a restorer's classic single). With the key the
// barrel is checked against the sand limits (common practice: 3 mm
// minimum, about 5:1) and no longer against die casting, whose alloys do
// not include iron; without it the iron barrel is a casting warning
// naming die casting. The optimiser keeps each set's process: --set barrel
// searches within the sand limits, --set head within die casting, and a
// bad process name in the key is refused with the key named.
func TestSetCasting(t *testing.T) {
	up, _ := designs(t)
	src, err := os.ReadFile(up)
	if err != nil {
		t.Fatal(err)
	}
	s := string(src)
	i := strings.Index(s, "[barrel]")
	j := i + strings.Index(s[i:], "alloy = \"A356-T6\"")
	iron := s[:j] + "alloy = \"grey-iron\"\ncasting = \"sand\"\n" + s[j+len("alloy = \"A356-T6\"\n"):]
	dir := t.TempDir()
	write := func(name, body string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	withKey := write("iron.toml", iron)
	without := write("iron-nokey.toml", strings.Replace(iron, "casting = \"sand\"\n", "", 1))

	_, errs, code := run(t, "estimate", without, "--samples", "0")
	if code != 0 || !strings.Contains(errs, "barrel fins: alloy grey-iron") || !strings.Contains(errs, "die casting") {
		t.Errorf("iron barrel under die casting: exit %d, warnings %q", code, errs)
	}
	_, errs, code = run(t, "estimate", withKey, "--samples", "0")
	if code != 0 || strings.Contains(errs, "alloy grey-iron") {
		t.Errorf("iron barrel with its own sand casting: exit %d, warnings %q", code, errs)
	}
	// the demo's barrel fins (1.8 mm tips, 5.5:1) break the sand limits,
	// and say so by the sand figures
	if !strings.Contains(errs, "thinner than the sand minimum 3.00 mm") {
		t.Errorf("the barrel is not checked against the sand limits: %q", errs)
	}
	type optJSON struct {
		Process struct {
			Name         string  `json:"name"`
			MinThickness float64 `json:"min_thickness_m"`
		} `json:"process"`
		Optimum struct {
			Tip float64 `json:"tip_thickness_m"`
		} `json:"optimum"`
	}
	for _, c := range []struct {
		set, process string
		min          float64
	}{{"barrel", "sand", 0.003}, {"head", "die-casting", 0.0012}} {
		var v optJSON
		runJSON(t, &v, "optimise", withKey, "--set", c.set)
		if v.Process.Name != c.process || v.Process.MinThickness != c.min || v.Optimum.Tip < c.min-1e-12 {
			t.Errorf("optimise --set %s: process %q (minimum %g m), optimum tip %g m; want %s, %g m", c.set, v.Process.Name, v.Process.MinThickness, v.Optimum.Tip, c.process, c.min)
		}
	}
	// the notes name the keys each process came from
	txt, _, _ := run(t, "tilt", withKey, "--samples", "0", "-q")
	if flat := strings.Join(strings.Fields(txt), " "); !strings.Contains(flat, "head die-casting (cylinder.casting) and barrel sand (barrel.casting)") {
		t.Errorf("tilt's casting note does not name the keys:\n%s", txt)
	}
	bad := write("bad.toml", strings.Replace(iron, "casting = \"sand\"", "casting = \"forged\"", 1))
	_, errs, code = run(t, "estimate", bad)
	if code != ExitDesign || !strings.Contains(errs, "barrel.casting") {
		t.Errorf("a bad barrel.casting: exit %d %q", code, errs)
	}
}

// --set both keeps each set's process in the JSON: process is the head's
// (die casting, 1.2 mm), barrel_process the barrel's own (sand, 3 mm),
// each with its real limits, not a joined name.
func TestSetCastingBoth(t *testing.T) {
	up, _ := designs(t)
	src, _ := os.ReadFile(up)
	s := string(src)
	i := strings.Index(s, "\n[barrel]")
	j := i + strings.Index(s[i:], "alloy = \"A356-T6\"")
	p := filepath.Join(t.TempDir(), "iron.toml")
	if err := os.WriteFile(p, []byte(s[:j]+"alloy = \"grey-iron\"\ncasting = \"sand\"\n"+s[j+len("alloy = \"A356-T6\"\n"):]), 0o644); err != nil {
		t.Fatal(err)
	}
	type process struct {
		Name string  `json:"name"`
		Min  float64 `json:"min_thickness_m"`
	}
	var v struct {
		Process process `json:"process"`
		Barrel  process `json:"barrel_process"`
	}
	runJSON(t, &v, "optimise", p, "--set", "both", "--samples", "0")
	if v.Process.Name != "die-casting" || v.Process.Min != 0.0012 || v.Barrel.Name != "sand" || v.Barrel.Min != 0.003 {
		t.Errorf("process %+v, barrel_process %+v", v.Process, v.Barrel)
	}
}
