package design

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"finmarch/cmd/internal/demo"
)

// A points file gives the same calibration points as the same readings in
// [[measurement]] tables: units from the header or the cell, comments,
// empty cells, a row's own altitude.
func TestPointsFileMatchesMeasurementTables(t *testing.T) {
	csv := "# two runs on the test road\n" +
		"speed (km/h),ambient (C),head (C),place,offset (K),altitude\n" +
		"90,28,204,plug-seat,15,\n" +
		"60 mph,20 C,190,plug-seat,15,1200 m\n"
	pts, err := ReadPoints([]byte(csv), "runs.csv", 300)
	if err != nil {
		t.Fatal(err)
	}
	src := "[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\nplace = \"plug-seat\"\noffset = \"15 K\"\n" +
		"[[measurement]]\nspeed = \"60 mph\"\nambient = \"20 C\"\nhead = \"190 C\"\nplace = \"plug-seat\"\noffset = \"15 K\"\naltitude = \"1200 m\"\n"
	d, err := Parse(append(append([]byte(nil), demo.Files[0].Src...), "\n"+src...), "up.toml")
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Points) != 2 || len(pts) != 2 {
		t.Fatalf("%d and %d points", len(d.Points), len(pts))
	}
	for i := range pts {
		a, b := pts[i], d.Points[i]
		if math.Abs(a.Speed-b.Speed) > 1e-9 || math.Abs(a.Ambient-b.Ambient) > 1e-9 || math.Abs(a.Temp-b.Temp) > 1e-9 ||
			math.Abs(a.Offset-b.Offset) > 1e-9 || a.Barrel != b.Barrel {
			t.Errorf("point %d: file %+v, tables %+v", i+1, a, b)
		}
	}
	if pts[0].Pressure == pts[1].Pressure {
		t.Error("the row's own altitude was not used")
	}
}

// Each problem in a points file names the file, the line and the column.
func TestPointsFileErrors(t *testing.T) {
	for _, c := range []struct{ csv, want string }{
		{"", "no header row"},
		{"speed (km/h),ambient (C),head (C)\n", "no measured point"},
		{"speed,ambient (C),head (C)\n90,28,204\n", `runs.csv:2: speed: "90" has no unit`},
		{"speed (km/h),ambient (C),temp (C)\n90,28,204\n", `runs.csv:1: temp (C): unknown column`},
		{"speed (km/h),ambient (C),head (C)\n90,28,204\n90,28,20\n", "runs.csv:3: the measured temperature must lie between the ambient and 500 C"},
		{"speed (km/h),ambient (C),head (C),place\n90,28,204,plug-seat\n", "runs.csv:2: a plug-seat reading needs offset"},
		{"speed (km/h),ambient (C),head (C)\n90,28,204,7\n", "runs.csv:2: 4 cells, but the header names 3 columns"},
		{"speed (furlongs),ambient (C),head (C)\n90,28,204\n", `runs.csv:1: speed (furlongs): unit "furlongs"`},
		{"speed (km/h),ambient (C)\n90,28\n", "the header needs a head or a barrel column"},
		{"speed (km/h),ambient (C),head (C)\n\"90,28,204\n", "runs.csv:2"},
		{"speed (km/h),ambient (C),head (C),barrel (C)\n90,28,204,150\n", "runs.csv:2: give the head or the barrel"},
		{"speed (km/h),ambient (C),head (C)\n90,28,204\x00\n", "runs.csv:2"},
	} {
		_, err := ReadPoints([]byte(c.csv), "runs.csv", 0)
		var es Errors
		if !errors.As(err, &es) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: %v; want %q", c.csv, err, c.want)
		}
	}
}

// A bad [[measurement]] is reported at its own table's line, not the
// first one's.
func TestMeasurementErrorLine(t *testing.T) {
	src := string(demo.Files[0].Src)
	lines := strings.Count(src, "\n")
	src += "\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\n" +
		"\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"20 C\"\n"
	_, err := Parse([]byte(src), "up.toml")
	want := fmt.Sprintf("up.toml:%d: measurement[2]: the measured temperature", lines+7)
	if err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("%v; want %q", err, want)
	}
}

// Too many longitudinal fins on the head are blamed on the head, with the
// head's own diameter (the message once said "the barrel").
func TestCountErrorNamesItsSet(t *testing.T) {
	src := strings.Replace(string(demo.LaidOver), "count = 44", "count = 50", 1)
	_, err := Parse([]byte(src), "lo.toml")
	if err == nil || !strings.Contains(err.Error(), "head.count") || strings.Contains(err.Error(), "barrel") || !strings.Contains(err.Error(), "root diameter of") {
		t.Errorf("%v", err)
	}
}
