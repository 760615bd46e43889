package schema

import (
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// The three example documents are valid by construction (examples/); the
// bad documents below are each a small edit of one of them.

func readExample(tb testing.TB, name string) []byte {
	tb.Helper()
	b, err := os.ReadFile(filepath.Join("..", "examples", name+".json"))
	if err != nil {
		tb.Fatal(err)
	}
	return b
}

// docEdit changes a decoded document in place.
type docEdit func(tb testing.TB, doc map[string]any)

// pathSteps splits "loads[2].power_w" into "loads", 2, "power_w".
func pathSteps(tb testing.TB, path string) []any {
	tb.Helper()
	var steps []any
	for _, seg := range strings.Split(path, ".") {
		key, rest, _ := strings.Cut(seg, "[")
		if key != "" {
			steps = append(steps, key)
		}
		for rest != "" {
			num, after, ok := strings.Cut(rest, "]")
			n, err := strconv.Atoi(num)
			if !ok || err != nil {
				tb.Fatalf("bad path %q", path)
			}
			steps = append(steps, n)
			rest = strings.TrimPrefix(after, "[")
		}
	}
	return steps
}

// walkTo returns the container holding the last step of path.
func walkTo(tb testing.TB, doc map[string]any, path string) (any, any) {
	tb.Helper()
	steps := pathSteps(tb, path)
	var cur any = doc
	for _, s := range steps[:len(steps)-1] {
		if cur == nil {
			tb.Fatalf("%s: no such element", path)
		}
		switch k := s.(type) {
		case string:
			m, ok := cur.(map[string]any)
			if !ok {
				tb.Fatalf("%s: %q is not in an object", path, k)
			}
			cur = m[k]
		case int:
			a, ok := cur.([]any)
			if !ok || k >= len(a) {
				tb.Fatalf("%s: no element %d", path, k)
			}
			cur = a[k]
		}
	}
	return cur, steps[len(steps)-1]
}

// set puts v at path (the last step may be a new key).
func set(path string, v any) docEdit {
	return func(tb testing.TB, doc map[string]any) {
		c, last := walkTo(tb, doc, path)
		switch k := last.(type) {
		case string:
			c.(map[string]any)[k] = v
		case int:
			c.([]any)[k] = v
		}
	}
}

// raw puts JSON text at path as it is written (for numbers no float64
// holds, such as 1e400).
func raw(path, text string) docEdit { return set(path, json.RawMessage(text)) }

// del removes the key at path.
func del(path string) docEdit {
	return func(tb testing.TB, doc map[string]any) {
		c, last := walkTo(tb, doc, path)
		delete(c.(map[string]any), last.(string))
	}
}

// rename moves the value at path to a new key in the same object.
func rename(path, to string) docEdit {
	return func(tb testing.TB, doc map[string]any) {
		c, last := walkTo(tb, doc, path)
		m := c.(map[string]any)
		m[to] = m[last.(string)]
		delete(m, last.(string))
	}
}

// mutate decodes an example, applies the edits and encodes it again.
func mutate(tb testing.TB, example string, edits ...docEdit) []byte {
	tb.Helper()
	var doc map[string]any
	if err := json.Unmarshal(readExample(tb, example), &doc); err != nil {
		tb.Fatal(err)
	}
	for _, e := range edits {
		e(tb, doc)
	}
	b, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		tb.Fatal(err)
	}
	return b
}

// problemsOf decodes data and returns its problems; it fails the test when
// the error is not a non-empty Problems.
func problemsOf(tb testing.TB, data []byte) Problems {
	tb.Helper()
	p, err := Decode(data)
	if err == nil {
		if p == nil {
			tb.Fatal("Decode returned neither a project nor an error")
		}
		return nil
	}
	var ps Problems
	if !errors.As(err, &ps) || len(ps) == 0 {
		tb.Fatalf("error is not a non-empty Problems: %T %v", err, err)
	}
	if p != nil {
		tb.Fatal("Decode returned a project together with problems")
	}
	return ps
}

