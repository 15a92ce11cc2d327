package tiltwell_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/tiltwell/tiltwell"
)

// vmr is the compilation every material value comes from:
// I. Vurgaftman, J. R. Meyer, L. R. Ram-Mohan, J. Appl. Phys. 89, 5815
// (2001), doi:10.1063/1.1368156. Binary values are from its per-compound
// tables of recommended band-structure parameters (Sec. III), in the
// table's own units (Å, meV/K), so that a unit conversion in the code
// cannot hide. Table numbers are by our reading, from memory.
var vmrBinaries = []struct {
	table              string
	m                  tiltwell.Material
	a, da              float64 // Å at 300 K, Å/K
	eg, alpha, beta    float64 // Γ gap (eV), Varshni α (meV/K), β (K)
	egX, alphaX, betaX float64
	egL, alphaL, betaL float64
	me, g1, g2, g3     float64
	ep, vbo            float64
}{
	{"Sec. III A, GaAs (Table I)", tiltwell.GaAs(), 5.65325, 3.88e-5, 1.519, 0.5405, 204, 1.981, 0.460, 204, 1.815, 0.605, 204, 0.067, 6.98, 2.06, 2.93, 28.8, -0.80},
	{"Sec. III B, AlAs (Table II)", tiltwell.AlAs(), 5.6611, 2.90e-5, 3.099, 0.885, 530, 2.24, 0.70, 530, 2.46, 0.605, 204, 0.15, 3.76, 0.82, 1.42, 21.1, -1.33},
	{"Sec. III C, InAs (Table III)", tiltwell.InAs(), 6.0583, 2.74e-5, 0.417, 0.276, 93, 1.433, 0.276, 93, 1.133, 0.276, 93, 0.026, 20.0, 8.5, 9.2, 21.5, -0.59},
	// InP's X gap is tabulated as 2.384 − 3.7e-4 T eV: α = 0.37 meV/K, β = 0.
	{"Sec. III F, InP (Table VI)", tiltwell.InP(), 5.8697, 2.79e-5, 1.4236, 0.363, 162, 2.384, 0.37, 0, 2.014, 0.363, 162, 0.0795, 5.08, 1.60, 2.10, 20.7, -0.94},
}

func near(got, want, tol float64) bool { return math.Abs(got-want) <= tol }

// TestBinaryTables holds each binary to the compilation's table, and its
// gap at every temperature to the Varshni law written out here.
func TestBinaryTables(t *testing.T) {
	t.Parallel()
	for _, b := range vmrBinaries {
		m := b.m
		check := func(what string, got, want float64) {
			t.Helper()
			if !near(got, want, 1e-12*math.Max(1, math.Abs(want))) {
				t.Errorf("%s (vmr %s): %s = %.10g, want %.10g", m.Name, b.table, what, got, want)
			}
		}
		check("lattice (Å)", m.Lattice*1e10, b.a)
		check("lattice expansion (Å/K)", m.LatticeExpansion*1e10, b.da)
		check("electron mass", m.ElectronMass, b.me)
		check("γ1", m.Luttinger1, b.g1)
		check("γ2", m.Luttinger2, b.g2)
		check("γ3", m.Luttinger3, b.g3)
		check("Ep", m.Kane, b.ep)
		check("VBO", m.VBO, b.vbo)
		check("Ev", m.Ev(), b.vbo)
		for _, T := range []float64{1e-6, 4.2, 77, 150, 300, 500, 1000} {
			varshni := func(e0, alpha, beta float64) float64 { return e0 - alpha*1e-3*T*T/(T+beta) }
			g, err := m.Gap(T)
			if err != nil {
				t.Fatal(err)
			}
			check("Γ gap", g, varshni(b.eg, b.alpha, b.beta))
			check("X gap", m.X.At(T), varshni(b.egX, b.alphaX, b.betaX))
			check("L gap", m.L.At(T), varshni(b.egL, b.alphaL, b.betaL))
			ec, err := m.Ec(T)
			if err != nil {
				t.Fatal(err)
			}
			check("Ec", ec, b.vbo+varshni(b.eg, b.alpha, b.beta))
			a, err := m.LatticeAt(T)
			if err != nil {
				t.Fatal(err)
			}
			check("lattice at T (Å)", a*1e10, b.a+b.da*(T-300))
		}
		if err := m.Validate(); err != nil {
			t.Errorf("%s: %v", m.Name, err)
		}
	}
}

