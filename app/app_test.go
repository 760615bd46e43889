package app

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"solstand/examples"
)

func examplePath(name string) string { return filepath.Join("..", "examples", name+".json") }

func years(n int) *int { return &n }

// TestSizeExamples sizes each example end to end, writes its workbook and
// reads it back with excelize, and checks the JSON summary against the
// stable interface of CONTRACT.md: its keys, and the energy ledger, which
// must close to 1e-9 relative.
func TestSizeExamples(t *testing.T) {
	for _, name := range examples.Names() {
		t.Run(name, func(t *testing.T) {
			dir := t.TempDir()
			out := filepath.Join(dir, name+".xlsx")
			var stdout, stderr bytes.Buffer
			err := Size(SizeOptions{Project: examplePath(name), Out: out, JSON: true, Years: years(3), Quiet: true}, &stdout, &stderr)
			if err != nil {
				t.Fatalf("size: %v\n%s", err, stderr.String())
			}
			f, err := excelize.OpenFile(out)
			if err != nil {
				t.Fatalf("workbook does not open: %v", err)
			}
			defer f.Close()
			if len(f.GetSheetList()) < 5 {
				t.Errorf("workbook has only sheets %v", f.GetSheetList())
			}
			var sum map[string]any
			if err := json.Unmarshal(stdout.Bytes(), &sum); err != nil {
				t.Fatalf("summary is not JSON: %v", err)
			}
			for _, key := range []string{
				"design_month", "demand.daily_wh", "demand.peak_w", "demand.surge_w",
				"resource.ghi_kwh_m2_day", "resource.poa_kwh_m2_day",
				"array.required_w", "array.rated_w", "array.modules", "array.modules_series", "array.strings", "array.tilt_deg", "array.azimuth_deg",
				"battery.required_ah", "battery.capacity_ah", "battery.capacity_wh", "battery.usable_wh", "battery.nominal_v",
				"battery.autonomy_days", "battery.max_dod", "battery.blocks_series", "battery.strings",
				"controller.kind", "controller.rated_a",
				"simulation.years", "simulation.seed", "simulation.loss_of_load_probability", "simulation.demand_wh",
				"simulation.unmet_wh", "simulation.min_soc", "simulation.mean_soc",
				"simulation.ledger.pv_available_wh", "simulation.ledger.load_served_wh", "simulation.ledger.unmet_wh",
				"simulation.ledger.dumped_wh", "simulation.ledger.losses_wh", "simulation.ledger.battery_start_wh", "simulation.ledger.battery_end_wh",
				"cautions",
			} {
				if lookup(sum, key) == nil {
					t.Errorf("summary lacks %s", key)
				}
			}
			if n := len(lookup(sum, "demand.daily_wh").([]any)); n != 12 {
				t.Errorf("demand.daily_wh has %d months", n)
			}
			led := func(k string) float64 { return lookup(sum, "simulation.ledger."+k).(float64) }
			in := led("pv_available_wh") + led("battery_start_wh")
			outE := led("load_served_wh") + led("losses_wh") + led("dumped_wh") + led("battery_end_wh")
			if math.Abs(in-outE) > 1e-9*in {
				t.Errorf("ledger does not close: %g in, %g out", in, outE)
			}
			dem := lookup(sum, "simulation.demand_wh").(float64)
			if got := led("load_served_wh") + led("unmet_wh"); math.Abs(got-dem) > 1e-9*dem {
				t.Errorf("served + unmet = %g, demand %g", got, dem)
			}
			lolp := lookup(sum, "simulation.loss_of_load_probability").(float64)
			if want := led("unmet_wh") / dem; math.Abs(lolp-want) > 1e-12 {
				t.Errorf("loss_of_load_probability %g, unmet/demand %g", lolp, want)
			}
			kind := lookup(sum, "controller.kind").(string)
			if kind != "mppt" && kind != "pwm" {
				t.Errorf("controller.kind %q", kind)
			}
			// Every caution carries a code, a severity and a message, and the
			// codes-and-practitioner note is always present.
			found := false
			for _, c := range lookup(sum, "cautions").([]any) {
				m := c.(map[string]any)
				switch m["severity"] {
				case "info", "warning", "danger":
				default:
					t.Errorf("caution %v has severity %v", m["code"], m["severity"])
				}
				if m["code"] == "" || m["message"] == "" {
					t.Errorf("caution without code or message: %v", m)
				}
				if m["code"] == "codes-and-practitioner" {
					found = true
				}
			}
			if !found {
				t.Error("the standing note on codes and a licensed practitioner is missing")
			}
		})
	}
}

