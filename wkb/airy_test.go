package wkb

import (
	"fmt"
	"math"
	"testing"
)

// airyTol is the accuracy asked of the internal Airy evaluation: far below
// the 1e-10 a WKB wavefunction needs, and below the error floor of the
// improved rule's connection phase.
const airyTol = 1e-14

// airyAiBi returns Ai(x) and Bi(x) on the table range by a Taylor step from
// the nearest node: an evaluation independent of the tabulated series of θ
// and M².
func airyAiBi(x float64) (ai, bi float64) {
	tab := airyTable()
	nd := tab[int(math.Round((x-airyLo)/airyStep))]
	ai, _ = taylorStep(nd.x, nd.ai, nd.aip, x-nd.x)
	bi, _ = taylorStep(nd.x, nd.bi, nd.bip, x-nd.x)
	return ai, bi
}

func relDiff(got, want float64) float64 {
	return math.Abs(got-want) / math.Max(math.Abs(want), 1e-300)
}

// Values: at x = 0 the closed forms of DLMF 9.2.3–9.2.6
// (https://dlmf.nist.gov/9.2), Ai(0) = 1/(3^(2/3) Γ(2/3)) and so on; at
// x = ±1, ±5 computed independently at high precision (mpmath, 17 digits
// kept; no published table was used).
func TestAiryValues(t *testing.T) {
	t.Parallel()
	tests := []struct {
		x, ai, aip, bi, bip float64
	}{
		{0, 0.35502805388781723926, -0.25881940379280679841, 0.61492662744600073515, 0.44828835735382635791},
		{-5, 0.35076100902411432, 0.32719281855444314, -0.13836913490160058, 0.77841177300189925},
		{-1, 0.53556088329235212, -0.010160567116645209, 0.10399738949694461, 0.59237562642279235},
		{1, 0.13529241631288142, -0.15914744129679321, 1.2074235949528713, 0.93243593339277563},
		{5, 1.0834442813607442e-4, -2.4741389086846248e-4, 657.79204417117118, 1435.8190802179825},
	}
	tab := airyTable()
	for _, tt := range tests {
		t.Run(fmt.Sprintf("x=%g", tt.x), func(t *testing.T) {
			t.Parallel()
			nd := tab[int(math.Round((tt.x-airyLo)/airyStep))]
			if nd.x != tt.x {
				t.Fatalf("node at %g, want %g", nd.x, tt.x)
			}
			for _, c := range []struct {
				name      string
				got, want float64
			}{{"Ai", nd.ai, tt.ai}, {"Ai'", nd.aip, tt.aip}, {"Bi", nd.bi, tt.bi}, {"Bi'", nd.bip, tt.bip}} {
				// On x < 0 compare against the modulus: the functions oscillate.
				scale := math.Abs(c.want)
				if tt.x < 0 {
					scale = 1
				}
				if d := math.Abs(c.got-c.want) / scale; d > airyTol {
					t.Errorf("%s(%g) = %.17g, want %.17g (error %.2g)", c.name, tt.x, c.got, c.want, d)
				}
			}
			th, m2 := airyTab(tt.x)
			if th != nd.theta || m2 != nd.ai*nd.ai+nd.bi*nd.bi {
				t.Errorf("airyTab(%g) = %g, %g, node holds θ = %g, M² = %g", tt.x, th, m2, nd.theta, nd.ai*nd.ai+nd.bi*nd.bi)
			}
		})
	}
}

// The two directions of the table meet: Ai stepped back from x = 12 must
// land on the closed form of DLMF 9.2.3 at 0, and every node must satisfy
// the Wronskian W{Ai, Bi} = 1/π (DLMF 9.2.7).
func TestAiryTableConsistency(t *testing.T) {
	t.Parallel()
	tab := airyTable()
	i0 := int(-airyLo / airyStep)
	p := tab[i0+1]
	ai, aip := taylorStep(p.x, p.ai, p.aip, -airyStep)
	if d := relDiff(ai, tab[i0].ai); d > airyTol {
		t.Errorf("Ai(0) stepped back from %g = %.17g, closed form %.17g (rel %.2g)", airyHi, ai, tab[i0].ai, d)
	}
	if d := relDiff(aip, tab[i0].aip); d > airyTol {
		t.Errorf("Ai'(0) stepped back = %.17g, closed form %.17g (rel %.2g)", aip, tab[i0].aip, d)
	}
	for _, nd := range tab {
		w := nd.ai*nd.bip - nd.aip*nd.bi
		// On x > 0 the products are of size Ai Bi′ ~ √x/(2π); rounding is
		// relative to that.
		if d := math.Abs(w-1/math.Pi) * math.Pi; d > airyTol {
			t.Errorf("x=%g: W{Ai,Bi} = %.17g, want 1/π (rel %.2g)", nd.x, w, d)
		}
	}
}