func TestDecodeExamples(t *testing.T) {
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		t.Run(name, func(t *testing.T) {
			p, err := Decode(readExample(t, name))
			if err != nil {
				t.Fatalf("example does not decode:\n%v", err)
			}
			// the same file as saved by an editor that writes a UTF-8 byte-order mark
			if _, err := Decode(append([]byte("\xef\xbb\xbf"), readExample(t, name)...)); err != nil {
				t.Fatalf("example with a byte-order mark does not decode:\n%v", err)
			}
			if p.Name == "" || len(p.Loads) == 0 {
				t.Fatalf("decoded project is empty: %+v", p)
			}
		})
	}
}

type wantProblem struct{ path, gist string }

func TestDecodeBadDocuments(t *testing.T) {
	tests := []struct {
		name    string
		example string
		edits   []docEdit
		want    []wantProblem // every problem reported, in any order
	}{
		{"negative power", "cabin", []docEdit{set("loads[2].power_w", -60)},
			[]wantProblem{{"loads[2].power_w", "must be greater than 0, got -60"}}},
		{"unknown key", "cabin", []docEdit{set("site.latitude", 46.8)},
			[]wantProblem{{"site.latitude", "unknown key (did you mean \"latitude_deg\"?)"}}},
		{"renamed key", "cabin", []docEdit{rename("site.latitude_deg", "latitude")},
			[]wantProblem{{"site.latitude", "did you mean \"latitude_deg\""}, {"site.latitude_deg", "is required"}}},
		{"wrong type", "cabin", []docEdit{set("loads[0].power_w", "six")},
			[]wantProblem{{"loads[0].power_w", "must be number, got string"}}},
		// latitude is defined on -90..90
		{"latitude beyond the pole", "cabin", []docEdit{set("site.latitude_deg", 95)},
			[]wantProblem{{"site.latitude_deg", "must be at most 90, got 95"}}},
		// longitude is defined on -180..180
		{"longitude beyond -180", "cabin", []docEdit{set("site.longitude_deg", -200)},
			[]wantProblem{{"site.longitude_deg", "must be at least -180, got -200"}}},
		{"eleven monthly GHI values", "cabin", []docEdit{set("site.ghi_kwh_m2_day", []any{1.4, 2.3, 3.5, 4.5, 5.2, 5.8, 5.9, 5.0, 3.8, 2.5, 1.5})},
			[]wantProblem{{"site.ghi_kwh_m2_day", "must have 12 monthly values"}}},
		// 14 exceeds even the extraterrestrial daily total, at most about 13.5 kWh/m² (computed from Duffie & Beckman (2013) eq. 1.10.3 at a pole at its summer solstice)
		{"GHI above the extraterrestrial bound", "cabin", []docEdit{set("site.ghi_kwh_m2_day[6]", 14)},
			[]wantProblem{{"site.ghi_kwh_m2_day[6]", "more than the Earth receives), got 14"}}},
		// irradiation cannot be negative
		{"negative GHI", "cabin", []docEdit{set("site.ghi_kwh_m2_day[0]", -1)},
			[]wantProblem{{"site.ghi_kwh_m2_day[0]", "must be from 0 to 12 kWh/m²/day"}}},
		// depth of discharge is a fraction of capacity, in (0, 1] (issue 2)
		{"depth of discharge above 1", "cabin", []docEdit{set("battery.max_dod", 1.2)},
			[]wantProblem{{"battery.max_dod", "must be at most 1, got 1.2"}}},
		{"depth of discharge 0", "cabin", []docEdit{set("battery.max_dod", 0)},
			[]wantProblem{{"battery.max_dod", "must be greater than 0, got 0"}}},
		// a day has 24 h
		{"hours per day beyond a day", "cabin", []docEdit{set("loads[1].hours_per_day", 25)},
			[]wantProblem{{"loads[1].hours_per_day", "at most 24, got 25"}}},
		{"malformed window", "cabin", []docEdit{set("loads[0].windows[1]", "17h-22h")},
			[]wantProblem{{"loads[0].windows[1]", "must be a time HH:MM, got \"17h\""}}},
		// a clock has hours 00..23 (24:00 as an end, ISO 8601)
		{"window ending at 25:00", "cabin", []docEdit{set("loads[6].windows[0]", "19:00-25:00")},
			[]wantProblem{{"loads[6].windows[0]", "hour must be 00..23"}}},
		{"overlapping windows", "cabin", []docEdit{set("loads[0].windows", []any{"17:00-22:30", "22:00-23:00"})},
			[]wantProblem{{"loads[0].windows[1]", "overlaps windows[0] (17:00-22:30) by 30 min"}}},
		// the calendar has months 1..12
		{"month 13", "cabin", []docEdit{set("loads[2].months[5]", 13)},
			[]wantProblem{{"loads[2].months[5]", "must be a month 1..12, got 13"}}},
		{"fractional quantity", "cabin", []docEdit{set("loads[5].quantity", 1.5)},
			[]wantProblem{{"loads[5].quantity", "must be a whole number of at least 1, got 1.5"}}},
		{"missing site latitude", "cabin", []docEdit{del("site.latitude_deg")},
			[]wantProblem{{"site.latitude_deg", "is required"}}},
		{"missing chemistry", "cabin", []docEdit{del("battery.chemistry")},
			[]wantProblem{{"battery.chemistry", "is required"}}},
		{"controller kind not in enum", "cabin", []docEdit{set("controller.kind", "fast")},
			[]wantProblem{{"controller.kind", "must be one of mppt, pwm, got fast"}}},
		{"chemistry not in enum", "cabin", []docEdit{set("battery.chemistry", "nickel")},
			[]wantProblem{{"battery.chemistry", "must be one of flooded, agm, gel, lifepo4, got nickel"}}},
		// an AC load needs an inverter on a DC bus
		{"AC load without inverter", "cabin", []docEdit{del("inverter")},
			[]wantProblem{{"inverter", "is required: the inventory has AC loads"}}},
		// loads reconnect above the disconnect state of charge 1 − max_dod
		{"reconnect below cut-off", "cabin", []docEdit{set("battery.reconnect_soc", 0.4)},
			[]wantProblem{{"battery.reconnect_soc", "must be above the cut-off state of charge 1 − max_dod = 0.5, got 0.4"}}},
		// the maximum-power voltage of a module lies below its open-circuit voltage (any I-V curve)
		{"vmp equal to voc", "cabin", []docEdit{set("array.module.vmp_v", 22.4), set("array.module.imp_a", 5.36)},
			[]wantProblem{{"array.module.vmp_v", "must be below voc_v (22.4 V)"}}},
		{"bad date", "cabin", []docEdit{set("output.date", "2026-13-01")},
			[]wantProblem{{"output.date", "must be a date YYYY-MM-DD, got \"2026-13-01\""}}},
		{"zero simulated years", "cabin", []docEdit{set("simulation.years", 0)},
			[]wantProblem{{"simulation.years", "must be from 1 to 1000, got 0"}}},
		{"fractional simulated years", "cabin", []docEdit{set("simulation.years", 1.5)},
			[]wantProblem{{"simulation.years", "must be integer"}}},
		// IEC 60228 defines classes 1, 2, 5 and 6; the tool supports 2 and 5
		{"cable class 3", "cabin", []docEdit{set("wiring.cable_class", 3)},
			[]wantProblem{{"wiring.cable_class", "must be 2 or 5, got 3"}}},
		{"branch names an unknown load", "cabin", []docEdit{set("wiring.dc_branches[0].loads[1]", "Reading lamps")},
			[]wantProblem{{"wiring.dc_branches[0].loads[1]", "no DC load is named \"Reading lamps\""}}},
		{"branch names an AC load", "cabin", []docEdit{set("wiring.dc_branches[1].loads", []any{"Laptop"})},
			[]wantProblem{{"wiring.dc_branches[1].loads[0]", "no DC load is named \"Laptop\""}}},
		// elevation is at most 90° (the zenith)
		{"horizon above the zenith", "cabin", []docEdit{set("site.horizon[2].elevation_deg", 95)},
			[]wantProblem{{"site.horizon[2].elevation_deg", "must be at most 90, got 95"}}},
		// the tool takes tilts of 0..90° from horizontal
		{"tilt beyond vertical", "cabin", []docEdit{set("array.tilt_deg", 100)},
			[]wantProblem{{"array.tilt_deg", "must be at most 90, got 100"}}},
		{"tilt neither number nor word", "cabin", []docEdit{set("array.tilt_deg", "steep")},
			[]wantProblem{{"array.tilt_deg", "must be a number or one of the words"}}},
		// 12, 24, 36 and 48 V are the nominal DC voltages on offer (common practice)
		{"nominal voltage 30", "cabin", []docEdit{set("system.nominal_v", 30)},
			[]wantProblem{{"system.nominal_v", "must be 12, 24, 36, 48 or \"auto\", got 30"}}},
		{"unknown top-level key", "cabin", []docEdit{set("loadz", []any{})},
			[]wantProblem{{"loadz", "unknown key (did you mean \"loads\"?)"}}},
		{"unknown key that looks like an index", "cabin", []docEdit{set("battery.7", 1)},
			[]wantProblem{{"battery.7", "unknown key"}}},
		{"unknown module key", "cabin", []docEdit{set("array.module.vmpp_v", 18.3)},
			[]wantProblem{{"array.module.vmpp_v", "did you mean \"vmp_v\""}}},
		{"circuit not in enum", "cabin", []docEdit{set("loads[3].circuit", "both")},
			[]wantProblem{{"loads[3].circuit", "must be one of ac, dc, got both"}}},
		{"eight days a week", "cabin", []docEdit{set("loads[0].days_per_week", 8)},
			[]wantProblem{{"loads[0].days_per_week", "at most 7, got 8"}}},
		{"duty cycle above 1", "cabin", []docEdit{set("loads[3].duty_cycle", 1.5)},
			[]wantProblem{{"loads[3].duty_cycle", "at most 1, got 1.5"}}},
		{"two ways of daily use", "cabin", []docEdit{set("loads[4].hours_per_day", 2)},
			[]wantProblem{{"loads[4]", "more than one way of daily use (hours_per_day, energy_wh_day)"}}},
		{"no daily use", "cabin", []docEdit{del("loads[4].energy_wh_day")},
			[]wantProblem{{"loads[4]", "give its daily use"}}},
		// 4 W × 24 h = 96 Wh, computed
		{"energy above power all day", "cabin", []docEdit{set("loads[4].energy_wh_day", 200)},
			[]wantProblem{{"loads[4].energy_wh_day", "must not exceed power_w × 24 h = 96 Wh"}}},
		{"empty inventory", "cabin", []docEdit{set("loads", []any{})},
			[]wantProblem{{"loads", "must list at least one load"}, {"wiring.dc_branches[0].loads[0]", "no DC load"}, {"wiring.dc_branches[0].loads[1]", "no DC load"}, {"wiring.dc_branches[1].loads[0]", "no DC load"}}},
		{"surge factor below 1", "cabin", []docEdit{set("loads[2].surge_factor", 0.5)},
			[]wantProblem{{"loads[2].surge_factor", "must be at least 1"}}},
		{"empty project name", "cabin", []docEdit{set("name", "")},
			[]wantProblem{{"name", "must not be empty"}}},
		// a reflectance is a fraction
		{"albedo above 1", "cabin", []docEdit{set("site.ground_albedo", 1.5)},
			[]wantProblem{{"site.ground_albedo", "must be at most 1, got 1.5"}}},
		{"record low above record high", "cabin", []docEdit{set("site.record_low_c", 35)},
			[]wantProblem{{"site.record_low_c", "record low 35 °C is above the record high 31 °C"}}},
		{"soiling loss 0.6", "cabin", []docEdit{set("array.soiling_loss", 0.6)},
			[]wantProblem{{"array.soiling_loss", "loss fraction from 0 to below 0.5, got 0.6"}}},
		// azimuth is 0..360° clockwise from north
		{"azimuth beyond 360", "cabin", []docEdit{set("array.azimuth_deg", 400)},
			[]wantProblem{{"array.azimuth_deg", "must be at most 360, got 400"}}},
		{"zero autonomy days", "cabin", []docEdit{set("battery.autonomy_days", 0)},
			[]wantProblem{{"battery.autonomy_days", "must be greater than 0, got 0"}}},
		{"block voltage not dividing the bank", "cabin", []docEdit{set("battery.block.nominal_v", 5)},
			[]wantProblem{{"battery.block.nominal_v", "5 V blocks cannot make a 12 V bank"}}},
		{"paper not in enum", "cabin", []docEdit{set("output.paper", "a3")},
			[]wantProblem{{"output.paper", "must be one of a4, letter, got a3"}}},
		{"negative price", "cabin", []docEdit{set("costs.module_each", -5)},
			[]wantProblem{{"costs.module_each", "must not be negative, got -5"}}},
		{"target LOLP of 1", "clinic", []docEdit{set("simulation.target_lolp", 1)},
			[]wantProblem{{"simulation.target_lolp", "must be below 1, got 1"}}},
		{"loads not an array", "cabin", []docEdit{set("loads", map[string]any{})},
			[]wantProblem{{"loads", "must be array, got object"}}},
		{"site not an object", "cabin", []docEdit{set("site", "here")},
			[]wantProblem{{"site", "must be object, got string"}}},
		{"negative seed", "cabin", []docEdit{set("simulation.seed", -1)},
			[]wantProblem{{"simulation.seed", "must be a whole number from 0 to 18446744073709551615, got number -1"}}},
		{"month beyond int range", "cabin", []docEdit{raw("loads[2].months[1]", "1e20")},
			[]wantProblem{{"loads[2].months[1]", "must be a whole number, got number 1"}}},
		{"power beyond float64", "cabin", []docEdit{raw("loads[3].power_w", "1e400")},
			[]wantProblem{{"loads[3].power_w", "must be a number between -1.8e308 and 1.8e308, got number 1e400"}}},
		// civil time zones run from UTC−12 to UTC+14 (IANA tz database; from memory)
		{"time zone beyond +14", "cabin", []docEdit{set("site.utc_offset_h", 20)},
			[]wantProblem{{"site.utc_offset_h", "must be at most 14, got 20"}}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ps := problemsOf(t, mutate(t, tc.example, tc.edits...))
			if ps == nil {
				t.Fatal("bad document accepted")
			}
			matched := make([]bool, len(ps))
			for _, w := range tc.want {
				found := false
				for i, p := range ps {
					if !matched[i] && p.Path == w.path && strings.Contains(p.Message, w.gist) {
						matched[i], found = true, true
						break
					}
				}
				if !found {
					t.Errorf("missing problem %s: …%s…", w.path, w.gist)
				}
			}
			for i, p := range ps {
				if !matched[i] {
					t.Errorf("unexpected problem %s", p)
				}
			}
		})
	}
}

