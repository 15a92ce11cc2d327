package tiltwell_test

import (
	"errors"
	"math"
	"math/big"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
	"gonum.org/v1/gonum/floats/scalar"
)

// TestConstants checks the constants against CODATA 2018 (E. Tiesinga,
// P. J. Mohr, D. B. Newell, B. N. Taylor, Rev. Mod. Phys. 93, 025010
// (2021)): ħ = 1.054571817…e-34 J s, and ħ²/(2mₑ) = 0.0380998211615 eV nm²,
// derived from the CODATA 2018 values with mpmath at 30 digits.
func TestConstants(t *testing.T) {
	if d := math.Abs(tiltwell.ReducedPlanck-1.054571817e-34) / 1.054571817e-34; d > 1e-9 {
		t.Errorf("ħ = %g", tiltwell.ReducedPlanck)
	}
	h2m := tiltwell.ReducedPlanck * tiltwell.ReducedPlanck / (2 * tiltwell.ElectronMass) / tiltwell.ElementaryCharge * 1e18
	if d := math.Abs(h2m-0.0380998211615) / 0.0380998211615; d > 1e-11 {
		t.Errorf("ħ²/(2mₑ) = %.13g eV nm², want 0.0380998211615", h2m)
	}
}

// TestWellUnits checks E₁ = ħ²π²/(2m*L²) of a 10 nm GaAs electron well
// (m* = 0.067): 56.1239048 meV, evaluated with mpmath at 30 digits from
// the CODATA 2018 constants; and the round trips of the conversions.
func TestWellUnits(t *testing.T) {
	w, err := tiltwell.NewWell(10e-9, 0.067)
	if err != nil {
		t.Fatal(err)
	}
	if e := w.MilliEV(1); math.Abs(e-56.1239048) > 1e-7 {
		t.Errorf("E₁ = %.10g meV, want 56.1239048", e)
	}
	// F₀ = E₁/(eL): 56.1239 meV across 10 nm is 56.1239 kV/cm.
	if f0 := w.FieldUnit() / tiltwell.KVPerCM(1); math.Abs(f0-56.1239048) > 1e-6 {
		t.Errorf("F₀ = %.10g kV/cm", f0)
	}
	for _, F := range []float64{0, 1e5, -3e7} {
		if got := w.Field(w.Reduced(F)); math.Abs(got-F) > 1e-15*math.Abs(F) {
			t.Errorf("Field(Reduced(%g)) = %g", F, got)
		}
	}
	if j := w.Joules(2); math.Abs(j/w.EnergyUnit()-2) > 1e-15 {
		t.Errorf("Joules(2) = %g", j)
	}
}

// TestNewWellBad checks that bad or out-of-range scales are refused.
func TestNewWellBad(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ width, mass float64 }{
		{0, 0.067}, {-1e-9, 0.067}, {math.NaN(), 0.067}, {math.Inf(1), 0.067},
		{10e-9, 0}, {10e-9, -1}, {10e-9, math.NaN()}, {10e-9, math.Inf(1)},
		{1e-200, 1}, {1e300, 1}, {1e-9, 1e-300},
		// E₁ and F₀ under- or overflow: F₀ = 3.8e-310 (subnormal) and
		// Reduced(1) = +Inf before the ranges were checked.
		{1e100, 1e-9}, {1e-160, 1e-9},
		// Just outside the plausible ranges.
		{0.09e-9, 0.067}, {10.1e-6, 0.067}, {10e-9, 0.9e-3}, {10e-9, 21},
	} {
		if _, err := tiltwell.NewWell(c.width, c.mass); !errors.Is(err, tiltwell.ErrUnits) {
			t.Errorf("NewWell(%g, %g): err = %v, want ErrUnits", c.width, c.mass, err)
		}
	}
	for _, c := range []struct{ width, mass float64 }{
		{tiltwell.MinWellWidth, tiltwell.MinWellMass}, {tiltwell.MaxWellWidth, tiltwell.MaxWellMass},
		{10e-9, 0.067}, {0.3e-9, 0.0023}, {5e-6, 15},
	} {
		w, err := tiltwell.NewWell(c.width, c.mass)
		if err != nil {
			t.Errorf("NewWell(%g, %g): %v", c.width, c.mass, err)
			continue
		}
		for _, v := range []float64{w.EnergyUnit(), w.FieldUnit(), w.Reduced(1), w.Field(1)} {
			if !(v >= 0x1p-1022) || math.IsInf(v, 0) {
				t.Errorf("NewWell(%g, %g): a scale %g is not a normal number", c.width, c.mass, v)
			}
		}
	}
}

