package certify

import (
	"gapcert/fem/problem"
)

// Plan describes the first computation Certify would run on a problem:
// the sizes of its meshes and spaces and an estimate of its peak memory
// (larger meshes follow if the target width is not met).
type Plan struct {
	Kind             string
	Degree           int
	Cells            int // intervals: P_p cells
	StageACells      int
	Triangles        int // polygons: trial-mesh triangles
	StageATriangles  int
	StageASpace      string
	Tetrahedra       int // polyhedra: trial-mesh tetrahedra
	StageATetrahedra int
	MemoryEstimate   int64 // bytes, polygons and polyhedra only
	ReentrantCorners []int
	SingularCorners  []int // vertices the trial mesh is graded (and adaptively refined) toward
}

// FirstPlan returns the plan of the first computation of Certify.
func FirstPlan(p *problem.Problem) (Plan, error) {
	if err := Supported(p); err != nil {
		return Plan{}, err
	}
	if p.IsProduct() {
		// Products certify their factors (product.go), each with its own
		// plan; the plan says only that.
		return Plan{Kind: KindProduct}, nil
	}
	if err := checkMeshable(p); err != nil {
		return Plan{}, err
	}
	r, err := initialRecipe(p)
	if err != nil {
		return Plan{}, err
	}
	if p.Dim == 1 {
		return Plan{Kind: KindInterval, Degree: r.degree, Cells: r.cells, StageACells: r.stageACells}, nil
	}
	if p.Polyhedron != nil {
		space := "enriched-crouzeix-raviart"
		if usesCR(p) {
			space = "crouzeix-raviart"
		}
		return Plan{Kind: KindPolyhedron, Degree: r.degree, Tetrahedra: int(polyhedronTrialTetrahedra(p, r)),
			StageATetrahedra: int(polyhedronTetrahedra(p, r.stageARefine)), StageASpace: space, MemoryEstimate: memoryEstimate(p, r)}, nil
	}
	m, err := trialMesh(p, r)
	if err != nil {
		return Plan{}, err
	}
	ma, err := polygonMesh(p, r.stageARefine, stageACorners(p, r))
	if err != nil {
		return Plan{}, err
	}
	space := "enriched-crouzeix-raviart"
	if usesCR(p) {
		space = "crouzeix-raviart"
	}
	return Plan{Kind: KindPolygon, Degree: r.degree, Triangles: len(m.Tris), StageATriangles: len(ma.Tris),
		StageASpace: space, MemoryEstimate: memoryEstimate(p, r), ReentrantCorners: reentrantCorners(p),
		SingularCorners: cornerVertices(trialCorners(p, r))}, nil
}
