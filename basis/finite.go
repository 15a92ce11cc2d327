package basis

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/internal/airy"
	"gonum.org/v1/gonum/integrate/quad"
)

const (
	// DefaultBox is the deepest, in units of L, that the automatic box
	// reaches beyond the outer interfaces into the outer layers (see
	// [Solver.Box]).
	DefaultBox = 8
	// MaxBox is the largest Box a Solver accepts, in units of L.
	MaxBox = 100
	// boxDecay is the decay exponent ∫κ dξ across the barrier between an
	// outer interface and the box wall that the automatic box aims at: the
	// wall then shifts a level by about 2κψ²e^(−18)/(π²μ) (ψ its value at
	// the interface), and the first-order edge correction removes all but
	// the square of that.
	boxDecay = 9
	// zeroDecay is the exponent of the box at f = 0 without a potential,
	// where the levels are the box's own roots and a wider box costs
	// nothing: the wall's shift is then below e^(−38) ≈ 3e-17 relative.
	zeroDecay = 19
	// zeroBoxMax bounds that box, in units of L.
	zeroBoxMax = 1000
	// boxNudge shortens the depths of a Box the caller chose by this
	// irrational fraction (4.0e-4): a box whose layers all hold whole
	// numbers of half-waves at one energy (round depths beside round band
	// edges, as Box = 1 beside a well of width 1 and barriers of 5 E₁ at
	// E = 9) has a degenerate box level, whose closed form gives one
	// state twice and leaves its partner out of the basis. That left
	// errors of 4e-10 to 5e-4 at every basis size, 20 to 6e5 times the
	// estimate (TestFiniteRoundBox); the nudge moves such depths off the
	// coincidence. The automatic depths follow the levels and are left
	// as they are (shortened too, 5 levels of the default grid of
	// TestFiniteAgainstExact were no longer confined).
	boxNudge = (math.Sqrt2 - 1) / 1024
	// maxBoxPasses bounds the passes that place the box.
	maxBoxPasses = 6
	// probeExtra is how many states beyond k the passes that place the
	// box use.
	probeExtra = 10
)

// fwork is the scratch space of a finite stack.
type fwork struct {
	layers []tiltwell.Layer
	ifs    []float64
	segs   []seg
	e      []float64 // box levels E_1..E_(N+1)
	en     []float64 // Neumann box levels (f = 0)
	reps   []rep     // N×nseg closed forms
	ends   []float64 // N×(nseg+1) values at the layer edges
	ls, rs []shot
	x, wt  []float64 // quadrature nodes and weights
	wf     []float64 // W(x) = f(x − ½) + V(x) at the nodes
	phi    []float64 // N×Q basis states at the nodes
	g      []float64 // N×Q scratch: w·W·Φ
	psi    []float64 // Q: a Ritz function at the nodes
	brk    []float64 // the Breaks of the folded potential
	out    []flevel  // per level
	prev   []flevel  // the levels of a smaller basis on the same box
	save   []flevel
	stale  bool      // w.a holds another basis's vectors than out's
	wd     []float64 // diagonal of W in the basis
	gy     []float64 // Qᵀe, e_m = χ_m(x₀), for the Green's function
	cw     []complex128
	piv    []bool
	// The box the basis was built on: depths beyond the interfaces, the
	// index of the interfaces x0 and x1 among the layer edges, the
	// number of nodes and of states.
	dl, dr             float64
	i0, i1             int
	nq, ns             int
	wmin               float64        // min W over the nodes
	vmin               float64        // lowest band edge of the box (zero field)
	mumax              float64        // largest mass ratio in the box
	mirrorOf, mirrored tiltwell.Stack // the last stack mirrored, and its mirror
}

// flevel is one level of a stack as the solver finds it.
type flevel struct {
	energy, gamma float64
	// err is the level's error estimate without the wall's truncation
	// (Ritz truncation, rounding, the right wall, the iteration's noise,
	// the neglected orders of a narrow width); gammaRel is Γ's relative
	// error from the width formula; wall models the error the wall's
	// Green's function leaves; Err and GammaErr are the totals reported.
	err, gammaRel, wall, chi float64
	Err, GammaErr            float64
	bound                    tiltwell.Bound
	theta                    float64 // the Ritz value in the box
	trunc                    float64 // the truncation part of err
}

// geometry is a folded stack (f ≥ 0) as the box sees it, with the
// potential.
type geometry struct {
	x0, x1  float64 // outer interfaces
	vl, ml  float64 // left outer layer
	vr, mr  float64 // right outer layer
	f       float64
	edgeL   float64 // band edge of the left outer layer at x0, with the field
	edgeR   float64 // the same on the right, at x1
	ceiling float64 // min(edgeL, edgeR): confined levels lie below it
	inner   []tiltwell.Layer
	innerLo []float64 // left edges of the inner layers
	pot     func(float64) float64
	mirror  bool      // evaluate the potential at 1 − ξ
	breaks  []float64 // in the folded frame
	userBox float64
	limit   float64 // deepest box
}

