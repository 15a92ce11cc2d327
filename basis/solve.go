package basis

import (
	"fmt"
	"github.com/tiltwell/tiltwell/internal/floor"
	"math"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/integrate/quad"
)

const (
	unit   = 0x1p-53                 // unit roundoff u of float64
	eightP = 8 / (math.Pi * math.Pi) // 8/π², the scale of ⟨m|ξ − ½|n⟩
)

// gamma is Higham's γ_n = nu/(1 − nu), the relative rounding bound of an
// n-term sum or inner product (Higham §3.1).
func gamma(n int) float64 {
	nu := float64(n) * unit
	return nu / (1 - nu)
}

// dipole returns ⟨m|ξ − ½|n⟩ = −8mn/(π²(m² − n²)²) for m + n odd and 0
// otherwise (m ≠ n; the diagonal is 0 too). Check-values §3.
func dipole(m, n int) float64 {
	if (m+n)&1 == 0 {
		return 0
	}
	fm, fn := float64(m), float64(n)
	d := (fm - fn) * (fm + fn) // exact for m, n < 2²⁶
	return -eightP * fm * fn / (d * d)
}

// rigorousSlack is how much wider than the estimated bracket a proven
// bracket may be and still be reported (as Rigorous) instead of it.
const rigorousSlack = 3

// trustFraction bounds the out-of-basis correction θ − ρ(u), as a fraction
// of the gap to the next Ritz value, below which the estimated bracket may
// stand in for the proven one (measured on the strong-field grid of
// TestStrongFieldEstimates).
const trustFraction = 0.02

// estimateTested is the largest |f| over which the estimated bracket was
// validated on every level of every basis size up to 160
// (TestBracketsContainExact); beyond it the estimate must also pass the
// trustFraction test.
const estimateTested = 1000

