package main

import (
	"os"
	"path/filepath"
	"testing"
)

// TestExitStatus checks the exit statuses of CONTRACT.md through the
// command-line parser: 0 success, 1 failed work, 2 bad use, 3 invalid document.
func TestExitStatus(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.json")
	_ = os.WriteFile(bad, []byte(`{"name": 1}`), 0o644)
	devnull, _ := os.OpenFile(os.DevNull, os.O_WRONLY, 0)
	defer devnull.Close()
	stdout, stderr := os.Stdout, os.Stderr
	os.Stdout, os.Stderr = devnull, devnull
	defer func() { os.Stdout, os.Stderr = stdout, stderr }()
	for _, tc := range []struct {
		args []string
		want int
	}{
		{[]string{"--version"}, 0},
		{[]string{"schema"}, 0},
		{[]string{"validate", "../../examples/cabin.json"}, 0},
		{[]string{"size"}, 2},
		{[]string{"size", "a.json", "b.json"}, 2},
		{[]string{"size", "--no-such-flag", "x.json"}, 2},
		{[]string{"frobnicate"}, 2},
		{[]string{"wire", "--current", "20"}, 2},
		{[]string{"sun", "--lat", "95", "--lon", "0", "--at", "2026-01-01T12:00:00Z"}, 2},
		{[]string{"validate", bad}, 3},
		{[]string{"size", bad, "-o", filepath.Join(dir, "x.xlsx")}, 3},
		{[]string{"validate", filepath.Join(dir, "missing.json")}, 1},
		{[]string{"wire", "--current", "5000", "--length-m", "500", "--voltage", "12", "--max-drop-pct", "1"}, 1},
	} {
		if got := execute(tc.args); got != tc.want {
			t.Errorf("solstand %v: exit %d, want %d", tc.args, got, tc.want)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "x.xlsx")); !os.IsNotExist(err) {
		t.Error("a workbook was written for an invalid project")
	}
}
