package validity

import (
	"math"
	"strings"
	"testing"
)

func TestLogOncePerCause(t *testing.T) {
	var l Log
	if !l.Check("Gnielinski", "Re", 5000, 3000, 5e6) {
		t.Fatal("in range reported as outside")
	}
	l.Check("Gnielinski", "Re", 2000, 3000, 5e6)
	l.Check("Gnielinski", "Re", 1500, 3000, 5e6)
	l.Check("Gnielinski", "Pr", 0.1, 0.5, 2000)
	if l.Len() != 2 {
		t.Fatalf("want 2 causes, got %d", l.Len())
	}
	ws := l.Warnings()
	if ws[1].Quantity != "Re" || ws[1].SeenMin != 1500 || ws[1].SeenMax != 2000 || ws[1].Count != 2 {
		t.Fatalf("bad record %+v", ws[1])
	}
	if s := ws[1].String(); !strings.Contains(s, "Re = 1500 to 2000") || !strings.Contains(s, "valid 3000 to 5e+06") {
		t.Fatalf("message %q", s)
	}
}

func TestNilLogAndNaN(t *testing.T) {
	var l *Log
	if l.Check("x", "y", math.NaN(), 0, 1) {
		t.Fatal("NaN must be outside")
	}
	if l.Len() != 0 || l.Warnings() != nil {
		t.Fatal("nil log recorded")
	}
	var m Log
	m.Check("x", "y", math.NaN(), 0, 1)
	if m.Len() != 1 {
		t.Fatal("NaN not recorded")
	}
}

func TestMerge(t *testing.T) {
	var a, b Log
	a.Check("c", "q", 5, 0, 1)
	b.Check("c", "q", 7, 0, 1)
	b.Check("c", "q", 9, 0, 1)
	b.Check("d", "q", -1, 0, 1)
	a.Merge(&b)
	ws := a.Warnings()
	if len(ws) != 2 || ws[0].SeenMin != 5 || ws[0].SeenMax != 9 || ws[0].Count != 3 {
		t.Fatalf("merge wrong: %+v", ws)
	}
}

func TestReset(t *testing.T) {
	var l Log
	l.Check("c", "q", 5, 0, 1)
	l.Reset()
	if l.Len() != 0 || len(l.Warnings()) != 0 {
		t.Fatal("reset kept warnings")
	}
	l.Check("c", "q", 7, 0, 1)
	if ws := l.Warnings(); len(ws) != 1 || ws[0].SeenMin != 7 || ws[0].Count != 1 {
		t.Errorf("after reset: %+v", ws)
	}
}
