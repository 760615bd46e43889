package workbook

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/xuri/excelize/v2"

	"solstand/caution"
	"solstand/report"
)

// styles are the style ids of the workbook's palette.
type styles struct {
	title, subtitle, note, header, label, text, textWrap int
	input, inputInt, inputText                           int
	value, valueInt, valuePct                            int
	result, resultInt, resultPct                         int
	calc, calcInt, calcPct                               int
	danger, warning, info, codesNote                     int
	cfLow, cfUnmet                                       int
}

// The palette: slate ink, a sea-green accent, a warm sand for inputs.
const (
	colInk       = "23313F"
	colAccent    = "2F6F62"
	colAccentBg  = "E4F0EC"
	colInputBg   = "FFF3D6"
	colInputInk  = "1D3F8A"
	colValueBg   = "F1F2F4"
	colBorder    = "B9C3CC"
	colDangerBg  = "F6D5D1"
	colDangerInk = "8A1C12"
	colWarnBg    = "FBE7C4"
	colWarnInk   = "7A4A00"
	colInfoBg    = "DCE8F4"
	colInfoInk   = "1E3F66"
)

func newStyles(f *excelize.File) (styles, error) {
	var s styles
	var err error
	border := []excelize.Border{
		{Type: "left", Color: colBorder, Style: 1}, {Type: "right", Color: colBorder, Style: 1},
		{Type: "top", Color: colBorder, Style: 1}, {Type: "bottom", Color: colBorder, Style: 1},
	}
	fill := func(c string) excelize.Fill { return excelize.Fill{Type: "pattern", Color: []string{c}, Pattern: 1} }
	num2, num0, pct := "#,##0.00", "#,##0", "0.00%"
	mk := func(dst *int, st *excelize.Style) {
		if err != nil {
			return
		}
		*dst, err = f.NewStyle(st)
	}
	locked := &excelize.Protection{Locked: true}
	unlocked := &excelize.Protection{Locked: false}
	mk(&s.title, &excelize.Style{Font: &excelize.Font{Bold: true, Size: 15, Color: colAccent, Family: "Calibri"}})
	mk(&s.subtitle, &excelize.Style{Font: &excelize.Font{Bold: true, Size: 12, Color: colInk}})
	mk(&s.note, &excelize.Style{Font: &excelize.Font{Italic: true, Size: 9, Color: "5B6770"}})
	mk(&s.header, &excelize.Style{Font: &excelize.Font{Bold: true, Color: "FFFFFF"}, Fill: fill(colAccent),
		Alignment: &excelize.Alignment{WrapText: true, Vertical: "center"}, Border: border})
	mk(&s.label, &excelize.Style{Font: &excelize.Font{Color: colInk}, Border: border})
	mk(&s.text, &excelize.Style{Border: border})
	mk(&s.textWrap, &excelize.Style{Border: border, Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"}})
	inFont := &excelize.Font{Bold: true, Color: colInputInk}
	mk(&s.input, &excelize.Style{Font: inFont, Fill: fill(colInputBg), Border: border, CustomNumFmt: &num2, Protection: unlocked})
	mk(&s.inputInt, &excelize.Style{Font: inFont, Fill: fill(colInputBg), Border: border, CustomNumFmt: &num0, Protection: unlocked})
	mk(&s.inputText, &excelize.Style{Font: inFont, Fill: fill(colInputBg), Border: border, Protection: unlocked})
	mk(&s.value, &excelize.Style{Fill: fill(colValueBg), Border: border, CustomNumFmt: &num2, Protection: locked})
	mk(&s.valueInt, &excelize.Style{Fill: fill(colValueBg), Border: border, CustomNumFmt: &num0, Protection: locked})
	mk(&s.valuePct, &excelize.Style{Fill: fill(colValueBg), Border: border, CustomNumFmt: &pct, Protection: locked})
	resFont := &excelize.Font{Bold: true, Color: colAccent}
	mk(&s.result, &excelize.Style{Font: resFont, Fill: fill(colAccentBg), Border: border, CustomNumFmt: &num2, Protection: locked})
	mk(&s.resultInt, &excelize.Style{Font: resFont, Fill: fill(colAccentBg), Border: border, CustomNumFmt: &num0, Protection: locked})
	mk(&s.resultPct, &excelize.Style{Font: resFont, Fill: fill(colAccentBg), Border: border, CustomNumFmt: &pct, Protection: locked})
	mk(&s.calc, &excelize.Style{Border: border, CustomNumFmt: &num2, Protection: locked})
	mk(&s.calcInt, &excelize.Style{Border: border, CustomNumFmt: &num0, Protection: locked})
	mk(&s.calcPct, &excelize.Style{Border: border, CustomNumFmt: &pct, Protection: locked})
	sev := func(bg, ink string) *excelize.Style {
		return &excelize.Style{Font: &excelize.Font{Bold: true, Color: ink}, Fill: fill(bg), Border: border,
			Alignment: &excelize.Alignment{Vertical: "top"}}
	}
	mk(&s.danger, sev(colDangerBg, colDangerInk))
	mk(&s.warning, sev(colWarnBg, colWarnInk))
	mk(&s.info, sev(colInfoBg, colInfoInk))
	mk(&s.codesNote, &excelize.Style{Font: &excelize.Font{Bold: true, Size: 12, Color: colDangerInk}, Fill: fill(colWarnBg),
		Border: []excelize.Border{{Type: "left", Color: colDangerInk, Style: 2}, {Type: "right", Color: colDangerInk, Style: 2},
			{Type: "top", Color: colDangerInk, Style: 2}, {Type: "bottom", Color: colDangerInk, Style: 2}},
		Alignment: &excelize.Alignment{WrapText: true, Vertical: "center"}})
	if err != nil {
		return s, err
	}
	s.cfLow, err = f.NewConditionalStyle(&excelize.Style{Font: &excelize.Font{Color: colWarnInk, Bold: true}, Fill: fill(colWarnBg)})
	if err != nil {
		return s, err
	}
	s.cfUnmet, err = f.NewConditionalStyle(&excelize.Style{Font: &excelize.Font{Color: colDangerInk, Bold: true}, Fill: fill(colDangerBg)})
	return s, err
}

func (s styles) severity(sv caution.Severity) int {
	switch sv {
	case caution.Danger:
		return s.danger
	case caution.Warning:
		return s.warning
	default:
		return s.info
	}
}

// grid is a sheet being assembled in memory before it is streamed in row order.
type grid struct {
	name    string
	rows    map[int][]any
	widths  map[int]float64
	merges  [][2]string
	freeze  int             // rows frozen at the top (0 none)
	heights map[int]float64 // row heights in points, where wrapped text needs more than one line
}

func newGrid(name string) *grid {
	return &grid{name: name, rows: map[int][]any{}, widths: map[int]float64{}, heights: map[int]float64{}}
}

// fit makes row tall enough for text wrapped in a column (or merged
// columns) about widthChars characters wide: spreadsheet programs do not
// grow rows for wrapped text in merged cells, nor always on load.
func (g *grid) fit(row int, text string, widthChars float64) {
	lines := math.Ceil(float64(len([]rune(text))) * 1.1 / widthChars)
	if h := 15 * math.Max(1, lines); h > g.heights[row] {
		g.heights[row] = h
	}
}

// put stores v at column col (1-based) of row.
func (g *grid) put(col, row int, v any) {
	r := g.rows[row]
	for len(r) < col {
		r = append(r, nil)
	}
	r[col-1] = v
	g.rows[row] = r
}

// text writes s as a string, never as a formula, whatever it starts with.
func (g *grid) text(col, row int, s string, style int) {
	g.put(col, row, excelize.Cell{Value: s, StyleID: style})
}

// num writes a number (NaN and infinities are written as empty).
func (g *grid) num(col, row int, v float64, style int) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		g.put(col, row, excelize.Cell{StyleID: style})
		return
	}
	g.put(col, row, excelize.Cell{Value: v, StyleID: style})
}

