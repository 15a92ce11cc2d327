// Package exact is the exact reference for the tilted quantum well: the
// levels, wavefunctions and dipoles of the well with infinitely high walls,
//
//	H = −(1/π²) d²/dξ² + f (ξ − ½),   φ(0) = φ(1) = 0,
//
// from the Airy-function solution, to full float64 accuracy, for any level
// up to [MaxLevels] and any field |f| ≤ [MaxField]; and, for a
// [tiltwell.Stack] of finite barriers and layers (Solver.Stack), of the
// BenDaniel–Duke model
//
//	H = −(1/π²) d/dξ (1/μ) d/dξ + v(ξ) + f (ξ − ½),
//
// whose levels under a field are quasi-bound, η_r − iΓ/2, with the escape
// width Γ from 1e-300 to the broad resonances near ionisation (see
// [Solver]). Every other method in tiltwell is tested against it, and
// [Check] holds any solver of either model against it.
//
// The package also exports the real-argument Airy functions it is built on
// ([Airy], [AiryScaled], [ModulusPhase], [AiZero]), accurate to a few units
// in the last place (relative to the modulus where they oscillate; see
// [Airy]), from a node table computed at 256-bit precision (the generators
// are internal/cmd/airygen and thetagen; `go generate` rewrites the tables).
//
// # Reference table files
//
// [Table.WriteTo] and [ReadTable] keep a [Table] of levels in a text file,
// version 2 of this format. A table file is UTF-8 text, one record per
// line, each line ending in "\n" (a "\r" before it is ignored):
//
//	tiltwell-levels v2: f n energy err (f in F₀; energy, err in E₁)
//	# a note, any number of lines starting with '#'
//	10	1	0.06602629575509052	2.539022520861924e-15
//	10	2	4.181870005637617	4.255949771308553e-15
//	end 2
//
// The first line must begin with "tiltwell-levels v2" followed by a colon,
// a space or the line end. Lines starting with '#' are comments, which make
// up [Table.Note]; blank lines are ignored. Every other line but the last
// has four fields separated by spaces or tabs: the reduced field f, the
// level number n, the reduced energy η and the reference's error estimate,
// in units of E₁. The numbers f, η and the estimate are written by
// [strconv.FormatFloat] with format 'g' and precision −1, the shortest text
// that [strconv.ParseFloat] turns back into the same float64, so the round
// trip is lossless; n is a decimal integer. The levels of one field are
// consecutive lines with n = 1, 2, …, k; each field appears once, and the
// fields may come in any order and have different k.
//
// The last line is "end N", N the number of level lines, followed by its
// newline and nothing else: a file cut anywhere, even in the middle of a
// number, lacks it, has a different N or lacks the final newline, and
// [ReadTable] refuses it. Version 1 had no end line, so a cut file could
// pass for a whole one; ReadTable refuses version 1 and says how to
// convert a file known to be whole (change v1 to v2, add the end line).
//
// A line is at most [MaxTableLine] bytes; a table has at most
// [MaxTableFields] fields, [MaxLevels] levels at one field and
// [MaxTableRows] in all, and a note of at most [MaxTableNote] bytes.
//
// References:
//   - NIST Digital Library of Mathematical Functions, chapter 9 (Airy and
//     related functions), https://dlmf.nist.gov/9, equations cited where
//     used.
//   - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
//     §10.4 (Airy functions), Table 10.13 (zeros).
package exact
