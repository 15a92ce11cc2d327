package tiltwell

import (
	"fmt"
	"math"
	"slices"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/unit/constant"

	"github.com/tiltwell/tiltwell/internal/coulomb"
)

// Hydrogen scales, from CODATA 2018 (see [ElectronMass]): with the fine
// structure constant α = 7.2973525693e-3 (CODATA 2018, as gonum's
// unit/constant has it) and e²/(4πε₀) = αħc,
//
//	a₀ = ħ/(m₀ c α) = 5.29177210903e-11 m,   Ry = m₀ c² α²/2 = 13.605693122994 eV.
var (
	bohrRadius = ReducedPlanck / (ElectronMass * float64(constant.LightSpeedInVacuum) * float64(constant.FineStructure))
	rydberg    = ElectronMass * float64(constant.LightSpeedInVacuum) * float64(constant.LightSpeedInVacuum) *
		float64(constant.FineStructure) * float64(constant.FineStructure) / 2
)

// Exciton is the electron–hole pair of a quantum well for the variational
// exciton binding energy ([Exciton.Binding]): the width of the well the
// wavefunctions were computed in, the masses of the relative motion and the
// dielectric constant. All fields but Interfaces must be finite and
// positive.
//
// The model (effective masses, one conduction and one valence subband, no
// band mixing, no image charges, one dielectric constant everywhere, the
// in-plane centre of mass at rest) is
//
//	H = H_e(z_e) + H_h(z_h) − ħ²/(2μ) ∇²_ρ − e²/(4πε₀ε_r √(ρ² + (z_e − z_h)²)),
//
// with H_e, H_h the electron's and the hole's Hamiltonians across the well
// (field included), ρ the in-plane electron–hole separation and μ the
// in-plane reduced mass.
type Exciton struct {
	// Width is the reference width L in metres: the length unit ξ = z/L
	// of the wavefunctions.
	Width float64
	// Reduced is the in-plane reduced mass μ = m_e∥ m_h∥/(m_e∥ + m_h∥) in
	// units of the electron mass m₀. For a GaAs heavy hole the in-plane
	// hole mass is 1/(γ₁ + γ₂), not the mass along the growth axis.
	Reduced float64
	// Normal is the reduced mass along the growth axis,
	// μ_z = m_e m_h/(m_e + m_h) in m₀, with the masses the wavefunctions
	// were computed with (those of the reference well). It enters only
	// the two-parameter trial function, whose correlation depends on
	// z_e − z_h.
	Normal float64
	// Dielectric is the static relative permittivity ε_r.
	Dielectric float64
	// Interfaces lists the ξ of the interfaces where the wavefunctions'
	// derivatives may jump (BenDaniel–Duke, with different masses on the
	// two sides), such as Stack.Interfaces of either carrier's stack (the
	// electron's and the hole's stacks share their layers). If it is nil,
	// the interfaces are 0 and 1, those of a single well. Values outside
	// the wavefunctions' supports are ignored.
	Interfaces []float64
}

// ExcitonBinding is the result of [Exciton.Binding]: the binding energy of
// the 1s exciton and the in-plane trial function that gives it.
type ExcitonBinding struct {
	// Energy is the binding energy E_B = E_e + E_h − E_X in meV from the
	// two-parameter trial function, E_X being the variational exciton
	// energy; the larger Energy, the more bound. See [Exciton.Binding]
	// for what is proven about it.
	Energy float64
	// Err is an estimate, not a proven bound, of how far Energy lies below
	// the model's binding energy, in meV: the gain of the two-parameter
	// trial over the one-parameter one (Energy − OneParameter), plus
	// Numerical.
	Err float64
	// Numerical is the estimated quadrature error of the energies in meV,
	// from the convergence of three nested rules; it is included in Err.
	Numerical float64
	// Radius is the optimal in-plane radius λ of the two-parameter trial
	// function, in nm.
	Radius float64
	// Anisotropy is the optimal β ∈ [0, 1] of the two-parameter trial
	// function: 0 for the purely in-plane (two-dimensional) form, 1 for
	// the isotropic (three-dimensional) one.
	Anisotropy float64
	// Density is 1/⟨Ψ|Ψ⟩ for the two-parameter trial function Ψ (with
	// F(0, 0) = 1 and normalized φ_e, φ_h), per unit area in nm⁻²: the
	// in-plane density of the relative motion at zero separation. The
	// oscillator strength of the exciton line is proportional to
	// |∫ Ψ(z, z, ρ = 0) dz|²/⟨Ψ|Ψ⟩ = overlap² × Density, with overlap the
	// electron–hole overlap ∫φ_e φ_h dξ. For the one-parameter form it is
	// 2/(πλ²), the normalized exp(−ρ/λ) at ρ = 0; in the two-dimensional
	// limit it tends to 8/(πa*²), with a* = [Exciton.BohrRadius].
	Density float64
	// OneParameter is the binding energy in meV from the one-parameter
	// trial function exp(−ρ/λ) (Bastard et al.), OneParameterRadius its
	// optimal λ in nm and OneParameterDensity its 2/(πλ²) in nm⁻².
	OneParameter        float64
	OneParameterRadius  float64
	OneParameterDensity float64
}

// Rydberg returns the effective Rydberg Ry* = Ry μ/ε_r² in meV, the
// binding energy of the three-dimensional hydrogenic exciton (Ry =
// 13.605693122994 eV, CODATA 2018). The strictly two-dimensional exciton
// binds by 4 Ry*. It does not check its receiver.
func (x Exciton) Rydberg() float64 {
	return rydberg / ElementaryCharge * 1e3 * x.Reduced / (x.Dielectric * x.Dielectric)
}

// BohrRadius returns the effective Bohr radius a* = a₀ ε_r/μ in nm
// (a₀ = 0.0529177210903 nm, CODATA 2018). It does not check its receiver.
func (x Exciton) BohrRadius() float64 {
	return bohrRadius * 1e9 * x.Dielectric / x.Reduced
}