// TestDecodeAllProblemsInOnePass: a document with three problems of
// different kinds (schema and physical sense) gives three lines.
func TestDecodeAllProblemsInOnePass(t *testing.T) {
	data := mutate(t, "cabin",
		set("site.latitude", 46.8),
		set("loads[2].power_w", -60),
		set("battery.max_dod", 1.2))
	_, err := Decode(data)
	if err == nil {
		t.Fatal("bad document accepted")
	}
	want := []string{
		`site.latitude: unknown key (did you mean "latitude_deg"?)`,
		"loads[2].power_w: must be greater than 0, got -60",
		"battery.max_dod: must be at most 1, got 1.2",
	}
	got := strings.Split(err.Error(), "\n")
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Fatalf("got %d lines:\n%s\nwant:\n%s", len(got), err, strings.Join(want, "\n"))
	}
}

// TestDecodeProblemOrder: schema problems come out with array indices in
// numeric order (loads[2] before loads[10]).
func TestDecodeProblemOrder(t *testing.T) {
	loads := make([]any, 12)
	for i := range loads {
		loads[i] = map[string]any{"name": fmt.Sprint("l", i), "power_w": 1, "hours_per_day": 1}
	}
	loads[2].(map[string]any)["power_w"] = "one"
	loads[10].(map[string]any)["power_w"] = "ten"
	ps := problemsOf(t, mutate(t, "cabin", del("wiring.dc_branches"), set("loads", loads)))
	var paths []string
	for _, p := range ps {
		paths = append(paths, p.Path)
	}
	if strings.Join(paths, " ") != "loads[2].power_w loads[10].power_w" {
		t.Fatalf("got %v", paths)
	}
}

