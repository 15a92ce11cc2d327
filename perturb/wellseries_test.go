package perturb

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// testWells are the finite wells the series tests run on: symmetric and
// asymmetric, mass ratios 1 to 2, shallow (v = 2, two levels) to deep
// (v = 50, eight levels), the GaAs-like demo electron (v = 4.3, μ = 1.37,
// invented demo data) and one barrier below the ground level's
// infinite-well value.
var testWells = []squarewell.Well{
	{VL: 4.3, ML: 1.37, VR: 4.3, MR: 1.37},
	{VL: 2, ML: 1, VR: 2, MR: 1},
	{VL: 50, ML: 1, VR: 50, MR: 1},
	{VL: 10, ML: 1, VR: 30, MR: 2},
	{VL: 5, ML: 2, VR: 20, MR: 1},
	{VL: 3, ML: 1.5, VR: 3.5, MR: 1},
	{VL: 0.8, ML: 1, VR: 12, MR: 1.2},
}

// TestWellSeriesAgainstBox checks E₁ and E₂ of every bound level against
// an eigen-solve of the tilted well in a box that knows nothing of
// perturbation theory (boxSolver), by the Richardson-extrapolated
// differences
//
//	(η(h) − η(−h))/(2h) = E₁ + E₃h² + …,   (η(h) + η(−h) − 2η(0))/(2h²) = E₂ + E₄h² + …
//
// at h and 2h (common practice, no source). Levels within 2% of the
// barrier top (their series converges only for |f| ≲ 1e-3) are left out.
func TestWellSeriesAgainstBox(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		for n := 1; n <= w.Count(); n++ {
			g, err := newWellGeom(w, n)
			if err != nil {
				t.Fatal(err)
			}
			if g.eta0 > 0.98*math.Min(w.VL, w.VR) {
				continue
			}
			ws := g.series()
			t.Run(fmt.Sprintf("%v/n=%d", w, n), func(t *testing.T) {
				t.Parallel()
				at := func(f float64) float64 {
					guess := g.eta0 + ws.E[1]*f + ws.E[2]*f*f
					width := 1e-3 + 2*math.Abs(ws.E[2]*f*f)
					eta, ok := fieldBox(w, guess, f).level(f, guess-width, guess+width)
					if !ok {
						t.Fatalf("box: no level near %g at f = %g", g.eta0, f)
					}
					return eta
				}
				e0 := at(0)
				if d := math.Abs(e0 - g.eta0); d > 1e-14*math.Max(1, g.eta0) {
					t.Errorf("η₀ = %.17g, box %.17g", g.eta0, e0)
				}
				h := 0.004
				d1 := func(h float64) float64 { return (at(h) - at(-h)) / (2 * h) }
				d2 := func(h float64) float64 { return (at(h) + at(-h) - 2*e0) / (2 * h * h) }
				e1 := (4*d1(h) - d1(2*h)) / 3
				e2 := (4*d2(h) - d2(2*h)) / 3
				// Rounding of the box levels (a few ulps of η) over h and h²,
				// and the dropped E₅h⁴, E₆h⁴ terms.
				round := 16 * eps * math.Max(1, g.eta0)
				tol1 := round/h + 16*math.Abs(ws.E[5])*math.Pow(h, 4)
				tol2 := round/(h*h) + 16*math.Abs(ws.E[6])*math.Pow(h, 4)
				if math.Abs(e1-ws.E[1]) > tol1 {
					t.Errorf("E₁ = %.12g, box %.12g (tolerance %.2g)", ws.E[1], e1, tol1)
				}
				if math.Abs(e2-ws.E[2]) > tol2 {
					t.Errorf("E₂ = %.12g, box %.12g (tolerance %.2g)", ws.E[2], e2, tol2)
				}
			})
		}
	}
}

// TestWellSeriesSum holds the whole series, summed to order J, against
// the box eigen-solve at fields where its terms fall off fast (the last
// term below 1e-13): they must agree to rounding. This checks every
// coefficient E₁ … E₁₀ at once.
func TestWellSeriesSum(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		t.Run(fmt.Sprint(w), func(t *testing.T) {
			t.Parallel()
			wellSeriesSum(t, w)
		})
	}
}