// Limits of the exciton calculation.
const (
	// excitonMinWidth and excitonMaxWidth bound L/a*: near them the
	// two- and three-dimensional limits are reached to 2e-6 and 1e-10
	// (measured at L/a* = 1e-6 and 9e4, infinite walls).
	excitonMinWidth = 1e-6
	excitonMaxWidth = 1e5
	// excitonNormTol is the largest |∫φ² dξ − 1| accepted, the same
	// tolerance exact.Check holds solvers to.
	excitonNormTol = 1e-6
)

// Binding returns the binding energy of the 1s exciton formed by the
// electron in electron and the hole in hole, both normalized
// wavefunctions of ξ = z/L in the reduced units of x.Width (for a hole,
// its wavefunction in the mirrored tilt, as [Pair.Sweep] uses it).
// Wavefunctions that implement [Spread] are integrated over their
// Support; others over [0, 1].
//
// The trial functions are Ψ = φ_e(z_e) φ_h(z_h) F(ρ, z_e − z_h) with
//
//	F = exp(−ρ/λ)                       one parameter λ (G. Bastard,
//	                                    E. E. Mendez, L. L. Chang, L. Esaki,
//	                                    Phys. Rev. B 26, 1974 (1982))
//	F = exp(−√(ρ² + β²(z_e − z_h)²)/λ)   two parameters λ > 0, 0 ≤ β ≤ 1
//
// (the anisotropic form of the quantum-well exciton literature, used for
// instance by R. L. Greene, K. K. Bajaj and D. E. Phelps, Phys. Rev. B 29,
// 1807 (1984) — from memory). β = 0 is the one-parameter form and β = 1
// the three-dimensional hydrogenic 1s state, exact in a wide well. With
// φ_e, φ_h eigenfunctions of H_e, H_h (energies E_e, E_h) and
// u = z_e − z_h, the kinetic energy of a product φF is that of φ plus
// ∫φ²|∇F|², and ∂F/∂z_e = −∂F/∂z_h = ∂F/∂u, so
//
//	⟨Ψ|H|Ψ⟩ − (E_e + E_h)⟨Ψ|Ψ⟩ = ∫ φ_e² φ_h² [ħ²/(2μ) |∇_ρF|² + ħ²/(2μ_z) |∂_uF|² − e²F²/(4πε₀ε_r r)],
//
// with 1/μ_z = 1/m_e + 1/m_h. Every term reduces to an integral over u of
// the density C(u) = ∫φ_e²(z + u) φ_h²(z) dz of the electron–hole
// separation against closed-form kernels of u/λ and β. The Coulomb kernel
// is the in-plane average
//
//	∫ d²ρ exp(−2√(ρ² + β²u²)/λ)/√(ρ² + u²) = πλ K(2|u|/λ, β),
//	K(B, β) = ∫_{βB}^∞ t e^(−t)/√(t² + (1 − β²)B²) dt,
//
// which at β = 0 is B[(π/2)(H₁(B) − Y₁(B)) − 1] (Struve and Neumann
// functions, DLMF 11.5.2 differentiated with 11.4.27 and 10.6.3) and at
// β = 1 is e^(−B); the kinetic kernels hold E₁ (DLMF 6.2.1). The
// one-parameter energy is minimised by Brent's method (R. P. Brent,
// Algorithms for Minimization without Derivatives (1973), ch. 5), the
// two-parameter one by Newton steps on finite differences in ln λ and θ,
// β = sin²θ.
//
// What is proven. The variational principle makes E_X an upper bound on
// the lowest energy of H (with the in-plane centre of mass at rest), so
// Energy and OneParameter are lower bounds on the model's exciton binding
// energy, Energy ≥ OneParameter, provided that
//   - H has a lowest level: infinite walls at any field, finite barriers
//     at zero field. Under a field with finite barriers the exciton is a
//     resonance, the spectrum of H has no bottom, and Energy is an
//     estimate of its binding, not a bound;
//   - φ_e, φ_h are the eigenfunctions of H_e, H_h. For OneParameter this
//     is not needed: it is a bound for any normalized φ, with E_e, E_h
//     their expectation values. For Energy with β > 0 it is, and the
//     error of an approximate solver's wavefunctions enters unbounded;
//   - the mass along z of each carrier is the reference well's
//     everywhere (infinite walls), or no heavier there than in the
//     barriers (the usual case: the ∂_uF term, evaluated with the well's
//     μ_z, is then overestimated and the bound survives);
//   - the quadrature is accurate to Numerical (an estimate, from the
//     convergence of nested rules; the tests' independent quadrature
//     agrees with Energy to 1e-14 relative).
//
// What is estimated. Err, the gain of the two-parameter trial over the
// one-parameter one, is an estimate of the remaining error, not a bound,
// and not checked against an exact solution of the model: it vanishes in
// the two-dimensional limit, where both trials are exact, and is
// pessimistic in wide wells (L ≫ a*), where the one-parameter binding
// falls to zero while the two-parameter one tends to the exact 1 Ry*. For
// the 10 nm GaAs well of the tests, a richer trial with a further factor
// exp(−γ|z_e − z_h|) gains 0.0075 meV where Err = 0.131 meV: there too Err
// is likely an overestimate, by ten or more.
//
// Limits (infinite walls, measured in the tests): Energy → 4 Ry* as
// L/a* → 0 (the two-dimensional hydrogen atom) and → 1 Ry* as L/a* → ∞
// with μ_z = μ (the three-dimensional one); OneParameter → 4 Ry* and → 0.
//
// Binding returns an error wrapping [ErrUnits] for a width, mass or
// dielectric constant that is not a finite positive number, L/a* outside
// [1e-6, 1e5], a nil wavefunction, a support that is not a finite
// interval, an interface that is NaN or infinite, a wavefunction that is
// NaN or infinite somewhere, or one whose ∫φ² differs from 1 by more than
// 1e-6; and an error wrapping [ErrNoConvergence] for a wavefunction that
// no polynomial of degree 1024 resolves between two interfaces (a kink
// at an interface missing from Interfaces).
func (x Exciton) Binding(electron, hole Wavefunction) (ExcitonBinding, error) {
	if err := x.validate(); err != nil {
		return ExcitonBinding{}, err
	}
	if electron == nil || hole == nil {
		return ExcitonBinding{}, fmt.Errorf("tiltwell: exciton: nil wavefunction (electron %v, hole %v): %w", electron != nil, hole != nil, ErrUnits)
	}
	astar := x.BohrRadius() * 1e-9 // metres
	la := x.Width / astar          // L/a*
	if !(la >= excitonMinWidth && la <= excitonMaxWidth) {
		return ExcitonBinding{}, fmt.Errorf("tiltwell: exciton: width L/a* = %g (L = %g m, a* = %g m) outside [%g, %g]: %w",
			la, x.Width, astar, excitonMinWidth, excitonMaxWidth, ErrUnits)
	}
	breaks, err := x.interfaces()
	if err != nil {
		return ExcitonBinding{}, err
	}
	ce, err := sampleCarrier("electron", electron, breaks)
	if err != nil {
		return ExcitonBinding{}, err
	}
	ch, err := sampleCarrier("hole", hole, breaks)
	if err != nil {
		return ExcitonBinding{}, err
	}

	p := newPairDensity(&ce, &ch, la)
	nu := x.Reduced / x.Normal
	// ln λ, λ in units of a*: the two-dimensional optimum is ½ and no
	// trial here binds more tightly; the upper end covers the
	// one-parameter radius of wide wells, of order √(L a*).
	lo := math.Log(lambdaMin)
	hi := math.Log(4 * max(1, la*p.span))

	// One parameter: β = 0, from the start λ ≈ √(¼ + L/(3a*)), which
	// joins the two-dimensional optimum ½ to the wide-well growth
	// √(L a*/3) of the in-plane trial (within 15%).
	e1 := func(s float64) float64 { return p.energy(p.coarse, math.Exp(s), 0, nu) }
	s1, f1 := bracketMin(e1, 0.5*math.Log(0.25+la/3), lo, hi)

	// Two parameters: Newton's method on (ln λ, θ) with β = sin²θ, which
	// keeps β in [0, 1] and makes the ends of that range interior
	// stationary points; it starts from the one-parameter radius at β = ½.
	e2 := func(s, th float64) float64 {
		sn := math.Sin(th)
		return p.energy(p.coarse, math.Exp(s), sn*sn, nu)
	}
	s2, th2, f2 := newton2(e2, s1, math.Pi/4, lo, hi)
	beta2 := math.Sin(th2) * math.Sin(th2)
	if f1 < f2 {
		// The two-parameter family contains the one-parameter one.
		s2, beta2 = s1, 0
	}

	// Final energies with the fine rule, and the estimate of its error.
	lam1, lam2 := math.Exp(s1), math.Exp(s2)
	fine1, num1 := p.final(lam1, 0, nu)
	fine2, num2 := p.final(lam2, beta2, nu)
	num := max(num1, num2)
	if fine2 > fine1 {
		fine2, lam2, beta2 = fine1, lam1, 0
	}
	ry := x.Rydberg()
	an := x.BohrRadius()
	b := ExcitonBinding{
		Energy:              -fine2 * ry,
		Numerical:           num * ry,
		Radius:              lam2 * an,
		Anisotropy:          beta2,
		Density:             2 / (math.Pi * lam2 * lam2 * p.norm(p.fine, lam2, beta2) * an * an),
		OneParameter:        -fine1 * ry,
		OneParameterRadius:  lam1 * an,
		OneParameterDensity: 2 / (math.Pi * lam1 * lam1 * an * an),
	}
	b.Err = (b.Energy - b.OneParameter) + b.Numerical
	return b, nil
}