// lookup follows a dotted path through decoded JSON.
func lookup(v any, path string) any {
	for _, k := range strings.Split(path, ".") {
		m, ok := v.(map[string]any)
		if !ok {
			return nil
		}
		v = m[k]
	}
	return v
}

func TestInverterOnlyWithACLoads(t *testing.T) {
	for name, want := range map[string]bool{"clinic": true, "telecom": false} {
		var stdout bytes.Buffer
		if err := Size(SizeOptions{Project: examplePath(name), JSON: true, Years: years(1), Quiet: true}, &stdout, &bytes.Buffer{}); err != nil {
			t.Fatal(err)
		}
		var sum map[string]any
		_ = json.Unmarshal(stdout.Bytes(), &sum)
		if got := lookup(sum, "inverter.continuous_w") != nil; got != want {
			t.Errorf("%s: inverter present %v, want %v", name, got, want)
		}
	}
}

func TestSameSeedSameBytes(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a.xlsx"), filepath.Join(dir, "b.xlsx")
	for _, out := range []string{a, b} {
		if err := Size(SizeOptions{Project: examplePath("cabin"), Out: out, Years: years(2), Quiet: true}, &bytes.Buffer{}, &bytes.Buffer{}); err != nil {
			t.Fatal(err)
		}
	}
	x, _ := os.ReadFile(a)
	y, _ := os.ReadFile(b)
	if !bytes.Equal(x, y) {
		t.Error("two runs with the same project and seed wrote different workbooks")
	}
}