// formula writes a live formula with its cached value.
func (g *grid) formula(col, row int, f string, cached float64, style int) {
	c := excelize.Cell{Formula: f, StyleID: style}
	if !math.IsNaN(cached) && !math.IsInf(cached, 0) {
		c.Value = cached
	}
	g.put(col, row, c)
}

// headers writes a header row starting at column 1.
func (g *grid) headers(row int, style int, hs ...string) {
	for i, h := range hs {
		g.text(i+1, row, h, style)
		w := g.widths[i+1]
		if w == 0 {
			w = 9 // the spreadsheet's default column width
		}
		g.fit(row, h, w)
	}
}

func (g *grid) width(col int, w float64) { g.widths[col] = w }

// flush streams the grid to its sheet. Everything else on the sheet (page
// setup, validations, conditional formats, charts, comments) must be set before.
func (g *grid) flush(f *excelize.File) error {
	sw, err := f.NewStreamWriter(g.name)
	if err != nil {
		return err
	}
	cols := make([]int, 0, len(g.widths))
	for c := range g.widths {
		cols = append(cols, c)
	}
	sort.Ints(cols)
	for _, c := range cols {
		if err := sw.SetColWidth(c, c, g.widths[c]); err != nil {
			return err
		}
	}
	if g.freeze > 0 {
		if err := sw.SetPanes(freezePanes(g.freeze)); err != nil {
			return err
		}
	}
	rows := make([]int, 0, len(g.rows))
	for r := range g.rows {
		rows = append(rows, r)
	}
	sort.Ints(rows)
	for _, r := range rows {
		cell, _ := excelize.CoordinatesToCellName(1, r)
		var opts []excelize.RowOpts
		if h := g.heights[r]; h > 0 {
			opts = append(opts, excelize.RowOpts{Height: h})
		}
		if err := sw.SetRow(cell, g.rows[r], opts...); err != nil {
			return err
		}
	}
	for _, m := range g.merges {
		if err := sw.MergeCell(m[0], m[1]); err != nil {
			return err
		}
	}
	return sw.Flush()
}

