package design

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"finmarch/airflow"
	"finmarch/airflow/calibrate"
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

// Each problem in a points file names the file, the line and the column
// (the header's name for it), and every cell is read or refused: an empty
// or missing required cell is an error, not a zero; a typed uncertainty of
// 0 K is refused, not taken for "not given".
func TestPointsFileErrors(t *testing.T) {
	for _, c := range []struct{ csv, want string }{
		{"", "no header row"},
		{"speed (km/h),ambient (C),head (C)\n", "no measured point"},
		{"speed,ambient (C),head (C)\n90,28,204\n", `runs.csv:2: speed: "90" has no unit`},
		{"speed (km/h),ambient (C),temp (C)\n90,28,204\n", `runs.csv:1: temp (C): unknown column`},
		{"speed (km/h),ambient (C),,head (C)\n90,28,,204\n", `runs.csv:1: column 3 (empty name): unknown column`},
		{"speed (km/h),ambient (C),head (C)\n90,28,204\n90,28,20\n", "runs.csv:3: head: 20 C: the measured temperature must lie between the ambient (28 C) and 500 C"},
		{"speed (km/h),ambient (C),barrel (C)\n90,28,600\n", "runs.csv:2: barrel: 600 C is outside the allowed range"},
		{"speed (km/h),ambient (C),head (C),place\n90,28,204,plug-seat\n", "runs.csv:2: offset: missing: a plug-seat reading needs offset"},
		{"speed (km/h),ambient (C),head (C)\n90,28,204,7\n", "runs.csv:2: column 4: 4 cells, but the header names 3 columns"},
		{"speed (furlongs),ambient (C),head (C)\n90,28,204\n", `runs.csv:1: speed (furlongs): unit "furlongs"`},
		{"speed (km/h),ambient (C)\n90,28\n", "the header needs a head or a barrel column"},
		{"speed (km/h),ambient (C),head (C)\n90,\"28\" C,204\n", `runs.csv:2: ambient: extraneous or missing " in quoted-field`},
		{"speed (km/h),ambient (C),head (C)\n90,2\"8,204\n", `runs.csv:2: ambient: bare " in non-quoted-field`},
		{"speed (km/h),ambient (C),head (C),barrel (C)\n90,28,204,150\n", "runs.csv:2: head: a reading is of the head or of the barrel, not both"},
		{"speed (km/h),ambient (C),head (C),barrel (C)\n90,28,,\n", "runs.csv:2: head: missing; give the head or the barrel"},
		{"speed (km/h),ambient (C),head (C)\n90,28,204\x00\n", "runs.csv:2: head: a NUL byte"},
		{"speed (km/h),ambient (C),head (C)\n90,28\xb0C,204\n", "runs.csv:2: ambient: byte 0xB0: not text in UTF-8"},
		{"speed (km/h),amb\x01ient (C),head (C)\n90,28,204\n", "runs.csv:1: column 2: the control character U+0001"},
		// empty and missing required cells
		{"speed (km/h),ambient (C),head (C)\n,28,204\n", "runs.csv:2: speed: empty; every reading needs its road speed, 0 to 400 km/h"},
		{"speed (km/h),ambient (C),head (C)\n90,,204\n", "runs.csv:2: ambient: empty; every reading needs its ambient, -50 to 60 C"},
		{"speed (km/h),ambient (C),head (C)\n90,28,204\n90,28\n", "runs.csv:3: head: empty; every reading needs its measured head temperature"},
		{"speed (km/h),ambient (C),barrel (C)\n90\n", "runs.csv:2: ambient: empty"},
		// values out of range, each on its column
		{"speed (km/h),ambient (C),head (C)\n500,28,204\n", "runs.csv:2: speed: 500 km/h is outside the allowed 0 to 400 km/h"},
		{"speed (km/h),ambient (C),head (C)\n90,70,204\n", "runs.csv:2: ambient: 70 C is outside the allowed -50 to 60 C"},
		{"speed (km/h),ambient (C),head (C),altitude (m)\n90,28,204,9000\n", "runs.csv:2: altitude: 9000 m is outside the allowed -500 to 6000 m"},
		{"speed (km/h),ambient (C),head (C),place\n90,28,204,exhaust\n", `runs.csv:2: place: "exhaust": fin-root (the default) or plug-seat`},
		{"speed (km/h),ambient (C),head (C),offset (K)\n90,28,204,300\n", "runs.csv:2: offset: 300 K is outside the allowed range, above -100 K and below 200 K"},
		{"speed (km/h),ambient (C),head (C),uncertainty (K)\n90,28,204,0\n", "runs.csv:2: uncertainty: 0 K is outside the allowed 0.1 to 50 K (leave it out for 5 K)"},
		{"speed (km/h),ambient (C),head (C),uncertainty\n90,28,204,-2 K\n", "runs.csv:2: uncertainty: -2 K is outside the allowed 0.1 to 50 K"},
		{"speed (km/h),ambient (C),head (C),uncertainty (K)\n90,28,204,80\n", "runs.csv:2: uncertainty: 80 K is outside the allowed 0.1 to 50 K"},
	} {
		_, err := ReadPoints([]byte(c.csv), "runs.csv", 0)
		var es Errors
		if !errors.As(err, &es) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: %v; want %q", c.csv, err, c.want)
			continue
		}
		// every problem of a row names its file, its line and its column
		for _, e := range es {
			if e.File != "runs.csv" || (e.Line > 0 && e.Key == "" && !strings.Contains(e.Msg, "header")) {
				t.Errorf("%q: %q does not name its file and column", c.csv, e.Error())
			}
		}
	}
}

