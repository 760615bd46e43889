// Command solstand sizes stand-alone (off-grid) photovoltaic systems and
// writes the design as an editable spreadsheet workbook. This file only
// maps command-line flags onto the functions of package app.
package main

import (
	"errors"
	"fmt"
	"math"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"solstand/app"
	"solstand/examples"
)

func main() {
	os.Exit(execute(os.Args[1:]))
}

// usageError marks an error of command-line use (exit status 2).
type usageError struct{ error }

func execute(args []string) int {
	root := newRoot()
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return app.ExitOK
	}
	app.Report(os.Stderr, err)
	var ue usageError
	if errors.As(err, &ue) {
		return app.ExitUsage
	}
	// Errors of the commands themselves carry their exit status; anything
	// else comes from the parser (unknown command or flag, missing flag).
	var ae *app.Error
	if errors.As(err, &ae) {
		return ae.Code
	}
	return app.ExitUsage
}

func newRoot() *cobra.Command {
	root := &cobra.Command{
		Use:   "solstand",
		Short: "Size stand-alone photovoltaic systems and write the design as an editable workbook",
		Long: `solstand sizes a stand-alone (off-grid) photovoltaic system from a project
document — the site, the appliance list, the equipment on offer — and checks the
design by simulating it hour by hour through many synthetic years of weather.
It writes an .xlsx workbook whose sizing recalculates when the client edits an
input, with the cautions the design triggers.

solstand is a design aid: local electrical codes and a licensed practitioner
decide what is installed.`,
		Version:       app.Version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return usageError{fmt.Errorf("%w (see %s --help)", err, c.CommandPath())}
	})
	root.AddCommand(sizeCmd(), validateCmd(), schemaCmd(), initCmd(), sunCmd(), resourceCmd(), wireCmd(), curvesCmd())
	return root
}

func exactArgs(n int, what string) cobra.PositionalArgs {
	return func(c *cobra.Command, args []string) error {
		if len(args) != n {
			return usageError{fmt.Errorf("%s needs %s (see %s --help)", c.CommandPath(), what, c.CommandPath())}
		}
		return nil
	}
}

type simFlags struct {
	seed    uint64
	years   int
	weather string
	quiet   bool
}

func (s *simFlags) add(c *cobra.Command) {
	c.Flags().Uint64Var(&s.seed, "seed", 0, "seed of the synthetic weather (default: the project's, else 1; the same seed gives the same numbers)")
	c.Flags().IntVar(&s.years, "years", 0, "synthetic years to simulate (default: the project's, else 20)")
	c.Flags().StringVar(&s.weather, "weather", "", "EPW or CSV weather file to use instead of the project's monthly means")
	c.Flags().BoolVarP(&s.quiet, "quiet", "q", false, "no progress output on stderr")
}

func (s *simFlags) seedYears(c *cobra.Command) (*uint64, *int, error) {
	var seed *uint64
	var years *int
	if c.Flags().Changed("seed") {
		seed = &s.seed
	}
	if c.Flags().Changed("years") {
		if s.years < 1 || s.years > 1000 {
			return nil, nil, usageError{fmt.Errorf("--years must be from 1 to 1000, got %d", s.years)}
		}
		years = &s.years
	}
	return seed, years, nil
}

func sizeCmd() *cobra.Command {
	var sf simFlags
	var out string
	var asJSON, hourly bool
	c := &cobra.Command{
		Use:   "size PROJECT.json [-o OUT.xlsx] [--json]",
		Short: "Size the system, simulate it and write the workbook",
		Long: `Size the array, charge controller, battery bank, inverter, cables and fuses for the
worst month, check the design by simulation and write the workbook (-o) and/or
the summary as JSON on stdout (--json). Without either, a short summary is
printed. On failure no output file is created or changed.`,
		Example: "  solstand size examples/clinic.json -o clinic.xlsx\n  solstand size examples/cabin.json --json --years 50",
		Args:    exactArgs(1, "one project file"),
		RunE: func(c *cobra.Command, args []string) error {
			seed, years, err := sf.seedYears(c)
			if err != nil {
				return err
			}
			return app.Size(app.SizeOptions{Project: args[0], Out: out, JSON: asJSON, Seed: seed, Years: years,
				Weather: sf.weather, Hourly: hourly, Quiet: sf.quiet}, os.Stdout, os.Stderr)
		},
	}
	c.Flags().StringVarP(&out, "output", "o", "", "workbook to write (.xlsx)")
	c.Flags().BoolVar(&asJSON, "json", false, "print the summary as JSON on stdout")
	c.Flags().BoolVar(&hourly, "hourly", false, "add the hourly sheet (8760 rows of the first simulated year)")
	sf.add(c)
	return c
}

