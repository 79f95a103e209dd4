// Package protocol holds Gusset's wire protocol: the JSON-RPC 2.0 envelope,
// the request and result types of every method (the single source of the
// published JSON Schema), error codes, and the server loop that frames
// newline-delimited messages, dispatches them to a bounded pool of workers,
// streams progress notifications and writes every message whole through a
// single writer.
//
// The package knows nothing of mechanics: methods are registered as Handler
// functions by the adapter in cmd/gusset.
package protocol

//go:generate go run gusset/schema/generate -protocol . -out ../schema/gusset.schema.json
