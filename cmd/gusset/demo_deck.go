package main

import (
	"math"
	"os"
	"path/filepath"

	"gusset/protocol"
)

// deckBay checks two bays of the footbridge's deck in space: the bottom
// chords (IPE 300) run 6 m between bearings, three cross-beams (IPE 200)
// span the 3 m between them, pinned at both ends (fin-plate connections:
// each end's major-axis rotation released, and one end's torsion), and the
// deck panels carry the crowd of 5 kN/m² as an area load that spans one
// way, along the bridge, onto the cross-beams. By hand (statics, common
// practice): the middle cross-beam carries 5 × 3 = 15 kN/m, so 15·3²/8 =
// 16.9 kN·m at mid-span and 22.5 kN into each chord at mid-span, where a
// chord's moment is 22.5·6/4 = 33.75 kN·m; the reactions add up to the
// panels' 5 × 18 = 90 kN. The setting is invented for the demo.
func (d *demo) deckBay() error {
	var solved protocol.SolveResult
	if err := d.call("solve", map[string]any{"model": deckBayModel(), "picture": true}, &solved); err != nil {
		return err
	}
	c := solved.Cases[0]
	middle, chord := c.Members[memberIndex("cross-beam 2")], c.Members[memberIndex("north chord 1")]
	total := 0.0
	for _, r := range c.Reactions {
		total += r.Force[2]
	}
	released := 0.0
	for _, e := range []string{"cross-beam 1", "cross-beam 2", "cross-beam 3"} {
		f := c.EndForces[memberIndex(e)]
		released = math.Max(released, math.Max(math.Abs(f[5]), math.Abs(f[11])))
	}
	d.say("2c. Deck bay in space: pinned cross-beams (end releases) under the crowd as an area load\n")
	d.say("   middle cross-beam: largest moment %.1f kN·m at %.2f m (15·3²/8 = 16.9 by hand)\n",
		math.Abs(middle.PeakMomentZ.Value), middle.PeakMomentZ.At)
	d.say("   north chord: largest moment %.1f kN·m (22.5·6/4 = 33.75 by hand); moments at the released ends below %.1g kN·m\n",
		math.Abs(chord.PeakMomentZ.Value), math.Max(released, 1e-12))
	d.say("   the bearings carry %.1f kN up, the panels' 5 × 18 = 90 kN\n", total)
	file := filepath.Join(d.dir, "deck-bay-moments.svg")
	if err := os.WriteFile(file, []byte(solved.Picture), 0o644); err != nil {
		return err
	}
	d.say("   Moment diagrams and deflected shape in space: %s\n\n", file)
	return nil
}

// deckMembers lists the deck bay's members in model order.
var deckMembers = []struct {
	id, from, to, section string
	releases              map[string][]string
}{
	{"north chord 1", "N0", "N1", "IPE 300", nil},
	{"north chord 2", "N1", "N2", "IPE 300", nil},
	{"south chord 1", "S0", "S1", "IPE 300", nil},
	{"south chord 2", "S1", "S2", "IPE 300", nil},
	{"cross-beam 1", "N0", "S0", "IPE 200", pinnedEnds},
	{"cross-beam 2", "N1", "S1", "IPE 200", pinnedEnds},
	{"cross-beam 3", "N2", "S2", "IPE 200", pinnedEnds},
}

// pinnedEnds releases a cross-beam's major-axis rotation at both ends
// (its local z is horizontal, along the bridge) and its torsion at the
// first, so that it neither bends nor twists the chords.
var pinnedEnds = map[string][]string{"first": {"rx", "rz"}, "second": {"rz"}}

func memberIndex(id string) int {
	for i, m := range deckMembers {
		if m.id == id {
			return i
		}
	}
	panic("demo: no deck member " + id)
}

// deckBayModel is the deck bay: x along the bridge, y across, z up.
func deckBayModel() map[string]any {
	var nodes, members []map[string]any
	for i, x := range []float64{0, 3, 6} {
		nodes = append(nodes, map[string]any{"id": "N" + string(rune('0'+i)), "at": []float64{x, 0, 0}},
			map[string]any{"id": "S" + string(rune('0'+i)), "at": []float64{x, 3, 0}})
	}
	for _, m := range deckMembers {
		member := map[string]any{"id": m.id, "ends": []string{m.from, m.to}, "material": "steel", "section": m.section, "type": "beam"}
		if m.releases != nil {
			member["releases"] = m.releases
		}
		members = append(members, member)
	}
	ipe := func(id string, depth, width, web, flange, root float64) map[string]any {
		return map[string]any{"id": id, "shape": map[string]any{"kind": "i", "depth": depth, "width": width,
			"web_thickness": web, "flange_thickness": flange, "root_radius": root}}
	}
	panel := func(nodes ...string) map[string]any {
		return map[string]any{"nodes": nodes, "pressure": 5, "to": "members", "span": "one-way", "span_direction": []float64{1, 0, 0}}
	}
	return map[string]any{
		"dimension": 3,
		"materials": []map[string]any{{"id": "steel", "elastic_modulus": 2.1e8, "tension_limit": 3.55e5, "compression_limit": 3.55e5}},
		"sections":  []map[string]any{ipe("IPE 200", 0.2, 0.1, 0.0056, 0.0085, 0.012), ipe("IPE 300", 0.3, 0.15, 0.0071, 0.0107, 0.015)},
		"nodes":     nodes,
		"members":   members,
		// Bearings at the chords' ends: one fixed, the others sliding,
		// each holding the chord's twist (a fork).
		"supports": []map[string]any{
			{"node": "N0", "fix": []string{"x", "y", "z", "rx"}}, {"node": "S0", "fix": []string{"x", "z", "rx"}},
			{"node": "N2", "fix": []string{"y", "z", "rx"}}, {"node": "S2", "fix": []string{"z", "rx"}},
		},
		"load_cases": []map[string]any{{"id": "crowd", "area_loads": []map[string]any{
			panel("N0", "N1", "S1", "S0"), panel("N1", "N2", "S2", "S1"),
		}}},
	}
}
