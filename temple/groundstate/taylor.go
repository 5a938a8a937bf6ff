package groundstate

import "gapcert/interval"

// unit is the interval [0, 1], the domain of every Taylor model here.
var unit = interval.New(0, 1)

// tmodel is a Taylor model in one variable ξ ∈ [0, 1]: a function f with
//
//	f(ξ) ∈ Σ_k c[k] ξ^k + r   for every ξ ∈ [0, 1],
//
// the right side evaluated in exact interval arithmetic at the point ξ
// (for ξ ≥ 0 it is the interval [Σ c[k].Lo ξ^k + r.Lo, Σ c[k].Hi ξ^k + r.Hi]).
// Every operation below returns a model of the exact result for every pair
// of functions in its arguments' models (Makino–Berz); the inequality each
// relies on is stated with it.
type tmodel struct {
	c []interval.I
	r interval.I
}

// constModel returns the model with polynomial v and remainder 0.
func constModel(v interval.I) tmodel {
	return tmodel{c: []interval.I{v}}
}

// eval returns an enclosure of {f(ξ) : ξ ∈ x} for x ⊆ [0, 1], by Horner's
// scheme in interval arithmetic (inclusion isotone, so it contains the
// value at every point of x for every choice of coefficients in c).
func (f tmodel) eval(x interval.I) interval.I {
	var v interval.I
	for k := len(f.c) - 1; k >= 0; k-- {
		v = v.Mul(x).Add(f.c[k])
	}
	return v.Add(f.r)
}

// truncate moves the terms of degree > deg into the remainder:
// c ξ^k ∈ c·[0, 1] for ξ ∈ [0, 1].
func (f tmodel) truncate(deg int) tmodel {
	if len(f.c) <= deg+1 {
		return f
	}
	r := f.r
	for k := deg + 1; k < len(f.c); k++ {
		r = r.Add(f.c[k].Mul(unit))
	}
	return tmodel{c: f.c[:deg+1], r: r}
}

// addModels returns f + g (coefficientwise; remainders add).
func addModels(f, g tmodel) tmodel {
	n := max(len(f.c), len(g.c))
	c := make([]interval.I, n)
	for k := range c {
		if k < len(f.c) {
			c[k] = f.c[k]
		}
		if k < len(g.c) {
			c[k] = c[k].Add(g.c[k])
		}
	}
	return tmodel{c: c, r: f.r.Add(g.r)}
}

// scale returns a model of t·f for every t in the interval t
// (t·Σ c ξ^k + t·r ⊆ Σ (t c) ξ^k + t r by subdistributivity).
func (f tmodel) scale(t interval.I) tmodel {
	c := make([]interval.I, len(f.c))
	for k := range c {
		c[k] = f.c[k].Mul(t)
	}
	return tmodel{c: c, r: f.r.Mul(t)}
}

// mulModels returns a model of degree ≤ deg of f·g. With f = p + ρ and
// g = q + σ pointwise (ρ ∈ f.r, σ ∈ g.r),
//
//	f g = p q + ρ (q + σ) + p σ ∈ p q + f.r·(range q + g.r) + (range p)·g.r,
//
// p q is the coefficient convolution (interval arithmetic is
// subdistributive, so the expanded product contains the exact one), and
// its terms above deg are truncated.
func mulModels(f, g tmodel, deg int) tmodel {
	c := make([]interval.I, len(f.c)+len(g.c)-1)
	for i, fi := range f.c {
		for j, gj := range g.c {
			c[i+j] = c[i+j].Add(fi.Mul(gj))
		}
	}
	pf := tmodel{c: f.c}.eval(unit)
	pg := tmodel{c: g.c}.eval(unit)
	r := f.r.Mul(pg.Add(g.r)).Add(pf.Mul(g.r))
	return tmodel{c: c, r: r}.truncate(deg)
}

// integrate returns a model of degree ≤ deg of F(ξ) = ∫_0^ξ f(η) dη. For
// a function between the lower and upper polynomials of the model
// (Σ c.Lo η^k + r.Lo ≤ f(η) ≤ Σ c.Hi η^k + r.Hi for η ≥ 0) integration is
// monotone, so F(ξ) ∈ Σ c[k]/(k+1) ξ^{k+1} + ξ·r ⊆ … + [0, 1]·r.
func (f tmodel) integrate(deg int) tmodel {
	c := make([]interval.I, len(f.c)+1)
	for k, ck := range f.c {
		c[k+1] = ck.DivF(float64(k + 1))
	}
	return tmodel{c: c, r: f.r.Mul(unit)}.truncate(deg)
}
