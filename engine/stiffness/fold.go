package stiffness

import "sync"

// caseFold hands each recovered case to Options.Fold and keeps what the
// closing notes need of the cases it drops: the members' unchecked flags
// and whether any bending check was made.
type caseFold struct {
	mu      sync.Mutex
	fold    func(index int, c *CaseResult) bool
	flags   []uint16 // per member, the unchecked flags of the dropped cases
	bending bool     // a dropped case made a bending check
	dropped bool     // some case was dropped
}

// keep stores case i's result in res, or, when Options.Fold is set and
// returns false, only its summary (see Options.Fold). Safe for concurrent
// use by the recovering goroutines; Fold is called one case at a time.
func (r *run) keep(i int, cr *CaseResult) {
	if r.opt.Fold == nil {
		r.res.Cases[i] = *cr
		return
	}
	f := r.folding()
	f.mu.Lock()
	defer f.mu.Unlock()
	if f.fold(i, cr) {
		r.res.Cases[i] = *cr
		return
	}
	if f.flags == nil {
		f.flags = make([]uint16, len(r.m.Members))
	}
	var scratch MemberResult
	for e := range cr.MemberCount() {
		r := cr.Member(e, &scratch)
		f.flags[e] |= r.Unchecked
		f.bending = f.bending || r.BendingUtilisation >= 0
	}
	f.dropped = true
	r.res.Cases[i] = summaryOf(cr)
}

// folding returns the run's caseFold, made on first use.
func (r *run) folding() *caseFold {
	r.foldOnce.Do(func() { r.fold = &caseFold{fold: r.opt.Fold} })
	return r.fold
}

// summaryOf is a dropped case's result: its id, kind and scalars, without
// the per-node and per-member arrays.
func summaryOf(cr *CaseResult) CaseResult {
	return CaseResult{ID: cr.ID, Combination: cr.Combination, Residual: cr.Residual, LoadSum: cr.LoadSum,
		ReactionSum: cr.ReactionSum, BalanceError: cr.BalanceError, MaxDisplacement: cr.MaxDisplacement, MaxMoment: cr.MaxMoment}
}

// caseNotes sets the result's unchecked list and the bending caveat over
// every case, the dropped ones included.
func (r *run) caseNotes() {
	flags := memberUncheckedFlags(r.m, r.res.Cases)
	bending := bendingCaveat(r.m, r.res.Cases)
	if f := r.fold; f != nil && f.dropped {
		for e, fl := range f.flags {
			flags[e] |= fl
		}
		if bending == nil && f.bending {
			bending = []string{bendingCaveatText}
		}
	}
	r.res.Unchecked = uncheckedNotesOf(r.m, flags, maxUncheckedNotes)
	r.res.Warnings = append(r.res.Warnings, bending...)
}
