// Command gapcert computes rigorous enclosures of the lowest eigenvalues of
// Schrödinger operators −Δ + V on intervals and polygons and writes
// certificates that can be checked again. Run "gapcert help" for the
// commands.
package main

import "os"

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}
