package app

import (
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
// tsvRows are the rows of a corpus table in badDir: tab-separated, n
// fields each (the last takes the rest of the line), skipping blank lines
// and # comments; a row of another width fails the test.
func tsvRows(t *testing.T, name string, n int) [][]string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join(badDir, name))
	if err != nil {
		t.Fatal(err)
	}
	var rows [][]string
	for _, l := range strings.Split(string(b), "\n") {
		if strings.HasPrefix(l, "#") || strings.TrimSpace(l) == "" {
			continue
		}
		p := strings.SplitN(strings.TrimRight(l, "\r"), "\t", n)
		if len(p) != n {
			t.Fatalf("bad %s line %q", name, l)
		}
		rows = append(rows, p)
	}
	return rows
}

func TestBadDesignCorpus(t *testing.T) {
	n := 0
	for _, p := range tsvRows(t, "expect.tsv", 4) {
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