// TestGaAsGap300: the GaAs gap at room temperature is 1.42 eV (common
// practice, no source); the compilation's Varshni law gives
// 1.519 − 0.5405e-3·300²/(300 + 204) = 1.42248 eV.
func TestGaAsGap300(t *testing.T) {
	t.Parallel()
	g, err := tiltwell.GaAs().Gap(300)
	if err != nil {
		t.Fatal(err)
	}
	if !near(g, 1.42, 0.005) || !near(g, 1.519-0.5405e-3*300*300/504, 1e-12) {
		t.Errorf("GaAs gap at 300 K = %.6f eV, want 1.42248", g)
	}
}

// TestHoleMasses: the [001] and in-plane hole masses of GaAs from its
// Luttinger parameters γ1 = 6.98, γ2 = 2.06 (vmr Sec. III A):
// 1/(γ1 − 2γ2) = 1/2.86, 1/(γ1 + 2γ2) = 1/11.1, 1/(γ1 + γ2) = 1/9.04,
// 1/(γ1 − γ2) = 1/4.92. The heavy-hole value 0.3497 is the one the
// package's Pair documentation uses.
func TestHoleMasses(t *testing.T) {
	t.Parallel()
	m := tiltwell.GaAs()
	for _, tc := range []struct {
		what      string
		got, want float64
	}{
		{"heavy [001]", m.HeavyHoleMass(), 1 / 2.86},
		{"light [001]", m.LightHoleMass(), 1 / 11.1},
		{"heavy in plane", m.HeavyHoleMassInPlane(), 1 / 9.04},
		{"light in plane", m.LightHoleMassInPlane(), 1 / 4.92},
	} {
		if !near(tc.got, tc.want, 1e-12) {
			t.Errorf("GaAs %s hole mass %.6f, want %.6f", tc.what, tc.got, tc.want)
		}
	}
	if hh := m.HeavyHoleMass(); !near(hh, 0.3497, 5e-5) {
		t.Errorf("GaAs heavy hole %.5f, want 0.3497", hh)
	}
}

// TestPermittivity: static dielectric constants of the Ioffe Institute's
// NSM database (after Levinshtein, Rumyantsev, Shur, Handbook Series on
// Semiconductor Parameters, Vol. 1 (1996)): GaAs 12.90, AlAs 10.06 (its
// Al_xGa_{1−x}As law 12.90 − 2.84x at x = 1), InAs 15.15, InP 12.5, and
// Al0.3Ga0.7As 12.90 − 2.84·0.3 = 12.048.
func TestPermittivity(t *testing.T) {
	t.Parallel()
	al3, _ := tiltwell.AlGaAs(0.3)
	for _, tc := range []struct {
		m    tiltwell.Material
		want float64
	}{
		{tiltwell.GaAs(), 12.90}, {tiltwell.AlAs(), 10.06}, {tiltwell.InAs(), 15.15}, {tiltwell.InP(), 12.5}, {al3, 12.048},
	} {
		if !near(tc.m.Permittivity, tc.want, 1e-12) {
			t.Errorf("%s: permittivity %.4f, want %.4f", tc.m.Name, tc.m.Permittivity, tc.want)
		}
	}
}

