package perturb

import (
	"fmt"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell/exact"
	"gonum.org/v1/gonum/mat"
)

// dipoleElement returns ⟨m|ξ|n⟩ in the basis √2 sin(nπξ): −8mn/(π²(m² − n²)²)
// for m + n odd, 0 for m + n even, m ≠ n (derived by integration by parts;
// common practice, no source; checked independently at high precision
// with mpmath).
func dipoleElement(m, n int) float64 {
	if (m+n)%2 == 0 {
		return 0
	}
	d := float64(m-n) * float64(m+n)
	return -8 * float64(m) * float64(n) / (math.Pi * math.Pi * d * d)
}

// TestSecondOrder checks C_n three ways: values computed independently at
// high precision, the direct sum over states, and the closed-form
// recursion of series.go.
func TestSecondOrder(t *testing.T) {
	t.Parallel()
	// C_n = (n²π² − 15)/(48 n⁴ π²), computed independently at high
	// precision (mpmath, 40 digits, from the sum over states; no published
	// table with an equation number was found), 15 digits kept.
	independent := []float64{
		-0.0108295365548972,
		0.00322940396531892,
		0.00192391518656505,
		0.00117840024783243,
		0.000782672741512164,
	}
	for i, want := range independent {
		n := i + 1
		if got := secondOrder(n); math.Abs(got-want) > 1e-14*math.Abs(want) { // 15 digits printed
			t.Errorf("n=%d: C_n = %.17g, the independent value is %.17g", n, got, want)
		}
	}
	// Direct sum over states Σ_(m≠n) |⟨m|ξ|n⟩|²/(n² − m²) up to m = M.
	// For m > M ≥ 2n, m² − n² ≥ 3m²/4, so a term is at most
	// 64·1024 n²/(243 π⁴ m⁸) and the dropped tail at most
	// 65536 n²/(243·7 π⁴ M⁷) (Σ_(m>M) m⁻⁸ < 1/(7M⁷)).
	const M = 4000
	for n := 1; n <= 20; n++ {
		t.Run(fmt.Sprintf("n=%d", n), func(t *testing.T) {
			sum := 0.0
			for m := M; m >= 1; m-- { // smallest terms first
				if m == n {
					continue
				}
				x := dipoleElement(m, n)
				sum += x * x / float64(n*n-m*m)
			}
			tail := 65536 * float64(n*n) / (243 * 7 * math.Pow(math.Pi, 4) * math.Pow(M, 7))
			closed := secondOrder(n)
			if tol := tail + 1e-14*math.Abs(closed); math.Abs(sum-closed) > tol {
				t.Errorf("sum over states %.17g, closed form %.17g, diff %.3g > %.3g", sum, closed, sum-closed, tol)
			}
			c, _ := series(n)
			if math.Abs(c[0]-closed) > 1e-14*math.Abs(closed) {
				t.Errorf("recursion c₂ = %.17g, closed form %.17g", c[0], closed)
			}
		})
	}
	// Large n, recursion against closed form, and the two-wall WKB limit
	// C_n → 1/(48 n²) (the closed form's limit, and the expansion of the
	// two-wall WKB rule: see TestFourthOrderWKB).
	for _, n := range []int{50, 200, 1000} {
		c, _ := series(n)
		closed := secondOrder(n)
		if math.Abs(c[0]-closed) > 1e-13*math.Abs(closed) {
			t.Errorf("n=%d: recursion c₂ = %.17g, closed form %.17g", n, c[0], closed)
		}
		wkb := 1 / (48 * float64(n*n))
		if rel := math.Abs(closed/wkb - 1); rel > 2/float64(n*n) {
			t.Errorf("n=%d: C_n/(1/(48n²)) − 1 = %.3g, want O(1/n²) (≤ 2/n²)", n, rel)
		}
	}
}

// sineBasisSeries returns the energy coefficients E_1 … E_order of level n
// from the Rayleigh–Schrödinger recursion in the truncated sine basis
// m = 1 … M (the textbook sum over states, an independent route to the
// same numbers).
func sineBasisSeries(n, M, order int) []float64 {
	x := make([]float64, M*M)
	for i := range M {
		for j := range M {
			if i != j {
				x[i*M+j] = dipoleElement(i+1, j+1)
			}
		}
	}
	psi := make([][]float64, order+1)
	for j := range psi {
		psi[j] = make([]float64, M)
	}
	psi[0][n-1] = 1
	E := make([]float64, order+1)
	vp := make([]float64, M)
	for j := 1; j <= order; j++ {
		for i := range M {
			s := 0.0
			for l, p := range psi[j-1] {
				s += x[i*M+l] * p
			}
			vp[i] = s
		}
		E[j] = vp[n-1]
		for i := range M {
			if i == n-1 {
				continue
			}
			s := vp[i]
			for l := 1; l < j; l++ {
				s -= E[l] * psi[j-l][i]
			}
			psi[j][i] = s / float64(n*n-(i+1)*(i+1))
		}
	}
	return E
}