func curvesCmd() *cobra.Command {
	var sf simFlags
	var asJSON bool
	c := &cobra.Command{
		Use:   "curves PROJECT.json [--json]",
		Short: "Loss-of-load sizing curves: the smallest array for each storage size and reliability target",
		Long: `For storage from 1 to 10 days of autonomy, find by simulation the smallest
array-to-load ratio that meets each loss-of-load target (10 %, 1 %, 0.1 %, and the
project's own target): the isoreliability curves of Egido & Lorenzo (1992). With
prices in the project, the least-cost point of each curve is marked.`,
		Args: exactArgs(1, "one project file"),
		RunE: func(c *cobra.Command, args []string) error {
			seed, years, err := sf.seedYears(c)
			if err != nil {
				return err
			}
			return app.Curves(app.CurvesOptions{Project: args[0], JSON: asJSON, Seed: seed, Years: years, Weather: sf.weather, Quiet: sf.quiet}, os.Stdout, os.Stderr)
		},
	}
	c.Flags().BoolVar(&asJSON, "json", false, "print the curves as JSON on stdout")
	sf.add(c)
	return c
}

func validateCmd() *cobra.Command {
	var show bool
	var weather string
	c := &cobra.Command{
		Use:   "validate PROJECT.json",
		Short: "Check a project document; every problem on stderr, one a line, with its JSON path",
		Args:  exactArgs(1, "one project file"),
		RunE: func(c *cobra.Command, args []string) error {
			return app.Validate(app.ValidateOptions{Project: args[0], ShowDefaults: show, Weather: weather}, os.Stdout, os.Stderr)
		},
	}
	c.Flags().BoolVar(&show, "show-defaults", false, "print the document with every default filled in")
	c.Flags().StringVar(&weather, "weather", "", "weather file that stands in for the monthly means")
	return c
}

func schemaCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "schema",
		Short: "Print the project document's JSON Schema",
		Args:  exactArgs(0, "no arguments"),
		RunE:  func(c *cobra.Command, args []string) error { return app.Schema(os.Stdout) },
	}
}

func initCmd() *cobra.Command {
	var tmpl, out string
	var force bool
	c := &cobra.Command{
		Use:   "init --template NAME -o FILE",
		Short: "Write a starter project (" + strings.Join(examples.Names(), ", ") + ")",
		Args:  exactArgs(0, "no arguments"),
		RunE:  func(c *cobra.Command, args []string) error { return app.Init(tmpl, out, force) },
	}
	c.Flags().StringVar(&tmpl, "template", "", "starter project: "+strings.Join(examples.Names(), ", "))
	c.Flags().StringVarP(&out, "output", "o", "", "file to write")
	c.Flags().BoolVar(&force, "force", false, "replace the file if it exists")
	_ = c.MarkFlagRequired("template")
	_ = c.MarkFlagRequired("output")
	return c
}

func sunCmd() *cobra.Command {
	var o app.SunOptions
	var tilt, az float64
	c := &cobra.Command{
		Use:   "sun --lat DEG --lon DEG --at RFC3339 [--solar-time] [--tilt DEG --azimuth DEG] [--path] [--json]",
		Short: "Sun position at one instant (and incidence on a surface), or the sun-path table",
		Example: "  solstand sun --lat 43 --lon -89.4 --at 2026-02-13T10:30:00-06:00 --solar-time --tilt 45 --azimuth 195 --json\n" +
			"  solstand sun --lat -13.2 --lon 33.8 --path",
		Args: exactArgs(0, "no arguments"),
		RunE: func(c *cobra.Command, args []string) error {
			if c.Flags().Changed("tilt") {
				o.TiltDeg = &tilt
			}
			if c.Flags().Changed("azimuth") {
				o.AzimuthDeg = &az
			}
			return app.Sun(o, os.Stdout)
		},
	}
	c.Flags().Float64Var(&o.LatDeg, "lat", math.NaN(), "latitude in degrees, north positive")
	c.Flags().Float64Var(&o.LonDeg, "lon", math.NaN(), "longitude in degrees, east positive")
	c.Flags().StringVar(&o.At, "at", "", "instant, RFC 3339 with an offset (2026-02-13T09:30:00-06:00)")
	c.Flags().BoolVar(&o.SolarTime, "solar-time", false, "read the clock reading of --at as local apparent solar time (its offset is ignored)")
	c.Flags().Float64Var(&tilt, "tilt", 0, "surface tilt from horizontal in degrees")
	c.Flags().Float64Var(&az, "azimuth", 0, "surface azimuth in degrees clockwise from true north (180 = south)")
	c.Flags().BoolVar(&o.Path, "path", false, "the sun-path table: elevation and azimuth by solar hour on the 21st of each month")
	c.Flags().BoolVar(&o.JSON, "json", false, "JSON on stdout")
	_ = c.MarkFlagRequired("lat")
	_ = c.MarkFlagRequired("lon")
	return c
}