// solveN diagonalises at basis size N and brackets levels 1..k into
// w.theta and w.err (and level k+1 when N > k, used for the gap).
func (s Solver) solveN(w *work, f float64, N, k int) error {
	kk := min(k+1, N)
	M := 2 * N
	w.sizes(N, M, kk)
	pot := s.Potential != nil
	var vmin, vabs float64
	if pot {
		var err error
		if vmin, vabs, err = s.moments(w, M+N); err != nil {
			return err
		}
	}
	mom := w.mom
	elem := func(m, n int) float64 { // off-diagonal part of H_mn
		v := f * dipole(m, n)
		if pot {
			d := m - n
			if d < 0 {
				d = -d
			}
			v += mom[d] - mom[m+n]
		}
		return v
	}

	a := w.a[:N*N]
	for i := range N {
		for j := i; j < N; j++ {
			a[i*N+j] = elem(i+1, j+1)
		}
		a[i*N+i] += float64((i + 1) * (i + 1))
	}
	var ok bool
	if N >= selectedMin && kk <= N/2 {
		ok = w.eigenSelected(N, kk)
	} else {
		ok = w.eigen(N)
	}
	if !ok {
		return fmt.Errorf("basis: eigensolver did not converge at N = %d, f = %g: %w", N, f, tiltwell.ErrNoConvergence)
	}

	// hc = W C, W the off-diagonal part of H on rows m = 1..M, columns
	// n = 1..N, and C the first kk eigenvectors.
	hc := w.hc[:M*kk]
	clear(hc)
	for m := 1; m <= M; m++ {
		row := hc[(m-1)*kk : m*kk]
		n0 := 1
		if !pot {
			n0 = 1 + m&1 // only m + n odd couple
		}
		step := 2
		if pot {
			step = 1
		}
		for n := n0; n <= N; n += step {
			wmn := elem(m, n) // for n = m, V_mm (the kinetic m² is added later)
			if wmn == 0 {
				continue
			}
			c := a[(n-1)*N : (n-1)*N+kk]
			for j := range row {
				row[j] += wmn * c[j]
			}
		}
	}

	af := math.Abs(f)
	wabs := af * 2 / 3 // ‖|X|‖ ≤ max row sum of |X| ≤ 2/3
	hw := af / 2       // sup|ξ − ½| = ½
	if pot {
		wabs += vabs
		hw += vabs
	}
	fm := float64(M)
	// Tail constant: for m > M = 2N, m/(m² − N²)² ≤ (4/3)² m⁻³.
	ktail := eightP * af * 16 / 9
	ktail *= ktail
	gN, gM := gamma(2*N+2), gamma(M+2)

	for j := range kk {
		var cc, kin, q, ae, ao, en2 float64
		for i := range N {
			c := a[i*N+j]
			n := float64(i + 1)
			cc += c * c
			kin += n * n * c * c
			q += c * hc[i*kk+j]
			if (i+1)&1 == 0 {
				ae += n * math.Abs(c)
			} else {
				ao += n * math.Abs(c)
			}
		}
		q += kin
		theta := q / cc
		for i := range N {
			c := a[i*N+j]
			n := float64(i + 1)
			e := n*n*c + hc[i*kk+j] - theta*c
			en2 += e * e
		}
		sc := math.Sqrt(cc)
		eq := gN*(kin+wabs*cc) + 2*unit*math.Abs(q)                       // |fl(ψᵀHψ) − ψᵀHψ| and θ's division
		eps := math.Sqrt(en2) + gN*(float64(N*N)+wabs+math.Abs(theta))*sc // ‖ε‖
		er := gN * wabs * sc                                              // ‖r − fl(r)‖ outside the basis

		var r2, t1, t1abs, d, last float64
		improved := true
		for m := N + 1; m <= M; m++ {
			r := hc[(m-1)*kk+j]
			rr := r * r
			r2 += rr
			if m > M-4 {
				last += rr / 4
			}
			dm := float64(m)*float64(m) - theta
			if dm <= 0 {
				improved = false
				continue
			}
			t1 += rr / dm
			t1abs += rr / dm
			d += rr / (dm * dm)
		}
		// Tails beyond M: Σ_(m>M) r_m² (m² − θ)^(−p) with r_m² ≤ K A² m⁻⁶.
		amax := max(ae, ao) * (1 + gamma(N))
		shrink := 1.0 // (m² − θ) ≥ m²(1 − θ/M²) for m > M
		if theta > 0 {
			shrink = 1 - theta/(fm*fm)
		}
		tail := func(p int) float64 {
			q := float64(5 + 2*p)
			t := ktail * amax * amax * math.Pow(fm, -q) / q
			if pot {
				// Estimate: |r_m| ≤ r̄ M/m from the last rows (bounded V
				// with jumps gives 1/m; smooth V and the tilt m⁻³).
				q := float64(1 + 2*p)
				t += last * fm * fm * math.Pow(fm, -q) / q
			}
			if p > 0 {
				t /= math.Pow(shrink, float64(p))
			}
			return t
		}
		r2 = (r2 + tail(0)) * (1 + gM)
		lv := level{theta: theta}
		lv.up = 2 * eq / cc
		lv.rhoLoP = theta - eq/cc
		lv.rhoHiP = theta + eq/cc
		sp := eps + er + math.Sqrt(r2)
		lv.sig2P = sp * sp / cc
		if improved && shrink > 0 {
			t1hi := (t1 + tail(1)) * (1 + gM)
			t1lo := t1 - gM*t1abs
			dhi := (d + tail(2)) * (1 + gM)
			sd := math.Sqrt(dhi)
			lo := -(eq + t1hi + hw*dhi + 2*sd*er)
			hi := eq - t1lo + hw*dhi + 2*sd*er
			lv.improved = true
			lv.rhoLoU = theta + lo/cc
			lv.rhoHiU = theta + max(hi, 0)/cc
			su := eps + er + hw*sd
			lv.sig2U = su * su / cc
		}
		w.lv[j] = lv
	}

	// Brackets from the top down: the lower bound on level j + 1 is the
	// gap partner β of level j. betaR chains proven bounds only; betaE
	// also accepts the Ritz-gap guess β = ρ + (θ_(j+1) − θ_j)/2 where the
	// proven β is too low for the Kato–Temple hypothesis β > ρ.
	// ρ − σ²/(β − ρ) is concave in ρ, so over ρ ∈ [ρlo, ρhi] its
	// minimum is at an end.
	temple := func(lo, rhoLo, rhoHi, sig2, beta float64) float64 {
		if beta > rhoHi {
			lo = max(lo, min(rhoLo-sig2/(beta-rhoLo), rhoHi-sig2/(beta-rhoHi)))
		}
		return lo
	}
	betaR := floor.Level(f, kk+1) + vmin
	betaE := betaR
	for j := kk - 1; j >= 0; j-- {
		lv := &w.lv[j]
		next := 0.0 // θ_(j+1), the Ritz value above (or a guess)
		switch {
		case j+1 < N:
			next = w.eig[j+1]
		case j > 0:
			next = 2*lv.theta - w.eig[j-1]
		default:
			next = lv.theta + 3
		}
		crudeLo := floor.Level(f, j+1) + vmin
		loR := temple(crudeLo, lv.rhoLoP, lv.rhoHiP, lv.sig2P, betaR)
		if lv.improved {
			loR = temple(loR, lv.rhoLoU, lv.rhoHiU, lv.sig2U, betaR)
		}
		bE := betaE
		if bE <= max(lv.rhoHiP, lv.rhoHiU) {
			bE = max(bE, lv.theta+(next-lv.theta)/2)
		}
		// A guessed β is used only where the bound hardly depends on it:
		// σ ≤ (β − ρ)/8.
		guessed := bE != betaE
		estimate := func(lo, rhoLo, rhoHi, sig2 float64) float64 {
			if guessed && 64*sig2 > (bE-rhoHi)*(bE-rhoHi) {
				return lo
			}
			return temple(lo, rhoLo, rhoHi, sig2, bE)
		}
		loE := estimate(loR, lv.rhoLoP, lv.rhoHiP, lv.sig2P)
		if lv.improved {
			loE = estimate(loE, lv.rhoLoU, lv.rhoHiU, lv.sig2U)
		}
		if lv.improved {
			// Where the Kato–Temple bracket is loose (the top of the basis
			// at strong fields, where σ² is not small against the gap) or
			// its hypothesis cannot be met, twice the second-order
			// correction θ − ρ(u) is the better estimate.
			if pt := lv.theta - 2*(lv.theta-lv.rhoLoU); pt > loE {
				loE = pt
			}
		}
		eR := max(lv.theta-loR, 0)*(1+4*unit) + 4*unit*math.Abs(lv.theta)
		eE := max(lv.theta-loE, 0)*(1+4*unit) + 4*unit*math.Abs(lv.theta)
		eR, eE = max(eR, lv.up), max(eE, lv.up)
		w.theta[j] = lv.theta
		// The estimate is trusted only while the out-of-basis correction
		// is small against the gap to the next Ritz value; at strong
		// fields the top of a small basis fails that, and the estimate
		// there undershot the true error by up to 6×.
		trust := lv.improved && (math.Abs(f) <= estimateTested || lv.theta-lv.rhoLoU <= trustFraction*(next-lv.theta))
		if !pot && (eR <= rigorousSlack*eE || !trust) {
			w.err[j], w.bound[j] = eR, tiltwell.Rigorous
		} else {
			w.err[j], w.bound[j] = eE, tiltwell.Estimate
		}
		betaR, betaE = loR, loE
	}
	return nil
}

