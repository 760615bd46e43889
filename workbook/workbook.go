// Package workbook writes a solstand design (one report.Report) as a
// formatted, editable .xlsx workbook. The sizing chain is written as live
// formulas over styled input cells and workbook-scope defined names, each
// formula with its cached value, so that the workbook recalculates in a
// spreadsheet program to the engine's values while previewers that never
// recalculate still show numbers. Every sheet is written with the excelize
// stream writer, so numeric cached values keep their number type and long
// sheets (the daily balance, the hourly year) use little memory.
//
// The output is deterministic: the same Report gives the same bytes.
package workbook

import (
	"archive/zip"
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"

	"solstand/report"
)

// Options controls what the workbook holds.
type Options struct {
	// Hourly adds the hourly sheet (one row per hour of the first simulated
	// year); Report.Hourly also turns it on.
	Hourly bool
	// ToolVersion is written into the document properties ("solstand " + version).
	// Empty falls back to Report.ToolVersion.
	ToolVersion string
	// DailyYears limits the daily balance to the first DailyYears × 365 rows of
	// Simulation.FirstYear (0 = all rows the Report holds, which is normally one year).
	DailyYears int

	// wrongCache writes deliberately wrong cached values into the result formulas;
	// tests use it to prove that a spreadsheet program really recalculates.
	wrongCache bool
}

// Sheet names, in workbook order.
const (
	SheetSummary   = "Summary"
	SheetInputs    = "Inputs"
	SheetLoads     = "Loads"
	SheetResource  = "Resource"
	SheetArray     = "Array"
	SheetBattery   = "Battery"
	SheetEquipment = "Equipment"
	SheetDaily     = "Daily balance"
	SheetReliab    = "Reliability"
	SheetWiring    = "Wiring"
	SheetCost      = "Materials and cost"
	SheetCautions  = "Cautions"
	SheetMethod    = "Method"
	SheetSunPath   = "Sun path"
	SheetHourly    = "Hourly"
)

// SheetNames returns the sheet names the workbook has for the given options, in order.
func SheetNames(opt Options) []string {
	names := []string{SheetSummary, SheetInputs, SheetLoads, SheetResource, SheetArray,
		SheetBattery, SheetEquipment, SheetDaily, SheetReliab, SheetWiring, SheetCost,
		SheetCautions, SheetMethod, SheetSunPath}
	if opt.Hourly {
		names = append(names, SheetHourly)
	}
	return names
}

// Write writes the whole workbook of r to w. The same Report and Options give
// byte-identical output.
func Write(w io.Writer, r *report.Report, opt Options) error {
	if r == nil {
		return errors.New("workbook: nil report")
	}
	if w == nil {
		return errors.New("workbook: nil writer")
	}
	b, err := newBuilder(r, opt)
	if err != nil {
		return err
	}
	defer func() { _ = b.f.Close() }()
	if err := b.build(); err != nil {
		return err
	}
	if _, err := b.f.WriteTo(w); err != nil {
		return fmt.Errorf("workbook: writing: %w", err)
	}
	return nil
}

// WriteFile writes the workbook of r to path: into a temporary file in the
// target folder first, renamed over path only when complete, so that nothing
// is left behind (and an existing file is untouched) on failure.
func WriteFile(path string, r *report.Report, opt Options) (err error) {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, ".solstand-*.xlsx.tmp")
	if err != nil {
		return fmt.Errorf("workbook: %w", err)
	}
	tmpName := tmp.Name()
	defer func() {
		if err != nil {
			_ = tmp.Close()
			_ = os.Remove(tmpName)
		}
	}()
	if err = Write(tmp, r, opt); err != nil {
		return err
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("workbook: %s: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("workbook: %s: %w", path, err)
	}
	if err = os.Chmod(tmpName, 0o644); err != nil {
		return fmt.Errorf("workbook: %s: %w", path, err)
	}
	if err = os.Rename(tmpName, path); err != nil {
		return fmt.Errorf("workbook: %s: %w", path, err)
	}
	return nil
}

// builder carries the state of one workbook being written.
type builder struct {
	r   *report.Report
	opt Options
	f   *excelize.File
	st  styles
	// names maps each defined name to its absolute reference.
	names map[string]string
	// loc remembers where shared tables sit, for cross-sheet formulas.
	loc locations
}

// locations are the places of tables other sheets refer to.
type locations struct {
	loadsFirst, loadsLast int // rows of the load table on Loads (0 when empty)
	monthFirst            int // first month row of the monthly demand table on Loads
	resMonthFirst         int // first month row of the monthly resource table
	ratioFirst            int // first month row of the design-month table on Array
	lossCells             []string
}

func newBuilder(r *report.Report, opt Options) (*builder, error) {
	if opt.ToolVersion == "" {
		opt.ToolVersion = r.ToolVersion
	}
	if r.Hourly {
		opt.Hourly = true
	}
	f := excelize.NewFile()
	f.SetZipWriter(func(w io.Writer) excelize.ZipWriter { return &sortedZip{w: w} })
	b := &builder{r: r, opt: opt, f: f, names: map[string]string{}}
	if err := f.SetSheetName("Sheet1", SheetSummary); err != nil {
		return nil, fmt.Errorf("workbook: %w", err)
	}
	for _, name := range SheetNames(opt)[1:] {
		if _, err := f.NewSheet(name); err != nil {
			return nil, fmt.Errorf("workbook: sheet %q: %w", name, err)
		}
	}
	// Before any sheet is streamed: SetActiveSheet reads every worksheet back.
	f.SetActiveSheet(0)
	st, err := newStyles(f)
	if err != nil {
		return nil, fmt.Errorf("workbook: styles: %w", err)
	}
	b.st = st
	return b, nil
}

