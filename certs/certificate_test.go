package certs

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"gapcert/interval"
)

func sample() *Certificate {
	return &Certificate{
		Format:        Format,
		Problem:       json.RawMessage(`{"name":"unit interval","dim":1}`),
		ProblemSHA256: "9f86d081884c7d659a2feaa0c55ad015a3bf4f1b2b0b822cd15d6c15b0f00a08", // sha256("test"), common test vector
		Results: Results{
			Eigenvalues: []Eigen{
				{Index: 1, Lower: "9.8696044010", Upper: "9.8696044011"},
				{Index: 2, Lower: "39.478417604", Upper: "39.478417605"},
			},
			Gap:            Bound{"29.608813203", "29.608813204"},
			Diameter:       Bound{"1", "1"},
			GapD2OverPi2:   Bound{"2.9999999999", "3.0000000001"},
			RelativeWidths: map[string]string{"lambda2": "2.6e-11", "lambda1": "1.1e-11"},
		},
		Claims: []ClaimResult{
			{Text: "lambda2 - lambda1 >= 3*pi^2/D^2", Verdict: Undecided, Margin: Bound{"-1e-9", "1e-9"}},
			{Text: "pi > 3 & <", Verdict: Holds, Margin: Bound{"0.14", "0.15"}},
		},
		Method:     json.RawMessage(`{"mesh":{"cells":64}}`),
		Warnings:   []string{"demo data"},
		Provenance: Provenance{Tool: "gapcert test", GoVersion: "go1.26", OS: "linux", Arch: "amd64", Time: "2026-01-01T00:00:00Z"},
	}
}

func TestRoundTrip(t *testing.T) {
	c := sample()
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasSuffix(data, []byte("}\n")) || bytes.HasSuffix(data, []byte("\n\n")) {
		t.Errorf("no single trailing newline")
	}
	if !bytes.HasPrefix(data, []byte("{\n  \"format\": \""+Format+"\",\n  \"problem\": {\n    \"name\"")) {
		t.Errorf("unexpected layout:\n%s", data)
	}
	if !bytes.Contains(data, []byte(`"pi > 3 & <"`)) {
		t.Errorf("claim text escaped:\n%s", data)
	}
	if !bytes.Contains(data, []byte("\"relative_widths\": {\n      \"lambda1\"")) {
		t.Errorf("map keys not sorted:\n%s", data)
	}
	back, err := Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	again, err := back.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(data, again) {
		t.Errorf("Marshal∘Unmarshal changed the document:\n%s\n---\n%s", data, again)
	}
	if !reflect.DeepEqual(back.Results, c.Results) || !reflect.DeepEqual(back.Claims, c.Claims) || back.Provenance != c.Provenance {
		t.Errorf("round trip changed the values")
	}
	for _, key := range []string{"format", "problem", "problem_sha256", "results", "eigenvalues", "index", "lower", "upper", "gap", "diameter", "gap_d2_over_pi2", "relative_widths", "claims", "text", "verdict", "margin", "method", "warnings", "provenance", "tool", "go_version", "os", "arch", "time"} {
		if !bytes.Contains(data, []byte(`"`+key+`":`)) {
			t.Errorf("key %q missing", key)
		}
	}
}

func TestMarshalEmptyLists(t *testing.T) {
	c := sample()
	c.Claims, c.Warnings, c.Method, c.Results.Eigenvalues, c.Results.RelativeWidths = nil, nil, nil, nil, nil
	data, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`"claims": []`, `"warnings": []`, `"method": null`, `"eigenvalues": []`, `"relative_widths": {}`} {
		if !bytes.Contains(data, []byte(want)) {
			t.Errorf("missing %s in\n%s", want, data)
		}
	}
	if _, err := Unmarshal(data); err != nil {
		t.Error(err)
	}
}

func TestMarshalRejects(t *testing.T) {
	c := sample()
	c.Format = "gapcert.certificate/v0"
	if _, err := c.Marshal(); err == nil {
		t.Error("wrong format marshalled")
	}
	c = sample()
	c.Problem = json.RawMessage(`[1]`)
	if _, err := c.Marshal(); err == nil {
		t.Error("non-object problem marshalled")
	}
}

