package bigstack

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"math/big"
	"strconv"
	"strings"
	"sync"

	"github.com/tiltwell/tiltwell"
	"github.com/tiltwell/tiltwell/exact/internal/bigairy"
)

// The reference table (exact/testdata/stack256.txt) is plain text, one
// record per line, fields separated by single spaces; lines starting with
// '#' are comments. In order:
//
//	format stack256/1 prec=256
//	stack NAME REF W:V:M W:V:M …
//	block NAME F K MORE
//	row NAME F N ETA GAMMA ROUTE
//	…
//	end ROWS BLOCKS
//
//   - stack defines the layer structure NAME: REF is the index of the
//     reference well, then one W:V:M (width, band edge in E₁, mass ratio,
//     as Go's shortest float64 text) per layer, left to right.
//   - block opens the levels of NAME at the reduced field F (float64
//     text): K rows follow, levels 1..K; MORE says whether level K+1
//     exists: "none" (K is [Count]), "cap" (more levels, beyond the
//     generator's cap of 10) or "unknown" (level K+1, or the count, is out
//     of the reference's range). Under a field the uphill side confines
//     levels above its band edge too (triangular states, thousands of
//     them at weak field), so "cap" is common for asymmetric wells.
//   - row gives level N: ETA is η_r and GAMMA is Γ, both in E₁ to 36
//     significant digits (ETA in Go 'e' format; GAMMA as d.ddd…e±X with a
//     decimal exponent of any size, or 0 for a bound state); ROUTE is
//     "bound", "newton" or "narrow" (see [Route]).
//   - end closes the file with the number of row and block lines, so a
//     truncated file is detected.
//
// Rows appear in the order of their blocks, each block's rows in order of
// N. [ReadTable] parses it.

// TablePrec is the precision in bits of the reference table.
const TablePrec = 256

// tableDigits is the number of significant digits printed.
const tableDigits = 36

// levelCap is the largest level number the generator writes per block.
const levelCap = 10

// Structure is a named layer structure of the reference table with its
// fields.
type Structure struct {
	Name   string
	Layers []Layer
	Ref    int
	Fields []float64
}

var (
	posFields  = []float64{0, 1e-6, 1e-3, 0.1, 0.5, 1, 2, 3, 5, 10}
	bothFields = []float64{-10, -5, -3, -2, -1, -0.5, -0.1, -1e-3, -1e-6, 0, 1e-6, 1e-3, 0.1, 0.5, 1, 2, 3, 5, 10}
)

// Structures returns the structures of the reference table: symmetric
// single wells (barrier v ∈ {2, 4.3, 10, 50, 300} E₁, barrier mass ratio
// {1, 1.37, 2}) at f ≥ 0 (their levels are even in f), asymmetric single
// wells, a symmetric double well (barrier | well | thin barrier | well |
// barrier, the reference the left well) and a stepped well at both signs
// of f. The structures are invented for the test; they are not devices.
func Structures() []Structure {
	var out []Structure
	for _, v := range []float64{2, 4.3, 10, 50, 300} {
		for _, mu := range []float64{1, 1.37, 2} {
			out = append(out, Structure{
				Name:   fmt.Sprintf("sym-v%g-m%g", v, mu),
				Layers: []Layer{{0, v, mu}, {1, 0, 1}, {0, v, mu}},
				Ref:    1, Fields: posFields,
			})
		}
	}
	for _, a := range [][4]float64{{2, 1, 10, 1.37}, {4.3, 1.37, 50, 2}, {10, 2, 300, 1}} {
		out = append(out, Structure{
			Name:   fmt.Sprintf("asym-v%g-m%g-v%g-m%g", a[0], a[1], a[2], a[3]),
			Layers: []Layer{{0, a[0], a[1]}, {1, 0, 1}, {0, a[2], a[3]}},
			Ref:    1, Fields: bothFields,
		})
	}
	out = append(out, Structure{
		Name:   "double-v10-m1.37-b0.2",
		Layers: []Layer{{0, 10, 1.37}, {1, 0, 1}, {0.2, 10, 1.37}, {1, 0, 1}, {0, 10, 1.37}},
		Ref:    1, Fields: bothFields,
	}, Structure{
		Name:   "step-v10-m1.37-s0.5-v3-m1.1",
		Layers: []Layer{{0, 10, 1.37}, {1, 0, 1}, {0.5, 3, 1.1}, {0, 10, 1.37}},
		Ref:    1, Fields: bothFields,
	})
	return out
}