// newGeometry reads the folded stack st at field f ≥ 0.
func (w *fwork) newGeometry(st tiltwell.Stack, f float64) geometry {
	w.layers = st.Layers(w.layers)
	w.ifs = st.Interfaces(w.ifs)
	n := len(w.layers)
	g := geometry{x0: w.ifs[0], x1: w.ifs[len(w.ifs)-1], f: f}
	g.vl, g.ml = w.layers[0].Edge, w.layers[0].Mass
	g.vr, g.mr = w.layers[n-1].Edge, w.layers[n-1].Mass
	g.edgeL = g.vl + f*(g.x0-0.5)
	g.edgeR = g.vr + f*(g.x1-0.5)
	g.ceiling = min(g.edgeL, g.edgeR)
	g.inner = w.layers[1 : n-1]
	g.innerLo = w.ifs[:n-2]
	return g
}

// depth returns how far beyond an outer interface the box wall goes for a
// level eta: where the decay exponent ∫κ dξ from the interface reaches D,
// with κ = π√(μ(v(x) − η)), v(x) = bar + f·x on the uphill side and
// bar − f·x on the downhill side (x the distance from the interface, bar
// the band edge there, f ≥ 0); on the downhill side, if the barrier ends
// first, the first zero of Bi beyond the classical turning point. With Δ = bar − η and κ₀ = π√(μΔ),
//
//	∫₀^d κ₀√(1 ± fx/Δ) dx = ±(2Δκ₀/(3f))((1 ± fd/Δ)^(3/2) − 1),
//
// solved for d through log1p and expm1 so that f → 0 gives d = D/κ₀.
// The result is capped at limit; a level at or above bar gets limit
// (0 on the downhill side under a field).
func depth(bar, eta, mu, f, D, limit float64, downhill bool) float64 {
	delta := bar - eta
	if !(delta > 0) {
		if downhill && f > 0 {
			return 0
		}
		return limit
	}
	k0 := math.Pi * math.Sqrt(mu*delta)
	if f == 0 {
		return min(D/k0, limit)
	}
	r := 3 * f * D / (2 * delta * k0)
	var y float64
	if downhill {
		if r >= 1 {
			// The barrier ends before the decay reaches D: the wall goes to
			// the first zero of Bi beyond the turning point, z = b₁, where
			// the real problem's own solution vanishes (see greens.go).
			fs := math.Cbrt(f * f / (math.Pi * math.Pi * mu)) // f/s
			return min((delta-airy.BiZero1*fs)/f, limit)
		}
		y = -math.Expm1(2.0 / 3 * math.Log1p(-r))
	} else {
		y = math.Expm1(2.0 / 3 * math.Log1p(r))
	}
	return min(delta*y/f, limit)
}

// depths returns the box depths for a top level etaTop (NaN: a first
// guess that no confined level's turning point can lie inside).
func (g *geometry) depths(etaTop, D float64) (dl, dr float64) {
	lim := g.limit
	switch {
	case math.IsNaN(etaTop):
		dl, dr = min(1, lim), min(1, lim)
		if g.f > 0 {
			// Every confined level lies below the ceiling; with the wall
			// one Airy length f/s beyond the ceiling's turning point, the
			// wall is at z ≥ −1 for each of them (its shift stays of the
			// order of its width), and the outer stretch holds no state
			// below the ceiling (its lowest is about |a₁| = 2.34 Airy
			// energies above its bottom).
			fs := math.Cbrt(g.f * g.f / (math.Pi * math.Pi * g.ml)) // f/s
			dl = min(lim, (max(g.edgeL-g.ceiling, 0)+fs)/g.f)
		}
	case g.userBox > 0:
		dl, dr = g.userBox, g.userBox
		if g.f > 0 {
			fs := math.Cbrt(g.f * g.f / (math.Pi * math.Pi * g.ml))
			dl = min(dl, (max(g.edgeL-etaTop, 0)-airy.BiZero1*fs)/g.f)
		}
	default:
		dl = depth(g.edgeL, etaTop, g.ml, g.f, D, lim, true)
		dr = depth(g.edgeR, etaTop, g.mr, g.f, D, lim, false)
	}
	return dl, dr
}

// setBox sets the layers of the box with depths dl and dr (a depth of 0
// puts the wall on the interface), each shortened by boxNudge where the
// caller chose the Box.
func (w *fwork) setBox(g *geometry, dl, dr float64) {
	if g.userBox > 0 {
		dl, dr = dl*(1-boxNudge), dr*(1-boxNudge)
	}
	w.segs = w.segs[:0]
	w.dl, w.dr = dl, dr
	w.i0 = 0
	if dl > 0 {
		w.segs = append(w.segs, seg{lo: g.x0 - dl, w: dl, v: g.vl, mu: g.ml})
		w.i0 = 1
	}
	for i, l := range g.inner {
		w.segs = append(w.segs, seg{lo: g.innerLo[i], w: l.Width, v: l.Edge, mu: l.Mass})
	}
	w.i1 = len(w.segs)
	if dr > 0 {
		w.segs = append(w.segs, seg{lo: g.x1, w: dr, v: g.vr, mu: g.mr})
	}
	w.vmin, w.mumax = math.Inf(1), 0
	for _, s := range w.segs {
		w.vmin, w.mumax = min(w.vmin, s.v), max(w.mumax, s.mu)
	}
}

