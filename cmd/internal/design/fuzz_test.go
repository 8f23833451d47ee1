package design

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"finmarch/cmd/internal/demo"
)

// The fuzz targets of the readers: whatever the bytes, each answers with
// values or with errors naming the file, never a panic, never a value that
// is not finite or out of its range with a nil error, and quickly. Run one
// with, for example,
//
//	go test ./cmd/internal/design -run '^$' -fuzz '^FuzzReadRide$' -fuzztime 30s
//
// The seeds (below, and the hostile cases of testdata/bad) run in the
// ordinary suite.

// badDir is the corpus of hostile inputs.
const badDir = "../../../testdata/bad"

// addCorpus adds the corpus files whose names start with prefix and end
// with ext as seeds.
func addCorpus(f *testing.F, prefix, ext string) {
	ents, err := os.ReadDir(badDir)
	if err != nil {
		f.Fatal(err)
	}
	n := 0
	for _, e := range ents {
		if strings.HasPrefix(e.Name(), prefix) && strings.HasSuffix(e.Name(), ext) {
			b, err := os.ReadFile(filepath.Join(badDir, e.Name()))
			if err != nil {
				f.Fatal(err)
			}
			f.Add(b)
			n++
		}
	}
	if n == 0 {
		f.Fatalf("no %s*%s seeds in %s", prefix, ext, badDir)
	}
}

// perInput is how long one fuzz input may take to read: inputs are small,
// and a reader that takes this long on one has a superlinear path.
const perInput = 2 * time.Second

// checkErrors fails unless err is a list of errors each naming file with
// a message.
func checkErrors(t *testing.T, err error, file string) {
	t.Helper()
	es, ok := err.(Errors)
	if !ok || len(es) == 0 {
		t.Fatalf("error %T %v: want a list of errors", err, err)
	}
	for _, e := range es {
		if e.File != file || strings.TrimSpace(e.Msg) == "" {
			t.Fatalf("error %q: want the file and a message", e.Error())
		}
	}
}