// Block is the levels of one structure at one field.
type Block struct {
	Stack string
	F     float64
	// More is "none", "cap" or "unknown" (see the file format).
	More string
	Rows []Row
	// lines are the row lines as written (generator only).
	lines []string
}

// Row is one level of the reference table.
type Row struct {
	Stack string
	F     float64
	N     int
	// EtaText and GammaText are the fields as printed.
	EtaText, GammaText string
	// Eta is η_r parsed at 160 bits.
	Eta *big.Float
	// Gamma is Γ parsed at 160 bits, 0 for a bound state, nil if its
	// decimal exponent is beyond big.Float's range (below about 1e-6e8);
	// Log10Gamma holds it then.
	Gamma *big.Float
	// Log10Gamma is log₁₀ Γ (−Inf for a bound state).
	Log10Gamma float64
	Route      Route
}

// EtaFloat64 returns η_r rounded to float64.
func (r Row) EtaFloat64() float64 { return f64(r.Eta) }

// GammaFloat64 returns Γ rounded to float64 (0 if it underflows).
func (r Row) GammaFloat64() float64 {
	if r.Gamma == nil {
		return 0
	}
	return f64(r.Gamma)
}

// Table is a parsed reference table.
type Table struct {
	Stacks map[string]Structure // Fields is empty: the blocks say which fields
	Blocks []Block
}

// Rows returns every row in file order.
func (t *Table) Rows() []Row {
	var out []Row
	for _, b := range t.Blocks {
		out = append(out, b.Rows...)
	}
	return out
}

