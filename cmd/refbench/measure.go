package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"time"

	"gusset/cmd/gusset/adapter"
	"gusset/engine/model"
	"gusset/engine/sparse"
	"gusset/engine/stiffness"
	"gusset/protocol"
)

type config struct {
	gusset, cholmod string
	repeat          int
	dir             string
}

// ours holds one in-process run of the request's phases and of our sparse
// Cholesky on the exported system.
type ours struct {
	decode, compile                             time.Duration
	assemble, order, factor, solve, recoverAll  time.Duration
	sysOrder, sysSymbolic, sysNumeric, sysSolve time.Duration
}

// whole is one run of the request through the gusset binary.
type whole struct {
	wall    time.Duration
	peakKiB int64
	outSize int64
}

// reference is one CHOLMOD run as cholmod_bench prints it.
type reference struct {
	N             int     `json:"n"`
	Analyse       float64 `json:"analyse_s"`
	Factorise     float64 `json:"factorise_s"`
	Solve         float64 `json:"solve_s"`
	NonzerosL     float64 `json:"nnz_l"`
	Flops         float64 `json:"flops"`
	Ordering      string  `json:"ordering"`
	PeakBytes     int64   `json:"peak_cholmod_bytes"`
	PeakRSSKiB    int64   `json:"peak_rss_kib"`
	InputRSSKiB   int64   `json:"rss_after_input_kib"`
	solutionError float64
}

// measurement is everything reported for one model.
type measurement struct {
	name               string
	members, equations int
	requestBytes       int
	nonzerosL          int
	flops              float64
	runs               []ours
	wholes             []whole
	references         []reference
	relativeDifference float64
}

// measure exports one model and runs the four measurements cfg.repeat
// times, interleaved so that drifts of the machine touch all alike.
func measure(cfg config, name string, spec *model.Spec) (measurement, error) {
	ctx := context.Background()
	m, err := model.Compile(spec)
	if err != nil {
		return measurement{}, err
	}
	caseID := m.Cases[0].ID
	out := measurement{name: name, members: len(m.Members)}
	requestPath := filepath.Join(cfg.dir, name+".request.jsonl")
	params, err := json.Marshal(protocol.SolveParams{Model: *adapter.WireModel(spec), Cases: []string{caseID}})
	if err != nil {
		return out, err
	}
	line := fmt.Appendf(nil, `{"jsonrpc":"2.0","id":1,"method":"solve","params":%s}`+"\n", params)
	out.requestBytes = len(line)
	if err := os.WriteFile(requestPath, line, 0o644); err != nil {
		return out, err
	}
	mx, err := stiffness.Assemble(ctx, m, stiffness.Options{})
	if err != nil {
		return out, err
	}
	s := mx.K
	g, err := mx.Loads(m, caseID)
	if err != nil {
		return out, err
	}
	out.equations = s.N
	matrixPath := filepath.Join(cfg.dir, name+".mtx")
	rhsPath := filepath.Join(cfg.dir, name+".rhs")
	if err := writeMatrixMarket(matrixPath, s); err != nil {
		return out, err
	}
	if err := writeVector(rhsPath, g); err != nil {
		return out, err
	}
	var solution []float64
	for range cfg.repeat {
		w, err := runWhole(cfg.gusset, requestPath)
		if err != nil {
			return out, err
		}
		out.wholes = append(out.wholes, w)
		r, y, st, err := runOurs(ctx, spec, params, s, g, caseID)
		if err != nil {
			return out, err
		}
		out.runs, solution = append(out.runs, r), y
		out.nonzerosL, out.flops = st.NonzerosL, st.Flops
		ref, err := runReference(cfg.cholmod, matrixPath, rhsPath, solution)
		if err != nil {
			return out, err
		}
		out.references = append(out.references, ref)
		out.relativeDifference = ref.solutionError
	}
	return out, nil
}

// runWhole sends the request file to a fresh gusset process on its
// standard input, started by a spawner (spawn.go) that times it from
// start to exit and reads its true peak resident memory.
func runWhole(bin, requestPath string) (whole, error) {
	in, err := os.Open(requestPath)
	if err != nil {
		return whole{}, err
	}
	defer in.Close()
	var counter countingWriter
	var stderr bytes.Buffer
	resultPath := requestPath + ".spawned"
	cmd, err := viaSpawner(resultPath, bin, "serve")
	if err != nil {
		return whole{}, err
	}
	cmd.Stdin, cmd.Stdout, cmd.Stderr = in, &counter, &stderr
	if err := cmd.Run(); err != nil {
		return whole{}, fmt.Errorf("gusset: %v: %s", err, stderr.String())
	}
	sp, err := readSpawned(resultPath)
	if err != nil {
		return whole{}, err
	}
	w := whole{wall: sp.wall, peakKiB: sp.peakKiB, outSize: counter.n}
	// Progress notifications come first; the final response is the last
	// line.
	if !bytes.Contains(counter.lastHead, []byte(`"result":`)) {
		return w, fmt.Errorf("gusset answered without a result: %.300s", counter.lastHead)
	}
	return w, nil
}

