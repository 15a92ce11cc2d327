package tiltwell_test

import (
	"errors"
	"math"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// TestConstants checks the constants against CODATA 2018 (Tiesinga et al.,
// Rev. Mod. Phys. 93, 025010 (2021)): ħ = 1.054571817…e-34 J s and
// ħ²/(2mₑ) = 0.0380998211615 eV nm² (derived with mpmath in
// shared/reference/check-values.md §2).
func TestConstants(t *testing.T) {
	if d := math.Abs(tiltwell.ReducedPlanck-1.054571817e-34) / 1.054571817e-34; d > 1e-9 {
		t.Errorf("ħ = %g", tiltwell.ReducedPlanck)
	}
	h2m := tiltwell.ReducedPlanck * tiltwell.ReducedPlanck / (2 * tiltwell.ElectronMass) / tiltwell.ElementaryCharge * 1e18
	if d := math.Abs(h2m-0.0380998211615) / 0.0380998211615; d > 1e-11 {
		t.Errorf("ħ²/(2mₑ) = %.13g eV nm², want 0.0380998211615", h2m)
	}
}

// TestWellUnits checks E₁ of a 10 nm GaAs electron well (m* = 0.067,
// 56.1239048 meV; check-values.md §7, mpmath) and the round trips of the
// conversions.
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
	for _, c := range []struct{ width, mass float64 }{
		{0, 0.067}, {-1e-9, 0.067}, {math.NaN(), 0.067}, {math.Inf(1), 0.067},
		{10e-9, 0}, {10e-9, -1}, {10e-9, math.NaN()}, {10e-9, math.Inf(1)},
		{1e-200, 1}, {1e300, 1}, {1e-9, 1e-300},
	} {
		if _, err := tiltwell.NewWell(c.width, c.mass); !errors.Is(err, tiltwell.ErrUnits) {
			t.Errorf("NewWell(%g, %g): err = %v, want ErrUnits", c.width, c.mass, err)
		}
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