func (x Exciton) validate() error {
	for _, v := range []struct {
		name  string
		value float64
	}{
		{"width", x.Width},
		{"in-plane reduced mass", x.Reduced},
		{"reduced mass along z", x.Normal},
		{"dielectric constant", x.Dielectric},
	} {
		if !(v.value > 0) || math.IsInf(v.value, 0) {
			return fmt.Errorf("tiltwell: exciton: %s %v: %w", v.name, v.value, ErrUnits)
		}
	}
	return nil
}

// interfaces returns the sorted interfaces, 0 and 1 by default.
func (x Exciton) interfaces() ([]float64, error) {
	if x.Interfaces == nil {
		return []float64{0, 1}, nil
	}
	b := slices.Clone(x.Interfaces)
	for _, v := range b {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("tiltwell: exciton: interface at ξ = %v: %w", v, ErrUnits)
		}
	}
	slices.Sort(b)
	return slices.Compact(b), nil
}

// Optimisation settings, in units of a* for λ.
const (
	lambdaMin = 0.3  // below the two-dimensional optimum ½
	brentTol  = 1e-6 // in ln λ: the energy is then exact to ~1e-12
)

// ---- Wavefunctions as piecewise Chebyshev series ----

// chebPanel is φ on [lo, hi] as a Chebyshev series in t = (2ξ − lo − hi)/(hi − lo).
type chebPanel struct {
	lo, hi float64
	c      []float64
	// bound is Σ|c_k|, at least max |φ| on the panel.
	bound float64
}

// at evaluates the series at ξ in the panel (Clenshaw's recurrence).
func (p *chebPanel) at(xi float64) float64 {
	t := (2*xi - p.lo - p.hi) / (p.hi - p.lo)
	t2 := 2 * t
	var b1, b2 float64
	for k := len(p.c) - 1; k >= 1; k-- {
		b1, b2 = p.c[k]+t2*b1-b2, b1
	}
	return p.c[0] + t*b1 - b2
}

// carrier is one wavefunction as contiguous Chebyshev panels over its
// support, split at the interfaces and where a degree would exceed
// maxPanelDegree; kinks lists where φ or φ′ may jump: the interfaces and
// the ends of the support where φ is cut off at a noticeable value.
type carrier struct {
	panels []chebPanel
	kinks  []float64
}