// TestAlloyEndpoints: an alloy at x = 0 or 1 is its end member (every
// bowing term carries x(1 − x)).
func TestAlloyEndpoints(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		alloy  func(float64) (tiltwell.Material, error)
		x0, x1 tiltwell.Material
	}{
		{tiltwell.AlGaAs, tiltwell.GaAs(), tiltwell.AlAs()},
		{tiltwell.InGaAs, tiltwell.GaAs(), tiltwell.InAs()},
		{tiltwell.InAlAs, tiltwell.AlAs(), tiltwell.InAs()},
	} {
		for x, want := range map[float64]tiltwell.Material{0: tc.x0, 1: tc.x1} {
			got, err := tc.alloy(x)
			if err != nil {
				t.Fatal(err)
			}
			same := func(what string, g, w float64) {
				if !near(g, w, 1e-12*math.Max(1, math.Abs(w))) {
					t.Errorf("%s at x = %g: %s = %.10g, want %s's %.10g", got.Name, x, what, g, want.Name, w)
				}
			}
			for _, T := range []float64{4, 300} {
				g, _ := got.Gap(T)
				w, _ := want.Gap(T)
				same("Γ gap", g, w)
				same("X gap", got.X.At(T), want.X.At(T))
				same("L gap", got.L.At(T), want.L.At(T))
			}
			same("lattice", got.Lattice, want.Lattice)
			same("VBO", got.VBO, want.VBO)
			same("electron mass", got.ElectronMass, want.ElectronMass)
			same("heavy hole", got.HeavyHoleMass(), want.HeavyHoleMass())
			same("light hole", got.LightHoleMass(), want.LightHoleMass())
			same("γ3", got.Luttinger3, want.Luttinger3)
			same("Ep", got.Kane, want.Kane)
			same("permittivity", got.Permittivity, want.Permittivity)
		}
	}
}

// TestAlloyBowing holds the alloys to the bowing parameters of vmr Sec. IV
// (P = x P_A + (1 − x) P_B − x(1 − x) C), each value written out from the
// binary tables and the bowing parameter:
//   - Al_xGa_{1−x}As: Γ gap C = −0.127 + 1.310x, X gap C = 0.055, VBO and
//     masses linear;
//   - In_xGa_{1−x}As: Γ gap 0.477, VBO −0.38, electron mass 0.0091, Ep
//     −1.48, [001] hole masses −0.145 (heavy) and 0.0202 (light);
//   - In_xAl_{1−x}As: Γ gap 0.70, VBO −0.64, electron mass 0.049, Ep −4.81.
func TestAlloyBowing(t *testing.T) {
	t.Parallel()
	al, _ := tiltwell.AlGaAs(0.3)
	ga, _ := tiltwell.InGaAs(0.53)
	ia, _ := tiltwell.InAlAs(0.52)
	gap0 := func(m tiltwell.Material) float64 { g, _ := m.Gap(1e-9); return g }
	b := func(x, pa, pb, c float64) float64 { return x*pa + (1-x)*pb - x*(1-x)*c }
	for _, tc := range []struct {
		what      string
		got, want float64
	}{
		{"Al0.3Ga0.7As Γ gap 0 K", gap0(al), b(0.3, 3.099, 1.519, -0.127+1.310*0.3)},
		{"Al0.3Ga0.7As X gap 0 K", al.X.At(1e-9), b(0.3, 2.24, 1.981, 0.055)},
		{"Al0.3Ga0.7As L gap 0 K", al.L.At(1e-9), b(0.3, 2.46, 1.815, 0)},
		{"Al0.3Ga0.7As VBO", al.VBO, b(0.3, -1.33, -0.80, 0)},
		{"Al0.3Ga0.7As electron mass", al.ElectronMass, b(0.3, 0.15, 0.067, 0)},
		{"Al0.3Ga0.7As γ1", al.Luttinger1, b(0.3, 3.76, 6.98, 0)},
		{"Al0.3Ga0.7As γ2", al.Luttinger2, b(0.3, 0.82, 2.06, 0)},
		{"In0.53Ga0.47As Γ gap 0 K", gap0(ga), b(0.53, 0.417, 1.519, 0.477)},
		{"In0.53Ga0.47As VBO", ga.VBO, b(0.53, -0.59, -0.80, -0.38)},
		{"In0.53Ga0.47As electron mass", ga.ElectronMass, b(0.53, 0.026, 0.067, 0.0091)},
		{"In0.53Ga0.47As Ep", ga.Kane, b(0.53, 21.5, 28.8, -1.48)},
		{"In0.53Ga0.47As heavy hole", ga.HeavyHoleMass(), b(0.53, 1/(20-17.0), 1/(6.98-4.12), -0.145)},
		{"In0.53Ga0.47As light hole", ga.LightHoleMass(), b(0.53, 1/(20+17.0), 1/(6.98+4.12), 0.0202)},
		{"In0.53Ga0.47As γ3", ga.Luttinger3, b(0.53, 9.2, 2.93, 0)},
		{"In0.52Al0.48As Γ gap 0 K", gap0(ia), b(0.52, 0.417, 3.099, 0.70)},
		{"In0.52Al0.48As VBO", ia.VBO, b(0.52, -0.59, -1.33, -0.64)},
		{"In0.52Al0.48As electron mass", ia.ElectronMass, b(0.52, 0.026, 0.15, 0.049)},
		{"In0.52Al0.48As Ep", ia.Kane, b(0.52, 21.5, 21.1, -4.81)},
		{"In0.52Al0.48As γ1", ia.Luttinger1, b(0.52, 20.0, 3.76, 0)},
	} {
		if !near(tc.got, tc.want, 1e-9) {
			t.Errorf("%s = %.10g, want %.10g (vmr Sec. IV)", tc.what, tc.got, tc.want)
		}
	}
	if al.Name != "Al0.3Ga0.7As" || ga.Name != "In0.53Ga0.47As" || ia.Name != "In0.52Al0.48As" {
		t.Errorf("names %q, %q, %q", al.Name, ga.Name, ia.Name)
	}
}

