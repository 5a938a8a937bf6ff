package claim

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
)

// MaxEigenvalue is the largest k for which "lambdak" is a quantity.
const MaxEigenvalue = 20

// Names of the quantities besides the eigenvalues.
const (
	Gap       = "gap"
	Diameter  = "D"
	Area      = "area"
	Perimeter = "perimeter"
	Inradius  = "inradius"
	// Volume and SurfaceArea are the measures of a domain of three or
	// four coordinates (a polyhedron or a product) and of its boundary.
	Volume      = "volume"
	SurfaceArea = "surface_area"
	Alpha       = "alpha"
	// ShapeMargin is the margin u(x)·u(y) − u(m)² of the midpoint triple
	// x, y, m = (x + y)/2 that a polygon's certificate records for its
	// ground state u (unit L² norm): the witness's margin, or the best
	// candidate's when there is no witness. It has a value only when the
	// certificate has results.ground_state (certify --ground-state), and
	// only on polygons.
	ShapeMargin = "shape_margin"
)

// Eigenvalue returns the name of the k-th eigenvalue, "lambdak".
func Eigenvalue(k int) string { return "lambda" + strconv.Itoa(k) }

// Quantities returns every quantity name a claim may use besides pi, e
// and the problem's parameters: lambda1 … lambda20, gap, D, area,
// perimeter, inradius, alpha, shape_margin, volume, surface_area. Which of
// them a given problem provides is decided by Scope.
func Quantities() []string {
	names := make([]string, 0, MaxEigenvalue+9)
	for k := 1; k <= MaxEigenvalue; k++ {
		names = append(names, Eigenvalue(k))
	}
	return append(names, Gap, Diameter, Area, Perimeter, Inradius, Alpha, ShapeMargin, Volume, SurfaceArea)
}

// IsQuantity reports whether name is one of Quantities.
func IsQuantity(name string) bool { return slices.Contains(Quantities(), name) }

// eigenvalueIndex returns k for "lambdak" with 1 ≤ k ≤ MaxEigenvalue.
func eigenvalueIndex(name string) (int, bool) {
	digits, ok := strings.CutPrefix(name, "lambda")
	if !ok || digits == "" || digits[0] == '0' {
		return 0, false
	}
	k, err := strconv.Atoi(digits)
	if err != nil || k < 1 || k > MaxEigenvalue {
		return 0, false
	}
	return k, true
}

// Scope is what a problem provides to its claims.
type Scope struct {
	Dim         int // the number of coordinates: 1 interval, 2 polygon, 3 polyhedron or product, 4 product
	Vertices    int // the polygon's or the polyhedron's vertices (0 for an interval or a product of three or four coordinates)
	Eigenvalues int // the number of certified eigenvalues, lambda1 … lambdaN
	// NoAlpha says why alpha has no value ("no side has a Robin
	// condition", …); "" when the Robin sides share one coefficient.
	NoAlpha string
	Params  []string // the problem's parameters
	// Extra are further names with a value (the reference quantity of a
	// built-in claim, see package fem/claim/named).
	Extra []string
}

// Unavailable says why name has no value in s and how to fix the claim;
// both are "" when it has one.
func (s Scope) Unavailable(name string) (why, hint string) {
	if slices.Contains(s.Params, name) || slices.Contains(s.Extra, name) {
		return "", ""
	}
	if k, ok := eigenvalueIndex(name); ok {
		if k <= s.Eigenvalues {
			return "", ""
		}
		return fmt.Sprintf("%s is not certified: the problem asks for %d eigenvalues", name, s.Eigenvalues),
			fmt.Sprintf(`set "eigenvalues": %d or more`, k)
	}
	switch name {
	case Gap, Diameter:
		return "", ""
	case Area, Perimeter:
		if s.Dim == 2 {
			return "", ""
		}
		if s.Dim > 2 {
			return fmt.Sprintf("%s is defined for polygons only", name), "on a domain of three or four coordinates use volume and surface_area"
		}
		return fmt.Sprintf("%s is defined for polygons only", name), "on an interval use D, its length"
	case Volume, SurfaceArea:
		if s.Dim > 2 {
			return "", ""
		}
		return fmt.Sprintf("%s is defined for three-dimensional domains only (and products of four coordinates)", name), "on a polygon use area and perimeter, on an interval D"
	case Inradius:
		if s.Dim == 2 && s.Vertices == 3 || s.Dim == 3 && s.Vertices == 4 {
			return "", ""
		}
		if s.Dim > 2 {
			return "inradius is defined for tetrahedra only among domains of three coordinates (3·volume/surface_area)", "for other domains write the bound you need with volume, surface_area or D"
		}
		return "inradius is defined for triangles only among polygons (2·area/perimeter; in three dimensions for tetrahedra)", "for other domains write the bound you need with area, perimeter or D"
	case Alpha:
		if s.NoAlpha == "" {
			return "", ""
		}
		piece := "side"
		if s.Dim > 2 {
			piece = "face"
		}
		return "alpha has no value: " + s.NoAlpha, "alpha is the Robin coefficient shared by every Robin " + piece + "; write the coefficient itself, or declare it as a parameter"
	case ShapeMargin:
		if s.Dim == 2 {
			return "", ""
		}
		return "shape_margin is defined for polygons only (the margin u(x)u(y) - u(m)^2 of a midpoint triple of the ground state)",
			"on an interval results.ground_state decides log-concavity itself (certify with --ground-state)"
	}
	known := fmt.Sprintf("known names: lambda1…lambda%d, gap, D", max(s.Eigenvalues, 1))
	if s.Dim == 2 {
		known += ", area, perimeter, shape_margin"
		if s.Vertices == 3 {
			known += ", inradius"
		}
	}
	if s.Dim > 2 {
		known += ", volume, surface_area"
		if s.Dim == 3 && s.Vertices == 4 {
			known += ", inradius"
		}
	}
	if s.NoAlpha == "" {
		known += ", alpha"
	}
	known += ", pi, e"
	if len(s.Params) > 0 {
		known += " and the parameters " + strings.Join(s.Params, ", ")
	}
	if n, err := strconv.Atoi(strings.TrimPrefix(name, "lambda")); err == nil && strings.HasPrefix(name, "lambda") && n > MaxEigenvalue {
		known = fmt.Sprintf("at most %d eigenvalues are certified", MaxEigenvalue)
	}
	return fmt.Sprintf("unknown name %q", name), known
}

// CheckScope returns an *Error for the name of the claim that has no value
// in s and occurs first in its text, with its column and a hint; nil if
// every name has a value.
func (c *Claim) CheckScope(s Scope) error {
	var first *Error
	for _, v := range c.Vars() {
		if why, hint := s.Unavailable(v); why != "" {
			if col := nameColumn(c.Text, v); first == nil || col < first.Col {
				first = &Error{Text: c.Text, Col: col, Msg: why, Hint: hint}
			}
		}
	}
	if first == nil {
		return nil
	}
	return first
}

// nameColumn returns the 1-based column of the first occurrence of name as
// a whole identifier in text (1 if not found).
func nameColumn(text, name string) int {
	isIdent := func(b byte) bool {
		return b == '_' || '0' <= b && b <= '9' || 'a' <= b && b <= 'z' || 'A' <= b && b <= 'Z'
	}
	for i := 0; i+len(name) <= len(text); i++ {
		if text[i:i+len(name)] != name {
			continue
		}
		if (i == 0 || !isIdent(text[i-1])) && (i+len(name) == len(text) || !isIdent(text[i+len(name)])) {
			return i + 1
		}
	}
	return 1
}
