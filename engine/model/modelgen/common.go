package modelgen

import (
	"strconv"

	"gusset/engine/model"
)

// The material and section shared by every generated model.
const (
	MaterialID = "steel"
	SectionID  = "tube"
)

// Steel returns the material every generated model uses: E = 2.1e8 kN/m²,
// weight density 77 kN/m³, tension and compression limits 2.35e5 kN/m²,
// carbon factor 1.5 kg CO2e/kg (typical structural steel, common practice).
func Steel() model.MaterialSpec {
	return model.MaterialSpec{
		ID:               MaterialID,
		ElasticModulus:   model.Num(2.1e8),
		WeightDensity:    value(77),
		TensionLimit:     value(2.35e5),
		CompressionLimit: value(2.35e5),
		CarbonFactor:     value(1.5),
	}
}

// Tube returns the section every generated model uses: area 2e-3 m² and
// second moment 3e-6 m⁴ (in 3D the compiler defaults the other axis to the
// same value and the torsion constant to twice it).
func Tube() model.SectionSpec {
	return model.SectionSpec{
		ID:           SectionID,
		Area:         model.Num(2e-3),
		SecondMoment: value(3e-6),
	}
}

// Must compiles spec and panics if it does not compile; for tests and
// benchmarks that feed it a generator's output.
func Must(spec *model.Spec) *model.Model {
	m, err := model.Compile(spec)
	if err != nil {
		panic("modelgen: " + err.Error())
	}
	return m
}

func value(x float64) *model.Value {
	v := model.Num(x)
	return &v
}

// builder accumulates nodes and members with sequential ids.
type builder struct {
	spec *model.Spec
}

func newBuilder(dim, nodes, members int) *builder {
	return &builder{spec: &model.Spec{
		Dimension: dim,
		Units:     model.UnitsSpec{Length: "m", Force: "kN"},
		Materials: []model.MaterialSpec{Steel()},
		Sections:  []model.SectionSpec{Tube()},
		Nodes:     make([]model.NodeSpec, 0, nodes),
		Members:   make([]model.MemberSpec, 0, members),
	}}
}

func nodeID(i int) string   { return "n" + strconv.Itoa(i) }
func memberID(i int) string { return "m" + strconv.Itoa(i) }

// node adds a node and returns its index.
func (b *builder) node(at ...float64) int {
	i := len(b.spec.Nodes)
	vals := make([]model.Value, len(at))
	for k, x := range at {
		vals[k] = model.Num(x)
	}
	b.spec.Nodes = append(b.spec.Nodes, model.NodeSpec{ID: nodeID(i), At: vals})
	return i
}

// member adds a member of the given type ("bar" or "beam") from node i to
// node j and returns its index.
func (b *builder) member(i, j int, kind string) int {
	e := len(b.spec.Members)
	b.spec.Members = append(b.spec.Members, model.MemberSpec{
		ID:       memberID(e),
		Ends:     [2]string{nodeID(i), nodeID(j)},
		Material: MaterialID,
		Section:  SectionID,
		Type:     kind,
	})
	return e
}

func (b *builder) support(i int, fix ...string) {
	b.spec.Supports = append(b.spec.Supports, model.SupportSpec{Node: nodeID(i), Fix: fix})
}

// load adds a nodal force to load case c, creating cases as needed.
func (b *builder) load(c int, id string, i int, force ...float64) {
	for len(b.spec.LoadCases) <= c {
		b.spec.LoadCases = append(b.spec.LoadCases, model.LoadCaseSpec{})
	}
	lc := &b.spec.LoadCases[c]
	lc.ID = id
	vals := make([]model.Value, len(force))
	for k, x := range force {
		vals[k] = model.Num(x)
	}
	lc.Loads = append(lc.Loads, model.NodalLoadSpec{Node: nodeID(i), Force: vals})
}
