package app

import (
	"bufio"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

const badDir = "../../../testdata/bad"

// Every bad design in testdata/bad (written by gen_bad.py) goes through the
// real estimate command: it must exit with the expected code, print nothing
// on stdout, name the line where one applies, and carry the expected
// message fragment. No case may panic.
func TestBadDesignCorpus(t *testing.T) {
	f, err := os.Open(filepath.Join(badDir, "expect.tsv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	n := 0
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		l := sc.Text()
		if strings.HasPrefix(l, "#") || strings.TrimSpace(l) == "" {
			continue
		}
		p := strings.SplitN(l, "\t", 4)
		if len(p) != 4 {
			t.Fatalf("bad expect line %q", l)
		}
		code, _ := strconv.Atoi(p[1])
		line, _ := strconv.Atoi(p[2])
		path := filepath.Join(badDir, p[0])
		out, errs, got := run(t, "estimate", path)
		n++
		if got != code {
			t.Errorf("%s: exit %d, want %d\n%s", p[0], got, code, errs)
		}
		if out != "" {
			t.Errorf("%s: printed on stdout:\n%s", p[0], out)
		}
		if !strings.Contains(errs, p[3]) {
			t.Errorf("%s: message lacks %q:\n%s", p[0], p[3], errs)
		}
		if line > 0 && !strings.Contains(errs, p[0]+":"+p[2]+":") {
			t.Errorf("%s: message does not name line %d:\n%s", p[0], line, errs)
		}
		if strings.Contains(errs, "internal error") {
			t.Errorf("%s: %s", p[0], errs)
		}
	}
	if n < 50 {
		t.Fatalf("corpus has %d cases, want at least 50", n)
	}
	// a huge file is refused before parsing
	huge := filepath.Join(t.TempDir(), "huge.toml")
	os.WriteFile(huge, []byte(strings.Repeat("# padding line of a huge design file\n", 40000)), 0o644)
	if _, errs, got := run(t, "estimate", huge); got != ExitDesign || !strings.Contains(errs, "at most 1048576 bytes") {
		t.Errorf("huge file: exit %d %s", got, errs)
	}
}