// The optional cells of a points file mean what their documentation says
// when empty (the key left out: the given altitude, fin-root, 0 K offset,
// 5 K uncertainty), and what the user typed when given, zero included.
func TestPointsFileOptionalCells(t *testing.T) {
	src := "speed (km/h),ambient (C),head (C),barrel (C),altitude (m),place,offset (K),uncertainty (K)\n" +
		"90,28,204,,,,,\n" +
		"60,20,,150,1200,plug-seat,0,0.5\n" +
		"90,28,204\n" // a short row: the missing optional cells are empty
	pts, err := ReadPoints([]byte(src), "runs.csv", 300)
	if err != nil {
		t.Fatal(err)
	}
	if len(pts) != 3 {
		t.Fatalf("%d points", len(pts))
	}
	a, b, c := pts[0], pts[1], pts[2]
	if a.Barrel || a.Offset != 0 || a.Sigma != calibrate.DefaultSigma || math.Abs(a.Pressure-airflow.ISA(300, nil).P) > 1e-9 {
		t.Errorf("empty optional cells: %+v", a)
	}
	if !b.Barrel || b.Offset != 0 || b.Sigma != 0.5 || math.Abs(b.Pressure-airflow.ISA(1200, nil).P) > 1e-9 || math.Abs(b.Temp-423.15) > 1e-9 {
		t.Errorf("given cells: %+v", b)
	}
	if c != a {
		t.Errorf("a short row %+v differs from the same row with empty cells %+v", c, a)
	}
	// the design's own pressure for rows without an altitude, however the
	// design gives it
	d, err := Parse([]byte(strings.Replace(dropKey(string(demo.Files[0].Src), "altitude"), "[air]", "[air]\npressure = \"85 kPa\"", 1)), "p.toml")
	if err != nil {
		t.Fatal(err)
	}
	pts, err = d.ReadPoints([]byte("speed (km/h),ambient (C),head (C)\n90,28,204\n"), "runs.csv")
	if err != nil || len(pts) != 1 || pts[0].Pressure != 85e3 {
		t.Errorf("design at 85 kPa: %+v %v", pts, err)
	}
}

// dropKey removes the line setting key from a design's source.
func dropKey(src, key string) string {
	var out []string
	for _, l := range strings.Split(src, "\n") {
		if !strings.HasPrefix(strings.TrimSpace(l), key+" ") && !strings.HasPrefix(strings.TrimSpace(l), key+"=") {
			out = append(out, l)
		}
	}
	return strings.Join(out, "\n")
}

