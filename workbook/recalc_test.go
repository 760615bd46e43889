package workbook

import (
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"solstand/report"
)

// resultNames are the result defined names of CONTRACT.md with the engine
// value each must recalculate to.
func resultNames(r *report.Report) map[string]float64 {
	dm := clampMonth(r.DesignMonth)
	m := map[string]float64{
		"design_month":        float64(r.DesignMonth),
		"daily_demand_wh":     r.Demand.DailyWh[dm],
		"array_required_w":    r.Array.RequiredW,
		"array_rated_w":       r.Array.RatedW,
		"battery_required_ah": r.Battery.RequiredAh,
		"battery_capacity_ah": r.Battery.CapacityAh,
		"controller_rated_a":  r.Controller.RatedA,
	}
	if r.Inverter != nil {
		m["inverter_continuous_w"] = r.Inverter.ContinuousW
	}
	return m
}

// soffice returns the LibreOffice binary, or skips (fails where
// SOLSTAND_REQUIRE_LIBREOFFICE=1, as in CI).
func soffice(t *testing.T) string {
	t.Helper()
	for _, name := range []string{"soffice", "libreoffice"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("SOLSTAND_REQUIRE_LIBREOFFICE") == "1" {
		t.Fatal("LibreOffice (soffice) is not on PATH but SOLSTAND_REQUIRE_LIBREOFFICE=1: install libreoffice-calc-nogui")
	}
	t.Skip("LibreOffice (soffice) not on PATH: skipping the recalculation test (set SOLSTAND_REQUIRE_LIBREOFFICE=1 to make this a failure)")
	return ""
}

// recalcProfile writes a fresh LibreOffice user profile that recalculates
// every OOXML and ODF file on load, and returns its URL.
func recalcProfile(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.MkdirAll(filepath.Join(dir, "user"), 0o755); err != nil {
		t.Fatal(err)
	}
	const xcu = `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
`
	if err := os.WriteFile(filepath.Join(dir, "user", "registrymodifications.xcu"), []byte(xcu), 0o644); err != nil {
		t.Fatal(err)
	}
	return "file://" + dir
}

// recalc converts in (xlsx) to xlsx with LibreOffice headless and returns the output path.
func recalc(t *testing.T, bin, profile, in string) string {
	t.Helper()
	out := filepath.Join(t.TempDir(), "out")
	cmd := exec.Command(bin, "-env:UserInstallation="+profile, "--headless", "--norestore",
		"--convert-to", "xlsx:Calc MS Excel 2007 XML", "--outdir", out, in)
	cmd.Env = append(os.Environ(), "HOME="+t.TempDir())
	b, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("soffice: %v\n%s", err, b)
	}
	p := filepath.Join(out, filepath.Base(in))
	if _, err := os.Stat(p); err != nil {
		t.Fatalf("soffice wrote no %s: %v\n%s", p, err, b)
	}
	return p
}

