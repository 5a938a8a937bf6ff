// Package discretetest is a conformance suite for the interfaces of
// package fem/discrete: one table of checks, run through the interfaces
// alone, that every discretisation must pass (each element package calls
// Run from its tests, so a new discretisation inherits the suite).
//
// Run checks, on a problem with known eigenvalues Λ_k = λ_k + γ:
//
//   - upper bounds: the Ritz pencil of the chosen vectors encloses values
//     at or above each exact Λ_k and within a relative tolerance of it;
//   - the leading block of the Ritz matrices of all vectors is the Ritz
//     matrices of the leading vectors, bit for bit (the driver reuses it);
//   - the verified count: a shift below the located eigenvalue proves a
//     bound at or below the exact discrete eigenvalue, whose projection
//     bound lies at or below the exact Λ_k and within a tolerance of it,
//     and a shift above the exact Λ_k does not count fewer than k;
//   - stage B: for each of the first trial functions alone, Temple's
//     bound (the Lehmann–Goerisch bound with N = 1) from the flux matrix
//     and a ρ below the exact Λ_(k+1) lies at or below the exact Λ_k and
//     within a tolerance of it;
//   - determinism: a second run with one thread gives the same bits.
package discretetest