func (c *carrier) lo() float64 { return c.panels[0].lo }
func (c *carrier) hi() float64 { return c.panels[len(c.panels)-1].hi }

// panelAt returns the panel holding ξ (the last one at the right end).
func (c *carrier) panelAt(xi float64) *chebPanel {
	for i := range c.panels {
		if xi < c.panels[i].hi {
			return &c.panels[i]
		}
	}
	return &c.panels[len(c.panels)-1]
}

// Chebyshev sampling: n + 1 Lobatto points, n doubling from chebMin to
// chebMax, until the last coefficients fall below chebTol of the largest.
// A panel of a wavefunction whose degree exceeds maxPanelDegree is halved
// (at most maxSplits times): the cost of the separation density grows as
// the square of the degrees.
const (
	chebMin        = 8
	chebMax        = 1024
	chebTol        = 1e-13
	maxPanelDegree = 16
	maxSplits      = 4
	// cutoffKink is the |φ| relative to its largest value above which an
	// end of the support counts as a kink (φ² at 1e-14 of its peak).
	cutoffKink = 1e-7
)

// sampleCarrier builds the Chebyshev panels of w over its support split at
// breaks, and normalizes them; it checks ∫φ² against 1.
func sampleCarrier(name string, w Wavefunction, breaks []float64) (carrier, error) {
	lo, hi := Support(w)
	if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return carrier{}, fmt.Errorf("tiltwell: exciton: %s support [%v, %v] is not a finite interval: %w", name, lo, hi, ErrUnits)
	}
	edges := []float64{lo}
	for _, b := range breaks {
		if b > lo && b < hi {
			edges = append(edges, b)
		}
	}
	edges = append(edges, hi)
	var c carrier
	// A normalized φ peaks at 1/√(hi − lo) or above: coefficients below
	// chebTol of a tenth of that are noise, whatever the panel's own scale
	// (a tail panel may hold only 1e-8 of the peak).
	floor := 0.1 / math.Sqrt(hi-lo)
	var fit func(a, b float64, splits int) error
	fit = func(a, b float64, splits int) error {
		p, err := chebSample(name, w, a, b, floor)
		if err != nil {
			return err
		}
		if len(p.c)-1 > maxPanelDegree && splits < maxSplits {
			m := (a + b) / 2
			if err := fit(a, m, splits+1); err != nil {
				return err
			}
			return fit(m, b, splits+1)
		}
		c.panels = append(c.panels, p)
		return nil
	}
	for i := 0; i+1 < len(edges); i++ {
		if err := fit(edges[i], edges[i+1], 0); err != nil {
			return carrier{}, err
		}
	}
	norm, peak := 0.0, 0.0
	for _, p := range c.panels {
		// ∫φ² over the panel, exact for the series with d + 1 Gauss points.
		r := gaussRule(len(p.c))
		half, mid := (p.hi-p.lo)/2, (p.hi+p.lo)/2
		for q, t := range r.x {
			v := p.at(mid + half*t)
			norm += half * r.w[q] * v * v
		}
		bound := 0.0 // Σ|c_k| ≥ max |φ| on the panel
		for _, v := range p.c {
			bound += math.Abs(v)
		}
		peak = max(peak, bound)
	}
	if !(math.Abs(norm-1) <= excitonNormTol) {
		return carrier{}, fmt.Errorf("tiltwell: exciton: %s wavefunction has ∫φ² dξ = %.12g over [%g, %g], want 1 within %g: %w",
			name, norm, lo, hi, float64(excitonNormTol), ErrUnits)
	}
	s := 1 / math.Sqrt(norm)
	for i := range c.panels {
		p := &c.panels[i]
		p.bound = 0
		for k := range p.c {
			p.c[k] *= s
			p.bound += math.Abs(p.c[k])
		}
	}
	c.kinks = edges[1 : len(edges)-1]
	if first := &c.panels[0]; math.Abs(first.at(lo)) > cutoffKink*peak*s {
		c.kinks = append([]float64{lo}, c.kinks...)
	}
	if last := &c.panels[len(c.panels)-1]; math.Abs(last.at(hi)) > cutoffKink*peak*s {
		c.kinks = append(c.kinks, hi)
	}
	return c, nil
}

// chebSample returns the Chebyshev series of w on [lo, hi]; floor is the
// scale below which coefficients count as noise (see chebFit).
func chebSample(name string, w Wavefunction, lo, hi, floor float64) (chebPanel, error) {
	var bad float64
	var badAt float64
	p, ok := chebFit(func(xi float64) float64 {
		v := w.At(xi)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			if bad == 0 {
				bad, badAt = v, xi
			}
			return 0
		}
		return v
	}, lo, hi, floor, chebMax)
	if bad != 0 || math.IsNaN(bad) {
		return chebPanel{}, fmt.Errorf("tiltwell: exciton: %s wavefunction is %v at ξ = %g: %w", name, bad, badAt, ErrUnits)
	}
	if !ok {
		return chebPanel{}, fmt.Errorf("tiltwell: exciton: %s wavefunction not resolved on [%g, %g] by a polynomial of degree %d (a kink inside? list it in Exciton.Interfaces): %w",
			name, lo, hi, chebMax, ErrNoConvergence)
	}
	return p, nil
}

