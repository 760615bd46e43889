package schema

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strconv"

	"github.com/invopop/jsonschema"
)

// Auto is a number that may instead be left to the tool: in JSON either a
// number or one of the words "auto" / "optimise" (also spelt "optimize").
// The zero value is unset; ApplyDefaults fills it.
type Auto struct {
	Set    bool    // a value or a word was given (or a default applied)
	IsAuto bool    // the word, not a number
	Word   string  // the word as written ("auto", "optimise")
	Value  float64 // the number, when not IsAuto
}

// Number makes a fixed Auto.
func Number(v float64) Auto { return Auto{Set: true, Value: v} }

// Automatic makes an Auto left to the tool, under the given word.
func Automatic(word string) Auto { return Auto{Set: true, IsAuto: true, Word: word} }

// IsZero lets encoding/json omit an unset Auto.
func (a Auto) IsZero() bool { return !a.Set }

// UnmarshalJSON accepts a number or the words auto, optimise, optimize.
func (a *Auto) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	if len(b) > 0 && b[0] == '"' {
		var s string
		if err := json.Unmarshal(b, &s); err != nil {
			return err
		}
		switch s {
		case "auto", "optimise", "optimize":
			*a = Automatic(s)
			return nil
		}
		return fmt.Errorf("must be a number or \"auto\"/\"optimise\", got %q", s)
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		return fmt.Errorf("must be a number or \"auto\"/\"optimise\", got %s", b)
	}
	*a = Number(v)
	return nil
}

// MarshalJSON writes the number or "auto".
func (a Auto) MarshalJSON() ([]byte, error) {
	if a.IsAuto {
		w := a.Word
		if w == "" {
			w = "auto"
		}
		return json.Marshal(w)
	}
	return json.Marshal(a.Value)
}

// JSONSchema describes the number-or-word form.
func (Auto) JSONSchema() *jsonschema.Schema {
	return &jsonschema.Schema{
		OneOf: []*jsonschema.Schema{
			{Type: "number"},
			{Type: "string", Enum: []any{"auto", "optimise", "optimize"}},
		},
	}
}
