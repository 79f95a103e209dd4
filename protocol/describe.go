package protocol

import (
	"encoding/json"
	"runtime"
)

// Limits are the limits in force. A zero field takes its default.
type Limits struct {
	// MaxLineBytes is the largest message line accepted; default 64 MiB.
	MaxLineBytes int `json:"max_line_bytes"`
	// MaxNodes is the largest number of nodes in a model; default 1,000,000.
	MaxNodes int `json:"max_nodes"`
	// MaxMembers is the largest number of members in a model; default 2,000,000.
	MaxMembers int `json:"max_members"`
	// MaxSweepSteps is the largest number of steps in one sweep; default 100,000.
	MaxSweepSteps int `json:"max_sweep_steps"`
	// MaxCandidates is the largest number of candidate members in a layout
	// optimisation; default 5,000,000 (3.4 million candidates peak near
	// 300 MiB).
	MaxCandidates int `json:"max_candidates"`
	// Workers is the number of requests worked on at once; default the
	// number of CPUs.
	Workers int `json:"workers"`
	// MaxQueued is how many read requests may wait for a worker whatever
	// their size; default 1024.
	MaxQueued int `json:"max_queued"`
	// ReadAheadBytes lets more requests than max_queued wait while their
	// lines total less than this many bytes (each counted with 1 KiB for
	// its bookkeeping), so that a cancel or describe sent behind many
	// small requests is still read and answered at once. When both are
	// reached the server stops reading until a worker takes a request
	// (back-pressure); default 16 MiB.
	ReadAheadBytes int `json:"read_ahead_bytes"`
	// MaxQueuedBytes bounds the bytes of the request lines waiting for a
	// worker, whatever their number: when the next line would pass it,
	// the server stops taking requests into the queue; lines read meanwhile
	// (up to read_ahead_bytes more) still let cancel and describe through,
	// and then reading stops until a worker takes a request
	// (back-pressure); default 256 MiB.
	MaxQueuedBytes int `json:"max_queued_bytes"`
	// TimeLimitSeconds is the wall time allowed per request, 0 for none.
	TimeLimitSeconds float64 `json:"time_limit_seconds"`
}

// WithDefaults returns the limits with zero fields set to their defaults.
func (l Limits) WithDefaults() Limits {
	if l.MaxLineBytes <= 0 {
		l.MaxLineBytes = 64 << 20
	}
	if l.MaxNodes <= 0 {
		l.MaxNodes = 1_000_000
	}
	if l.MaxMembers <= 0 {
		l.MaxMembers = 2_000_000
	}
	if l.MaxSweepSteps <= 0 {
		l.MaxSweepSteps = 100_000
	}
	if l.MaxCandidates <= 0 {
		l.MaxCandidates = 5_000_000
	}
	if l.Workers <= 0 {
		l.Workers = runtime.NumCPU()
	}
	if l.MaxQueued <= 0 {
		l.MaxQueued = 1024
	}
	if l.ReadAheadBytes <= 0 {
		l.ReadAheadBytes = 16 << 20
	}
	if l.MaxQueuedBytes <= 0 {
		l.MaxQueuedBytes = 256 << 20
	}
	return l
}

// Method describes a registered method.
type Method struct {
	// Name is the method name.
	Name string `json:"name"`
	// Summary says in one sentence what the method does.
	Summary string `json:"summary"`
	// Params is the name of the params definition in the schema's $defs.
	Params string `json:"params"`
	// Result is the name of the result definition in the schema's $defs.
	Result string `json:"result"`
}

// DescribeResult is the result of describe.
type DescribeResult struct {
	// Name is the program's name.
	Name string `json:"name"`
	// Version is the program's version.
	Version string `json:"version"`
	// ProtocolVersion changes only if an existing field's meaning changes.
	ProtocolVersion string `json:"protocol_version"`
	// Methods lists the methods with their params and result definitions.
	Methods []Method `json:"methods"`
	// Limits are the limits in force.
	Limits Limits `json:"limits"`
	// SchemaID is the $id of the published schema the params follow.
	SchemaID string `json:"schema_id"`
}

// CancelParams are the params of cancel.
type CancelParams struct {
	// Request is the id of the request to cancel.
	Request json.RawMessage `json:"request" jsonschema:"oneof_type=string;number"`
}

// CancelResult is the result of cancel.
type CancelResult struct {
	// Cancelled is true when the request was in flight and is now being
	// stopped; it will still be answered, with the cancelled error.
	Cancelled bool `json:"cancelled"`
}
