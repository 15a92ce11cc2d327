package exact

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// ddBig returns x.hi + x.lo exactly.
func ddBig(x dd) *big.Float {
	return new(big.Float).SetPrec(256).Add(big.NewFloat(x.hi), big.NewFloat(x.lo))
}

// relBig returns |got − want|/|want| for a double-double against a big value.
func relBig(got dd, want *big.Float) float64 {
	d := new(big.Float).SetPrec(256).Sub(ddBig(got), want)
	r, _ := d.Quo(d, want).Float64()
	return math.Abs(r)
}

// TestDoubleDouble checks the double-double constants and operations
// against 256-bit arithmetic: π (Machin's formula, in bigairy), π², 2/3,
// and products, quotients, square and cube roots on seeded random input.
// The operations promise about 2^−104 relative.
func TestDoubleDouble(t *testing.T) {
	t.Parallel()
	pi := bigairy.Pi(256)
	const tol = 0x1p-102
	if e := relBig(ddPi, pi); e > 0x1p-106 {
		t.Errorf("π: rel err %.3g", e)
	}
	pi2 := new(big.Float).SetPrec(256).Mul(pi, pi)
	if e := relBig(ddPi2, pi2); e > tol {
		t.Errorf("π²: rel err %.3g", e)
	}
	two3 := new(big.Float).SetPrec(256).Quo(big.NewFloat(2), big.NewFloat(3))
	if e := relBig(ddTwo3, two3); e > 0x1p-106 {
		t.Errorf("2/3: rel err %.3g", e)
	}
	if e := relBig(ddPi4, new(big.Float).SetPrec(256).Quo(pi, big.NewFloat(4))); e > 0x1p-106 {
		t.Errorf("π/4: rel err %.3g", e)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	rnd := func() dd {
		h := math.Ldexp(1+rng.Float64(), rng.IntN(80)-40)
		return dd{h, h * (rng.Float64() - 0.5) * 0x1p-53}
	}
	for range 2000 {
		x, y := rnd(), rnd()
		bx, by := ddBig(x), ddBig(y)
		checks := []struct {
			name string
			got  dd
			want *big.Float
		}{
			{"mul", ddMul(x, y), new(big.Float).SetPrec(256).Mul(bx, by)},
			{"div", ddDiv(x, y), new(big.Float).SetPrec(256).Quo(bx, by)},
			{"add", ddAdd(x, y), new(big.Float).SetPrec(256).Add(bx, by)},
			{"sqrt", ddSqrt(x), new(big.Float).SetPrec(256).Sqrt(bx)},
			{"cbrt", ddCbrt(x), bigairy.Cbrt(bx, 256)},
			{"mulF", ddMulF(x, y.hi), new(big.Float).SetPrec(256).Mul(bx, big.NewFloat(y.hi))},
		}
		for _, c := range checks {
			if e := relBig(c.got, c.want); e > tol {
				t.Fatalf("%s(%v, %v): rel err %.3g", c.name, x, y, e)
			}
		}
	}
}
