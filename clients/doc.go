// Package clients holds the Python and Node.js clients of the gusset process
// (clients/python and clients/node) and the Go test that runs their test
// suites against a freshly built binary, so that `go test ./...` covers them.
//
// Where python3 (3.8 or later) or node (20 or later) is missing, that
// client's tests are skipped; with GUSSET_REQUIRE_CLIENTS=1 in the
// environment (CI sets it) a missing interpreter is a failure instead.
package clients
