package wiring

import (
	"math"
	"testing"
)

func FuzzParseStandard(f *testing.F) {
	for _, s := range []string{"iec", "NEC", " nec ", "", "x", "iec\x00"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		std, err := ParseStandard(s)
		if err == nil && std != IEC && std != NEC {
			t.Fatalf("ParseStandard(%q) = %q without error", s, std)
		}
		if err != nil && std != "" {
			t.Fatalf("ParseStandard(%q) = %q with error", s, std)
		}
	})
}

// FuzzSelect checks that Select never panics and that every choice it
// returns meets its own limits.
func FuzzSelect(f *testing.F) {
	f.Add(20.0, 0.0, 10.0, 12.0, 3.0, true, 2, 0.0, 0)
	f.Add(400.0, 0.0, 3.0, 12.0, 2.0, false, 0, 90.0, 2)
	f.Add(math.NaN(), -1.0, 0.0, 0.0, 0.0, true, 5, math.Inf(1), -1)
	f.Fuzz(func(t *testing.T, current, dropCurrent, length, volt, pct float64, iec bool, class int, tempC float64, runs int) {
		std := NEC
		if iec {
			std = IEC
		}
		c := Circuit{CurrentA: current, DropCurrentA: dropCurrent, OneWayLengthM: length, VoltageV: volt, MaxDropPct: pct,
			Standard: std, Class: class, ConductorTempC: tempC, ParallelRuns: runs % 8}
		ch, err := Select(c)
		if err != nil {
			return
		}
		if ch.DropPct > pct*(1+1e-12) || ch.AmpacityA < current {
			t.Fatalf("choice %+v breaks the limits of %+v", ch, c)
		}
	})
}
