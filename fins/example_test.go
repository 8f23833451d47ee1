package fins_test

import (
	"fmt"

	"finmarch/fins"
)

// The motorcycle-cylinder fin of Incropera et al. 6th ed. Example 3.10
// (from memory): 2024-T6 (k = 186 W/(m K)), t = 6 mm, 20 mm high on a
// 50 mm cylinder, h = 50 W/(m2 K). The book reads 0.95 off its chart; the
// exact solution gives 0.979.
func ExampleAnnularRectangular() {
	eta := fins.AnnularRectangular(50, 186, 0.006, 0.025, 0.045, nil)
	fmt.Printf("%.3f\n", eta)
	// Output: 0.979
}

// A fin set's geometry and overall surface efficiency.
func ExampleSet_Geometry() {
	s := fins.Set{Style: fins.StyleAnnular, Count: 8, Pitch: 0.009, Height: 0.04,
		RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	g, err := s.Geometry()
	if err != nil {
		fmt.Println(err)
		return
	}
	eta := s.FinEfficiency(g, 60, 151, nil)
	fmt.Printf("fin area %.3f m2, gap %.1f mm, fin efficiency %.3f, surface efficiency %.3f\n",
		g.FinArea, g.GapMean*1000, eta, g.SurfaceEfficiency(eta))
	// Output: fin area 0.332 m2, gap 6.0 mm, fin efficiency 0.859, surface efficiency 0.866
}

// An impossible set names the value at fault.
func ExampleSet_Geometry_error() {
	s := fins.Set{Style: fins.StyleAnnular, Count: 8, Pitch: 0.003, Height: 0.04,
		RootThickness: 0.004, TipThickness: 0.002, RootDiameter: 0.12, Length: 0.072}
	_, err := s.Geometry()
	fmt.Println(err)
	// Output: pitch: 3 mm is not larger than the root thickness 4 mm, so no air gap is left between fins
}
