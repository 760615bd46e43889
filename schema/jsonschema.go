package schema

import (
	"bytes"
	"encoding/json"
	"fmt"
	"sync"

	sjs "github.com/santhosh-tekuri/jsonschema/v6"
)

// SchemaID is the identifier written into the generated schema.
const SchemaID = "https://solstand.invalid/schema/project.schema.json"

// Generate returns the JSON Schema of the project document, generated from
// the Go types of this package, indented and newline-terminated.
func Generate() ([]byte, error) {
	s := reflectSchema()
	s.ID = SchemaID
	s.Title = "solstand project"
	s.Description = "A stand-alone photovoltaic system design: site, loads, array, controller, battery, inverter, wiring, costs and simulation options. Units are in the key names."
	b, err := json.MarshalIndent(s, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// compiled holds the compiled schema and its decoded form (for key lookup).
type compiled struct {
	schema *sjs.Schema
	tree   map[string]any
}

var compileOnce = sync.OnceValues(func() (*compiled, error) {
	raw, err := Generate()
	if err != nil {
		return nil, err
	}
	doc, err := sjs.UnmarshalJSON(bytes.NewReader(raw))
	if err != nil {
		return nil, err
	}
	c := sjs.NewCompiler()
	if err := c.AddResource(SchemaID, doc); err != nil {
		return nil, err
	}
	s, err := c.Compile(SchemaID)
	if err != nil {
		return nil, fmt.Errorf("compile schema: %w", err)
	}
	var tree map[string]any
	if err := json.Unmarshal(raw, &tree); err != nil {
		return nil, err
	}
	return &compiled{schema: s, tree: tree}, nil
})

// knownKeys returns the property names the schema allows at an instance
// location (a list of keys and array indices), or nil.
func knownKeys(tree map[string]any, loc []string) []string {
	node := tree
	for _, step := range loc {
		if props, ok := node["properties"].(map[string]any); ok {
			if next, ok := props[step].(map[string]any); ok {
				node = next
				continue
			}
		}
		if items, ok := node["items"].(map[string]any); ok {
			node = items
			continue
		}
		return nil
	}
	props, ok := node["properties"].(map[string]any)
	if !ok {
		return nil
	}
	keys := make([]string, 0, len(props))
	for k := range props {
		keys = append(keys, k)
	}
	return keys
}
