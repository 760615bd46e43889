package schema

import (
	"errors"
	"testing"
)

// FuzzDecode: Decode never panics; it returns a project or a non-empty
// Problems, never both and never neither.
func FuzzDecode(f *testing.F) {
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		b := readExample(f, name)
		f.Add(b)
		f.Add(b[:len(b)/2])
	}
	for _, s := range []string{
		``, `{}`, `[]`, `null`, `{"name": "x"} {}`, `{"name": "x",}`,
		`{"loads": 5}`, `{"loads": [{"power_w": -1}]}`, `{"site": {"latitude": 1}}`,
		`{"array": {"tilt_deg": "steep"}}`, `{"simulation": {"years": 1e400}}`,
		`{"loads": [{"name": "a", "power_w": 1, "windows": ["23:00-23:00", "x"]}]}`,
	} {
		f.Add([]byte(s))
	}
	f.Add(mutate(f, "cabin", set("battery.autonomy_days", 1e300), set("simulation.years", -5)))
	f.Add(mutate(f, "clinic", del("site"), set("loads[0].months", []any{0, 13, 13})))
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Decode(data)
		if err == nil {
			if p == nil {
				t.Fatal("nil project and nil error")
			}
			return
		}
		if p != nil {
			t.Fatal("project together with an error")
		}
		var ps Problems
		if !errors.As(err, &ps) || len(ps) == 0 {
			t.Fatalf("error is not a non-empty Problems: %T %v", err, err)
		}
		for _, q := range ps {
			if q.Message == "" {
				t.Fatalf("problem without a message at %q", q.Path)
			}
		}
	})
}
