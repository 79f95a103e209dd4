package main

import (
	"bytes"
	"os"
	"testing"

	"gusset/schema"
)

// TestCommittedSchemaIsCurrent fails when the protocol types changed and
// gusset.schema.json was not regenerated (run go generate ./protocol).
func TestCommittedSchemaIsCurrent(t *testing.T) {
	// The doc comments are keyed by the path given, as go generate runs
	// the generator: from package protocol's directory.
	t.Chdir("../../protocol")
	want, err := Generate(".")
	if err != nil {
		t.Fatal(err)
	}
	got, err := os.ReadFile("../schema/gusset.schema.json")
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Fatal("schema/gusset.schema.json is stale: run `go generate ./protocol` and commit the result")
	}
	if !bytes.Equal(schema.Document, got) {
		t.Fatal("the embedded schema differs from the file: rebuild")
	}
}
