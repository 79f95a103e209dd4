package jsonrpc

// SetStreamChunk sets the size from which responses are streamed, for the
// external tests, and returns a function restoring the previous size.
func SetStreamChunk(n int) (restore func()) {
	old := streamChunk
	streamChunk = n
	return func() { streamChunk = old }
}

// Encode, EncodeStandard and CPUTime are encode, encodeStandard and
// cpuTime, for the external benchmarks.
var (
	Encode         = encode
	EncodeStandard = encodeStandard
	CPUTime        = cpuTime
)
