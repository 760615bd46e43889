package wiring

import (
	"fmt"
	"strings"
)

// Standard names the family of conductor sizes and protective-device ratings
// a project uses.
type Standard string

// The two standards of the project document.
const (
	// IEC selects metric sizes (IEC 60228), IEC 60364-5-52 ampacities and
	// IEC 60269 fuse ratings.
	IEC Standard = "iec"
	// NEC selects AWG/kcmil sizes (NEC Chapter 9 Table 8), NEC 310.16
	// ampacities and NEC 240.6(A) ratings.
	NEC Standard = "nec"
)

// ParseStandard reads a standard name, case-insensitively and with
// surrounding space ignored: "iec" or "nec".
func ParseStandard(s string) (Standard, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "iec":
		return IEC, nil
	case "nec":
		return NEC, nil
	}
	return "", fmt.Errorf("wiring: unknown standard %q (want iec or nec)", s)
}

// ConductorSize is one copper conductor size with its DC resistance at the
// table temperature and a simplified ampacity.
type ConductorSize struct {
	// Label is the size as the trade writes it: "16 mm²", "4 AWG", "2/0 AWG",
	// "250 kcmil".
	Label string `json:"label"`
	// AreaMM2 is the cross-section in mm² (nominal for IEC sizes; the NEC
	// Chapter 9 Table 8 area for AWG/kcmil sizes).
	AreaMM2 float64 `json:"area_mm2"`
	// ResistanceOhmPerKm is the DC resistance of one conductor at TableTempC.
	ResistanceOhmPerKm float64 `json:"resistance_ohm_per_km"`
	// TableTempC is the conductor temperature of ResistanceOhmPerKm: 20 °C
	// for IEC 60228, 75 °C for NEC Chapter 9 Table 8.
	TableTempC float64 `json:"table_temp_c"`
	// AmpacityA is a simplified current-carrying capacity of the conductor
	// (see Sizes for the source). The local code's tables, the installation
	// method and derating govern.
	AmpacityA float64 `json:"ampacity_a"`
}

// ohmPerKftToKm converts Ω per 1000 ft to Ω per km (1000 ft = 304.8 m).
const ohmPerKftToKm = 1 / 0.3048

type iecRow struct {
	label          string
	areaMM2        float64
	class2, class5 float64 // Ω/km at 20 °C
	ampacityA      float64
}

// iecTable: resistances are IEC 60228:2004 Table 2 (class 2, plain copper)
// and Table 3 (class 5, plain copper), maximum DC resistance at 20 °C in
// Ω/km. Class 2 values from 1.5 to 95 mm² are the ones listed in the
// project's SOURCES.md; class 2 above 95 mm² and all class 5 values are
// from memory of the same tables.
//
// Ampacities are IEC 60364-5-52:2009 Table B.52.2, reference method C
// (clipped direct to a wall), PVC insulation, two loaded copper conductors,
// 30 °C ambient (from memory). The same values are used for class 5
// conductors, which is an approximation.
var iecTable = []iecRow{
	{"1.5 mm²", 1.5, 12.1, 13.3, 19.5},
	{"2.5 mm²", 2.5, 7.41, 7.98, 27},
	{"4 mm²", 4, 4.61, 4.95, 36},
	{"6 mm²", 6, 3.08, 3.30, 46},
	{"10 mm²", 10, 1.83, 1.91, 63},
	{"16 mm²", 16, 1.15, 1.21, 85},
	{"25 mm²", 25, 0.727, 0.780, 112},
	{"35 mm²", 35, 0.524, 0.554, 138},
	{"50 mm²", 50, 0.387, 0.386, 168},
	{"70 mm²", 70, 0.268, 0.272, 213},
	{"95 mm²", 95, 0.193, 0.206, 258},
	{"120 mm²", 120, 0.153, 0.161, 299},
	{"150 mm²", 150, 0.124, 0.129, 344},
	{"185 mm²", 185, 0.0991, 0.106, 392},
	{"240 mm²", 240, 0.0754, 0.0801, 461},
	{"300 mm²", 300, 0.0601, 0.0641, 530},
}

type necRow struct {
	label     string
	areaMM2   float64
	ohmPerKft float64 // stranded uncoated copper at 75 °C
	ampacityA float64
	// maxProtectionA is the small-conductor limit of NEC 240.4(D) for
	// copper (0 = none).
	maxProtectionA float64
}