// Modulus and phase (DLMF 9.8.1–9.8.4, https://dlmf.nist.gov/9.8: Ai =
// M sin θ, Bi = M cos θ, θ(0) = π/6), values computed independently at
// high precision (mpmath); θ(a_k) = kπ at the zeros of Ai (DLMF 9.9.1)
// with a_k from DLMF Table 9.9.1 (https://dlmf.nist.gov/9.9#T1), which
// are not table nodes.
func TestAiryModulusPhase(t *testing.T) {
	t.Parallel()
	for _, tt := range []struct{ x, m, theta float64 }{
		{0, 0.710056107775634479, math.Pi / 6},
		{-1, 0.545564768597701525, 1.37899921506759781},
		{-5, 0.377066708879254078, 8.22972265088822221},
		{-10, 0.317242419073487239, 21.8639589573365545},
	} {
		th, m2 := airyTheta(tt.x)
		if d := relDiff(math.Sqrt(m2), tt.m); d > airyTol {
			t.Errorf("M(%g) = %.17g, want %.17g (rel %.2g)", tt.x, math.Sqrt(m2), tt.m, d)
		}
		if d := math.Abs(th - tt.theta); d > airyTol*tt.theta+airyTol {
			t.Errorf("θ(%g) = %.17g, want %.17g (diff %.2g)", tt.x, th, tt.theta, d)
		}
	}
	zeros := []float64{-2.338107410459767, -4.0879494441309706, -5.5205598280955511, -6.786708090071759,
		-7.9441335871208531, -9.0226508533409804, -10.040174341558086, -11.008524303733263,
		-11.936015563236263, -12.828776752865757}
	for k, a := range zeros {
		th, _ := airyTheta(a)
		// The zeros are given to 16–17 digits: θ′ ≈ √|a| turns that into a
		// phase uncertainty of a few 1e-16 |a|^(3/2).
		tol := airyTol + 4e-16*math.Abs(a)*math.Sqrt(-a)
		if d := math.Abs(th - float64(k+1)*math.Pi); d > tol {
			t.Errorf("θ(a_%d = %g) = %.17g, want %d π (diff %.2g)", k+1, a, th, k+1, d)
		}
	}
	// Ai at the zeros of Ai′, a′_k and Ai(a′_k) from DLMF Table 9.9.1, again
	// off the nodes.
	for _, tt := range []struct{ x, ai float64 }{
		{-1.0187929716474711, 0.5356566560156999},
		{-3.2481975821798365, -0.419015478032564},
		{-7.3721772550477702, 0.3423012444116238},
		{-12.384788371845747, -0.3007308293226446},
	} {
		ai, _ := airyAiBi(tt.x)
		if d := math.Abs(ai - tt.ai); d > 1e-15*16 {
			t.Errorf("Ai(%g) = %.17g, want %.16g (diff %.2g)", tt.x, ai, tt.ai, d)
		}
	}
}

