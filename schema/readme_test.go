package schema

import (
	"flag"
	"os"
	"strings"
	"testing"
)

var updateReadme = flag.Bool("update-readme", false, "rewrite the key reference in ../README.md")

// TestReadmeKeyTable keeps the README's reference of keys in step with the
// document types: it must equal ReferenceTable().
func TestReadmeKeyTable(t *testing.T) {
	const begin, end = "<!-- keys:begin -->\n", "<!-- keys:end -->"
	raw, err := os.ReadFile("../README.md")
	if err != nil {
		t.Fatal(err)
	}
	s := string(raw)
	i, j := strings.Index(s, begin), strings.Index(s, end)
	if i < 0 || j < i {
		t.Fatalf("README.md lacks the %q … %q markers", begin, end)
	}
	want := ReferenceTable()
	if got := s[i+len(begin) : j]; got != want {
		if *updateReadme {
			s = s[:i+len(begin)] + want + s[j:]
			if err := os.WriteFile("../README.md", []byte(s), 0o644); err != nil {
				t.Fatal(err)
			}
			return
		}
		t.Errorf("README.md key reference is out of date; run: go test ./schema -run TestReadmeKeyTable -update-readme")
	}
	for _, key := range []string{"`site.latitude_deg`", "`loads[].power_w`", "`battery.autonomy_days`", "`array.tilt_deg`"} {
		if !strings.Contains(want, key) {
			t.Errorf("reference lacks %s", key)
		}
	}
}