func freezePanes(rows int) *excelize.Panes {
	cell, _ := excelize.CoordinatesToCellName(1, rows+1)
	return &excelize.Panes{Freeze: true, YSplit: rows, TopLeftCell: cell, ActivePane: "bottomLeft",
		Selection: []excelize.Selection{{SQRef: cell, ActiveCell: cell, Pane: "bottomLeft"}}}
}

// cellName returns "B3" for (2, 3).
func cellName(col, row int) string {
	c, _ := excelize.CoordinatesToCellName(col, row)
	return c
}

// absName returns "$B$3".
func absName(col, row int) string {
	c, _ := excelize.CoordinatesToCellName(col, row, true)
	return c
}

// colName returns "B" for 2.
func colName(col int) string {
	c, _ := excelize.ColumnNumberToName(col)
	return c
}

// sheetRef quotes a sheet name for a reference.
func sheetRef(sheet string) string {
	return "'" + strings.ReplaceAll(sheet, "'", "''") + "'!"
}

// ref is an absolute cross-sheet reference to one cell.
func ref(sheet string, col, row int) string { return sheetRef(sheet) + absName(col, row) }

// rangeRef is an absolute cross-sheet reference to a range.
func rangeRef(sheet string, c1, r1, c2, r2 int) string {
	return sheetRef(sheet) + absName(c1, r1) + ":" + absName(c2, r2)
}

// define records a workbook-scope defined name on one cell.
func (b *builder) define(name, sheet string, col, row int) {
	b.names[name] = ref(sheet, col, row)
}

// cached returns v, or a deliberately wrong value when the test option asks for it.
func (b *builder) cached(v float64) float64 {
	if b.opt.wrongCache {
		return v*3 + 7
	}
	return v
}

// num formats a number for a formula literal.
func lit(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "0"
	}
	return fmt.Sprintf("%.15g", v)
}

// pageSetup applies the print settings every sheet shares: paper by the
// project's locale, fit to page width, header and footer, and protection
// without a password (input cells are unlocked by their style).
func (b *builder) pageSetup(sheet string, landscape bool) error {
	f := b.f
	size := paperSize(b.r.Paper)
	orient := "portrait"
	if landscape {
		orient = "landscape"
	}
	one, zero := 1, 0
	if err := f.SetPageLayout(sheet, &excelize.PageLayoutOptions{Size: &size, Orientation: &orient, FitToWidth: &one, FitToHeight: &zero}); err != nil {
		return err
	}
	fit := true
	if err := f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
		return err
	}
	if err := f.SetHeaderFooter(sheet, &excelize.HeaderFooterOptions{
		OddHeader: "&L" + hfText(b.r.Project, 90) + "&R" + hfText(b.r.Date, 20),
		OddFooter: "&L" + hfText(sheet, 40) + "&CPage &P of &N&R" + hfText("solstand "+b.opt.ToolVersion, 40),
	}); err != nil {
		return err
	}
	return f.ProtectSheet(sheet, &excelize.SheetProtectionOptions{
		SelectLockedCells: true, SelectUnlockedCells: true,
		FormatColumns: true, FormatRows: true, AutoFilter: true, Sort: true,
	})
}

// paperSize maps Report.Paper to the paperSize code of the OOXML pageSetup
// element (ECMA-376 Part 1: 1 Letter, 9 A4). Unknown values give A4.
func paperSize(p string) int {
	if strings.EqualFold(strings.TrimSpace(p), "letter") {
		return 1
	}
	return 9
}

// hfText makes project text safe inside a header or footer: '&' starts a
// control code there, so it is doubled; long text is cut.
func hfText(s string, max int) string {
	rs := []rune(s)
	if len(rs) > max {
		rs = append(rs[:max-1], '…')
	}
	return strings.ReplaceAll(string(rs), "&", "&&")
}

func codesNote(r *report.Report) string {
	if strings.TrimSpace(r.CodesNote) != "" {
		return r.CodesNote
	}
	return caution.CodesNote
}

var monthNames = [12]string{"Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"}

// inputCell writes an input on the Inputs-style layout with validation and a note.
type inputSpec struct {
	name    string // defined name ("" none)
	label   string
	value   float64
	unit    string
	note    string
	integer bool
	min     float64
	max     float64
}

// validate adds a data validation to one cell or range.
func (b *builder) validate(sheet, sqref string, integer bool, minV, maxV float64, title, msg string) error {
	dv := excelize.NewDataValidation(true)
	dv.Sqref = sqref
	t := excelize.DataValidationTypeDecimal
	if integer {
		t = excelize.DataValidationTypeWhole
	}
	if err := dv.SetRange(minV, maxV, t, excelize.DataValidationOperatorBetween); err != nil {
		return err
	}
	// Spreadsheet programs limit validation titles to 32 characters.
	if rs := []rune(title); len(rs) > 32 {
		title = string(rs[:31]) + "…"
	}
	dv.SetError(excelize.DataValidationErrorStyleStop, title, msg)
	dv.SetInput(title, msg)
	return b.f.AddDataValidation(sheet, dv)
}

func chartTitle(s string) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: s, Font: &excelize.Font{Bold: true, Size: 11, Color: colInk}}}}
}
