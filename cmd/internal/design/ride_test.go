package design

import (
	"math"
	"strings"
	"testing"
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

// Whatever the bytes, ReadRide answers with segments or errors, never a
// panic, and every segment it accepts is finite and in range.
func FuzzReadRide(f *testing.F) {
	for _, s := range []string{
		"time (s),speed (km/h)\n0,50\n60,0\n",
		"time (min),speed (km/h),grade (%),ambient (C)\n0,50,2,30\n5,0,0,\n",
		"time,speed\n0 s,10 m/s\n1 h,0 km/h\n",
		"time (s),speed (km/h)\nNaN,1e400\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		segs, err := ReadRide(b, "fuzz.csv")
		if err != nil {
			if strings.TrimSpace(err.Error()) == "" {
				t.Fatal("empty error")
			}
			return
		}
		for _, s := range segs {
			for _, v := range []float64{s.Duration, s.Speed, s.Grade, s.Ambient} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("non-finite segment %+v", s)
				}
			}
			if !(s.Duration > 0) || s.Speed < 0 {
				t.Fatalf("segment out of range %+v", s)
			}
		}
	})
}