// TestAlloyFacts checks the alloys against facts of the trade.
func TestAlloyFacts(t *testing.T) {
	t.Parallel()
	ga, _ := tiltwell.InGaAs(0.53)
	ia, _ := tiltwell.InAlAs(0.52)
	// In0.53Ga0.47As has a 0.74–0.75 eV gap and In0.52Al0.48As about
	// 1.45 eV at room temperature (common practice, no source); the
	// compilation gives 0.7373 and 1.4507 eV.
	if g, _ := ga.Gap(300); !near(g, 0.745, 0.01) {
		t.Errorf("In0.53Ga0.47As gap at 300 K %.4f eV, want 0.74–0.75", g)
	}
	if g, _ := ia.Gap(300); !near(g, 1.45, 0.01) {
		t.Errorf("In0.52Al0.48As gap at 300 K %.4f eV, want about 1.45", g)
	}
	// Their conduction-band offset is about 0.5 eV, some 70% of the gap
	// difference (common practice, no source; from memory); the
	// compilation's VBOs give 0.522 eV.
	eg, _ := ga.Ec(300)
	ea, _ := ia.Ec(300)
	if d := ea - eg; !near(d, 0.51, 0.03) {
		t.Errorf("InGaAs/InAlAs conduction offset %.4f eV, want about 0.5", d)
	}
	// In0.53Ga0.47As: electron mass about 0.041–0.043 m₀ (common practice,
	// from memory); the compilation's bowing gives 0.0430.
	if m := ga.ElectronMass; !near(m, 0.042, 0.0015) {
		t.Errorf("In0.53Ga0.47As electron mass %.4f, want about 0.042", m)
	}
}

// TestOffsetSplit: the GaAs/Al_xGa_{1−x}As band-gap difference is split
// about 65/35 between the conduction and the valence band (common practice,
// no source). The compilation's VBOs (GaAs −0.80, AlAs −1.33 eV, linear in
// x) give 62/38 at x = 0.3: ΔEv = 0.159 eV of ΔEg = 0.418 eV.
func TestOffsetSplit(t *testing.T) {
	t.Parallel()
	al, _ := tiltwell.AlGaAs(0.3)
	gw, _ := tiltwell.GaAs().Gap(300)
	gb, _ := al.Gap(300)
	dv := tiltwell.GaAs().Ev() - al.Ev()
	split := 1 - dv/(gb-gw)
	if !near(dv, 0.3*0.53, 1e-12) || !near(split, 0.62, 0.005) || !near(split, 0.65, 0.04) {
		t.Errorf("ΔEv %.4f eV of ΔEg %.4f eV: conduction share %.3f, want 0.62 (compilation), about 0.65 (common practice)", dv, gb-gw, split)
	}
}

