package main

import (
	"os"
	"path/filepath"

	"gusset/protocol"
)

// crossBeam checks one of the deck's cross-beams in bending: a 3 m steel
// I beam (IPE 200, given by its shape) spanning between the two trusses'
// bottom chords at a panel point, carrying 3 m of deck. Its loads follow
// the footbridge's: dead 1.2 kN/m² and its own weight, crowd 5 kN/m², and
// ultimate = 1.35 dead + 1.5 crowd (the setting is invented for the demo).
func (d *demo) crossBeam() error {
	const span, panel = 3.0, 3.0
	model := map[string]any{
		"dimension": 2,
		"materials": []map[string]any{{"id": "steel", "elastic_modulus": 2.1e8, "weight_density": 77,
			"tension_limit": 3.55e5, "compression_limit": 3.55e5}},
		"sections": []map[string]any{{"id": "IPE 200", "shape": map[string]any{"kind": "i", "depth": 0.2, "width": 0.1,
			"web_thickness": 0.0056, "flange_thickness": 0.0085, "root_radius": 0.012}}},
		"nodes":    []map[string]any{{"id": "north chord", "at": []float64{0, 0}}, {"id": "south chord", "at": []float64{span, 0}}},
		"members":  []map[string]any{{"id": "cross-beam", "ends": []string{"north chord", "south chord"}, "material": "steel", "section": "IPE 200", "type": "beam"}},
		"supports": []map[string]any{{"node": "north chord", "fix": []string{"x", "y"}}, {"node": "south chord", "fix": []string{"y"}}},
		"load_cases": []map[string]any{
			{"id": "dead", "self_weight": true, "member_loads": []map[string]any{{"member": "cross-beam", "kind": "uniform", "value": []float64{0, -1.2 * panel}}}},
			{"id": "crowd", "member_loads": []map[string]any{{"member": "cross-beam", "kind": "uniform", "value": []float64{0, -5 * panel}}}},
		},
		"combinations": []map[string]any{{"id": "ultimate", "factors": map[string]float64{"dead": 1.35, "crowd": 1.5}}},
	}
	var solved protocol.SolveResult
	if err := d.call("solve", map[string]any{"model": model, "cases": []string{"ultimate", "crowd"}, "picture": true}, &solved); err != nil {
		return err
	}
	ult, crowd := solved.Cases[0], solved.Cases[1]
	beam := ult.Members[0]
	d.say("2b. Deck cross-beam in bending (solve along the member; IPE 200 from its shape)\n")
	d.say("   ultimate: largest moment %.1f kN·m at %.2f m (the deck alone, 1.35·3.6 + 1.5·15 kN/m × 3²/8 = 30.8 by hand),\n",
		beam.PeakMomentZ.Value, beam.PeakMomentZ.At)
	d.say("             bending utilisation %.2f, shear at the ends %.1f kN\n", value(beam.BendingUtilisation), -beam.ShearY[0])
	sag := -crowd.Members[0].PeakDeflectionY.Value
	d.say("   crowd:    deflection %.1f mm at mid-span = span/%.0f\n", 1000*sag, span/sag)
	if len(solved.Unchecked) == 0 {
		d.say("   Every check was made (axial, bending, combined).\n")
	} else {
		for _, p := range solved.Unchecked {
			d.say("   Not checked: %s (%s)\n", p.Message, p.Path)
		}
	}
	file := filepath.Join(d.dir, "cross-beam-moments.svg")
	if err := os.WriteFile(file, []byte(solved.Picture), 0o644); err != nil {
		return err
	}
	d.say("   Moment diagram and deflected shape: %s\n\n", file)
	return nil
}

// value reads an optional number, NaN-free: a check not made prints as −1.
func value(p *float64) float64 {
	if p == nil {
		return -1
	}
	return *p
}
