package plot_test

import (
	"fmt"
	"log"
	"math"
	"os"
	"path/filepath"

	"gapcert/certs/plot"
)

// Pictures of the first two Dirichlet modes of (0, π), sin(kx) with
// λ_k = k² (closed form).
func ExampleWrite() {
	dir, err := os.MkdirTemp("", "modes")
	if err != nil {
		log.Fatal(err)
	}
	defer os.RemoveAll(dir)
	m := &plot.Modes{
		Title:    "−u″ = λu on (0, π), Dirichlet",
		Interval: [2]float64{0, math.Pi},
		Labels:   []string{"λ1 ∈ [0.99999, 1.00001]", "λ2 ∈ [3.99999, 4.00001]"},
		Eval:     func(k int, x, _ float64) float64 { return math.Sin(float64(k+1) * x) },
	}
	paths, err := plot.Write(dir, m, []string{"png", "svg"})
	if err != nil {
		log.Fatal(err)
	}
	for _, p := range paths {
		fmt.Println(filepath.Base(p))
	}
	// Output:
	// modes.png
	// modes.svg
}
