//go:build devexact

package basis

import (
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact"
)

func TestDevCompare(t *testing.T) {
	stacks := []struct{ vl, ml, vr, mr float64 }{
		{4.3, 1.37, 4.3, 1.37},
		{10, 1, 10, 1},
		{3, 1.5, 8, 2},
	}
	for _, sp := range stacks {
		st, _ := tiltwell.AsymmetricWell(sp.vl, sp.ml, sp.vr, sp.mr)
		for _, f := range []float64{0, 0.5, 1, 2, 4} {
			ex, eerr := exact.Solver{Stack: st}.Levels(nil, f, 4)
			bs, st2, berr := Solver{Stack: st}.Solve(nil, f, 4)
			t.Logf("stack %v f=%g exact n=%d (%v) basis n=%d N=%d tries=%d (%v)", sp, f, len(ex), eerr, len(bs), st2.Size, st2.Tries, berr)
			for i := range min(len(ex), len(bs)) {
				e, b := ex[i], bs[i]
				de := b.Energy - e.Energy
				t.Logf("  n=%d E=%.12f err=%.2e Err=%.2e (%s) ratio=%.2g | G=%.4e exG=%.4e gErr=%.2e trueGerr=%.2e",
					i+1, b.Energy, de, b.Err, b.Bound, b.Err/math.Abs(de), b.Gamma, e.Gamma, b.GammaErr, math.Abs(b.Gamma-e.Gamma))
			}
		}
	}
}

func TestDevGrid(t *testing.T) {
	type st4 struct{ vl, ml, vr, mr float64 }
	var stacks []st4
	for _, v := range []float64{2, 3, 5, 10, 20, 50} {
		for _, m := range []float64{1, 1.5, 2} {
			stacks = append(stacks, st4{v, m, v, m})
		}
		stacks = append(stacks, st4{v, 1, 2 * v, 2}, st4{2 * v, 2, v, 1.3})
	}
	fields := []float64{0, 1e-3, 0.1, 0.3, 1, 2, 3, 5, 7, 10, -2}
	var n, under, pess, gunder, gpess, refused, extra int
	worstP, worstGP := 0.0, 0.0
	for _, sp := range stacks {
		st, _ := tiltwell.AsymmetricWell(sp.vl, sp.ml, sp.vr, sp.mr)
		for _, f := range fields {
			ex, _ := exact.Solver{Stack: st}.Levels(nil, f, 12)
			bs, err := Solver{Stack: st}.Levels(nil, f, 12)
			if len(bs) < len(ex) {
				refused += len(ex) - len(bs)
				t.Logf("refused: %v f=%g exact %d basis %d (%v)", sp, f, len(ex), len(bs), err)
			}
			if len(bs) > len(ex) {
				extra += len(bs) - len(ex)
				t.Logf("extra: %v f=%g exact %d basis %d", sp, f, len(ex), len(bs))
			}
			for i := range min(len(ex), len(bs)) {
				e, b := ex[i], bs[i]
				n++
				de := math.Abs(b.Energy - e.Energy)
				if de > b.Err {
					under++
					t.Logf("UNDER %v f=%g n=%d err %.3g Err %.3g G %.3g", sp, f, i+1, de, b.Err, e.Gamma)
				}
				if de > 1e-12 && b.Err > 10*de {
					pess++
					t.Logf("PESS %v f=%g n=%d err %.3g Err %.3g ratio %.3g G %.3g", sp, f, i+1, de, b.Err, b.Err/de, e.Gamma)
				}
				if de > 1e-12 {
					worstP = max(worstP, b.Err/de)
				}
				dg := math.Abs(b.Gamma - e.Gamma)
				if dg > b.GammaErr+e.GammaErr {
					gunder++
					t.Logf("GUNDER %v f=%g n=%d G %.4g exG %.4g err %.3g GErr %.3g", sp, f, i+1, b.Gamma, e.Gamma, dg, b.GammaErr)
				}
				if dg > 1e-12 && b.GammaErr > 10*dg {
					gpess++
					t.Logf("GPESS %v f=%g n=%d G %.4g err %.3g GErr %.3g", sp, f, i+1, b.Gamma, dg, b.GammaErr)
				}
				if dg > 1e-12 {
					worstGP = max(worstGP, b.GammaErr/dg)
				}
			}
		}
	}
	t.Logf("points %d under %d pess %d (worst %.3g) gunder %d gpess %d (worst %.3g) refused %d extra %d", n, under, pess, worstP, gunder, gpess, worstGP, refused, extra)
}

func TestDevConvN(t *testing.T) {
	for _, c := range []struct {
		vl, ml, vr, mr, f float64
		k                 int
	}{{20, 1, 20, 1, 3, 5}, {5, 1, 5, 1, 0.3, 3}, {20, 2, 20, 2, 5, 4}} {
		st, _ := tiltwell.AsymmetricWell(c.vl, c.ml, c.vr, c.mr)
		ex, _ := exact.Solver{Stack: st}.Levels(nil, c.f, c.k)
		j := c.k - 1
		for _, N := range []int{20, 28, 40, 56, 80, 112, 160, 224} {
			bs, err := Solver{Stack: st, Size: N}.Levels(nil, c.f, c.k)
			if err != nil || len(bs) < c.k {
				t.Logf("%v N=%d: %v", c, N, err)
				continue
			}
			t.Logf("%v N=%d: err %.3g Err %.3g  Gerr %.3g GErr %.3g", c, N, bs[j].Energy-ex[j].Energy, bs[j].Err, bs[j].Gamma-ex[j].Gamma, bs[j].GammaErr)
		}
	}
}