// TestFailureLeavesNoOutput: an invalid project exits 3 and creates no file;
// an output path equal to the input is refused with exit 2 and the input
// is untouched.
func TestFailureLeavesNoOutput(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.json")
	if err := os.WriteFile(bad, []byte(`{"name": "x", "site": {"name": "s", "latitude_deg": 95, "longitude_deg": 0}}`), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out.xlsx")
	err := Size(SizeOptions{Project: bad, Out: out, Quiet: true}, &bytes.Buffer{}, &bytes.Buffer{})
	if Code(err) != ExitInvalid {
		t.Fatalf("exit %d (%v), want %d", Code(err), err, ExitInvalid)
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Error("an output file was created for an invalid project")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("the folder holds %d entries, want only the input", len(entries))
	}

	src, _ := os.ReadFile(examplePath("cabin"))
	in := filepath.Join(dir, "cabin.json")
	_ = os.WriteFile(in, src, 0o644)
	err = Size(SizeOptions{Project: in, Out: in, Quiet: true}, &bytes.Buffer{}, &bytes.Buffer{})
	if Code(err) != ExitUsage {
		t.Errorf("output = input: exit %d (%v), want %d", Code(err), err, ExitUsage)
	}
	after, _ := os.ReadFile(in)
	if !bytes.Equal(src, after) {
		t.Error("the input was changed")
	}
}

func TestValidateReportsPaths(t *testing.T) {
	dir := t.TempDir()
	src, _ := os.ReadFile(examplePath("cabin"))
	doc := strings.Replace(string(src), `"power_w": 60, "hours_per_day": 0.5`, `"power_w": -60, "hours_per_day": 0.5`, 1)
	p := filepath.Join(dir, "p.json")
	_ = os.WriteFile(p, []byte(doc), 0o644)
	err := Validate(ValidateOptions{Project: p}, &bytes.Buffer{}, &bytes.Buffer{})
	if Code(err) != ExitInvalid {
		t.Fatalf("exit %d, want 3", Code(err))
	}
	var buf bytes.Buffer
	Report(&buf, err)
	if !strings.Contains(buf.String(), "loads[2].power_w: must be greater than 0, got -60") {
		t.Errorf("stderr %q lacks the path and message", buf.String())
	}
}

func TestShowDefaults(t *testing.T) {
	var stdout bytes.Buffer
	if err := Validate(ValidateOptions{Project: examplePath("telecom"), ShowDefaults: true}, &stdout, &bytes.Buffer{}); err != nil {
		t.Fatal(err)
	}
	var doc map[string]any
	if err := json.Unmarshal(stdout.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	// Defaults not in the example must show: chemistry figures, derates, seed.
	for _, key := range []string{"battery.chemistry_overrides.charge_efficiency", "array.mismatch_loss", "simulation.seed", "battery.reconnect_soc"} {
		if lookup(doc, key) == nil {
			t.Errorf("--show-defaults lacks %s", key)
		}
	}
}

func TestInitTemplates(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		out := filepath.Join(dir, name+".json")
		if err := Init(name, out, false); err != nil {
			t.Fatal(err)
		}
		if _, err := LoadProject(out, ""); err != nil {
			t.Errorf("%s: the starter project does not validate: %v", name, err)
		}
		if err := Init(name, out, false); Code(err) != ExitUsage {
			t.Errorf("%s: overwriting without --force: exit %d", name, Code(err))
		}
	}
	if err := Init("lighthouse", filepath.Join(dir, "x.json"), false); Code(err) != ExitUsage {
		t.Errorf("unknown template: exit %d", Code(err))
	}
}

// TestSunContract checks `sun --json` against Duffie & Beckman Example
// 1.6.1: latitude 43° N, 10:30 solar time on February 13, a surface tilted
// 45° and turned 15° west of south (azimuth 195°): declination −14°,
// incidence 35° (the book rounds; we allow 0.5°).
func TestSunContract(t *testing.T) {
	tilt, az := 45.0, 195.0
	var out bytes.Buffer
	err := Sun(SunOptions{LatDeg: 43, LonDeg: -89.4, At: "2026-02-13T10:30:00-06:00", SolarTime: true, TiltDeg: &tilt, AzimuthDeg: &az, JSON: true}, &out)
	if err != nil {
		t.Fatal(err)
	}
	var v map[string]float64
	if err := json.Unmarshal(out.Bytes(), &v); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"zenith_deg", "azimuth_deg", "elevation_deg", "declination_deg", "hour_angle_deg", "equation_of_time_min", "incidence_deg"} {
		if _, ok := v[k]; !ok {
			t.Errorf("sun --json lacks %s", k)
		}
	}
	if math.Abs(v["declination_deg"]+14) > 0.5 { // Duffie & Beckman Example 1.6.1
		t.Errorf("declination %g, want −14", v["declination_deg"])
	}
	if math.Abs(v["incidence_deg"]-35) > 0.5 { // Duffie & Beckman Example 1.6.1
		t.Errorf("incidence %g, want 35", v["incidence_deg"])
	}
	if math.Abs(v["hour_angle_deg"]+22.5) > 1e-6 { // 10:30 solar time is 22.5° before noon
		t.Errorf("hour angle %g, want −22.5", v["hour_angle_deg"])
	}
}

