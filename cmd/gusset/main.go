// Command gusset is the Gusset solver process: a host starts it once and
// drives it with newline-delimited JSON-RPC 2.0 requests on stdin, reading
// responses and progress notifications on stdout. See README.md.
package main

import (
	"os"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}
