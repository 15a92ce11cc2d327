package perturb

import (
	"math"
	"sync"
)

// Validity of the series. The estimate of an order-P result is trusted up to
// the field where either
//
//   - the last two computed terms, max(|c_(J−2)| f^(J−2), |c_J| f^J), reach
//     tailFraction of the first neglected term |c_(2P)| f^(2P): beyond that
//     the unknown orders past J are no longer negligible; or
//   - the first neglected term reaches gapFraction of the distance from n²
//     to the nearest other unperturbed level (3 for n = 1, 2n − 1 above):
//     the level is then no longer a small perturbation of n².
const (
	tailFraction = 0.05
	gapFraction  = 0.1
)

// blockSize is the number of levels whose series are built together, on
// first use of any of them.
const blockSize = 64

// entry is the precomputed series of one level. It must not be modified.
type entry struct {
	nn  float64        // n²
	c   [nCoef]float64 // c₂ (closed form), c₄, …, c_J
	lim [2]float64     // validity limit for Order 1 and Order 2
}

type block [blockSize]entry

// blocks[i] returns the entries of levels i·blockSize + 1 … (i+1)·blockSize,
// built once and shared read-only by all goroutines.
var blocks = func() (b [(MaxLevels + blockSize - 1) / blockSize]func() *block) {
	for i := range b {
		b[i] = sync.OnceValue(func() *block { return buildBlock(i) })
	}
	return b
}()

func buildBlock(i int) *block {
	b := new(block)
	for j := range b {
		n := i*blockSize + j + 1
		if n > MaxLevels {
			break
		}
		e := &b[j]
		e.nn = float64(n) * float64(n)
		e.c, _ = series(n)
		e.c[0] = secondOrder(n) // the closed form; the recursion agrees to rounding
		scaleHigh(&e.c, n)
		gap := 2*float64(n) - 1
		if n == 1 {
			gap = 3
		}
		for p := 1; p <= 2; p++ {
			e.lim[p-1] = limit(&e.c, p, gap)
		}
	}
	return b
}

// The closed-form recursion loses digits to cancellation as n grows: c₁₀
// is wrong beyond n ≈ 150 and c₈ beyond n ≈ 250 (c₈n¹⁴ should settle at
// 2.44e-6 and c₁₀n¹⁸ near 2.6e-7, but swing by orders of magnitude by
// n = 500), while c₄ and c₆ stay accurate to 1000. Above reliableN[j] the
// coefficient c_(2j+2) is therefore taken from its large-n law
// c_(2j+2) ∝ n^(−(4j+2)) (the two-wall WKB scaling; c₄·2304n⁶ → 1),
// anchored at reliableN[j] and enlarged by 5% for the slow 1/n² drift of
// the normalised values (about 0.2% between n = 100 and 1000 for c₄ and
// c₆). These coefficients only enter the error estimate and the validity
// limit, for which a few per cent is ample; TestHighLevelEstimates checks
// the estimate against the exact levels for n up to 1000.
var reliableN = [nCoef]int{MaxLevels, MaxLevels, MaxLevels, 200, 100}

// anchors holds c_j at reliableN for the extrapolated coefficients.
var anchors = sync.OnceValue(func() (a [nCoef]float64) {
	for j, n := range reliableN {
		if n < MaxLevels {
			c, _ := series(n)
			a[j] = c[j]
		}
	}
	return a
})

// scaleHigh replaces the unreliable high-order coefficients of level n.
func scaleHigh(c *[nCoef]float64, n int) {
	for j, nr := range reliableN {
		if n > nr {
			c[j] = 1.05 * anchors()[j] * math.Pow(float64(nr)/float64(n), float64(4*j+2))
		}
	}
}

// entryOf returns the entry of level n, 1 ≤ n ≤ MaxLevels.
func entryOf(n int) *entry {
	return &blocks[(n-1)/blockSize]()[(n-1)%blockSize]
}

// limit returns the validity limit of the order-p result (see tailFraction
// and gapFraction) for the coefficients c and the unperturbed gap.
func limit(c *[nCoef]float64, p int, gap float64) float64 {
	j0 := 2 * p       // order of the first neglected term
	lead := c[j0/2-1] // its coefficient
	lim := math.Pow(gapFraction*gap/math.Abs(lead), 1/float64(j0))
	for j := maxOrder - 2; j <= maxOrder; j += 2 {
		if cj := math.Abs(c[j/2-1]); cj > 0 {
			lim = math.Min(lim, math.Pow(tailFraction*math.Abs(lead)/cj, 1/float64(j-j0)))
		}
	}
	return lim
}

// secondOrder returns C_n = (n²π² − 15)/(48 n⁴ π²) (see the package
// documentation for its derivation).
func secondOrder(n int) float64 {
	nn := float64(n) * float64(n)
	return (nn*math.Pi*math.Pi - 15) / (48 * nn * nn * math.Pi * math.Pi)
}

// powers returns f², f⁴, …, f^J.
func powers(f float64) (pw [nCoef]float64) {
	f2 := f * f
	x := f2
	for i := range pw {
		pw[i] = x
		x *= f2
	}
	return pw
}

// estimate returns the error estimate of the order-p energy of e at the
// field whose powers f², f⁴, …, f^J are pw, before rounding:
//
//	|Σ_(2p<j≤J) c_j f^j| + max(|c_(J−2)| f^(J−2), |c_J| f^J).
func (e *entry) estimate(p int, pw *[nCoef]float64) float64 {
	var s float64
	for i := p - 1; i < nCoef; i++ {
		s += e.c[i] * pw[i]
	}
	return abs(s) + max(abs(e.c[nCoef-2]*pw[nCoef-2]), abs(e.c[nCoef-1]*pw[nCoef-1]))
}

// dipoleEstimate returns the error estimate of the dipole 2c₂f at f > 0,
// before rounding: the same construction for dη/df = Σ j c_j f^(j−1),
//
//	|Σ_(4≤j≤J) j c_j f^(j−1)| + max((J−2)|c_(J−2)| f^(J−3), J|c_J| f^(J−1)).
func (e *entry) dipoleEstimate(f float64) float64 {
	pw := powers(f)
	var s float64
	for i := 1; i < nCoef; i++ {
		s += float64(2*i+2) * e.c[i] * pw[i]
	}
	last := float64(maxOrder) * e.c[nCoef-1] * pw[nCoef-1]
	prev := float64(maxOrder-2) * e.c[nCoef-2] * pw[nCoef-2]
	return (abs(s) + max(abs(prev), abs(last))) / f
}

// abs is math.Abs for the finite values here, kept inlinable.
func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
