package app

import (
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// Every hostile ride file and points file of testdata/bad/readers.tsv
// (written by gen_bad.py) goes through the real command on the upright
// demo (ride --profile, calibrate --points): it must exit with the
// expected code, name the file and the line where one applies, and carry
// the expected message fragment (on stdout when it must succeed, with
// nothing on stdout when it must fail). No case may panic.
func TestReaderCorpus(t *testing.T) {
	up, _ := designs(t)
	n := 0
	for _, p := range tsvRows(t, "readers.tsv", 5) {
		code, err1 := strconv.Atoi(p[2])
		line, err2 := strconv.Atoi(p[3])
		if err1 != nil || err2 != nil || p[4] == "" {
			t.Fatalf("bad readers.tsv row %q", p)
		}
		path := filepath.Join(badDir, p[1])
		var args []string
		switch p[0] {
		case "ride":
			args = []string{"ride", up, "--profile", path, "--every", "10 min"}
		case "calibrate":
			args = []string{"calibrate", up, "--points", path}
		default:
			t.Fatalf("readers.tsv: unknown command %q", p[0])
		}
		out, errs, got := run(t, args...)
		n++
		if got != code {
			t.Errorf("%s: exit %d, want %d\n%s", p[1], got, code, errs)
		}
		if strings.Contains(errs, "internal error") {
			t.Errorf("%s: %s", p[1], errs)
		}
		if code == 0 {
			if !strings.Contains(out, p[4]) {
				t.Errorf("%s: output lacks %q:\n%s", p[1], p[4], out)
			}
			continue
		}
		if out != "" {
			t.Errorf("%s: printed on stdout:\n%s", p[1], out)
		}
		if !strings.Contains(errs, p[4]) {
			t.Errorf("%s: message lacks %q:\n%s", p[1], p[4], errs)
		}
		if !strings.Contains(errs, p[1]) || line > 0 && !strings.Contains(errs, p[1]+":"+p[3]+":") {
			t.Errorf("%s: message does not name the file and line %d:\n%s", p[1], line, errs)
		}
	}
	if n < 30 {
		t.Fatalf("readers.tsv has %d cases, want at least 30", n)
	}
}
