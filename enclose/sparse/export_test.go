package sparse

// Hooks for the benchmarks of package sparse_test.

// FactorizeUpLooking is LDL.Factorize forced to the up-looking algorithm.
func FactorizeUpLooking(f *LDL, sym *Symbolic, s *Sym) bool {
	f.algorithm = upLooking
	defer func() { f.algorithm = automatic }()
	return f.Factorize(sym, s)
}

// FactorizeMultifrontal is LDL.Factorize forced to the multifrontal
// algorithm.
func FactorizeMultifrontal(f *LDL, sym *Symbolic, s *Sym) bool {
	f.algorithm = multifrontal
	defer func() { f.algorithm = automatic }()
	return f.Factorize(sym, s)
}
