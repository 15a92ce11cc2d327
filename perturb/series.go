package perturb

import (
	"math"
)

// The Rayleigh–Schrödinger series of one level,
//
//	η_n(f) = n² + c₂ f² + c₄ f⁴ + … + c_J f^J + O(f^(J+2)),
//
// is computed here once per level, exactly in the sense that no basis is
// truncated: every order of the wavefunction is a polynomial times
// cos(nπξ) plus a polynomial times sin(nπξ), and the recursion is solved in
// that closed form. The odd coefficients vanish (η_n is even in f, by the
// mirror symmetry ξ → 1 − ξ), so only even orders are kept.
//
// The recursion (any quantum-mechanics text, e.g. J. J. Sakurai and
// J. Napolitano, Modern Quantum Mechanics, 2nd ed., §5.1, from memory), with
// H₀ = −(1/π²) d²/dξ², V = ξ − ½, E₀ = n², ψ₀ = sin(kξ), k = nπ and the
// intermediate normalisation ⟨ψ₀|ψ_j⟩ = 0 for j ≥ 1:
//
//	E_j = ⟨ψ₀|V|ψ_(j−1)⟩ / ⟨ψ₀|ψ₀⟩,
//	(H₀ − E₀) ψ_j = −V ψ_(j−1) + Σ_(i=1..j) E_i ψ_(j−i),
//
// the second being, after multiplying by −π²,
//
//	ψ_j″ + k² ψ_j = π² (V ψ_(j−1) − Σ_(i=1..j) E_i ψ_(j−i)),   ψ_j(0) = ψ_j(1) = 0.
//
// With ψ = P cos(kξ) + Q sin(kξ) and right-hand side A cos(kξ) + B sin(kξ)
// (P, Q, A, B polynomials in u = ξ − ½) the equation splits into
//
//	P″ + 2kQ′ = A,   Q″ − 2kP′ = B,
//
// solved by Q′ = Σ_m (−1/(4k²))^m D^(2m) (A/(2k) + B′/(4k²)) (a finite sum)
// and P′ = (Q″ − B)/(2k). The constant in P makes ψ_j(0) = 0; ψ_j(1) = 0 then
// holds by the choice of E_j (the residual is tested); the constant in Q
// (a multiple of ψ₀) gives ⟨ψ₀|ψ_j⟩ = 0. Integrals of a polynomial g against
// cos(2kξ) and sin(2kξ) over [0, 1] are finite sums of end-point derivatives
// (repeated integration by parts, sin 2nπ = 0, cos 2nπ = 1).
//
// For j = 1 this gives the closed-form first-order wavefunction used by
// [Solver.Wavefunction]; for j = 2 it reproduces C_n (tested).

// maxOrder is J, the highest order of the series kept per level. The
// coefficients of f^2 … f^maxOrder feed the error estimates; the answer
// itself uses only f².
const maxOrder = 10

// nCoef is the number of even coefficients c₂, c₄, …, c_J kept per level.
const nCoef = maxOrder / 2

// poly is a polynomial in u = ξ − ½; p[i] is the coefficient of uⁱ.
type poly []float64

func (p poly) eval(u float64) float64 {
	s := 0.0
	for i := len(p) - 1; i >= 0; i-- {
		s = s*u + p[i]
	}
	return s
}

func (p poly) deriv() poly {
	if len(p) <= 1 {
		return nil
	}
	d := make(poly, len(p)-1)
	for i := 1; i < len(p); i++ {
		d[i-1] = float64(i) * p[i]
	}
	return d
}

// integ returns the antiderivative that vanishes at u = 0.
func (p poly) integ() poly {
	d := make(poly, len(p)+1)
	for i, c := range p {
		d[i+1] = c / float64(i+1)
	}
	return d
}

// mulU returns u·p.
func (p poly) mulU() poly {
	d := make(poly, len(p)+1)
	copy(d[1:], p)
	return d
}

// axpy returns a·x + y as a new polynomial.
func axpy(a float64, x, y poly) poly {
	d := make(poly, max(len(x), len(y)))
	for i, c := range x {
		d[i] = a * c
	}
	for i, c := range y {
		d[i] += c
	}
	return d
}

