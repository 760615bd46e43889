package workbook

import (
	"fmt"
	"sort"
	"strings"

	"github.com/xuri/excelize/v2"

	"solstand/caution"
	"solstand/report"
)

const simNote = "Simulation result for the design as written: these values do not recalculate when inputs change."

// summarySheet writes the project, the key results (formulas over the
// defined names), the cautions that matter most and the demand/yield chart.
func (b *builder) summarySheet() error {
	r := b.r
	g := newGrid(SheetSummary)
	g.width(1, 40)
	g.width(2, 16)
	g.width(3, 12)
	g.width(4, 70)
	g.text(1, 1, "Stand-alone PV design", b.st.title)
	row := 3
	info := func(label, v string) {
		if strings.TrimSpace(v) == "" {
			return
		}
		g.text(1, row, label, b.st.label)
		g.text(2, row, v, b.st.text)
		g.merges = append(g.merges, [2]string{cellName(2, row), cellName(4, row)})
		row++
	}
	info("Project", r.Project)
	info("Client", r.Client)
	info("Prepared by", r.PreparedBy)
	info("Date", r.Date)
	info("Site", r.Site.Name)
	info("Position", fmt.Sprintf("%.4f° latitude, %.4f° longitude, %.0f m", r.Site.LatitudeDeg, r.Site.LongitudeDeg, r.Site.ElevationM))
	row++
	g.headers(row, b.st.header, "Key result", "Value", "Unit", "Note")
	row++
	dm := clampMonth(r.DesignMonth)
	type kr struct {
		label, formula string
		v              float64
		st             int
		unit, note     string
		noteFormula    string // a text formula over the names, kept live
	}
	krs := []kr{
		{"Design month", "design_month", float64(r.DesignMonth), b.st.resultInt, "month", "Month with the largest demand-to-irradiation ratio.", ""},
		{"Design month name", "", 0, 0, "", "", ""},
		{"Daily demand in the design month", "daily_demand_wh", r.Demand.DailyWh[dm], b.st.result, "Wh/day", "DC side, inverter losses included.", ""},
		{"Array power required", "array_required_w", r.Array.RequiredW, b.st.result, "W", "Before rounding to whole modules.", ""},
		{"Array rated power", "array_rated_w", r.Array.RatedW, b.st.result, "W", fmt.Sprintf("%d × %d modules (strings × series).", r.Array.Strings, r.Array.ModulesSeries),
			`array_strings&" × "&modules_series&" modules (strings × series)."`},
		{"Modules", "array_modules", float64(r.Array.Modules), b.st.resultInt, "modules", "", ""},
		{"Battery capacity required", "battery_required_ah", r.Battery.RequiredAh, b.st.result, "Ah", fmt.Sprintf("At %g V.", r.Battery.NominalV), `"At "&system_v&" V."`},
		{"Battery bank capacity", "battery_capacity_ah", r.Battery.CapacityAh, b.st.result, "Ah", fmt.Sprintf("%d × %d blocks (series × strings).", r.Battery.BlocksSeries, r.Battery.Strings),
			`battery_blocks_series&" × "&battery_strings&" blocks (series × strings)."`},
		{"Battery bank energy", "battery_capacity_wh", r.Battery.CapacityWh, b.st.result, "Wh", "", ""},
		{"Controller rating (one unit)", "controller_rated_a", r.Controller.RatedA, b.st.result, "A", fmt.Sprintf("%s, %d unit(s).", strings.ToUpper(r.Controller.Kind), r.Controller.Units),
			`"` + strings.ToUpper(r.Controller.Kind) + `, "&controller_units&" unit(s)."`},
	}
	if r.Inverter != nil {
		krs = append(krs, kr{"Inverter continuous rating", "inverter_continuous_w", r.Inverter.ContinuousW, b.st.result, "W", fmt.Sprintf("Surge %.0f W.", r.Inverter.SurgeW), ""})
	}
	for _, k := range krs {
		g.text(1, row, k.label, b.st.label)
		if k.formula == "" {
			// Month name of the design month, as a formula over design_month.
			g.put(2, row, excelize.Cell{Formula: `CHOOSE(design_month,"Jan","Feb","Mar","Apr","May","Jun","Jul","Aug","Sep","Oct","Nov","Dec")`,
				Value: monthNames[dm], StyleID: b.st.result})
		} else {
			g.formula(2, row, k.formula, k.v, k.st)
		}
		g.text(3, row, k.unit, b.st.text)
		if k.noteFormula != "" {
			g.put(4, row, excelize.Cell{Formula: k.noteFormula, Value: k.note, StyleID: b.st.textWrap})
		} else {
			g.text(4, row, k.note, b.st.textWrap)
		}
		row++
	}
	row++
	s := r.Simulation
	g.text(1, row, "Simulation check", b.st.subtitle)
	g.text(2, row, simNote, b.st.note)
	row++
	for _, v := range []struct {
		label string
		v     float64
		st    int
		unit  string
	}{
		{"Years simulated", float64(s.Years), b.st.valueInt, "years"},
		{"Loss-of-load probability", s.LOLP, b.st.valuePct, "unmet / demand"},
		{"Unmet energy", s.UnmetWh, b.st.valueInt, "Wh"},
		{"Lowest state of charge", s.MinSOC, b.st.valuePct, "fraction"},
		{"Mean state of charge", s.MeanSOC, b.st.valuePct, "fraction"},
		{"Days with unmet load", float64(s.UnmetDays), b.st.valueInt, "days"},
	} {
		g.text(1, row, v.label, b.st.label)
		g.num(2, row, v.v, v.st)
		g.text(3, row, v.unit, b.st.text)
		row++
	}
	g.text(1, row, "Seed of the synthetic weather", b.st.label)
	g.text(2, row, fmt.Sprint(s.Seed), b.st.text)
	row += 2
	g.text(1, row, "Cautions that matter most (all on the Cautions sheet)", b.st.subtitle)
	row++
	cs := sortedCautions(r.Cautions)
	if len(cs) > 6 {
		cs = cs[:6]
	}
	for _, c := range cs {
		g.text(1, row, strings.ToUpper(string(c.Severity))+": "+c.Code, b.st.severity(c.Severity))
		g.text(2, row, c.Message, b.st.textWrap)
		g.fit(row, c.Message, 98)
		g.merges = append(g.merges, [2]string{cellName(2, row), cellName(4, row)})
		row++
	}
	row++
	g.text(1, row, codesNote(r), b.st.codesNote)
	g.merges = append(g.merges, [2]string{cellName(1, row), cellName(4, row)})
	row += 2
	if err := b.pageSetup(SheetSummary, false); err != nil {
		return err
	}
	cats := rangeRef(SheetResource, 2, 5, 2, 16)
	if err := b.f.AddChart(SheetSummary, cellName(1, row), &excelize.Chart{
		Type: excelize.Line,
		Series: []excelize.ChartSeries{
			{Name: ref(SheetLoads, 7, b.loc.monthFirst-1), Categories: cats, Values: rangeRef(SheetLoads, 7, b.loc.monthFirst, 7, b.loc.monthFirst+11), Line: excelize.LineOptions{Width: 2.25}},
			{Name: ref(SheetResource, 11, 4), Categories: cats, Values: rangeRef(SheetResource, 11, 5, 11, 16), Line: excelize.LineOptions{Width: 2.25}},
		},
		Title:     chartTitle("Monthly demand and PV yield, Wh/day"),
		Legend:    excelize.ChartLegend{Position: "bottom"},
		Dimension: excelize.ChartDimension{Width: 720, Height: 320},
	}); err != nil {
		return err
	}
	return g.flush(b.f)
}