// TestLatticeMatch: In0.53Ga0.47As and In0.52Al0.48As are lattice-matched
// to InP (common practice, no source). From the lattice constants (vmr
// Sec. III) and Vegard's law the matched compositions are
// x = (a_InP − a_GaAs)/(a_InAs − a_GaAs) = 0.534 and
// (a_InP − a_AlAs)/(a_InAs − a_AlAs) = 0.525.
func TestLatticeMatch(t *testing.T) {
	t.Parallel()
	inp := tiltwell.InP()
	xGa := (5.8697 - 5.65325) / (6.0583 - 5.65325)
	xAl := (5.8697 - 5.6611) / (6.0583 - 5.6611)
	if !near(xGa, 0.53, 0.01) || !near(xAl, 0.52, 0.01) {
		t.Errorf("matched compositions %.4f, %.4f; want 0.53, 0.52", xGa, xAl)
	}
	for _, x := range []struct {
		alloy func(float64) (tiltwell.Material, error)
		x     float64
		tol   float64
	}{
		{tiltwell.InGaAs, 0.53, 4e-4}, {tiltwell.InAlAs, 0.52, 4e-4},
		{tiltwell.InGaAs, xGa, 1e-12}, {tiltwell.InAlAs, xAl, 1e-12},
	} {
		m, _ := x.alloy(x.x)
		mis, err := m.Mismatch(inp, 300)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(mis) > x.tol {
			t.Errorf("%s on InP: mismatch %.2e, want within %.0e", m.Name, mis, x.tol)
		}
	}
	// And the GaAs/AlAs system is nearly matched: +0.14% at 300 K.
	if mis, _ := tiltwell.AlAs().Mismatch(tiltwell.GaAs(), 300); !near(mis, (5.6611-5.65325)/5.65325, 1e-12) {
		t.Errorf("AlAs on GaAs: mismatch %.4e", mis)
	}
}

// TestIndirect: Al_xGa_{1−x}As becomes indirect near x ≈ 0.4–0.45 (common
// practice, no source) and AlAs is indirect through its X valley (vmr
// Sec. III B). With the compilation's parameters the crossover is at
// x = 0.411 at 300 K (the L valley; Γ–X alone at 0.435) and x = 0.417 at
// 4 K (the X valley).
func TestIndirect(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		m      func() tiltwell.Material
		T      float64
		ind    bool
		valley string
	}{
		{tiltwell.GaAs, 300, false, "Γ"},
		{tiltwell.InAs, 300, false, "Γ"},
		{tiltwell.InP, 300, false, "Γ"},
		{tiltwell.AlAs, 4, true, "X"},
		{tiltwell.AlAs, 300, true, "X"},
		{func() tiltwell.Material { m, _ := tiltwell.AlGaAs(0.3); return m }, 300, false, "Γ"},
		{func() tiltwell.Material { m, _ := tiltwell.AlGaAs(0.410); return m }, 300, false, "Γ"},
		{func() tiltwell.Material { m, _ := tiltwell.AlGaAs(0.412); return m }, 300, true, "L"},
		{func() tiltwell.Material { m, _ := tiltwell.AlGaAs(0.416); return m }, 4, false, "Γ"},
		{func() tiltwell.Material { m, _ := tiltwell.AlGaAs(0.418); return m }, 4, true, "X"},
		{func() tiltwell.Material { m, _ := tiltwell.AlGaAs(0.45); return m }, 300, true, "L"},
		{func() tiltwell.Material { m, _ := tiltwell.InGaAs(0.53); return m }, 300, false, "Γ"},
		{func() tiltwell.Material { m, _ := tiltwell.InAlAs(0.52); return m }, 300, false, "Γ"},
	} {
		m := tc.m()
		ind, valley, margin, err := m.Indirect(tc.T)
		if err != nil {
			t.Fatal(err)
		}
		if ind != tc.ind || valley != tc.valley || (margin > 0) != ind {
			t.Errorf("%s at %g K: indirect %v via %s (margin %.4f eV), want %v via %s", m.Name, tc.T, ind, valley, margin, tc.ind, tc.valley)
		}
	}
	// The Γ–X crossover alone at 300 K lies between 0.434 and 0.436.
	for x, below := range map[float64]bool{0.434: false, 0.436: true} {
		m, _ := tiltwell.AlGaAs(x)
		g, _ := m.Gap(300)
		if (m.X.At(300) < g) != below {
			t.Errorf("Al%gGaAs at 300 K: X %.4f, Γ %.4f eV", x, m.X.At(300), g)
		}
	}
}

