package certify

import (
	"fmt"
	"testing"
	"time"

	"gapcert/fem/problem"
)

func TestZZScratch(t *testing.T) {
	for _, v := range []string{
		`[["0","0"],["1000*cos(1)","1000*sin(1)"],["1000*cos(1)-2000*sin(1)","1000*sin(1)+2000*cos(1)"],["-2000*sin(1)","2000*cos(1)"]]`,
		`[["0","0"],["1000","0"],["1000","2000"],["0","2000"]]`,
	} {
		p, err := problem.Parse([]byte(polygonText(v, "0", []string{`{"robin":"1e-9"}`, `"dirichlet"`, `{"robin":"1e6"}`, `"neumann"`}, 3)))
		if err != nil {
			t.Fatal(err)
		}
		c, err := Certify(p, Options{RelWidth: 1e-2, TimeLimit: 6 * time.Second, Progress: func(f string, a ...any) { fmt.Printf(f, a...) }})
		if err != nil {
			t.Fatal(err)
		}
		fmt.Println(string(c.Method))
	}
}
