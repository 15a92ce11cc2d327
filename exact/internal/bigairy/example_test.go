package bigairy_test

import (
	"fmt"
	"log"
	"math/big"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

func ExampleLevel() {
	// The ground level at f = 10 to 200 bits (about 60 digits).
	eta, err := bigairy.Level(10, 1, 0)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println(eta.Text('f', 40))
	// Output:
	// 0.0660262957550905163228299723407393777052
}

func ExampleAiry() {
	ai, aip, bi, bip := bigairy.Airy(big.NewFloat(1), 128)
	fmt.Println(ai.Text('f', 25))
	fmt.Println(aip.Text('f', 25))
	fmt.Println(bi.Text('f', 25))
	fmt.Println(bip.Text('f', 25))
	// Output:
	// 0.1352924163128814155241474
	// -0.1591474412967932127875003
	// 1.2074235949528712594363788
	// 0.9324359333927756329594515
}

func ExamplePhase() {
	// Θ(a_1)/π = 1 at the first zero of Ai (DLMF 9.9.1).
	z := big.NewFloat(-2.338107410459767)
	th := bigairy.Phase(z, 64)
	th.Quo(th, bigairy.Pi(64))
	fmt.Printf("%.12f\n", th)
	// Output:
	// 1.000000000000
}