// necTable: areas and resistances are NEC Chapter 9 Table 8, stranded
// uncoated copper, DC resistance at 75 °C in Ω/kft. The values for 14, 12,
// 10, 8, 6, 4, 2 AWG, 1/0, 2/0 and 4/0 are the ones listed in the project's
// SOURCES.md; 3 AWG, 1 AWG, 3/0 and the kcmil sizes, and all areas, are from
// memory of the same table.
//
// Ampacities are NEC Table 310.16, 75 °C column, copper, not more than three
// current-carrying conductors, 30 °C ambient (from memory). Small-conductor
// protection limits are NEC 240.4(D) (from memory).
var necTable = []necRow{
	{"14 AWG", 2.08, 3.14, 20, 15},
	{"12 AWG", 3.31, 1.98, 25, 20},
	{"10 AWG", 5.261, 1.24, 35, 30},
	{"8 AWG", 8.367, 0.778, 50, 0},
	{"6 AWG", 13.30, 0.491, 65, 0},
	{"4 AWG", 21.15, 0.308, 85, 0},
	{"3 AWG", 26.67, 0.245, 100, 0},
	{"2 AWG", 33.62, 0.194, 115, 0},
	{"1 AWG", 42.41, 0.154, 130, 0},
	{"1/0 AWG", 53.49, 0.122, 150, 0},
	{"2/0 AWG", 67.43, 0.0967, 175, 0},
	{"3/0 AWG", 85.01, 0.0766, 200, 0},
	{"4/0 AWG", 107.2, 0.0608, 230, 0},
	{"250 kcmil", 127, 0.0515, 255, 0},
	{"300 kcmil", 152, 0.0429, 285, 0},
	{"350 kcmil", 177, 0.0367, 310, 0},
	{"400 kcmil", 203, 0.0321, 335, 0},
	{"500 kcmil", 253, 0.0258, 380, 0},
	{"600 kcmil", 304, 0.0214, 420, 0},
	{"700 kcmil", 355, 0.0184, 460, 0},
	{"750 kcmil", 380, 0.0171, 475, 0},
	{"800 kcmil", 405, 0.0161, 490, 0},
	{"900 kcmil", 456, 0.0143, 520, 0},
	{"1000 kcmil", 507, 0.0129, 545, 0},
}

// Sizes lists the copper conductor sizes of a standard, smallest first.
//
// IEC: IEC 60228:2004 Table 2 (class 2, stranded) or Table 3 (class 5,
// flexible), plain copper, maximum DC resistance at 20 °C; ampacity from
// IEC 60364-5-52 Table B.52.2, reference method C, PVC, two loaded
// conductors (from memory). NEC: NEC Chapter 9 Table 8, stranded uncoated
// copper at 75 °C, converted from Ω/kft to Ω/km; ampacity from NEC Table
// 310.16, 75 °C column (from memory); class is ignored.
//
// The ampacities are a simplified table: the local code's tables, the
// installation method, grouping and ambient derating govern.
func Sizes(std Standard, class int) ([]ConductorSize, error) {
	switch std {
	case IEC:
		if class != 2 && class != 5 {
			return nil, fmt.Errorf("wiring: IEC 60228 class %d not supported (want 2 or 5)", class)
		}
		out := make([]ConductorSize, len(iecTable))
		for i, r := range iecTable {
			res := r.class2
			if class == 5 {
				res = r.class5
			}
			out[i] = ConductorSize{Label: r.label, AreaMM2: r.areaMM2, ResistanceOhmPerKm: res, TableTempC: 20, AmpacityA: r.ampacityA}
		}
		return out, nil
	case NEC:
		out := make([]ConductorSize, len(necTable))
		for i, r := range necTable {
			out[i] = ConductorSize{Label: r.label, AreaMM2: r.areaMM2, ResistanceOhmPerKm: r.ohmPerKft * ohmPerKftToKm, TableTempC: 75, AmpacityA: r.ampacityA}
		}
		return out, nil
	}
	return nil, fmt.Errorf("wiring: unknown standard %q (want iec or nec)", std)
}

// ProtectionLimitA is the largest overcurrent-device rating a conductor may
// have: its ampacity, or for 14, 12 and 10 AWG copper the lower limits of
// NEC 240.4(D) (15, 20 and 30 A; from memory). IEC sizes return the
// ampacity. The result is for one conductor; parallel runs multiply it.
func ProtectionLimitA(size ConductorSize, std Standard) float64 {
	if std == NEC {
		for _, r := range necTable {
			if r.label == size.Label && r.maxProtectionA > 0 && r.maxProtectionA < size.AmpacityA {
				return r.maxProtectionA
			}
		}
	}
	return size.AmpacityA
}

// Standard overcurrent-device ratings.
var (
	// necRatingsA: NEC 240.6(A) standard ampere ratings of fuses and
	// inverse-time breakers, with the additional standard fuse ratings 1, 3,
	// 6, 10 and 601 A of the same section (from memory).
	necRatingsA = []float64{1, 3, 6, 10, 15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350, 400, 450, 500, 600, 601, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000}
	// iecRatingsA: IEC 60269-1 §5.3.1 preferred rated currents of fuse-links
	// (from memory).
	iecRatingsA = []float64{2, 4, 6, 8, 10, 12, 16, 20, 25, 32, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250}
)

// StandardRatingsA lists the standard overcurrent-device ratings of a
// standard in A, smallest first: NEC 240.6(A) (with its additional fuse
// ratings) or the IEC 60269-1 preferred fuse-link ratings. An unknown
// standard gives nil.
func StandardRatingsA(std Standard) []float64 {
	switch std {
	case NEC:
		return append([]float64(nil), necRatingsA...)
	case IEC:
		return append([]float64(nil), iecRatingsA...)
	}
	return nil
}