func TestUnmarshalStrict(t *testing.T) {
	good, err := sample().Marshal()
	if err != nil {
		t.Fatal(err)
	}
	edit := func(old, new string) []byte {
		if !bytes.Contains(good, []byte(old)) {
			t.Fatalf("fixture lacks %q", old)
		}
		return bytes.Replace(good, []byte(old), []byte(new), 1)
	}
	tests := []struct {
		name string
		data []byte
		want string // substring of the error
	}{
		{"other version", edit(`"format": "gapcert.certificate/v1"`, `"format": "gapcert.certificate/v2"`), `"gapcert.certificate/v2" is not supported`},
		{"no format", edit(`"format": "gapcert.certificate/v1",`, ``), `no "format" field`},
		{"unknown top key", edit(`"warnings":`, `"extra": 1, "warnings":`), `extra: unknown key "extra"`},
		{"unknown nested key", edit(`"index": 1,`, `"index": 1, "mid": "9.87",`), `results.eigenvalues[0].mid: unknown key "mid"`},
		{"missing section", edit(`"warnings": [
    "demo data"
  ],`, ``), `warnings: missing`},
		{"missing result", edit(`"diameter": {
      "lower": "1",
      "upper": "1"
    },`, ``), `results.diameter: missing`},
		{"float bound", edit(`"lower": "1",`, `"lower": 1,`), `results.diameter.lower: want a string, not a number`},
		{"bad decimal", edit(`"lower": "1",`, `"lower": "1.0.0",`), `results.diameter`},
		{"empty bound", edit(`"lower": "1",`, `"lower": "",`), `results.diameter`},
		{"reversed bound", edit(`"upper": "1"`, `"upper": "0.5"`), `not an interval`},
		{"bad verdict", edit(`"verdict": "holds"`, `"verdict": "true"`), `claims[1].verdict`},
		{"bad index", edit(`"index": 2,`, `"index": 1,`), `results.eigenvalues[1].index`},
		{"problem not object", edit(`"problem": {
    "name": "unit interval",
    "dim": 1
  },`, `"problem": [1],`), `problem: must be a JSON object`},
		{"problem null", edit(`"problem": {
    "name": "unit interval",
    "dim": 1
  },`, `"problem": null,`), `problem: must be a JSON object`},
		{"short digest", edit(`"problem_sha256": "9f86`, `"problem_sha256": "9f8`), `problem_sha256`},
		{"upper-case digest", edit(`"problem_sha256": "9f86`, `"problem_sha256": "9F86`), `problem_sha256`},
		{"trailing data", append(append([]byte{}, good...), []byte(`{}`)...), `data after the top-level value`},
		{"not json", []byte(`{"format": `), `not a JSON certificate`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Unmarshal(tc.data)
			if err == nil {
				t.Fatal("accepted")
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q does not mention %q", err, tc.want)
			}
		})
	}
	// Only syntax errors are not *FormatError.
	var fe *FormatError
	if _, err := Unmarshal(edit(`"index": 1,`, `"index": 1, "x": 0,`)); !errors.As(err, &fe) {
		t.Errorf("unknown key: %T, want *FormatError", err)
	}
}

// TestBoundContainsInterval: NewBound(x, d).Interval() ⊇ x, checked on
// random intervals over many magnitudes with the exact comparison of
// math/big (the printed decimals are read as exact rationals), and the
// printed interval is not much wider than a unit in the last printed digit.
func TestBoundContainsInterval(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 88))
	for i := 0; i < 3000; i++ {
		a := math.Ldexp(rng.Float64()*2-1, rng.IntN(200)-100)
		b := a + math.Abs(a)*rng.Float64()*math.Pow(10, -float64(rng.IntN(16)))
		if rng.IntN(10) == 0 {
			b = a
		}
		x := interval.New(a, b)
		digits := 1 + rng.IntN(17)
		bd := NewBound(x, digits)
		y, err := bd.Interval()
		if err != nil {
			t.Fatalf("%v, %d digits: %v", x, digits, err)
		}
		if !x.Subset(y) {
			t.Fatalf("%v, %d digits: printed [%s, %s] reads back as %v", x, digits, bd.Lower, bd.Upper, y)
		}
		lo, _ := new(big.Rat).SetString(bd.Lower)
		hi, _ := new(big.Rat).SetString(bd.Upper)
		if lo.Cmp(new(big.Rat).SetFloat64(a)) > 0 || hi.Cmp(new(big.Rat).SetFloat64(b)) < 0 {
			t.Fatalf("%v, %d digits: printed [%s, %s] does not contain it (exact comparison)", x, digits, bd.Lower, bd.Upper)
		}
		// Each end moves by less than one unit in the digits-th place.
		rel := 2 * math.Pow(10, float64(1-digits))
		if y.Lo < a-math.Abs(a)*rel || y.Hi > b+math.Abs(b)*rel {
			t.Fatalf("%v, %d digits: printed [%s, %s] is too wide", x, digits, bd.Lower, bd.Upper)
		}
	}
}

