package main

import (
	"bytes"
	"fmt"
	"os"
	"strings"

	"github.com/invopop/jsonschema"

	"gusset/cmd/gusset/adapter"
	"gusset/protocol"
)

// errorCodeSchema is the schema's ErrorCode definition: one entry per code
// the server sends, its kind as the title and when it is sent as the
// description. The README's table and both clients' error classes are
// generated from the same table (adapter.ErrorCodes).
func errorCodeSchema() *jsonschema.Schema {
	s := &jsonschema.Schema{Type: "integer",
		Description: "ErrorCode lists every error.code the server sends: JSON-RPC's and the server's own (negative), and the engine's (1000 and up). The title is error.data.kind."}
	for _, c := range adapter.ErrorCodes() {
		s.OneOf = append(s.OneOf, &jsonschema.Schema{Const: c.Code, Title: c.Kind, Description: c.When})
	}
	return s
}

// className is the clients' class name of a kind: its words capitalised
// and joined ("not in equilibrium" → NotInEquilibrium).
func className(kind string) string {
	var b strings.Builder
	for _, w := range strings.Fields(kind) {
		b.WriteString(strings.ToUpper(w[:1]) + w[1:])
	}
	return b.String()
}

// The generated regions of the README and the clients: each region's
// lines lie between a line holding "BEGIN GENERATED: name" and one
// holding "END GENERATED: name".

func readmeTable(codes []protocol.CodeInfo) string {
	var b strings.Builder
	b.WriteString("| code | kind | when |\n| --- | --- | --- |\n")
	for _, c := range codes {
		fmt.Fprintf(&b, "| %d | %s | %s |\n", c.Code, c.Kind, c.When)
	}
	return b.String()
}

func pythonClasses(codes []protocol.CodeInfo) string {
	var b strings.Builder
	for _, c := range codes {
		when := strings.ReplaceAll(c.When, "`", "``")
		fmt.Fprintf(&b, "\n\nclass %s(GussetError):\n    \"\"\"%s (%d): %s.\"\"\"\n\n    CODE = %d\n    KIND = %q\n",
			className(c.Kind), className(c.Kind), c.Code, when, c.Code, c.Kind)
	}
	b.WriteString("\n\n#: WIRE_ERRORS lists the classes of the wire codes, in code-table order.\nWIRE_ERRORS: Tuple[Type[GussetError], ...] = (\n")
	for _, c := range codes {
		fmt.Fprintf(&b, "    %s,\n", className(c.Kind))
	}
	b.WriteString(")\n")
	return b.String()
}

func pythonNames(codes []protocol.CodeInfo) string {
	var b strings.Builder
	for _, c := range codes {
		fmt.Fprintf(&b, "    %q,\n", className(c.Kind))
	}
	return b.String()
}

func nodeClasses(codes []protocol.CodeInfo) string {
	var b strings.Builder
	for _, c := range codes {
		fmt.Fprintf(&b, "\n/** %s (%d): %s. */\nexport class %s extends GussetError {\n  static code = %d;\n  static kind = '%s';\n}\n",
			className(c.Kind), c.Code, c.When, className(c.Kind), c.Code, c.Kind)
	}
	b.WriteString("\n/** wireErrors lists the classes of the wire codes, in code-table order. */\nexport const wireErrors = [\n")
	for _, c := range codes {
		fmt.Fprintf(&b, "  %s,\n", className(c.Kind))
	}
	b.WriteString("];\n")
	return b.String()
}

// writeRegions replaces the named generated regions of a file.
func writeRegions(path string, regions map[string]string) error {
	b, err := os.ReadFile(path)
	if err != nil {
		return err
	}
	for name, body := range regions {
		begin, end := []byte("BEGIN GENERATED: "+name), []byte("END GENERATED: "+name)
		i, j := bytes.Index(b, begin), bytes.Index(b, end)
		if i < 0 || j < i {
			return fmt.Errorf("%s: no region %q", path, name)
		}
		start := i + bytes.IndexByte(b[i:], '\n') + 1
		stop := bytes.LastIndexByte(b[:j], '\n') + 1
		b = append(append(append([]byte{}, b[:start]...), body...), b[stop:]...)
	}
	return os.WriteFile(path, b, 0o644)
}

// writeCodeTables writes the README's table and the clients' error classes
// (files given as "" are skipped).
func writeCodeTables(readme, python, node string) error {
	codes := adapter.ErrorCodes()
	for _, w := range []struct {
		path    string
		regions map[string]string
	}{
		{readme, map[string]string{"error codes": readmeTable(codes)}},
		{python, map[string]string{"error classes": pythonClasses(codes), "error names": pythonNames(codes)}},
		{node, map[string]string{"error classes": nodeClasses(codes)}},
	} {
		if w.path == "" {
			continue
		}
		if err := writeRegions(w.path, w.regions); err != nil {
			return err
		}
	}
	return nil
}
