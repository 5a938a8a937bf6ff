package certify

import (
	"encoding/json"
	"errors"
	"fmt"
	"slices"

	"gapcert/certs"
	"gapcert/fem/problem"
	"gapcert/fem/problem/strictjson"
)

// productCertificate reports whether data reads as a certificate of a
// product domain (then Check takes checkProduct; any other defect is
// reported by the general path).
func productCertificate(data []byte) (*certs.Certificate, *problem.Problem, bool) {
	cert, err := certs.Unmarshal(data)
	if err != nil {
		return nil, nil, false
	}
	p, err := problem.Parse(cert.Problem)
	if err != nil || !p.IsProduct() {
		return nil, nil, false
	}
	return cert, p, true
}

// decodeProductMethod reads a product's method block strictly: every key
// spelled as ProductMethod defines it, none repeated, at every depth (the
// factors' certificates are read by readRecorded).
func decodeProductMethod(raw json.RawMessage) (ProductMethod, error) {
	var m ProductMethod
	if err := strictjson.Decode(raw, &m); err != nil {
		return ProductMethod{}, certs.AsFormatError("method", err)
	}
	return m, nil
}

// recordedFactors reads the factors of a product's method strictly and
// returns each factor's certificate and the problem it must certify (the
// factor's problem file of the recorded product with the recorded count
// and target, or the rectangle's). Errors are *certs.FormatError with the
// JSON path of the defect.
func recordedFactors(p *problem.Problem, m ProductMethod) ([]*certs.Certificate, []*problem.Problem, error) {
	if m.Kind != KindProduct {
		return nil, nil, &certs.FormatError{Path: "method.kind", Msg: fmt.Sprintf("%q does not fit a product domain (want %q)", m.Kind, KindProduct)}
	}
	sep, why := p.Separable()
	switch {
	case m.Combination == CombineSums && !sep:
		return nil, nil, &certs.FormatError{Path: "method.combination", Msg: fmt.Sprintf("%q needs a separable potential, and %s", m.Combination, why)}
	case m.Combination == CombineSums && len(m.Factors) != p.Factors():
		return nil, nil, &certs.FormatError{Path: "method.factors", Msg: fmt.Sprintf("has %d entries for %d factors", len(m.Factors), p.Factors())}
	case m.Combination == CombineRectangle && (sep || p.Dim != 2):
		return nil, nil, &certs.FormatError{Path: "method.combination", Msg: fmt.Sprintf("%q is for a product of two intervals whose potential does not separate", m.Combination)}
	case m.Combination == CombineRectangle && len(m.Factors) != 1:
		return nil, nil, &certs.FormatError{Path: "method.factors", Msg: fmt.Sprintf("has %d entries; a rectangle has one certificate", len(m.Factors))}
	case m.Combination != CombineSums && m.Combination != CombineRectangle:
		return nil, nil, &certs.FormatError{Path: "method.combination", Msg: fmt.Sprintf("%q is not one of %q, %q", m.Combination, CombineSums, CombineRectangle)}
	}
	var cs []*certs.Certificate
	var subs []*problem.Problem
	for i, f := range m.Factors {
		path := fmt.Sprintf("method.factors[%d]", i)
		if _, err := ParseTarget(f.Target); err != nil {
			return nil, nil, &certs.FormatError{Path: path + ".target", Msg: err.Error()}
		}
		if f.Eigenvalues < 2 || f.Eigenvalues > maxFactorEigenvalues {
			return nil, nil, &certs.FormatError{Path: path + ".eigenvalues", Msg: fmt.Sprintf("%d is not from 2 to %d", f.Eigenvalues, maxFactorEigenvalues)}
		}
		var file []byte
		if m.Combination == CombineSums {
			file = p.FactorFile(i, f.Eigenvalues, f.Target)
		} else {
			if f.Eigenvalues != p.Eigenvalues {
				return nil, nil, &certs.FormatError{Path: path + ".eigenvalues", Msg: fmt.Sprintf("%d, but the product asks for %d", f.Eigenvalues, p.Eigenvalues)}
			}
			file = p.RectangleFile()
		}
		sub, err := problem.Parse(file)
		if err != nil {
			return nil, nil, &certs.FormatError{Path: path, Msg: "the factor's problem is invalid: " + err.Error()}
		}
		c, _, _, err := readRecorded(f.Certificate)
		if err != nil {
			return nil, nil, certs.AsFormatError(path+".certificate", err)
		}
		cs, subs = append(cs, c), append(subs, sub)
	}
	return cs, subs, nil
}

