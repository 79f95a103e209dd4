// Package schema holds Gusset's published JSON Schema: generated from the
// protocol's Go types by the command schema/generate (run through the
// go:generate line in package protocol; the reflector stays out of the
// served binary), committed as gusset.schema.json, embedded, and used at run
// time to validate every request's params before any engine code runs.
package schema