// TestNewWellHints: an implausible width or mass is refused with an error
// that names the value and the likely mistake.
func TestNewWellHints(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		width, mass float64
		want        string
	}{
		{10, 0.041, "width 10 m outside 1e-10–1e-05 m: did you mean 10 nm = 10e-9?"},
		{50, 0.067, "did you mean 50 nm = 50e-9?"},
		{0.005, 0.067, "did you mean 0.005 µm = 0.005e-6?"},
		{10e-9, 41, "effective mass 41 m₀ outside 0.001–20 m₀: did you mean 0.041 m₀?"},
		{10e-9, 670, "did you mean 0.67 m₀?"},
		{10e-9, 0.067 * tiltwell.ElectronMass, "in kilograms? the mass is in units of m₀, 0.067 here"},
		{0.067, 10e-9, "swapped?"},
		{1e-300, 0.067, "width 1e-300 m outside"},
	} {
		_, err := tiltwell.NewWell(c.width, c.mass)
		if !errors.Is(err, tiltwell.ErrUnits) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("NewWell(%g, %g): error %v, want one wrapping ErrUnits that says %q", c.width, c.mass, err, c.want)
		}
	}
}

// TestEnergyConversions: meV, eV and joules to reduced energies and back.
// 1 eV = e J exactly (CODATA 2018).
func TestEnergyConversions(t *testing.T) {
	t.Parallel()
	w, err := tiltwell.NewWell(10e-9, 0.067)
	if err != nil {
		t.Fatal(err)
	}
	if got := w.FromMilliEV(56.1239048); math.Abs(got-1) > 1e-8 {
		t.Errorf("FromMilliEV(E₁ in meV) = %.10g, want 1", got)
	}
	for _, eta := range []float64{0, 1, -3.5, 1e-12, 250} {
		for _, c := range []struct {
			name string
			to   func(float64) float64
			from func(float64) float64
		}{
			{"meV", w.MilliEV, w.FromMilliEV},
			{"eV", w.EV, w.FromEV},
			{"J", w.Joules, w.FromJoules},
		} {
			if got := c.from(c.to(eta)); !scalar.EqualWithinRel(got, eta, 4e-16) {
				t.Errorf("%s: round trip of %g gives %.17g", c.name, eta, got)
			}
		}
		if ev, mev := w.EV(eta), w.MilliEV(eta); !scalar.EqualWithinRel(1000*ev, mev, 4e-16) {
			t.Errorf("η = %g: %g eV but %g meV", eta, ev, mev)
		}
		if ev, j := w.EV(eta), w.Joules(eta); !scalar.EqualWithinRel(ev*tiltwell.ElementaryCharge, j, 4e-16) {
			t.Errorf("η = %g: %g eV but %g J", eta, ev, j)
		}
	}
}