// checkProduct is Check for the certificate of a product domain: it reads
// the method, every factor's certificate and every claim's reference
// certificate strictly (before computing),
// checks the canonical problem and its hash, that each factor's
// certificate certifies the factor's problem (the recorded product's
// FactorFile with the recorded count and target, or its RectangleFile),
// re-verifies each factor's certificate by Check (recomputation), and
// recomputes the combination (proof.ProductSums) from the factors'
// recorded enclosures, which Check has just reproduced: results, claims and
// method must equal the recomputation field for field, and the refinement
// record must say "target reached" exactly when the recomputed widths meet
// its target.
func checkProduct(cert *certs.Certificate, p *problem.Problem, memory int64) error {
	m, err := decodeProductMethod(cert.Method)
	if err != nil {
		return err
	}
	cs, subs, err := recordedFactors(p, m)
	if err != nil {
		return err
	}
	bad, err := checkRecordedProblem(cert, p)
	if err != nil {
		return err
	}
	for i, c := range cs {
		path := fmt.Sprintf("method.factors[%d].certificate", i)
		if c.ProblemSHA256 != subs[i].SHA256() {
			bad = append(bad, fmt.Sprintf("%s certifies another problem than factor %d of the recorded product, %s", path, i, subs[i].Canonical()))
			continue
		}
		err := CheckWithin(m.Factors[i].Certificate, memory)
		var mm *MismatchError
		switch {
		case errors.As(err, &mm):
			for _, q := range mm.Problems {
				bad = append(bad, path+": "+q)
			}
		case err != nil:
			return fmt.Errorf("%s: %w", path, err)
		}
	}
	if len(bad) > 0 {
		return &MismatchError{Problems: bad}
	}
	var pr *productResult
	if m.Combination == CombineRectangle {
		// The rectangle's target is its certificate's own (its problem
		// file carries the product's target, not the one it was run at),
		// so the recorded method.factors[0].target is compared with it.
		target := m.Factors[0].Target
		if ref, rerr := RefinementOf(cs[0]); rerr == nil && ref != nil {
			target = ref.Target
		}
		pr, err = rectangleResult(p, cs[0], target)
	} else {
		counts := make([]int, len(m.Factors))
		targets := make([]string, len(m.Factors))
		for i, f := range m.Factors {
			counts[i], targets[i] = f.Eigenvalues, f.Target
		}
		var short []int
		pr, short, err = combineFactors(p, counts, cs, targets)
		if err == nil && len(short) > 0 {
			return &MismatchError{Problems: []string{fmt.Sprintf("method.factors: the certified eigenvalues of factor %d do not decide the product's lambda%d (its omitted eigenvalues may lie below it)", short[0], p.Eigenvalues)}}
		}
	}
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	fresh, err := pr.certificate(p, Options{recorded: cert})
	if err != nil {
		return fmt.Errorf("recomputation failed: %w", err)
	}
	bad = append(bad, differences("results", cert.Results, fresh.Results)...)
	bad = append(bad, differences("claims", cert.Claims, fresh.Claims)...)
	if m.Refinement == nil {
		bad = append(bad, "method.refinement is missing (a certificate records its target and why refinement stopped)")
	} else {
		bad = append(bad, checkProductRefinement(m.Refinement, pr.res)...)
		pr.method.Refinement = m.Refinement
	}
	bad = append(bad, differences("method", m, pr.method)...)
	for _, w := range fresh.Warnings {
		if !slices.Contains(cert.Warnings, w) {
			bad = append(bad, fmt.Sprintf("warnings lack %q, which the recomputation gives", w))
		}
	}
	if len(bad) > 0 {
		return &MismatchError{Problems: bad}
	}
	return nil
}

// checkProductRefinement verifies a product's refinement record: its
// target is accepted, its stop reason is one of the vocabulary, and it is
// "target reached" exactly when the recomputed widths meet the target
// (the other reasons are the factors' records, which their own checks
// verify as far as a step determines them).
func checkProductRefinement(rec *Refinement, res *result) []string {
	target, err := ParseTarget(rec.Target)
	if err != nil {
		return []string{fmt.Sprintf("method.refinement.target: %v", err)}
	}
	var bad []string
	if rec.TargetRule != TargetRule {
		bad = append(bad, fmt.Sprintf("method.refinement.target_rule is %q, want %q", rec.TargetRule, TargetRule))
	}
	if !slices.Contains(stopReasons, rec.StopReason) {
		return append(bad, fmt.Sprintf("method.refinement.stop_reason %q is not one of the stop reasons", rec.StopReason))
	}
	switch reached := res.reached(target); {
	case rec.StopReason == StopTarget && !reached:
		bad = append(bad, fmt.Sprintf("method.refinement.stop_reason says %q, but the recomputed widths do not meet the target %s", StopTarget, rec.Target))
	case rec.StopReason != StopTarget && reached:
		bad = append(bad, fmt.Sprintf("method.refinement.stop_reason says %q, but the recomputed widths meet the target %s", rec.StopReason, rec.Target))
	}
	return bad
}
