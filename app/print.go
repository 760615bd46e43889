package app

import (
	"fmt"
	"io"

	"solstand/report"
)

// PrintSummary writes the terminal summary of a design.
func PrintSummary(w io.Writer, r *report.Report) {
	p := func(format string, a ...any) { fmt.Fprintf(w, format+"\n", a...) }
	p("%s — %s", r.Project, r.Site.Name)
	p("Design month: %s (%.0f Wh/day DC side, %.2f kWh/m²/day on the array)", report.MonthName(r.DesignMonth), r.Demand.DailyWh[r.DesignMonth-1], r.Resource.POAKWhM2Day[r.DesignMonth-1])
	p("Array:      %d × %.0f W = %.0f W (method asks %.0f W), %d in series × %d strings, tilt %.0f°, azimuth %.0f°",
		r.Array.Modules, r.Array.Module.PmaxW, r.Array.RatedW, r.Array.RequiredW, r.Array.ModulesSeries, r.Array.Strings, r.Array.TiltDeg, r.Array.AzimuthDeg)
	p("Battery:    %s, %d × %g V %g Ah blocks (%d in series × %d strings) = %.0f Ah at %g V, %.0f Wh usable (method asks %.0f Ah)",
		r.Battery.Chemistry, r.Battery.Blocks, r.Battery.BlockV, r.Battery.BlockAh, r.Battery.BlocksSeries, r.Battery.Strings, r.Battery.CapacityAh, r.Battery.NominalV, r.Battery.UsableWh, r.Battery.RequiredAh)
	p("Controller: %s, %d × %.0f A", r.Controller.Kind, r.Controller.Units, r.Controller.RatedA)
	if r.Inverter != nil {
		p("Inverter:   %.0f W continuous, %.0f W surge", r.Inverter.ContinuousW, r.Inverter.SurgeW)
	}
	s := r.Simulation
	p("Simulation: %d synthetic years (seed %d): loss of load %.3g %%, %d days with unmet load, lowest state of charge %.0f %%",
		s.Years, s.Seed, 100*s.LOLP, s.UnmetDays, 100*s.MinSOC)
	if r.Battery.ExpectedLifeYears > 0 {
		p("Battery life: about %.1f years", r.Battery.ExpectedLifeYears)
	}
	if r.Lifecycle != nil {
		p("Lifecycle:  net present cost %.0f %s over %.0f years, %.3f %s/kWh", r.Lifecycle.NetPresentCost, r.Lifecycle.Currency, r.Lifecycle.AnalysisYears, r.Lifecycle.LevelisedCostPerKWh, r.Lifecycle.Currency)
	}
	n := 0
	for _, c := range r.Cautions {
		if c.Severity == "danger" || c.Severity == "warning" {
			n++
		}
	}
	p("Cautions:   %d in all, %d warnings or dangers (see the workbook's Cautions sheet or --json)", len(r.Cautions), n)
	for _, c := range r.Cautions {
		if c.Severity == "danger" {
			p("  DANGER %s: %s", c.Code, c.Message)
		}
	}
	p("%s", r.CodesNote)
}
