package exact

import (
	"bufio"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

type refRow struct {
	f   float64
	n   int
	eta *big.Float
}

// readReference reads testdata/levels256.txt, written by
// internal/cmd/levelref from the independent 256-bit solver.
func readReference(t *testing.T) []refRow {
	t.Helper()
	fh, err := os.Open("testdata/levels256.txt")
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	var rows []refRow
	sc := bufio.NewScanner(fh)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || line == "" {
			continue
		}
		fs := strings.Fields(line)
		if len(fs) != 3 {
			t.Fatalf("bad line %q", line)
		}
		f, err1 := strconv.ParseFloat(fs[0], 64)
		n, err2 := strconv.Atoi(fs[1])
		eta, _, err3 := big.ParseFloat(fs[2], 10, 256, big.ToNearestEven)
		if err1 != nil || err2 != nil || err3 != nil {
			t.Fatalf("bad line %q", line)
		}
		rows = append(rows, refRow{f, n, eta})
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	if len(rows) < 1000 {
		t.Fatalf("only %d reference rows", len(rows))
	}
	return rows
}

// TestAgainstReference holds every level and its error estimate against the
// 256-bit reference (fields 1e-8 to 1e4, n = 1..50): the error is at most
// 1e-14·max(1, |η|), the estimate Err never undershoots it, and Err is at
// most 100 times max(error, ε·max(1, |η|)).
func TestAgainstReference(t *testing.T) {
	t.Parallel()
	rows := readReference(t)
	var worst, worstRatio, worstPess float64
	var worstAt, ratioAt, pessAt string
	for _, r := range rows {
		l, err := Solver{}.Level(r.f, r.n)
		if err != nil {
			t.Fatalf("f=%g n=%d: %v", r.f, r.n, err)
		}
		ref, _ := r.eta.Float64()
		// The error against the 256-bit value, formed in big arithmetic
		// so that the reference's own rounding to float64 does not count.
		d := new(big.Float).SetPrec(256).Sub(new(big.Float).SetFloat64(l.Energy), r.eta)
		e, _ := d.Float64()
		e = math.Abs(e)
		scale := max(1, math.Abs(ref))
		at := fmt.Sprintf("f=%g n=%d", r.f, r.n)
		if e/scale > worst {
			worst, worstAt = e/scale, at
		}
		if e/scale > 1e-14 {
			t.Errorf("%s: η = %.17g, reference %s (rel err %.2g)", at, l.Energy, r.eta.Text('g', 20), e/scale)
		}
		if e > l.Err {
			t.Errorf("%s: Err = %.3g undershoots the true error %.3g", at, l.Err, e)
		}
		if q := e / l.Err; q > worstRatio {
			worstRatio, ratioAt = q, at
		}
		p := l.Err / max(e, eps*scale)
		if p > worstPess {
			worstPess, pessAt = p, at
		}
		if p > 100 {
			t.Errorf("%s: Err = %.3g is %.0f× the error %.3g", at, l.Err, p, e)
		}
	}
	t.Logf("%d levels: worst relative error %.3g (%s); worst error/Err %.3g (%s); worst Err/max(error, ε) %.1f (%s)",
		len(rows), worst, worstAt, worstRatio, ratioAt, worstPess, pessAt)
}

// TestReferenceFile re-derives a seeded sample of the reference file with
// the 256-bit solver, so the file cannot drift from its generator.
func TestReferenceFile(t *testing.T) {
	t.Parallel()
	rows := readReference(t)
	rng := rand.New(rand.NewPCG(1, 1))
	for range 4 {
		r := rows[rng.IntN(len(rows))]
		if r.n > 10 {
			r = rows[rng.IntN(len(rows))] // prefer the cheaper low levels
		}
		v, err := bigairy.Level(r.f, r.n, 256)
		if err != nil {
			t.Fatal(err)
		}
		if got, want := v.Text('e', 30), r.eta.Text('e', 30); got != want {
			t.Errorf("f=%g n=%d: regenerated %s, file %s", r.f, r.n, got, want)
		}
	}
}

// TestDipoleAgainstReference checks Dipole = dη/df (Hellmann–Feynman)
// against a central difference of the 256-bit reference levels with a step
// of 2^-40 relative, whose truncation error is below 1e-24 relative.
func TestDipoleAgainstReference(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f float64
		n int
	}{
		{1e-3, 1}, {0.07, 1}, {0.5, 2}, {1, 1}, {3, 5}, {10, 1}, {10, 7}, {100, 3}, {1000, 6}, {7000, 20},
	} {
		fp, fm := c.f*(1+0x1p-40), c.f*(1-0x1p-40)
		ep, err1 := bigairy.Level(fp, c.n, 256)
		em, err2 := bigairy.Level(fm, c.n, 256)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		num := new(big.Float).SetPrec(256).Sub(ep, em)
		den := new(big.Float).SetPrec(256).Sub(big.NewFloat(fp), big.NewFloat(fm))
		want, _ := num.Quo(num, den).Float64()
		got, err := Solver{}.Dipole(c.f, c.n)
		if err != nil {
			t.Fatal(err)
		}
		// Weak-to-moderate fields lose digits to the cancellation of the
		// two halves of the well (|⟨ξ − ½⟩| ≪ ⟨|ξ − ½|⟩); see Dipole.
		if e := math.Abs(got-want) / math.Abs(want); e > 1e-12 {
			t.Errorf("f=%g n=%d: Dipole %.17g, reference dη/df %.17g (rel %.2g)", c.f, c.n, got, want, e)
		} else {
			t.Logf("f=%g n=%d: rel %.2g", c.f, c.n, e)
		}
	}
}

// TestHighLevelsAgainstReference extends the reference check to the edges
// of the supported range: levels up to 200 and |f| up to 1e5, computed by
// the 256-bit solver at 128 bits (ample for float64).
func TestHighLevelsAgainstReference(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		f float64
		n int
	}{
		{1e5, 1}, {1e5, 37}, {-1e5, 120}, {3e4, 200}, {10, 200}, {1e-8, 200}, {500, 150},
	} {
		r, err := bigairy.Level(c.f, c.n, 128)
		if err != nil {
			t.Fatal(err)
		}
		l, err := Solver{}.Level(c.f, c.n)
		if err != nil {
			t.Fatal(err)
		}
		d := new(big.Float).SetPrec(128).Sub(new(big.Float).SetFloat64(l.Energy), r)
		e, _ := d.Float64()
		e = math.Abs(e)
		ref, _ := r.Float64()
		if e > 1e-14*max(1, math.Abs(ref)) || e > l.Err {
			t.Errorf("f=%g n=%d: η = %.17g, reference %s, error %.2g, Err %.2g", c.f, c.n, l.Energy, r.Text('g', 20), e, l.Err)
		} else {
			t.Logf("f=%g n=%d: error %.2g, Err %.2g", c.f, c.n, e, l.Err)
		}
	}
}
