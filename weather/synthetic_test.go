package weather

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"testing"
)

// testKT is an invented set of monthly mean clearness indices.
var testKT = [12]float64{0.45, 0.5, 0.55, 0.58, 0.6, 0.62, 0.65, 0.6, 0.55, 0.5, 0.45, 0.35}

func TestBendtMean(t *testing.T) {
	// The mean of the distribution, by numerical integration of its CDF
	// (mean = k_min + ∫ (1 − F) dk over [k_min, k_max], composite Simpson
	// rule, 2000 intervals), equals K̄T: computed here from the published
	// distribution (Duffie & Beckman (2013) §2.11), not read from a table.
	for _, kt := range []float64{0.15, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8} {
		t.Run(fmt.Sprint(kt), func(t *testing.T) {
			_, kMin, kMax, err := BendtGamma(kt)
			if err != nil {
				t.Fatal(err)
			}
			const n = 2000
			h := (kMax - kMin) / n
			sum := 0.0
			for i := 0; i <= n; i++ {
				w := 2.0
				switch {
				case i == 0 || i == n:
					w = 1
				case i%2 == 1:
					w = 4
				}
				sum += w * (1 - BendtCDF(kMin+float64(i)*h, kt))
			}
			if mean := kMin + sum*h/3; math.Abs(mean-kt) > 1e-9 {
				t.Errorf("mean %.12f, want %g", mean, kt)
			}
		})
	}
}

func TestBendtGamma(t *testing.T) {
	// k_max values computed here from k_max = 0.6313 + 0.267 K̄T −
	// 11.9 (K̄T − 0.75)^8 (Bendt et al. 1981, Duffie & Beckman (2013) §2.11).
	tests := []struct{ kt, kMax float64 }{
		{0.75, 0.6313 + 0.267*0.75},
		{0.5, 0.6313 + 0.267*0.5 - 11.9*math.Pow(0.25, 8)},
		{0.3, 0.6313 + 0.267*0.3 - 11.9*math.Pow(0.45, 8)},
		{0.2, 0.6313 + 0.267*0.2 - 11.9*math.Pow(0.55, 8)},
		{0.1, 0.6313 + 0.267*0.1 - 11.9*math.Pow(0.65, 8)},
	}
	for _, tc := range tests {
		g, kMin, kMax, err := BendtGamma(tc.kt)
		if err != nil {
			t.Fatal(err)
		}
		if kMin != 0.05 || math.Abs(kMax-tc.kMax) > 1e-12 {
			t.Errorf("K̄T %g: k_min %g k_max %g, want 0.05 and %g", tc.kt, kMin, kMax, tc.kMax)
		}
		// γ > 0 when K̄T lies above the midpoint of [k_min, k_max] (more
		// clear days), γ < 0 below it: the mean of the density ∝ e^(γk).
		if mid := (kMin + kMax) / 2; (tc.kt > mid) != (g > 0) {
			t.Errorf("K̄T %g: γ %g with the midpoint at %g", tc.kt, g, mid)
		}
	}
	// The midpoint gives γ = 0 (the uniform distribution).
	mid := 0.4
	for range 60 { // fixed point: K̄T = (k_min + k_max(K̄T))/2
		mid = (0.05 + bendtKMax(mid)) / 2
	}
	if g, _, _, err := BendtGamma(mid); err != nil || math.Abs(g) > 1e-6 {
		t.Errorf("γ at the midpoint %g: %g, %v", mid, g, err)
	}
	for _, bad := range []float64{0, 0.05, 0.06, 0.87, 0.9, 1, -1, math.NaN(), math.Inf(1)} {
		if _, _, _, err := BendtGamma(bad); err == nil {
			t.Errorf("K̄T %g accepted", bad)
		}
		if !math.IsNaN(BendtCDF(0.5, bad)) || !math.IsNaN(BendtQuantile(0.5, bad)) || BendtValid(bad) {
			t.Errorf("K̄T %g: CDF or quantile not NaN", bad)
		}
	}
}

func TestBendtQuantileInvertsCDF(t *testing.T) {
	for _, kt := range []float64{0.12, 0.3, 0.5, 0.7, 0.84} {
		for _, p := range []float64{0, 1e-9, 0.01, 0.25, 0.5, 0.75, 0.99, 1 - 1e-9, 1} {
			k := BendtQuantile(p, kt)
			if got := BendtCDF(k, kt); math.Abs(got-p) > 1e-9 {
				t.Errorf("K̄T %g p %g: k %g, CDF %g", kt, p, k, got)
			}
		}
		_, kMin, kMax, _ := BendtGamma(kt)
		if BendtCDF(kMin-0.1, kt) != 0 || BendtCDF(kMax+0.1, kt) != 1 {
			t.Errorf("K̄T %g: CDF outside [k_min, k_max] not 0 and 1", kt)
		}
		if BendtQuantile(-1, kt) != kMin || BendtQuantile(2, kt) != kMax {
			t.Errorf("K̄T %g: quantile of p outside [0,1] not clamped", kt)
		}
	}
}