func wellSeriesSum(t *testing.T, w squarewell.Well) {
	for n := 1; n <= w.Count(); n++ {
		g, _ := newWellGeom(w, n)
		ws := g.series()
		// The field where the last term is 1e-13.
		f := math.Pow(1e-13/(math.Abs(ws.E[wellOrder])+1e-300), 1.0/wellOrder)
		for _, sf := range []float64{f, -f} {
			sum := g.eta0
			for j := wellOrder; j >= 1; j-- {
				sum += ws.E[j] * math.Pow(sf, float64(j))
			}
			ref, ok := fieldBox(w, g.eta0, sf).level(sf, sum-1e-6, sum+1e-6)
			if !ok {
				t.Fatalf("%v n=%d f=%g: box: no level near %g", w, n, sf, sum)
			}
			if d := math.Abs(sum - ref); d > 2e-13*math.Max(1, g.eta0) {
				t.Errorf("%v n=%d f=%.4g: series %.16g, box %.16g (diff %.2g)", w, n, sf, sum, ref, d)
			}
		}
	}
}

// TestDalgarnoLewisQuadrature computes E₂ of ground levels a second way,
// by quadrature of the Dalgarno–Lewis form (A. Dalgarno and J. T. Lewis,
// Proc. R. Soc. A 233, 70 (1955); see the package documentation)
//
//	E₂ = −π² ∫ μ S²/φ₀² dξ,   S(ξ) = ∫₋∞^ξ (V − E₁) φ₀² dξ′,
//
// with the closed-form zero-field state of internal/squarewell and
// Gauss–Legendre panels, independent of the recursion.
func TestDalgarnoLewisQuadrature(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		st, err := w.State(1)
		if err != nil {
			t.Fatal(err)
		}
		lo, hi := st.Support()
		// Panels: the barriers in steps of a quarter decay length, the
		// well in eight.
		var edges []float64
		for x := lo; x < 0; x += 0.25 / st.KL {
			edges = append(edges, x)
		}
		for i := 0; i < 8; i++ {
			edges = append(edges, float64(i)/8)
		}
		for x := 1.0; x < hi; x += 0.25 / st.KR {
			edges = append(edges, x)
		}
		edges = append(edges, hi)
		const nq = 24
		integ := func(fn func(float64) float64, a, b float64) float64 {
			return quad.Fixed(fn, a, b, nq, quad.Legendre{}, 0)
		}
		sq := func(x float64) float64 { v := st.At(x); return v * v }
		var e1 float64
		for i := 0; i+1 < len(edges); i++ {
			e1 += integ(func(x float64) float64 { return (x - 0.5) * sq(x) }, edges[i], edges[i+1])
		}
		// S from the left for ξ < ½ and from the right above (S(∞) = 0),
		// so that it never cancels; ½ is a panel edge.
		dens := func(x float64) float64 { return (x - 0.5 - e1) * sq(x) }
		edgeS := make([]float64, len(edges))
		for i := 1; i < len(edges) && edges[i] <= 0.5; i++ {
			edgeS[i] = edgeS[i-1] + integ(dens, edges[i-1], edges[i])
		}
		for i := len(edges) - 2; i >= 0 && edges[i] >= 0.5; i-- {
			edgeS[i] = edgeS[i+1] - integ(dens, edges[i], edges[i+1])
		}
		var e2 float64
		for i := 0; i+1 < len(edges); i++ {
			a, b := edges[i], edges[i+1]
			mu := 1.0
			switch {
			case b <= 0:
				mu = w.ML
			case a >= 1:
				mu = w.MR
			}
			e2 += integ(func(x float64) float64 {
				var s float64
				if b <= 0.5 {
					s = edgeS[i] + integ(dens, a, x)
				} else {
					s = edgeS[i+1] - integ(dens, x, b)
				}
				return -math.Pi * math.Pi * mu * s * s / sq(x)
			}, a, b)
		}
		g, _ := newWellGeom(w, 1)
		ws := g.series()
		if d := math.Abs(e1 - ws.E[1]); d > 1e-12 {
			t.Errorf("%v: E₁ = %.15g, quadrature %.15g", w, ws.E[1], e1)
		}
		if d := math.Abs(e2 - ws.E[2]); d > 1e-11*math.Abs(e2) {
			t.Errorf("%v: E₂ = %.15g, Dalgarno–Lewis quadrature %.15g (rel %.2g)", w, ws.E[2], e2, d/math.Abs(e2))
		}
	}
}