// intCos returns ∫₀¹ g cos(Kξ) dξ for K = 2nπ:
//
//	Σ_m (−1)^m (g^(2m+1)(1) − g^(2m+1)(0)) / K^(2m+2).
func intCos(g poly, K float64) float64 {
	s, sign, kp := 0.0, 1.0, K*K
	for d := g.deriv(); len(d) > 0; d = d.deriv().deriv() {
		s += sign * (d.eval(0.5) - d.eval(-0.5)) / kp
		sign, kp = -sign, kp*K*K
	}
	return s
}

// intSin returns ∫₀¹ g sin(Kξ) dξ for K = 2nπ:
//
//	Σ_m (−1)^m (g^(2m)(0) − g^(2m)(1)) / K^(2m+1).
func intSin(g poly, K float64) float64 {
	s, sign, kp := 0.0, 1.0, K
	for d := g; len(d) > 0; d = d.deriv().deriv() {
		s += sign * (d.eval(-0.5) - d.eval(0.5)) / kp
		sign, kp = -sign, kp*K*K
	}
	return s
}

// intOne returns ∫₀¹ g dξ.
func intOne(g poly) float64 {
	q := g.integ()
	return q.eval(0.5) - q.eval(-0.5)
}

// overlap returns ⟨sin(kξ)|P cos(kξ) + Q sin(kξ)⟩ over [0, 1], K = 2k:
// ½∫P sin Kξ + ½∫Q − ½∫Q cos Kξ.
func overlap(P, Q poly, K float64) float64 {
	return 0.5 * (intSin(P, K) + intOne(Q) - intCos(Q, K))
}

// series returns the even coefficients c₂, c₄, …, c_J of level n and the
// largest residual |ψ_j(1)| of the recursion (zero in exact arithmetic).
func series(n int) (c [nCoef]float64, resid float64) {
	k := float64(n) * math.Pi
	K := 2 * k
	inv4k2 := 1 / (4 * k * k)
	P := []poly{nil}
	Q := []poly{{1}}
	var E [maxOrder + 1]float64
	for j := 1; j <= maxOrder; j++ {
		uP, uQ := P[j-1].mulU(), Q[j-1].mulU()
		if j%2 == 0 {
			// ⟨ψ₀|V|ψ_(j−1)⟩/⟨ψ₀|ψ₀⟩ with ⟨ψ₀|ψ₀⟩ = ½. Odd orders are
			// zero by parity; computing them would only add rounding.
			E[j] = 2 * overlap(uP, uQ, K)
		}
		A, B := uP, uQ
		for i := 2; i <= j; i += 2 {
			A = axpy(-E[i], P[j-i], A)
			B = axpy(-E[i], Q[j-i], B)
		}
		A = axpy(math.Pi*math.Pi, A, nil)
		B = axpy(math.Pi*math.Pi, B, nil)
		g := axpy(1/(2*k), A, axpy(inv4k2, B.deriv(), nil))
		q := g
		scale := 1.0
		for d := g.deriv().deriv(); len(d) > 0; d = d.deriv().deriv() {
			scale *= -inv4k2
			q = axpy(scale, d, q)
		}
		pp := axpy(1/(2*k), q.deriv(), axpy(-1/(2*k), B, nil))
		Pj := pp.integ()
		Pj[0] -= Pj.eval(-0.5) // ψ_j(0) = P(−½) = 0
		Qj := q.integ()
		resid = math.Max(resid, math.Abs(Pj.eval(0.5))) // ψ_j(1) = ±P(½)
		if len(Qj) == 0 {
			Qj = poly{0}
		}
		Qj[0] -= 2 * overlap(Pj, Qj, K) // ⟨ψ₀|ψ_j⟩ = 0, ⟨ψ₀|ψ₀⟩ = ½
		P = append(P, Pj)
		Q = append(Q, Qj)
	}
	for i := range c {
		c[i] = E[2*i+2]
	}
	return c, resid
}
