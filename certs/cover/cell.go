package cover

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"math/big"
	"strings"

	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// Box is a closed box of parameter values with exact rational bounds: Lo[j]
// < Hi[j] for parameter j of the family.
type Box struct {
	Lo, Hi []*big.Rat
}

// Box returns the whole parameter box of the family.
func (f *Family) Box() Box {
	b := Box{}
	for _, p := range f.Params {
		b.Lo = append(b.Lo, new(big.Rat).Set(p.Lo))
		b.Hi = append(b.Hi, new(big.Rat).Set(p.Hi))
	}
	return b
}

// Roots returns the boxes of the first split: parameter j's range cut into
// Count equal parts, in the order of the Cartesian product with the first
// parameter varying slowest (root k = Σ_j i_j·Π_{l>j} Count_l).
func (f *Family) Roots() []Box {
	total := 1
	for _, p := range f.Params {
		total *= p.Count
	}
	roots := make([]Box, total)
	for k := range roots {
		rem := k
		idx := make([]int, len(f.Params))
		for j := len(f.Params) - 1; j >= 0; j-- {
			idx[j] = rem % f.Params[j].Count
			rem /= f.Params[j].Count
		}
		for j, p := range f.Params {
			step := new(big.Rat).Sub(p.Hi, p.Lo)
			step.Quo(step, big.NewRat(int64(p.Count), 1))
			lo := new(big.Rat).Mul(step, big.NewRat(int64(idx[j]), 1))
			lo.Add(lo, p.Lo)
			hi := new(big.Rat).Add(lo, step)
			if idx[j] == p.Count-1 {
				hi.Set(p.Hi)
			}
			roots[k].Lo = append(roots[k].Lo, lo)
			roots[k].Hi = append(roots[k].Hi, hi)
		}
	}
	return roots
}

// Width returns Hi[j] − Lo[j].
func (b Box) Width(j int) *big.Rat { return new(big.Rat).Sub(b.Hi[j], b.Lo[j]) }

// Measure returns the product of the widths.
func (b Box) Measure() *big.Rat {
	m := big.NewRat(1, 1)
	for j := range b.Lo {
		m.Mul(m, b.Width(j))
	}
	return m
}

// Equal reports whether the boxes have the same bounds.
func (b Box) Equal(c Box) bool {
	if len(b.Lo) != len(c.Lo) {
		return false
	}
	for j := range b.Lo {
		if b.Lo[j].Cmp(c.Lo[j]) != 0 || b.Hi[j].Cmp(c.Hi[j]) != 0 {
			return false
		}
	}
	return true
}

// Inside reports whether b ⊆ c.
func (b Box) Inside(c Box) bool {
	for j := range b.Lo {
		if b.Lo[j].Cmp(c.Lo[j]) < 0 || b.Hi[j].Cmp(c.Hi[j]) > 0 {
			return false
		}
	}
	return true
}

// splitParam returns the parameter in which the family bisects b: among
// the parameters whose width exceeds their min_cell, the one with the
// largest ratio width/min_cell (the first on ties); −1 when every width
// is at most its min_cell (the cell has reached min_cell and is not
// split).
func (f *Family) splitParam(b Box) int {
	best := -1
	var bestRatio *big.Rat
	for j, p := range f.Params {
		w := b.Width(j)
		if w.Cmp(p.MinCell) <= 0 {
			continue
		}
		r := w.Quo(w, p.MinCell)
		if best < 0 || r.Cmp(bestRatio) > 0 {
			best, bestRatio = j, r
		}
	}
	return best
}

// bisect returns the two halves of b in parameter j (lower half first).
func (b Box) bisect(j int) (Box, Box) {
	mid := new(big.Rat).Add(b.Lo[j], b.Hi[j])
	mid.Quo(mid, big.NewRat(2, 1))
	lower, upper := b.clone(), b.clone()
	lower.Hi[j] = mid
	upper.Lo[j] = new(big.Rat).Set(mid)
	return lower, upper
}

func (b Box) clone() Box {
	c := Box{Lo: make([]*big.Rat, len(b.Lo)), Hi: make([]*big.Rat, len(b.Hi))}
	for j := range b.Lo {
		c.Lo[j] = new(big.Rat).Set(b.Lo[j])
		c.Hi[j] = new(big.Rat).Set(b.Hi[j])
	}
	return c
}

// allCorners returns the 2^n corners of b (n parameters).
func (b Box) allCorners() [][]*big.Rat {
	n := len(b.Lo)
	out := make([][]*big.Rat, 0, 1<<n)
	for mask := 0; mask < 1<<n; mask++ {
		c := make([]*big.Rat, n)
		for j := range c {
			if mask&(1<<j) != 0 {
				c[j] = b.Hi[j]
			} else {
				c[j] = b.Lo[j]
			}
		}
		out = append(out, c)
	}
	return out
}

// Enclosure returns a float64 interval containing [Lo[j], Hi[j]].
func (b Box) Enclosure(j int) interval.I {
	lo, hi := decimalio.FromRat(b.Lo[j]), decimalio.FromRat(b.Hi[j])
	return interval.I{Lo: lo.Lo, Hi: hi.Hi}
}

// Text returns the box as "a ∈ [lo, hi], b ∈ [lo, hi]" with exact bounds.
func (b Box) Text(names []string) string {
	parts := make([]string, len(b.Lo))
	for j := range b.Lo {
		parts[j] = fmt.Sprintf("%s ∈ [%s, %s]", names[j], problem.RatText(b.Lo[j]), problem.RatText(b.Hi[j]))
	}
	return strings.Join(parts, ", ")
}

// key is the canonical text of the bounds ("lo,hi;lo,hi" in reduced
// fractions), the identity of a cell.
func (b Box) key() string {
	parts := make([]string, len(b.Lo))
	for j := range b.Lo {
		parts[j] = b.Lo[j].RatString() + "," + b.Hi[j].RatString()
	}
	return strings.Join(parts, ";")
}

// CellFileName returns the file name of the certificate of cell b:
// "cell-" and the first 16 hex digits of the SHA-256 of its canonical
// bounds, ".cell.json".
func CellFileName(b Box) string {
	sum := sha256.Sum256([]byte(b.key()))
	return "cell-" + hex.EncodeToString(sum[:])[:16] + cellSuffix
}

// CornerFileName returns the file name of the certificate of the corner
// problem with the given hash: "corner-" and its first 16 hex digits,
// ".cert.json".
func CornerFileName(problemSHA256 string) string {
	return "corner-" + problemSHA256[:16] + ".cert.json"
}

const cellSuffix = ".cell.json"