// TestWireContract: 20 A over 10 m one way at 12 V with 3 % drop allows at
// most 0.36 V, i.e. 2 × 10 m × 20 A × R ≤ 0.36 V → R ≤ 0.9 Ω/km. IEC 60228
// class 2: 16 mm² is 1.15 Ω/km (too much), 25 mm² is 0.727 Ω/km (SOURCES.md,
// IEC 60228); NEC Chapter 9 Table 8: 4 AWG 0.308 Ω/kft = 1.01 Ω/km (too
// much), so 3 AWG.
func TestWireContract(t *testing.T) {
	for _, tc := range []struct {
		std   string
		class int
		want  string
	}{{"iec", 2, "25 mm²"}, {"nec", 0, "3 AWG"}} {
		var out bytes.Buffer
		if err := Wire(WireOptions{CurrentA: 20, LengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: tc.std, Class: tc.class, JSON: true}, &out); err != nil {
			t.Fatal(err)
		}
		var v map[string]any
		_ = json.Unmarshal(out.Bytes(), &v)
		if v["size"] != tc.want {
			t.Errorf("%s: size %v, want %s", tc.std, v["size"], tc.want)
		}
		for _, k := range []string{"standard", "size", "area_mm2", "resistance_ohm_per_km", "drop_v", "drop_pct"} {
			if _, ok := v[k]; !ok {
				t.Errorf("wire --json lacks %s", k)
			}
		}
		if d := v["drop_pct"].(float64); d > 3 {
			t.Errorf("%s: drop %g %% above the limit", tc.std, d)
		}
	}
	if err := Wire(WireOptions{CurrentA: 20, LengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: "jis"}, &bytes.Buffer{}); Code(err) != ExitUsage {
		t.Errorf("unknown standard: exit %d", Code(err))
	}
}

// TestResourceContract: a horizontal plane returns the horizontal
// irradiation (energy balance of the transposition), and the months carry
// the representative days of Klein (1977), Duffie & Beckman Table 1.6.1.
func TestResourceContract(t *testing.T) {
	var out bytes.Buffer
	err := Resource(ResourceOptions{LatDeg: -13.2, LonDeg: 33.8, GHI: "5.6,5.6,5.7,5.6,5.3,4.9,5.1,5.8,6.5,6.8,6.3,5.6", TiltDeg: 0, Albedo: 0.2, JSON: true}, &out, &bytes.Buffer{})
	if err != nil {
		t.Fatal(err)
	}
	var v struct {
		Months []map[string]float64 `json:"months"`
	}
	if err := json.Unmarshal(out.Bytes(), &v); err != nil {
		t.Fatal(err)
	}
	days := []float64{17, 47, 75, 105, 135, 162, 198, 228, 258, 288, 318, 344} // Duffie & Beckman Table 1.6.1
	if len(v.Months) != 12 {
		t.Fatalf("%d months", len(v.Months))
	}
	for i, m := range v.Months {
		if m["day_of_year"] != days[i] {
			t.Errorf("month %d: day %g, want %g", i+1, m["day_of_year"], days[i])
		}
		if math.Abs(m["poa_kwh_m2_day"]-m["ghi_kwh_m2_day"]) > 1e-9 {
			t.Errorf("month %d: horizontal plane %g, GHI %g", i+1, m["poa_kwh_m2_day"], m["ghi_kwh_m2_day"])
		}
		for _, k := range []string{"month", "extraterrestrial_kwh_m2_day", "clearness_index", "diffuse_fraction"} {
			if _, ok := m[k]; !ok {
				t.Errorf("resource --json lacks months[].%s", k)
			}
		}
	}
	if err := Resource(ResourceOptions{LatDeg: 10, GHI: "1,2,3"}, &bytes.Buffer{}, &bytes.Buffer{}); Code(err) != ExitUsage {
		t.Errorf("11 GHI values: exit %d", Code(err))
	}
}