func fmtFloat(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

// formatStack returns the stack line of s.
func formatStack(s Structure) string {
	var b strings.Builder
	fmt.Fprintf(&b, "stack %s %d", s.Name, s.Ref)
	for _, l := range s.Layers {
		fmt.Fprintf(&b, " %s:%s:%s", fmtFloat(l.Width), fmtFloat(l.Edge), fmtFloat(l.Mass))
	}
	return b.String()
}

// FormatRow returns the row line of level r of structure name at field f.
func FormatRow(name string, f float64, r *Resonance) string {
	g := "0"
	if r.Route != RouteBound {
		g = formatPow10(r.Log10Gamma, tableDigits)
	}
	return fmt.Sprintf("row %s %s %d %s %s %s", name, fmtFloat(f), r.N, r.Eta.Text('e', tableDigits-1), g, r.Route)
}

// formatPow10 prints 10^lg with the given significant digits as
// d.ddd…e±X, for a decimal exponent of any size.
func formatPow10(lg *big.Float, digits int) string {
	wp := lg.Prec() + 64
	e := newf(wp).Set(lg)
	ei, _ := e.Int(nil) // truncation towards zero
	E := newf(wp).SetInt(ei)
	if E.Cmp(lg) > 0 {
		E.Sub(E, fint(1, wp))
	}
	frac := newf(wp).Sub(lg, E)
	frac.Mul(frac, bigairy.Log(fint(10, wp), wp))
	m := bigairy.Exp(frac, wp)
	s := m.Text('f', digits-1)
	exp, _ := E.Int64()
	if strings.HasPrefix(s, "10") {
		m.Quo(m, fint(10, wp))
		s = m.Text('f', digits-1)
		exp++
	}
	return s + "e" + strconv.FormatInt(exp, 10)
}

// levelsOf computes the block of s at f: levels 1.. up to the cap.
func levelsOf(s Structure, f float64) (Block, error) {
	b := Block{Stack: s.Name, F: f}
	for n := 1; n <= levelCap; n++ {
		r, err := Level(s.Layers, s.Ref, f, n, TablePrec)
		if err != nil {
			if _, ok := tiltwell.Confined(err); ok {
				b.More = "none"
				return b, nil
			}
			if errors.Is(err, tiltwell.ErrOutOfRange) {
				b.More = "unknown"
				return b, nil
			}
			return b, fmt.Errorf("%s f=%g n=%d: %w", s.Name, f, n, err)
		}
		b.lines = append(b.lines, FormatRow(s.Name, f, r))
	}
	switch k, err := Count(s.Layers, s.Ref, f); {
	case err != nil:
		b.More = "unknown"
	case k > levelCap:
		b.More = "cap"
	default:
		b.More = "none"
	}
	return b, nil
}

// WriteTable computes the reference table of [Structures] with up to
// workers goroutines and writes it to w in the format above. It takes a
// few minutes on two cores.
func WriteTable(w io.Writer, workers int) error {
	ss := Structures()
	type job struct {
		s Structure
		f float64
	}
	var jobs []job
	for _, s := range ss {
		for _, f := range s.Fields {
			jobs = append(jobs, job{s, f})
		}
	}
	blocks := make([]Block, len(jobs))
	errs := make([]error, len(jobs))
	var wg sync.WaitGroup
	sem := make(chan struct{}, max(1, workers))
	for i := range jobs {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer wg.Done()
			defer func() { <-sem }()
			blocks[i], errs[i] = levelsOf(jobs[i].s, jobs[i].f)
		}()
	}
	wg.Wait()
	if err := errors.Join(errs...); err != nil {
		return err
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintln(bw, "# Reference quasi-bound levels η = η_r − iΓ/2 (E₁) of layered wells under a field f (F₀):")
	fmt.Fprintln(bw, "#   H = −(1/π²) d/dξ (1/μ) d/dξ + v(ξ) + f(ξ − ½), reference well on [0, 1], BenDaniel–Duke interfaces,")
	fmt.Fprintln(bw, "#   decaying Ai uphill, outgoing Ai − iBi downhill (f < 0: the mirrored stack).")
	fmt.Fprintln(bw, "# Computed at 256 bits by exact/internal/bigstack (Taylor shooting in ξ, Airy boundary conditions,")
	fmt.Fprintln(bw, "# complex Newton where Γ ≥ 1e-310, else the first-order narrow width); independent of package exact.")
	fmt.Fprintln(bw, "# Regenerate with: go run ./internal/cmd/stackref > testdata/stack256.txt (from exact/).")
	fmt.Fprintln(bw, "# Format: see the comment at the top of exact/internal/bigstack/table.go. Structures are invented.")
	fmt.Fprintf(bw, "format stack256/1 prec=%d\n", TablePrec)
	for _, s := range ss {
		fmt.Fprintln(bw, formatStack(s))
	}
	rows := 0
	for _, b := range blocks {
		fmt.Fprintf(bw, "block %s %s %d %s\n", b.Stack, fmtFloat(b.F), len(b.lines), b.More)
		for _, l := range b.lines {
			fmt.Fprintln(bw, l)
			rows++
		}
	}
	fmt.Fprintf(bw, "end %d %d\n", rows, len(blocks))
	return bw.Flush()
}

// ReadTable reads a reference table in the format above. It returns an
// error naming the line for a malformed line, a row outside its block, an
// unknown stack, or a missing or inconsistent end line (a truncated file).
func ReadTable(r io.Reader) (*Table, error) {
	t := &Table{Stacks: map[string]Structure{}}
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 1<<16), 1<<20)
	line := 0
	rows, pending := 0, 0
	ended, formatSeen := false, false
	bad := func(format string, a ...any) error {
		return fmt.Errorf("bigstack: table line %d: %s", line, fmt.Sprintf(format, a...))
	}
	for sc.Scan() {
		line++
		text := sc.Text()
		if text == "" || text[0] == '#' {
			continue
		}
		if ended {
			return nil, bad("data after the end line")
		}
		fs := strings.Fields(text)
		switch fs[0] {
		case "format":
			if len(fs) < 2 || fs[1] != "stack256/1" {
				return nil, bad("unknown format %q", text)
			}
			formatSeen = true
		case "stack":
			if len(fs) < 6 {
				return nil, bad("stack needs a name, a reference index and at least 3 layers")
			}
			ref, err := strconv.Atoi(fs[2])
			if err != nil {
				return nil, bad("reference index: %v", err)
			}
			var ls []Layer
			for _, f := range fs[3:] {
				p := strings.Split(f, ":")
				if len(p) != 3 {
					return nil, bad("layer %q is not W:V:M", f)
				}
				var v [3]float64
				for i := range p {
					if v[i], err = strconv.ParseFloat(p[i], 64); err != nil {
						return nil, bad("layer %q: %v", f, err)
					}
				}
				ls = append(ls, Layer{v[0], v[1], v[2]})
			}
			if err := checkLayers(ls, ref); err != nil {
				return nil, bad("%v", err)
			}
			t.Stacks[fs[1]] = Structure{Name: fs[1], Layers: ls, Ref: ref}
		case "block":
			if pending != 0 {
				return nil, bad("block opened with %d rows of the previous block missing", pending)
			}
			if len(fs) != 5 {
				return nil, bad("block needs NAME F K MORE")
			}
			if _, ok := t.Stacks[fs[1]]; !ok {
				return nil, bad("unknown stack %q", fs[1])
			}
			f, err := strconv.ParseFloat(fs[2], 64)
			if err != nil {
				return nil, bad("field: %v", err)
			}
			k, err := strconv.Atoi(fs[3])
			if err != nil || k < 0 {
				return nil, bad("row count %q", fs[3])
			}
			if fs[4] != "none" && fs[4] != "cap" && fs[4] != "unknown" {
				return nil, bad("MORE %q is not none, cap or unknown", fs[4])
			}
			t.Blocks = append(t.Blocks, Block{Stack: fs[1], F: f, More: fs[4]})
			pending = k
		case "row":
			if pending == 0 {
				return nil, bad("row outside a block")
			}
			row, err := parseRow(fs)
			if err != nil {
				return nil, bad("%v", err)
			}
			b := &t.Blocks[len(t.Blocks)-1]
			if row.Stack != b.Stack || row.F != b.F || row.N != len(b.Rows)+1 {
				return nil, bad("row %s f=%g n=%d does not continue block %s f=%g", row.Stack, row.F, row.N, b.Stack, b.F)
			}
			b.Rows = append(b.Rows, row)
			pending--
			rows++
		case "end":
			if len(fs) != 3 {
				return nil, bad("end needs ROWS BLOCKS")
			}
			nr, err1 := strconv.Atoi(fs[1])
			nb, err2 := strconv.Atoi(fs[2])
			if err1 != nil || err2 != nil || nr != rows || nb != len(t.Blocks) || pending != 0 {
				return nil, bad("end says %s rows, %s blocks; read %d rows, %d blocks (%d rows missing)", fs[1], fs[2], rows, len(t.Blocks), pending)
			}
			ended = true
		default:
			return nil, bad("unknown record %q", fs[0])
		}
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("bigstack: reading table: %w", err)
	}
	if !formatSeen || !ended {
		return nil, fmt.Errorf("bigstack: table truncated after line %d (no format or end line)", line)
	}
	return t, nil
}

