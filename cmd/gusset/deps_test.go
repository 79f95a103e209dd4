package main

import (
	"os/exec"
	"strings"
	"testing"
)

// TestDependencyDirection keeps the imports one way (STYLE.md): engine
// packages import the standard library, gonum and other engine packages;
// protocol the standard library only; schema adds the reflector and the
// validator; only the adapter and the command import both protocol and
// engine.
func TestDependencyDirection(t *testing.T) {
	out, err := exec.Command("go", "list", "-f", "{{.ImportPath}}:{{join .Imports \" \"}}", "gusset/...").Output()
	if err != nil {
		t.Fatalf("go list: %v", err)
	}
	std := func(p string) bool {
		return !strings.Contains(strings.Split(p, "/")[0], ".") && !strings.HasPrefix(p, "gusset")
	}
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		pkg, imports, _ := strings.Cut(line, ":")
		for _, imp := range strings.Fields(imports) {
			var ok bool
			switch {
			case strings.HasPrefix(pkg, "gusset/engine"):
				ok = std(imp) || strings.HasPrefix(imp, "gonum.org/v1/") || strings.HasPrefix(imp, "gusset/engine")
			case pkg == "gusset/protocol":
				ok = std(imp)
			case pkg == "gusset/protocol/jsonrpc":
				ok = std(imp) || imp == "gusset/protocol"
			case pkg == "gusset/schema/generate":
				// The generator reflects the adapter's method table.
				ok = std(imp) || imp == "gusset/protocol" || imp == "gusset/schema" || imp == "gusset/cmd/gusset/adapter" ||
					imp == "github.com/invopop/jsonschema"
			case strings.HasPrefix(pkg, "gusset/schema"):
				ok = std(imp) || imp == "gusset/protocol" || imp == "gusset/schema" ||
					imp == "github.com/invopop/jsonschema" || imp == "github.com/santhosh-tekuri/jsonschema/v5"
			case pkg == "gusset/cmd/benchreport":
				ok = std(imp)
			case strings.HasPrefix(pkg, "gusset/cmd/gusset"), strings.HasPrefix(pkg, "gusset/clients"):
				ok = true
			default:
				t.Errorf("package %s is outside the layout", pkg)
				ok = true
			}
			if !ok {
				t.Errorf("%s imports %s, against the dependency direction", pkg, imp)
			}
		}
	}
}
