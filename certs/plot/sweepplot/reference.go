package sweepplot

import (
	"fmt"
	"slices"

	"gapcert/certs"
	"gapcert/fem/claim/named"
)

// referenceNames returns the names of the reference quantities of built-in
// claims (named.Claim.Reference) that a formula may use, sorted. The
// catalogue says which problem each one's certificate certifies
// (named.Claim.ReferenceProblem; for @robin_comparison −u″ = λu on (0, D),
// D the polygon's diameter, with the polygon's Robin coefficient at both
// ends) and which of its results it is (named.Claim.ReferenceResult; for
// robin_interval_gap the gap).
func referenceNames() []string {
	var names []string
	for _, c := range named.All() {
		if c.Reference != "" {
			names = append(names, c.Reference)
		}
	}
	slices.Sort(names)
	return slices.Compact(names)
}

// isReference reports whether name is a reference quantity.
func isReference(name string) bool { return slices.Contains(referenceNames(), name) }

// referenceOwner returns the text ("@name") of the built-in claim whose
// reference quantity is name.
func referenceOwner(name string) string {
	for _, c := range named.All() {
		if c.Reference == name {
			return c.Text()
		}
	}
	return ""
}

// referenceBounds reads the reference quantities of a certificate's claims
// from the reference certificates stored in them (each decoded and
// format-checked by certs.Unmarshal; the re-check of a certificate,
// certify.Check, verifies its references in turn). A reference must
// belong to the built-in claim that names it, and two claims may not give
// the same reference quantity different enclosures.
func referenceBounds(claims []certs.ClaimResult) (map[string]certs.Bound, error) {
	refs := map[string]certs.Bound{}
	for k, cr := range claims {
		if cr.Reference == nil {
			continue
		}
		name := cr.Reference.Name
		if !isReference(name) {
			continue // a reference this package does not offer by name
		}
		c, err := named.Lookup(cr.Text)
		if err != nil || c.Reference != name {
			return nil, fmt.Errorf("claims[%d]: claim %q carries a reference certificate of %s, which is not its reference", k, cr.Text, name)
		}
		inner, err := certs.Unmarshal(cr.Reference.Certificate)
		if err != nil {
			return nil, fmt.Errorf("claims[%d].reference: %v", k, err)
		}
		b, ok := inner.Results.Quantity(c.ReferenceResult)
		if !ok {
			return nil, fmt.Errorf("claims[%d].reference: the certificate records no %s", k, c.ReferenceResult)
		}
		if prev, dup := refs[name]; dup && prev != b {
			return nil, fmt.Errorf("claims[%d].reference: %s is [%s, %s] here and [%s, %s] in an earlier claim", k, name, b.Lower, b.Upper, prev.Lower, prev.Upper)
		}
		refs[name] = b
	}
	return refs, nil
}

// missingReference says why point i has no enclosure of the reference
// quantity name.
func (s *Sweep) missingReference(i int, name string) string {
	owner := referenceOwner(name)
	if s.Problems[i] == nil {
		return "its certificate file was not found, and reference quantities are read from it"
	}
	for _, cr := range s.Summary.Points[i].Claims {
		if cr.Text != owner {
			continue
		}
		if cr.Reason != "" {
			return fmt.Sprintf("the claim %s has no reference certificate: %s", owner, cr.Reason)
		}
		return fmt.Sprintf("the claim %s has no reference certificate", owner)
	}
	return fmt.Sprintf("the point has no claim %s (hint: add %q to the family's claims)", owner, owner)
}