// chebFit returns the Chebyshev interpolant of f on [lo, hi] through n + 1
// Lobatto points, n doubling from chebMin until the last coefficients fall
// below chebTol of the largest or of floor, whichever is larger (then
// trimmed), and whether that happened by n = maxN. The floor keeps a piece
// where f is at the rounding level of its larger values elsewhere from
// chasing noise.
func chebFit(f func(float64) float64, lo, hi, floor float64, maxN int) (chebPanel, bool) {
	half, mid := (hi-lo)/2, (hi+lo)/2
	// vals holds f at mid + half cos(πj/n), j = 0..n, for the current n.
	var vals []float64
	var c []float64
	for n := chebMin; n <= maxN; n *= 2 {
		cs := cosTable(n)
		next := make([]float64, n+1)
		for j := 0; j <= n; j++ {
			if j%2 == 0 && vals != nil {
				next[j] = vals[j/2]
				continue
			}
			xi := mid + half*cs[j]
			if j == 0 {
				xi = hi
			} else if j == n {
				xi = lo
			}
			next[j] = f(xi)
		}
		vals = next
		c = chebCoeffs(vals, cs)
		scale := floor
		for _, v := range c {
			scale = max(scale, math.Abs(v))
		}
		if scale == 0 {
			return chebPanel{lo: lo, hi: hi, c: []float64{0}}, true
		}
		tail := max(math.Abs(c[n]), math.Abs(c[n-1]), math.Abs(c[n-2]), math.Abs(c[n-3]))
		if tail <= chebTol*scale {
			// Drop the coefficients below the noise.
			d := n
			for d > 0 && math.Abs(c[d]) <= 0.1*chebTol*scale {
				d--
			}
			return chebPanel{lo: lo, hi: hi, c: slices.Clip(c[:d+1])}, true
		}
	}
	return chebPanel{lo: lo, hi: hi, c: c}, false
}

// chebCoeffs returns the Chebyshev coefficients of the interpolant through
// vals at the Lobatto points cos(πj/n) (a discrete cosine transform of type
// I; J. C. Mason and D. C. Handscomb, Chebyshev Polynomials (2003), §6.1).
// cs is cosTable(n).
func chebCoeffs(vals, cs []float64) []float64 {
	n := len(vals) - 1
	c := make([]float64, n+1)
	for k := 0; k <= n; k++ {
		s := 0.5 * (vals[0] + vals[n]*cs[(k*n)%(2*n)])
		for j := 1; j < n; j++ {
			s += vals[j] * cs[(j*k)%(2*n)]
		}
		c[k] = 2 * s / float64(n)
	}
	c[0] /= 2
	c[n] /= 2
	return c
}

// cosTables[i] holds cos(πm/n), m = 0..2n−1, for n = chebMin·2^i; built on
// first use, read-only after.
var cosTables sync.Map

func cosTable(n int) []float64 {
	if t, ok := cosTables.Load(n); ok {
		return t.([]float64)
	}
	t := make([]float64, 2*n)
	for m := range t {
		t[m] = math.Cos(math.Pi * float64(m) / float64(n))
	}
	// Exact values where the cosine is 0 or ±1 keep the nodes symmetric.
	t[0], t[n] = 1, -1
	if n%2 == 0 {
		t[n/2], t[3*n/2] = 0, 0
	}
	v, _ := cosTables.LoadOrStore(n, t)
	return v.([]float64)
}

// gaussRule returns a Gauss–Legendre rule on [−1, 1] with at least n
// points, exact for polynomials of degree 2n − 1 (gonum's quad.Legendre;
// I. Bogaert, SIAM J. Sci. Comput. 36, A1008 (2014)), built on first use
// and read-only after. gonum v0.17.0 tabulates a wrong 26-point rule (its
// two outermost weights are 0, and the weights sum to 1.979); the
// 27-point rule stands in for it (TestGaussRule).
func gaussRule(n int) quadNodes {
	if n == 26 {
		n = 27
	}
	if r, ok := gaussRules.Load(n); ok {
		return r.(quadNodes)
	}
	r := quadNodes{x: make([]float64, n), w: make([]float64, n)}
	quad.Legendre{}.FixedLocations(r.x, r.w, -1, 1)
	v, _ := gaussRules.LoadOrStore(n, r)
	return v.(quadNodes)
}

var gaussRules sync.Map

// quadNodes is a quadrature rule on [−1, 1]: nodes x and weights w.
type quadNodes struct {
	x, w []float64
}

// ---- The density of the electron–hole separation ----

// pairNode is one node of the quadrature over u = ξ_e − ξ_h ≥ 0: ua is u
// in units of a*, and cw the rule's weight times C_s(u), the density of
// |ξ_e − ξ_h| in units of 1/L, so that Σ cw g(ua) ≈ ∫ C_s(u) g(u) du.
type pairNode struct {
	ua, cw float64
}

// pairDensity holds three nested rules over u. The optimisation runs on
// the coarse one: an error δ in the energy moves the optimum by O(δ) and
// the energy there by O(δ²), which the fine rule then evaluates; the
// change from the medium rule to the fine one estimates the quadrature
// error.
type pairDensity struct {
	coarse, medium, fine []pairNode
	// span is the largest separation, in units of L.
	span float64
}

// Rules over u: Clenshaw–Curtis panels, which nest (each rule uses every
// other node of the next). Near u = 0 the panels shrink geometrically by
// pairRatio, for the kernels' scale λ/2 and their u² ln u singularity,
// down to pairMinScale times λ_min/2 (at least pairMinLevels levels);
// each has pairOrder + 1 nodes in the medium rule. Away from 0 the panels
// are long enough for C_s, with more nodes for high degrees.
const (
	pairRatio     = 4
	pairOrder     = 8
	pairMinScale  = 0.01
	pairMinLevels = 4
	// segmentDegree and segmentSplits bound the interpolants of C_s: a
	// segment is halved up to segmentSplits times until degree
	// segmentDegree resolves each piece.
	segmentDegree = chebMax
	segmentSplits = 4
)

