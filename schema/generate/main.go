// Command generate writes the published schema from the protocol types:
//
//	go run gusset/schema/generate -out schema/gusset.schema.json
//
// It runs from package protocol's directory through go generate.
package main

import (
	"flag"
	"fmt"
	"os"
)

func main() {
	out := flag.String("out", "gusset.schema.json", "output file")
	dir := flag.String("protocol", ".", "directory of package protocol's source")
	flag.Parse()
	b, err := Generate(*dir)
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	if err := os.WriteFile(*out, b, 0o644); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}
