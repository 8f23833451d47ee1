package design

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"
)

// A ride file read with units from the header and from the cells: each
// row's conditions hold until the next row's time, the last time ends it.
func TestReadRide(t *testing.T) {
	src := "# a commute\ntime (min),speed (km/h),grade (%),ambient,head_heat (W),barrel_heat (kW)\n0,50,2,30 C,800,0.4\n90 s,30 mph,0,,900,0.5\n10,0,-3,25 C,300,0.2\n"
	segs, err := ReadRide([]byte(src), "ride.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(segs) != 2 {
		t.Fatalf("%d segments", len(segs))
	}
	a, b := segs[0], segs[1]
	if a.Duration != 90 || math.Abs(a.Speed-50/3.6) > 1e-12 || a.Grade != 2 || math.Abs(a.Ambient-303.15) > 1e-9 || a.Heat == nil || a.Heat[0] != 800 || a.Heat[1] != 400 {
		t.Errorf("first segment %+v %v", a, a.Heat)
	}
	if b.Duration != 510 || math.Abs(b.Speed-30*0.44704) > 1e-12 || b.Ambient != 0 || b.Heat[1] != 500 {
		t.Errorf("second segment %+v %v", b, b.Heat)
	}
}

// Every cell of a ride file is used or refused: an empty or missing cell
// of a row that is not the last is an error naming its file, line, column
// and range, never a zero (a missing speed was once a standstill, an empty
// barrel_heat 0 W), but for ambient, whose empty cell is the design's
// ambient; the last row only ends the ride, and its other cells may be
// empty (checked when given).
func TestRideFileCells(t *testing.T) {
	for _, c := range []struct{ csv, want string }{
		{"time (s),speed (km/h)\n0,50\n60\n120,0\n", "ride.csv:3: speed: empty; every row but the last needs its road speed, 0 to 400 km/h"},
		{"time (s),speed (km/h)\n0,50\n60,\n120,0\n", "ride.csv:3: speed: empty; every row but the last needs its road speed"},
		{"time (s),speed (km/h)\n0,50\n,40\n120,0\n", "ride.csv:3: time: empty; every row needs its time, 0 to 8.64e+04 s"},
		{"time (s),speed (km/h)\n0,50\n60,40\n,0\n", "ride.csv:4: time: empty"},
		{"time (s),speed (km/h),grade (%)\n0,50,2\n60,40,\n120,0,0\n", "ride.csv:3: grade: empty; every row but the last needs its grade, -30 to 30 %"},
		{"time (s),speed (km/h),head_heat (W),barrel_heat (W)\n0,50,800,400\n60,40,800,\n120,0,300,200\n", "ride.csv:3: barrel_heat: empty; every row but the last needs the heat to the barrel fins, 0 to 5e+04 W"},
		{"time (s),speed (km/h),head_heat (W),barrel_heat (W)\n0,50,,400\n60,40,800,400\n", "ride.csv:2: head_heat: empty"},
		{"time (s),speed (km/h),grade (%)\n0,50,2\n60,40,2,9\n", "ride.csv:3: column 4: 4 cells, but the header names 3 columns"},
		{"time (s),speed (km/h)\n0,50\n60,40\n120,500\n", "ride.csv:4: speed: 500 is outside the allowed 0 to 400 km/h"},
		{"time (s),speed (km/h)\n0,50\nx,40\n30,0\n", "ride.csv:3: time: \"x\" has no number"},
		{"time (s),speed (km/h)\n0,50\n60,40\n30,0\n", "ride.csv:4: time: 30 s is not after the row before (60 s, line 3)"},
		{"time (s),speed (km/h),,grade (%)\n0,50,,1\n", "ride.csv:1: column 3 (empty name): unknown column"},
		{"time (s),speed (km/h)\n0,5\"0\n60,0\n", `ride.csv:2: speed: bare " in non-quoted-field`},
		{"time (s),speed (km/h)\n0,50\n60,\x1b[31m0\n", "ride.csv:3: speed: the control character U+001B"},
	} {
		_, err := ReadRide([]byte(c.csv), "ride.csv")
		var es Errors
		if !errors.As(err, &es) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: %v; want %q", c.csv, err, c.want)
			continue
		}
		for _, e := range es {
			if e.File != "ride.csv" || e.Line > 1 && e.Key == "" {
				t.Errorf("%q: %q does not name its file and column", c.csv, e.Error())
			}
		}
	}
	// a bad time is not the base of the next row's order check
	_, err := ReadRide([]byte("time (s),speed (km/h)\n0,50\n90 kg,40\n60,0\n"), "ride.csv")
	if err == nil || strings.Contains(err.Error(), "not after") {
		t.Errorf("%v", err)
	}

	// the last row's cells but time may be empty, or short; ambient may be
	// empty anywhere (the design's)
	segs, err := ReadRide([]byte("time (s),speed (km/h),grade (%),ambient (C),head_heat (W),barrel_heat (W)\n0,50,2,,800,400\n60,40,0,25,900,500\n120\n"), "ride.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(segs) != 2 || segs[0].Ambient != 0 || math.Abs(segs[1].Ambient-298.15) > 1e-9 || segs[1].Heat == nil || segs[1].Heat[1] != 500 || segs[1].Duration != 60 {
		t.Errorf("%+v", segs)
	}
	// a given 0 is a value: 0 W, 0 %, standing
	segs, err = ReadRide([]byte("time (s),speed (km/h),grade (%),head_heat (W),barrel_heat (W)\n0,0,0,0,0\n60,,,,\n"), "ride.csv")
	if err != nil || len(segs) != 1 || segs[0].Heat == nil || *segs[0].Heat != [2]float64{0, 0} {
		t.Errorf("%+v %v", segs, err)
	}
}

// A ride file holds at most MaxRideRows rows: one more is refused with the
// file, the line and the cap (not an error per row), and a file at the cap
// is read in well under a second.
func TestRideFileRowCap(t *testing.T) {
	var b strings.Builder
	b.WriteString("time (s),speed (km/h),grade (%)\n")
	for i := 0; i < MaxRideRows; i++ {
		fmt.Fprintf(&b, "%d,%d,%d\n", i, i%120, i%7-3)
	}
	if b.Len() > MaxFileSize {
		t.Fatalf("a file at the row cap is %d bytes, over the size cap", b.Len())
	}
	start := time.Now()
	segs, err := ReadRide([]byte(b.String()), "day.csv")
	if err != nil || len(segs) != MaxRideRows-1 {
		t.Fatalf("%d segments: %v", len(segs), err)
	}
	t.Logf("%d rows read in %v", MaxRideRows, time.Since(start))
	fmt.Fprintf(&b, "%d,0,0\n", MaxRideRows)
	_, err = ReadRide([]byte(b.String()), "day.csv")
	want := fmt.Sprintf("day.csv:%d: more than %d rows; a ride file holds at most %d", MaxRideRows+2, MaxRideRows, MaxRideRows)
	if err == nil || err.Error() != want {
		t.Errorf("%v; want %q", err, want)
	}
}
