package bigstack

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"sort"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

func single(vl, ml, vr, mr float64) []Layer {
	return []Layer{{0, vl, ml}, {1, 0, 1}, {0, vr, mr}}
}

// textbookLevels returns the bound levels of the symmetric finite well at
// f = 0 from the even and odd equations
//
//	k tan(k/2) = κ/μ,  −k cot(k/2) = κ/μ,  k = π√η,  κ = π√(μ(v − η))
//
// (textbook; the mass ratio enters through the BenDaniel–Duke condition,
// G. Bastard, Wave Mechanics Applied to Semiconductor Heterostructures
// (1988), ch. III — from memory), written without poles as
// k sin(k/2) − (κ/μ) cos(k/2) = 0 and k cos(k/2) + (κ/μ) sin(k/2) = 0 and
// solved by bisection between consecutive multiples of π/2 in k/2.
func textbookLevels(v, mu float64, prec uint) []*big.Float {
	wp := prec + 32
	pi := bigairy.Pi(wp)
	g := func(even bool) func(*big.Float) int {
		return func(eta *big.Float) int {
			k := newf(wp).Sqrt(eta)
			k.Mul(k, pi)
			q := newf(wp).Sub(ffloat(v, wp), eta)
			q.Mul(q, ffloat(mu, wp))
			q.Sqrt(q)
			q.Mul(q, pi)
			q.Quo(q, ffloat(mu, wp))
			s, c := sinCos(newf(wp).SetMantExp(k, -1), wp)
			if even {
				r := newf(wp).Mul(k, s)
				return r.Sub(r, newf(wp).Mul(q, c)).Sign()
			}
			r := newf(wp).Mul(k, c)
			return r.Add(r, newf(wp).Mul(q, s)).Sign()
		}
	}
	var out []*big.Float
	// k/2 ∈ (jπ/2, (j+1)π/2): even roots for j even, odd for j odd;
	// η = (k/π)² = j² at k/2 = jπ/2.
	for j := 0; float64(j*j) < v; j++ {
		a := fint(int64(j*j), wp)
		b := newf(wp).SetFloat64(math.Min(float64((j+1)*(j+1)), v))
		if b.Cmp(ffloat(v, wp)) == 0 {
			b.Sub(b, newf(wp).SetMantExp(fint(1, wp), -int(prec)))
		}
		gj := g(j%2 == 0)
		if gj(a)*gj(b) < 0 {
			out = append(out, bisect(gj, a, b, prec))
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Cmp(out[j]) < 0 })
	return out
}

// f = 0: every level of symmetric wells against the textbook even/odd
// equations, and the number of bound states ⌈√v⌉ (the threshold κ = 0 of
// the same equations, k = π√v: one state per multiple of π below it).
func TestTextbookFiniteWell(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, v := range sample([]float64{2, 4.3, 10, 50, 300}) {
		for _, mu := range []float64{1, 1.37, 2} {
			t.Run(fmt.Sprintf("v=%g/mu=%g", v, mu), func(t *testing.T) {
				t.Parallel()
				want := textbookLevels(v, mu, prec)
				if len(want) != int(math.Ceil(math.Sqrt(v))) {
					t.Fatalf("textbook: %d levels, want ⌈√v⌉ = %g", len(want), math.Ceil(math.Sqrt(v)))
				}
				w := single(v, mu, v, mu)
				if k, err := Count(w, 1, 0); err != nil || k != len(want) {
					t.Errorf("Count = %d, %v; want %d", k, err, len(want))
				}
				ns := []int{1, 2, len(want)}
				if v <= 10 {
					ns = ns[:0]
					for n := 1; n <= len(want); n++ {
						ns = append(ns, n)
					}
				}
				for _, n := range ns {
					r, err := Level(w, 1, 0, n, prec)
					if err != nil {
						t.Fatalf("n=%d: %v", n, err)
					}
					if e := relErr(r.Eta, want[n-1], 1); e > 1e-34 || r.Route != RouteBound || r.Gamma.Sign() != 0 {
						t.Errorf("n=%d: η = %s, textbook %s (rel %g), route %v", n, r.Eta.Text('g', 25), want[n-1].Text('g', 25), e, r.Route)
					}
				}
				_, err := Level(w, 1, 0, len(want)+1, prec)
				if k, ok := tiltwell.Confined(err); !ok || k != len(want) || !errors.Is(err, tiltwell.ErrLevel) {
					t.Errorf("level %d: err %v, want a ConfinedError with %d", len(want)+1, err, len(want))
				}
			})
		}
	}
}

