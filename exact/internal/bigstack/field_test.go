package bigstack

import (
	"fmt"
	"math"
	"math/big"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// As the barriers grow the levels approach those of the infinite well
// (bigairy.Level, an independent solver) at the rate the penetration depth
// sets: at f = 0, η ≈ n²(1 − 4δ), δ = √μ/(π√v) (each wall moves out by the
// penetration length μ/κ, textbook), and at any field the difference
// shrinks like 1/√v. At v = 1e300 nothing overflows and the level is the
// infinite-wall one to 1e-60.
func TestInfiniteBarrierLimit(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, f := range sample([]float64{0, 1, -5}) {
		for _, n := range []int{1, 2} {
			t.Run(fmt.Sprintf("f=%g/n=%d", f, n), func(t *testing.T) {
				t.Parallel()
				inf := fint(int64(n*n), prec)
				if f != 0 {
					var err error
					if inf, err = bigairy.Level(f, n, prec); err != nil {
						t.Fatal(err)
					}
				}
				d := map[float64]float64{}
				for _, v := range []float64{1e6, 1e8, 1e300} {
					mu := 1.37
					r, err := Level(single(v, mu, v, mu), 1, f, n, prec)
					if err != nil {
						t.Fatalf("v=%g: %v", v, err)
					}
					d[v] = f64(newf(prec).Sub(inf, r.Eta))
					if f != 0 && (r.Log10Gamma == nil || f64(r.Log10Gamma) > -1e6) {
						t.Errorf("v=%g: log₁₀ Γ = %v; want an astronomically small width", v, r.Log10Gamma)
					}
					if f == 0 && v < 1e300 {
						lead := 4 * float64(n*n) * math.Sqrt(mu) / (math.Pi * math.Sqrt(v))
						if e := math.Abs(d[v]/lead - 1); e > 10/math.Sqrt(v) {
							t.Errorf("v=%g: η∞ − η = %g, penetration estimate %g (rel %g)", v, d[v], lead, e)
						}
					}
				}
				// Next order: η = n²/(1 + 2δ)² gives a relative −3δ ≈ −1e-3
				// at v = 1e6.
				if r := d[1e6] / d[1e8]; math.Abs(r-10) > 0.02 {
					t.Errorf("(η∞ − η)(1e6)/(η∞ − η)(1e8) = %g, want 10 (1/√v)", r)
				}
				if !(d[1e6] > 0) || math.Abs(d[1e300]) > 1e-60 {
					t.Errorf("η∞ − η: %g at 1e6, %g at 1e300", d[1e6], d[1e300])
				}
			})
		}
	}
}

// Moving the zero of the field potential: the same double well described
// with its right-hand well as the reference (1.2 to the right) has
// H′ = H − 1.2 f, so every η_r drops by 1.2 f and Γ is unchanged; its
// mirror image at −f is the same physics again. The three computations use
// different layer lists, Airy arguments and (for −f) the folding.
func TestTranslationAndMirror(t *testing.T) {
	t.Parallel()
	const prec = 128
	w := []Layer{{0, 10, 1.37}, {1, 0, 1}, {0.2, 6, 1.37}, {1, 0, 1}, {0, 20, 2}}
	wm, refm := mirror(w, 3)
	for _, c := range sample([]struct {
		f float64
		n int
	}{{0.5, 1}, {2, 2}, {1e-3, 1}, {0, 3}, {-2, 2}}) {
		t.Run(fmt.Sprintf("f=%g/n=%d", c.f, c.n), func(t *testing.T) {
			t.Parallel()
			a, err := Level(w, 1, c.f, c.n, prec)
			if err != nil {
				t.Fatal(err)
			}
			b, err := Level(w, 3, c.f, c.n, prec)
			if err != nil {
				t.Fatal(err)
			}
			m, err := Level(wm, refm, -c.f, c.n, prec)
			if err != nil {
				t.Fatal(err)
			}
			// The right well starts at 1 + 0.2 (the float64 0.2, exactly).
			shift := newf(prec+64).Add(fint(1, prec+64), ffloat(0.2, prec+64))
			shift.Mul(shift, ffloat(c.f, prec+64))
			want := newf(prec+64).Sub(a.Eta, shift)
			for name, r := range map[string]*Resonance{"translated": b, "mirrored": m} {
				if e := relErr(r.Eta, want, 1); e > 1e-34 {
					t.Errorf("%s: η = %s, want %s (rel %g)", name, r.Eta.Text('g', 25), want.Text('g', 25), e)
				}
				if c.f != 0 {
					if e := relErr(r.Log10Gamma, a.Log10Gamma, 0); e > 1e-34 {
						t.Errorf("%s: log₁₀ Γ = %s, want %s", name, r.Log10Gamma.Text('g', 25), a.Log10Gamma.Text('g', 25))
					}
				}
			}
		})
	}
}

// gammaFlux is the escape width of a narrow resonance from the flux
// through the downhill barrier divided by the probability in the well:
// integrating d/dξ Im(φ̄ p) = (π²Γ/2)|φ|² (from the equation and its
// conjugate, p = φ′/μ) from the downhill turning point to +∞ gives
// Γ = −2 Im(φ̄p)/(π² ∫|φ|²). For the real solution at η_B, continued
// into the downhill layer by the outgoing wave c(Ai − iBi) with |c| = β =
// φ₀/Bi(z₀), the flux is Im(φ̄p) = −β² (s₀/μ₀)/π (Wronskian, DLMF 9.2.7),
// so
//
//	Γ = 2 (s₀/μ₀) β² / (π³ N),  N = ∫ φ² from the turning point z = 0,
//
// with N exact from the Airy antiderivative ∫ w² dz = z w² − w′² (DLMF
// 9.11.5 with w₁ = w₂) in every layer: no η-derivative, unlike [Level].
// It returns log₁₀ Γ.
func gammaFlux(t *testing.T, layers []Layer, ref int, f float64, n int, prec uint) *big.Float {
	t.Helper()
	pb := newProblem(layers, ref, f)
	etaB, m, err := pb.boundLevel(n, prec, f)
	if err != nil {
		t.Fatal(err)
	}
	wp := prec + guard
	c := pb.consts(wp)
	eta := creal(etaB, wp)
	R := len(pb.layers) - 1
	// F(i, x) = (1/s)(z φ² − φ_z²) at x = pos[i'] in layer i, φ_z = μ p/s.
	prim := func(i, at int) *big.Float {
		lc := c.lc[i]
		st := m.at[at]
		z := pb.airyArg(lc, c.pos[at], eta, wp)
		a := newf(wp).Mul(&st.phi.re, &st.phi.re)
		a.Mul(a, &z.re)
		b := newf(wp).Mul(&st.p.re, lc.mu)
		b.Quo(b, lc.s)
		b.Mul(b, b)
		return a.Sub(a, b).Quo(a, lc.s)
	}
	norm := newf(wp).Neg(prim(R, R))
	for i := 1; i < R; i++ {
		norm.Add(norm, prim(i, i+1))
		norm.Sub(norm, prim(i, i))
	}
	// Downhill layer from the turning point to ξ₀: φ = βBi(z), φ_z = βBi′.
	lc0 := c.lc[0]
	phi0 := newf(wp).Quo(&m.p.re, &m.l.re) // φ₀ = p₀/L at the root
	phi2 := newf(wp).Mul(phi0, phi0)
	left := newf(wp).Mul(phi2, m.zmb2)
	left.Quo(left, lc0.s)
	if m.biSq != nil {
		_, _, _, bip0 := bigairy.Initial(wp)
		tail := newf(wp).Mul(bip0, bip0)
		tail.Mul(tail, phi2)
		tail.Quo(tail, m.biSq)
		left.Add(left, tail.Quo(tail, lc0.s))
	}
	norm.Add(norm, left)
	// ln Γ = ln(2 (s₀/μ₀) φ₀² / (π³ N)) − ln Bi(z₀)².
	pi := c.pi
	g := newf(wp).Quo(lc0.s, lc0.mu)
	g.Mul(g, phi2)
	g.SetMantExp(g, 1)
	g.Quo(g, newf(wp).Mul(newf(wp).Mul(pi, pi), pi))
	g.Quo(g, norm)
	ep := wp + 64
	if m.zeta != nil {
		ep += uint(max(bitsOf(m.zeta), 0))
	}
	ln := bigairy.Log(g, ep)
	if m.biSq != nil {
		ln.Sub(ln, bigairy.Log(m.biSq, ep))
	} else {
		// Bi² = e^(2ζ) S_u²/(π√z₀).
		b2 := newf(ep).Mul(m.su, m.su)
		b2.Quo(b2, pi)
		b2.Quo(b2, newf(ep).Sqrt(&m.z0.re))
		ln.Sub(ln, bigairy.Log(b2, ep))
		ln.Sub(ln, newf(ep).SetMantExp(m.zeta, 1))
	}
	return ln.Quo(ln, bigairy.Log(fint(10, ep), ep))
}

// The escape width from complex Newton on the outgoing-wave condition
// against the flux formula (gammaFlux), for narrow resonances
// (Γ from 1e-5 to 1e-300) in single, double and stepped wells. The flux
// formula neglects terms of relative order Γ/(level spacing), so they must
// agree to about that.
func TestWidthAgainstFlux(t *testing.T) {
	t.Parallel()
	const prec = 128
	double := []Layer{{0, 10, 1.37}, {1, 0, 1}, {0.2, 10, 1.37}, {1, 0, 1}, {0, 10, 1.37}}
	step := []Layer{{0, 10, 1.37}, {1, 0, 1}, {0.5, 3, 1.1}, {0, 10, 1.37}}
	for _, c := range sample([]struct {
		name   string
		layers []Layer
		f      float64
		n      int
	}{
		{"v4.3-f1", single(4.3, 1.37, 4.3, 1.37), 1, 1},
		{"v4.3-f2", single(4.3, 1.37, 4.3, 1.37), 2, 1},
		{"v50-f3", single(50, 1, 50, 1), 3, 1},
		{"v50-f2", single(50, 1, 50, 1), 2, 2},
		{"asym-f1", single(10, 2, 300, 1), 1, 2},
		{"double-f1", double, 1, 3},
		{"double-f-0.5", double, -0.5, 2},
		{"step-f3", step, 3, 2},
	}) {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			r, err := level(c.layers, 1, c.f, c.n, prec, routeNewtonOnly)
			if err != nil {
				t.Fatal(err)
			}
			lf := gammaFlux(t, c.layers, 1, c.f, c.n, prec)
			// |Δ log₁₀ Γ| · ln 10 is the relative difference.
			d := math.Abs(f64(newf(prec).Sub(r.Log10Gamma, lf))) * math.Ln10
			g := math.Pow(10, f64(r.Log10Gamma))
			t.Logf("Γ = %.6g (log₁₀ %.3f), flux rel diff %.3g", g, f64(r.Log10Gamma), d)
			if d > math.Max(10*g, 1e-34) {
				t.Errorf("Newton log₁₀ Γ = %s, flux %s: rel diff %g", r.Log10Gamma.Text('g', 20), lf.Text('g', 20), d)
			}
		})
	}
}