// newPairDensity builds the rules over u for the carriers e and h, whose
// panels end at the interfaces; la is L/a*.
func newPairDensity(e, h *carrier, la float64) pairDensity {
	span := max(e.hi()-h.lo(), h.hi()-e.lo())
	// C_s is smooth between the separations at which a kink of one
	// carrier meets one of the other: an interface, or an end of a
	// support where a quasi-bound level's wavefunction is cut off at its
	// outer turning point (there φ can be 1e-2 of its peak). The ends of
	// the supports of bound states, and the splits of long panels, add
	// kinks below the interpolation tolerance.
	ke, kh := e.kinks, h.kinks
	cuts := []float64{0, span}
	for _, a := range ke {
		for _, b := range kh {
			if d := math.Abs(a - b); d > 0 && d < span {
				cuts = append(cuts, d)
			}
		}
	}
	slices.Sort(cuts)
	cuts = slices.Compact(cuts)
	// Merge cuts closer than 1e-12 of the span.
	merged := cuts[:1]
	for _, c := range cuts[1:] {
		if c-merged[len(merged)-1] > 1e-12*span {
			merged = append(merged, c)
		}
	}
	cuts = merged
	if cuts[len(cuts)-1] != span {
		cuts[len(cuts)-1] = span
	}

	deg := 0
	for _, p := range e.panels {
		deg = max(deg, len(p.c)-1)
	}
	dh := 0
	for _, p := range h.panels {
		dh = max(dh, len(p.c)-1)
	}
	deg += dh

	type panel struct {
		a, b  float64
		order int // the fine rule has 2·order + 1 nodes
	}
	var panels []panel
	// The first segment, graded towards 0.
	first := cuts[1]
	umin := pairMinScale * lambdaMin / 2 / la
	var graded []float64
	for top, lev := first, 0; top > umin || lev < pairMinLevels; lev++ {
		graded = append(graded, top)
		top /= pairRatio
	}
	panels = append(panels, panel{0, graded[len(graded)-1], pairOrder})
	for i := len(graded) - 1; i > 0; i-- {
		panels = append(panels, panel{graded[i], graded[i-1], pairOrder})
	}
	// The remaining segments.
	for i := 1; i+1 < len(cuts); i++ {
		panels = append(panels, panel{cuts[i], cuts[i+1], 0})
	}
	// Orders: C_s is a polynomial of degree ≤ 2 deg + 1 per segment, and
	// its coefficients fall off about as fast as those of the products of
	// the two series; give each panel nodes in proportion to its share of
	// the span. The exponential part e^(−2β|u|/λ) of the kernels needs,
	// in the coarse rule, about one node per two units of 2u/λ at the
	// smallest optimal radius λ = ½ a*, where it has not yet decayed
	// (2u/λ < 40).
	for i := range panels {
		a, b := panels[i].a*la, panels[i].b*la // in a*
		need := int(math.Ceil(float64(deg+2) * (panels[i].b - panels[i].a) / span))
		if 4*a < 40 {
			need = max(need, 2*(int(4*(b-a)/2)+4))
		}
		// Even orders keep the three rules nested (2o, o and o/2
		// intervals).
		o := min(max(pairOrder, need+need%2), 512)
		panels[i].order = max(panels[i].order, o)
	}

	// C_s on each segment between cuts, where it is a polynomial (of the
	// wavefunctions' series), as Chebyshev interpolants: far fewer
	// evaluations than the rules have nodes (one interpolant per segment
	// needs fewer than pieces would: C_s is smooth there). A segment that
	// degree segmentDegree does not resolve is halved; a piece still
	// unresolved at the smallest length (it should not happen) is marked
	// by nil coefficients and evaluated directly.
	cs := func(u float64) float64 { return separation(e, h, u) + separation(h, e, u) }
	// C_s integrates to 1 over [0, span], so it peaks at 1/span or above.
	floor := 0.1 / span
	var pieces []chebPanel
	var fit func(a, b float64, depth int)
	fit = func(a, b float64, depth int) {
		p, ok := chebFit(cs, a, b, floor, segmentDegree)
		switch {
		case ok:
			pieces = append(pieces, p)
		case depth < segmentSplits:
			m := (a + b) / 2
			fit(a, m, depth+1)
			fit(m, b, depth+1)
		default:
			pieces = append(pieces, chebPanel{lo: a, hi: b})
		}
	}
	for i := 0; i+1 < len(cuts); i++ {
		fit(cuts[i], cuts[i+1], 0)
	}
	density := func(u float64) float64 {
		i, _ := slices.BinarySearchFunc(pieces, u, func(p chebPanel, u float64) int {
			if p.hi < u {
				return -1
			}
			return 1
		})
		p := &pieces[min(i, len(pieces)-1)]
		if p.c == nil {
			return cs(u)
		}
		return p.at(u)
	}

	var pd pairDensity
	pd.span = span
	for _, pn := range panels {
		fx, fw := ccRule(2 * pn.order)
		_, mw := ccRule(pn.order)
		_, cw := ccRule(pn.order / 2)
		half, mid := (pn.b-pn.a)/2, (pn.b+pn.a)/2
		for j := range fx {
			u := mid + half*fx[j]
			if j == 0 {
				u = pn.b
			} else if j == len(fx)-1 {
				u = pn.a
			}
			c := density(u)
			pd.fine = append(pd.fine, pairNode{u * la, half * fw[j] * c})
			if j%2 == 0 {
				pd.medium = append(pd.medium, pairNode{u * la, half * mw[j/2] * c})
			}
			if j%4 == 0 {
				pd.coarse = append(pd.coarse, pairNode{u * la, half * cw[j/4] * c})
			}
		}
	}
	return pd
}

// separationSkip bounds the pieces of the separation density that are left
// out: C_s integrates to 1 over at most 2e4 (twice the widest support),
// and its interpolants stop at 1e-13 of a tenth of 1/span (see
// newPairDensity), at least 5e-19; a few hundred skipped pieces stay
// below that.
const separationSkip = 1e-21

