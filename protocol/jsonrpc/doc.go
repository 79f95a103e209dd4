// Package jsonrpc is Gusset's transport: it reads newline-delimited
// JSON-RPC 2.0 requests, answers describe and cancel itself, runs the other
// methods on a bounded pool of workers, streams their progress
// notifications and writes every message whole through a single writer.
// The wire types it carries are package protocol's; the methods are
// registered as Handler functions by cmd/gusset/adapter.
//
// One conn holds the state of one session. Its state lock (conn.mu) is the
// only lock through which in-flight state changes: the table of requests in
// flight by id, each call's done and stopped marks and progress clocks,
// the count of failures and the accounting of lines parsed off the reader.
// A call's sendMu only orders the call's own messages (its progress before
// its final response); no state lock is held while a message waits for the
// writer, so a slow reader of the output never blocks a cancel.
package jsonrpc