func TestBoundSpecial(t *testing.T) {
	tests := []struct {
		x interval.I
		b Bound
	}{
		{interval.Entire(), Bound{"-Infinity", "Infinity"}},
		{interval.I{Lo: 0, Hi: math.Inf(1)}, Bound{"0", "Infinity"}},
		{interval.Point(0.5), Bound{"0.5", "0.5"}},
		{interval.Point(1.0 / 3), Bound{"0.3333", "0.3334"}},
		{interval.Point(-1.0 / 3), Bound{"-0.3334", "-0.3333"}},
	}
	for _, tc := range tests {
		b := NewBound(tc.x, 4)
		if !sameValue(b.Lower, tc.b.Lower) || !sameValue(b.Upper, tc.b.Upper) {
			t.Errorf("NewBound(%v, 4) = %v, want %v", tc.x, b, tc.b)
		}
		y, err := b.Interval()
		if err != nil || !tc.x.Subset(y) {
			t.Errorf("%v: Interval() = %v, %v", b, y, err)
		}
	}
	for _, b := range []Bound{{"Infinity", "Infinity"}, {"-Infinity", "-Infinity"}, {"2", "1"}, {"x", "1"}, {"1", "1/0"}} {
		if _, err := b.Interval(); err == nil {
			t.Errorf("%v: no error", b)
		}
	}
}

// sameValue reports whether two printed ends denote the same number
// (exact rational comparison; "Infinity" and "-Infinity" literally).
func sameValue(a, b string) bool {
	ra, okA := new(big.Rat).SetString(a)
	rb, okB := new(big.Rat).SetString(b)
	if !okA || !okB {
		return a == b
	}
	return ra.Cmp(rb) == 0
}

// withBuiltinClaim returns the sample with a built-in claim carrying
// hypotheses (one disproven, with a witness) and a reference certificate.
func withBuiltinClaim(t *testing.T) *Certificate {
	t.Helper()
	inner, err := sample().Marshal()
	if err != nil {
		t.Fatal(err)
	}
	side, vertex := 1, 3
	c := sample()
	c.Claims = append(c.Claims, ClaimResult{
		Text: "@robin_comparison", Inequality: "gap >= robin_interval_gap", Verdict: Holds, Margin: Bound{"0.5", "0.6"},
		Hypotheses: []Hypothesis{
			{Name: "robin_boundary", Verdict: Disproven, Detail: "side 1 differs", Witness: &Witness{Side: &side}},
			{Name: "convex_domain", Verdict: Disproven, Detail: "re-entrant", Witness: &Witness{Vertex: &vertex, Point: []string{"1", "sqrt(3)/2"}}},
			{Name: "convex_potential", Verdict: Proven, Detail: "V'' ≥ 0"},
			{Name: "zero_potential", Verdict: Undecided, Detail: "no point found"},
		},
		Reference: &Reference{Name: "robin_interval_gap", Certificate: json.RawMessage(inner)},
	})
	return c
}

// TestRoundTripBuiltinClaim: the fields of built-in claims survive
// Marshal and Unmarshal unchanged.
func TestRoundTripBuiltinClaim(t *testing.T) {
	data, err := withBuiltinClaim(t).Marshal()
	if err != nil {
		t.Fatal(err)
	}
	back, err := Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	again, err := back.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(data, again) {
		t.Errorf("Marshal∘Unmarshal changed the document")
	}
	got := back.Claims[2]
	if got.Inequality != "gap >= robin_interval_gap" || len(got.Hypotheses) != 4 || *got.Hypotheses[0].Witness.Side != 1 ||
		*got.Hypotheses[1].Witness.Vertex != 3 || got.Hypotheses[1].Witness.Point[1] != "sqrt(3)/2" || got.Reference.Name != "robin_interval_gap" {
		t.Errorf("round trip changed the claim: %+v", got)
	}
	inner, err := Unmarshal(got.Reference.Certificate)
	if err != nil || inner.Results.Gap != sample().Results.Gap {
		t.Errorf("reference certificate: %v", err)
	}
	for _, key := range []string{"inequality", "hypotheses", "name", "detail", "witness", "side", "vertex", "point", "reference", "certificate"} {
		if !bytes.Contains(data, []byte(`"`+key+`":`)) {
			t.Errorf("key %q missing", key)
		}
	}
	// Claims without the new fields do not write them.
	plain, _ := sample().Marshal()
	for _, key := range []string{"inequality", "hypotheses", "reference"} {
		if bytes.Contains(plain, []byte(`"`+key+`":`)) {
			t.Errorf("plain claim writes %q", key)
		}
	}
}

