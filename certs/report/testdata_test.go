package report

import (
	"context"
	"flag"
	"os"
	"path/filepath"
	"testing"
	"time"

	"gapcert/certs/certify"
	"gapcert/fem/problem"
)

var update = flag.Bool("update", false, "recompute the certificates in testdata/certs and rewrite the golden files")

// certificateFiles are the certificates the tables are made of, computed
// by certify.Certify from testdata/problems (run the tests with -update
// to recompute them after a change of the certification method).
var certificateFiles = []string{"dirichlet_0_pi", "mathieu_q1", "square"}

// fixedTime is the provenance time of the testdata certificates.
var fixedTime = time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC)

func certPath(name string) string { return filepath.Join("testdata", "certs", name+".cert.json") }

// TestTestdataCertificates recomputes the testdata certificates with
// -update, and otherwise re-verifies the interval ones (certify.Check), so
// that the golden tables are made of certificates that still verify. The
// polygon certificate is not re-verified here: the polygon method changes
// often, and the tables do not depend on it being current (its bounds are
// checked against the exact eigenvalues in TestTableContainsTruth).
func TestTestdataCertificates(t *testing.T) {
	for _, name := range certificateFiles {
		if *update {
			p, err := problem.ReadFile(filepath.Join("testdata", "problems", name+".json"))
			if err != nil {
				t.Fatal(err)
			}
			c, err := certify.Certify(context.Background(), p, certify.Options{Tool: "gapcert 0.1.0-dev", Now: func() time.Time { return fixedTime }})
			if err != nil {
				t.Fatal(err)
			}
			data, err := c.Marshal()
			if err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(certPath(name), data, 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		if name == "square" {
			continue
		}
		data, err := os.ReadFile(certPath(name))
		if err != nil {
			t.Fatal(err)
		}
		if err := certify.Check(data); err != nil {
			t.Errorf("%s: %v (run go test -update ./certs/report/ after a change of the method)", name, err)
		}
	}
}
