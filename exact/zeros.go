package exact

import (
	"fmt"
	"math"
	"sync"

	"github.com/tiltwell/tiltwell"
)

// zeroTable holds a_1 … a_(MaxLevels+1), the zeros of Ai, computed once.
var zeroTable = sync.OnceValue(func() []float64 {
	z := make([]float64, MaxLevels+1)
	for k := range z {
		z[k] = findZero(k + 1)
	}
	return z
})

// findZero solves Θ(z) = kπ (DLMF 9.9.1) by Newton's method from the
// asymptotic form a_k ≈ −T(3π(4k − 1)/8), T(t) = t^(2/3)(1 + (5/48)t^(−2)
// − (5/36)t^(−4)) (DLMF 9.9.6, 9.9.18).
func findZero(k int) float64 {
	t := 3 * math.Pi * (4*float64(k) - 1) / 8
	it2 := 1 / (t * t)
	z := -math.Pow(t, 2.0/3) * (1 + it2*(5.0/48-it2*5.0/36))
	// The residual Θ(z) − kπ in double-double, so that the phase's own
	// size (up to ~kπ) does not limit the zero's accuracy.
	target := ddNeg(ddMulF(ddPi, float64(k)))
	for range 8 {
		th, p := phaseDD(dd{z, 0})
		// Θ′ = −p, so Newton's step for Θ(z) − kπ is +(Θ − kπ)/p.
		dz := ddAdd(th, target).hi / p
		z += dz
		if math.Abs(dz) <= 1e-17*math.Abs(z) {
			break
		}
	}
	return z
}

// airyZero returns a_k for 1 ≤ k ≤ MaxLevels+1.
func airyZero(k int) float64 { return zeroTable()[k-1] }

// AiZero returns a_k, the k-th zero of Ai (a_1 = −2.338107…, DLMF §9.9),
// to full float64 accuracy, for 1 ≤ k ≤ 1e6. Other k give an error
// wrapping [tiltwell.ErrLevel].
func AiZero(k int) (float64, error) {
	if k < 1 || k > 1e6 {
		return 0, fmt.Errorf("exact: Airy zero number %d outside 1..1e6: %w", k, tiltwell.ErrLevel)
	}
	if k <= MaxLevels+1 {
		return airyZero(k), nil
	}
	return findZero(k), nil
}
