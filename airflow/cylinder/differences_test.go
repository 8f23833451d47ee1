package cylinder

import "testing"

// Differences on hand-made results: each reason appears past its threshold
// (and not below it), on the side its physics says, and swapping the
// designs swaps every side.
func TestDifferences(t *testing.T) {
	a := Result{Method: MethodChannel, Head: SetResult{PassageVelocity: 12, MeanH: 60, AirIn: 300, AirOut: 360, TotalArea: 0.35, HeatLoad: 2600},
		Barrel: SetResult{AirIn: 300, TotalArea: 0.3, HeatLoad: 1400}}
	b := a
	if d := Differences(a, b); len(d) != 0 {
		t.Fatalf("identical designs differ: %+v", d)
	}
	b.Head.PassageVelocity, b.Head.Series = 8, true // slower air: warmer
	b.Head.MeanH = 50                               // lower h: warmer
	b.Head.AirOut = 320                             // less warming along the head: cooler
	b.Barrel.AirIn = 320                            // warmer air to the barrel: warmer
	b.Head.TotalArea = 0.25                         // less surface: warmer
	b.Head.HeatLoad = 2610                          // 0.25 %: below its threshold
	want := map[DiffKind]bool{DiffAirSpeed: true, DiffMeanH: true, DiffAirRise: false, DiffBarrelInlet: true, DiffArea: true}
	d := Differences(a, b)
	if len(d) != len(want) {
		t.Fatalf("%d reasons, want %d: %+v", len(d), len(want), d)
	}
	for _, x := range d {
		if w, ok := want[x.Kind]; !ok || x.Warmer != w {
			t.Errorf("kind %d: warmer %v, want %v (listed %v)", x.Kind, x.Warmer, w, ok)
		}
	}
	if !d[0].Series || !d[0].Passage || d[0].A != 12 || d[0].B != 8 {
		t.Errorf("passage velocity: %+v", d[0])
	}
	// under a free-stream method the speed compared is the approach speed,
	// and designs on methods of different kinds are not compared by it
	fa, fb := a, b
	fa.Method, fb.Method = MethodGibson, MethodGibson
	fa.Head.ApproachSpeed, fb.Head.ApproachSpeed = 17, 12
	if x := Differences(fa, fb)[0]; x.Kind != DiffAirSpeed || x.Passage || x.A != 17 || x.B != 12 || !x.Warmer {
		t.Errorf("approach speed: %+v", x)
	}
	fb.Method = MethodChannel
	if x := Differences(fa, fb)[0]; x.Kind == DiffAirSpeed {
		t.Errorf("a passage velocity compared with an approach speed: %+v", x)
	}
	for i, x := range Differences(b, a) {
		if x.Kind != d[i].Kind || x.Warmer == d[i].Warmer || x.Series {
			t.Errorf("swapped kind %d: warmer %v, series %v", x.Kind, x.Warmer, x.Series)
		}
	}
}
