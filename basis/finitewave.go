package basis

import (
	"fmt"
	"math"

	"github.com/tiltwell/tiltwell"
)

// stackWave is a level of a finite stack: Σ c_m χ_m over the box states,
// zero outside the box.
type stackWave struct {
	segs []seg
	reps []rep // N×len(segs)
	c    []float64
}

var _ tiltwell.Spread = stackWave{}

// At returns φ(ξ): the expansion inside the box, 0 outside it and for
// NaN ξ.
func (w stackWave) At(xi float64) float64 {
	lo, hi := w.Support()
	if !(xi > lo && xi < hi) {
		return 0
	}
	si := len(w.segs) - 1
	for i, s := range w.segs {
		if xi < s.lo+s.w {
			si = i
			break
		}
	}
	s := w.segs[si]
	x := xi - s.lo
	ns := len(w.segs)
	sum := 0.0
	for m, c := range w.c {
		sum += c * w.reps[m*ns+si].at(x, s.w)
	}
	return sum
}

// Support returns the box [a, b], over which φ is normalized.
func (w stackWave) Support() (lo, hi float64) {
	last := w.segs[len(w.segs)-1]
	return w.segs[0].lo, last.lo + last.w
}

// stackWavefunction is Wavefunction for a finite Stack.
func (s Solver) stackWavefunction(f float64, n int) (tiltwell.Wavefunction, error) {
	if err := s.check(f, n); err != nil {
		return nil, err
	}
	w := getWork()
	defer putWork(w)
	fr := negligible(f)
	g := s.geometryFor(w, fr)
	_, conf, why, err := s.stackRun(w, &g, n)
	if err != nil {
		return nil, err
	}
	if conf < n {
		return nil, &tiltwell.ConfinedError{Method: "basis", F: f, Asked: n, Confined: conf, Why: fmt.Sprintf("level %d: %s", conf+1, why)}
	}
	fw := &w.fw
	ns := len(fw.segs)
	var wave stackWave
	wave.segs = append([]seg(nil), fw.segs...)
	if g.f == 0 && g.pot == nil {
		// The zero-field levels are the box states themselves.
		if err := fw.buildBasis(&g, n); err != nil {
			return nil, err
		}
		wave.reps = append([]rep(nil), fw.reps[(n-1)*ns:n*ns]...)
		wave.c = []float64{1}
		if fw.ends[(n-1)*(ns+1)+fw.i0] < 0 {
			wave.c[0] = -1
		}
	} else {
		N := fw.ns
		if fw.stale {
			// A second basis measured the wall's error after this one:
			// solve again for the vectors.
			if err := fw.buildBasis(&g, N); err != nil {
				return nil, err
			}
			if err := w.ritz(&g, N, n); err != nil {
				return nil, err
			}
		}
		wave.reps = append([]rep(nil), fw.reps[:N*ns]...)
		wave.c = make([]float64, N)
		psi0, nrm := 0.0, 0.0
		for i := range wave.c {
			c := w.a[i*N+n-1]
			wave.c[i] = c
			psi0 += c * fw.ends[i*(ns+1)+fw.i0]
			nrm += c * c
		}
		sc := 1 / math.Sqrt(nrm)
		if psi0 < 0 {
			sc = -sc
		}
		for i := range wave.c {
			wave.c[i] *= sc
		}
	}
	var wf tiltwell.Wavefunction = wave
	if _, mir := tiltwell.Fold(fr); mir {
		wf = tiltwell.Mirror(wf, n)
	}
	return wf, nil
}
