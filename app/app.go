// Package app holds the logic of each solstand command as a plain function
// over plain options and writers, so tests call it without the command-line
// parser. cmd/solstand only maps flags onto these options.
package app

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"solstand/examples"
	"solstand/report"
	"solstand/schema"
	"solstand/simulate"
	"solstand/weather"
	"solstand/workbook"
)

// Version is the program's version, set by the build (-ldflags) or left as is.
var Version = "0.1.0"

// Exit statuses of CONTRACT.md.
const (
	ExitOK      = 0
	ExitFailed  = 1 // the work failed: I/O, a design that cannot be met
	ExitUsage   = 2 // bad command-line use
	ExitInvalid = 3 // the project document is invalid
)

// Error carries an exit status with its cause.
type Error struct {
	Code int
	Err  error
}

func (e *Error) Error() string { return e.Err.Error() }
func (e *Error) Unwrap() error { return e.Err }

// Code returns the exit status for an error (0 for nil).
func Code(err error) int {
	if err == nil {
		return ExitOK
	}
	var e *Error
	if errors.As(err, &e) {
		return e.Code
	}
	return ExitFailed
}

func fail(code int, format string, a ...any) error {
	return &Error{Code: code, Err: fmt.Errorf(format, a...)}
}

// Report prints an error the way the commands do: problems one a line.
func Report(w io.Writer, err error) {
	var ps schema.Problems
	if errors.As(err, &ps) {
		for _, p := range ps {
			fmt.Fprintln(w, p.String())
		}
		return
	}
	fmt.Fprintln(w, "solstand:", err)
}

// LoadProject reads, decodes and checks a project file. A weather file given
// on the command line (weatherPath) stands in for the project's monthly means.
func LoadProject(path, weatherPath string) (*schema.Project, error) {
	if st, err := os.Stat(path); err == nil && st.Size() > schema.MaxDocumentBytes {
		return nil, &Error{Code: ExitInvalid, Err: schema.Problems{{Message: fmt.Sprintf("%s: document is %.1f MB; the limit is %d MB (a project describes one site; split a fleet into one file per site)",
			path, float64(st.Size())/(1<<20), schema.MaxDocumentBytes>>20)}}}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fail(ExitFailed, "%w", err)
	}
	p, err := schema.DecodeWith(data, schema.DecodeOptions{WeatherFile: weatherPath})
	if err != nil {
		var ps schema.Problems
		if errors.As(err, &ps) {
			for i := range ps {
				if ps[i].Path == "" {
					ps[i].Message = path + ": " + ps[i].Message
				}
			}
			return nil, &Error{Code: ExitInvalid, Err: ps}
		}
		return nil, &Error{Code: ExitInvalid, Err: err}
	}
	if weatherPath != "" {
		p.Site.WeatherFile = weatherPath
	} else if p.Site.WeatherFile != "" && !filepath.IsAbs(p.Site.WeatherFile) {
		p.Site.WeatherFile = filepath.Join(filepath.Dir(path), p.Site.WeatherFile)
	}
	return p, nil
}

// SizeOptions are the options of `solstand size`.
type SizeOptions struct {
	Project string // path of the project document
	Out     string // workbook path, "" for none
	JSON    bool   // the summary as JSON on stdout
	Seed    *uint64
	Years   *int
	Weather string
	Hourly  bool
	Quiet   bool
}

// Size runs the whole job: size, simulate, write the workbook and/or the
// summary. On failure no output file is created or changed.
func Size(opt SizeOptions, stdout, stderr io.Writer) error {
	if opt.Out != "" {
		if err := checkOutput(opt.Project, opt.Out); err != nil {
			return err
		}
	}
	r, err := run(opt.Project, opt.Weather, opt.Seed, opt.Years, opt.Quiet, stderr, false, opt.Hourly)
	if err != nil {
		return err
	}
	if opt.Out != "" {
		if err := workbook.WriteFile(opt.Out, r, workbook.Options{Hourly: r.Hourly, ToolVersion: Version}); err != nil {
			return fail(ExitFailed, "write %s: %w", opt.Out, err)
		}
		if !opt.Quiet {
			fmt.Fprintf(stderr, "wrote %s\n", opt.Out)
		}
	}
	if opt.JSON {
		return writeJSON(stdout, report.Summarise(r))
	}
	if opt.Out == "" {
		PrintSummary(stdout, r)
	}
	return nil
}

// CurvesOptions are the options of `solstand curves`.
type CurvesOptions struct {
	Project string
	JSON    bool
	Seed    *uint64
	Years   *int
	Weather string
	Quiet   bool
}