// finite reports whether every value is a finite number.
func finite(vs ...float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// Whatever the bytes, ReadRide answers with segments or errors, and every
// segment it accepts is finite and in range.
func FuzzReadRide(f *testing.F) {
	for _, s := range []string{
		"time (s),speed (km/h)\n0,50\n60,0\n",
		"time (min),speed (km/h),grade (%),ambient (C)\n0,50,2,30\n5,0,0,\n",
		"time,speed\n0 s,10 m/s\n1 h,0 km/h\n",
		"time (s),speed (km/h)\nNaN,1e400\n",
		"\uFEFFtime (s),speed (km/h),head_heat (kW),barrel_heat (W)\n0,50,1,400\n60\n",
		"time (s),speed (km/h)\n0,50\n60\n120,0\n",
		"time (h),speed (mph),Grade (percent),AMBIENT (F)\n0,30,1,80\n0.5,0,0,\n",
		"time (s),speed (km/h)\n0,\"5\"\"0\"\n60,0\n",
	} {
		f.Add([]byte(s))
	}
	addCorpus(f, "ride-", ".csv")
	f.Fuzz(func(t *testing.T, b []byte) {
		start := time.Now()
		segs, err := ReadRide(b, "fuzz.csv")
		if d := time.Since(start); d > perInput {
			t.Fatalf("%d bytes took %v", len(b), d)
		}
		if err != nil {
			checkErrors(t, err, "fuzz.csv")
			return
		}
		if len(segs) == 0 || len(segs) >= MaxRideRows {
			t.Fatalf("%d segments", len(segs))
		}
		var total float64
		for _, s := range segs {
			if !finite(s.Duration, s.Speed, s.Grade, s.Ambient) {
				t.Fatalf("non-finite segment %+v", s)
			}
			if !(s.Duration > 0) || s.Speed < 0 || s.Speed > 400/3.6 || math.Abs(s.Grade) > 30 ||
				s.Ambient != 0 && (s.Ambient < C-50 || s.Ambient > C+60) {
				t.Fatalf("segment out of range %+v", s)
			}
			if s.Heat != nil && (!finite(s.Heat[0], s.Heat[1]) || s.Heat[0] < 0 || s.Heat[1] < 0 || s.Heat[0] > 50e3 || s.Heat[1] > 50e3) {
				t.Fatalf("heat out of range %+v", *s.Heat)
			}
			if (s.Heat == nil) != (segs[0].Heat == nil) {
				t.Fatal("some segments with a heat, some without")
			}
			total += s.Duration
		}
		if total > 24*3600*(1+1e-12) {
			t.Fatalf("a ride of %g s", total)
		}
	})
}

// Whatever the bytes, ReadPoints answers with points that pass the
// calibration's own check (finite, in range, a stated uncertainty) or with
// errors.
func FuzzReadPoints(f *testing.F) {
	for _, s := range []string{
		"speed (km/h),ambient (C),head (C),place,offset (K),uncertainty (K)\n90,28,204,plug-seat,15,5\n",
		"speed,ambient,barrel,altitude\n60 mph,20 C,150 C,1200 m\n",
		"speed (km/h),ambient (C),head (C),barrel (C)\n90,28,,150\n90,28,204,\n",
		"\uFEFFspeed (km/h),ambient (C),head (C)\n90,28,204\n",
		"speed (km/h),ambient (C),head (C),uncertainty (K)\n90,28,204,0\n",
		"speed (km/h),ambient (C),head (C)\n90,28,204\n90,28\n",
		"speed (km/h),ambient (C),head (C)\n1e308,28,204\n",
	} {
		f.Add([]byte(s))
	}
	addCorpus(f, "points-", ".csv")
	f.Fuzz(func(t *testing.T, b []byte) {
		start := time.Now()
		pts, err := ReadPoints(b, "fuzz.csv", 300)
		if d := time.Since(start); d > perInput {
			t.Fatalf("%d bytes took %v", len(b), d)
		}
		if err != nil {
			checkErrors(t, err, "fuzz.csv")
			return
		}
		if len(pts) == 0 || len(pts) > MaxPointRows {
			t.Fatalf("%d points", len(pts))
		}
		for _, p := range pts {
			if !finite(p.Speed, p.Ambient, p.Pressure, p.Temp, p.Sigma, p.Offset) || !(p.Pressure > 0) {
				t.Fatalf("non-finite point %+v", p)
			}
			if msg := p.Check(); len(msg) > 0 {
				t.Fatalf("point %+v accepted: %v", p, msg)
			}
			if !(p.Sigma >= minSigma && p.Sigma <= maxSigma) {
				t.Fatalf("uncertainty %g K accepted", p.Sigma)
			}
		}
	})
}

// fanBase is the fan-cooled demo up to its curve: the fuzz input follows
// it in place of the [[fan_point]] tables.
var fanBase = func() string {
	s := string(demo.ScooterFan)
	return s[:strings.Index(s, "[[fan_point]]")]
}()

// Whatever follows the fan-cooled demo's [cooling] table in place of its
// curve, the design parses to a fan whose curve is in range (flow rising,
// pressure falling, an efficiency at every point or none) and whose
// operating point is finite, or it is refused with errors naming the file.
func FuzzFanCurve(f *testing.F) {
	s := string(demo.ScooterFan)
	f.Add([]byte(s[strings.Index(s, "[[fan_point]]"):]))
	for _, s := range []string{
		"[[fan_point]]\nflow = \"0 m3/s\"\npressure = \"500 Pa\"\n[[fan_point]]\nflow = \"0.1 m3/s\"\npressure = \"0 Pa\"\n",
		"[[fan_point]]\nflow = \"0 m3/s\"\npressure = \"500 Pa\"\nefficiency = 0.3\n[[fan_point]]\nflow = \"0.1 m3/s\"\npressure = \"0 Pa\"\n",
		"[[fan_point]]\nflow = \"0 cfm\"\npressure = \"2 inH2O\"\nefficiency = 0\n[[fan_point]]\nflow = \"100 cfm\"\npressure = \"0 Pa\"\nefficiency = 0\n",
		"[[fan_point]]\nflow = 1e-300\npressure = 1e-300\n[[fan_point]]\nflow = 2e-300\npressure = 0\n",
		"[[fan_point]]\nflow = \"0.1 m3/s\"\npressure = \"500 Pa\"\n[[fan_point]]\nflow = \"0.1 m3/s\"\npressure = \"400 Pa\"\n",
	} {
		f.Add([]byte(s))
	}
	addCorpus(f, "fan-", ".toml")
	f.Fuzz(func(t *testing.T, b []byte) {
		src := append([]byte(fanBase), b...)
		start := time.Now()
		d, err := Parse(src, "fuzz.toml")
		if err != nil {
			if strings.TrimSpace(err.Error()) == "" {
				t.Fatal("empty error")
			}
			return
		}
		fan := d.Case.Supply.Fan
		if fan == nil {
			return // the input replaced the source (a later [cooling] is a syntax error, but a ram design may parse)
		}
		if len(fan.Curve) < 2 || len(fan.Curve) > 50 {
			t.Fatalf("%d fan points", len(fan.Curve))
		}
		withEff := 0
		for i, p := range fan.Curve {
			if !finite(p.Flow, p.Pressure, p.Efficiency) || p.Flow < 0 || p.Flow > 100 || p.Pressure < 0 || p.Pressure > 20e3 {
				t.Fatalf("point %d out of range %+v", i+1, p)
			}
			if i > 0 && (!(p.Flow > fan.Curve[i-1].Flow) || p.Pressure > fan.Curve[i-1].Pressure) {
				t.Fatalf("point %d: flow not rising or pressure rising %+v", i+1, fan.Curve)
			}
			if p.Efficiency != 0 {
				withEff++
				if p.Efficiency < 0.01 || p.Efficiency > 0.95 {
					t.Fatalf("efficiency %g accepted", p.Efficiency)
				}
			}
		}
		if withEff != 0 && withEff != len(fan.Curve) {
			t.Fatalf("an efficiency at %d of %d points accepted", withEff, len(fan.Curve))
		}
		if !(fan.IdleSpeed == 0 || fan.RatedSpeed > fan.IdleSpeed) {
			t.Fatalf("rated speed %g not above idle %g", fan.RatedSpeed, fan.IdleSpeed)
		}
		op, err := d.Case.FanOperatingPoint(d.Run)
		if d := time.Since(start); d > perInput {
			t.Fatalf("%d bytes took %v", len(b), d)
		}
		if err == nil && !finite(op.Speed, op.Flow, op.Pressure, op.Shroud, op.Drop, op.MassFlow, op.Efficiency, op.Power, op.AirPower) {
			t.Fatalf("non-finite operating point %+v", op)
		}
	})
}