// TestFieldConversions: 1 kV/cm = 1e5 V/m and 1 V/µm = 1e6 V/m (SI
// prefixes), both ways.
func TestFieldConversions(t *testing.T) {
	t.Parallel()
	if got := tiltwell.KVPerCM(100); got != 1e7 {
		t.Errorf("KVPerCM(100) = %g", got)
	}
	if got := tiltwell.VPerMicron(10); got != 1e7 {
		t.Errorf("VPerMicron(10) = %g", got)
	}
	if got := tiltwell.InKVPerCM(1e7); got != 100 {
		t.Errorf("InKVPerCM(1e7) = %g", got)
	}
	if got := tiltwell.InVPerMicron(1e7); got != 10 {
		t.Errorf("InVPerMicron(1e7) = %g", got)
	}
	for _, F := range []float64{0, 3.3e6, -2.5e7, 1e9} {
		if got := tiltwell.KVPerCM(tiltwell.InKVPerCM(F)); !scalar.EqualWithinRel(got, F, 4e-16) {
			t.Errorf("kV/cm round trip of %g: %g", F, got)
		}
		if got := tiltwell.VPerMicron(tiltwell.InVPerMicron(F)); !scalar.EqualWithinRel(got, F, 4e-16) {
			t.Errorf("V/µm round trip of %g: %g", F, got)
		}
		if kv, v := tiltwell.InKVPerCM(F), tiltwell.InVPerMicron(F); !scalar.EqualWithinRel(kv, 10*v, 4e-16) {
			t.Errorf("%g V/m is %g kV/cm but %g V/µm", F, kv, v)
		}
	}
}

// TestPhoton: λ = hc/E. CODATA 2018 gives hc = 1.239 841 984… × 10⁻⁶ eV m,
// exact since h, c and e are (from memory), so 1 eV is 1239.84198… nm;
// the test also forms hc/e as an exact rational from the defined values
// h = 6.62607015e-34 J s, c = 299792458 m/s, e = 1.602176634e-19 C.
func TestPhoton(t *testing.T) {
	t.Parallel()
	if got := tiltwell.Wavelength(1); math.Abs(got-1239.84198) > 5e-6 {
		t.Errorf("Wavelength(1 eV) = %.9f nm, want 1239.84198", got)
	}
	h, _ := new(big.Rat).SetString("6.62607015e-34")
	c, _ := new(big.Rat).SetString("299792458")
	e, _ := new(big.Rat).SetString("1.602176634e-19")
	hc := new(big.Rat).Mul(h, c)
	hc.Quo(hc, e)
	hc.Mul(hc, big.NewRat(1e9, 1)) // eV nm
	want, _ := hc.Float64()
	if got := tiltwell.Wavelength(1); !scalar.EqualWithinRel(got, want, 4e-16) {
		t.Errorf("Wavelength(1 eV) = %.17g nm, exact %.17g", got, want)
	}
	for _, ev := range []float64{1.42, 0.8, 3.1, 1e-3} {
		if got := tiltwell.PhotonEnergy(tiltwell.Wavelength(ev)); !scalar.EqualWithinRel(got, ev, 4e-16) {
			t.Errorf("round trip of %g eV: %.17g", ev, got)
		}
	}
	// A red shift lengthens the wavelength.
	if tiltwell.Wavelength(1.41) <= tiltwell.Wavelength(1.42) {
		t.Error("a lower photon energy gave a shorter wavelength")
	}
}

// TestEscapeTime: τ = ħ/(Γ E₁); 1 meV of width is a lifetime of
// ħ/(1 meV) = 6.582e-13 s (CODATA 2018: ħ = 6.582119569e-16 eV s).
func TestEscapeTime(t *testing.T) {
	t.Parallel()
	w, err := tiltwell.NewWell(10e-9, 0.067)
	if err != nil {
		t.Fatal(err)
	}
	gamma := 1 / w.MilliEV(1) // Γ = 1 meV in E₁
	if got, want := w.EscapeTime(gamma), 6.582119569e-13; math.Abs(got-want) > 1e-9*want {
		t.Errorf("EscapeTime(1 meV) = %g s, want %g", got, want)
	}
	if got := w.EscapeTime(0); !math.IsInf(got, 1) {
		t.Errorf("EscapeTime(0) = %g, want +Inf (a bound state)", got)
	}
	if got := w.EscapeTime(1e-300); math.IsInf(got, 0) || !(got > 1e280) {
		t.Errorf("EscapeTime(1e-300) = %g, want finite and huge", got)
	}
	for _, g := range []float64{-1, math.NaN()} {
		if got := w.EscapeTime(g); !math.IsNaN(got) {
			t.Errorf("EscapeTime(%v) = %g, want NaN", g, got)
		}
	}
}
