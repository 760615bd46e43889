// Package wiring sizes the copper conductors and the overcurrent protection
// of a stand-alone PV system: the smallest conductor that keeps the voltage
// drop within its limit and carries the current, fuses and breakers from the
// standard lists of ratings, string fuses, the battery fuse with its
// interrupting rating, and the safety cautions of the DC side.
//
// Ampacities here are simplified tables; the local electrical code's tables,
// the installation method and derating govern.
package wiring

import (
	"errors"
	"fmt"
	"math"
)

// CopperAlphaPerK is the temperature coefficient of resistance of annealed
// copper at 20 °C, 0.00393 /K: IEC 60287-1-1 Table 1 gives 3.93 × 10⁻³ /K,
// and the IEC 60228 Annex B correction factor 254.5/(234.5 + t) is the same
// line (1/254.5 = 0.003929 /K) (both from memory).
const CopperAlphaPerK = 0.00393

// ResistanceAtTempOhmPerKm corrects a copper resistance at 20 °C to another
// conductor temperature: R_t = R_20 · (1 + α (t − 20)) with α = 0.00393 /K
// (IEC 60287-1-1 Table 1; IEC 60228 Annex B).
func ResistanceAtTempOhmPerKm(r20 float64, tempC float64) float64 {
	return r20 * (1 + CopperAlphaPerK*(tempC-20))
}

// ResistanceBetweenTempsOhmPerKm corrects a copper resistance known at
// fromC to toC with the same linear law referred to 20 °C (IEC 60287-1-1
// Table 1). From 75 °C it reproduces the NEC Chapter 9 Table 8 note
// R2 = R1 [1 + 0.00323 (T2 − 75)], since 0.00393/(1 + 0.00393 · 55) = 0.00323.
func ResistanceBetweenTempsOhmPerKm(r, fromC, toC float64) float64 {
	return r * (1 + CopperAlphaPerK*(toC-20)) / (1 + CopperAlphaPerK*(fromC-20))
}

// DropV is the voltage drop of a two-wire DC circuit: V = 2 · L · I · R / 1000
// with L the one-way length in m, I the current in A and R the resistance of
// one conductor in Ω/km (Ohm's law over the out-and-back conductor length).
func DropV(oneWayLengthM, currentA, resistanceOhmPerKm float64) float64 {
	return 2 * oneWayLengthM * currentA * resistanceOhmPerKm / 1000
}

// Circuit is one two-wire DC circuit to size.
type Circuit struct {
	// Name says which circuit this is ("battery → inverter").
	Name string `json:"name"`
	// CurrentA is the design current the conductor must carry (its ampacity
	// must be at least this), with any 1.25 factors already applied.
	CurrentA float64 `json:"current_a"`
	// DropCurrentA is the current the voltage drop is computed at (the
	// operating current); 0 means CurrentA.
	DropCurrentA float64 `json:"drop_current_a,omitempty"`
	// OneWayLengthM is the route length from source to load in m.
	OneWayLengthM float64 `json:"one_way_length_m"`
	// VoltageV is the circuit voltage the drop is a percentage of.
	VoltageV float64 `json:"voltage_v"`
	// MaxDropPct is the largest two-way voltage drop allowed, in % of VoltageV.
	MaxDropPct float64 `json:"max_drop_pct"`
	// Standard picks the size table.
	Standard Standard `json:"standard"`
	// Class is the IEC 60228 conductor class, 2 or 5 (ignored for NEC).
	Class int `json:"class,omitempty"`
	// ConductorTempC is the conductor temperature the drop is computed at;
	// 0 means the table temperature (20 °C IEC, 75 °C NEC).
	ConductorTempC float64 `json:"conductor_temp_c,omitempty"`
	// ParallelRuns is the number of conductors in parallel per pole
	// (0 means 1). Resistance divides and ampacity multiplies by it, with
	// no grouping derating.
	ParallelRuns int `json:"parallel_runs,omitempty"`
	// Count is the number of identical circuits of this kind (one per
	// string, say), for the cable list; 0 means 1. It does not change the
	// choice.
	Count int `json:"count,omitempty"`
}

// What decided a conductor choice (Choice.LimitedBy).
const (
	LimitedByDrop       = "voltage drop"
	LimitedByAmpacity   = "ampacity"
	LimitedBySmallest   = "smallest listed size"
	LimitedByProtection = "protection rating"
)

// Choice is the conductor chosen for a circuit.
type Choice struct {
	Circuit Circuit       `json:"circuit"`
	Size    ConductorSize `json:"size"`
	// Runs is the number of conductors in parallel per pole (at least 1).
	Runs int `json:"runs"`
	// ResistanceOhmPerKm is the resistance of one conductor at the
	// conductor temperature used.
	ResistanceOhmPerKm float64 `json:"resistance_ohm_per_km"`
	// AmpacityA is the simplified ampacity of all runs together.
	AmpacityA float64 `json:"ampacity_a"`
	DropV     float64 `json:"drop_v"`
	DropPct   float64 `json:"drop_pct"`
	// LimitedBy says which requirement set the size: LimitedByDrop,
	// LimitedByAmpacity (also when both are first met at the same size),
	// LimitedBySmallest (both met by the smallest listed size) or
	// LimitedByProtection (upsized so that a standard protective
	// rating fits; DesignSystem only).
	LimitedBy string `json:"limited_by"`
}

