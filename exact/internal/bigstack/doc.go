// Package bigstack is an arbitrary-precision (math/big) reference for the
// quasi-bound levels of finite-barrier and layered wells under a field,
// the role package bigairy plays for the infinite well. It is slow by
// design (milliseconds to a few hundred milliseconds per level) and exists
// to generate exact/testdata/stack256.txt and to check the fast solver of
// package exact in its tests. Its formulation is its own: it shares
// nothing with exact's float64 transfer-matrix solver but the model.
//
// The model, in the reduced units of the reference well (ξ ∈ [0, 1],
// energies in E₁, fields in F₀), is
//
//	H = −(1/π²) d/dξ (1/μ(ξ)) d/dξ + v(ξ) + f (ξ − ½)
//
// with piecewise-constant band edge v and mass ratio μ (the first and last
// layers semi-infinite) and φ, (1/μ) dφ/dξ continuous at the interfaces
// (BenDaniel–Duke). For f > 0 the uphill side holds the decaying Ai and the
// downhill side only the outgoing wave Ai − iBi (time factor e^(−iEt/ħ)),
// so the levels are complex, η = η_r − iΓ/2; at f = 0 they are bound
// states; f < 0 is the mirrored stack at −f. Level n is the n-th lowest
// by η_r.
//
// [Level] integrates the equation across the layers by Taylor series in ξ
// (exact in any layer, at any field including tiny ones where the Airy
// arguments are huge), takes the outer boundary conditions from Airy
// functions of complex argument (Maclaurin series with guard bits, or the
// asymptotic expansions where they reach the precision), brackets level n
// by a Sturm count on a real problem, and obtains Γ by complex Newton at
// a precision that resolves it, or, where Γ is below 10^-310, by a
// cancellation-free first-order formula. [Count] gives the number of
// levels it can find. [WriteTable] and [ReadTable] write and read the
// reference table; its format is documented in table.go.
//
// Arguments are never modified. All functions are safe for concurrent use.
package bigstack