// TestDecodeSyntax: a JSON syntax error names the line and column of the
// offending character; a truncated file says it ends early, where.
func TestDecodeSyntax(t *testing.T) {
	cabin := readExample(t, "cabin")
	lines := strings.Split(string(cabin), "\n")
	// Line 3 of cabin.json is `  "name": "Larch Hollow weekend cabin",`;
	// without its comma the parser stops at the quote opening line 4's key,
	// the third character of that line.
	if !strings.HasPrefix(lines[2], `  "name": `) || !strings.HasPrefix(lines[3], `  "client"`) {
		t.Fatalf("cabin.json changed; lines 3-4 are %q, %q", lines[2], lines[3])
	}
	noComma := slicesWith(lines, 2, strings.TrimSuffix(lines[2], ","))

	tests := []struct {
		name string
		data string
		want string
	}{
		{"missing comma", strings.Join(noComma, "\n"), "line 4, column 3: JSON syntax: invalid character '\"' after object key:value pair"},
		{"trailing comma", "{\n  \"name\": \"x\",\n}", "line 3, column 1: JSON syntax: invalid character '}'"},
		{"bad literal", "{\n\"name\": tru}", "line 2, column 12: JSON syntax: invalid character '}' in literal true"},
		{"data after the document", "{\"name\": \"x\"}\n\n  {}", "line 3, column 3: unexpected data after the document"},
		{"garbage after the document", `{"name": "x"} x`, "line 1, column 15: unexpected data after the document"},
		{"empty file", "", "line 1, column 1: the document ends early"},
		{"not an object", "[1, 2]", "the document must be a JSON object"},
	}
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		b := string(readExample(t, name))
		half := b[:len(b)/2]
		line := strings.Count(half, "\n") + 1
		col := len([]rune(half[strings.LastIndexByte(half, '\n')+1:])) + 1
		tests = append(tests, struct{ name, data, want string }{
			name + " cut in half", half,
			fmt.Sprintf("line %d, column %d: the document ends early (truncated file?)", line, col),
		})
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ps := problemsOf(t, []byte(tc.data))
			if len(ps) != 1 || ps[0].Path != "" || !strings.HasPrefix(ps[0].Message, tc.want) {
				t.Fatalf("got %q\nwant %q…", ps, tc.want)
			}
		})
	}
}

