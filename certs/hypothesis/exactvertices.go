package hypothesis

import (
	"math/big"

	"gapcert/fem/problem"
	"gapcert/interval"
	"gapcert/interval/algebraic"
)

// surdVertices reads every coordinate of the points vs (two or three
// coordinates each) exactly as a surd (package algebraic); ok is false if
// some coordinate is not read.
func surdVertices(vs [][]problem.Number) (v [][]algebraic.Surd, ok bool) {
	return readVertices(vs, algebraic.NewSurd, algebraic.ReadSurd)
}

// cycVertices reads every coordinate exactly as a sum of rational
// multiples of roots of unity (package algebraic) and returns the vertices
// in the smallest cyclotomic field holding them all; ok is false if some
// coordinate is not read or that field is beyond algebraic's bounds.
func cycVertices(vs [][]problem.Number) (v [][]algebraic.Cyclotomic, ok bool) {
	sums, ok := readVertices(vs, algebraic.NewRootSum, algebraic.ReadRootSum)
	if !ok {
		return nil, false
	}
	var all []algebraic.RootSum
	for _, s := range sums {
		all = append(all, s...)
	}
	f, ok := algebraic.CyclotomicFieldOf(all...)
	if !ok {
		return nil, false
	}
	v = make([][]algebraic.Cyclotomic, len(sums))
	for i, s := range sums {
		for _, x := range s {
			v[i] = append(v[i], f.Element(x))
		}
	}
	return v, true
}

// readVertices reads every coordinate exactly: a rational with fromRat,
// a constant formula (its canonical text, guarded by its enclosure) with
// read.
func readVertices[T any](vs [][]problem.Number, fromRat func(*big.Rat) T, read func(string, interval.I) (T, bool)) (v [][]T, ok bool) {
	v = make([][]T, len(vs))
	for i, p := range vs {
		v[i] = make([]T, len(p))
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

// planarPoints returns the polygon's vertices as rows of coordinates.
func planarPoints(vs [][2]problem.Number) [][]problem.Number {
	out := make([][]problem.Number, len(vs))
	for i := range vs {
		out[i] = vs[i][:]
	}
	return out
}

// spacePoints returns the polyhedron's vertices as rows of coordinates.
func spacePoints(vs [][3]problem.Number) [][]problem.Number {
	out := make([][]problem.Number, len(vs))
	for i := range vs {
		out[i] = vs[i][:]
	}
	return out
}
