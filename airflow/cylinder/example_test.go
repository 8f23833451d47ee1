package cylinder_test

import (
	"fmt"

	"finmarch/airflow"
	"finmarch/airflow/cylinder"
	"finmarch/fins"
	"finmarch/materials"
)

// The upright demo single (an invented scenario: `finmarch demo`, design A)
// at 90 km/h on a 35 C day, annular fins, the heat of each fin set from the
// road load; the figures are the demo's. This is the
// front door of the estimator: a Case of physics inputs, a Load, and
// Balance with default Settings.
func Example() {
	al, err := materials.Lookup("A356-T6")
	if err != nil {
		panic(err)
	}
	c := cylinder.Case{
		Speed:    90 / 3.6,              // m/s
		Ambient:  308.15,                // K
		Pressure: airflow.ISA(0, nil).P, // Pa, sea level
		Head: cylinder.FinSet{Name: "head", Alloy: al, Emissivity: 0.2, Set: fins.Set{
			Style: fins.StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.040,
			RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}},
		Barrel: cylinder.FinSet{Name: "barrel", Alloy: al, Emissivity: 0.9, Set: fins.Set{
			Style: fins.StyleAnnular, Count: 12, Pitch: 0.009, Height: 0.030,
			RootThickness: 0.0035, TipThickness: 0.0018, RootDiameter: 0.092, Length: 0.108}},
	}
	// the demo's road load; the coefficients not given take their defaults
	load := cylinder.Load{Road: cylinder.RoadLoad{Mass: 230, CdA: 0.45, CoolShare: 0.18, IdleHeat: 500}}
	q, err := load.At(c)
	if err != nil {
		panic(err)
	}
	r, err := c.Balance(q, cylinder.Settings{})
	if err != nil {
		panic(err)
	}
	fmt.Printf("heat load: head %.0f W, barrel %.0f W\n", q.Head, q.Barrel)
	fmt.Printf("head wall %.1f C, barrel wall %.1f C\n", r.Head.WallTemp-273.15, r.Barrel.WallTemp-273.15)
	fmt.Printf("head: mean h %.1f W/m2K by %s\n", r.Head.MeanH, r.Method)
	for _, m := range r.Methods {
		fmt.Printf("  %-12s head %.1f C, barrel %.1f C\n", m.Method, m.Head-273.15, m.Barrel-273.15)
	}
	// Output:
	// heat load: head 2681 W, barrel 1443 W
	// head wall 158.4 C, barrel wall 95.5 C
	// head: mean h 74.3 W/m2K by gibson
	//   gibson       head 158.4 C, barrel 95.5 C
	//   briggs-young head 164.6 C, barrel 98.4 C
	//   channel      head 176.5 C, barrel 106.4 C

}
