// Package schema holds Gusset's published JSON Schema: generated from the
// protocol's Go types (see Generate and the go:generate line in package
// protocol), committed as gusset.schema.json, embedded, and used at run time
// to validate every request's params before any engine code runs.
package schema