func slicesWith(s []string, i int, v string) []string {
	out := append([]string(nil), s...)
	out[i] = v
	return out
}

// minimalDoc holds only the required keys, plus the monthly climate the
// physical checks need. Its figures are invented for the test.
const minimalDoc = `{
  "name": "Garden shed",
  "site": {"name": "Hillside plot", "latitude_deg": 40.4, "longitude_deg": -3.7,
    "ghi_kwh_m2_day": [2.1, 3.0, 4.3, 5.4, 6.3, 7.1, 7.3, 6.4, 5.0, 3.4, 2.3, 1.8],
    "air_temp_c": [6, 7, 10, 13, 17, 22, 25, 25, 21, 15, 10, 7]},
  "loads": [{"name": "lamp", "power_w": 10, "hours_per_day": 3}],
  "array": {"module": {"pmax_w": 100, "voc_v": 22, "isc_a": 6, "vmp_v": 18, "imp_a": 5.56}},
  "battery": {"chemistry": "agm", "block": {"nominal_v": 12, "capacity_ah": 100}}
}`

// leftNil lists the optional pointers ApplyDefaults deliberately leaves
// unset on minimalDoc: values with no default (prices, measured figures,
// the other ways of entering daily use), chemistry figures filled later by
// ApplyChemistryDefaults, and sections absent from the document.
var leftNil = map[string]bool{
	"loads[].energy_wh_day": true, "loads[].duty_cycle": true, "loads[].surge_w": true,
	"array.module.temp_coeff_voc_pct_per_c": true, // NEC 690.7 table fallback
	"controller.min_mppt_voltage_v":         true,
	"battery.max_dod":                       true, "battery.room_volume_m3": true,
	"battery.reconnect_soc": true, "battery.noncritical_cutoff_soc": true, "battery.chemistry_overrides": true,
	"battery.block.rated_hours": true, "battery.block.internal_resistance_mohm": true,
	"battery.block.max_charge_a": true, "battery.block.max_discharge_a": true, "battery.block.peukert_exponent": true,
	"inverter":          true,
	"costs.module_each": true, "costs.controller_each": true, "costs.battery_block_each": true,
	"costs.inverter_each": true, "costs.fuse_each": true, "costs.breaker_each": true,
	"costs.combiner_each": true, "costs.cable_per_m_per_mm2": true, "costs.mounting_per_module": true,
	"costs.installation": true, "costs.om_per_year": true,
	"simulation.target_lolp": true,
}

