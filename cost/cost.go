// Package cost holds the money side of a stand-alone PV design: the
// materials list and the lifecycle cost (present worth of capital,
// operation and maintenance, replacements and salvage, net present cost
// and levelised cost per kWh served).
//
// No prices live here: every price comes from the project.
package cost

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// PresentWorthFactor is the single-payment present worth factor
// (P/F, d, n) = (1 + d)^−n: the value today of one unit of money paid at
// the end of year n at discount rate d (any engineering-economics text,
// e.g. Duffie & Beckman (2013) §11.4).
func PresentWorthFactor(discountRate, year float64) float64 {
	return math.Pow(1+discountRate, -year)
}

// UniformSeriesPresentWorth is the uniform-series present worth factor
// (P/A, d, n) = ((1 + d)^n − 1) / (d (1 + d)^n): the value today of one
// unit paid at the end of each of n years; for d = 0 it is n (any
// engineering-economics text, e.g. Duffie & Beckman (2013) §11.4).
func UniformSeriesPresentWorth(discountRate, years float64) float64 {
	if discountRate == 0 {
		return years
	}
	g := math.Pow(1+discountRate, years)
	return (g - 1) / (discountRate * g)
}

// CapitalRecoveryFactor is (A/P, d, n) = d (1 + d)^n / ((1 + d)^n − 1), the
// reciprocal of UniformSeriesPresentWorth; for d = 0 it is 1/n. It turns a
// present worth into equal yearly payments.
func CapitalRecoveryFactor(discountRate, years float64) float64 {
	return 1 / UniformSeriesPresentWorth(discountRate, years)
}

// PresentWorthFactorEscalating is the present worth of a series of n yearly
// payments, the first one unit at the end of year 1, growing at rate i per
// year, discounted at rate d: PWF(N, i, d) = 1/(d − i) · [1 − ((1 + i)/(1 +
// d))^N], and N/(1 + i) when i = d (Duffie & Beckman (2013) §11.5, eq.
// 11.5.1; the equation number from memory). With i = 0 it is
// UniformSeriesPresentWorth.
func PresentWorthFactorEscalating(discountRate, escalationRate, years float64) float64 {
	if discountRate == escalationRate {
		return years / (1 + escalationRate)
	}
	return (1 - math.Pow((1+escalationRate)/(1+discountRate), years)) / (discountRate - escalationRate)
}

// Item is one line of the materials list.
type Item struct {
	Category  string  `json:"category"`
	Name      string  `json:"name"`
	Unit      string  `json:"unit"`
	Quantity  float64 `json:"quantity"`
	UnitPrice float64 `json:"unit_price"`
}

// Cost is the line total, Quantity × UnitPrice.
func (it Item) Cost() float64 { return it.Quantity * it.UnitPrice }

// Total adds up the line totals of a materials list.
func Total(items []Item) float64 {
	s := 0.0
	for _, it := range items {
		s += it.Cost()
	}
	return s
}

// CategoryTotal is the sum of the lines of one category.
type CategoryTotal struct {
	Category string  `json:"category"`
	Total    float64 `json:"total"`
}

// ByCategory sums a materials list by category, in the order each category
// first appears.
func ByCategory(items []Item) []CategoryTotal {
	idx := map[string]int{}
	var out []CategoryTotal
	for _, it := range items {
		i, ok := idx[it.Category]
		if !ok {
			i = len(out)
			idx[it.Category] = i
			out = append(out, CategoryTotal{Category: it.Category})
		}
		out[i].Total += it.Cost()
	}
	return out
}

// ValidateItems reports the first line with a negative or non-finite
// quantity or price.
func ValidateItems(items []Item) error {
	for i, it := range items {
		if !finite(it.Quantity) || it.Quantity < 0 {
			return fmt.Errorf("cost: items[%d] %q: quantity %v must not be negative", i, it.Name, it.Quantity)
		}
		if !finite(it.UnitPrice) || it.UnitPrice < 0 {
			return fmt.Errorf("cost: items[%d] %q: unit price %v must not be negative", i, it.Name, it.UnitPrice)
		}
	}
	return nil
}

