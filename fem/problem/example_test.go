package problem_test

import (
	"fmt"

	"gapcert/fem/problem"
)

func ExampleParse() {
	p, err := problem.Parse([]byte(`{
	  "domain": {"polygon": [["0", "0"], ["0", "1"], ["2", "1"], ["2", "0"]]},
	  "boundary": ["dirichlet", "neumann", "dirichlet", {"robin": "1/2"}],
	  "potential": "x^2"
	}`))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p.Reversed(), p.Convex(), p.Area())
	for k, bc := range p.Boundary {
		fmt.Println(k, p.Vertices[k][0].Text, p.Vertices[k][1].Text, bc.Kind, bc.Alpha.Text)
	}
	fmt.Printf("%s\n", p.Canonical())
	// Output:
	// true convex [2, 2]
	// 0 0 0 robin 0.5
	// 1 2 0 dirichlet 0
	// 2 2 1 neumann 0
	// 3 0 1 dirichlet 0
	// {"boundary":[{"robin":"0.5"},"dirichlet","neumann","dirichlet"],"claims":[],"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["0","1"]]},"eigenvalues":2,"name":"","parameters":{},"potential":"x^2","target":{"relative_width":"0.000001"}}
}

func ExampleParse_errors() {
	_, err := problem.Parse([]byte(`{"domain": {"interval": ["1", "0"]}, "boundary": "dirichlet", "eigenvalues": 1}`))
	fmt.Println(err)
	// Output:
	// domain.interval: reversed interval: the left end is above the right end (hint: list the ends in increasing order)
	// eigenvalues: eigenvalues = 1 is out of range (hint: an integer from 2 to 20)
}
