package tet

import (
	"go/parser"
	"go/token"
	"strings"
	"testing"
)

// TestPackageDocumentationIsOneComment checks that doc.go is one comment
// attached to the package clause: a blank line inside it would detach
// everything above it from the package documentation (go doc shows only
// the comment directly before "package").
func TestPackageDocumentationIsOneComment(t *testing.T) {
	f, err := parser.ParseFile(token.NewFileSet(), "doc.go", nil, parser.ParseComments|parser.PackageClauseOnly)
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Comments) != 1 || f.Doc == nil || f.Doc != f.Comments[0] {
		t.Fatalf("doc.go has %d comment groups; the package documentation must be the only one", len(f.Comments))
	}
	text := f.Doc.Text()
	for _, want := range []string{"Package tet ", "Reference element", "Piola transform", "Conformity"} {
		if !strings.Contains(text, want) {
			t.Errorf("package documentation lacks %q", want)
		}
	}
}
