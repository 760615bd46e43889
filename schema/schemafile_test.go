package schema

import (
	"bytes"
	"flag"
	"os"
	"testing"
)

var update = flag.Bool("update", false, "rewrite project.schema.json from Generate")

const schemaFile = "project.schema.json"

// TestSchemaFile: the committed schema file is what Generate (and so
// `solstand schema`) writes. `go test ./schema -run TestSchemaFile -update`
// rewrites it after a change to the document types.
func TestSchemaFile(t *testing.T) {
	want, err := Generate()
	if err != nil {
		t.Fatal(err)
	}
	if *update {
		if err := os.WriteFile(schemaFile, want, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	got, err := os.ReadFile(schemaFile)
	if err != nil {
		t.Fatalf("%v (run: go test ./schema -run TestSchemaFile -update)", err)
	}
	if !bytes.Equal(got, want) {
		t.Fatalf("%s differs from Generate(); run: go test ./schema -run TestSchemaFile -update", schemaFile)
	}
}

// TestGenerateStable: generating twice gives the same bytes, so the file
// does not churn.
func TestGenerateStable(t *testing.T) {
	a, err := Generate()
	if err != nil {
		t.Fatal(err)
	}
	b, err := Generate()
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a, b) {
		t.Fatal("Generate is not deterministic")
	}
}
