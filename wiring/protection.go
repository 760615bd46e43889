package wiring

import (
	"fmt"
	"math"
)

// ContinuousFactor is the 1.25 factor of NEC 690.8 (and of NEC 210.19(A)
// and 215.2(A) for continuous loads): a current expected for three hours or more is
// multiplied by 1.25 before conductors and protective devices are chosen.
const ContinuousFactor = 1.25

// StringFuseFactor is 1.25 × 1.25 = 1.5625: the smallest string fuse rating
// as a multiple of module Isc, NEC 690.8(A)(1) (maximum current 1.25 · Isc)
// and 690.9(B) (device at 1.25 of the maximum current). IEC 62548 asks for
// at least 1.5 · Isc (from memory), which 1.5625 also meets.
const StringFuseFactor = ContinuousFactor * ContinuousFactor

// SelectProtection picks the smallest standard rating (StandardRatingsA) at
// least designA and at most conductorAmpacityA, so that the device carries
// the design current and protects the conductor. NEC 240.4(B) lets a device
// go to the next standard rating above an ampacity that matches none; that
// allowance is deliberately not used here. The error says when no standard
// rating fits between the two.
func SelectProtection(designA, conductorAmpacityA float64, std Standard) (ratingA float64, err error) {
	if !finite(designA) || designA <= 0 {
		return 0, fmt.Errorf("wiring: protection: design current %v A must be positive", designA)
	}
	if !finite(conductorAmpacityA) || conductorAmpacityA <= 0 {
		return 0, fmt.Errorf("wiring: protection: conductor ampacity %v A must be positive", conductorAmpacityA)
	}
	ratings := StandardRatingsA(std)
	if ratings == nil {
		return 0, fmt.Errorf("wiring: protection: unknown standard %q (want iec or nec)", std)
	}
	for _, r := range ratings {
		if r >= designA {
			if r > conductorAmpacityA {
				return 0, fmt.Errorf("wiring: protection: the smallest %s rating at or above %.4g A is %g A, above the conductor's %.4g A: use a larger conductor", std, designA, r, conductorAmpacityA)
			}
			return r, nil
		}
	}
	return 0, fmt.Errorf("wiring: protection: %.4g A is above every %s standard rating", designA, std)
}

// StringFusesRequired reports whether each PV string needs its own fuse:
// with three or more strings in parallel, a faulted string can be fed by the
// others with more than its modules' series fuse rating (common practice;
// NEC 690.9(A)).
func StringFusesRequired(strings int) bool {
	return strings >= 3
}

// StringFusesRequiredByCurrent applies the current form of the same rule:
// fuses are needed when the reverse current the other strings can feed into
// a faulted one, (N − 1) · 1.25 · Isc, exceeds the module's maximum series
// fuse rating (NEC 690.9(A) exception, with the 1.25 of NEC 690.8(A)(1);
// IEC 62548 states the same test; from memory).
func StringFusesRequiredByCurrent(strings int, iscA, maxSeriesFuseA float64) bool {
	if strings < 2 {
		return false
	}
	return float64(strings-1)*ContinuousFactor*iscA > maxSeriesFuseA
}

// StringFuseA picks a string fuse: the smallest standard rating of at least
// 1.5625 · Isc (1.25 × 1.25, NEC 690.8(A)(1) and 690.9(B)) that does not
// exceed the module's maximum series fuse rating. The error says when no
// standard rating lies between the two.
func StringFuseA(iscA, maxSeriesFuseA float64, std Standard) (float64, error) {
	if !finite(iscA) || iscA <= 0 {
		return 0, fmt.Errorf("wiring: string fuse: module Isc %v A must be positive", iscA)
	}
	if !finite(maxSeriesFuseA) || maxSeriesFuseA <= 0 {
		return 0, fmt.Errorf("wiring: string fuse: module maximum series fuse %v A must be positive", maxSeriesFuseA)
	}
	minA := StringFuseFactor * iscA
	r, err := SelectProtection(minA, maxSeriesFuseA, std)
	if err != nil {
		return 0, fmt.Errorf("wiring: string fuse for Isc %.4g A (at least %.4g A, at most the module's %.4g A): %w", iscA, minA, maxSeriesFuseA, err)
	}
	return r, nil
}

// PVCircuitCurrentA gives the currents of a PV circuit of parallel strings
// by NEC 690.8(A)(1) and (B): the maximum current 1.25 · Isc · strings, and
// the conductor design current 1.25 times that.
func PVCircuitCurrentA(iscA float64, strings int) (maxCurrentA, conductorDesignA float64) {
	maxCurrentA = ContinuousFactor * iscA * float64(strings)
	return maxCurrentA, ContinuousFactor * maxCurrentA
}

// InverterBatteryCurrentA is the design current of the battery-to-inverter
// circuit: the inverter's continuous output power drawn at the battery's
// low-voltage disconnect through the inverter's efficiency, times the 1.25
// continuous factor: 1.25 · P / (V_LVD · η). NEC 690.8(A) takes the
// stand-alone inverter input current at rated power and the lowest input
// voltage as the maximum current, and 690.8(B) the 1.25 for conductors
// (2017 edition numbering, from memory). Non-positive or non-finite inputs,
// or an efficiency above 1, give NaN.
func InverterBatteryCurrentA(continuousW, lowVoltageDisconnectV, efficiency float64) float64 {
	if !finite(continuousW) || !finite(lowVoltageDisconnectV) || !finite(efficiency) ||
		continuousW <= 0 || lowVoltageDisconnectV <= 0 || efficiency <= 0 || efficiency > 1 {
		return math.NaN()
	}
	return ContinuousFactor * continuousW / (lowVoltageDisconnectV * efficiency)
}

// BankResistanceOhm is the internal resistance of a bank of equal blocks:
// blocksSeries blocks in each string, strings in parallel:
// R = R_block · series / strings. Non-positive inputs give NaN.
func BankResistanceOhm(blockOhm float64, blocksSeries, strings int) float64 {
	if !finite(blockOhm) || blockOhm <= 0 || blocksSeries <= 0 || strings <= 0 {
		return math.NaN()
	}
	return blockOhm * float64(blocksSeries) / float64(strings)
}

// BatteryShortCircuitA estimates the prospective short-circuit current of a
// battery bank at its terminals by Ohm's law, I = V / R, from the bank
// voltage and its total internal resistance. Cable and connection
// resistance are left out, so the figure is an upper estimate; IEC 61660-1
// gives the full method. Use the open-circuit voltage of the charged bank
// for the highest figure. Non-positive or non-finite inputs give NaN.
func BatteryShortCircuitA(seriesV, totalInternalResistanceOhm float64) float64 {
	if !finite(seriesV) || !finite(totalInternalResistanceOhm) || seriesV <= 0 || totalInternalResistanceOhm <= 0 {
		return math.NaN()
	}
	return seriesV / totalInternalResistanceOhm
}