// separation returns ∫ φ_a²(y + u) φ_b²(y) dy for u ≥ 0: the density of
// ξ_a − ξ_b at u. The integral is split where either series changes
// panel, and each piece uses a Gauss rule exact for the product of the
// two series; pieces bounded below separationSkip are left out.
func separation(a, b *carrier, u float64) float64 {
	ylo := max(b.lo(), a.lo()-u)
	yhi := min(b.hi(), a.hi()-u)
	if !(ylo < yhi) {
		return 0
	}
	// Breakpoints: b's panel edges and a's shifted by −u.
	var buf [16]float64
	pts := append(buf[:0], ylo, yhi)
	for _, p := range b.panels[1:] {
		if p.lo > ylo && p.lo < yhi {
			pts = append(pts, p.lo)
		}
	}
	for _, p := range a.panels[1:] {
		if y := p.lo - u; y > ylo && y < yhi {
			pts = append(pts, y)
		}
	}
	slices.Sort(pts)
	sum := 0.0
	for i := 0; i+1 < len(pts); i++ {
		y0, y1 := pts[i], pts[i+1]
		if !(y1 > y0) {
			continue
		}
		ym := (y0 + y1) / 2
		pa, pb := a.panelAt(ym+u), b.panelAt(ym)
		if m := pa.bound * pb.bound; m*m*(y1-y0) < separationSkip {
			// Two tails: the piece is below any tolerance.
			continue
		}
		r := gaussRule(len(pa.c) + len(pb.c) - 1)
		half := (y1 - y0) / 2
		s := 0.0
		for q, t := range r.x {
			y := ym + half*t
			va, vb := pa.at(y+u), pb.at(y)
			s += r.w[q] * va * va * vb * vb
		}
		sum += half * s
	}
	return sum
}

// ccRule returns the Clenshaw–Curtis rule with n + 1 nodes cos(πj/n),
// j = 0..n, on [−1, 1], exact for polynomials of degree n (n ≥ 1; the
// weights in the direct form of J. Waldvogel, BIT 46, 195 (2006), §2),
// built on first use and read-only after.
func ccRule(n int) (x, w []float64) {
	if r, ok := ccRules.Load(n); ok {
		rr := r.(quadNodes)
		return rr.x, rr.w
	}
	x = make([]float64, n+1)
	w = make([]float64, n+1)
	for j := 0; j <= n; j++ {
		x[j] = math.Cos(math.Pi * float64(j) / float64(n))
		s := 0.0
		for k := 1; k <= n/2; k++ {
			bk := 2.0
			if 2*k == n {
				bk = 1
			}
			s += bk / float64(4*k*k-1) * math.Cos(2*math.Pi*float64(k*j)/float64(n))
		}
		cj := 2.0
		if j == 0 || j == n {
			cj = 1
		}
		w[j] = cj / float64(n) * (1 - s)
	}
	v, _ := ccRules.LoadOrStore(n, quadNodes{x, w})
	rr := v.(quadNodes)
	return rr.x, rr.w
}

var ccRules sync.Map

// ---- The variational energy ----

// energy returns the variational energy of the relative motion,
// ⟨Ψ|H|Ψ⟩/⟨Ψ|Ψ⟩ − E_e − E_h, in units of Ry* for the two-parameter trial
// function with radius lam (in a*) and anisotropy beta, over the rule
// nodes; nu = μ/μ_z. With B = 2u/λ and x = βB, per unit ⟨F|F⟩ at u = 0,
//
//	⟨F|F⟩     ∝ Σ C e^(−x)(1 + x)
//	T_∥       = (1/λ²) Σ C [e^(−x)(1 + x) − x² E₁(x)]
//	T_z       = (ν β²/λ²) Σ C x² E₁(x)
//	Coulomb   = −(4/λ) Σ C K(B, β)
//
// (lengths in a*, energies in Ry*: ħ²/(2μa*²) = Ry*, e²/(4πε₀ε_r a*) =
// 2 Ry*). The in-plane integrals behind them are elementary with
// s = √(ρ² + β²u²): ∫ρ dρ e^(−2s/λ)(·) = ∫_{β|u|}^∞ s ds e^(−2s/λ)(·).
func (p *pairDensity) energy(nodes []pairNode, lam, beta, nu float64) float64 {
	pk := 2 / lam
	var sn, st, sz, sv float64
	for _, nd := range nodes {
		b := pk * nd.ua
		sv += nd.cw * coulomb.Kernel(b, beta)
		if beta == 0 {
			sn += nd.cw
			st += nd.cw
			continue
		}
		x := beta * b
		n := math.Exp(-x) * (1 + x)
		k2 := 0.0
		if x > 0 {
			k2 = x * x * coulomb.E1(x)
		}
		sn += nd.cw * n
		st += nd.cw * (n - k2)
		sz += nd.cw * k2
	}
	return ((st+nu*beta*beta*sz)/(lam*lam) - 4/lam*sv) / sn
}

// final returns the energy on the fine rule and an estimate of its
// quadrature error. The three nested rules converge geometrically (the
// integrands are analytic on every panel, the singularity at u = 0 being
// met by the grading), so with the coarse and medium errors
// e_c = |E_c − E_f| and e_m = |E_m − E_f| the fine error is about
// e_m·(e_m/e_c); it is never taken below 1e-14 |E_f|, the rounding of the
// sums. The tests' independent quadrature measures the error of E_f at
// 2e-15 to 1e-14 relative where this estimate gives 1e-14 to 8e-14.
func (p *pairDensity) final(lam, beta, nu float64) (e, err float64) {
	e = p.energy(p.fine, lam, beta, nu)
	ec := math.Abs(p.energy(p.coarse, lam, beta, nu) - e)
	em := math.Abs(p.energy(p.medium, lam, beta, nu) - e)
	err = em
	if em < ec {
		err = em * em / ec
	}
	return e, max(err, 1e-14*math.Abs(e))
}

// norm returns Σ C e^(−x)(1 + x), the norm of F relative to its value in
// the two-dimensional limit.
func (p *pairDensity) norm(nodes []pairNode, lam, beta float64) float64 {
	pk := 2 / lam
	sn := 0.0
	for _, nd := range nodes {
		x := beta * pk * nd.ua
		sn += nd.cw * math.Exp(-x) * (1 + x)
	}
	return sn
}

// ---- One-dimensional minimisation ----