func resourceCmd() *cobra.Command {
	var o app.ResourceOptions
	var az float64
	c := &cobra.Command{
		Use:     "resource --lat DEG --lon DEG (--ghi 12 VALUES | --weather FILE) --tilt DEG [--azimuth DEG] [--albedo F] [--json]",
		Short:   "Monthly solar resource table for a site and a plane",
		Example: "  solstand resource --lat -13.2 --lon 33.8 --ghi 5.6,5.6,5.7,5.6,5.3,4.9,5.1,5.8,6.5,6.8,6.3,5.6 --tilt 20 --azimuth 0 --json",
		Args:    exactArgs(0, "no arguments"),
		RunE: func(c *cobra.Command, args []string) error {
			if c.Flags().Changed("azimuth") {
				o.AzimuthDeg = &az
			}
			return app.Resource(o, os.Stdout, os.Stderr)
		},
	}
	c.Flags().Float64Var(&o.LatDeg, "lat", math.NaN(), "latitude in degrees, north positive")
	c.Flags().Float64Var(&o.LonDeg, "lon", math.NaN(), "longitude in degrees, east positive")
	c.Flags().StringVar(&o.GHI, "ghi", "", "12 comma-separated monthly means of daily horizontal irradiation, kWh/m²/day")
	c.Flags().StringVar(&o.Weather, "weather", "", "EPW or CSV weather file instead of --ghi")
	c.Flags().Float64Var(&o.TiltDeg, "tilt", 0, "plane tilt from horizontal in degrees")
	c.Flags().Float64Var(&az, "azimuth", 0, "plane azimuth in degrees clockwise from true north (default: towards the equator)")
	c.Flags().Float64Var(&o.Albedo, "albedo", 0.2, "ground reflectance 0..1")
	c.Flags().BoolVar(&o.JSON, "json", false, "JSON on stdout")
	return c
}

func wireCmd() *cobra.Command {
	var o app.WireOptions
	c := &cobra.Command{
		Use:     "wire --current A --length-m M --voltage V --max-drop-pct P --standard iec|nec [--json]",
		Short:   "Smallest conductor that keeps the voltage drop within the limit and carries the current",
		Example: "  solstand wire --current 20 --length-m 10 --voltage 12 --max-drop-pct 3 --standard iec --json",
		Args:    exactArgs(0, "no arguments"),
		RunE:    func(c *cobra.Command, args []string) error { return app.Wire(o, os.Stdout) },
	}
	c.Flags().Float64Var(&o.CurrentA, "current", 0, "design current in A")
	c.Flags().Float64Var(&o.LengthM, "length-m", 0, "one-way length in m")
	c.Flags().Float64Var(&o.VoltageV, "voltage", 0, "circuit voltage in V")
	c.Flags().Float64Var(&o.MaxDropPct, "max-drop-pct", 3, "largest voltage drop in % of the circuit voltage")
	c.Flags().StringVar(&o.Standard, "standard", "iec", "iec (mm², IEC 60228) or nec (AWG/kcmil, NEC Chapter 9 Table 8)")
	c.Flags().IntVar(&o.Class, "class", 5, "IEC 60228 conductor class: 2 (stranded) or 5 (flexible)")
	c.Flags().Float64Var(&o.ConductorTempC, "conductor-temp-c", 0, "conductor temperature for the resistance in °C (default: the table's)")
	c.Flags().BoolVar(&o.JSON, "json", false, "JSON on stdout")
	for _, f := range []string{"current", "length-m", "voltage"} {
		_ = c.MarkFlagRequired(f)
	}
	return c
}