func TestParseMaterial(t *testing.T) {
	t.Parallel()
	for spec, want := range map[string]string{
		"GaAs": "GaAs", "gaas": "GaAs", " InP ": "InP", "AlAs": "AlAs", "INAS": "InAs",
		"AlGaAs:0.3": "Al0.3Ga0.7As", "ingaas:0.53": "In0.53Ga0.47As", "InAlAs: 0.52": "In0.52Al0.48As",
		"AlGaAs:0": "Al0Ga1As", "AlGaAs:1": "Al1Ga0As",
	} {
		m, err := tiltwell.ParseMaterial(spec)
		if err != nil {
			t.Errorf("ParseMaterial(%q): %v", spec, err)
			continue
		}
		if m.Name != want {
			t.Errorf("ParseMaterial(%q) = %s, want %s", spec, m.Name, want)
		}
	}
	for _, spec := range []string{"", "Si", "GaN", "GaAs:0.3", "AlGaAs", "AlGaAs:", "AlGaAs:x", "AlGaAs:-0.1", "AlGaAs:1.2", "AlGaAs:NaN", "InGaAs:Inf", "InAlAs:2"} {
		_, err := tiltwell.ParseMaterial(spec)
		if !errors.Is(err, tiltwell.ErrUnits) {
			t.Errorf("ParseMaterial(%q): error %v, want ErrUnits", spec, err)
			continue
		}
		if name, _, _ := strings.Cut(spec, ":"); spec != "" && !strings.Contains(err.Error(), name) {
			t.Errorf("ParseMaterial(%q): error %q does not name the input", spec, err)
		}
	}
	if got := tiltwell.MaterialNames(); len(got) != 7 || got[0] != "GaAs" {
		t.Errorf("MaterialNames() = %v", got)
	}
	names := tiltwell.MaterialNames()
	names[0] = "changed"
	if tiltwell.MaterialNames()[0] != "GaAs" {
		t.Error("MaterialNames shares its slice")
	}
}

// TestMaterialErrors: compositions outside [0, 1] and temperatures
// outside (0, MaxTemperature] are errors naming the value.
func TestMaterialErrors(t *testing.T) {
	t.Parallel()
	for _, alloy := range []func(float64) (tiltwell.Material, error){tiltwell.AlGaAs, tiltwell.InGaAs, tiltwell.InAlAs} {
		for _, x := range []float64{-0.1, -1e-300, 1.0000001, 2, math.NaN(), math.Inf(1), math.Inf(-1)} {
			if _, err := alloy(x); !errors.Is(err, tiltwell.ErrUnits) || !strings.Contains(err.Error(), "composition") {
				t.Errorf("composition %v: error %v", x, err)
			}
		}
	}
	m := tiltwell.GaAs()
	sub := tiltwell.InP()
	for _, T := range []float64{0, -1, -300, math.NaN(), math.Inf(1), 1000.5, 1e300} {
		errs := map[string]error{}
		_, errs["Gap"] = m.Gap(T)
		_, errs["Ec"] = m.Ec(T)
		_, errs["LatticeAt"] = m.LatticeAt(T)
		_, _, _, errs["Indirect"] = m.Indirect(T)
		_, errs["Mismatch"] = m.Mismatch(sub, T)
		for name, err := range errs {
			if !errors.Is(err, tiltwell.ErrUnits) || !strings.Contains(err.Error(), "temperature") {
				t.Errorf("%s(%v): error %v", name, T, err)
			}
		}
	}
	if _, err := m.Gap(tiltwell.MaxTemperature); err != nil {
		t.Errorf("Gap(MaxTemperature): %v", err)
	}
}

