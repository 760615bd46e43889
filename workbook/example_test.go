package workbook_test

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"

	"github.com/xuri/excelize/v2"

	"solstand/report"
	"solstand/workbook"
)

// A minimal report: the workbook still has every sheet, with its inputs and
// live formulas.
func ExampleWrite() {
	r := &report.Report{Project: "Example cabin", Date: "2026-06-01", Paper: "letter", DesignMonth: 12}
	r.Battery.AutonomyDays = 3
	r.Battery.MaxDoD = 0.5
	r.Array.Module.PmaxW = 200
	var buf bytes.Buffer
	if err := workbook.Write(&buf, r, workbook.Options{ToolVersion: "dev"}); err != nil {
		fmt.Println(err)
		return
	}
	f, err := excelize.OpenReader(&buf)
	if err != nil {
		fmt.Println(err)
		return
	}
	defer f.Close()
	fmt.Println(len(f.GetSheetList()), "sheets")
	v, _ := f.GetCellValue("Inputs", "B6")
	fmt.Println("autonomy_days =", v)
	// Output:
	// 14 sheets
	// autonomy_days = 3.00
}

func ExampleWriteFile() {
	dir, err := os.MkdirTemp("", "solstand-example")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer os.RemoveAll(dir)
	r := &report.Report{Project: "Example pump house", Date: "2026-06-01"}
	path := filepath.Join(dir, "design.xlsx")
	if err := workbook.WriteFile(path, r, workbook.Options{Hourly: true}); err != nil {
		fmt.Println(err)
		return
	}
	_, err = os.Stat(path)
	fmt.Println(err == nil)
	// Output: true
}
