package main

import (
	"slices"

	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// catalogue names the models the reference benchmark knows, all from the
// generated families the engine's own benchmarks use.
var catalogue = map[string]func() *model.Spec{
	// Double-layer space grids of bars, k × k bays: 8k² members.
	"grid3d-60":  func() *model.Spec { return modelgen.SpaceTruss3D(60, 60) },
	"grid3d-100": func() *model.Spec { return modelgen.SpaceTruss3D(100, 100) },
	// The 2D braced grid, k × k squares: about 3k² members.
	"grid2d-300": func() *model.Spec { return modelgen.GridTruss2D(300, 300) },
	// A solid block of rigid frames (as many storeys as bays each way)
	// and a tall building frame, 6 freedoms per node.
	"block": func() *model.Spec { return modelgen.Frame3D(12, 12, 12) },
	"frame": func() *model.Spec { return modelgen.Frame3D(10, 10, 30) },
}

var defaultModels = []string{"grid3d-60", "grid3d-100", "grid2d-300", "block", "frame"}

func modelNames() []string {
	names := make([]string, 0, len(catalogue))
	for n := range catalogue {
		names = append(names, n)
	}
	slices.Sort(names)
	return names
}
