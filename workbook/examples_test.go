package workbook

import (
	"os"
	"path/filepath"
	"testing"

	"solstand/schema"
	"solstand/simulate"
)

// TestRecalcExamples recalculates the workbook of each example project, as
// the engine sizes it, in LibreOffice: every defined-name result must come
// back to the engine's value within 0.5 %, and doubling autonomy_days must
// double battery_required_ah.
func TestRecalcExamples(t *testing.T) {
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		t.Run(name, func(t *testing.T) {
			data, err := os.ReadFile(filepath.Join("..", "examples", name+".json"))
			if err != nil {
				t.Fatal(err)
			}
			p, err := schema.Decode(data)
			if err != nil {
				t.Fatal(err)
			}
			years := 2
			r, err := simulate.Run(p, simulate.Options{Years: &years, ToolVersion: "test"})
			if err != nil {
				t.Fatal(err)
			}
			checkRecalc(t, r)
		})
	}
}
