// Package protocol holds Gusset's wire protocol: the JSON-RPC 2.0 envelope,
// the request and result types of every method (the single source of the
// published JSON Schema), the limits, the method names and the error codes.
// The transport that serves them (framing, dispatch, workers, streaming,
// cancellation) is package protocol/jsonrpc.
//
// The package knows nothing of mechanics, and holds types only.
package protocol

//go:generate go run gusset/schema/generate -protocol . -out ../schema/gusset.schema.json -readme ../README.md -python ../clients/python/gusset/errors.py -node ../clients/node/src/errors.js