// TestValidate: hand-made materials with unphysical parameters are refused.
func TestValidate(t *testing.T) {
	t.Parallel()
	for _, m := range []tiltwell.Material{tiltwell.GaAs(), tiltwell.AlAs(), tiltwell.InAs(), tiltwell.InP()} {
		if err := m.Validate(); err != nil {
			t.Errorf("%s: %v", m.Name, err)
		}
	}
	for x := 0.0; x <= 1; x += 0.05 {
		for _, alloy := range []func(float64) (tiltwell.Material, error){tiltwell.AlGaAs, tiltwell.InGaAs, tiltwell.InAlAs} {
			m, err := alloy(x)
			if err == nil {
				err = m.Validate()
			}
			if err != nil {
				t.Errorf("x = %g: %v", x, err)
			}
		}
	}
	nan := math.NaN()
	for what, spoil := range map[string]func(*tiltwell.Material){
		"composition":           func(m *tiltwell.Material) { m.Composition = 1.5 },
		"lattice constant":      func(m *tiltwell.Material) { m.Lattice = 0 },
		"lattice expansion":     func(m *tiltwell.Material) { m.LatticeExpansion = nan },
		"VBO":                   func(m *tiltwell.Material) { m.VBO = math.Inf(-1) },
		"electron mass":         func(m *tiltwell.Material) { m.ElectronMass = nan },
		"Luttinger parameter":   func(m *tiltwell.Material) { m.Luttinger2 = 4 },
		"Luttinger parameter γ": func(m *tiltwell.Material) { m.Luttinger3 = nan },
		"Kane energy":           func(m *tiltwell.Material) { m.Kane = -1 },
		"permittivity":          func(m *tiltwell.Material) { m.Permittivity = 0 },
		"Γ valley weight":       func(m *tiltwell.Material) { m.Gamma.Terms[0].Beta = -1 },
		"X valley weights' sum": func(m *tiltwell.Material) { m.X.Terms[1].Weight = 0.5 },
		"L valley weights' sum": func(m *tiltwell.Material) { m.L.Bow = nan },
	} {
		m := tiltwell.GaAs()
		spoil(&m)
		err := m.Validate()
		if !errors.Is(err, tiltwell.ErrUnits) || !strings.Contains(err.Error(), what) {
			t.Errorf("spoilt %s: error %v", what, err)
		}
	}
}

// FuzzParseMaterial: any spec gives an error or a valid material with a
// positive finite gap, never a panic.
func FuzzParseMaterial(f *testing.F) {
	for _, s := range []string{"GaAs", "AlGaAs:0.3", "InGaAs:0.53", "InAlAs:1e-300", "inp:", "AlGaAs:0x1p-2", ":", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, spec string) {
		m, err := tiltwell.ParseMaterial(spec)
		if err != nil {
			if !errors.Is(err, tiltwell.ErrUnits) {
				t.Fatalf("%q: error %v does not wrap ErrUnits", spec, err)
			}
			return
		}
		if err := m.Validate(); err != nil {
			t.Fatalf("%q: %v", spec, err)
		}
		if g, err := m.Gap(300); err != nil || !(g > 0) || math.IsInf(g, 0) {
			t.Fatalf("%q: gap %v, %v", spec, g, err)
		}
	})
}