// buildBasis computes the N lowest box states (and the level of state
// N + 1) on the current box, the quadrature nodes, the states there
// (normalized) and W(x) = f(x − ½) + V(x). It returns an error if a
// Potential value is not finite, or if the box levels could not be
// bracketed.
func (w *fwork) buildBasis(g *geometry, N int) error {
	ns := len(w.segs)
	w.e = grow(w.e, N+1)
	if !boxLevels(w.segs, dirichlet, w.e) {
		return fmt.Errorf("basis: box levels of %d states could not be bracketed: %w", N+1, tiltwell.ErrNoConvergence)
	}
	w.reps = grow(w.reps, N*ns)
	w.ends = grow(w.ends, N*(ns+1))
	w.ls, w.rs = grow(w.ls, ns+1), grow(w.rs, ns+1)
	for m := range N {
		boxState(w.segs, dirichlet, w.e[m], w.reps[m*ns:(m+1)*ns], w.ends[m*(ns+1):(m+1)*(ns+1)], w.ls, w.rs)
	}
	// Nodes: per layer (split at Breaks), enough for the products of two
	// states: ⌈0.8·Ω·h⌉ + 24, Ω the largest |q|^(1/2) of the states on
	// the layer (the product varies as e^(±2Ωx); Gauss–Legendre is exact
	// to rounding for it from about 0.7·Ω·h nodes, tested).
	extra := 24
	if g.pot != nil {
		extra = 32
	}
	nq := 0
	for pass := range 2 {
		nq = 0
		for si := range w.segs {
			s := &w.segs[si]
			om := math.Pi * math.Sqrt(s.mu*math.Max(math.Abs(s.v-w.e[0]), math.Abs(s.v-w.e[N-1])))
			lo := s.lo
			for bi := 0; bi <= len(g.breaks); bi++ {
				hi := s.lo + s.w
				if bi < len(g.breaks) {
					b := g.breaks[bi]
					if !(b > lo && b < hi) {
						continue
					}
					hi = b
				}
				q := int(math.Ceil(nodeFactor*om*(hi-lo))) + extra
				if q == 26 {
					// gonum v0.17.0's quad.Legendre returns a wrong rule for
					// 26 nodes (its weights sum to 0.98945; measured, every
					// other size from 2 to 3000 is right).
					q = 27
				}
				if pass == 1 {
					x, wt := w.x[nq:nq+q], w.wt[nq:nq+q]
					quad.Legendre{}.FixedLocations(x, wt, lo, hi)
				}
				nq += q
				lo = hi
			}
		}
		if pass == 0 {
			w.x, w.wt = grow(w.x, nq), grow(w.wt, nq)
		}
	}
	w.nq, w.ns = nq, N
	w.phi, w.wf = grow(w.phi, N*nq), grow(w.wf, nq)
	// W at the nodes; the potential acts only between the outer
	// interfaces.
	w.wmin = math.Inf(1)
	for q, x := range w.x[:nq] {
		v := g.f * (x - 0.5)
		if g.pot != nil && x > g.x0 && x < g.x1 {
			xv := x
			if g.mirror {
				xv = 1 - x
			}
			p := g.pot(xv)
			if !(math.Abs(p) <= MaxPotential) {
				return fmt.Errorf("basis: Potential(%g) = %v, not a finite number of magnitude at most %g: %w", xv, p, MaxPotential, tiltwell.ErrUnits)
			}
			v += p
		}
		w.wf[q] = v
		w.wmin = min(w.wmin, v)
	}
	// The states at the nodes, normalized by the quadrature.
	for m := range N {
		row := w.phi[m*nq : (m+1)*nq]
		r := w.reps[m*ns : (m+1)*ns]
		si := 0
		nrm := 0.0
		for q, x := range w.x[:nq] {
			for si+1 < ns && x > w.segs[si].lo+w.segs[si].w {
				si++
			}
			v := r[si].at(x-w.segs[si].lo, w.segs[si].w)
			row[q] = v
			nrm += w.wt[q] * v * v
		}
		sc := 1 / math.Sqrt(nrm)
		for q := range row {
			row[q] *= sc
		}
		for i := range r {
			r[i].c1 *= sc
			r[i].c2 *= sc
		}
		ends := w.ends[m*(ns+1) : (m+1)*(ns+1)]
		for i := range ends {
			ends[i] *= sc
		}
	}
	return nil
}

// nodeFactor is the number of Gauss–Legendre nodes per unit of Ω·h on a
// layer (see buildBasis).
const nodeFactor = 0.8