// leftNilElsewhere adds the pointers without a default in sections or
// ways of entry the examples use and minimalDoc does not.
var leftNilElsewhere = map[string]bool{
	"loads[].hours_per_day": true, "loads[].surge_factor": true, // surge_w given instead
	"inverter.idle_w": true, "inverter.standby_w": true, "inverter.wake_threshold_w": true,
	"wiring.dc_branches[].current_a": true,
}

var indexRE = regexp.MustCompile(`\[\d+\]`)

// genericPath writes every array index of a path as [].
func genericPath(p string) string { return indexRE.ReplaceAllString(p, "[]") }

// nilPointers walks v and returns the JSON paths of its nil pointers.
func nilPointers(v reflect.Value, path string, out *[]string) {
	switch v.Kind() {
	case reflect.Pointer:
		if v.IsNil() {
			*out = append(*out, path)
			return
		}
		nilPointers(v.Elem(), path, out)
	case reflect.Struct:
		t := v.Type()
		for i := range t.NumField() {
			name, _, _ := strings.Cut(t.Field(i).Tag.Get("json"), ",")
			if name == "-" || name == "" || !t.Field(i).IsExported() {
				continue
			}
			p := name
			if path != "" {
				p = path + "." + name
			}
			nilPointers(v.Field(i), p, out)
		}
	case reflect.Slice:
		for i := range v.Len() {
			nilPointers(v.Index(i), fmt.Sprintf("%s[%d]", path, i), out)
		}
	}
}