// TestCoefficientsSineBasis holds the closed-form recursion against the sum
// over states in a sine basis of 400 states (converged: the same at 200
// states to the tolerances below).
func TestCoefficientsSineBasis(t *testing.T) {
	t.Parallel()
	// Relative tolerance per order j = 4, 6, 8, 10 (plus the basis
	// convergence): set by the rounding of the closed-form recursion at
	// high order, worst at n = 1 (measured worst: 2.6e-13, 1.5e-10, 3.1e-9,
	// 2.1e-6). The estimates need only a few digits of c₆ … c₁₀.
	tol := [nCoef]float64{0, 1e-11, 1e-9, 1e-8, 1e-5}
	for n := 1; n <= 12; n++ {
		t.Run(fmt.Sprintf("n=%d", n), func(t *testing.T) {
			t.Parallel()
			big := sineBasisSeries(n, 400, maxOrder)
			small := sineBasisSeries(n, 200, maxOrder)
			c, _ := series(n)
			for i := 1; i < nCoef; i++ {
				j := 2*i + 2
				conv := math.Abs(big[j] - small[j])
				if d := math.Abs(c[i] - big[j]); d > tol[i]*math.Abs(big[j])+conv {
					t.Errorf("c_%d: recursion %.12g, sine basis %.12g, rel diff %.3g", j, c[i], big[j], d/math.Abs(big[j]))
				}
				t.Logf("c_%d rel diff %.2g (basis convergence %.2g)", j, math.Abs(c[i]/big[j]-1), conv/math.Abs(big[j]))
			}
			// The odd orders vanish by parity; the basis sum shows it.
			for j := 1; j <= maxOrder; j += 2 {
				if math.Abs(big[j]) > 1e-15*math.Abs(big[j+1]) {
					t.Errorf("odd order %d: E = %.3g, want 0", j, big[j])
				}
			}
		})
	}
}

func TestRecursionResidual(t *testing.T) {
	t.Parallel()
	// ψ_j(1) = 0 is not imposed but follows from the choice of E_j: a check
	// of the algebra (common practice, no source).
	for _, n := range []int{1, 2, 3, 7, 12, 64, 65, 500, 1000} {
		if _, r := series(n); r > 1e-13 {
			t.Errorf("n=%d: |ψ_j(1)| = %.3g", n, r)
		}
	}
}

// TestFourthOrderWKB checks c₄ against the two-wall WKB rule, which is exact
// to leading order in 1/n: from (2/(3f))[(η + f/2)^(3/2) − (η − f/2)^(3/2)] = n
// (D. J. Griffiths, Introduction to Quantum Mechanics, 2nd ed., §8.3,
// from memory), expanding in f gives √η = n + f²/(96n³) +
// f⁴/(6144n⁷) + …, so η = n² + f²/(48n²) + f⁴/(2304n⁶) + … (derived here).
// The correction is O(1/n²), as for C_n.
func TestFourthOrderWKB(t *testing.T) {
	t.Parallel()
	for _, n := range []int{30, 100, 300, 1000} {
		c, _ := series(n)
		nf := float64(n)
		r := c[1] * 2304 * math.Pow(nf, 6)
		if math.Abs(r-1) > 30/(nf*nf) {
			t.Errorf("n=%d: c₄·2304n⁶ = %.9f, want 1 + O(1/n²) (|dev| ≤ 30/n²)", n, r)
		}
	}
}

// fitTol is the relative agreement required between c₂, c₄ from a
// polynomial fit of exact levels at small f and from the series. It is set
// by the fit, not by the reference (accurate to a few ulp): measured worst
// 8e-12 for c₂ and 3.3e-7 for c₄ (n = 8).
const fitTol = 1e-6

// TestFourthOrderFit fits η_n(f) from the exact Airy solver at small f by
// an even polynomial (exact interpolation at 8 fields, in powers of f²) and
// compares its f² and f⁴ coefficients with C_n and c₄.
func TestFourthOrderFit(t *testing.T) {
	t.Parallel()
	var ex exact.Solver
	const npts = 8
	for n := 1; n <= 12; n++ {
		t.Run(fmt.Sprintf("n=%d", n), func(t *testing.T) {
			t.Parallel()
			lim := entryOf(n).lim[1]
			h := lim / (2 * npts) // fields up to half the Order-2 limit
			a := mat.NewDense(npts, npts, nil)
			b := mat.NewVecDense(npts, nil)
			for i := range npts {
				f := h * float64(i+1)
				lv, err := ex.Level(f, n)
				if err != nil {
					t.Fatal(err)
				}
				x := (f / lim) * (f / lim) // scaled for conditioning
				for j := range npts {
					a.Set(i, j, math.Pow(x, float64(j+1)))
				}
				b.SetVec(i, lv.Energy-float64(n*n))
			}
			var sol mat.VecDense
			if err := sol.SolveVec(a, b); err != nil {
				t.Fatal(err)
			}
			c, _ := series(n)
			fitC2 := sol.AtVec(0) / (lim * lim)
			fitC4 := sol.AtVec(1) / math.Pow(lim, 4)
			if d := math.Abs(fitC2/secondOrder(n) - 1); d > fitTol {
				t.Errorf("fit c₂ = %.12g, closed form %.12g, rel diff %.3g", fitC2, secondOrder(n), d)
			}
			if d := math.Abs(fitC4/c[1] - 1); d > fitTol {
				t.Errorf("fit c₄ = %.12g, series %.12g, rel diff %.3g", fitC4, c[1], d)
			}
			t.Logf("rel diff c₂ %.2g, c₄ %.2g", math.Abs(fitC2/secondOrder(n)-1), math.Abs(fitC4/c[1]-1))
		})
	}
}
