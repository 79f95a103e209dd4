package main

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"gusset/protocol"
)

// The demo client's brief for the footbridge's stability and liveliness
// (invented for the demo): a linear buckling factor of at least 200 under
// the ultimate combination, a margin for the out-of-plane and member
// buckling that this plane pin-jointed model leaves out, and a first
// vertical frequency of at least 5 Hz, above the second harmonic of
// walking (common practice for footbridges).
const (
	demoMinFactor    = 200.0
	demoMinFrequency = 5.0
)

// modalModel returns the demo model with mass: steel at 7.85 t/m³ and the
// deck's dead load (10.8 kN per inner deck node, half at the ends) as
// node masses of load/g (g = 9.81 m/s²).
func (d *demo) modalModel() (json.RawMessage, error) {
	var m map[string]any
	if err := json.Unmarshal(d.model, &m); err != nil {
		return nil, err
	}
	for _, mat := range m["materials"].([]any) {
		mat.(map[string]any)["mass_density"] = 7.85
	}
	for _, n := range m["nodes"].([]any) {
		node := n.(map[string]any)
		id := node["id"].(string)
		switch {
		case id == "L0" || id == "L8":
			node["mass"] = 5.4 / 9.81
		case strings.HasPrefix(id, "L"):
			node["mass"] = 10.8 / 9.81
		}
	}
	return json.Marshal(m)
}

// modalStudy finds the footbridge's buckling factor and first frequency
// at its drawn depth, draws both modes, and repeats the depth study
// subject to the brief's limits, printing the constrained optimum beside
// the unconstrained one (freeDepth, freeVolume).
func (d *demo) modalStudy(sizing map[string]any, freeDepth, freeVolume float64) error {
	model, err := d.modalModel()
	if err != nil {
		return err
	}
	var buckling, vibration protocol.ModesResult
	if err := d.call("modes", map[string]any{"model": model, "kind": "buckling", "case": "ultimate", "count": 3, "picture": true}, &buckling); err != nil {
		return err
	}
	if err := d.call("modes", map[string]any{"model": model, "kind": "vibration", "count": 4, "picture": true}, &vibration); err != nil {
		return err
	}
	for file, svg := range map[string]string{"buckling-mode.svg": buckling.Picture, "vibration-mode.svg": vibration.Picture} {
		if err := os.WriteFile(filepath.Join(d.dir, file), []byte(svg), 0o644); err != nil {
			return err
		}
	}
	if buckling.CriticalFactor == nil || vibration.FirstFrequency == nil {
		return fmt.Errorf("modes found no critical factor or first frequency")
	}
	d.say("   Stability and liveliness (modes: shift-invert Lanczos, %d and %d solves):\n", buckling.Stats.Solves, vibration.Stats.Solves)
	d.say("   At the drawn depth: buckling factor %.1f under ultimate, first frequency %.2f Hz (%.0f%% of the mass moves with it vertically)\n",
		*buckling.CriticalFactor, *vibration.FirstFrequency, 100*vibration.Modes[0].EffectiveMass[1]/vibration.TotalMass[1])
	var sw protocol.SweepResult
	params := map[string]any{
		"model":      model,
		"parameters": []map[string]any{{"name": "depth", "from": 0.75, "to": 6.0, "count": 22}},
		"metrics":    []string{"volume", "critical_load_factor", "first_frequency"},
		"cases":      []string{"ultimate"},
		"sizing":     sizing,
		"objective":  map[string]any{"metric": "volume", "tolerance": 1e-6},
		"constraints": []map[string]any{{"metric": "critical_load_factor", "min": demoMinFactor},
			{"metric": "first_frequency", "min": demoMinFrequency}},
	}
	if err := d.call("sweep-parameter", params, &sw); err != nil {
		return err
	}
	r := sw.Refinement
	if r == nil || len(r.Values) == 0 {
		return fmt.Errorf("the constrained sweep found no optimum: %s", r.Message)
	}
	active := "none (the optimum is interior)"
	if len(r.ActiveConstraints) > 0 {
		limits := []string{fmt.Sprintf("critical_load_factor ≥ %g", demoMinFactor), fmt.Sprintf("first_frequency ≥ %g Hz", demoMinFrequency)}
		var names []string
		for _, k := range r.ActiveConstraints {
			names = append(names, limits[k])
		}
		active = strings.Join(names, ", ")
	}
	d.say("   Least steel, unconstrained:               depth %.3f m, %.4f m³\n", freeDepth, freeVolume)
	d.say("   Least steel with λ ≥ %.0f and f₁ ≥ %.0f Hz:   depth %.3f m, %.4f m³ (λ = %.1f, f₁ = %.2f Hz); active: %s\n",
		demoMinFactor, demoMinFrequency, r.Values[0], r.Objective, r.Metrics["critical_load_factor"], r.Metrics["first_frequency"], active)
	d.say("   Linear results for the perfect truss: imperfections, nonlinearity and the codes govern. Modes: buckling-mode.svg, vibration-mode.svg\n\n")
	return nil
}