// A UTF-8 byte-order mark before the header (as some spreadsheets save
// CSV) is skipped; one anywhere else is still a character of its cell.
func TestPointsFileByteOrderMark(t *testing.T) {
	body := "speed (km/h),ambient (C),head (C)\n90,28,204\n"
	a, err := ReadPoints([]byte("\uFEFF"+body), "runs.csv", 0)
	if err != nil {
		t.Fatal(err)
	}
	b, err := ReadPoints([]byte(body), "runs.csv", 0)
	if err != nil || len(a) != 1 || a[0] != b[0] {
		t.Errorf("with the mark %+v, without %+v %v", a, b, err)
	}
	if _, err := ReadPoints([]byte("speed (km/h),\uFEFFambient (C),head (C)\n90,28,204\n"), "runs.csv", 0); err == nil || !strings.Contains(err.Error(), "unknown column") {
		t.Errorf("a mark inside the header: %v", err)
	}
	if _, err := ReadRide([]byte("\uFEFFtime (s),speed (km/h)\n0,50\n60,0\n"), "ride.csv"); err != nil {
		t.Errorf("ride file with the mark: %v", err)
	}
	// a design file too (the TOML reader skips it), its lines counted as
	// without it
	if _, err := Parse(append([]byte("\uFEFF"), demo.Files[0].Src...), "up.toml"); err != nil {
		t.Errorf("design with the mark: %v", err)
	}
	_, err = Parse([]byte("\uFEFF"+strings.Replace(string(demo.Files[0].Src), `speed = "90 km/h"`, `speed = "900 km/h"`, 1)), "up.toml")
	if line := 1 + strings.Count(string(demo.Files[0].Src[:strings.Index(string(demo.Files[0].Src), `speed = "90 km/h"`)]), "\n"); err == nil || !strings.Contains(err.Error(), fmt.Sprintf("up.toml:%d: air.speed", line)) {
		t.Errorf("design with the mark, an error at line %d: %v", line, err)
	}
}

// A points file holds at most MaxPointRows readings: one more is refused
// with the file, the line and the cap, and a file at the cap is read (and
// quickly: see the report in the package's tests' log).
func TestPointsFileRowCap(t *testing.T) {
	var b strings.Builder
	b.WriteString("speed (km/h),ambient (C),head (C),place,offset (K),uncertainty (K)\n")
	for i := 0; i < MaxPointRows; i++ {
		fmt.Fprintf(&b, "%d,28,%d,plug-seat,15,3\n", 30+i%90, 150+i%50)
	}
	start := time.Now()
	pts, err := ReadPoints([]byte(b.String()), "runs.csv", 0)
	if err != nil || len(pts) != MaxPointRows {
		t.Fatalf("%d points: %v", len(pts), err)
	}
	t.Logf("%d rows read in %v", MaxPointRows, time.Since(start))
	b.WriteString("90,28,204,plug-seat,15,3\n")
	_, err = ReadPoints([]byte(b.String()), "runs.csv", 0)
	want := fmt.Sprintf("runs.csv:%d: more than %d rows; a points file holds at most %d", MaxPointRows+2, MaxPointRows, MaxPointRows)
	if err == nil || err.Error() != want {
		t.Errorf("%v; want %q", err, want)
	}
}

// A bad [[measurement]] is reported at its own key's line in its own
// table, not the first table's; a typed uncertainty of 0 K is refused with
// its range, and a measurement's missing key at its table's line.
func TestMeasurementErrorLine(t *testing.T) {
	src := string(demo.Files[0].Src)
	lines := strings.Count(src, "\n")
	src += "\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\n" +
		"\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"20 C\"\n" +
		"\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\nuncertainty = \"0 K\"\n" +
		"\n[[measurement]]\nambient = \"28 C\"\nhead = \"204 C\"\n"
	_, err := Parse([]byte(src), "up.toml")
	for _, want := range []string{
		fmt.Sprintf("up.toml:%d: measurement[2].head: 20 C: the measured temperature must lie between the ambient (28 C) and 500 C", lines+10),
		fmt.Sprintf("up.toml:%d: measurement[3].uncertainty: 0 K is outside the allowed 0.1 to 50 K", lines+16),
		fmt.Sprintf("up.toml:%d: measurement[4].speed: missing; every reading needs its road speed, 0 to 400 km/h", lines+18),
	} {
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%v; want %q", err, want)
		}
	}
	// a measurement without uncertainty is 5 K, stated, not a zero
	d, err := Parse([]byte(string(demo.Files[0].Src)+"\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\n"), "up.toml")
	if err != nil || len(d.Points) != 1 || d.Points[0].Sigma != calibrate.DefaultSigma {
		t.Errorf("%v %+v", err, d)
	}
}

// A design holds at most MaxPointRows [[measurement]] tables.
func TestMeasurementCap(t *testing.T) {
	one := "\n[[measurement]]\nspeed = \"90 km/h\"\nambient = \"28 C\"\nhead = \"204 C\"\n"
	_, err := Parse([]byte(string(demo.Files[0].Src)+strings.Repeat(one, MaxPointRows+1)), "up.toml")
	if err == nil || !strings.Contains(err.Error(), fmt.Sprintf("measurement[%d]: %d [[measurement]] tables; a design holds at most %d", MaxPointRows+1, MaxPointRows+1, MaxPointRows)) {
		t.Errorf("%v", err)
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
