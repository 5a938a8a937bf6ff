package tet

// Test helpers of this package for its external tests (package tet_test).
var (
	UnitCubeForTest      = unitCube
	MustExprForTest      = mustExpr
	RitzBoundsForTest    = ritzBounds
	AllBCForTest         = allBC
	RelErrForTest        = relErr
	StageALowerForTest   = stageALower
	StageALowerOfForTest = stageALowerOf
)
