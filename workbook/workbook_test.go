package workbook

import (
	"archive/zip"
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"

	"solstand/caution"
	"solstand/report"
)

var update = flag.Bool("update", false, "rewrite the golden files under testdata/")

func writeBytes(t testing.TB, r *report.Report, opt Options) []byte {
	t.Helper()
	var buf bytes.Buffer
	if err := Write(&buf, r, opt); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

func openBytes(t testing.TB, b []byte) *excelize.File {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// zipEntries returns the archive's entries by name.
func zipEntries(t testing.TB, b []byte) map[string]string {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		t.Fatal(err)
	}
	m := map[string]string{}
	for _, zf := range zr.File {
		rc, err := zf.Open()
		if err != nil {
			t.Fatal(err)
		}
		data, err := io.ReadAll(rc)
		_ = rc.Close()
		if err != nil {
			t.Fatal(err)
		}
		m[zf.Name] = string(data)
	}
	return m
}

// inputNames are the defined names the workbook writes as input cells for the fixture.
var inputNames = []string{"autonomy_days", "max_dod", "system_v", "block_v", "block_ah", "module_pmax_w", "module_isc_a",
	"modules_series", "derate_loss_1", "derate_loss_2", "derate_loss_3", "controller_charge_v", "controller_margin",
	"inverter_margin", "discount_rate", "analysis_years"}

// golden is what testdata/golden.json pins down.
type golden struct {
	Sheets       []string            `json:"sheets"`
	DefinedNames map[string]string   `json:"defined_names"`
	InputStyles  map[string]cellLook `json:"input_styles"`
	Print        map[string]printSet `json:"print"`
	CalcPr       string              `json:"calc_pr"`
}

type cellLook struct {
	Locked bool   `json:"locked"`
	Fill   string `json:"fill"`
	Bold   bool   `json:"bold"`
	NumFmt string `json:"num_fmt"`
}

type printSet struct {
	Paper       int    `json:"paper"`
	Orientation string `json:"orientation"`
	FitToWidth  int    `json:"fit_to_width"`
	FitToHeight int    `json:"fit_to_height"`
	FitToPage   bool   `json:"fit_to_page"`
	Header      string `json:"header"`
	Footer      string `json:"footer"`
	Protected   bool   `json:"protected"`
}

func lookOf(t *testing.T, f *excelize.File, sheet, cell string) cellLook {
	t.Helper()
	id, err := f.GetCellStyle(sheet, cell)
	if err != nil {
		t.Fatal(err)
	}
	st, err := f.GetStyle(id)
	if err != nil {
		t.Fatal(err)
	}
	l := cellLook{Locked: true}
	if st.Protection != nil {
		l.Locked = st.Protection.Locked
	}
	if len(st.Fill.Color) > 0 {
		l.Fill = st.Fill.Color[0]
	}
	if st.Font != nil {
		l.Bold = st.Font.Bold
	}
	if st.CustomNumFmt != nil {
		l.NumFmt = *st.CustomNumFmt
	}
	return l
}

func collectGolden(t *testing.T, b []byte) golden {
	f := openBytes(t, b)
	defer f.Close()
	g := golden{Sheets: f.GetSheetList(), DefinedNames: map[string]string{}, InputStyles: map[string]cellLook{}, Print: map[string]printSet{}}
	for _, d := range f.GetDefinedName() {
		g.DefinedNames[d.Name] = d.RefersTo
	}
	for _, n := range inputNames {
		sheet, cell := splitRef(t, g.DefinedNames[n])
		g.InputStyles[n] = lookOf(t, f, sheet, cell)
	}
	g.InputStyles["Loads!F4 (hours of a load)"] = lookOf(t, f, SheetLoads, "F4")
	g.InputStyles["Materials and cost!E4 (unit price)"] = lookOf(t, f, SheetCost, "E4")
	entries := zipEntries(t, b)
	sheetXML := sheetFiles(t, entries)
	for _, s := range g.Sheets {
		pl, err := f.GetPageLayout(s)
		if err != nil {
			t.Fatal(err)
		}
		hf, err := f.GetHeaderFooter(s)
		if err != nil {
			t.Fatal(err)
		}
		sp, err := f.GetSheetProps(s)
		if err != nil {
			t.Fatal(err)
		}
		ps := printSet{Header: hf.OddHeader, Footer: hf.OddFooter}
		if pl.Size != nil {
			ps.Paper = *pl.Size
		}
		if pl.Orientation != nil {
			ps.Orientation = *pl.Orientation
		}
		if pl.FitToWidth != nil {
			ps.FitToWidth = *pl.FitToWidth
		}
		if pl.FitToHeight != nil {
			ps.FitToHeight = *pl.FitToHeight
		}
		if sp.FitToPage != nil {
			ps.FitToPage = *sp.FitToPage
		}
		x := sheetXML[s]
		ps.Protected = strings.Contains(x, "<sheetProtection") && !strings.Contains(x, "password=") && !strings.Contains(x, "hashValue=")
		g.Print[s] = ps
	}
	g.CalcPr = regexp.MustCompile(`<calcPr[^>]*>`).FindString(entries["xl/workbook.xml"])
	return g
}

// sheetFiles maps sheet names to their worksheet XML.
func sheetFiles(t *testing.T, entries map[string]string) map[string]string {
	t.Helper()
	wb := entries["xl/workbook.xml"]
	rels := entries["xl/_rels/workbook.xml.rels"]
	out := map[string]string{}
	for _, m := range regexp.MustCompile(`<sheet name="([^"]*)" sheetId="\d+" r:id="(rId\d+)"`).FindAllStringSubmatch(wb, -1) {
		target := regexp.MustCompile(`Id="` + m[2] + `" Target="([^"]*)"`).FindStringSubmatch(rels)
		if target == nil {
			target = regexp.MustCompile(`Target="([^"]*)"[^>]*Id="` + m[2] + `"`).FindStringSubmatch(rels)
		}
		if target == nil {
			t.Fatalf("no target for sheet %s", m[1])
		}
		p := strings.TrimPrefix(target[1], "/xl/")
		out[unescapeXML(m[1])] = entries["xl/"+strings.TrimPrefix(p, "xl/")]
	}
	return out
}

func unescapeXML(s string) string {
	return strings.NewReplacer("&amp;", "&", "&lt;", "<", "&gt;", ">", "&quot;", `"`, "&apos;", "'").Replace(s)
}

// TestGolden pins sheet names, defined names, input-cell styles, print
// settings and calculation properties (testdata/golden.json; -update rewrites it).
func TestGolden(t *testing.T) {
	b := writeBytes(t, fixtureReport(), Options{Hourly: true, ToolVersion: "0.0.0-test"})
	got := collectGolden(t, b)
	path := filepath.Join("testdata", "golden.json")
	js, err := json.MarshalIndent(got, "", "  ")
	if err != nil {
		t.Fatal(err)
	}
	js = append(js, '\n')
	if *update {
		if err := os.MkdirAll("testdata", 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, js, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -run TestGolden -update)", err)
	}
	if !bytes.Equal(want, js) {
		t.Errorf("workbook differs from %s (go test -run TestGolden -update to accept):\n%s", path, js)
	}
	// Independent of the golden file: the invariants it encodes.
	if strings.Join(got.Sheets, "|") != strings.Join(SheetNames(Options{Hourly: true}), "|") {
		t.Errorf("sheets = %v", got.Sheets)
	}
	for _, n := range []string{"autonomy_days", "max_dod", "module_pmax_w", "design_month", "daily_demand_wh", "array_required_w",
		"array_rated_w", "battery_required_ah", "battery_capacity_ah", "controller_rated_a", "inverter_continuous_w"} {
		ref := got.DefinedNames[n]
		if !regexp.MustCompile(`^'[^']+'!\$[A-Z]+\$\d+$`).MatchString(ref) {
			t.Errorf("defined name %s = %q, want one cell", n, ref)
		}
	}
	for n, l := range got.InputStyles {
		if l.Locked || l.Fill != colInputBg {
			t.Errorf("input %s: locked %v fill %q, want unlocked with the input fill", n, l.Locked, l.Fill)
		}
	}
	for s, p := range got.Print {
		if p.Paper != 9 || p.FitToWidth != 1 || !p.FitToPage || !p.Protected ||
			!strings.Contains(p.Header, "Demo health post") || !strings.Contains(p.Footer, "&P of &N") {
			t.Errorf("print settings of %s: %+v", s, p)
		}
	}
	if !regexp.MustCompile(`fullCalcOnLoad="(1|true)"`).MatchString(got.CalcPr) {
		t.Errorf("calcPr = %s, want fullCalcOnLoad", got.CalcPr)
	}
}

// TestPaper checks the pageSetup paperSize codes of ECMA-376 Part 1 (1 Letter, 9 A4).
func TestPaper(t *testing.T) {
	for _, tc := range []struct {
		paper string
		want  int
	}{{"a4", 9}, {"letter", 1}, {"LETTER", 1}, {"", 9}} {
		r := fixtureReport()
		r.Paper = tc.paper
		f := openBytes(t, writeBytes(t, r, Options{}))
		for _, s := range f.GetSheetList() {
			pl, err := f.GetPageLayout(s)
			if err != nil || pl.Size == nil || *pl.Size != tc.want {
				t.Errorf("paper %q sheet %s: size %v (err %v), want %d", tc.paper, s, pl.Size, err, tc.want)
			}
		}
		_ = f.Close()
	}
}

// TestFormulaInjection: project texts that look like formulas are written as strings.
func TestFormulaInjection(t *testing.T) {
	payloads := []string{
		"=1+1",
		"+1+1",
		"-1+1",
		"@SUM(1,1)",
		`=HYPERLINK("http://example.invalid","click")`,
		"=cmd|' /C calc'!A0",
		"\t=1+2",
		"=autonomy_days*0",
	}
	for _, p := range payloads {
		t.Run(fmt.Sprintf("%q", p), func(t *testing.T) {
			r := fixtureReport()
			r.Project = p + " & co"
			r.Site.Name = p
			r.Demand.Rows[0].Name = p
			r.Materials.Items[0].Name = p
			r.Cautions[0].Message = p
			r.Methods[0].Source = p
			r.Wiring.Circuits[0].Name = p
			b := writeBytes(t, r, Options{})
			f := openBytes(t, b)
			defer f.Close()
			for _, at := range []struct{ sheet, cell string }{
				{SheetLoads, "A4"}, {SheetCost, "B4"}, {SheetMethod, "C4"}, {SheetWiring, "A5"}, {SheetSummary, "B3"},
			} {
				fm, err := f.GetCellFormula(at.sheet, at.cell)
				if err != nil {
					t.Fatal(err)
				}
				v, _ := f.GetCellValue(at.sheet, at.cell)
				if fm != "" {
					t.Errorf("%s!%s: written as formula %q", at.sheet, at.cell, fm)
				}
				if strings.TrimSpace(v) != strings.TrimSpace(p) && !strings.HasPrefix(v, p) {
					t.Errorf("%s!%s = %q, want the text %q", at.sheet, at.cell, v, p)
				}
			}
			// No formula element anywhere carries the payload.
			esc := new(bytes.Buffer)
			_ = xmlEscape(esc, strings.TrimLeft(p, "=+-@\t"))
			for name, x := range zipEntries(t, b) {
				for _, m := range regexp.MustCompile(`<f>([^<]*)</f>`).FindAllStringSubmatch(x, -1) {
					if strings.Contains(m[1], esc.String()) {
						t.Errorf("%s: formula %q carries the payload", name, m[1])
					}
				}
			}
			hf, err := f.GetHeaderFooter(SheetSummary)
			if err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(hf.OddHeader, " && co") {
				t.Errorf("header %q: '&' of the project name not escaped", hf.OddHeader)
			}
		})
	}
}

func xmlEscape(w io.Writer, s string) error {
	_, err := io.WriteString(w, strings.NewReplacer("&", "&amp;", "<", "&lt;", ">", "&gt;", `"`, "&#34;", "'", "&#39;").Replace(s))
	return err
}

// TestDeterministic: the same Report gives the same bytes.
func TestDeterministic(t *testing.T) {
	for _, opt := range []Options{{}, {Hourly: true, ToolVersion: "1.2.3"}} {
		a := writeBytes(t, fixtureReport(), opt)
		b := writeBytes(t, fixtureReport(), opt)
		if !bytes.Equal(a, b) {
			t.Errorf("options %+v: two writes differ (%d vs %d bytes)", opt, len(a), len(b))
		}
		core := zipEntries(t, a)["docProps/core.xml"]
		if !strings.Contains(core, "2026-03-14T00:00:00Z") {
			t.Errorf("core properties without the report date: %s", core)
		}
	}
}

// TestDocProps checks title, subject and creator.
func TestDocProps(t *testing.T) {
	f := openBytes(t, writeBytes(t, fixtureReport(), Options{ToolVersion: "9.8.7"}))
	defer f.Close()
	p, err := f.GetDocProps()
	if err != nil {
		t.Fatal(err)
	}
	if p.Title != "Demo health post" || p.Creator != "solstand 9.8.7" || p.Subject == "" || p.Created != "2026-03-14T00:00:00Z" {
		t.Errorf("doc props = %+v", p)
	}
}

// TestCachedValues: previewers that never recalculate see the engine's numbers.
func TestCachedValues(t *testing.T) {
	r := fixtureReport()
	b := writeBytes(t, r, Options{})
	names := definedNamesBytes(t, b)
	f := openBytes(t, b)
	defer f.Close()
	for name, want := range resultNames(r) {
		sheet, cell := splitRef(t, names[name])
		fm, _ := f.GetCellFormula(sheet, cell)
		if fm == "" {
			t.Errorf("%s: no formula", name)
		}
		var got float64
		v, _ := f.GetCellValue(sheet, cell, excelize.Options{RawCellValue: true})
		if _, err := fmt.Sscan(v, &got); err != nil || !relClose(got, want, 1e-12) {
			t.Errorf("%s: cached %q, want %g", name, v, want)
		}
	}
	// Numeric cached values keep their number type (no t="str").
	x := sheetFiles(t, zipEntries(t, b))[SheetArray]
	if regexp.MustCompile(`<c r="B\d+"[^>]*t="str"[^>]*><f>array_strings`).MatchString(x) {
		t.Error("numeric formula written with a string cached value")
	}
}

func definedNamesBytes(t *testing.T, b []byte) map[string]string {
	f := openBytes(t, b)
	defer f.Close()
	m := map[string]string{}
	for _, d := range f.GetDefinedName() {
		m[d.Name] = d.RefersTo
	}
	return m
}

// TestSheetsContent spot-checks tables and the conditional formats.
func TestSheetsContent(t *testing.T) {
	r := fixtureReport()
	b := writeBytes(t, r, Options{Hourly: true})
	f := openBytes(t, b)
	defer f.Close()
	rows, err := f.GetRows(SheetDaily)
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 3+365 {
		t.Errorf("daily balance rows = %d, want 368", len(rows))
	}
	hr, err := f.GetRows(SheetHourly)
	if err != nil {
		t.Fatal(err)
	}
	if len(hr) != 3+8760 {
		t.Errorf("hourly rows = %d, want 8763", len(hr))
	}
	cf, err := f.GetConditionalFormats(SheetDaily)
	if err != nil {
		t.Fatal(err)
	}
	if len(cf) != 2 {
		t.Errorf("daily conditional formats = %v, want SOC and unmet", cf)
	}
	v, _ := f.GetCellValue(SheetCautions, "A3")
	if v != caution.CodesNote {
		t.Errorf("cautions note = %q", v)
	}
	v, _ = f.GetCellValue(SheetCautions, "B6")
	if v != "battery-short-circuit" {
		t.Errorf("first caution = %q, want the danger one", v)
	}
	// Every chart reference (series names included) is a cell reference:
	// Excel repairs a chart whose <c:f> holds plain text.
	nCharts := 0
	for name, x := range zipEntries(t, b) {
		if !strings.HasPrefix(name, "xl/charts/chart") {
			continue
		}
		nCharts++
		for _, m := range regexp.MustCompile(`<c:f>([^<]*)</c:f>`).FindAllStringSubmatch(x, -1) {
			if !regexp.MustCompile(`^'[^']+'!\$[A-Z]+\$\d+(:\$[A-Z]+\$\d+)?$`).MatchString(unescapeXML(m[1])) {
				t.Errorf("%s: chart reference %q is not a cell range", name, m[1])
			}
		}
	}
	if nCharts != 5 {
		t.Errorf("charts = %d, want 5", nCharts)
	}
	for _, s := range []string{SheetSummary, SheetResource, SheetDaily, SheetReliab, SheetSunPath} {
		if !strings.Contains(sheetFiles(t, zipEntries(t, b))[s], "<drawing") {
			t.Errorf("sheet %s has no chart", s)
		}
	}
}

// TestWriteFileAtomic: a failed write leaves nothing behind and keeps an existing file.
func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.xlsx")
	if err := os.WriteFile(path, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	bad := fixtureReport()
	bad.Date = "14.03.2026"
	for _, r := range []*report.Report{nil, bad} {
		if err := WriteFile(path, r, Options{}); err == nil {
			t.Fatal("want an error")
		}
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("files left behind: %v", ents)
	}
	if b, _ := os.ReadFile(path); string(b) != "old" {
		t.Errorf("existing file changed: %q", b)
	}
	if err := WriteFile(filepath.Join(dir, "missing", "x.xlsx"), fixtureReport(), Options{}); err == nil {
		t.Error("want an error for a missing folder")
	}
	if err := WriteFile(path, fixtureReport(), Options{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	_ = f.Close()
}

// TestThirtyYearsMemory: a 30-year daily balance is written in under 150 MB.
func TestThirtyYearsMemory(t *testing.T) {
	if testing.Short() {
		t.Skip("short")
	}
	r := fixtureReport()
	fillSimulation(r, 30*365)
	runtime.GC()
	var base runtime.MemStats
	runtime.ReadMemStats(&base)
	var peak uint64
	var mu sync.Mutex
	done := make(chan struct{})
	go func() {
		tk := time.NewTicker(2 * time.Millisecond)
		defer tk.Stop()
		for {
			select {
			case <-done:
				return
			case <-tk.C:
				var m runtime.MemStats
				runtime.ReadMemStats(&m)
				mu.Lock()
				if m.HeapInuse > peak {
					peak = m.HeapInuse
				}
				mu.Unlock()
			}
		}
	}()
	var n countWriter
	err := Write(&n, r, Options{DailyYears: 30, Hourly: true})
	close(done)
	if err != nil {
		t.Fatal(err)
	}
	mu.Lock()
	used := int64(peak) - int64(base.HeapInuse)
	mu.Unlock()
	t.Logf("30-year workbook: %d bytes, peak heap above baseline %.1f MB", n, float64(used)/1e6)
	if used > 150e6 {
		t.Errorf("peak heap %.1f MB, want under 150 MB", float64(used)/1e6)
	}
}

type countWriter int64

func (c *countWriter) Write(p []byte) (int, error) { *c += countWriter(len(p)); return len(p), nil }

// TestNoEmptyReport: a nearly empty Report still gives a valid workbook.
func TestNoEmptyReport(t *testing.T) {
	r := &report.Report{Date: "2026-01-01", DesignMonth: 1}
	b := writeBytes(t, r, Options{Hourly: true})
	f := openBytes(t, b)
	defer f.Close()
	if got := f.GetSheetList(); len(got) != 15 {
		t.Errorf("sheets = %v", got)
	}
}

// FuzzTextCells: whatever a load or project name holds, Write succeeds and the
// name is a string cell, never a formula.
func FuzzTextCells(f *testing.F) {
	for _, s := range []string{"=1+1", "+A1", "-2", "@x", "&&&", "'quoted'", "", "ünïcödé", "<tag>&amp;", strings.Repeat("=", 300)} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r := fixtureReport()
		r.Project = s
		r.Site.Name = s
		r.Demand.Rows[0].Name = s
		r.Simulation.FirstYear = r.Simulation.FirstYear[:10]
		var buf bytes.Buffer
		if err := Write(&buf, r, Options{}); err != nil {
			t.Fatalf("Write(%q): %v", s, err)
		}
		x, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
		if err != nil {
			t.Fatal(err)
		}
		defer x.Close()
		if fm, _ := x.GetCellFormula(SheetLoads, "A4"); fm != "" {
			t.Errorf("name %q written as formula %q", s, fm)
		}
	})
}
