package airflow_test

import (
	"fmt"

	"finmarch/airflow"
)

// Air at 300 K and 1 bar, and the standard atmosphere at 2000 m.
func ExampleProperties() {
	a := airflow.Properties(300, 1e5, nil)
	fmt.Printf("rho %.4f kg/m3, mu %.4g Pa s, k %.4f W/(m K), Pr %.3f\n", a.Rho, a.Mu, a.K, a.Pr)
	s := airflow.ISA(2000, nil)
	fmt.Printf("ISA 2000 m: %.2f K, %.0f Pa\n", s.T, s.P)
	// Output:
	// rho 1.1612 kg/m3, mu 1.846e-05 Pa s, k 0.0262 W/(m K), Pr 0.706
	// ISA 2000 m: 275.15 K, 79495 Pa
}

// A fin passage at Re = 1500 and Re = 20000, 10 hydraulic diameters long.
func ExampleChannel() {
	for _, re := range []float64{1500, 20000} {
		c := airflow.Channel(re, 0.7, 10, nil)
		fmt.Printf("Re %5.0f: %s, Nu %.1f, f_app %.4f\n", re, c.Regime, c.Nu, c.Fapp)
	}
	// Output:
	// Re  1500: laminar, Nu 10.5, f_app 0.0310
	// Re 20000: turbulent, Nu 64.4, f_app 0.0064
}