// TestWellSeriesWigner checks the recursion against Wigner's 2n+1 rule
// (e.g. J. O. Hirschfelder, W. Byers Brown and S. T. Epstein, Adv. Quantum
// Chem. 1, 255 (1964); from memory), with intermediate normalisation:
//
//	N₀ E_(2m+1) = ⟨ψ_m|V|ψ_m⟩ − Σ_(k,l=1..m) E_(2m+1−k−l) ⟨ψ_k|ψ_l⟩
//	N₀ E_(2m)   = ⟨ψ_(m−1)|V|ψ_m⟩ − Σ_(k=1..m, l=1..m−1) E_(2m−k−l) ⟨ψ_k|ψ_l⟩,
//
// in particular E₃ = ⟨ψ₁|V − E₁|ψ₁⟩/N₀: energies to order 2m+1 from the
// wavefunctions to order m, a different use of the same functions than
// the projection E_j = ⟨ψ₀|V|ψ_(j−1)⟩/N₀.
func TestWellSeriesWigner(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		for n := 1; n <= w.Count(); n++ {
			g, _ := newWellGeom(w, n)
			ws := g.series()
			ov := func(a, b int) float64 { return g.inner(&ws.psi[a], &ws.psi[b], false) }
			scale := 0.0
			for j := 1; j <= wellOrder; j++ {
				scale = math.Max(scale, math.Abs(ws.E[j])*math.Pow(0.3, float64(j)))
			}
			for j := 2; j <= wellOrder; j++ {
				m := j / 2
				var got float64
				if j%2 == 1 {
					got = g.inner(&ws.psi[m], &ws.psi[m], true)
					for k := 1; k <= m; k++ {
						for l := 1; l <= m; l++ {
							got -= ws.E[j-k-l] * ov(k, l)
						}
					}
				} else {
					got = g.inner(&ws.psi[m-1], &ws.psi[m], true)
					for k := 1; k <= m; k++ {
						for l := 1; l <= m-1; l++ {
							got -= ws.E[j-k-l] * ov(k, l)
						}
					}
				}
				got /= g.n0
				// Relative to the coefficient, or to the size of the
				// series at f = 0.3 for coefficients that vanish.
				tol := 1e-9*math.Abs(ws.E[j]) + 1e-12*scale/math.Pow(0.3, float64(j))
				if d := math.Abs(got - ws.E[j]); d > tol {
					t.Errorf("%v n=%d: E_%d = %.12g by projection, %.12g by the 2n+1 rule", w, n, j, ws.E[j], got)
				}
			}
		}
	}
}

// TestWellSeriesMirror: the mirrored well (ξ → 1 − ξ) has the coefficients
// (−1)^j E_j, since its levels at f are those of the well at −f.
func TestWellSeriesMirror(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		m := squarewell.Well{VL: w.VR, ML: w.MR, VR: w.VL, MR: w.ML}
		if m == w {
			continue // symmetric: see TestWellSeriesSymmetric
		}
		for n := 1; n <= w.Count(); n++ {
			g, _ := newWellGeom(w, n)
			gm, _ := newWellGeom(m, n)
			a, b := g.series(), gm.series()
			for j := 1; j <= wellOrder; j++ {
				want := a.E[j]
				if j%2 == 1 {
					want = -want
				}
				if d := math.Abs(b.E[j] - want); d > 1e-10*math.Abs(want)+1e-15*math.Pow(4, float64(j)) {
					t.Errorf("%v n=%d: E_%d = %.12g, mirrored %.12g", w, n, j, a.E[j], b.E[j])
				}
			}
			if a.resid > 1e-11 || b.resid > 1e-11 {
				t.Errorf("%v n=%d: solvability residual %.2g, %.2g", w, n, a.resid, b.resid)
			}
		}
	}
}

// TestWellSeriesInfiniteLimit: as v → ∞ the finite-well coefficients tend
// to those of the infinite well (series.go, and C_n = (n²π² − 15)/(48n⁴π²)
// in closed form), the difference shrinking like the penetration depth
// 1/√v (TestInfiniteLimit of internal/squarewell for η₀, common practice
// for the rest).
func TestWellSeriesInfiniteLimit(t *testing.T) {
	t.Parallel()
	for n := 1; n <= 6; n++ {
		c, _ := series(n)
		var dev [2]float64
		for i, v := range []float64{1e6, 1e10} {
			w := squarewell.Well{VL: v, ML: 1, VR: v, MR: 1}
			g, _ := newWellGeom(w, n)
			ws := g.series()
			if rel := math.Abs(ws.E[2]/secondOrder(n) - 1); rel > 20/math.Sqrt(v) {
				t.Errorf("v=%g n=%d: E₂ = %.12g, C_n = %.12g", v, n, ws.E[2], secondOrder(n))
			}
			for j := 2; j <= wellOrder; j += 2 {
				rel := math.Abs(ws.E[j]/c[j/2-1] - 1)
				if rel > 100/math.Sqrt(v) {
					t.Errorf("v=%g n=%d: E_%d = %.10g, infinite well %.10g", v, n, j, ws.E[j], c[j/2-1])
				}
				dev[i] = math.Max(dev[i], rel)
			}
		}
		// 1/√v: the deviation falls by 100 from v = 1e6 to 1e10.
		if r := dev[0] / dev[1]; r < 80 || r > 120 {
			t.Errorf("n=%d: deviation %.3g at v = 1e6, %.3g at 1e10: ratio %.3g, want ≈ 100", n, dev[0], dev[1], r)
		}
	}
}

