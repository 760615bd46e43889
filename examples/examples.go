// Package examples holds the three demo projects of solstand — a mountain
// cabin, a rural health post and a radio repeater — with invented sites and
// numbers. `solstand init` writes the same documents.
package examples

import (
	"embed"
	"fmt"
	"sort"
	"strings"
)

//go:embed *.json
var files embed.FS

// Names lists the templates, sorted.
func Names() []string {
	ents, _ := files.ReadDir(".")
	var out []string
	for _, e := range ents {
		out = append(out, strings.TrimSuffix(e.Name(), ".json"))
	}
	sort.Strings(out)
	return out
}

// Template returns the document of a named template.
func Template(name string) ([]byte, error) {
	b, err := files.ReadFile(name + ".json")
	if err != nil {
		return nil, fmt.Errorf("no template %q (there are: %s)", name, strings.Join(Names(), ", "))
	}
	return b, nil
}
