package sweep

import "gapcert/certs"

// SummaryFormat is the format identifier written to, and required in, the
// "format" field of every sweep summary.
const SummaryFormat = "gapcert.sweep-summary/v1"

// Summary is the record of one sweep run (one shard, or the merge of all
// shards). It is written as summary.json beside the certificates, and the
// same rows as summary.csv.
type Summary struct {
	Format string `json:"format"`
	// Family is the base name of the family file the run expanded.
	Family string `json:"family"`
	// FamilySHA256 is the hex SHA-256 of the family file's bytes.
	FamilySHA256 string `json:"family_sha256"`
	// Shard is the part of the family this run covered; a merged summary
	// and an unsharded run have Shard{Index: 0, Count: 1}.
	Shard Shard `json:"shard"`
	// Parameters are the parameter names in expansion order (the first
	// varies slowest).
	Parameters []string `json:"parameters"`
	// TotalPoints is the number of points of the whole family (all shards).
	TotalPoints int `json:"total_points"`
	// GroundState is set when the family asks every certificate for its
	// ground-state block; then each certified point carries it.
	GroundState bool `json:"ground_state,omitempty"`
	// Points are the points of this run, in increasing Index.
	Points []Point `json:"points"`
}

// Shard is part Index (0-based) of Count parts: the points k with
// k mod Count = Index.
type Shard struct {
	Index int `json:"index"`
	Count int `json:"count"`
}

// Statuses of a point.
const (
	// StatusComputed: the certificate was computed in this run.
	StatusComputed = "computed"
	// StatusReused: a certificate already in the output directory verified
	// and belongs to the point, so it was kept.
	StatusReused = "reused"
	// StatusRefined: the certificate was recomputed with a tighter width
	// target because a claim was undecided, and replaced the earlier one.
	StatusRefined = "refined"
	// StatusError: no valid certificate for the point; Error says why.
	StatusError = "error"
)

// Point is one point of a family: its parameter values, its certificate
// file and the certified results copied from that certificate.
type Point struct {
	// Index is the 0-based position of the point in the expansion order.
	Index int `json:"index"`
	// Params maps each parameter name to its exact value as text (a
	// decimal such as "0.25" or a fraction such as "1/3").
	Params map[string]string `json:"params"`
	// File is the certificate's file name, relative to the summary's
	// directory ("" when Status is StatusError and nothing was written).
	File string `json:"file"`
	// ProblemSHA256 is the hex SHA-256 of the canonical problem JSON of the
	// point (the certificate's problem_sha256).
	ProblemSHA256 string `json:"problem_sha256"`
	// CertificateSHA256 is the hex SHA-256 of the certificate file's bytes.
	CertificateSHA256 string `json:"certificate_sha256"`
	// RelWidth is the relative width target the certificate was computed
	// with (exact decimal text).
	RelWidth     string              `json:"rel_width"`
	Eigenvalues  []certs.Eigen       `json:"eigenvalues"`
	Gap          certs.Bound         `json:"gap"`
	Diameter     certs.Bound         `json:"diameter"`
	GapD2OverPi2 certs.Bound         `json:"gap_d2_over_pi2"`
	Claims       []certs.ClaimResult `json:"claims"`
	// GroundState is the certificate's results.ground_state, copied
	// whole (nil when the family does not ask for it, or when there is
	// no certificate).
	GroundState *certs.GroundState `json:"ground_state,omitempty"`
	// Verdict is the least favourable verdict over Claims (fails before
	// undecided before holds), "" when there are no claims or no
	// certificate.
	Verdict string `json:"verdict"`
	Status  string `json:"status"`
	Error   string `json:"error,omitempty"`
}

// ShapeMargin returns the margin a summary lists for a ground state's
// log-concavity verdict: the witness's margin when the verdict is
// disproven (see certs.ShapeWitness: its lower end is positive), the best
// candidate's margin when it is undecided and one was recorded, else nil.
// It is copied from the certificate, never computed.
func ShapeMargin(gs *certs.GroundState) *certs.Bound {
	switch {
	case gs == nil:
		return nil
	case gs.Witness != nil:
		m := gs.Witness.Margin
		return &m
	}
	return gs.Margin
}