// brentMin minimises f on [a, b] by Brent's method (golden section with
// parabolic steps; R. P. Brent, Algorithms for Minimization without
// Derivatives (1973), ch. 5), to an absolute tolerance tol in x. It
// returns the best point and its value.
func brentMin(f func(float64) float64, a, b, tol float64) (float64, float64) {
	const gold = 0.3819660112501051 // (3 − √5)/2
	x := a + gold*(b-a)
	w, v := x, x
	fx := f(x)
	fw, fv := fx, fx
	var d, e float64
	for range 200 {
		m := (a + b) / 2
		tol1 := tol/3 + 1e-12*math.Abs(x)
		tol2 := 2 * tol1
		if math.Abs(x-m) <= tol2-(b-a)/2 {
			break
		}
		golden := true
		if math.Abs(e) > tol1 {
			// Parabola through x, w, v.
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			pp := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				pp = -pp
			}
			q = math.Abs(q)
			if math.Abs(pp) < math.Abs(q*e/2) && pp > q*(a-x) && pp < q*(b-x) {
				e = d
				d = pp / q
				if u := x + d; u-a < tol2 || b-u < tol2 {
					d = math.Copysign(tol1, m-x)
				}
				golden = false
			}
		}
		if golden {
			if x >= m {
				e = a - x
			} else {
				e = b - x
			}
			d = gold * e
		}
		u := x + d
		if math.Abs(d) < tol1 {
			u = x + math.Copysign(tol1, d)
		}
		fu := f(u)
		if fu <= fx {
			if u >= x {
				a = x
			} else {
				b = x
			}
			v, w, x = w, x, u
			fv, fw, fx = fw, fx, fu
		} else {
			if u < x {
				a = u
			} else {
				b = u
			}
			if fu <= fw || w == x {
				v, w = w, u
				fv, fw = fw, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return x, fx
}

// bracketMin minimises f near s0 within [lo, hi]: Brent on a window of
// half-width ¼ around s0, moved and retried if the minimum lands on an
// edge of the window that is not an end of [lo, hi].
func bracketMin(f func(float64) float64, s0, lo, hi float64) (float64, float64) {
	const half = 0.25
	a, b := max(lo, s0-half), min(hi, s0+half)
	for range 20 {
		s, e := brentMin(f, a, b, brentTol)
		switch {
		case s-a < 10*brentTol && a > lo:
			a, b = max(lo, s-2*half), s+brentTol
		case b-s < 10*brentTol && b < hi:
			a, b = s-brentTol, min(hi, s+2*half)
		default:
			return s, e
		}
	}
	return brentMin(f, lo, hi, brentTol)
}

// newton2 minimises f(s, θ) from (s, th) by Newton steps on a
// finite-difference gradient and Hessian (five new values per step), each
// step limited in length, the new centre being the best point seen; s is
// kept in [lo, hi]. It returns the best point and its value.
func newton2(f func(s, th float64) float64, s, th, lo, hi float64) (float64, float64, float64) {
	clamp := func(v float64) float64 { return min(hi, max(lo, v)) }
	s = clamp(s)
	f0 := f(s, th)
	hs, ht := 0.02, 0.05
	for range 12 {
		// Stencil, inside [lo, hi] in s.
		sp, sm := clamp(s+hs), clamp(s-hs)
		fsp, fsm := f(sp, th), f(sm, th)
		ftp, ftm := f(s, th+ht), f(s, th-ht)
		fst := f(sp, th+ht)
		bs, bt, bf := s, th, f0
		for _, c := range [...]struct{ s, t, f float64 }{{sp, th, fsp}, {sm, th, fsm}, {s, th + ht, ftp}, {s, th - ht, ftm}, {sp, th + ht, fst}} {
			if c.f < bf {
				bs, bt, bf = c.s, c.t, c.f
			}
		}
		dsp, dsm := sp-s, s-sm
		if dsp <= 0 || dsm <= 0 {
			// At an end of [lo, hi] in s: step in θ only.
			dsp, dsm = 0, 0
		}
		var gs, hss float64
		if dsp > 0 {
			gs = ((fsp-f0)*dsm*dsm + (f0-fsm)*dsp*dsp) / (dsp * dsm * (dsp + dsm))
			hss = 2 * ((fsp-f0)*dsm - (f0-fsm)*dsp) / (dsp * dsm * (dsp + dsm))
		}
		gt := (ftp - ftm) / (2 * ht)
		htt := (ftp - 2*f0 + ftm) / (ht * ht)
		hst := 0.0
		if dsp > 0 {
			hst = (fst - fsp - ftp + f0) / (dsp * ht)
		}
		var ds, dt float64
		convex := false
		if det := hss*htt - hst*hst; hss > 0 && htt > 0 && det > 0 {
			ds = -(htt*gs - hst*gt) / det
			dt = -(hss*gt - hst*gs) / det
			convex = true
		} else {
			// Not convex here: a step down each coordinate, lengthened
			// below while it keeps lowering f.
			if hss > 0 {
				ds = -gs / hss
			} else if gs != 0 {
				ds = -math.Copysign(0.25, gs)
			}
			if htt > 0 {
				dt = -gt / htt
			} else if gt != 0 {
				dt = -math.Copysign(0.25, gt)
			}
		}
		// Limit the step.
		if a := math.Abs(ds); a > 0.5 {
			ds, dt = ds*0.5/a, dt*0.5/a
		}
		if a := math.Abs(dt); a > 0.4 {
			ds, dt = ds*0.4/a, dt*0.4/a
		}
		for range 8 {
			ns, nt := clamp(s+ds), th+dt
			fn := f(ns, nt)
			if !(fn < bf) {
				break
			}
			bs, bt, bf = ns, nt, fn
			if convex || ns == lo || ns == hi {
				break
			}
			ds, dt = 2*ds, 2*dt
		}
		moved := math.Abs(bs-s) + math.Abs(bt-th)
		s, th, f0 = bs, bt, bf
		if math.Abs(ds) < 1e-5 && math.Abs(dt) < 1e-4 || moved == 0 && hs < 1e-4 {
			break
		}
		// Shrink the stencil with the step, so that the finite differences
		// stay accurate near the minimum.
		hs = min(0.02, max(1e-4, math.Abs(ds)/2))
		ht = min(0.05, max(1e-3, math.Abs(dt)/2))
	}
	return s, th, f0
}