func TestApplyDefaultsFillsOptionalPointers(t *testing.T) {
	p, err := Decode([]byte(minimalDoc))
	if err != nil {
		t.Fatalf("minimal document refused:\n%v", err)
	}
	var nils []string
	nilPointers(reflect.ValueOf(p).Elem(), "", &nils)
	got := map[string]bool{}
	for _, n := range nils {
		n = genericPath(n)
		got[n] = true
		if !leftNil[n] {
			t.Errorf("%s is still nil after ApplyDefaults", n)
		}
	}
	for n := range leftNil {
		if !got[n] {
			t.Errorf("%s is now filled by ApplyDefaults; take it off leftNil", n)
		}
	}
	// A few of the defaults, by value (the constants of defaults.go).
	if !p.Array.TiltDeg.IsAuto || *p.Array.AzimuthDeg != 180 || p.Controller.Kind != "mppt" ||
		*p.Battery.AutonomyDays != DefaultAutonomyDays || *p.Site.UTCOffsetH != 0 || p.Loads[0].Spread != DefaultSpreadWindow {
		t.Errorf("defaults not as documented: tilt %+v azimuth %g kind %q autonomy %g utc %g spread %q",
			p.Array.TiltDeg, *p.Array.AzimuthDeg, p.Controller.Kind, *p.Battery.AutonomyDays, *p.Site.UTCOffsetH, p.Loads[0].Spread)
	}
	// Battery indoors by default: the coldest monthly mean (6 °C) held
	// between 10 and 20 °C.
	if *p.Battery.TempC != 10 {
		t.Errorf("battery temperature %g, want 10", *p.Battery.TempC)
	}
}

