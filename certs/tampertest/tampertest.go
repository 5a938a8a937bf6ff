// Package tampertest makes tampered copies of a certificate, for the tests
// of every command and function that reads certificates (certs.Unmarshal,
// the re-check, merge, the command line): copies that JSON readers read
// differently, because they repeat a key or spell a key in another case,
// or that carry keys the format does not define. Each variant says where
// the strict reader must find the defect and what a reader that matches
// keys exactly and lets the last of two equal keys win (Python's json
// module, for one) would take from the file.
package tampertest

import (
	"bytes"
	"fmt"
	"regexp"
)

// Variant is one way of tampering with a certificate.
type Variant struct {
	Name string
	// Path is the JSON path at which the strict reader must report the
	// defect.
	Path string
	// Seen says what a reader that matches keys exactly and keeps the last
	// of two equal keys takes from the tampered file.
	Seen string
	// Edit returns the tampered copy of a certificate, or nil if the
	// certificate lacks what the variant edits.
	Edit func(cert []byte) []byte
}

// fakeEigenvalues are false enclosures of λ1 and λ2.
const fakeEigenvalues = `[{"index": 1, "lower": "1e-3", "upper": "2e-3"}, {"index": 2, "lower": "1e9", "upper": "2e9"}]`

// fakeProblem is another problem than any certificate's.
const fakeProblem = `{"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet", "eigenvalues": 2, "claims": ["gap >= 1e9"]}`

// Variants returns the tamper variants for a certificate written by
// certs.Certificate.Marshal. refClaim is the index of a claim that carries
// an embedded reference certificate, or −1: the variants that edit a
// reference then return nil.
func Variants(refClaim int) []Variant {
	ref := fmt.Sprintf("claims[%d].reference", refClaim)
	vs := []Variant{
		{"case variant after the key, fake first", "results.EigenValues",
			"the false eigenvalues under \"eigenvalues\"; encoding/json alone took the later \"EigenValues\"",
			func(c []byte) []byte {
				return replaceNth(c, `"eigenvalues": [`, 1, `"eigenvalues": `+fakeEigenvalues+`, "EigenValues": [`)
			}},
		{"case variant after the key, fake last", "results.gap.UPPER",
			"the certified gap, \"UPPER\" being another key; encoding/json alone took the false \"UPPER\"",
			func(c []byte) []byte {
				return replaceRegexp(c, `"gap": \{\s*"lower": "[^"]*",\s*"upper": "[^"]*"`, `$0, "UPPER": "1e9"`)
			}},
		{"duplicate key, fake first", "results.eigenvalues",
			"the certified eigenvalues (the later key); a reader that keeps the first key sees the false ones",
			func(c []byte) []byte {
				return replaceNth(c, `"results": {`, 1, `"results": {"eigenvalues": `+fakeEigenvalues+`, `)
			}},
		{"duplicate key, fake last", "results.eigenvalues",
			"the false eigenvalues (the later key)",
			func(c []byte) []byte {
				return replaceNth(c, `"gap": {`, 1, `"eigenvalues": `+fakeEigenvalues+`, "gap": {`)
			}},
		{"two problem objects, fake first", "problem",
			"the certified problem (the later key); a reader that keeps the first key sees the false one",
			func(c []byte) []byte {
				return replaceNth(c, `"problem": {`, 1, `"problem": `+fakeProblem+`, "problem": {`)
			}},
		{"two problem objects, fake last", "problem",
			"the false problem (the later key), beside a hash of the certified one",
			func(c []byte) []byte {
				return replaceNth(c, `"problem_sha256":`, 1, `"problem": `+fakeProblem+`, "problem_sha256":`)
			}},
		{"case variant of a section", "Provenance",
			"no provenance at all (\"Provenance\" is another key)",
			func(c []byte) []byte { return replaceNth(c, `"provenance": {`, -1, `"Provenance": {`) }},
		{"extra key in method", "method.stage_c",
			"a method with a stage the format does not define",
			func(c []byte) []byte { return replaceNth(c, `"method": {`, -1, `"method": {"stage_c": "on", `) }},
		{"case variant in method", "method.Degree",
			"a method without \"degree\" and with an unknown \"Degree\"",
			func(c []byte) []byte { return replaceNth(c, `"degree":`, -1, `"Degree":`) }},
		{"duplicate key in method", "method.degree",
			"the recorded degree (the later key); a reader that keeps the first key sees degree 1",
			func(c []byte) []byte { return replaceNth(c, `"method": {`, -1, `"method": {"degree": 1, `) }},
	}
	if refClaim < 0 {
		return vs
	}
	return append(vs,
		Variant{"extra key in an embedded reference", ref + ".trusted",
			"a reference marked \"trusted\", a key the format does not define",
			func(c []byte) []byte {
				return replaceRegexp(c, `"name": "[a-z_]+",\s*"certificate": \{`, `"trusted": true, $0`)
			}},
		Variant{"extra key in the method of an embedded reference", ref + ".certificate.method.stage_c",
			"a reference method with a stage the format does not define",
			func(c []byte) []byte { return replaceNth(c, `"method": {`, 1, `"method": {"stage_c": "on", `) }},
		Variant{"duplicate key in an embedded reference, fake last", ref + ".certificate.results.gap",
			"a false reference gap (the later key)",
			func(c []byte) []byte {
				return replaceNth(c, `"diameter": {`, 2, `"gap": {"lower": "1e9", "upper": "2e9"}, "diameter": {`)
			}},
		Variant{"case variant in an embedded reference", ref + ".certificate.results.Gap",
			"the certified reference gap under \"gap\"; encoding/json alone took the false \"Gap\"",
			func(c []byte) []byte {
				return replaceNth(c, `"diameter": {`, 2, `"Gap": {"lower": "1e9", "upper": "2e9"}, "diameter": {`)
			}},
	)
}

// replaceNth replaces the n-th occurrence (1-based; −1 for the last) of
// old in data by new, or returns nil if there is none.
func replaceNth(data []byte, old string, n int, new string) []byte {
	at := -1
	if n < 0 {
		at = bytes.LastIndex(data, []byte(old))
	} else {
		from := 0
		for k := 0; k < n; k++ {
			i := bytes.Index(data[from:], []byte(old))
			if i < 0 {
				return nil
			}
			at, from = from+i, from+i+len(old)
		}
	}
	if at < 0 {
		return nil
	}
	out := append([]byte{}, data[:at]...)
	out = append(out, new...)
	return append(out, data[at+len(old):]...)
}

// replaceRegexp replaces the first match of expr in data by repl (with
// $0 for the match), or returns nil if there is none.
func replaceRegexp(data []byte, expr, repl string) []byte {
	re := regexp.MustCompile(expr)
	loc := re.FindSubmatchIndex(data)
	if loc == nil {
		return nil
	}
	out := append([]byte{}, data[:loc[0]]...)
	out = re.Expand(out, []byte(repl), data, loc)
	return append(out, data[loc[1]:]...)
}