// sortedCautions orders cautions danger first, keeping the given order within a severity.
func sortedCautions(in []caution.Caution) []caution.Caution {
	cs := append([]caution.Caution(nil), in...)
	sort.SliceStable(cs, func(i, j int) bool { return cs[i].Severity.Rank() < cs[j].Severity.Rank() })
	return cs
}

// dailySheet streams the daily balance (one row per simulated day), with
// conditional formats, the state-of-charge chart and the monthly summary of
// all simulated years beside it.
func (b *builder) dailySheet() error {
	r := b.r
	s := r.Simulation
	days := s.FirstYear
	if b.opt.DailyYears > 0 && len(days) > b.opt.DailyYears*365 {
		days = days[:b.opt.DailyYears*365]
	}
	f := b.f
	const first = 4
	last := first + len(days) - 1
	if err := b.pageSetup(SheetDaily, true); err != nil {
		return err
	}
	if len(days) > 0 {
		socRange := cellName(12, first) + ":" + cellName(14, last)
		if err := f.SetConditionalFormat(SheetDaily, socRange, []excelize.ConditionalFormatOptions{
			{Type: "cell", Criteria: "<", Format: &b.st.cfLow, Value: "1-max_dod"}}); err != nil {
			return err
		}
		// Unmet energy of at least half a watt-hour (what the sheet shows as 1 Wh and more); float rounding leaves traces far below that.
		if err := f.SetConditionalFormat(SheetDaily, cellName(9, first)+":"+cellName(9, last), []excelize.ConditionalFormatOptions{
			{Type: "cell", Criteria: ">", Format: &b.st.cfUnmet, Value: "0.5"}}); err != nil {
			return err
		}
		if err := f.AddChart(SheetDaily, "P18", &excelize.Chart{
			Type: excelize.Line,
			Series: []excelize.ChartSeries{{Name: ref(SheetDaily, 14, 3), Values: rangeRef(SheetDaily, 14, first, 14, last),
				Line: excelize.LineOptions{Width: 1}, Marker: excelize.ChartMarker{Symbol: "none"}}},
			Title:     chartTitle("State of charge at the end of each day"),
			Legend:    excelize.ChartLegend{Position: "none"},
			YAxis:     excelize.ChartAxis{Minimum: ptrF(0), Maximum: ptrF(1)},
			XAxis:     excelize.ChartAxis{TickLabelSkip: 30},
			Dimension: excelize.ChartDimension{Width: 720, Height: 300},
		}); err != nil {
			return err
		}
	}
	sw, err := f.NewStreamWriter(SheetDaily)
	if err != nil {
		return err
	}
	widths := []float64{6, 6, 7, 12, 12, 12, 12, 12, 11, 11, 11, 9, 9, 9, 3, 7, 13, 12, 10, 12, 13, 9, 9, 10}
	for i, w := range widths {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(freezePanes(3)); err != nil {
		return err
	}
	st := b.st
	if err := sw.SetRow("A1", []any{excelize.Cell{Value: "Daily energy balance", StyleID: st.title}}); err != nil {
		return err
	}
	if err := sw.SetRow("A2", []any{excelize.Cell{Value: simNote + " State of charge below 1 − maximum depth of discharge and unmet energy are highlighted.", StyleID: st.note}}); err != nil {
		return err
	}
	head := []string{"Year", "Day", "Month", "PV available, Wh", "PV used, Wh", "Demand, Wh", "Served critical, Wh", "Served other, Wh",
		"Unmet, Wh", "Dumped, Wh", "Losses, Wh", "SOC min", "SOC max", "SOC end"}
	mhead := []string{"Month", "Demand, Wh (all years)", "Unmet, Wh", "Loss-of-load probability", "Dumped, Wh", "PV available, Wh", "Min SOC", "Mean SOC", "Days with unmet load"}
	row := make([]any, 0, 24)
	for _, h := range head {
		row = append(row, excelize.Cell{Value: h, StyleID: st.header})
	}
	row = append(row, nil)
	for _, h := range mhead {
		row = append(row, excelize.Cell{Value: h, StyleID: st.header})
	}
	if err := sw.SetRow("A3", row, excelize.RowOpts{Height: 45}); err != nil { // three lines of wrapped header
		return err
	}
	n := len(days)
	if len(s.Monthly) > n {
		n = len(s.Monthly)
	}
	for i := 0; i < n; i++ {
		row = row[:0]
		if i < len(days) {
			d := days[i]
			row = append(row,
				excelize.Cell{Value: i/365 + 1, StyleID: st.valueInt},
				excelize.Cell{Value: d.Day, StyleID: st.valueInt},
				excelize.Cell{Value: d.Month, StyleID: st.valueInt},
				excelize.Cell{Value: d.PVAvailableWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.PVUsedWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.DemandWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.ServedCriticalWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.ServedNonCriticalWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.UnmetWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.DumpedWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.LossesWh, StyleID: st.valueInt},
				excelize.Cell{Value: d.SOCMin, StyleID: st.valuePct},
				excelize.Cell{Value: d.SOCMax, StyleID: st.valuePct},
				excelize.Cell{Value: d.SOCEnd, StyleID: st.valuePct},
				nil)
		} else {
			row = append(row, nil, nil, nil, nil, nil, nil, nil, nil, nil, nil, nil, nil, nil, nil, nil)
		}
		if i < len(s.Monthly) {
			m := s.Monthly[i]
			row = append(row,
				excelize.Cell{Value: m.Month, StyleID: st.valueInt},
				excelize.Cell{Value: m.DemandWh, StyleID: st.valueInt},
				excelize.Cell{Value: m.UnmetWh, StyleID: st.valueInt},
				excelize.Cell{Value: m.LOLP, StyleID: st.valuePct},
				excelize.Cell{Value: m.DumpedWh, StyleID: st.valueInt},
				excelize.Cell{Value: m.PVWh, StyleID: st.valueInt},
				excelize.Cell{Value: m.MinSOC, StyleID: st.valuePct},
				excelize.Cell{Value: m.MeanSOC, StyleID: st.valuePct},
				excelize.Cell{Value: m.UnmetDays, StyleID: st.valueInt})
		}
		if err := sw.SetRow(cellName(1, first+i), row); err != nil {
			return err
		}
	}
	return sw.Flush()
}

func ptrF(v float64) *float64 { return &v }

// reliabilitySheet writes the loss-of-load statistics and the sizing curves.
func (b *builder) reliabilitySheet() error {
	r := b.r
	s := r.Simulation
	g := newGrid(SheetReliab)
	g.text(1, 1, "Reliability", b.st.title)
	g.text(1, 2, simNote+" Loss-of-load probability = unmet energy / demand (Egido & Lorenzo 1992).", b.st.note)
	for c, w := range []float64{34, 14, 14, 14, 14, 14, 14, 14, 14} {
		g.width(c+1, w)
	}
	row := 4
	kv := func(label string, v float64, st int, unit string) {
		g.text(1, row, label, b.st.label)
		g.num(2, row, v, st)
		g.text(3, row, unit, b.st.text)
		row++
	}
	kv("Years simulated", float64(s.Years), b.st.valueInt, "years")
	kv("Loss-of-load probability", s.LOLP, b.st.valuePct, "")
	if s.TargetLOLP > 0 {
		kv("Target loss-of-load probability", s.TargetLOLP, b.st.valuePct, "")
	}
	kv("Demand", s.DemandWh, b.st.valueInt, "Wh")
	kv("Unmet energy", s.UnmetWh, b.st.valueInt, "Wh")
	kv("Hours with unmet load", float64(s.UnmetHours), b.st.valueInt, "h")
	kv("Days with unmet load", float64(s.UnmetDays), b.st.valueInt, "days")
	kv("Longest run of days with unmet load", float64(s.LongestUnmetRunDays), b.st.valueInt, "days")
	kv("Days below half charge", float64(s.DaysBelowHalf), b.st.valueInt, "days")
	kv("Lowest state of charge", s.MinSOC, b.st.valuePct, "")
	kv("Mean state of charge", s.MeanSOC, b.st.valuePct, "")
	kv("State of charge, 5th percentile", s.SOCP5, b.st.valuePct, "")
	kv("State of charge, median", s.SOCP50, b.st.valuePct, "")
	kv("Dumped energy", s.DumpedWh, b.st.valueInt, "Wh")
	kv("Recovery after the worst streak", s.RecoveryDays, b.st.value, "days")
	kv("Battery throughput", s.ThroughputWh, b.st.valueInt, "Wh")
	kv("Equivalent full cycles", s.EquivalentFullCycles, b.st.value, "cycles")
	row++
	g.text(1, row, "Energy ledger (all simulated years)", b.st.subtitle)
	row++
	l := s.Ledger
	kv("PV available", l.PVAvailableWh, b.st.valueInt, "Wh")
	kv("Load served", l.LoadServedWh, b.st.valueInt, "Wh")
	kv("Unmet", l.UnmetWh, b.st.valueInt, "Wh")
	kv("Dumped", l.DumpedWh, b.st.valueInt, "Wh")
	kv("Losses", l.LossesWh, b.st.valueInt, "Wh")
	kv("Battery at start", l.BatteryStartWh, b.st.valueInt, "Wh")
	kv("Battery at end", l.BatteryEndWh, b.st.valueInt, "Wh")
	row++
	g.text(1, row, "By calendar month (all years)", b.st.subtitle)
	row++
	g.headers(row, b.st.header, "Month", "Demand, Wh", "Unmet, Wh", "Loss-of-load probability", "Days with unmet load", "Min SOC")
	row++
	for _, m := range s.Monthly {
		g.num(1, row, float64(m.Month), b.st.valueInt)
		g.num(2, row, m.DemandWh, b.st.valueInt)
		g.num(3, row, m.UnmetWh, b.st.valueInt)
		g.num(4, row, m.LOLP, b.st.valuePct)
		g.num(5, row, float64(m.UnmetDays), b.st.valueInt)
		g.num(6, row, m.MinSOC, b.st.valuePct)
		row++
	}
	row++
	if len(s.Yearly) > 0 {
		g.text(1, row, "By simulated year", b.st.subtitle)
		row++
		g.headers(row, b.st.header, "Year", "Loss-of-load probability", "Unmet, Wh", "Dumped, Wh", "Min SOC")
		row++
		for _, y := range s.Yearly {
			g.num(1, row, float64(y.Year), b.st.valueInt)
			g.num(2, row, y.LOLP, b.st.valuePct)
			g.num(3, row, y.UnmetWh, b.st.valueInt)
			g.num(4, row, y.DumpedWh, b.st.valueInt)
			g.num(5, row, y.MinSOC, b.st.valuePct)
			row++
		}
		row++
	}
	if len(s.Stress) > 0 {
		g.text(1, row, "Stress tests", b.st.subtitle)
		row++
		g.headers(row, b.st.header, "Test", "Min SOC", "Unmet, Wh", "Recovery, days (−1: not recovered)", "Description")
		row++
		for _, t := range s.Stress {
			g.text(1, row, t.Name, b.st.label)
			g.num(2, row, t.MinSOC, b.st.valuePct)
			g.num(3, row, t.UnmetWh, b.st.valueInt)
			g.num(4, row, t.RecoveryDays, b.st.value)
			g.text(5, row, t.Description, b.st.text)
			row++
		}
		row++
	}
	if m := s.Measured; m != nil {
		g.text(1, row, "Measured weather year: "+m.Source, b.st.subtitle)
		row++
		kv("Loss-of-load probability", m.LOLP, b.st.valuePct, "")
		kv("Unmet energy", m.UnmetWh, b.st.valueInt, "Wh")
		kv("Lowest state of charge", m.MinSOC, b.st.valuePct, "")
		kv("Dumped energy", m.DumpedWh, b.st.valueInt, "Wh")
		row++
	}
	var series []excelize.ChartSeries
	if len(r.Curves) > 0 {
		g.text(1, row, "Sizing curves (array-to-load ratio against storage days at equal loss-of-load probability)", b.st.subtitle)
		row++
		g.headers(row, b.st.header, "Target LOLP", "Storage, days", "Array-to-load ratio", "Array, W", "Storage, Wh", "LOLP", "Cost", "Cheapest", "Curve")
		row++
		for ci, c := range r.Curves {
			r1 := row
			for i, p := range c.Points {
				g.num(1, row, c.TargetLOLP, b.st.valuePct)
				g.num(2, row, p.StorageDays, b.st.value)
				g.num(3, row, p.ArrayToLoad, b.st.value)
				g.num(4, row, p.ArrayW, b.st.valueInt)
				g.num(5, row, p.CapacityWh, b.st.valueInt)
				g.num(6, row, p.LOLP, b.st.valuePct)
				g.num(7, row, p.Cost, b.st.valueInt)
				g.text(8, row, tern(i == c.Cheapest, "yes", ""), b.st.text)
				g.text(9, row, fmt.Sprintf("LOLP %g %%", c.TargetLOLP*100), b.st.text)
				row++
			}
			if len(c.Points) > 0 {
				series = append(series, excelize.ChartSeries{
					Name:       ref(SheetReliab, 9, r1),
					Categories: rangeRef(SheetReliab, 2, r1, 2, row-1),
					Values:     rangeRef(SheetReliab, 3, r1, 3, row-1),
					Marker:     scatterMarker(ci, 6),
				})
			}
		}
		row++
	}
	if err := b.pageSetup(SheetReliab, true); err != nil {
		return err
	}
	if len(series) > 0 {
		if err := b.f.AddChart(SheetReliab, cellName(10, 4), &excelize.Chart{
			Type:      excelize.Scatter,
			Series:    series,
			Title:     chartTitle("Sizing curves: array-to-load ratio against storage days"),
			Legend:    excelize.ChartLegend{Position: "bottom"},
			XAxis:     excelize.ChartAxis{Title: chartTitle("Storage, days")},
			YAxis:     excelize.ChartAxis{Title: chartTitle("Array-to-load ratio")},
			Dimension: excelize.ChartDimension{Width: 640, Height: 360},
		}); err != nil {
			return err
		}
	}
	return g.flush(b.f)
}

// wiringSheet writes the conductors and the protection.
func (b *builder) wiringSheet() error {
	w := b.r.Wiring
	g := newGrid(SheetWiring)
	g.text(1, 1, "Wiring and protection", b.st.title)
	g.text(1, 2, "Conductor tables: "+orDash(strings.ToUpper(w.Standard))+" (IEC 60228 metric sizes at 20 °C; NEC Chapter 9 Table 8 AWG sizes at 75 °C). Currents include the NEC 690.8 factors where they apply.", b.st.note)
	for c, wd := range []float64{30, 11, 10, 10, 10, 12, 11, 12, 11, 10, 10, 14} {
		g.width(c+1, wd)
	}
	g.headers(4, b.st.header, "Circuit", "Current, A", "Length, m", "Voltage, V", "Max drop, %", "Size", "Area, mm²", "Resistance, Ω/km", "Ampacity, A", "Drop, V", "Drop, %", "Limited by")
	row := 5
	for _, c := range w.Circuits {
		g.text(1, row, c.Name, b.st.label)
		g.num(2, row, c.CurrentA, b.st.value)
		g.num(3, row, c.LengthM, b.st.value)
		g.num(4, row, c.VoltageV, b.st.value)
		g.num(5, row, c.MaxDropPct, b.st.value)
		g.text(6, row, c.Size, b.st.text)
		g.num(7, row, c.AreaMM2, b.st.value)
		g.num(8, row, c.ResistanceOhmPerKm, b.st.value)
		g.num(9, row, c.AmpacityA, b.st.value)
		g.num(10, row, c.DropV, b.st.value)
		g.num(11, row, c.DropPct, b.st.value)
		g.text(12, row, c.LimitedBy, b.st.text)
		row++
	}
	row++
	g.text(1, row, "Protection", b.st.subtitle)
	row++
	g.headers(row, b.st.header, "Circuit", "Device", "Rating, A", "Count", "Interrupting, A", "Note")
	row++
	for _, p := range w.Protection {
		g.text(1, row, p.Circuit, b.st.label)
		g.text(2, row, p.Kind, b.st.text)
		g.num(3, row, p.RatingA, b.st.value)
		g.num(4, row, float64(p.Count), b.st.valueInt)
		g.num(5, row, p.InterruptingA, b.st.valueInt)
		g.text(6, row, p.Note, b.st.text)
		row++
	}
	if err := b.pageSetup(SheetWiring, true); err != nil {
		return err
	}
	return g.flush(b.f)
}

// cautionsSheet writes the codes note prominently and every caution with severity styling.
func (b *builder) cautionsSheet() error {
	g := newGrid(SheetCautions)
	g.width(1, 12)
	g.width(2, 30)
	g.width(3, 90)
	g.text(1, 1, "Cautions", b.st.title)
	g.text(1, 3, codesNote(b.r), b.st.codesNote)
	g.merges = append(g.merges, [2]string{"A3", "C3"})
	g.headers(5, b.st.header, "Severity", "Code", "Caution")
	g.freeze = 5
	row := 6
	for _, c := range sortedCautions(b.r.Cautions) {
		st := b.st.severity(c.Severity)
		g.text(1, row, string(c.Severity), st)
		g.text(2, row, c.Code, st)
		g.text(3, row, c.Message, b.st.textWrap)
		g.fit(row, c.Message, 90)
		row++
	}
	if len(b.r.Cautions) == 0 {
		g.text(1, row, "(none)", b.st.note)
	}
	if err := b.pageSetup(SheetCautions, false); err != nil {
		return err
	}
	return g.flush(b.f)
}

// methodSheet writes each published method and source the run used, and the run's notes.
func (b *builder) methodSheet() error {
	g := newGrid(SheetMethod)
	g.width(1, 30)
	g.width(2, 50)
	g.width(3, 70)
	g.text(1, 1, "Methods and sources", b.st.title)
	g.headers(3, b.st.header, "Topic", "Method", "Source")
	g.freeze = 3
	row := 4
	for _, m := range b.r.Methods {
		g.text(1, row, m.Topic, b.st.label)
		g.text(2, row, m.Method, b.st.textWrap)
		g.text(3, row, m.Source, b.st.textWrap)
		g.fit(row, m.Method, 50)
		g.fit(row, m.Source, 70)
		row++
	}
	if len(b.r.Notes) > 0 {
		row++
		g.text(1, row, "Assumptions and defaults of this run", b.st.subtitle)
		row++
		for _, n := range b.r.Notes {
			g.text(1, row, n, b.st.text)
			g.merges = append(g.merges, [2]string{cellName(1, row), cellName(3, row)})
			row++
		}
	}
	if err := b.pageSetup(SheetMethod, true); err != nil {
		return err
	}
	return g.flush(b.f)
}

// sunPathSheet writes the sun-path table and a chart of elevation against azimuth.
func (b *builder) sunPathSheet() error {
	rows := append([]report.SunPathRow(nil), b.r.SunPath...)
	sort.SliceStable(rows, func(i, j int) bool {
		if rows[i].Month != rows[j].Month {
			return rows[i].Month < rows[j].Month
		}
		return rows[i].SolarHour < rows[j].SolarHour
	})
	g := newGrid(SheetSunPath)
	g.text(1, 1, "Sun path", b.st.title)
	g.text(1, 2, "Sun position on each month's representative day (Klein 1977), by solar hour; azimuth clockwise from true north.", b.st.note)
	g.headers(3, b.st.header, "Month", "Solar hour", "Elevation, °", "Azimuth, °", "Month name")
	g.freeze = 3
	for c := 1; c <= 5; c++ {
		g.width(c, 12)
	}
	var series []excelize.ChartSeries
	row := 4
	for i := 0; i < len(rows); {
		j := i
		r1 := row
		for j < len(rows) && rows[j].Month == rows[i].Month {
			p := rows[j]
			g.num(1, row, float64(p.Month), b.st.valueInt)
			g.num(2, row, float64(p.SolarHour), b.st.valueInt)
			g.num(3, row, p.ElevationDeg, b.st.value)
			g.num(4, row, p.AzimuthDeg, b.st.value)
			name := "month"
			if m := p.Month; m >= 1 && m <= 12 {
				name = monthNames[m-1]
			}
			g.text(5, row, name, b.st.text)
			row++
			j++
		}
		series = append(series, excelize.ChartSeries{Name: ref(SheetSunPath, 5, r1), Categories: rangeRef(SheetSunPath, 4, r1, 4, row-1),
			Values: rangeRef(SheetSunPath, 3, r1, 3, row-1), Marker: scatterMarker(len(series), 4)})
		i = j
	}
	if err := b.pageSetup(SheetSunPath, false); err != nil {
		return err
	}
	if len(series) > 0 {
		if err := b.f.AddChart(SheetSunPath, "G4", &excelize.Chart{
			Type:      excelize.Scatter,
			Series:    series,
			Title:     chartTitle("Sun elevation against azimuth"),
			Legend:    excelize.ChartLegend{Position: "right"},
			XAxis:     excelize.ChartAxis{Title: chartTitle("Azimuth, °")},
			YAxis:     excelize.ChartAxis{Title: chartTitle("Elevation, °"), Minimum: ptrF(0)},
			Dimension: excelize.ChartDimension{Width: 640, Height: 380},
		}); err != nil {
			return err
		}
	}
	return g.flush(b.f)
}

// cumulative days before each month in a 365-day year.
var monthStart = [13]int{0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334, 365}

// monthOfDay returns the month 1..12 of day-of-year 1..365 (365-day year).
func monthOfDay(day int) int {
	for m := 1; m <= 12; m++ {
		if day <= monthStart[m] {
			return m
		}
	}
	return 12
}

// hourlySheet streams one row per hour of the first simulated year.
func (b *builder) hourlySheet() error {
	s := b.r.Simulation
	n := len(s.FirstYearHourlySOC)
	if len(s.FirstYearHourlyPVWh) > n {
		n = len(s.FirstYearHourlyPVWh)
	}
	if len(s.FirstYearHourlyLoadWh) > n {
		n = len(s.FirstYearHourlyLoadWh)
	}
	if err := b.pageSetup(SheetHourly, false); err != nil {
		return err
	}
	if n > 0 {
		if err := b.f.SetConditionalFormat(SheetHourly, fmt.Sprintf("G4:G%d", 3+n), []excelize.ConditionalFormatOptions{
			{Type: "cell", Criteria: "<", Format: &b.st.cfLow, Value: "1-max_dod"}}); err != nil {
			return err
		}
	}
	sw, err := b.f.NewStreamWriter(SheetHourly)
	if err != nil {
		return err
	}
	for i, w := range []float64{10, 7, 7, 9, 12, 12, 10} {
		if err := sw.SetColWidth(i+1, i+1, w); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(freezePanes(3)); err != nil {
		return err
	}
	st := b.st
	if err := sw.SetRow("A1", []any{excelize.Cell{Value: "Hourly balance, first simulated year", StyleID: st.title}}); err != nil {
		return err
	}
	if err := sw.SetRow("A2", []any{excelize.Cell{Value: simNote, StyleID: st.note}}); err != nil {
		return err
	}
	head := []any{}
	for _, h := range []string{"Hour of year", "Day", "Month", "Solar hour", "PV available, Wh", "Load, Wh", "SOC (end of hour)"} {
		head = append(head, excelize.Cell{Value: h, StyleID: st.header})
	}
	if err := sw.SetRow("A3", head); err != nil {
		return err
	}
	at := func(v []float32, i int) any {
		if i < len(v) {
			return float64(v[i])
		}
		return nil
	}
	row := make([]any, 7)
	for i := 0; i < n; i++ {
		day := i/24 + 1
		dayOfYear := (day-1)%365 + 1
		row[0] = excelize.Cell{Value: i + 1, StyleID: st.valueInt}
		row[1] = excelize.Cell{Value: day, StyleID: st.valueInt}
		row[2] = excelize.Cell{Value: monthOfDay(dayOfYear), StyleID: st.valueInt}
		row[3] = excelize.Cell{Value: i % 24, StyleID: st.valueInt}
		row[4] = excelize.Cell{Value: at(s.FirstYearHourlyPVWh, i), StyleID: st.value}
		row[5] = excelize.Cell{Value: at(s.FirstYearHourlyLoadWh, i), StyleID: st.value}
		row[6] = excelize.Cell{Value: at(s.FirstYearHourlySOC, i), StyleID: st.valuePct}
		if err := sw.SetRow(cellName(1, 4+i), row); err != nil {
			return err
		}
	}
	return sw.Flush()
}

// markerColours are the series colours of the scatter charts.
var markerColours = [...]string{"1F6F5C", "C2571A", "4A5A9C", "8A6D1F", "6B3F7A", "2F8FB0"}

// scatterMarker is a filled round marker in the i-th series colour: a
// scatter series draws no line, and a marker without a fill is invisible in
// some spreadsheet programs.
func scatterMarker(i, size int) excelize.ChartMarker {
	fill := excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{markerColours[i%len(markerColours)]}}
	return excelize.ChartMarker{Symbol: "circle", Size: size, Fill: fill, Border: excelize.LineOptions{Width: 0.75, Fill: fill}}
}