// moments fills w.mom[j] = ∫₀¹ V(ξ) cos(jπξ) dξ for j = 0..jmax by
// Gauss–Legendre quadrature on the panels between Breaks, with
// ⌈jmax·h⌉ + 32 nodes on a panel of width h, and returns inf V and
// sup |V| over the nodes.
func (s Solver) moments(w *work, jmax int) (vmin, vabs float64, err error) {
	w.mom = grow(w.mom, jmax+1)
	mom := w.mom
	clear(mom)
	vmin = math.Inf(1)
	lo := 0.0
	for p := 0; p <= len(s.Breaks); p++ {
		hi := 1.0
		if p < len(s.Breaks) {
			hi = s.Breaks[p]
		}
		q := int(math.Ceil(float64(jmax)*(hi-lo))) + 32
		w.x, w.wt = grow(w.x, q), grow(w.wt, q)
		quad.Legendre{}.FixedLocations(w.x, w.wt, lo, hi)
		for i, x := range w.x {
			v := s.Potential(x)
			if !(math.Abs(v) <= MaxPotential) {
				return 0, 0, fmt.Errorf("basis: Potential(%g) = %v, not a finite number of magnitude at most %g: %w", x, v, MaxPotential, tiltwell.ErrUnits)
			}
			vmin = min(vmin, v)
			vabs = max(vabs, math.Abs(v))
			wv := w.wt[i] * v
			s1, c1 := math.Sincos(math.Pi * x)
			sj, cj := 0.0, 1.0
			for j := range mom {
				mom[j] += wv * cj
				sj, cj = sj*c1+cj*s1, cj*c1-sj*s1
			}
		}
		lo = hi
	}
	return vmin, vabs, nil
}
