// Command refbench measures a whole Gusset solve request beside SuiteSparse
// CHOLMOD (a general-purpose sparse Cholesky used as a reference only) on
// exactly the matrices the engine assembles. It is run by hand through
// testdata/bench/reference/run, which installs Debian's libsuitesparse-dev,
// builds the small C program cholmod_bench and the gusset binary, and calls
//
//	refbench -gusset BIN -cholmod BIN [-models LIST] [-repeat N] [-work DIR]
//
// For each model it writes the solve request and the engine's scaled
// stiffness system (Matrix Market, lower triangle) with the first load
// case's right-hand side, then runs, interleaved and repeated, (a) the whole
// request through the gusset binary (process start to last byte out, and the
// child's peak resident memory, measured through a small spawner process:
// see spawn.go), (b) the engine's phases in process, (c) our
// sparse Cholesky on the exported system and (d) CHOLMOD's analyse, factorise
// and solve on the same file, and prints one Markdown report of medians with
// the ratios, nnz(L), flops, GFLOP/s and the relative difference of the two
// solutions.
package main

import (
	"flag"
	"fmt"
	"os"
	"strings"
)

func main() {
	if len(os.Args) > 1 && os.Args[1] == spawnFlag {
		os.Exit(spawnMain(os.Args[2:]))
	}
	os.Exit(run(os.Args[1:]))
}

func run(args []string) int {
	flags := flag.NewFlagSet("refbench", flag.ContinueOnError)
	gusset := flags.String("gusset", "", "path of the gusset binary (required)")
	cholmod := flags.String("cholmod", "", "path of the cholmod_bench binary (required)")
	models := flags.String("models", strings.Join(defaultModels, ","), "models to measure: "+strings.Join(modelNames(), ", "))
	repeat := flags.Int("repeat", 3, "interleaved repeats per model (medians are reported)")
	work := flags.String("work", "", "folder for the exported files (default: a temporary folder)")
	if err := flags.Parse(args); err != nil {
		return 2
	}
	if *gusset == "" || *cholmod == "" || *repeat < 1 {
		fmt.Fprintln(os.Stderr, "refbench: -gusset and -cholmod are required and -repeat must be at least 1")
		return 2
	}
	dir := *work
	if dir == "" {
		var err error
		if dir, err = os.MkdirTemp("", "refbench"); err != nil {
			fmt.Fprintln(os.Stderr, "refbench:", err)
			return 1
		}
		defer os.RemoveAll(dir)
	}
	cfg := config{gusset: *gusset, cholmod: *cholmod, repeat: *repeat, dir: dir}
	var rows []measurement
	for _, name := range strings.Split(*models, ",") {
		build, ok := catalogue[strings.TrimSpace(name)]
		if !ok {
			fmt.Fprintf(os.Stderr, "refbench: no model %q (choose from %s)\n", name, strings.Join(modelNames(), ", "))
			return 2
		}
		fmt.Fprintf(os.Stderr, "refbench: %s ...\n", name)
		m, err := measure(cfg, strings.TrimSpace(name), build())
		if err != nil {
			fmt.Fprintf(os.Stderr, "refbench: %s: %v\n", name, err)
			return 1
		}
		rows = append(rows, m)
	}
	report(os.Stdout, rows)
	return 0
}
