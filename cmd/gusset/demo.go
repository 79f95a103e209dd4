package main

import (
	"bytes"
	"context"
	_ "embed"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"gusset/cmd/gusset/adapter"
	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// footbridge is the demo scenario, of our own invention: the Brannock Cut
// footbridge in the market town of Esker Vale, a 24 m steel truss of eight
// 3 m panels carrying a 3 m wide deck over a canal. Its depth is a
// parameter; the deck's dead load (1.2 kN/m²) and a crowd load (5 kN/m²)
// reach the bottom-chord nodes.
//
//go:embed scenario/footbridge.json
var footbridge []byte

// deckArea is the deck the bridge serves: 24 m × 3 m.
const deckArea = 72.0

// demo holds the state of one demo run: a server driven in-process through
// the real protocol, and the output folder.
type demo struct {
	out    io.Writer
	dir    string
	server *jsonrpc.Server
	model  json.RawMessage
	next   int
	// answers are the requests and results so far, for report.html.
	answers []answered
}

func runDemo(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("gusset demo", flag.ContinueOnError)
	fs.SetOutput(stderr)
	dir := fs.String("out", "gusset-demo", "folder to write the pictures into")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if err := os.MkdirAll(*dir, 0o755); err != nil {
		fmt.Fprintf(stderr, "gusset demo: %v\n", err)
		return 1
	}
	s, err := newServer(protocol.Limits{}, stderr)
	if err != nil {
		fmt.Fprintf(stderr, "gusset demo: %v\n", err)
		return 1
	}
	d := &demo{out: stdout, dir: *dir, server: s, model: footbridge}
	start := time.Now()
	if err := d.run(); err != nil {
		fmt.Fprintf(stderr, "gusset demo: %v\n", err)
		return 1
	}
	report := filepath.Join(*dir, "report.html")
	if err := writeReport(report, "Gusset demo: the Brannock Cut footbridge, Esker Vale", d.answers); err != nil {
		fmt.Fprintf(stderr, "gusset demo: %v\n", err)
		return 1
	}
	fmt.Fprintf(stdout, "\nDone in %d ms. Pictures are in %s/; the whole study in one page: %s\n\n%s\n",
		time.Since(start).Milliseconds(), *dir, report, adapter.Caution)
	return 0
}

// call sends one request through the protocol and decodes its result.
func (d *demo) call(method string, params map[string]any, result any) error {
	d.next++
	req, err := json.Marshal(map[string]any{"jsonrpc": "2.0", "id": d.next, "method": method, "params": params})
	if err != nil {
		return err
	}
	var out bytes.Buffer
	if _, err := d.server.Serve(context.Background(), bytes.NewReader(append(req, '\n')), &out); err != nil {
		return err
	}
	for _, line := range bytes.Split(bytes.TrimSpace(out.Bytes()), []byte("\n")) {
		var msg struct {
			Method string          `json:"method"`
			Result json.RawMessage `json:"result"`
			Error  *protocol.Error `json:"error"`
		}
		if err := json.Unmarshal(line, &msg); err != nil {
			return err
		}
		if msg.Method != "" {
			continue
		}
		if msg.Error != nil {
			return fmt.Errorf("%s failed: %s", method, msg.Error.Message)
		}
		if err := json.Unmarshal(msg.Result, result); err != nil {
			return err
		}
		p, _ := json.Marshal(params)
		id := json.RawMessage(strconv.Itoa(d.next))
		d.answers = append(d.answers, answered{ID: id, Method: method, Params: p,
			Response: &protocol.Response{JSONRPC: "2.0", ID: id, Result: result}})
		return nil
	}
	return fmt.Errorf("%s: no response", method)
}

func (d *demo) say(format string, args ...any) {
	fmt.Fprint(d.out, withoutNegativeZeros(fmt.Sprintf(format, args...)))
}

func (d *demo) run() error {
	var model struct {
		Members []struct {
			ID string `json:"id"`
		} `json:"members"`
		Parameters map[string]float64 `json:"parameters"`
	}
	if err := json.Unmarshal(d.model, &model); err != nil {
		return err
	}
	d.say("Gusset demo: the Brannock Cut footbridge, Esker Vale\n")
	d.say("A 24 m steel truss of eight 3 m panels, %.1f m deep, carrying a 3 m deck over the canal.\n", model.Parameters["depth"])
	d.say("Load cases: dead (self-weight and a 1.2 kN/m² deck), crowd (5 kN/m²); combination ultimate = 1.35 dead + 1.5 crowd.\n\n")

	ids := make([]string, len(model.Members))
	for i, m := range model.Members {
		ids[i] = m.ID
	}
	governing, err := d.analysis(ids)
	if err != nil {
		return err
	}
	if err := d.diagrams(governing); err != nil {
		return err
	}

	if err := d.crossBeam(); err != nil {
		return err
	}
	if err := d.deckBay(); err != nil {
		return err
	}

	lp, sizing, err := d.quantities()
	if err != nil {
		return err
	}

	// 4. Depth study.
	if err := d.depthStudy(model.Parameters["depth"], lp.Totals.All.Volume, sizing); err != nil {
		return err
	}

	// 5. The least-material layout for the same span and loads.
	if err := d.bestLayout(*lp); err != nil {
		return err
	}

	// 6. A funicular arch for the same deck (demo_arch.go).
	return d.archAlternative()
}

// analysis runs and reports part 1 (solve of the three cases, with the
// deflected shape written as a picture) and returns the governing case's id.
// ids are the members' ids in model order.
func (d *demo) analysis(ids []string) (string, error) {
	// 1. Analysis.
	var solved protocol.SolveResult
	if err := d.call("solve", map[string]any{"model": d.model, "cases": []string{"ultimate", "dead", "crowd"}, "picture": true}, &solved); err != nil {
		return "", err
	}
	if err := os.WriteFile(filepath.Join(d.dir, "deflected-shape.svg"), []byte(solved.Picture), 0o644); err != nil {
		return "", err
	}
	d.say("1. Stiffness analysis (solve)\n")
	d.say("   Stability: %s\n", solved.Stability.Rule)
	governing := 0
	for i, c := range solved.Cases {
		hi, lo := extremes(c.AxialForces)
		d.say("   %-9s largest tension %7.1f kN (%s), largest compression %7.1f kN (%s)\n", c.ID,
			c.AxialForces[hi], ids[hi], c.AxialForces[lo], ids[lo])
		d.say("%s\n", wrapped("             "+summaryLine(c), "             ", 104))
		// The governing case carries the largest member force: the
		// largest utilisation would pass over a case whose members are
		// left unchecked (bars under their own weight).
		if largestForce(c.AxialForces) > largestForce(solved.Cases[governing].AxialForces) {
			governing = i
		}
	}
	g := solved.Cases[governing]
	d.say("   Reactions (%s):", g.ID)
	for _, r := range g.Reactions {
		d.say(" %s (%.1f, %.1f) kN;", r.Node, r.Force[0], r.Force[1])
	}
	d.say("\n   Governing: %s.", g.ID)
	if len(solved.Warnings) == 0 {
		d.say(" No warnings.\n\n")
	} else {
		d.say("\n   Warnings: %s\n\n", strings.Join(solved.Warnings, "; "))
	}
	return g.ID, nil
}

// quantities runs and reports part 3 (load-path with tubes of D/t = 30 sized
// for every case) and returns the result and the sizing it used.
func (d *demo) quantities() (*protocol.LoadPathResult, map[string]any, error) {
	// 3. Material quantities.
	sizing := map[string]any{"shape": "tube", "diameter_to_thickness": 30}
	var lp protocol.LoadPathResult
	if err := d.call("load-path", map[string]any{"model": d.model, "sizing": sizing, "floor_area": deckArea}, &lp); err != nil {
		return nil, nil, err
	}
	d.say("3. Load path and material (load-path, tubes with D/t = 30, sized for every case)\n")
	for _, c := range lp.Cases {
		d.say("   %-9s Z = %7.1f kN·m (tension %6.1f, compression %6.1f); M = %7.1f; Maxwell residual %.1e\n",
			c.ID, c.LoadPath, c.TensionLoadPath, c.CompressionLoadPath, c.Constant, c.RelativeResidual)
	}
	if len(lp.Warnings) > 0 {
		d.say("%s\n", wrapped("   Left out: "+lp.Warnings[0]+moreCases(len(lp.Warnings)-1), "             ", 104))
	}
	t := lp.Totals.All
	d.say("   Steel: %.3f m³, %.0f kg, %.0f kg CO2e; per m² of deck %.1f kg and %.1f kg CO2e\n\n",
		t.Volume, t.Mass, t.Carbon, lp.Totals.PerFloorArea.Mass, lp.Totals.PerFloorArea.Carbon)
	return &lp, sizing, nil
}

// bestLayout finds the least-volume layout that carries the ultimate deck
// loads within the same 24 m span and a 4 m depth, and compares it with the
// truss sized by stress alone.
func (d *demo) bestLayout(lp protocol.LoadPathResult) error {
	var loads []map[string]any
	for i := 0; i <= 8; i++ {
		w := 1.35*10.8 + 1.5*45 // kN per panel point: 1.35 dead deck + 1.5 crowd
		if i == 0 || i == 8 {
			w /= 2
		}
		loads = append(loads, map[string]any{"at": []float64{3 * float64(i), 0}, "force": []float64{0, -w}})
	}
	params := map[string]any{
		"domain":        map[string]any{"outline": [][]float64{{0, 0}, {24, 0}, {24, 4}, {0, 4}}},
		"divisions":     []int{24, 4},
		"supports":      []map[string]any{{"at": []float64{0, 0}, "fix": []string{"x", "y"}}, {"at": []float64{24, 0}, "fix": []string{"y"}}},
		"cases":         []map[string]any{{"id": "ultimate deck", "loads": loads}},
		"tension_limit": 3.55e5, "compression_limit": 3.55e5, "picture": true,
	}
	var lay protocol.LayoutResult
	if err := d.call("optimise-layout", params, &lay); err != nil {
		return err
	}
	var stressVolume float64
	for _, c := range lp.Cases {
		if c.ID == "ultimate" {
			stressVolume = c.StressVolume
		}
	}
	d.say("\n5. Least-material layout (optimise-layout, ground structure of %d candidates within 24 m × 4 m)\n", lay.Stats.Candidates)
	d.say("   %d members and %.4f m³ of steel sized by stress alone, against %.4f m³ for the 2 m truss under the\n", len(lay.Members), lay.Volume, stressVolume)
	d.say("   ultimate combination, also by stress alone: a bound on what any layout in that space can reach\n")
	d.say("   (buckling and the truss's self-weight left out; Maxwell's residual %.1e kN·m).\n", lay.Cases[0].MaxwellResidual)
	file := filepath.Join(d.dir, "least-material-layout.svg")
	if err := os.WriteFile(file, []byte(lay.Picture), 0o644); err != nil {
		return err
	}
	d.say("   Drawing: %s\n", file)
	return nil
}

// diagrams draws the form and force diagrams of the governing case.
func (d *demo) diagrams(caseID string) error {
	var rec protocol.ReciprocateResult
	if err := d.call("reciprocate", map[string]any{"model": d.model, "case": caseID, "picture": true}, &rec); err != nil {
		return err
	}
	inner := 0
	for _, s := range rec.Spaces {
		if !s.Outer {
			inner++
		}
	}
	d.say("2. Reciprocal force diagram (reciprocate, %s)\n", caseID)
	d.say("   %d spaces lettered round the boundary and %d inner faces numbered, in Bow's notation;\n", len(rec.Spaces)-inner, inner)
	d.say("   load line %s; closure error %.1e kN; Airy stress function: %d ridges (compression), %d valleys (tension).\n",
		strings.Join(rec.LoadLine, "→"), rec.Closure.Max, count(rec.Airy.Folds, "ridge"), count(rec.Airy.Folds, "valley"))
	file := filepath.Join(d.dir, "form-and-force.svg")
	if err := os.WriteFile(file, []byte(rec.Picture), 0o644); err != nil {
		return err
	}
	d.say("   Drawing: %s\n\n", file)
	return nil
}

func count(list []string, s string) int {
	n := 0
	for _, x := range list {
		if x == s {
			n++
		}
	}
	return n
}

// depthStudy sweeps the depth, refines the least-volume depth and plots the
// curve.
func (d *demo) depthStudy(depth, volume float64, sizing map[string]any) error {
	var sw protocol.SweepResult
	params := map[string]any{
		"model":      d.model,
		"parameters": []map[string]any{{"name": "depth", "from": 0.75, "to": 6.0, "count": 22}},
		"metrics":    []string{"volume", "load_path", "mass", "carbon"},
		"sizing":     sizing,
		"objective":  map[string]any{"metric": "volume", "tolerance": 1e-6},
	}
	if err := d.call("sweep-parameter", params, &sw); err != nil {
		return err
	}
	d.say("4. Depth study (sweep-parameter over 0.75–6 m, %d steps, refined by Brent's method)\n", sw.Total)
	r := sw.Refinement
	if r == nil || len(r.Values) == 0 {
		return fmt.Errorf("the sweep found no optimum")
	}
	best := r.Values[0]
	d.say("   Least steel at depth %.3f m: %.3f m³ (%.0f kg, %.0f kg CO2e), against %.3f m³ at %.1f m: %.0f%% less.\n",
		best, r.Objective, r.Metrics["mass"], r.Metrics["carbon"], volume, depth, 100*(1-r.Objective/volume))
	d.say("   Span/depth at the optimum: %.1f. %d evaluations beyond the sweep.\n", 24/best, r.Evaluations)
	file := filepath.Join(d.dir, "depth-study.svg")
	if err := plotSweep(file, sw, best, r.Objective); err != nil {
		return err
	}
	d.say("   Curve: %s\n", file)
	return d.modalStudy(sizing, best, r.Objective)
}

// extremes returns the indices of the largest and smallest values.
func extremes(x []float64) (hi, lo int) {
	for i, v := range x {
		if v > x[hi] {
			hi = i
		}
		if v < x[lo] {
			lo = i
		}
	}
	return hi, lo
}

// largestForce returns the largest absolute axial force.
func largestForce(forces []float64) float64 {
	var most float64
	for _, n := range forces {
		most = max(most, math.Abs(n))
	}
	return most
}