// TestUnmarshalStrictBuiltinClaim: malformed hypotheses and references are
// format errors with their path.
func TestUnmarshalStrictBuiltinClaim(t *testing.T) {
	good, err := withBuiltinClaim(t).Marshal()
	if err != nil {
		t.Fatal(err)
	}
	edit := func(old, new string) []byte {
		if !bytes.Contains(good, []byte(old)) {
			t.Fatalf("fixture lacks %q", old)
		}
		return bytes.Replace(good, []byte(old), []byte(new), 1)
	}
	editLast := func(old, new string) []byte {
		i := bytes.LastIndex(good, []byte(old))
		if i < 0 {
			t.Fatalf("fixture lacks %q", old)
		}
		return append(append(append([]byte{}, good[:i]...), new...), good[i+len(old):]...)
	}
	for _, tc := range []struct {
		name string
		data []byte
		want string
	}{
		{"bad hypothesis verdict", edit(`"verdict": "proven"`, `"verdict": "true"`), `claims[2].hypotheses[2].verdict`},
		{"disproven without witness", edit(`"verdict": "undecided",
          "detail": "no point found"`, `"verdict": "disproven",
          "detail": "no point found"`), `claims[2].hypotheses[3].witness`},
		{"witness on proven", edit(`"detail": "V'' ≥ 0"`, `"detail": "V'' ≥ 0", "witness": {"side": 0}`), `claims[2].hypotheses[2].witness`},
		{"empty hypothesis name", edit(`"name": "zero_potential"`, `"name": ""`), `claims[2].hypotheses[3].name`},
		{"negative side", edit(`"side": 1`, `"side": -1`), `negative`},
		{"five coordinates", edit(`"sqrt(3)/2"`, `"sqrt(3)/2", "0", "0", "0"`), `witness.point`},
		{"unknown hypothesis key", edit(`"detail": "no point found"`, `"detail": "no point found", "why": 1`), `claims[2].hypotheses[3].why: unknown key "why"`},
		{"bad reference bound", editLast(`"upper": "29.608813204"`, `"upper": "29.6.1"`), `claims[2].reference.certificate`},
		{"reference not a certificate", edit(`"certificate": {`, `"certificate": {"x": 1,`), `claims[2].reference.certificate`},
		{"empty reference name", edit(`"name": "robin_interval_gap"`, `"name": ""`), `claims[2].reference.name`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Unmarshal(tc.data)
			if err == nil {
				t.Fatal("accepted")
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q does not mention %q", err, tc.want)
			}
		})
	}
	// A reference may not nest references.
	c := withBuiltinClaim(t)
	inner, _ := c.Marshal()
	c.Claims[2].Reference.Certificate = inner
	data, _ := c.Marshal()
	if _, err := Unmarshal(data); err == nil || !strings.Contains(err.Error(), "references of its own") {
		t.Errorf("nested reference: %v", err)
	}
}

