package array

import (
	"fmt"
	"math"
)

// STC conditions of IEC 60904-3: 1000 W/m² irradiance, 25 °C cell, AM1.5.
const (
	STCIrradianceWM2 = 1000.0
	STCCellTempC     = 25.0
)

// Module is a photovoltaic module from its datasheet. The electrical values
// are at STC (IEC 60904-3: 1000 W/m², 25 °C cell, AM1.5). Temperature
// coefficients are in percent per kelvin of the STC value (e.g. −0.40 for
// power, −0.30 for Voc, +0.05 for Isc). NOCTC is the nominal operating cell
// temperature (IEC 61215 conditions: 800 W/m², 20 °C air, 1 m/s wind).
type Module struct {
	PmaxW, VocV, IscA, VmpV, ImpA                                  float64
	TempCoeffPmaxPctPerC, TempCoeffVocPctPerC, TempCoeffIscPctPerC float64
	NOCTC                                                          float64
	MaxSeriesFuseA, MaxSystemV                                     float64
}

// Validate checks that the datasheet values are physically consistent.
func (m Module) Validate() error {
	pos := []struct {
		name string
		v    float64
	}{{"pmax_w", m.PmaxW}, {"voc_v", m.VocV}, {"isc_a", m.IscA}, {"vmp_v", m.VmpV}, {"imp_a", m.ImpA}, {"noct_c", m.NOCTC}}
	for _, p := range pos {
		if !(p.v > 0) || math.IsInf(p.v, 0) {
			return fmt.Errorf("module: %s %g must be positive", p.name, p.v)
		}
	}
	if m.VmpV >= m.VocV {
		return fmt.Errorf("module: vmp_v %g must be below voc_v %g", m.VmpV, m.VocV)
	}
	if m.ImpA >= m.IscA {
		return fmt.Errorf("module: imp_a %g must be below isc_a %g", m.ImpA, m.IscA)
	}
	if m.VmpV*m.ImpA > m.PmaxW*1.05 || m.VmpV*m.ImpA < m.PmaxW*0.95 {
		return fmt.Errorf("module: vmp_v × imp_a = %g W differs from pmax_w %g W by more than 5 %%", m.VmpV*m.ImpA, m.PmaxW)
	}
	for _, c := range []struct {
		name string
		v    float64
	}{{"temp_coeff_pmax_pct_per_c", m.TempCoeffPmaxPctPerC}, {"temp_coeff_voc_pct_per_c", m.TempCoeffVocPctPerC}, {"temp_coeff_isc_pct_per_c", m.TempCoeffIscPctPerC}} {
		if math.IsNaN(c.v) || math.Abs(c.v) > 2 {
			return fmt.Errorf("module: %s %g outside [-2, 2] %%/°C", c.name, c.v)
		}
	}
	if m.NOCTC < 20 || m.NOCTC > 80 {
		return fmt.Errorf("module: noct_c %g outside [20, 80]", m.NOCTC)
	}
	return nil
}

// CellTempC is the cell temperature by the NOCT model,
// T_c = T_a + (NOCT − 20)/800 · G, Duffie & Beckman (2013) §23.3, with
// the small efficiency term neglected; airTempC in °C, poaWM2 the irradiance
// on the plane, noctC the module's NOCT.
func CellTempC(airTempC, poaWM2, noctC float64) float64 {
	return airTempC + (noctC-20)/800*math.Max(0, poaWM2)
}

// ModuleMPPW is the module's power at its maximum power point for
// irradiance poaWM2 on the plane and cell temperature cellTempC: the STC
// rating scaled linearly with irradiance and corrected by the power
// coefficient, P = Pmax · G/1000 · (1 + γ(T_c − 25)): the linear efficiency
// model of Evans (1981), as in Duffie & Beckman (2013) ch. 23, without its
// logarithmic irradiance term. Never negative.
func ModuleMPPW(m Module, poaWM2, cellTempC float64) float64 {
	if !(poaWM2 > 0) {
		return 0
	}
	p := m.PmaxW * poaWM2 / STCIrradianceWM2 * (1 + m.TempCoeffPmaxPctPerC/100*(cellTempC-STCCellTempC))
	return math.Max(0, p)
}

// VocAtTempV is the module's open-circuit voltage at cell temperature
// cellTempC by its Voc coefficient, Voc·(1 + β(T − 25)) (NEC 690.7(A)(1),
// the manufacturer's coefficient method).
func VocAtTempV(m Module, cellTempC float64) float64 {
	return m.VocV * (1 + m.TempCoeffVocPctPerC/100*(cellTempC-STCCellTempC))
}

