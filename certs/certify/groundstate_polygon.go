package certify

import "gapcert/certs"

// groundStatePolygon is the ground-state block of a polygon. Polygons are
// not computed in this build: the block is Undecided and says so.
func groundStatePolygon(in groundStateInputs) (*certs.GroundState, error) {
	return &certs.GroundState{LogConcavity: certs.Undecided, Reason: "polygons: not computed in this build"}, nil
}
