package schema

import (
	"fmt"
	"slices"
	"strings"

	"github.com/invopop/jsonschema"
)

// ReferenceTable writes the project document's keys as a Markdown table —
// key path, type, whether required, and the meaning with units and
// defaults — from the generated JSON Schema, in the order of the document
// types, so that the README's reference cannot drift from the code.
func ReferenceTable() string {
	var b strings.Builder
	b.WriteString("| key | type | required | meaning, units and default |\n| --- | --- | --- | --- |\n")
	walkRef(&b, reflectSchema(), "")
	return b.String()
}

func reflectSchema() *jsonschema.Schema {
	r := &jsonschema.Reflector{DoNotReference: true, ExpandedStruct: true}
	return r.Reflect(&Project{})
}

func walkRef(b *strings.Builder, s *jsonschema.Schema, prefix string) {
	if s == nil || s.Properties == nil {
		return
	}
	for pair := s.Properties.Oldest(); pair != nil; pair = pair.Next() {
		k, child := pair.Key, pair.Value
		if k == "$schema" {
			continue
		}
		path := k
		if prefix != "" {
			path = prefix + "." + k
		}
		typ := typeOf(child)
		req := ""
		if slices.Contains(s.Required, k) {
			req = "yes"
		}
		desc := strings.ReplaceAll(child.Description, "|", "\\|")
		if len(child.Enum) > 0 && !strings.Contains(desc, fmt.Sprint(child.Enum[0])) {
			var e []string
			for _, v := range child.Enum {
				e = append(e, fmt.Sprint(v))
			}
			desc = strings.TrimSpace(desc + " One of: " + strings.Join(e, ", ") + ".")
		}
		fmt.Fprintf(b, "| `%s` | %s | %s | %s |\n", path, typ, req, desc)
		switch {
		case child.Type == "object":
			walkRef(b, child, path)
		case child.Type == "array" && child.Items != nil && child.Items.Type == "object":
			walkRef(b, child.Items, path+"[]")
		}
	}
}

func typeOf(s *jsonschema.Schema) string {
	switch {
	case s.Type == "array" && s.Items != nil:
		return "array of " + typeOf(s.Items)
	case s.Type != "":
		return s.Type
	case len(s.OneOf) > 0:
		return "number or word"
	}
	return "any"
}
