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
// otherwise (m ≠ n; the diagonal is 0 too), in the basis √2 sin(mπξ) (by
// integration by parts; common practice, no source).
func dipole(m, n int) float64 {
	if (m+n)&1 == 0 {
		return 0
	}
	fm, fn := float64(m), float64(n)
	d := (fm - fn) * (fm + fn) // exact for m, n < 2²⁶
	return -eightP * fm * fn / (d * d)
}

// rigorousSlack is how much wider than the estimated bracket a proven
// bracket may be and still be reported (as Rigorous) instead of it. The
// estimate is at most 5.5× the true error (measured over f = 0.1…1e4,
// N = 2…160, every level), so a proven bracket within 1.5× of it is at
// most 8× the true error (7.9 measured); with 3 it reached 11.4× at the top
// of small bases at strong fields (N = 20, n = 19, f = 231).
const rigorousSlack = 1.5

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
	// n = 1..N, and C the first kk eigenvectors. Inside the basis
	// (m ≤ N) the rows are formed in double-double, hc + hcLo, for the
	// Rayleigh quotients: the tilt as −f·(8/π²)·Σ_n R_mn c_n with
	// R_mn = mn/(m² − n²)² and 8/π² in double-double (see ratio), the
	// potential as Σ_n V_mn c_n. Outside, in float64, for the residual.
	hc, hcLo := w.hc[:M*kk], w.hcLo[:N*kk]
	clear(hc)
	clear(hcLo)
	gh, gl := twoProd(-f, eightPiSqHi) // −f·8/π² = gh + gl
	gl -= f * eightPiSqLo
	var vh, vl []float64
	if pot {
		w.vrow = grow(w.vrow, 2*kk)
		vh, vl = w.vrow[:kk], w.vrow[kk:2*kk]
	}
	for m := 1; m <= N; m++ {
		row, lo := hc[(m-1)*kk:m*kk], hcLo[(m-1)*kk:m*kk]
		if f != 0 {
			for n := 1 + m&1; n <= N; n += 2 { // only m + n odd couple
				rh, rl := ratio(m, n)
				c := a[(n-1)*N : (n-1)*N+kk]
				row, lo := row[:len(c)], lo[:len(c)]
				for j, cj := range c {
					p := rh * cj
					s := row[j] + p
					bb := s - row[j]
					// twoProd's and twoSum's error terms, inlined.
					lo[j] += ((row[j] - (s - bb)) + (p - bb)) + math.FMA(rh, cj, -p) + rl*cj
					row[j] = s
				}
			}
			for j := range row {
				p, e := twoProd(gh, row[j])
				row[j], lo[j] = twoSum(p, e+gh*lo[j]+gl*row[j])
			}
		}
		if pot {
			clear(vh)
			clear(vl)
			for n := 1; n <= N; n++ {
				d := m - n
				if d < 0 {
					d = -d
				}
				v := mom[d] - mom[m+n] // V_mn, and V_mm on the diagonal
				c := a[(n-1)*N : (n-1)*N+kk]
				for j, cj := range c {
					p, e := twoProd(v, cj)
					s, t := twoSum(vh[j], p)
					vh[j] = s
					vl[j] += t + e
				}
			}
			for j := range row {
				s, t := twoSum(row[j], vh[j])
				row[j], lo[j] = twoSum(s, t+lo[j]+vl[j])
			}
		}
	}
	for m := N + 1; m <= M; m++ {
		row := hc[(m-1)*kk : m*kk]
		n0, step := 1+m&1, 2 // only m + n odd couple
		if pot {
			n0, step = 1, 1
		}
		for n := n0; n <= N; n += step {
			wmn := elem(m, n)
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
	// Error of the double-double rows inside the basis, per row m: for
	// the tilt at most rowRel·|f|·Σ_n |X_mn c_n| (u² from R_mn, 8/π² and
	// the product with the field, and the rounding of the low parts,
	// γ_(2N)(N + 1)u ≤ 2(N + 1)²u²), summing over m with |c|ᵀ|X||c| ≤
	// (2/3)cᵀc to rowRel·wTilt·cᵀc; for a potential (an estimate, not a
	// proof) γ_(2N+2)·sup|V| per unit of ‖c‖, as in plain float64, since the
	// moments V_mn carry their own rounding.
	rowRel := (2*float64(N+1)*float64(N+1) + 8) * unit * unit * (1 + gN)
	rowErr := rowRel * af * 2 / 3
	if pot {
		rowErr += gN * vabs
	}

	for j := range kk {
		var cc, q dd
		var ae, ao, en2, eb2, small float64
		for i := range N {
			c := a[i*N+j]
			nn := float64((i + 1) * (i + 1))
			cc.addProd(c, c)
			kc, ke := twoProd(nn, c) // n²c = kc + ke exactly
			q.addProd(kc, c)
			q.addSmall(ke * c)
			q.addProd(c, hc[i*kk+j])
			q.addSmall(c * hcLo[i*kk+j])
			small += math.Abs(ke*c) + math.Abs(c*hcLo[i*kk+j]) // rounded by u each
			if (i+1)&1 == 0 {
				ae += float64(i+1) * math.Abs(c)
			} else {
				ao += float64(i+1) * math.Abs(c)
			}
		}
		qh, ql, qErr := q.value()
		ch, cl, cErr := cc.value()
		th, tl := ddDiv(qh, ql, ch, cl)
		qErr += unit*small + rowErr*ch*(1+8*unit)
		cLow := ch - cErr - 2*unit*ch // a lower bound on cᵀc
		// |θ_dd − ρ(c)|, ρ(c) = cᵀHc/cᵀc in exact arithmetic for the
		// computed vector c: the errors of q and cᵀc, and the division.
		aP := (qErr+math.Abs(th)*cErr)/cLow*(1+8*unit) + 32*unit*unit*math.Abs(th)
		// In-basis residual ε = (H − θ)c at θ = th, and a bound on its
		// rounding: two fused roundings per component, relative to the
		// terms n²|c|, |hc| and |θ c|, and the rows' errors.
		for i := range N {
			c := a[i*N+j]
			nn := float64((i + 1) * (i + 1))
			e := math.FMA(-th, c, math.FMA(nn, c, hc[i*kk+j])) + hcLo[i*kk+j]
			en2 += e * e
			b := nn*math.Abs(c) + math.Abs(hc[i*kk+j]) + math.Abs(th*c)
			eb2 += b * b
		}
		sc := math.Sqrt(ch + cErr + 2*unit*ch)
		eps := math.Sqrt(en2)*(1+gN) + 3*unit*math.Sqrt(eb2)*(1+gN) + rowErr*sc*(1+4*unit)
		er := gamma(2*N+8) * wabs * sc // ‖r − fl(r)‖ outside the basis: the sums and the elements f·X_mn

		var r2, t1, t1abs, d, last float64
		improved := true
		for m := N + 1; m <= M; m++ {
			r := hc[(m-1)*kk+j]
			rr := r * r
			r2 += rr
			if m > M-4 {
				last += rr / 4
			}
			dm := float64(m)*float64(m) - th
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
		if th > 0 {
			shrink = 1 - th/(fm*fm)
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
		lv := level{theta: th, lo: tl}
		// η_k ≤ θ_k (HUM) ≤ ρ(c) + Σ_(i<k) |⟨c, v_i⟩|²(θ_k − θ_i)/cᵀc,
		// with |⟨c, v_i⟩| ≤ ‖(A − ρ)c‖/|θ_i − ρ|: the part of c along the
		// lower Ritz vectors, a rounding-size term, bounded with the
		// computed gap to the Ritz value below.
		lv.up = aP
		if j > 0 {
			if gb := th - w.eig[j-1]; gb > 0 {
				lv.up += float64(j) * eps * eps / (cLow * gb / 2)
			} else {
				lv.up = math.Inf(1)
			}
		}
		lv.offLoP, lv.offHiP = -aP, aP
		sp := eps + er + math.Sqrt(r2)
		lv.sig2P = sp * sp / cLow * (1 + 4*unit)
		if improved && shrink > 0 {
			t1hi := (t1 + tail(1)) * (1 + gM)
			t1lo := t1 - gM*t1abs
			dhi := (d + tail(2)) * (1 + gM)
			sd := math.Sqrt(dhi)
			// ρ(u) − θ_dd = [cᵀc(ρ(c) − θ_dd) − t_l·D − T₁ + f⟨δ|ξ − ½|δ⟩]/(cᵀc + D),
			// t_l = θ_dd − θ.
			common := aP*ch*(1+4*unit) + math.Abs(tl)*dhi + hw*dhi + 2*sd*er
			lo := -(common + t1hi)
			hi := common - t1lo
			lv.improved = true
			lv.offLoU = lo / cLow * (1 + 4*unit)
			lv.offHiU = max(hi, 0) / cLow * (1 + 4*unit)
			su := eps + er + hw*sd
			lv.sig2U = su * su / cLow * (1 + 4*unit)
		}
		w.lv[j] = lv
	}

	// Brackets from the top down: the lower bound on level j + 1 is the
	// gap partner β of level j. betaR chains proven bounds only; betaE
	// also accepts the Ritz-gap guess β = ρ + (θ_(j+1) − θ_j)/2 where the
	// proven β is too low for the Kato–Temple hypothesis β > ρ.
	// Everything is measured from θ_dd = θ + t_l, the Rayleigh quotient in
	// double-double: a candidate lower bound is stored as its width
	// θ_dd − bound, so that rounding is relative to the width, not to θ.
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
		wR := lv.width(floor.Level(f, j+1) + vmin)
		wR = lv.temple(wR, lv.offLoP, lv.offHiP, lv.sig2P, lv.gap(betaR))
		if lv.improved {
			wR = lv.temple(wR, lv.offLoU, lv.offHiU, lv.sig2U, lv.gap(betaR))
		}
		gE := lv.gap(betaE)
		if gE <= max(lv.offHiP, lv.offHiU) {
			gE = max(gE, lv.gap(lv.theta+(next-lv.theta)/2))
		}
		// A guessed β is used only where the bound hardly depends on it:
		// σ ≤ (β − ρ)/8.
		guessed := gE != lv.gap(betaE)
		estimate := func(wd, oLo, oHi, sig2 float64) float64 {
			if guessed && 64*sig2 > (gE-oHi)*(gE-oHi) {
				return wd
			}
			return lv.temple(wd, oLo, oHi, sig2, gE)
		}
		wE := estimate(wR, lv.offLoP, lv.offHiP, lv.sig2P)
		if lv.improved {
			wE = estimate(wE, lv.offLoU, lv.offHiU, lv.sig2U)
			// Where the Kato–Temple bracket is loose (the top of the basis
			// at strong fields, where σ² is not small against the gap) or
			// its hypothesis cannot be met, twice the second-order
			// correction θ − ρ(u) is the better estimate.
			wE = min(wE, -2*lv.offLoU)
		}
		eR, eE := lv.errBar(wR), lv.errBar(wE)
		w.theta[j] = lv.theta
		// The estimate is trusted only while the out-of-basis correction
		// is small against the gap to the next Ritz value; at strong
		// fields the top of a small basis fails that, and the estimate
		// there undershot the true error by up to 6×.
		trust := lv.improved && (math.Abs(f) <= estimateTested || -lv.offLoU <= trustFraction*(next-lv.theta))
		if !pot && (eR <= rigorousSlack*eE || !trust) {
			w.err[j], w.bound[j] = eR, tiltwell.Rigorous
		} else {
			w.err[j], w.bound[j] = eE, tiltwell.Estimate
		}
		betaR, betaE = lv.lower(wR), lv.lower(wE)
	}
	return nil
}

// gap returns a lower bound on β − θ_dd for an absolute β.
func (lv *level) gap(beta float64) float64 {
	x := beta - lv.theta
	y := x - lv.lo
	return y - 3*unit*(math.Abs(x)+math.Abs(y))
}

// width returns an upper bound on θ_dd − lo for an absolute lower bound lo.
func (lv *level) width(lo float64) float64 {
	x := lv.theta - lo
	y := x + lv.lo
	return y + 3*unit*(math.Abs(x)+math.Abs(y))
}

// lower returns an absolute lower bound θ_dd − wd, rounded down.
func (lv *level) lower(wd float64) float64 {
	x := lv.theta - wd
	y := x + lv.lo
	return y - 3*unit*(math.Abs(x)+math.Abs(y))
}

// temple returns the smaller of wd and the width θ_dd − L of the
// Kato–Temple lower bound L = ρ − σ²/(β − ρ) for a trial function with
// ρ ∈ [θ_dd + oLo, θ_dd + oHi] (oLo ≤ 0), variance at most sig2, and g a
// lower bound on β − θ_dd. L is concave in ρ, so its minimum over the
// interval is at an end.
func (lv *level) temple(wd, oLo, oHi, sig2, g float64) float64 {
	if !(g > oHi) {
		return wd
	}
	wl := sig2/(g-oLo)*(1+4*unit) - oLo
	wh := sig2/(g-oHi)*(1+4*unit) - oHi
	return min(wd, max(wl, wh)*(1+4*unit))
}

// errBar returns Err for a level whose exact value lies in
// [θ_dd − wd, θ_dd + up]: the distance from the reported θ to the far
// end, with θ_dd − θ = t_l known.
func (lv *level) errBar(wd float64) float64 {
	return max(wd-lv.lo, lv.up+lv.lo, 0) * (1 + 4*unit)
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