// lagOne is the lag-1 autocorrelation of the daily departures from the
// monthly means over the whole sequence.
func lagOne(k []float64, kt [12]float64) float64 {
	var sxy, sxx, prev float64
	for i := range k {
		m, _ := DayOfYearMonth(i)
		a := k[i] - kt[m-1]
		sxx += a * a
		if i > 0 {
			sxy += a * prev
		}
		prev = a
	}
	return sxy / sxx
}

func TestDailyClearnessMeansAndPersistence(t *testing.T) {
	// Sampling error of a lag-1 autocorrelation over 36 500 days is about
	// 1/√36500 ≈ 0.005; the tolerance 0.02 allows that and the first-order
	// bias correction of gaussianLagOne. Independent days held to their
	// month's mean show the bias itself, −1/n with n = 365/12 (Marriott &
	// Pope 1954).
	tests := []struct {
		name   string
		opt    SyntheticOptions
		target float64
	}{
		{"default 0.3", SyntheticOptions{Years: 100, Seed: 7}, 0.3},
		{"0.5", SyntheticOptions{Years: 100, Seed: 8, LagOneCorrelation: 0.5}, 0.5},
		{"0.1", SyntheticOptions{Years: 100, Seed: 9, LagOneCorrelation: 0.1}, 0.1},
		{"independent", SyntheticOptions{Years: 100, Seed: 10, Independent: true}, -12.0 / 365},
		{"multiplicative 0.3", SyntheticOptions{Years: 100, Seed: 11, MultiplicativeRescale: true}, 0.3},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			k, err := DailyClearness(testKT, tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			if len(k) != 100*DaysPerYear {
				t.Fatalf("%d values", len(k))
			}
			var longRun [12]float64
			for y := range 100 {
				for m := 1; m <= 12; m++ {
					first := y*DaysPerYear + FirstDayOfMonth(m)
					days := k[first : first+DaysInMonth(m)]
					_, kMin, kMax, _ := BendtGamma(testKT[m-1])
					sum := 0.0
					for _, v := range days {
						if v < kMin || v > kMax {
							t.Fatalf("year %d month %d: %g outside [%g, %g]", y, m, v, kMin, kMax)
						}
						sum += v
					}
					mean := sum / float64(len(days))
					// Every month of every year is held to K̄T.
					if math.Abs(mean-testKT[m-1]) > 1e-12 {
						t.Fatalf("year %d month %d: mean %.15f, want %g", y, m, mean, testKT[m-1])
					}
					longRun[m-1] += mean / 100
				}
			}
			for m := range 12 {
				if math.Abs(longRun[m]/testKT[m]-1) > 0.01 {
					t.Errorf("month %d: 100-year mean %g, want %g within 1 %%", m+1, longRun[m], testKT[m])
				}
			}
			r := lagOne(k, testKT)
			t.Logf("lag-1 autocorrelation %.4f, target %.4f", r, tc.target)
			if math.Abs(r-tc.target) > 0.02 {
				t.Errorf("lag-1 autocorrelation %.4f, want %g ± 0.02", r, tc.target)
			}
		})
	}
}

func TestDailyClearnessDistribution(t *testing.T) {
	// With independent days the values follow the Bendt distribution up
	// to the monthly rescaling. Kolmogorov–Smirnov distance over 200 years
	// of July (6 200 days, K̄T 0.65): the 1 % critical value for the sample
	// alone is 1.63/√6200 ≈ 0.021; 0.03 leaves room for the rescaling.
	k, err := DailyClearness(testKT, SyntheticOptions{Years: 200, Seed: 3, Independent: true})
	if err != nil {
		t.Fatal(err)
	}
	var july []float64
	for y := range 200 {
		first := y*DaysPerYear + FirstDayOfMonth(7)
		july = append(july, k[first:first+31]...)
	}
	sort.Float64s(july)
	d := 0.0
	for i, v := range july {
		f := BendtCDF(v, testKT[6])
		d = max(d, math.Abs(f-float64(i)/float64(len(july))), math.Abs(f-float64(i+1)/float64(len(july))))
	}
	if d > 0.03 {
		t.Errorf("KS distance %.4f, want below 0.03", d)
	}
}

