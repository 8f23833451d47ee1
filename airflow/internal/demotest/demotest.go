package demotest

import (
	"testing"

	"finmarch/airflow"
	"finmarch/airflow/cylinder"
	"finmarch/fins"
	"finmarch/materials"
)

// Upright returns the upright demo at 90 km/h, 35 C, sea level, with the
// demo's cruise heat (2681 W head, 1443 W barrel) and a 220 C limit on
// both walls.
func Upright(t testing.TB) cylinder.Design {
	al, err := materials.Lookup("A356-T6")
	if err != nil {
		t.Fatal(err)
	}
	return cylinder.Design{
		Case: cylinder.Case{Speed: 25, Ambient: 308.15, Pressure: airflow.ISA(0, nil).P,
			Head: cylinder.FinSet{Name: "head", Alloy: al, Emissivity: 0.2, Set: fins.Set{Style: fins.StyleAnnular, Count: 8, Pitch: 0.009,
				Height: 0.040, RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}},
			Barrel: cylinder.FinSet{Name: "barrel", Alloy: al, Emissivity: 0.9, Set: fins.Set{Style: fins.StyleAnnular, Count: 12, Pitch: 0.009,
				Height: 0.030, RootThickness: 0.0035, TipThickness: 0.0018, RootDiameter: 0.092, Length: 0.108}}},
		Load:   cylinder.Load{Direct: true, Given: cylinder.HeatLoad{Head: 2681, Barrel: 1443}},
		Limits: cylinder.Limits{Head: 493.15, Barrel: 493.15},
	}
}
