package adapter

import (
	"bytes"
	"context"
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/modes"
	"gusset/engine/render"
	"gusset/engine/stiffness"
	"gusset/protocol"
)

// modesCaution adds to Caution what linear modal results leave out.
const modesCaution = Caution + " These are linear results for the perfect structure (bifurcation and small vibration): imperfections, nonlinearity and the design codes govern real design."

// modes finds the buckling load factors or natural frequencies of the
// request's model.
func (a *Adapter) modes(ctx context.Context, r *request[protocol.ModesParams]) (*protocol.ModesResult, error) {
	p := r.Params
	m := r.Model
	opt := modes.Options{Count: p.Count, Case: p.Case, Reporter: r.Stream}
	if p.Case != "" && m.CaseIndex(p.Case) < 0 && m.CombinationIndex(p.Case) < 0 {
		return nil, protocol.NewError(fault.UnknownCase.Code(), fault.UnknownCase.String(),
			fmt.Sprintf("no load case or combination is called %q", p.Case), protocol.Problem{Path: "/params/case", Message: "not a case or combination of the model"})
	}
	var res *modes.Result
	var err error
	if p.Kind == string(modes.KindBuckling) {
		if p.Shift != nil {
			opt.Shift = *p.Shift
		}
		res, err = modes.Buckling(ctx, m, opt)
	} else {
		if p.Shift != nil {
			w := 2 * math.Pi * *p.Shift
			opt.Shift = w * w
		}
		res, err = modes.Vibration(ctx, m, opt)
	}
	if err != nil {
		return nil, modesError(err, p.Shift != nil)
	}
	out := modesResult(m, res)
	if p.Kind == string(modes.KindVibration) && p.Case != "" {
		out.Warnings = append(out.Warnings, protocol.Problem{Path: "/params/case",
			Message: "vibration does not use a load case: the structure vibrates about its unloaded form, without the stiffening or softening of the case's axial forces"})
	}
	if p.Picture && len(res.Modes) > 0 {
		var svg bytes.Buffer
		if err := render.Mode(&svg, m, modePicture(res), render.Options{}); err != nil {
			return nil, err
		}
		out.Picture = svg.String()
	}
	return out, nil
}

// modesError locates an engine error of modes in the request.
func modesError(err error, shifted bool) error {
	fe, ok := fault.As(err)
	if !ok {
		return err
	}
	switch {
	case fe.Kind == fault.NoSolution && shifted && len(fe.Problems) == 0:
		e := located("", fe)
		e.Data.Problems = append(e.Data.Problems, protocol.Problem{Path: "/params/shift", Message: fe.Message})
		return e
	case fe.Kind == fault.NoSolution:
		return located("/params", fe)
	case fe.Kind == fault.Unstable:
		e := located("/params/model", fe)
		if mm, ok := fe.Detail.(*stiffness.Mechanism); ok {
			e.Data.Detail = mechanismOf(mm)
		}
		return e
	}
	return located("/params/model", fe)
}

// modesResult converts the engine's modes.
func modesResult(m *model.Model, res *modes.Result) *protocol.ModesResult {
	out := &protocol.ModesResult{Kind: string(res.Kind), Case: res.Case, Modes: []protocol.ModeResult{},
		TotalMass: res.TotalMass, Warnings: []protocol.Problem{}, Caution: modesCaution,
		Stats: protocol.ModesStats{Equations: res.Stats.Equations, Iterations: res.Stats.Iterations, Solves: res.Stats.Solves,
			Restarts: res.Stats.Restarts, Factorisations: res.Stats.Factorisations, Converged: res.Stats.Converged}}
	for i, md := range res.Modes {
		mr := protocol.ModeResult{Number: i + 1, Displacements: md.Displacements, Rotations: finiteRows(md.Rotations),
			Residual: md.Residual, Mechanism: md.Mechanism}
		if res.Kind == modes.KindBuckling {
			mr.Factor, mr.LoadReversal = ptr(md.Factor), md.LoadReversal
		} else {
			mr.Frequency, mr.AngularFrequency = ptr(md.Frequency), ptr(md.Angular)
			mr.Participation, mr.EffectiveMass = md.Participation, md.EffectiveMass
			if !md.Mechanism && out.FirstFrequency == nil {
				out.FirstFrequency = ptr(md.Frequency)
			}
		}
		out.Modes = append(out.Modes, mr)
	}
	if res.HasCritical {
		out.CriticalFactor = ptr(res.Critical)
	} else if res.Kind == modes.KindBuckling {
		out.Warnings = append(out.Warnings, protocol.Problem{Path: "/params/count",
			Message: fmt.Sprintf("none of the %d factors found is positive: the case's loads do not buckle the structure within them (ask for more modes, or a shift above zero)", len(res.Modes))})
	}
	for _, w := range res.Warnings {
		out.Warnings = append(out.Warnings, protocol.Problem{Path: "/params/model" + w.Path, Message: w.Message})
	}
	return out
}

func ptr(x float64) *float64 { return &x }

// modePicture describes the first mode for render.Mode.
func modePicture(res *modes.Result) render.ModeShape {
	md := res.Modes[0]
	shape := render.ModeShape{Displacements: md.Displacements, Rotations: md.Rotations}
	if res.Kind == modes.KindBuckling {
		shape.Heading = fmt.Sprintf("Buckling mode 1 of %q: load factor %.4g", res.Case, md.Factor)
		shape.Notes = []string{"Linear bifurcation of the perfect structure; imperfections and nonlinearity lower real capacity."}
		if md.LoadReversal {
			shape.Notes = append(shape.Notes, "A negative factor: the structure buckles under the reversed loads.")
		}
	} else {
		shape.Heading = fmt.Sprintf("Vibration mode 1: %.4g Hz (ω = %.4g rad/s)", md.Frequency, md.Angular)
		shape.Notes = []string{"Small free vibration about the unloaded form, consistent mass."}
	}
	return shape
}
