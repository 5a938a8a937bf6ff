package hypothesis

import (
	"math/big"

	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/algebraic"
)

// surdVertices reads every coordinate exactly as a surd (package
// algebraic); ok is false if some coordinate is not read.
func surdVertices(vs [][2]problem.Number) (v [][2]algebraic.Surd, ok bool) {
	return readVertices(vs, algebraic.NewSurd, algebraic.ReadSurd)
}

// cycVertices reads every coordinate exactly as a sum of rational
// multiples of roots of unity (package algebraic) and returns the vertices
// in the smallest cyclotomic field holding them all; ok is false if some
// coordinate is not read or that field is beyond algebraic's bounds.
func cycVertices(vs [][2]problem.Number) (v [][2]algebraic.Cyclotomic, ok bool) {
	sums, ok := readVertices(vs, algebraic.NewRootSum, algebraic.ReadRootSum)
	if !ok {
		return nil, false
	}
	all := make([]algebraic.RootSum, 0, 2*len(sums))
	for _, s := range sums {
		all = append(all, s[0], s[1])
	}
	f, ok := algebraic.CyclotomicFieldOf(all...)
	if !ok {
		return nil, false
	}
	v = make([][2]algebraic.Cyclotomic, len(sums))
	for i, s := range sums {
		v[i] = [2]algebraic.Cyclotomic{f.Element(s[0]), f.Element(s[1])}
	}
	return v, true
}

// readVertices reads every coordinate exactly: a rational with fromRat,
// a constant formula (its canonical text, guarded by its enclosure) with
// read.
func readVertices[T any](vs [][2]problem.Number, fromRat func(*big.Rat) T, read func(string, interval.I) (T, bool)) (v [][2]T, ok bool) {
	v = make([][2]T, len(vs))
	for i, p := range vs {
		for k, n := range p {
			if n.Rat != nil {
				v[i][k] = fromRat(n.Rat)
			} else if v[i][k], ok = read(n.Text, n.Val); !ok {
				return nil, false
			}
		}
	}
	return v, true
}
