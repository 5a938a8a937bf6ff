package certify_test

import (
	"context"
	"fmt"
	"log"

	"gapcert/certs/certify"
	"gapcert/fem/problem"
)

// Certify −u″ = λu on (0, 1) with Dirichlet ends (λ_k = k²π²), check a
// claim about the gap and re-verify the certificate.
func ExampleCertify() {
	p, err := problem.Parse([]byte(`{
		"domain": {"interval": ["0", "1"]},
		"boundary": "dirichlet",
		"eigenvalues": 2,
		"claims": ["gap >= 29"]
	}`))
	if err != nil {
		log.Fatal(err)
	}
	c, err := certify.Certify(context.Background(), p, certify.Options{RelWidth: "1e-10"})
	if err != nil {
		log.Fatal(err)
	}
	for _, e := range c.Results.Eigenvalues {
		x, err := e.Bound().Interval()
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("lambda%d ≈ %.9f\n", e.Index, x.Mid())
	}
	fmt.Println(c.Claims[0].Text, c.Claims[0].Verdict)
	ref, err := certify.RefinementOf(c)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println("stopped:", ref.StopReason)
	data, err := c.Marshal()
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println("check:", certify.Check(data) == nil)
	// Output:
	// lambda1 ≈ 9.869604401
	// lambda2 ≈ 39.478417604
	// gap >= 29 holds
	// stopped: target reached
	// check: true
}
