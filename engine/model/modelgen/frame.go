package modelgen

import "gusset/engine/model"

// Frame2D returns a 2D rigid frame of beams: bays ≥ 1 bays of 6 m and
// storeys ≥ 1 storeys of 3.5 m. Node (i, s) (column line i, level s, level
// 0 at the base) is n{s·(bays+1)+i}. Members: (bays+1)·storeys columns
// then bays·storeys beams, all type "beam"; (bays+1)·(storeys+1) nodes.
// Column bases are fixed (x, y, rz). Load case "gravity" applies −20 kN
// along y at every floor node; case "lateral" applies +10 kN along x at the
// left node of every floor; combination "ultimate" is 1.35·gravity +
// 1.5·lateral. Frame2D panics unless bays, storeys ≥ 1.
func Frame2D(bays, storeys int) *model.Spec {
	if bays < 1 || storeys < 1 {
		panic("modelgen: Frame2D needs bays, storeys ≥ 1")
	}
	const bay, storey = 6.0, 3.5
	b := newBuilder(2, (bays+1)*(storeys+1), (2*bays+1)*storeys)
	id := func(i, s int) int { return s*(bays+1) + i }
	for s := 0; s <= storeys; s++ {
		for i := 0; i <= bays; i++ {
			b.node(float64(i)*bay, float64(s)*storey)
		}
	}
	for s := range storeys {
		for i := 0; i <= bays; i++ {
			b.member(id(i, s), id(i, s+1), "beam")
		}
	}
	for s := 1; s <= storeys; s++ {
		for i := range bays {
			b.member(id(i, s), id(i+1, s), "beam")
		}
	}
	for i := 0; i <= bays; i++ {
		b.support(id(i, 0), "x", "y", "rz")
	}
	for s := 1; s <= storeys; s++ {
		for i := 0; i <= bays; i++ {
			b.load(0, "gravity", id(i, s), 0, -20)
		}
	}
	for s := 1; s <= storeys; s++ {
		b.load(1, "lateral", id(0, s), 10, 0)
	}
	b.spec.Combos = append(b.spec.Combos, ultimate())
	return b.spec
}

// Frame3D returns a 3D rigid frame of beams: nx×ny bays of 6 m in plan and
// storeys of 3.5 m. Node (i, j, s) is n{s·(nx+1)(ny+1) + j·(nx+1) + i}.
// Members: (nx+1)(ny+1)·storeys columns, then at each floor the beams along
// x and along y, storeys·(nx(ny+1) + ny(nx+1)) beams, all type "beam" with
// the default orientation. Column bases are fixed in all six components.
// Load case "gravity" applies −20 kN along z at every floor node; case
// "lateral" applies +10 kN along x at the nodes of the x = 0 face above
// the base; combination "ultimate" is 1.35·gravity + 1.5·lateral.
// Frame3D panics unless nx, ny, storeys ≥ 1.
func Frame3D(nx, ny, storeys int) *model.Spec {
	if nx < 1 || ny < 1 || storeys < 1 {
		panic("modelgen: Frame3D needs nx, ny, storeys ≥ 1")
	}
	const bay, storey = 6.0, 3.5
	perFloor := (nx + 1) * (ny + 1)
	beams := nx*(ny+1) + ny*(nx+1)
	b := newBuilder(3, perFloor*(storeys+1), (perFloor+beams)*storeys)
	id := func(i, j, s int) int { return s*perFloor + j*(nx+1) + i }
	for s := 0; s <= storeys; s++ {
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				b.node(float64(i)*bay, float64(j)*bay, float64(s)*storey)
			}
		}
	}
	for s := range storeys {
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				b.member(id(i, j, s), id(i, j, s+1), "beam")
			}
		}
	}
	for s := 1; s <= storeys; s++ {
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				if i < nx {
					b.member(id(i, j, s), id(i+1, j, s), "beam")
				}
				if j < ny {
					b.member(id(i, j, s), id(i, j+1, s), "beam")
				}
			}
		}
	}
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			b.support(id(i, j, 0), "x", "y", "z", "rx", "ry", "rz")
		}
	}
	for s := 1; s <= storeys; s++ {
		for j := 0; j <= ny; j++ {
			for i := 0; i <= nx; i++ {
				b.load(0, "gravity", id(i, j, s), 0, 0, -20)
			}
		}
	}
	for s := 1; s <= storeys; s++ {
		for j := 0; j <= ny; j++ {
			b.load(1, "lateral", id(0, j, s), 10, 0, 0)
		}
	}
	b.spec.Combos = append(b.spec.Combos, ultimate())
	return b.spec
}

// ultimate is 1.35·gravity + 1.5·lateral (partial factors in the style of
// the Eurocode ultimate limit state, common practice).
func ultimate() model.CombinationSpec {
	return model.CombinationSpec{ID: "ultimate", Factors: map[string]float64{"gravity": 1.35, "lateral": 1.5}}
}