// parseRow parses the fields of a row line.
func parseRow(fs []string) (Row, error) {
	if len(fs) != 7 {
		return Row{}, fmt.Errorf("row needs NAME F N ETA GAMMA ROUTE, got %d fields", len(fs)-1)
	}
	r := Row{Stack: fs[1], EtaText: fs[4], GammaText: fs[5]}
	var err error
	if r.F, err = strconv.ParseFloat(fs[2], 64); err != nil {
		return r, err
	}
	if r.N, err = strconv.Atoi(fs[3]); err != nil || r.N < 1 {
		return r, fmt.Errorf("level %q", fs[3])
	}
	if r.Eta, _, err = big.ParseFloat(fs[4], 10, 160, big.ToNearestEven); err != nil {
		return r, fmt.Errorf("eta %q: %v", fs[4], err)
	}
	switch fs[6] {
	case "bound":
		r.Route = RouteBound
	case "newton":
		r.Route = RouteNewton
	case "narrow":
		r.Route = RouteNarrow
	default:
		return r, fmt.Errorf("route %q", fs[6])
	}
	if fs[5] == "0" {
		if r.Route != RouteBound {
			return r, fmt.Errorf("gamma 0 on a %s row", r.Route)
		}
		r.Gamma, r.Log10Gamma = newf(160), math.Inf(-1)
		return r, nil
	}
	i := strings.IndexByte(fs[5], 'e')
	if i < 0 {
		return r, fmt.Errorf("gamma %q has no exponent", fs[5])
	}
	mant, _, err := big.ParseFloat(fs[5][:i], 10, 160, big.ToNearestEven)
	if err != nil || mant.Sign() <= 0 {
		return r, fmt.Errorf("gamma mantissa %q", fs[5][:i])
	}
	exp, err := strconv.ParseInt(fs[5][i+1:], 10, 64)
	if err != nil {
		return r, fmt.Errorf("gamma exponent %q: %v", fs[5][i+1:], err)
	}
	r.Log10Gamma = math.Log10(f64(mant)) + float64(exp)
	// big.Float's binary exponent is an int32: 10^exp fits for
	// |exp| < 6.4e8.
	if exp > -640000000 && exp < 640000000 {
		r.Gamma = mant.Mul(mant, pow10(exp, 192)).SetPrec(160)
	}
	return r, nil
}

// pow10 returns 10^e by binary powering at precision prec (relative error
// about log₂|e| units of 2^-prec).
func pow10(e int64, prec uint) *big.Float {
	neg := e < 0
	if neg {
		e = -e
	}
	r := fint(1, prec)
	b := fint(10, prec)
	for ; e > 0; e >>= 1 {
		if e&1 == 1 {
			r.Mul(r, b)
		}
		b.Mul(b, b)
	}
	if neg {
		r.Quo(fint(1, prec), r)
	}
	return r
}