// Replacement is a part replaced at each multiple of its life inside the
// analysis period (a battery bank, a controller, an inverter).
type Replacement struct {
	Name      string  `json:"name"`
	LifeYears float64 `json:"life_years"`
	// Cost is the price of one replacement, also the value its salvage is
	// a fraction of.
	Cost float64 `json:"cost"`
}

// LifecycleInput holds the money figures of a lifecycle cost.
type LifecycleInput struct {
	// Capital is the first cost of the equipment, at year 0.
	Capital float64 `json:"capital"`
	// Installation is the installation labour and transport, at year 0.
	Installation float64 `json:"installation"`
	// OMPerYear is the operation and maintenance cost of each year, paid
	// at the end of years 1..AnalysisYears.
	OMPerYear float64 `json:"om_per_year"`
	// DiscountRate is the real discount rate per year (0.05 = 5 %).
	DiscountRate float64 `json:"discount_rate"`
	// AnalysisYears is the whole number of years of the analysis, 1..100.
	AnalysisYears float64       `json:"analysis_years"`
	Replacements  []Replacement `json:"replacements,omitempty"`
	// ServedWhPerYear is the energy served to the loads in a year, for the
	// levelised cost; 0 leaves the levelised cost at 0.
	ServedWhPerYear float64 `json:"served_wh_per_year"`
}

// LifecycleRow is one cash flow of the lifecycle table. Salvage rows have
// a negative Cost.
type LifecycleRow struct {
	Year int    `json:"year"`
	Item string `json:"item"`
	// Cost is the amount at its year, undiscounted.
	Cost float64 `json:"cost"`
	// PresentWorth is Cost · PresentWorthFactor(DiscountRate, Year).
	PresentWorth float64 `json:"present_worth"`
}

// Lifecycle is the lifecycle cost of a design.
type Lifecycle struct {
	// Rows are the cash flows by year; their PresentWorth sums to
	// NetPresentCost.
	Rows []LifecycleRow `json:"rows"`
	// CapitalPW is capital plus installation (both at year 0).
	CapitalPW      float64 `json:"capital_pw"`
	OMPW           float64 `json:"om_pw"`
	ReplacementsPW float64 `json:"replacements_pw"`
	// SalvagePW is the present worth of the salvage values, as a positive
	// number that NetPresentCost subtracts.
	SalvagePW float64 `json:"salvage_pw"`
	// NetPresentCost = CapitalPW + OMPW + ReplacementsPW − SalvagePW.
	NetPresentCost float64 `json:"net_present_cost"`
	// LevelisedCostPerKWh = NetPresentCost · CapitalRecoveryFactor /
	// (ServedWhPerYear / 1000); 0 when no energy served is given.
	LevelisedCostPerKWh float64 `json:"levelised_cost_per_kwh"`
}

// Row item names of Compute.
const (
	RowCapital      = "capital"
	RowInstallation = "installation"
	RowOM           = "operation and maintenance"
	rowReplacement  = "replacement: "
	rowSalvage      = "salvage: "
)

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// minLifeYears bounds the number of replacement rows.
const minLifeYears = 0.25

const eps = 1e-9

func validateLifecycle(in LifecycleInput) error {
	for _, f := range []struct {
		name string
		v    float64
	}{{"capital", in.Capital}, {"installation", in.Installation}, {"om_per_year", in.OMPerYear}, {"served_wh_per_year", in.ServedWhPerYear}} {
		if !finite(f.v) || f.v < 0 {
			return fmt.Errorf("cost: %s = %v: must not be negative", f.name, f.v)
		}
	}
	if !finite(in.DiscountRate) || in.DiscountRate <= -1 || in.DiscountRate > 1 {
		return fmt.Errorf("cost: discount_rate = %v: must lie above −1 and at most 1 (a fraction: 0.05 = 5 %%)", in.DiscountRate)
	}
	if !finite(in.AnalysisYears) || in.AnalysisYears < 1 || in.AnalysisYears > 100 || in.AnalysisYears != math.Trunc(in.AnalysisYears) {
		return fmt.Errorf("cost: analysis_years = %v: must be a whole number of years from 1 to 100", in.AnalysisYears)
	}
	for i, r := range in.Replacements {
		if !finite(r.LifeYears) || r.LifeYears < minLifeYears {
			return fmt.Errorf("cost: replacements[%d] %q: life %v years must be at least %v", i, r.Name, r.LifeYears, minLifeYears)
		}
		if !finite(r.Cost) || r.Cost < 0 {
			return fmt.Errorf("cost: replacements[%d] %q: cost %v must not be negative", i, r.Name, r.Cost)
		}
	}
	return nil
}