// ErrNoSize is wrapped by Select when even the largest listed size fails.
var ErrNoSize = errors.New("no listed conductor size meets the limits")

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func validate(c Circuit) error {
	switch {
	case !finite(c.CurrentA) || c.CurrentA <= 0:
		return fmt.Errorf("current %v A: must be positive", c.CurrentA)
	case !finite(c.DropCurrentA) || c.DropCurrentA < 0:
		return fmt.Errorf("drop current %v A: must not be negative", c.DropCurrentA)
	case !finite(c.OneWayLengthM) || c.OneWayLengthM <= 0:
		return fmt.Errorf("one-way length %v m: must be positive", c.OneWayLengthM)
	case !finite(c.VoltageV) || c.VoltageV <= 0:
		return fmt.Errorf("voltage %v V: must be positive", c.VoltageV)
	case !finite(c.MaxDropPct) || c.MaxDropPct <= 0 || c.MaxDropPct >= 100:
		return fmt.Errorf("maximum drop %v %%: must lie between 0 and 100", c.MaxDropPct)
	case !finite(c.ConductorTempC) || c.ConductorTempC < -60 || c.ConductorTempC > 250:
		return fmt.Errorf("conductor temperature %v °C: outside −60..250", c.ConductorTempC)
	case c.ParallelRuns < 0:
		return fmt.Errorf("parallel runs %d: must not be negative", c.ParallelRuns)
	case c.Count < 0:
		return fmt.Errorf("count %d: must not be negative", c.Count)
	}
	return nil
}

// Select picks the smallest conductor whose two-way voltage drop
// (DropV: 2 · L · I · R / 1000, over the parallel runs) stays within
// MaxDropPct and whose simplified ampacity carries CurrentA. When even the
// largest listed size fails, the error wraps ErrNoSize and says what to do:
// parallel runs, a shorter run or a higher system voltage.
func Select(c Circuit) (Choice, error) {
	return selectFrom(c, 0)
}

// selectFrom is Select restricted to sizes of at least minAreaMM2.
func selectFrom(c Circuit, minAreaMM2 float64) (Choice, error) {
	name := c.Name
	if name == "" {
		name = "circuit"
	}
	if err := validate(c); err != nil {
		return Choice{}, fmt.Errorf("wiring: %s: %w", name, err)
	}
	sizes, err := Sizes(c.Standard, c.Class)
	if err != nil {
		return Choice{}, fmt.Errorf("wiring: %s: %w", name, err)
	}
	runs := c.ParallelRuns
	if runs == 0 {
		runs = 1
	}
	dropI := c.DropCurrentA
	if dropI == 0 {
		dropI = c.CurrentA
	}
	maxDropV := c.VoltageV * c.MaxDropPct / 100
	iDrop, iAmp := -1, -1
	for i, s := range sizes {
		r := s.ResistanceOhmPerKm
		if c.ConductorTempC != 0 {
			r = ResistanceBetweenTempsOhmPerKm(r, s.TableTempC, c.ConductorTempC)
		}
		if iDrop < 0 && DropV(c.OneWayLengthM, dropI, r)/float64(runs) <= maxDropV {
			iDrop = i
		}
		if iAmp < 0 && s.AmpacityA*float64(runs) >= c.CurrentA {
			iAmp = i
		}
	}
	if iDrop < 0 || iAmp < 0 {
		why := "the voltage drop"
		if iAmp < 0 {
			why = "the current"
			if iDrop < 0 {
				why = "the voltage drop and the current"
			}
		}
		return Choice{}, fmt.Errorf("wiring: %s: %w (%s; largest %s, %d run(s)): use parallel runs, a shorter run or a higher system voltage", name, ErrNoSize, why, sizes[len(sizes)-1].Label, runs)
	}
	idx := max(iDrop, iAmp)
	limited := LimitedByAmpacity
	switch {
	case iDrop > iAmp:
		limited = LimitedByDrop
	case idx == 0:
		limited = LimitedBySmallest
	}
	for idx < len(sizes) && sizes[idx].AreaMM2 < minAreaMM2 {
		idx++
		limited = LimitedByProtection
	}
	if idx == len(sizes) {
		return Choice{}, fmt.Errorf("wiring: %s: %w (no protective rating fits; largest %s, %d run(s)): use parallel runs", name, ErrNoSize, sizes[len(sizes)-1].Label, runs)
	}
	s := sizes[idx]
	r := s.ResistanceOhmPerKm
	if c.ConductorTempC != 0 {
		r = ResistanceBetweenTempsOhmPerKm(r, s.TableTempC, c.ConductorTempC)
	}
	d := DropV(c.OneWayLengthM, dropI, r) / float64(runs)
	return Choice{
		Circuit:            c,
		Size:               s,
		Runs:               runs,
		ResistanceOhmPerKm: r,
		AmpacityA:          s.AmpacityA * float64(runs),
		DropV:              d,
		DropPct:            100 * d / c.VoltageV,
		LimitedBy:          limited,
	}, nil
}
