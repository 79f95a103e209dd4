package jsonrpc

// SetStreamChunk sets the size from which responses are streamed, for the
// external tests, and returns a function restoring the previous size.
func SetStreamChunk(n int) (restore func()) {
	old := streamChunk
	streamChunk = n
	return func() { streamChunk = old }
}