// ErrInvalid is wrapped by every input error of Compute.
var ErrInvalid = errors.New("invalid lifecycle input")

// Compute works out the lifecycle cost over AnalysisYears at the real
// discount rate, with end-of-year cash flows:
//
//   - capital and installation at year 0, at face value;
//   - operation and maintenance at the end of each year 1..N, in present
//     worth OMPerYear · UniformSeriesPresentWorth(d, N);
//   - each replacement at each multiple k · life strictly inside the period
//     (k · life < N), paid at the end of the year in which it falls
//     (year ⌈k · life⌉), discounted by PresentWorthFactor;
//   - salvage: the last unit of each replacement item (the original one
//     where none was replaced) still has t_last + life − N years of life at
//     the end of the period; its value is that remaining fraction of its
//     life times Cost (straight-line), credited at year N and discounted;
//   - NetPresentCost = CapitalPW + OMPW + ReplacementsPW − SalvagePW;
//   - LevelisedCostPerKWh = NetPresentCost · CapitalRecoveryFactor(d, N) /
//     (ServedWhPerYear / 1000).
//
// This is the present-worth method of any engineering-economics text
// (e.g. Duffie & Beckman (2013) ch. 11).
func Compute(in LifecycleInput) (Lifecycle, error) {
	if err := validateLifecycle(in); err != nil {
		return Lifecycle{}, fmt.Errorf("%w: %w", ErrInvalid, err)
	}
	d := in.DiscountRate
	n := int(in.AnalysisYears)
	var out Lifecycle
	row := func(year int, item string, c float64) LifecycleRow {
		return LifecycleRow{Year: year, Item: item, Cost: c, PresentWorth: c * PresentWorthFactor(d, float64(year))}
	}
	rows := []LifecycleRow{row(0, RowCapital, in.Capital), row(0, RowInstallation, in.Installation)}
	out.CapitalPW = in.Capital + in.Installation
	for y := 1; y <= n; y++ {
		r := row(y, RowOM, in.OMPerYear)
		rows = append(rows, r)
		out.OMPW += r.PresentWorth
	}
	var salvage []LifecycleRow
	for _, rp := range in.Replacements {
		last := 0.0
		for k := 1; ; k++ {
			t := float64(k) * rp.LifeYears
			if t >= float64(n)-eps {
				break
			}
			last = t
			r := row(int(math.Ceil(t-eps)), rowReplacement+rp.Name, rp.Cost)
			rows = append(rows, r)
			out.ReplacementsPW += r.PresentWorth
		}
		frac := (last + rp.LifeYears - float64(n)) / rp.LifeYears
		frac = math.Min(1, math.Max(0, frac))
		if frac > eps && rp.Cost > 0 {
			r := row(n, rowSalvage+rp.Name, -frac*rp.Cost)
			salvage = append(salvage, r)
			out.SalvagePW -= r.PresentWorth
		}
	}
	rows = append(rows, salvage...)
	sort.SliceStable(rows, func(a, b int) bool { return rows[a].Year < rows[b].Year })
	out.Rows = rows
	out.NetPresentCost = out.CapitalPW + out.OMPW + out.ReplacementsPW - out.SalvagePW
	if in.ServedWhPerYear > 0 {
		out.LevelisedCostPerKWh = out.NetPresentCost * CapitalRecoveryFactor(d, float64(n)) / (in.ServedWhPerYear / 1000)
	}
	return out, nil
}