// Curves prints the isoreliability curves of a project.
func Curves(opt CurvesOptions, stdout, stderr io.Writer) error {
	r, err := run(opt.Project, opt.Weather, opt.Seed, opt.Years, opt.Quiet, stderr, true, false)
	if err != nil {
		return err
	}
	if opt.JSON {
		return writeJSON(stdout, struct {
			Project     string         `json:"project"`
			DesignMonth int            `json:"design_month"`
			DailyWh     float64        `json:"design_daily_wh"`
			Years       int            `json:"years"`
			Seed        uint64         `json:"seed"`
			Curves      []report.Curve `json:"curves"`
			CodesNote   string         `json:"codes_note"`
		}{r.Project, r.DesignMonth, r.Demand.DailyWh[r.DesignMonth-1], r.Simulation.Years, r.Simulation.Seed, r.Curves, r.CodesNote})
	}
	fmt.Fprintf(stdout, "Isoreliability curves for %s (design month %d, %d synthetic years, seed %d)\n", r.Project, r.DesignMonth, r.Simulation.Years, r.Simulation.Seed)
	for _, c := range r.Curves {
		fmt.Fprintf(stdout, "\nloss-of-load target %.4g\n  storage days  array-to-load  array W  battery Wh  LOLP\n", c.TargetLOLP)
		for i, pt := range c.Points {
			mark := ""
			if i == c.Cheapest {
				mark = "  <- least cost"
			}
			fmt.Fprintf(stdout, "  %12.2f  %13.3f  %7.0f  %10.0f  %.5f%s\n", pt.StorageDays, pt.ArrayToLoad, pt.ArrayW, pt.CapacityWh, pt.LOLP, mark)
		}
	}
	fmt.Fprintln(stdout, "\n"+r.CodesNote)
	return nil
}

func run(path, weatherPath string, seed *uint64, years *int, quiet bool, stderr io.Writer, curves, hourly bool) (*report.Report, error) {
	p, err := LoadProject(path, weatherPath)
	if err != nil {
		return nil, err
	}
	if p.Output.Date == "" {
		// Reproducible builds' convention: the document date from SOURCE_DATE_EPOCH.
		if sec, err := strconv.ParseInt(os.Getenv("SOURCE_DATE_EPOCH"), 10, 64); err == nil {
			p.Output.Date = time.Unix(sec, 0).UTC().Format("2006-01-02")
		}
	}
	opt := simulate.Options{ToolVersion: Version, Seed: seed, Years: years, Curves: curves, Hourly: hourly}
	if p.Site.WeatherFile != "" {
		s, err := weather.ReadFile(p.Site.WeatherFile)
		if err != nil {
			return nil, fail(ExitFailed, "weather file: %w", err)
		}
		opt.Weather = &s
	}
	var bar *progress
	if !quiet {
		bar = newProgress(stderr)
		opt.Progress = bar.update
	}
	r, err := simulate.Run(p, opt)
	bar.finish()
	if err != nil {
		return nil, fail(ExitFailed, "%w", err)
	}
	return r, nil
}

// checkOutput refuses an output path that is the input document.
func checkOutput(in, out string) error {
	ai, err1 := filepath.Abs(in)
	ao, err2 := filepath.Abs(out)
	if err1 == nil && err2 == nil && ai == ao {
		return fail(ExitUsage, "the output %s is the project document itself; choose another name", out)
	}
	if si, err := os.Stat(in); err == nil {
		if so, err := os.Stat(out); err == nil && os.SameFile(si, so) {
			return fail(ExitUsage, "the output %s is the project document itself; choose another name", out)
		}
	}
	if strings.EqualFold(filepath.Ext(out), ".json") {
		return fail(ExitUsage, "the workbook path %s ends in .json; use .xlsx", out)
	}
	return nil
}

func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return fail(ExitFailed, "write JSON: %w", err)
	}
	return nil
}

// ValidateOptions are the options of `solstand validate`.
type ValidateOptions struct {
	Project      string
	ShowDefaults bool
	Weather      string
}

// Validate checks a project; with ShowDefaults it prints the document with
// every default filled in.
func Validate(opt ValidateOptions, stdout, stderr io.Writer) error {
	p, err := LoadProject(opt.Project, opt.Weather)
	if err != nil {
		return err
	}
	if opt.ShowDefaults {
		if err := simulate.ResolveDefaults(p); err != nil {
			return fail(ExitInvalid, "%w", err)
		}
		return writeJSON(stdout, p)
	}
	fmt.Fprintf(stderr, "%s: valid\n", opt.Project)
	return nil
}

// Schema prints the project document's JSON Schema.
func Schema(stdout io.Writer) error {
	b, err := schema.Generate()
	if err != nil {
		return fail(ExitFailed, "%w", err)
	}
	if _, err := stdout.Write(b); err != nil {
		return fail(ExitFailed, "write schema: %w", err)
	}
	return nil
}

// Init writes a starter project from a template.
func Init(template, out string, force bool) error {
	b, err := examples.Template(template)
	if err != nil {
		return fail(ExitUsage, "%w", err)
	}
	if out == "" {
		return fail(ExitUsage, "give the file to write with -o")
	}
	if !force {
		if _, err := os.Stat(out); err == nil {
			return fail(ExitUsage, "%s exists; pass --force to replace it", out)
		}
	}
	// Templates sit beside the schema in the source tree; a written starter
	// points at no schema path that may not exist where it is written.
	b = []byte(strings.Replace(string(b), `"$schema": "../schema/project.schema.json",`+"\n  ", "", 1))
	if err := AtomicWrite(out, b); err != nil {
		return fail(ExitFailed, "%w", err)
	}
	return nil
}

// AtomicWrite writes data to a temporary file in the target folder and
// renames it into place, so a failure leaves nothing half-written.
func AtomicWrite(path string, data []byte) error {
	dir := filepath.Dir(path)
	f, err := os.CreateTemp(dir, ".solstand-*.tmp")
	if err != nil {
		return err
	}
	tmp := f.Name()
	_, werr := f.Write(data)
	cerr := f.Close()
	if werr != nil || cerr != nil {
		os.Remove(tmp)
		return errors.Join(werr, cerr)
	}
	if err := os.Chmod(tmp, 0o644); err != nil {
		os.Remove(tmp)
		return err
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return err
	}
	return nil
}