// TestApplyDefaultsIdempotent: applying the defaults again changes
// nothing, and the document with its defaults filled in (what
// `validate --show-defaults` prints) decodes to the same project.
func TestApplyDefaultsIdempotent(t *testing.T) {
	docs := map[string][]byte{"minimal": []byte(minimalDoc)}
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		docs[name] = readExample(t, name)
	}
	for name, data := range docs {
		t.Run(name, func(t *testing.T) {
			p, err := Decode(data)
			if err != nil {
				t.Fatalf("refused:\n%v", err)
			}
			var nils []string
			nilPointers(reflect.ValueOf(p).Elem(), "", &nils)
			for _, n := range nils {
				if g := genericPath(n); !leftNil[g] && !leftNilElsewhere[g] {
					t.Errorf("%s is still nil after ApplyDefaults", n)
				}
			}
			again := clone(t, p)
			ApplyDefaults(again)
			if !reflect.DeepEqual(p, again) {
				t.Fatal("ApplyDefaults changed a document it had already filled")
			}
			shown, err := json.Marshal(p)
			if err != nil {
				t.Fatal(err)
			}
			back, err := Decode(shown)
			if err != nil {
				t.Fatalf("document with defaults filled in is refused:\n%v", err)
			}
			if !reflect.DeepEqual(p, back) {
				t.Fatalf("document with defaults filled in decodes differently:\n%s", shown)
			}
		})
	}
}

func clone(tb testing.TB, p *Project) *Project {
	tb.Helper()
	b, err := json.Marshal(p)
	if err != nil {
		tb.Fatal(err)
	}
	var c Project
	if err := json.Unmarshal(b, &c); err != nil {
		tb.Fatal(err)
	}
	if !reflect.DeepEqual(p, &c) {
		tb.Fatal("JSON round trip of a project is lossy")
	}
	return &c
}

func ExampleDecode() {
	doc := strings.Replace(minimalDoc, `"power_w": 10`, `"power_w": -10`, 1)
	doc = strings.Replace(doc, `"chemistry": "agm"`, `"chemistry": "agm", "max_dod": 1.5`, 1)
	_, err := Decode([]byte(doc))
	fmt.Println(err)

	p, err := Decode([]byte(minimalDoc))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p.Controller.Kind, p.Array.TiltDeg.Word, *p.Array.AzimuthDeg, *p.Battery.AutonomyDays)
	// Output:
	// loads[0].power_w: must be greater than 0, got -10
	// battery.max_dod: must be at most 1, got 1.5
	// mppt optimise 180 3
}