func (b *builder) build() error {
	if err := b.docProps(); err != nil {
		return err
	}
	// The order matters: later sheets refer to the places earlier ones record.
	steps := []struct {
		name string
		fn   func() error
	}{
		{SheetInputs, b.inputsSheet},
		{SheetLoads, b.loadsSheet},
		{SheetResource, b.resourceSheet},
		{SheetArray, b.arraySheet},
		{SheetBattery, b.batterySheet},
		{SheetEquipment, b.equipmentSheet},
		{SheetCost, b.costSheet},
		{SheetSummary, b.summarySheet},
		{SheetDaily, b.dailySheet},
		{SheetReliab, b.reliabilitySheet},
		{SheetWiring, b.wiringSheet},
		{SheetCautions, b.cautionsSheet},
		{SheetMethod, b.methodSheet},
		{SheetSunPath, b.sunPathSheet},
	}
	if b.opt.Hourly {
		steps = append(steps, struct {
			name string
			fn   func() error
		}{SheetHourly, b.hourlySheet})
	}
	for _, s := range steps {
		if err := s.fn(); err != nil {
			return fmt.Errorf("workbook: sheet %q: %w", s.name, err)
		}
	}
	// Defined names, sorted for a stable workbook.xml.
	keys := make([]string, 0, len(b.names))
	for k := range b.names {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if err := b.f.SetDefinedName(&excelize.DefinedName{Name: k, RefersTo: b.names[k]}); err != nil {
			return fmt.Errorf("workbook: defined name %s: %w", k, err)
		}
	}
	full := true
	mode := "auto"
	if err := b.f.SetCalcProps(&excelize.CalcPropsOptions{FullCalcOnLoad: &full, CalcMode: &mode}); err != nil {
		return fmt.Errorf("workbook: calc props: %w", err)
	}
	return nil
}

// docDate returns the fixed document timestamp from Report.Date.
func (b *builder) docDate() (string, error) {
	d := strings.TrimSpace(b.r.Date)
	if d == "" {
		return "2000-01-01T00:00:00Z", nil
	}
	t, err := time.Parse("2006-01-02", d)
	if err != nil {
		return "", fmt.Errorf("workbook: report date %q: want YYYY-MM-DD: %w", d, err)
	}
	return t.Format("2006-01-02") + "T00:00:00Z", nil
}

func (b *builder) docProps() error {
	stamp, err := b.docDate()
	if err != nil {
		return err
	}
	title := b.r.Project
	if title == "" {
		title = "Stand-alone PV design"
	}
	creator := strings.TrimSpace("solstand " + b.opt.ToolVersion)
	err = b.f.SetDocProps(&excelize.DocProperties{
		Title:          title,
		Subject:        "Stand-alone photovoltaic system sizing",
		Creator:        creator,
		LastModifiedBy: creator,
		Description:    "Sizing, simulation and parts list of a stand-alone PV system. " + codesNote(b.r),
		Keywords:       "stand-alone PV, off-grid, sizing",
		Created:        stamp,
		Modified:       stamp,
		Language:       "en",
	})
	if err != nil {
		return fmt.Errorf("workbook: document properties: %w", err)
	}
	return nil
}

// sortedZip is an excelize.ZipWriter that writes the archive entries in name
// order with zero timestamps, so that the bytes do not depend on map order.
type sortedZip struct {
	w       io.Writer
	entries map[string]*bytes.Buffer
}

// Create starts a new entry.
func (z *sortedZip) Create(name string) (io.Writer, error) {
	if z.entries == nil {
		z.entries = map[string]*bytes.Buffer{}
	}
	buf := new(bytes.Buffer)
	z.entries[name] = buf
	return buf, nil
}

// AddFS is not used by the workbook.
func (z *sortedZip) AddFS(fs.FS) error { return errors.New("workbook: AddFS not supported") }

// Close writes all entries, sorted by name ([Content_Types].xml first).
func (z *sortedZip) Close() error {
	names := make([]string, 0, len(z.entries))
	for n := range z.entries {
		names = append(names, n)
	}
	sort.Strings(names)
	zw := zip.NewWriter(z.w)
	for _, n := range names {
		fw, err := zw.CreateHeader(&zip.FileHeader{Name: n, Method: zip.Deflate})
		if err != nil {
			return err
		}
		data := z.entries[n].Bytes()
		if n == "[Content_Types].xml" {
			data = sortOverrides(data)
		}
		if _, err := fw.Write(data); err != nil {
			return err
		}
		delete(z.entries, n)
	}
	return zw.Close()
}

var ctElemRE = regexp.MustCompile(`<(?:Default|Override) [^>]*?(?:/>|></(?:Default|Override)>)`)

// sortOverrides puts the Default and Override elements of [Content_Types].xml
// in a fixed order (excelize emits them in map order).
func sortOverrides(data []byte) []byte {
	s := string(data)
	i := strings.Index(s, "<Default ")
	if o := strings.Index(s, "<Override "); i < 0 || (o >= 0 && o < i) {
		i = o
	}
	j := strings.LastIndex(s, "</Types>")
	if i < 0 || j < i {
		return data
	}
	parts := ctElemRE.FindAllString(s[i:j], -1)
	if strings.Join(parts, "") != s[i:j] {
		return data
	}
	sort.SliceStable(parts, func(a, b int) bool {
		da, db := strings.HasPrefix(parts[a], "<Default"), strings.HasPrefix(parts[b], "<Default")
		if da != db {
			return da
		}
		return parts[a] < parts[b]
	})
	return []byte(s[:i] + strings.Join(parts, "") + s[j:])
}
