package main

import (
	"os/exec"
	"strings"
	"testing"
)

// engineLayers places each engine package in a layer (DEVELOPERS.md,
// "Layout"): a package imports engine packages of lower layers only, so
// the engine's own dependencies point one way too. A new engine package
// not listed here is a method package (layer 4): it may build on the
// model, the solvers and the stiffness method, not on other methods; list
// it higher when it composes methods.
var engineLayers = map[string]int{
	"gusset/engine/fault": 0, "gusset/engine/progress": 0, "gusset/engine/expr": 0,
	"gusset/engine/model": 1, "gusset/engine/sparse": 1,
	"gusset/engine/model/modelgen": 2, "gusset/engine/statics": 2,
	"gusset/engine/stiffness": 3,
	"gusset/engine/loadpath":  4, "gusset/engine/reciprocal": 4, "gusset/engine/layout": 4, "gusset/engine/modes": 4,
	// Packages composing methods: form finding sizes by load path, sweeps
	// run the stiffness method, load path and modes, and render draws
	// the diagrams and layouts the methods return.
	"gusset/engine/formfind": 5, "gusset/engine/sweep": 5, "gusset/engine/render": 5,
}

// layer returns an engine package's layer (4 when unlisted).
func layer(pkg string) int {
	if l, ok := engineLayers[pkg]; ok {
		return l
	}
	return 4
}

// allowed reports whether package pkg may import imp, and why not.
func allowed(pkg, imp string) (bool, string) {
	std := !strings.Contains(strings.Split(imp, "/")[0], ".") && !strings.HasPrefix(imp, "gusset")
	engine := strings.HasPrefix(imp, "gusset/engine/")
	switch {
	case strings.HasPrefix(pkg, "gusset/engine/"):
		if engine && layer(imp) >= layer(pkg) {
			return false, "an engine package imports only engine packages of lower layers (engineLayers)"
		}
		return std || engine || strings.HasPrefix(imp, "gonum.org/v1/gonum/"), "the engine imports the standard library and gonum's numerics only"
	case pkg == "gusset/protocol":
		return std, "protocol imports the standard library only"
	case pkg == "gusset/protocol/jsonrpc":
		return std || imp == "gusset/protocol", "the transport imports the standard library and protocol only"
	case pkg == "gusset/schema":
		return std || imp == "gusset/protocol" || imp == "github.com/santhosh-tekuri/jsonschema/v5", "schema adds the validator only"
	case pkg == "gusset/schema/generate":
		// The generator reflects the adapter's method table and error
		// codes; it runs at build time only.
		return std || imp == "gusset/protocol" || imp == "gusset/schema" || imp == "gusset/cmd/gusset/adapter" ||
			imp == "github.com/invopop/jsonschema", "the generator adds the reflector and the adapter"
	case pkg == "gusset/cmd/gusset/adapter":
		return std || engine || strings.HasPrefix(imp, "gusset/protocol") || imp == "gusset/schema", "the adapter maps protocol to engine"
	case pkg == "gusset/cmd/gusset":
		// Wiring: the adapter, the transport and the schema; the demo
		// draws its charts through engine/render, the one drawing layer
		// (gonum's plot while the depth-study chart still uses it).
		return std || imp == "gusset/cmd/gusset/adapter" || strings.HasPrefix(imp, "gusset/protocol") ||
				imp == "gusset/schema" || imp == "gusset/engine/render" || strings.HasPrefix(imp, "gonum.org/v1/plot"),
			"the command is wiring (only the adapter imports the engine)"
	case pkg == "gusset/cmd/refbench":
		// The reference benchmark (run by hand, not served) writes
		// requests with the adapter and exports the engine's systems.
		return std || imp == "gusset/protocol" || imp == "gusset/cmd/gusset/adapter" || engine, "the reference benchmark"
	case pkg == "gusset/cmd/benchreport":
		return std, "benchreport imports the standard library only"
	case strings.HasPrefix(pkg, "gusset/clients"):
		return std, "the clients' Go test imports the standard library only"
	}
	return false, "the package is outside the layout of DEVELOPERS.md"
}

// TestDependencyDirection enforces the layering DEVELOPERS.md states: the
// engine on the standard library and gonum's numerics only, in layers;
// protocol on the standard library; the transport on protocol; only the
// adapter imports both the engine and protocol (the command adds
// engine/render for the demo's charts, the reference benchmark is a tool).
func TestDependencyDirection(t *testing.T) {
	out, err := exec.Command("go", "list", "-f", "{{.ImportPath}}:{{join .Imports \" \"}}", "gusset/...").Output()
	if err != nil {
		t.Fatalf("go list: %v", err)
	}
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		pkg, imports, _ := strings.Cut(line, ":")
		for _, imp := range strings.Fields(imports) {
			if ok, rule := allowed(pkg, imp); !ok {
				t.Errorf("%s imports %s: %s", pkg, imp, rule)
			}
		}
	}
}

// TestDependencyRulesBite checks that the rules reject what they should,
// so that a permissive change to allowed is noticed.
func TestDependencyRulesBite(t *testing.T) {
	for _, c := range [][2]string{
		{"gusset/engine/stiffness", "gusset/protocol"},
		{"gusset/engine/stiffness", "gusset/engine/loadpath"},
		{"gusset/engine/model", "gusset/engine/stiffness"},
		{"gusset/engine/newmethod", "gusset/engine/reciprocal"},
		{"gusset/engine/sparse", "gonum.org/v1/plot"},
		{"gusset/protocol", "gusset/engine/model"},
		{"gusset/protocol/jsonrpc", "gusset/schema"},
		{"gusset/schema", "github.com/invopop/jsonschema"},
		{"gusset/cmd/gusset", "gusset/engine/stiffness"},
		{"gusset/somewhere", "fmt"},
	} {
		if ok, _ := allowed(c[0], c[1]); ok {
			t.Errorf("%s may import %s, against DEVELOPERS.md", c[0], c[1])
		}
	}
}

// TestServedBinaryWithoutReflector keeps the schema reflector out of the
// served binary: the schema is generated at build time (go generate) and
// embedded; only its validator runs in the process.
func TestServedBinaryWithoutReflector(t *testing.T) {
	out, err := exec.Command("go", "list", "-deps", "gusset/cmd/gusset").Output()
	if err != nil {
		t.Fatalf("go list: %v", err)
	}
	for _, dep := range strings.Fields(string(out)) {
		if dep == "github.com/invopop/jsonschema" {
			t.Fatal("the served binary links the schema reflector; keep it in schema/generate")
		}
	}
}