func TestMultiplicativeRescaleSpike(t *testing.T) {
	// The documented side effect of MultiplicativeRescale: a few per cent
	// of days clamped at k_max (measured here; the Gaussian shift has none).
	for _, mult := range []bool{false, true} {
		k, err := DailyClearness(testKT, SyntheticOptions{Years: 200, Seed: 3, MultiplicativeRescale: mult})
		if err != nil {
			t.Fatal(err)
		}
		_, _, kMax, _ := BendtGamma(testKT[6])
		at := 0
		for y := range 200 {
			first := y*DaysPerYear + FirstDayOfMonth(7)
			for _, v := range k[first : first+31] {
				if v == kMax {
					at++
				}
			}
		}
		frac := float64(at) / (200 * 31)
		t.Logf("multiplicative %v: %.3f of July days at k_max", mult, frac)
		if mult != (frac > 0.01) || frac > 0.1 {
			t.Errorf("multiplicative %v: %.3f of days at k_max", mult, frac)
		}
	}
}

func TestDailyClearnessSeed(t *testing.T) {
	opt := SyntheticOptions{Years: 3, Seed: 42}
	a, err := DailyClearness(testKT, opt)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := DailyClearness(testKT, opt)
	if !slices.Equal(a, b) {
		t.Error("same seed, different numbers")
	}
	opt.Seed = 43
	c, _ := DailyClearness(testKT, opt)
	same := 0
	for i := range a {
		if a[i] == c[i] {
			same++
		}
	}
	if same > len(a)/100 {
		t.Errorf("different seeds share %d of %d values", same, len(a))
	}
}

func TestDailyClearnessSpecialMonths(t *testing.T) {
	kt := testKT
	kt[0] = 0    // polar night
	kt[11] = 0.9 // above the Bendt range
	if _, err := DailyClearness(kt, SyntheticOptions{Years: 1}); err == nil {
		t.Error("K̄T 0.9 accepted without FlatOutsideRange")
	}
	k, err := DailyClearness(kt, SyntheticOptions{Years: 2, FlatOutsideRange: true})
	if err != nil {
		t.Fatal(err)
	}
	for y := range 2 {
		for d := range 31 {
			if v := k[y*DaysPerYear+d]; v != 0 {
				t.Fatalf("polar night day %d: %g", d, v)
			}
			if v := k[y*DaysPerYear+334+d]; v != 0.9 {
				t.Fatalf("flat December day %d: %g", d, v)
			}
		}
	}
	for _, opt := range []SyntheticOptions{{Years: 0}, {Years: MaxSyntheticYears + 1}, {Years: 1, LagOneCorrelation: 1}, {Years: 1, LagOneCorrelation: math.NaN()}} {
		if _, err := DailyClearness(testKT, opt); err == nil {
			t.Errorf("options %+v accepted", opt)
		}
	}
}

func TestRescaleMeanClamped(t *testing.T) {
	// Values that must be pushed hard against k_max still reach the
	// mean: the solved factor, not one multiplicative pass.
	k := []float64{0.05, 0.05, 0.05, 0.8, 0.8, 0.8, 0.3}
	rescaleMean(k, 0.7, 0.05, 0.82)
	sum := 0.0
	for _, v := range k {
		if v < 0.05 || v > 0.82 {
			t.Fatalf("value %g outside bounds", v)
		}
		sum += v
	}
	if math.Abs(sum/7-0.7) > 1e-12 {
		t.Errorf("mean %g, want 0.7", sum/7)
	}
}

func TestMonthlyClearness(t *testing.T) {
	// Duffie & Beckman Example 1.10.1: H₀ = 33.8 MJ/m² at 43° N on 15 April,
	// i.e. 9.39 kWh/m²; a horizontal mean of half that gives K̄T = 0.5.
	var g, h0 [12]float64
	for m := range 12 {
		h0[m] = 33.8 / 3.6
		g[m] = h0[m] / 2
	}
	h0[0], g[0] = 0, 0
	kt, err := MonthlyClearness(g, h0)
	if err != nil || kt[0] != 0 || math.Abs(kt[3]-0.5) > 1e-15 {
		t.Errorf("K̄T %v, %v", kt, err)
	}
	g[0] = 1
	if _, err := MonthlyClearness(g, h0); err == nil {
		t.Error("irradiation without extraterrestrial irradiation accepted")
	}
	g[0], g[5] = 0, -1
	if _, err := MonthlyClearness(g, h0); err == nil {
		t.Error("negative irradiation accepted")
	}
}

func BenchmarkDailyClearness20Years(b *testing.B) {
	opt := SyntheticOptions{Years: 20, Seed: 1}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := DailyClearness(testKT, opt); err != nil {
			b.Fatal(err)
		}
	}
}
