package workbook

import (
	"bytes"
	"io"
	"os"
	"path/filepath"
	"sync"
	"testing"

	"github.com/xuri/excelize/v2"

	"solstand/report"
	"solstand/schema"
	"solstand/simulate"
)

// BenchmarkWrite writes the clinic example's workbook (first-year daily balance, no hourly sheet).
func BenchmarkWrite(b *testing.B) {
	r := clinicReport(b)
	b.ReportAllocs()
	for b.Loop() {
		if err := Write(io.Discard, r, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}

var (
	clinicOnce   sync.Once
	clinicResult *report.Report
)

// clinicReport is the clinic example as the engine sizes it (one
// synthetic year: the workbook's daily sheet holds the first year anyway).
func clinicReport(b *testing.B) *report.Report {
	clinicOnce.Do(func() {
		data, err := os.ReadFile(filepath.Join("..", "examples", "clinic.json"))
		if err != nil {
			b.Fatal(err)
		}
		p, err := schema.Decode(data)
		if err != nil {
			b.Fatal(err)
		}
		years := 1
		clinicResult, err = simulate.Run(p, simulate.Options{Years: &years})
		if err != nil {
			b.Fatal(err)
		}
	})
	return clinicResult
}

var (
	fixtureCellsOnce sync.Once
	fixtureCells     int
)

// cellCount is the number of non-empty cells of the clinic example's workbook.
func cellCount(b *testing.B) int {
	fixtureCellsOnce.Do(func() {
		var buf bytes.Buffer
		if err := Write(&buf, clinicReport(b), Options{}); err != nil {
			b.Fatal(err)
		}
		f, err := excelize.OpenReader(&buf)
		if err != nil {
			b.Fatal(err)
		}
		defer f.Close()
		for _, s := range f.GetSheetList() {
			rows, err := f.GetRows(s)
			if err != nil {
				b.Fatal(err)
			}
			for _, row := range rows {
				for _, c := range row {
					if c != "" {
						fixtureCells++
					}
				}
			}
		}
	})
	return fixtureCells
}

// BenchmarkExcelizeBaseline writes the same number of cells as BenchmarkWrite
// with the excelize stream writer alone (numbers, 14 a row, one sheet).
func BenchmarkExcelizeBaseline(b *testing.B) {
	n := cellCount(b)
	b.ReportAllocs()
	row := make([]any, 14)
	for b.Loop() {
		f := excelize.NewFile()
		sw, err := f.NewStreamWriter("Sheet1")
		if err != nil {
			b.Fatal(err)
		}
		for i, r := 0, 1; i < n; r++ {
			k := min(14, n-i)
			for j := 0; j < k; j++ {
				row[j] = float64(i + j)
			}
			cell, _ := excelize.CoordinatesToCellName(1, r)
			if err := sw.SetRow(cell, row[:k]); err != nil {
				b.Fatal(err)
			}
			i += k
		}
		if err := sw.Flush(); err != nil {
			b.Fatal(err)
		}
		if _, err := f.WriteTo(io.Discard); err != nil {
			b.Fatal(err)
		}
		_ = f.Close()
	}
	b.ReportMetric(float64(n), "cells")
}
