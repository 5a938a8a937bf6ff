package line

// space is the continuous piecewise polynomial space of degree p on a mesh
// in the hierarchical basis of hierarchicalRat, with the vertex function at
// an end removed when that end is constrained to zero.
//
// DOF ordering: cell k owns the p+1 consecutive global indices
// k·p + l − shift (l = 0 left vertex, 1..p−1 bubbles, p right vertex;
// shift = 1 if the left vertex is removed), so the right vertex of cell k
// is the left vertex of cell k+1 and the half-bandwidth is p.
//
// The bubbles are integrated Legendre polynomials: their derivatives are
// the shifted Legendre polynomials, L²-orthogonal to each other and to
// constants, so on a cell the stiffness matrix is diagonal in the bubbles
// and decoupled from the vertex functions; this keeps the conditioning
// mild at high p (unlike nodal or monomial bases).
//
// Conformity: on each cell a function of the space is a polynomial; its
// value at a node is the coefficient of that node's vertex function, which
// both adjacent cells share, because all bubbles vanish at both ends of
// their cell. Hence the functions are continuous and piecewise polynomial,
// so they lie in H¹; a removed end vertex makes the value there exactly 0.
type space struct {
	mesh        *Mesh
	p           int
	dropL       bool
	dropR       bool
	n           int
	basis       *table // hierarchicalTable(p), (p+1)×(p+1)
	shiftOfDofs int
}

func newSpace(m *Mesh, p int, dropL, dropR bool) space {
	if p < 1 {
		panic("line: polynomial degree must be ≥ 1")
	}
	n := m.Cells()*p + 1
	s := space{mesh: m, p: p, dropL: dropL, dropR: dropR, basis: hierarchicalTable(p)}
	if dropL {
		n--
		s.shiftOfDofs = 1
	}
	if dropR {
		n--
	}
	s.n = n
	return s
}

// dof returns the global index of local function l of cell k, or −1 if it
// is a removed end vertex.
func (s *space) dof(k, l int) int {
	if (k == 0 && l == 0 && s.dropL) || (k == s.mesh.Cells()-1 && l == s.p && s.dropR) {
		return -1
	}
	return k*s.p + l - s.shiftOfDofs
}

// localCoef fills c (length p+1) with the coefficients of vec on cell k
// (0 for removed vertices).
func (s *space) localCoef(c []float64, vec []float64, k int) {
	for l := 0; l <= s.p; l++ {
		if g := s.dof(k, l); g >= 0 {
			c[l] = vec[g]
		} else {
			c[l] = 0
		}
	}
}

// endValue returns the value of vec at the left (k = 0) or right end: the
// coefficient of the end vertex function (exact), 0 if removed.
func (s *space) endValue(vec []float64, side Side) float64 {
	if side == Left {
		if g := s.dof(0, 0); g >= 0 {
			return vec[g]
		}
		return 0
	}
	if g := s.dof(s.mesh.Cells()-1, s.p); g >= 0 {
		return vec[g]
	}
	return 0
}

// eval evaluates vec at x in floating point (a choice).
func (s *space) eval(vec []float64, x float64) float64 {
	if len(vec) != s.n {
		panic("line: coefficient vector length mismatch")
	}
	k, xi := s.mesh.locate(x)
	p1 := s.p + 1
	c := make([]float64, p1)
	s.localCoef(c, vec, k)
	b := make([]float64, p1)
	for i := 0; i < p1; i++ {
		acc := 0.0
		for l := 0; l < p1; l++ {
			acc += s.basis.FL[i*p1+l] * c[l]
		}
		b[i] = acc
	}
	return deCasteljau(b, xi, c)
}