// TestStarkShiftShallow: the finite well's quadratic Stark shift is
// several times that of infinite walls, the more so the shallower the
// well (G. Bastard, E. E. Mendez, L. L. Chang and L. Esaki, Phys. Rev. B
// 28, 3241 (1983); from memory): in units of the same well's E₁ and F₀,
// E₂ of the ground level against C₁ = −0.01083. The ratios quoted in the
// package documentation are checked to the digits given there.
func TestStarkShiftShallow(t *testing.T) {
	t.Parallel()
	prev := 1.0
	for _, c := range []struct{ v, mu, want, tol float64 }{
		{1e4, 1.37, 1, 0.05},
		{50, 1.37, 1.5, 0.05},
		{10, 1.37, 2.38, 0.01},
		{4.3, 1.37, 3.65, 0.005},
		{2, 1.37, 6.6, 0.05},
	} {
		w := squarewell.Well{VL: c.v, ML: c.mu, VR: c.v, MR: c.mu}
		g, _ := newWellGeom(w, 1)
		r := g.series().E[2] / secondOrder(1)
		if r < prev {
			t.Errorf("v=%g: E₂/C₁ = %.3g, below %.3g for the deeper well", c.v, r, prev)
		}
		if math.Abs(r-c.want) > c.tol {
			t.Errorf("v=%g μ=%g: E₂/C₁ = %.4g, documented %g", c.v, c.mu, r, c.want)
		}
		prev = r
	}
}

// TestWellSeriesSymmetric: in a symmetric well the odd coefficients vanish
// (η(−f) = η(f)); computed, they are rounding noise, which the rounding
// allowance δE_j must cover (the solver then sets them to zero).
func TestWellSeriesSymmetric(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		if w.VL != w.VR || w.ML != w.MR {
			continue
		}
		for n := 1; n <= w.Count(); n++ {
			g, _ := newWellGeom(w, n)
			ws := g.series()
			for j := 1; j < wellOrder; j += 2 {
				if math.Abs(ws.E[j]) > ws.dE[j] {
					t.Errorf("%v n=%d: E_%d = %.3g, rounding allowance %.3g", w, n, j, ws.E[j], ws.dE[j])
				}
			}
		}
	}
}

// TestFirstOrderClosedForm checks the closed forms of the package
// documentation (section "Finite wells") against the recursion: E₁ region
// by region from the normalized zero-field state, and the polynomials of
// ψ₁ in the well and the barriers.
func TestFirstOrderClosedForm(t *testing.T) {
	t.Parallel()
	for _, w := range testWells {
		for n := 1; n <= w.Count(); n++ {
			st, _ := w.State(n)
			g, _ := newWellGeom(w, n)
			ws := g.series()
			k, kl, kr := st.K, st.KL, st.KR
			anti := func(x float64) float64 {
				return (x-0.5)*math.Sin(2*k*x+2*st.DL)/(2*k) + math.Cos(2*k*x+2*st.DL)/(4*k*k)
			}
			e1 := st.C*st.C*(1+kr)/(4*kr*kr) - st.A*st.A*(1+kl)/(4*kl*kl) - st.B*st.B/2*(anti(1)-anti(0))
			if d := math.Abs(e1 - ws.E[1]); d > 1e-13 {
				t.Errorf("%v n=%d: E₁ = %.16g, closed form %.16g", w, n, ws.E[1], e1)
			}
			p := ws.psi[1]
			pi2 := math.Pi * math.Pi
			a, c := g.sl, g.s1
			aL := pi2 * w.ML * a / (2 * kl)
			bL := -(pi2*w.ML*a*(0.5+ws.E[1]) + aL) / (2 * kl)
			aR := -pi2 * w.MR * c / (2 * kr)
			bR := (aR - pi2*w.MR*c*(0.5-ws.E[1])) / (2 * kr)
			for _, cmp := range []struct {
				name      string
				got, want float64
			}{
				{"P u²", p.P[2], -pi2 / (4 * k)},
				{"P u", p.P[1], pi2 * ws.E[1] / (2 * k)},
				{"Q u", p.Q[1], pi2 / (4 * k * k)},
				{"L x²", p.L[2], aL / 2},
				{"L x", p.L[1], bL},
				{"R y²", p.R[2], aR / 2},
				{"R y", p.R[1], bR},
			} {
				if d := math.Abs(cmp.got - cmp.want); d > 1e-13*math.Max(1, math.Abs(cmp.want)) {
					t.Errorf("%v n=%d: ψ₁ coefficient %s = %.16g, closed form %.16g", w, n, cmp.name, cmp.got, cmp.want)
				}
			}
		}
	}
}
