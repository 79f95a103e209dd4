// Command generate writes the published schema from the protocol types and
// the adapter's method table, and the error-code table's copies (the
// README's table and both clients' error classes) from the same table:
//
//	go run gusset/schema/generate -out schema/gusset.schema.json -readme README.md \
//		-python clients/python/gusset/errors.py -node clients/node/src/errors.js
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
	readme := flag.String("readme", "", "README whose error-code table to rewrite")
	python := flag.String("python", "", "Python client errors module whose error classes to rewrite")
	node := flag.String("node", "", "Node client errors module whose error classes to rewrite")
	flag.Parse()
	if err := writeCodeTables(*readme, *python, *node); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
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