// phaseLevel solves the single-well condition in phase form,
//
//	k + arctan(k/q_L) + arctan(k/q_R) = nπ,  q = κ/μ of each side,
//
// (φ = sin(kξ + δ) in the well with k cot δ = q_L at ξ = 0 and
// k cot(k + δ) = −q_R at ξ = 1, BenDaniel–Duke; textbook, common practice)
// by bisection over η ∈ (0, edge), where qL(η), qR(η) are given.
func phaseLevel(n int, edge float64, qL, qR func(*big.Float, uint) *big.Float, prec uint) *big.Float {
	wp := prec + 32
	pi := bigairy.Pi(wp)
	g := func(eta *big.Float) int {
		k := newf(wp).Sqrt(eta)
		k.Mul(k, pi)
		s := newf(wp).Set(k)
		s.Add(s, bigairy.Atan(newf(wp).Quo(k, qL(eta, wp)), wp))
		s.Add(s, bigairy.Atan(newf(wp).Quo(k, qR(eta, wp)), wp))
		return s.Sub(s, newf(wp).Mul(fint(int64(n), wp), pi)).Sign()
	}
	b := ffloat(edge, wp)
	b.Sub(b, newf(wp).SetMantExp(fint(1, wp), -int(prec)))
	return bisect(g, newf(wp).SetMantExp(fint(1, wp), -int(prec)), b, prec)
}

// qExp returns q = κ/μ = π√(μ(v − η))/μ of a barrier.
func qExp(v, mu float64) func(*big.Float, uint) *big.Float {
	return func(eta *big.Float, wp uint) *big.Float {
		q := newf(wp).Sub(ffloat(v, wp), eta)
		q.Mul(q, ffloat(mu, wp))
		q.Sqrt(q)
		q.Mul(q, bigairy.Pi(wp))
		return q.Quo(q, ffloat(mu, wp))
	}
}

// f = 0, asymmetric wells against the phase-form textbook equation.
func TestTextbookAsymmetricWell(t *testing.T) {
	t.Parallel()
	const prec = 128
	for _, c := range sample([]struct{ vl, ml, vr, mr float64 }{{2, 1, 10, 1.37}, {4.3, 1.37, 50, 2}, {10, 2, 300, 1}, {300, 1, 50, 1.37}}) {
		t.Run(fmt.Sprintf("%v", c), func(t *testing.T) {
			t.Parallel()
			// The number of levels: ⌊(k + π/2 + arctan(k/q))/π⌋ at the lower
			// edge, where its q is 0 (the same equation at threshold).
			edge := math.Min(c.vl, c.vr)
			other := c.vr
			om := c.mr
			if c.vr == edge {
				other, om = c.vl, c.ml
			}
			ke := math.Pi * math.Sqrt(edge)
			qo := math.Pi * math.Sqrt(om*(other-edge)) / om
			nb := int(math.Floor((ke + math.Pi/2 + math.Atan(ke/qo)) / math.Pi))
			if k, err := Count(single(c.vl, c.ml, c.vr, c.mr), 1, 0); err != nil || k != nb {
				t.Errorf("Count = %d, %v; textbook %d", k, err, nb)
			}
			for n := 1; n <= nb; n++ {
				want := phaseLevel(n, math.Min(c.vl, c.vr), qExp(c.vl, c.ml), qExp(c.vr, c.mr), prec)
				r, err := Level(single(c.vl, c.ml, c.vr, c.mr), 1, 0, n, prec)
				if err != nil {
					t.Fatal(err)
				}
				if e := relErr(r.Eta, want, 1); e > 1e-34 {
					t.Errorf("n=%d: η = %s, textbook %s (rel %g)", n, r.Eta.Text('g', 25), want.Text('g', 25), e)
				}
			}
		})
	}
}

