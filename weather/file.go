package weather

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
)

// ReadFile reads a weather file, choosing the reader by the file's
// extension: .epw for ReadEPW, .csv for ReadCSV (either case). Errors carry
// the path.
func ReadFile(path string) (Series, error) {
	ext := strings.ToLower(filepath.Ext(path))
	if ext != ".epw" && ext != ".csv" {
		return Series{}, fmt.Errorf("weather file %s: unknown extension %q (want .epw or .csv)", path, ext)
	}
	f, err := os.Open(path)
	if err != nil {
		return Series{}, fmt.Errorf("weather file: %w", err)
	}
	defer f.Close()
	if ext == ".epw" {
		return ReadEPW(f, path)
	}
	return ReadCSV(f, path)
}
