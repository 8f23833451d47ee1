package materials_test

import (
	"fmt"

	"finmarch/materials"
)

func ExampleLookup() {
	a, _ := materials.Lookup("a356")
	fmt.Printf("%s: k %.0f W/(m K), density %.0f kg/m3\n", a.Name, a.K300, a.Density)
	_, err := materials.Lookup("A365-T6")
	fmt.Println(err != nil)
	// Output:
	// A356-T6: k 151 W/(m K), density 2685 kg/m3
	// true
}
