package bigstack_test

import (
	"fmt"
	"log"

	"github.com/tiltwell/tiltwell/exact/internal/bigstack"
)

// The ground level of a finite well (barriers 4.3 E₁, barrier mass ratio
// 1.37, roughly a GaAs/Al₀.₃Ga₀.₇As electron) at zero field and under a
// field that lets it escape.
func ExampleLevel() {
	well := []bigstack.Layer{{Edge: 4.3, Mass: 1.37}, {Width: 1, Mass: 1}, {Edge: 4.3, Mass: 1.37}}
	for _, f := range []float64{0, 2} {
		r, err := bigstack.Level(well, 1, f, 1, 128)
		if err != nil {
			log.Fatal(err)
		}
		g, _ := r.Gamma.Float64()
		fmt.Printf("f=%g: η_r = %s, Γ = %.10e (%v)\n", f, r.Eta.Text('f', 25), g, r.Route)
	}
	// Output:
	// f=0: η_r = 0.5393204424007035453179120, Γ = 0.0000000000e+00 (bound)
	// f=2: η_r = 0.3868904609699923899172510, Γ = 2.8199031688e-06 (newton)
}
