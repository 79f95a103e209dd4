package main

import (
	"fmt"
	"os"
	"path/filepath"

	"gusset/protocol"
)

// Rise of the arch alternative and the towpath headroom that bounds it.
const (
	archRise   = 3.0 // m, the crown the demo first asks for
	archPanels = 8
	archPanel  = 3.0 // m
)

// archAlternative finds the funicular alternative of the demo's setting:
// a compression arch under the Brannock Cut deck, springing from the two
// canal abutments, carrying the ultimate deck loads at its seven panel
// points through spandrel posts. find-form puts its thrust line through a
// crown 3 m up; sweep-parameter then varies the crown height on the model
// find-form returned and finds the rise of least load path.
func (d *demo) archAlternative() error {
	w := 1.35*10.8 + 1.5*45 // kN per panel point, as in bestLayout
	var nodes, members, loads []map[string]any
	for i := 0; i <= archPanels; i++ {
		nodes = append(nodes, map[string]any{"id": fmt.Sprintf("K%d", i), "at": []float64{archPanel * float64(i), 0}})
		if i > 0 {
			members = append(members, map[string]any{"id": fmt.Sprintf("R%d", i), "ends": []string{fmt.Sprintf("K%d", i-1), fmt.Sprintf("K%d", i)},
				"material": "sandstone", "section": "ring"})
		}
		if i > 0 && i < archPanels {
			loads = append(loads, map[string]any{"node": fmt.Sprintf("K%d", i), "force": []float64{0, -w}})
		}
	}
	arch := map[string]any{
		"dimension": 2, "units": map[string]string{"length": "m", "force": "kN"},
		"materials": []map[string]any{{"id": "sandstone", "elastic_modulus": 1.5e7, "compression_limit": 4000}},
		"sections":  []map[string]any{{"id": "ring", "area": 0.6}},
		"nodes":     nodes, "members": members,
		"supports":   []map[string]any{{"node": "K0", "fix": []string{"x", "y"}}, {"node": fmt.Sprintf("K%d", archPanels), "fix": []string{"x", "y"}}},
		"load_cases": []map[string]any{{"id": "ultimate deck", "loads": loads}},
	}
	crown := fmt.Sprintf("K%d", archPanels/2)
	var found protocol.FindFormResult
	params := map[string]any{"model": arch, "force_density": -1, "picture": true,
		"through": map[string]any{"node": crown, "at": []float64{archPanel * archPanels / 2, archRise}}}
	if err := d.call("find-form", params, &found); err != nil {
		return err
	}
	h := found.Reactions[0].Force[0]
	d.say("\n6. A funicular alternative (find-form): a sandstone arch under the deck, through a crown %.0f m up\n", archRise)
	d.say("   Force density %.2f kN/m in every voussoir line (compression), horizontal thrust %.1f kN on each abutment,\n", found.ForceDensities[0], h)
	d.say("   ring forces %.1f to %.1f kN; load path %.1f kN·m, Maxwell residual %.1e; equilibrium residual %.1e.\n",
		found.Forces[archPanels/2], found.Forces[0], found.LoadPath.LoadPath, found.LoadPath.RelativeResidual, found.Residual)
	file := filepath.Join(d.dir, "funicular-arch.svg")
	if err := os.WriteFile(file, []byte(found.Picture), 0o644); err != nil {
		return err
	}
	d.say("   Drawing: %s\n", file)
	var sw protocol.SweepResult
	sweep := map[string]any{"model": found.Model, "cases": []string{found.ModelCase}, "metrics": []string{"load_path"},
		"parameters": []map[string]any{{"name": found.RiseParameter, "from": 1, "to": 16, "count": 16}},
		"objective":  map[string]any{"metric": "load_path", "tolerance": 1e-8}}
	if err := d.call("sweep-parameter", sweep, &sw); err != nil {
		return err
	}
	r := sw.Refinement
	if r == nil || len(r.Values) == 0 {
		return fmt.Errorf("the rise sweep found no optimum")
	}
	d.say("   Rise study (sweep-parameter over the returned model's %q, 1–16 m): least load path %.1f kN·m\n", found.RiseParameter, r.Objective)
	d.say("   at a rise of %.3f m (span/rise %.2f), %.0f%% below the %.0f m arch; the towpath headroom decides.\n",
		r.Values[0], archPanel*archPanels/r.Values[0], 100*(1-r.Objective/found.LoadPath.LoadPath), archRise)
	return nil
}