// A symmetric double well at f = 0 (barrier v | well | barrier of width b
// | well | barrier v, all barriers mass μ) splits each level into an even
// and an odd state. In the right-hand well, the central barrier's
// log-derivative is q_c = (κ/μ) tanh(κb/2) (even, φ ∝ cosh) or
// (κ/μ) coth(κb/2) (odd, φ ∝ sinh), and the well is then a single well
// with q_L = q_c, q_R = κ/μ in the phase-form equation (textbook, common
// practice). The splittings η₂ − η₁ … are checked.
func TestDoubleWellSplitting(t *testing.T) {
	t.Parallel()
	const (
		prec       = 128
		v, mu, bar = 10.0, 1.37, 0.2
	)
	w := []Layer{{0, v, mu}, {1, 0, 1}, {bar, v, mu}, {1, 0, 1}, {0, v, mu}}
	qc := func(even bool) func(*big.Float, uint) *big.Float {
		return func(eta *big.Float, wp uint) *big.Float {
			q := qExp(v, mu)(eta, wp)
			kb := newf(wp).Mul(q, ffloat(mu, wp)) // κ b/2 = (κ/μ)·μ·b/2
			kb.Mul(kb, ffloat(bar, wp))
			kb.SetMantExp(kb, -1)
			th := tanhBig(kb, wp)
			if even {
				return q.Mul(q, th)
			}
			return q.Quo(q, th)
		}
	}
	var want []*big.Float
	for n := 1; n <= 4; n++ {
		for _, even := range []bool{true, false} {
			e := phaseLevel(n, v, qc(even), qExp(v, mu), prec)
			if e.Cmp(ffloat(v*(1-1e-12), prec)) < 0 {
				want = append(want, e)
			}
		}
	}
	sort.Slice(want, func(i, j int) bool { return want[i].Cmp(want[j]) < 0 })
	if k, err := Count(w, 1, 0); err != nil || k != len(want) {
		t.Fatalf("Count = %d, %v; closed form has %d levels", k, err, len(want))
	}
	got := make([]*big.Float, len(want))
	for i := range want {
		r, err := Level(w, 1, 0, i+1, prec)
		if err != nil {
			t.Fatal(err)
		}
		got[i] = r.Eta
		if e := relErr(r.Eta, want[i], 1); e > 1e-34 {
			t.Errorf("n=%d: η = %s, closed form %s (rel %g)", i+1, r.Eta.Text('g', 25), want[i].Text('g', 25), e)
		}
	}
	for i := 0; i+1 < len(want); i += 2 {
		ds := newf(prec).Sub(got[i+1], got[i])
		dw := newf(prec).Sub(want[i+1], want[i])
		if e := relErr(ds, dw, 0); e > 1e-30 {
			t.Errorf("splitting %d–%d: %s, closed form %s (rel %g)", i+1, i+2, ds.Text('g', 20), dw.Text('g', 20), e)
		}
	}
}

// For orientation only, numbers computed by the team with mpmath (not a
// publication) for v = 4.3, μ = 1.37: η₁ = 0.53932 at f = 0;
// η₁(1) = 0.50017, Γ₁ ≈ 6.9e-14; η₁(2) = 0.38689, Γ₁ ≈ 2.8e-6 (the digits
// given: half a unit in the last).
func TestOrientationValues(t *testing.T) {
	t.Parallel()
	w := single(4.3, 1.37, 4.3, 1.37)
	for _, c := range []struct {
		f            float64
		eta, gamma   float64
		etol, gtolRe float64
	}{
		{0, 0.53932, 0, 5e-6, 0},
		{1, 0.50017, 6.9e-14, 5e-6, 0.05e-14 / 6.9e-14},
		{2, 0.38689, 2.8e-6, 5e-6, 0.05e-6 / 2.8e-6},
	} {
		r, err := Level(w, 1, c.f, 1, 128)
		if err != nil {
			t.Fatal(err)
		}
		if d := math.Abs(f64(r.Eta) - c.eta); d > c.etol {
			t.Errorf("f=%g: η₁ = %.8g, want %g", c.f, f64(r.Eta), c.eta)
		}
		if g := f64(r.Gamma); (c.gamma == 0 && g != 0) || (c.gamma != 0 && math.Abs(g/c.gamma-1) > c.gtolRe) {
			t.Errorf("f=%g: Γ₁ = %.4g, want %g", c.f, g, c.gamma)
		}
	}
}