// TestUnmarshalTampered: certificates that two JSON readers would read
// differently are refused with the path of the defect. For each variant
// the comment says what a Python reader (json.load: keys matched exactly,
// the last of two equal keys wins) would see, and what encoding/json
// alone (keys matched without regard to case, the last match wins) made
// of it before the strict reader: the two disagree, or one of them sees a
// value that is not the certified one.
func TestUnmarshalTampered(t *testing.T) {
	good, err := withBuiltinClaim(t).Marshal()
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Unmarshal(good); err != nil {
		t.Fatalf("the untampered certificate: %v", err)
	}
	edit := func(old, new string) []byte {
		if bytes.Count(good, []byte(old)) < 1 {
			t.Fatalf("fixture lacks %q", old)
		}
		return bytes.Replace(good, []byte(old), []byte(new), 1)
	}
	editLast := func(old, new string) []byte {
		i := bytes.LastIndex(good, []byte(old))
		return append(append(append([]byte{}, good[:i]...), new...), good[i+len(old):]...)
	}
	const fakeEigen = `"eigenvalues": [{"index": 1, "lower": "0", "upper": "0.1"}, {"index": 2, "lower": "100", "upper": "101"}],`
	for _, tc := range []struct {
		name string
		data []byte
		path string // of the FormatError
	}{
		// Python: the false "eigenvalues"; encoding/json: the real
		// "EigenValues" (the later case-insensitive match).
		{"case variant after the fake", edit(`"eigenvalues": [`, fakeEigen+`"EigenValues": [`), "results.EigenValues"},
		// Python: "lower" is the certified end, "LOWER" an unknown key it
		// ignores; encoding/json: the false "LOWER" (the later match).
		{"LOWER next to lower", edit(`"gap": {
      "lower": "29.608813203",`, `"gap": {
      "lower": "29.608813203", "LOWER": "40",`), "results.gap.LOWER"},
		// Python and encoding/json: the fake, given last.
		{"duplicate key, fake last", edit(`"gap_d2_over_pi2": {`, `"gap_d2_over_pi2": {"lower": "7", "upper": "8"}, "gap_d2_over_pi2": {`), "results.gap_d2_over_pi2"},
		// Python and encoding/json: the real values given last; a reader
		// that keeps the first key (some streaming readers do) sees the fake.
		{"duplicate key, fake first", edit(`"results": {`, `"results": {`+fakeEigen), "results.eigenvalues"},
		// Python and encoding/json: the second problem, which the hash
		// need not cover if a reader hashes the first.
		{"two problem objects", edit(`"problem_sha256":`, `"problem": {"name": "unit interval", "dim": 2}, "problem_sha256":`), "problem"},
		// Python: the first "Problem" kept apart; encoding/json: the later one.
		{"problem in another case", edit(`"problem_sha256":`, `"Problem": {"name": "fake"}, "problem_sha256":`), "Problem"},
		// Python: the claim verdict "holds" of the later key.
		{"duplicate verdict in a claim", edit(`"verdict": "undecided",
      "margin"`, `"verdict": "undecided", "verdict": "holds",
      "margin"`), "claims[0].verdict"},
		// Python and encoding/json: the later "cells"; the method block is
		// opaque to this package, but its repeated keys are found here.
		{"duplicate key in method", editLast(`"method": {`, `"method": {"cells": 1, "cells": 2,`), "method.cells"},
		// An extra key beside an embedded reference: a statement no reader
		// of the format knows about.
		{"extra key in a reference", edit(`"name": "robin_interval_gap",`, `"name": "robin_interval_gap", "note": "x",`), "claims[2].reference.note"},
		// Inside the embedded reference certificate: encoding/json reads
		// the later "format" of the two, Python sees both keys.
		{"case variant in a reference certificate", edit(`"certificate": {`, `"certificate": {"Format": "gapcert.certificate/v1",`), "claims[2].reference.certificate.Format"},
		{"duplicate in a reference certificate", edit(`"certificate": {`, `"certificate": {"format": "gapcert.certificate/v1",`), "claims[2].reference.certificate.format"},
		// Python: both keys of the map; encoding/json: both, in a map.
		{"duplicate map key", edit(`"lambda1": "1.1e-11",`, `"lambda1": "1.1e-11", "lambda1": "1e-20",`), "results.relative_widths.lambda1"},
		{"case variant in provenance", editLast(`"tool": "gapcert test",`, `"Tool": "gapcert test",`), "provenance.Tool"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Unmarshal(tc.data)
			var fe *FormatError
			if !errors.As(err, &fe) {
				t.Fatalf("error %v, want a *FormatError", err)
			}
			if fe.Path != tc.path {
				t.Errorf("error %q has path %q, want %q", err, fe.Path, tc.path)
			}
			// Without the strict reader, encoding/json accepted the file.
			var lenient Certificate
			if err := json.Unmarshal(tc.data, &lenient); err != nil {
				t.Errorf("encoding/json refuses it too (%v): not a tamper the strict reader is needed for", err)
			}
		})
	}
}