// nameValues reads the numeric value of each defined name (resolved with the
// names of the workbook as written) from file.
func nameValues(t *testing.T, file string, refs map[string]string, names map[string]float64) map[string]float64 {
	t.Helper()
	f, err := excelize.OpenFile(file)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	got := map[string]float64{}
	for name := range names {
		sheet, cell := splitRef(t, refs[name])
		s, err := f.GetCellValue(sheet, cell, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		if err != nil {
			t.Fatalf("%s (%s): value %q is not a number", name, refs[name], s)
		}
		got[name] = v
	}
	return got
}

func splitRef(t *testing.T, ref string) (sheet, cell string) {
	t.Helper()
	i := strings.LastIndex(ref, "!")
	if i < 0 {
		t.Fatalf("bad reference %q", ref)
	}
	sheet = strings.Trim(ref[:i], "'")
	sheet = strings.ReplaceAll(sheet, "''", "'")
	return sheet, strings.ReplaceAll(ref[i+1:], "$", "")
}

func definedNames(t *testing.T, file string) map[string]string {
	t.Helper()
	f, err := excelize.OpenFile(file)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	m := map[string]string{}
	for _, d := range f.GetDefinedName() {
		m[d.Name] = d.RefersTo
	}
	return m
}

func relClose(got, want, tol float64) bool {
	if want == 0 {
		return math.Abs(got) <= tol
	}
	return math.Abs(got-want) <= tol*math.Abs(want)
}

// checkRecalc writes r's workbook with deliberately wrong cached results,
// recalculates it in LibreOffice, and checks every result defined name
// against the engine's value in r within 0.5 %; then doubles autonomy_days in
// the input cell, recalculates again and checks that battery_required_ah
// doubles. The lead can call it over any *report.Report.
func checkRecalc(t *testing.T, r *report.Report) (recalculated string, refs map[string]string) {
	t.Helper()
	bin := soffice(t)
	profile := recalcProfile(t)
	dir := t.TempDir()
	want := resultNames(r)

	// 1. Wrong cached values: the recalculated file must correct them.
	wrong := filepath.Join(dir, "wrong.xlsx")
	if err := WriteFile(wrong, r, Options{wrongCache: true}); err != nil {
		t.Fatal(err)
	}
	refs = definedNames(t, wrong)
	for name := range want {
		if refs[name] == "" {
			t.Fatalf("defined name %s missing", name)
		}
	}
	before := nameValues(t, wrong, refs, want)
	for name, w := range want {
		if relClose(before[name], w, 0.005) && w != 0 {
			t.Fatalf("%s: the cached value should be deliberately wrong before recalculation, got %g", name, before[name])
		}
	}
	recalculated = recalc(t, bin, profile, wrong)
	got := nameValues(t, recalculated, refs, want)
	for name, w := range want {
		if !relClose(got[name], w, 0.005) {
			t.Errorf("%s after recalculation = %g, engine %g (tolerance 0.5 %%)", name, got[name], w)
		}
	}

	// 2. Double autonomy_days in the input cell: battery_required_ah doubles
	// (the rate factor is a value cell, so exactly).
	edited := filepath.Join(dir, "edited.xlsx")
	if err := WriteFile(edited, r, Options{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(edited)
	if err != nil {
		t.Fatal(err)
	}
	sheet, cell := splitRef(t, refs["autonomy_days"])
	if err := f.SetCellFloat(sheet, cell, 2*r.Battery.AutonomyDays, -1, 64); err != nil {
		t.Fatal(err)
	}
	if err := f.Save(); err != nil {
		t.Fatal(err)
	}
	_ = f.Close()
	one := map[string]float64{"battery_required_ah": 0}
	doubled := nameValues(t, recalc(t, bin, profile, edited), refs, one)["battery_required_ah"]
	if !relClose(doubled, 2*got["battery_required_ah"], 1e-9) {
		t.Errorf("battery_required_ah with doubled autonomy = %g, want 2 × %g", doubled, got["battery_required_ah"])
	}
	return recalculated, refs
}

// TestRecalcLibreOffice recalculates the demo workbook in LibreOffice.
// The expected values are the fixture's own (computed from its inputs with
// the workbook's published definitions), not outside values.
func TestRecalcLibreOffice(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit func(*report.Report)
	}{
		{"mppt-with-inverter", func(*report.Report) {}},
		{"pwm-no-inverter-no-lists", func(r *report.Report) {
			var rows []report.LoadRow
			for _, l := range r.Demand.Rows {
				if l.Circuit == "dc" {
					rows = append(rows, l)
				}
			}
			r.Demand.Rows = rows
			r.Demand.PeakACW = 0
			r.Inverter = nil
			r.Controller.Kind = "pwm"
			r.Controller.RatingsA = nil
			r.Paper = "letter"
			fillSizing(r)
		}},
		{"controller-needs-several-units", func(r *report.Report) {
			r.Controller.RatingsA = []float64{10, 15}
			fillSizing(r)
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := fixtureReport()
			tc.edit(r)
			out, refs := checkRecalc(t, r)
			// The fixture is self-consistent beyond the contract names too.
			extra := map[string]float64{
				"array_strings": float64(r.Array.Strings), "array_modules": float64(r.Array.Modules),
				"battery_strings": float64(r.Battery.Strings), "battery_blocks": float64(r.Battery.Blocks),
				"battery_capacity_wh": r.Battery.CapacityWh, "battery_required_wh": r.Battery.RequiredWh,
				"controller_required_a": r.Controller.RequiredA, "controller_units": float64(r.Controller.Units),
				"array_derate_factor": r.Array.DerateFactor, "materials_total": r.Materials.Total,
				"capital_pw": r.Lifecycle.CapitalPW, "om_pw": r.Lifecycle.OMPW, "replacements_pw": r.Lifecycle.ReplacementsPW,
				"net_present_cost": r.Lifecycle.NetPresentCost, "levelised_cost_per_kwh": r.Lifecycle.LevelisedCostPerKWh,
			}
			if r.Inverter != nil {
				extra["inverter_required_w"] = r.Inverter.RequiredContinuousW
			}
			got := nameValues(t, out, refs, extra)
			for name, w := range extra {
				if !relClose(got[name], w, 1e-6) {
					t.Errorf("%s after recalculation = %g, fixture %g", name, got[name], w)
				}
			}
		})
	}
}
