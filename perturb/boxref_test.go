package perturb

import (
	"math"

	"github.com/tiltwell/tiltwell/internal/squarewell"
)

// boxSolver is an eigen-solver of the tilted finite well in a box, for the
// tests only and independent of everything else in the module: the
// Schrödinger equation
//
//	−(1/π²) (1/μ) φ″ + (v + f (ξ − ½)) φ = η φ
//
// in each layer, φ and (1/μ)φ′ continuous at ξ = 0 and 1, φ = 0 at the
// box walls ξ = −D and 1 + D, integrated by Taylor series (the equation is
// φ″ = (a₀ + a₁t) φ in each step, so c_(m+2) (m+1)(m+2) = a₀ c_m + a₁ c_(m−1)
// exactly, summed to rounding), shot from both walls to ξ = ½, and the
// level found by bracketing the Wronskian mismatch. The walls are far
// enough (2κD ≥ 80 at the level) that they move a level by far less than
// 1e-16 at f = 0; under a field the box level differs from the real part of
// the resonance by an amount of the order of its width, negligible where
// the tests use it.
type boxSolver struct {
	w squarewell.Well
	d float64 // distance of each wall from the well
}

func newBox(w squarewell.Well, eta float64) boxSolver {
	k := math.Pi * math.Sqrt(math.Min(w.ML*(w.VL-eta), w.MR*(w.VR-eta)))
	return boxSolver{w: w, d: 40/k + 0.5}
}

// fieldBox returns the box for the field f: the walls no farther than
// where the downhill barrier has fallen to 20% of its height above eta at
// the interface, so that the box holds no lower states of its own. The
// box level then differs from the resonance by about the tunnelling
// factor through the barrier to the wall, of the order of its width.
func fieldBox(w squarewell.Well, eta, f float64) boxSolver {
	b := newBox(w, eta)
	if af := math.Abs(f); af > 0 {
		v := w.VL
		if f < 0 {
			v = w.VR
		}
		b.d = math.Min(b.d, 0.8*(v-af/2-eta)/af)
	}
	return b
}

// taylorStep advances (φ, φ′) by h (h may be negative) in a layer where
// φ″ = (a₀ + a₁ t) φ.
func taylorStep(phi, dphi, a0, a1, h float64) (float64, float64) {
	var c [200]float64
	c[0], c[1] = phi, dphi
	sum, dsum := phi+dphi*h, dphi
	hp := 1.0 // h^m
	small := 0
	for m := 0; m+2 < len(c); m++ {
		cm1 := 0.0
		if m > 0 {
			cm1 = c[m-1]
		}
		c[m+2] = (a0*c[m] + a1*cm1) / float64((m+1)*(m+2))
		t := c[m+2] * hp * h * h
		dt := float64(m+2) * c[m+2] * hp * h
		hp *= h
		sum += t
		dsum += dt
		if math.Abs(t) <= 1e-18*math.Abs(sum) && math.Abs(dt) <= 1e-18*math.Abs(dsum) {
			small++
			if small > 3 {
				break
			}
		} else {
			small = 0
		}
	}
	return sum, dsum
}

// shoot integrates from the wall at from (φ = 0, φ′ = ±1) to ξ = ½ and
// returns φ and φ′ there, scaled to unit size.
func (b boxSolver) shoot(f, eta, from float64) (phi, dphi float64) {
	type segment struct{ stop, v, mu float64 }
	var segs [2]segment
	phi, dphi = 0, 1
	if from < 0 {
		segs = [2]segment{{0, b.w.VL, b.w.ML}, {0.5, 0, 1}}
	} else {
		dphi = -1
		segs = [2]segment{{1, b.w.VR, b.w.MR}, {0.5, 0, 1}}
	}
	x := from
	for i, sg := range segs {
		for x != sg.stop {
			a0 := math.Pi * math.Pi * sg.mu * (sg.v + f*(x-0.5) - eta)
			a1 := math.Pi * math.Pi * sg.mu * f
			h := math.Min(0.05, 0.5/math.Sqrt(math.Abs(a0)+1))
			if sg.stop < x {
				h = -h
			}
			if (sg.stop-x)/h <= 1 {
				h = sg.stop - x
			}
			phi, dphi = taylorStep(phi, dphi, a0, a1, h)
			if x+h == x || (sg.stop-x-h)/h < 1e-12 {
				x = sg.stop
			} else {
				x += h
			}
			if s := math.Hypot(phi, dphi); s > 1e100 || s < 1e-100 {
				phi, dphi = phi/s, dphi/s
			}
		}
		if i == 0 {
			dphi /= sg.mu // (1/μ)φ′ continuous; μ = 1 in the well
		}
	}
	s := math.Hypot(phi, dphi)
	return phi / s, dphi / s
}

// mismatch returns the scaled Wronskian of the two shots at ξ = ½.
func (b boxSolver) mismatch(f, eta float64) float64 {
	pl, dl := b.shoot(f, eta, -b.d)
	pr, dr := b.shoot(f, eta, 1+b.d)
	return pl*dr - dl*pr
}

// level returns the root of the mismatch in [lo, hi], which must bracket
// exactly one level (Illinois regula falsi to full precision).
func (b boxSolver) level(f, lo, hi float64) (float64, bool) {
	flo, fhi := b.mismatch(f, lo), b.mismatch(f, hi)
	if flo == 0 {
		return lo, true
	}
	if fhi == 0 {
		return hi, true
	}
	if (flo > 0) == (fhi > 0) {
		return 0, false
	}
	side := 0
	for range 200 {
		x := (lo*fhi - hi*flo) / (fhi - flo)
		if !(x > lo && x < hi) {
			x = 0.5 * (lo + hi)
		}
		fx := b.mismatch(f, x)
		if fx == 0 {
			return x, true
		}
		if (fx > 0) == (flo > 0) {
			lo, flo = x, fx
			if side == -1 {
				fhi /= 2
			}
			side = -1
		} else {
			hi, fhi = x, fx
			if side == 1 {
				flo /= 2
			}
			side = 1
		}
		if hi-lo <= 2e-16*math.Max(1, math.Abs(lo)) {
			break
		}
	}
	return 0.5 * (lo + hi), true
}
