package main

import (
	"fmt"
	"io"
	"runtime"
	"slices"
	"time"
)

// median returns the median of the values that pick takes from each run.
func median[T any](runs []T, pick func(T) float64) float64 {
	v := make([]float64, len(runs))
	for i, r := range runs {
		v[i] = pick(r)
	}
	slices.Sort(v)
	if n := len(v); n%2 == 1 {
		return v[n/2]
	} else {
		return (v[n/2-1] + v[n/2]) / 2
	}
}

func sec(d time.Duration) float64 { return d.Seconds() }

// report prints the summary across models and then each model's phases.
func report(w io.Writer, rows []measurement) {
	fmt.Fprintf(w, "# Gusset beside CHOLMOD\n\n%s, %d CPUs; medians of interleaved repeats.\n\n", runtime.Version(), runtime.NumCPU())
	fmt.Fprintln(w, "| model | members | equations | request MB | whole request s | CHOLMOD a+f+s s | ratio | our a+f+s s | ratio | peak MiB | CHOLMOD peak MiB | ratio | nnz(L) ours | nnz(L) CHOLMOD | rel. diff. u |")
	fmt.Fprintln(w, "|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|")
	for _, m := range rows {
		wholeS := median(m.wholes, func(x whole) float64 { return sec(x.wall) })
		refS := median(m.references, func(r reference) float64 { return r.Analyse + r.Factorise + r.Solve })
		oursS := median(m.runs, func(r ours) float64 { return sec(r.sysOrder + r.sysSymbolic + r.sysNumeric + r.sysSolve) })
		peak := median(m.wholes, func(x whole) float64 { return float64(x.peakKiB) / 1024 })
		refPeak := median(m.references, func(r reference) float64 { return float64(r.PeakRSSKiB) / 1024 })
		refL := median(m.references, func(r reference) float64 { return r.NonzerosL })
		fmt.Fprintf(w, "| %s | %d | %d | %.1f | %.3f | %.3f | %.2f× | %.3f | %.2f× | %.0f | %.0f | %.2f× | %d | %.0f | %.1e |\n",
			m.name, m.members, m.equations, float64(m.requestBytes)/1e6, wholeS, refS, wholeS/refS, oursS, oursS/refS,
			peak, refPeak, peak/refPeak, m.nonzerosL, refL, m.relativeDifference)
	}
	for _, m := range rows {
		phases(w, m)
	}
}

// phases prints one model's per-phase table.
func phases(w io.Writer, m measurement) {
	med := func(pick func(ours) time.Duration) float64 {
		return median(m.runs, func(r ours) float64 { return sec(pick(r)) })
	}
	ref := func(pick func(reference) float64) float64 { return median(m.references, pick) }
	wholeS := median(m.wholes, func(x whole) float64 { return sec(x.wall) })
	inProcess := med(func(r ours) time.Duration {
		return r.decode + r.compile + r.assemble + r.order + r.factor + r.solve + r.recoverAll
	})
	fmt.Fprintf(w, "\n## %s\n\n%d members, %d equations, request %.1f MB, response %.1f MB.\n\n",
		m.name, m.members, m.equations, float64(m.requestBytes)/1e6,
		median(m.wholes, func(x whole) float64 { return float64(x.outSize) / 1e6 }))
	fmt.Fprintln(w, "| phase | Gusset s | CHOLMOD s |")
	fmt.Fprintln(w, "|---|---:|---:|")
	row := func(name string, ours float64, reference string) {
		fmt.Fprintf(w, "| %s | %.3f | %s |\n", name, ours, reference)
	}
	row("request: JSON decode (in process, protocol.DecodeStrict)", med(func(r ours) time.Duration { return r.decode }), "")
	row("request: compile", med(func(r ours) time.Duration { return r.compile }), "")
	row("request: assemble", med(func(r ours) time.Duration { return r.assemble }), "")
	row("request: order + symbolic", med(func(r ours) time.Duration { return r.order }), "")
	row("request: numeric factorisation", med(func(r ours) time.Duration { return r.factor }), "")
	row("request: solve", med(func(r ours) time.Duration { return r.solve }), "")
	row("request: recover", med(func(r ours) time.Duration { return r.recoverAll }), "")
	row("request: the rest (process, validation, encode, write = whole − above)", wholeS-inProcess, "")
	row("whole request through the binary", wholeS, fmt.Sprintf("%.3f (analyse + factorise + solve)", ref(func(r reference) float64 { return r.Analyse + r.Factorise + r.Solve })))
	row("system: ordering + symbolic", med(func(r ours) time.Duration { return r.sysOrder + r.sysSymbolic }), fmt.Sprintf("%.3f (analyse, %s)", ref(func(r reference) float64 { return r.Analyse }), m.references[0].Ordering))
	numeric := med(func(r ours) time.Duration { return r.sysNumeric })
	refNumeric := ref(func(r reference) float64 { return r.Factorise })
	row("system: numeric factorisation", numeric, fmt.Sprintf("%.3f", refNumeric))
	row("system: solve", med(func(r ours) time.Duration { return r.sysSolve }), fmt.Sprintf("%.3f", ref(func(r reference) float64 { return r.Solve })))
	refFlops := ref(func(r reference) float64 { return r.Flops })
	fmt.Fprintf(w, "\nnnz(L) %d against %.0f; flops %.3g against %.3g; numeric %.1f GFLOP/s against %.1f GFLOP/s.\n",
		m.nonzerosL, ref(func(r reference) float64 { return r.NonzerosL }), m.flops, refFlops, m.flops/numeric/1e9, refFlops/refNumeric/1e9)
	fmt.Fprintf(w, "Peak resident memory: whole request %.0f MiB; CHOLMOD process %.0f MiB (%.0f MiB after reading the matrix; CHOLMOD's own allocations %.0f MiB).\n",
		median(m.wholes, func(x whole) float64 { return float64(x.peakKiB) / 1024 }),
		ref(func(r reference) float64 { return float64(r.PeakRSSKiB) / 1024 }),
		ref(func(r reference) float64 { return float64(r.InputRSSKiB) / 1024 }),
		ref(func(r reference) float64 { return float64(r.PeakBytes) / (1 << 20) }))
}