// TestHourlySheet: --hourly adds the hourly sheet with one row per hour of
// the first simulated year.
func TestHourlySheet(t *testing.T) {
	out := filepath.Join(t.TempDir(), "h.xlsx")
	if err := Size(SizeOptions{Project: examplePath("telecom"), Out: out, Hourly: true, Years: years(1), Quiet: true}, &bytes.Buffer{}, &bytes.Buffer{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(out)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows("Hourly")
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) < 8760 {
		t.Errorf("hourly sheet has %d rows, want at least 8760", len(rows))
	}
}

// TestSourceDateEpoch: without output.date, the workbook's date comes from
// SOURCE_DATE_EPOCH (the reproducible-builds convention).
func TestSourceDateEpoch(t *testing.T) {
	t.Setenv("SOURCE_DATE_EPOCH", "1767225600") // 2026-01-01T00:00:00Z
	dir := t.TempDir()
	src, _ := os.ReadFile(examplePath("telecom"))
	doc := strings.Replace(string(src), `"date": "2026-12-01"`, `"paper": "letter"`, 1)
	doc = strings.Replace(doc, `"output": {"paper": "letter", "paper": "letter"}`, `"output": {"paper": "letter"}`, 1)
	in := filepath.Join(dir, "t.json")
	_ = os.WriteFile(in, []byte(doc), 0o644)
	p, err := LoadProject(in, "")
	if err != nil {
		t.Fatal(err)
	}
	if p.Output.Date != "" {
		t.Fatalf("the test document still has a date %q", p.Output.Date)
	}
	r, err := run(in, "", nil, years(1), true, &bytes.Buffer{}, false, false)
	if err != nil {
		t.Fatal(err)
	}
	if r.Date != "2026-01-01" {
		t.Errorf("date %q, want 2026-01-01", r.Date)
	}
	t.Setenv("SOURCE_DATE_EPOCH", "1780000000") // 2026-05-28
	r, _ = run(in, "", nil, years(1), true, &bytes.Buffer{}, false, false)
	if r.Date != "2026-05-28" {
		t.Errorf("date %q, want 2026-05-28", r.Date)
	}
}

// TestCurvesCommand: `curves --json` gives one curve per target (10 %, 1 %,
// 0.1 %) whose points meet their target, and loss of load falls as storage
// grows along a curve's array-to-load ratio (Egido & Lorenzo 1992: the
// isoreliability curve trades array for storage).
func TestCurvesCommand(t *testing.T) {
	var out bytes.Buffer
	if err := Curves(CurvesOptions{Project: examplePath("cabin"), JSON: true, Years: years(3), Quiet: true}, &out, &bytes.Buffer{}); err != nil {
		t.Fatal(err)
	}
	var v struct {
		Curves []struct {
			TargetLOLP float64 `json:"target_lolp"`
			Points     []struct {
				StorageDays float64 `json:"storage_days"`
				ArrayToLoad float64 `json:"array_to_load"`
				LOLP        float64 `json:"loss_of_load_probability"`
			} `json:"points"`
		} `json:"curves"`
	}
	if err := json.Unmarshal(out.Bytes(), &v); err != nil {
		t.Fatal(err)
	}
	if len(v.Curves) != 3 {
		t.Fatalf("%d curves, want 3", len(v.Curves))
	}
	for _, c := range v.Curves {
		if len(c.Points) == 0 {
			t.Errorf("target %g: no points", c.TargetLOLP)
		}
		for i, p := range c.Points {
			if p.LOLP > c.TargetLOLP {
				t.Errorf("target %g: point %d has loss of load %g", c.TargetLOLP, i, p.LOLP)
			}
			if i > 0 && p.ArrayToLoad > c.Points[i-1].ArrayToLoad+0.05 {
				t.Errorf("target %g: more storage (%g days) needs a larger array (%g > %g)", c.TargetLOLP, p.StorageDays, p.ArrayToLoad, c.Points[i-1].ArrayToLoad)
			}
		}
	}
	out.Reset()
	if err := Curves(CurvesOptions{Project: examplePath("cabin"), Years: years(2), Quiet: true}, &out, &bytes.Buffer{}); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out.String(), "loss-of-load target") || !strings.Contains(out.String(), "licensed practitioner") {
		t.Errorf("text output lacks the curves or the codes note:\n%s", out.String())
	}
}

// TestTerminalSummary: without -o or --json, size prints a summary that
// names the design month, the equipment and the codes note.
func TestTerminalSummary(t *testing.T) {
	var out bytes.Buffer
	if err := Size(SizeOptions{Project: examplePath("clinic"), Years: years(1), Quiet: true}, &out, &bytes.Buffer{}); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Design month:", "Array:", "Battery:", "Controller:", "Inverter:", "Simulation:", "licensed practitioner"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, out.String())
		}
	}
}