// The table and the asymptotic expansions are independent; they must agree
// where they meet (and a little inside the table), to the accuracy of the
// expansions there (DLMF 9.7.5, 9.7.7, 9.7.9: smallest term ~ e^(−2ζ)).
func TestAiryTableMeetsAsymptotics(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{airyLo, airyLo + 0.3, airyLo + 1.1} {
		th, m2 := airyTheta(x) // table when x ≥ airyLo
		beta, m2a, z := airyNeg(x)
		tha := math.Pi/4 + z - beta
		if d := math.Abs(th - tha); d > airyTol*th {
			t.Errorf("x=%g: θ table %.17g, asymptotic %.17g (diff %.2g)", x, th, tha, d)
		}
		if d := relDiff(m2, m2a); d > airyTol {
			t.Errorf("x=%g: M² table %.17g, asymptotic %.17g (rel %.2g)", x, m2, m2a, d)
		}
	}
	for _, x := range []float64{airyHi - 1.3, airyHi - 0.1, airyHi} {
		ai, bi := airyAiBi(x)
		as, bs, z := airyScaledPos(x)
		if d := relDiff(ai, as*math.Exp(-z)); d > airyTol {
			t.Errorf("x=%g: Ai table %.17g, asymptotic %.17g (rel %.2g)", x, ai, as*math.Exp(-z), d)
		}
		if d := relDiff(bi, bs*math.Exp(z)); d > airyTol {
			t.Errorf("x=%g: Bi table %.17g, asymptotic %.17g (rel %.2g)", x, bi, bs*math.Exp(z), d)
		}
	}
}

// χ = θ − ζ̄ is continuous at the table edges and at 0, lies in (0, π/4),
// and its derivative matches a central difference.
func TestAiryChi(t *testing.T) {
	t.Parallel()
	chi0, _ := airyChi(0)
	if math.Abs(chi0-math.Pi/6) > airyTol {
		t.Errorf("χ(0) = %.17g, want π/6", chi0)
	}
	for _, x := range []float64{airyLo, airyHi} {
		a, _ := airyChi(math.Nextafter(x, math.Inf(-1)))
		b, _ := airyChi(math.Nextafter(x, math.Inf(1)))
		if math.Abs(a-b) > airyTol {
			t.Errorf("χ jumps by %.2g at x = %g", a-b, x)
		}
	}
	for x := -40.0; x <= 20; x += 0.37 {
		c, d := airyChi(x)
		if !(c > 0 && c < math.Pi/4) {
			t.Errorf("χ(%g) = %g outside (0, π/4)", x, c)
		}
		h := 1e-4
		cp, _ := airyChi(x + h)
		cm, _ := airyChi(x - h)
		fd := (cp - cm) / (2 * h)
		if math.Abs(fd-d) > 1e-7*(1+math.Abs(d)) {
			t.Errorf("χ′(%g) = %.10g, central difference %.10g", x, d, fd)
		}
	}
}

// The coefficients of DLMF 9.7.2 by recurrence against their closed forms:
// u_1 = 5/72, u_2 = 5·7·9·11/(216²·2!) (DLMF 9.7.2,
// https://dlmf.nist.gov/9.7).
func TestAiryCoefficients(t *testing.T) {
	t.Parallel()
	c := airyCoefs()
	if d := relDiff(c.u[1], 5.0/72); d > 1e-15 {
		t.Errorf("u_1 = %.17g, want 5/72", c.u[1])
	}
	if d := relDiff(c.u[2], 5*7*9*11/(216*216*2.0)); d > 1e-15 {
		t.Errorf("u_2 = %.17g", c.u[2])
	}
	if d := relDiff(c.v[1], -7.0/5*5/72); d > 1e-15 {
		t.Errorf("v_1 = %.17g, want −7/72", c.v[1])
	}
}

// The tabulated series of θ and M² agree with θ = atan2(Ai, Bi) and
// M² = Ai² + Bi² (DLMF 9.8.3, 9.8.4) from the functions themselves, off the
// nodes, across the table.
func TestAiryTableSeries(t *testing.T) {
	t.Parallel()
	for x := airyLo + 0.01; x < airyHi; x += 0.173 {
		ai, bi := airyAiBi(x)
		th, m2 := airyTab(x)
		want := math.Atan2(ai, bi)
		want += 2 * math.Pi * math.Round((th-want)/(2*math.Pi))
		// θ is compared in absolute terms on x < 0 and relative on x > 0,
		// where it is Ai/Bi and tiny.
		scale := math.Max(1, math.Abs(th))
		if x > 0 {
			scale = want
		}
		if d := math.Abs(th-want) / scale; d > airyTol {
			t.Errorf("x=%.3f: θ series %.17g, atan2 %.17g (rel %.2g)", x, th, want, d)
		}
		if d := relDiff(m2, ai*ai+bi*bi); d > airyTol {
			t.Errorf("x=%.3f: M² series %.17g, Ai²+Bi² %.17g (rel %.2g)", x, m2, ai*ai+bi*bi, d)
		}
	}
}