// countingWriter counts the bytes written and keeps the first 4 KiB of
// the last line begun (the final response, once the output ends).
type countingWriter struct {
	n        int64
	lastHead []byte
	inLine   bool // a line has begun and not ended
	head     []byte
}

func (c *countingWriter) Write(p []byte) (int, error) {
	const keep = 4096
	n := len(p)
	c.n += int64(n)
	for len(p) > 0 {
		if !c.inLine {
			c.head, c.inLine = c.head[:0], true
		}
		line, rest, ended := bytes.Cut(p, []byte("\n"))
		if len(c.head) < keep {
			c.head = append(c.head, line[:min(len(line), keep-len(c.head))]...)
		}
		if ended {
			c.lastHead, c.inLine = append(c.lastHead[:0], c.head...), false
		}
		p = rest
	}
	return n, nil
}

var _ io.Writer = (*countingWriter)(nil)

// runOurs times the request's in-process phases (decode, compile, the
// engine's solve) and our sparse Cholesky on the exported system, whose
// solution it returns.
func runOurs(ctx context.Context, spec *model.Spec, params []byte, s *sparse.Matrix, g []float64, caseID string) (ours, []float64, sparse.Stats, error) {
	var r ours
	start := time.Now()
	// As the server decodes (the adapter's decode, without the schema
	// sample): DecodeStrict, or encoding/json for input it declines.
	var p protocol.SolveParams
	if protocol.DecodeStrict(params, &p) != nil {
		if err := json.Unmarshal(params, &p); err != nil {
			return r, nil, sparse.Stats{}, err
		}
	}
	r.decode = time.Since(start)
	start = time.Now()
	m, err := model.Compile(spec)
	if err != nil {
		return r, nil, sparse.Stats{}, err
	}
	r.compile = time.Since(start)
	res, err := stiffness.Solve(ctx, m, stiffness.Options{Cases: []string{caseID}})
	if err != nil {
		return r, nil, sparse.Stats{}, err
	}
	st := res.Stats
	r.assemble, r.order, r.factor, r.solve, r.recoverAll = st.Assemble, st.Order, st.Factor, st.Solve, st.Recover
	c, err := sparse.Factorize(ctx, s, sparse.Options{})
	if err != nil {
		return r, nil, sparse.Stats{}, err
	}
	fs := c.Stats()
	r.sysOrder, r.sysSymbolic, r.sysNumeric = fs.Ordering, fs.Symbolic, fs.Numeric
	y := make([]float64, s.N)
	start = time.Now()
	c.Solve(y, g)
	r.sysSolve = time.Since(start)
	return r, y, fs, nil
}

// runReference runs cholmod_bench and compares its solution with ours.
func runReference(bin, matrixPath, rhsPath string, ourSolution []float64) (reference, error) {
	solutionPath := matrixPath + ".solution"
	var stdout, stderr bytes.Buffer
	cmd := exec.Command(bin, matrixPath, rhsPath, solutionPath)
	// OpenBLAS on every core unless the environment says otherwise: on this 2-core machine CHOLMOD factorises
	// grid3d-100 in 2.16 s with 2 threads against 3.15 s with 1, and
	// grid2d-300 in 2.02 s against 2.96 s (measured once each, load
	// average 2.4-3.4), so the reference runs in its best configuration.
	if os.Getenv("OPENBLAS_NUM_THREADS") == "" {
		cmd.Env = append(os.Environ(), fmt.Sprintf("OPENBLAS_NUM_THREADS=%d", runtime.NumCPU()))
	}
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Run(); err != nil {
		return reference{}, fmt.Errorf("cholmod_bench: %v: %s", err, stderr.String())
	}
	var ref reference
	if err := json.Unmarshal(stdout.Bytes(), &ref); err != nil {
		return ref, fmt.Errorf("cholmod_bench printed %q: %v", stdout.String(), err)
	}
	x, err := readVector(solutionPath, len(ourSolution))
	if err != nil {
		return ref, err
	}
	var diff, norm float64
	for i, v := range x {
		diff = math.Max(diff, math.Abs(v-ourSolution[i]))
		norm = math.Max(norm, math.Abs(v))
	}
	if norm > 0 {
		ref.solutionError = diff / norm
	}
	return ref, nil
}