// vmpCoeffPctPerC is the Vmp coefficient taken as the power coefficient less
// the current coefficient (P = V·I to first order), used when a datasheet
// gives no Vmp coefficient.
func vmpCoeffPctPerC(m Module) float64 {
	return m.TempCoeffPmaxPctPerC - m.TempCoeffIscPctPerC
}

// VmpAtTempV is the module's maximum-power voltage at cell temperature
// cellTempC, with the Vmp coefficient taken as γ_P − α_Isc (first order of
// P = V·I).
func VmpAtTempV(m Module, cellTempC float64) float64 {
	return m.VmpV * (1 + vmpCoeffPctPerC(m)/100*(cellTempC-STCCellTempC))
}

// nec690Table is NEC (2017–2023) Table 690.7(A), voltage correction factors
// for crystalline and multicrystalline silicon modules by lowest expected
// ambient temperature: each row is the lower bound of its band in °C and the
// factor.
var nec690Table = [...]struct{ lowC, factor float64 }{
	{20, 1.02}, {15, 1.04}, {10, 1.06}, {5, 1.08}, {0, 1.10}, {-5, 1.12},
	{-10, 1.14}, {-15, 1.16}, {-20, 1.18}, {-25, 1.20}, {-30, 1.21},
	{-35, 1.23}, {-40, 1.25},
}

// NEC690_7Factor is the crystalline-silicon voltage correction factor of NEC
// Table 690.7(A) for the lowest expected ambient temperature lowTempC: 1.00
// at 25 °C and above, 1.02 for 24–20 °C … 1.25 for −36 to −40 °C. A
// temperature between two integer bands takes the colder (larger) factor;
// below −40 °C, past the end of the table, it keeps 1.25 (use the module
// coefficient there).
func NEC690_7Factor(lowTempC float64) float64 {
	if lowTempC >= 25 {
		return 1.00
	}
	for _, r := range nec690Table {
		if lowTempC >= r.lowC {
			return r.factor
		}
	}
	return 1.25
}

// ModuleCurrentAtVoltageA is the module's current when it is held at
// terminal voltage voltageV (as a PWM controller does, pulling it to battery
// voltage), for irradiance poaWM2 and cell temperature cellTempC.
//
// The I–V curve is the explicit exponential fit of Borowy & Salameh (1996),
// I = Isc·(1 − C1·(exp(V/(C2·Voc)) − 1)), with C2 = (Vmp/Voc − 1)/ln(1 −
// Imp/Isc) and C1 = (1 − Imp/Isc)·exp(−Vmp/(C2·Voc)), which passes through
// (0, Isc) exactly and through (Vmp, Imp) and (Voc, 0) up to terms of the
// order of C1 (about 1e-4); at and above Voc the current is 0. It is translated to the operating point
// by scaling Isc and Imp with irradiance and their current coefficient, and
// Voc and Vmp with their voltage coefficients (see VocAtTempV, VmpAtTempV);
// the logarithmic fall of Voc at low light is neglected. The result is
// clamped to [0, Isc(G,T)].
func ModuleCurrentAtVoltageA(m Module, poaWM2, cellTempC, voltageV float64) float64 {
	if !(poaWM2 > 0) || !(m.IscA > 0) || !(m.VocV > 0) || m.ImpA >= m.IscA || m.VmpV >= m.VocV {
		return 0
	}
	dT := cellTempC - STCCellTempC
	ci := poaWM2 / STCIrradianceWM2 * (1 + m.TempCoeffIscPctPerC/100*dT)
	isc := m.IscA * ci
	imp := m.ImpA * ci
	voc := VocAtTempV(m, cellTempC)
	vmp := VmpAtTempV(m, cellTempC)
	if !(isc > 0) || !(voc > 0) || !(vmp > 0) || vmp >= voc {
		return 0
	}
	if voltageV <= 0 {
		return isc
	}
	if voltageV >= voc {
		return 0
	}
	c2 := (vmp/voc - 1) / math.Log(1-imp/isc)
	c1 := (1 - imp/isc) * math.Exp(-vmp/(c2*voc))
	i := isc * (1 - c1*(math.Exp(voltageV/(c2*voc))-1))
	return math.Max(0, math.Min(isc, i))
}
