package array

import (
	"errors"
	"math"
	"testing"
)

// A demo horizontal irradiation series (invented, kWh/m²/day), used only as
// input; every check below compares two routes through published equations.
var demoGHINorth = [12]float64{1.5, 2.4, 3.5, 4.6, 5.5, 6.1, 6.2, 5.4, 4.2, 2.9, 1.7, 1.3}
var demoGHISouth = [12]float64{6.8, 6.0, 4.9, 3.7, 2.8, 2.4, 2.6, 3.3, 4.5, 5.6, 6.4, 6.9}

// polarGHI is a demo series for a polar site: half the extraterrestrial
// irradiation of each representative day (K̄T = 0.5), 0 in polar night.
func polarGHI(lat float64) [12]float64 {
	var g [12]float64
	for m := 1; m <= 12; m++ {
		g[m-1] = 0.5 * ExtraterrestrialDailyWhM2(lat, RepresentativeDay(m), SolarConstantWM2) / 1000
	}
	return g
}

func TestExtraterrestrialExample1101(t *testing.T) {
	// Duffie & Beckman (2013) Example 1.10.1: φ = 43°, April 15 (n = 105):
	// H₀ = 33.8 MJ/m² with G_sc = 1367 W/m²; 1361 W/m² gives 0.5 % less.
	got := ExtraterrestrialDailyWhM2(43, 105, 1367) * 3600 / 1e6
	near(t, "H0 1367", got, 33.8, 0.1)
	got1361 := ExtraterrestrialDailyWhM2(43, 105, 1361) * 3600 / 1e6
	near(t, "H0 1361 ratio", got1361/got, 1361.0/1367, 1e-12)
	// Polar night: 75° N on December 10 (n = 344), no sunrise, H₀ = 0.
	if h := ExtraterrestrialDailyWhM2(75, 344, SolarConstantWM2); h != 0 {
		t.Errorf("polar night H0 = %g, want 0", h)
	}
	// Midnight sun: 75° N on June 11 (n = 162); computed from eq. 1.10.3
	// with ωs = 180°: H₀ = 24/π · G_sc · E₀ · π sin φ sin δ.
	d := DeclinationDeg(162) * deg
	want := 24 / math.Pi * SolarConstantWM2 * eccentricity(162) * math.Pi * math.Sin(75*deg) * math.Sin(d)
	near(t, "midnight sun H0", ExtraterrestrialDailyWhM2(75, 162, SolarConstantWM2), want, 1e-6)
}

func TestErbsCorrelations(t *testing.T) {
	// Branch continuity and limits, computed from Duffie & Beckman (2013)
	// eqs. 2.10.1 and 2.11.1 (the published breakpoints are continuous to
	// the printed precision).
	near(t, "hourly at 0.22", ErbsHourlyDiffuseFraction(0.2200001), ErbsHourlyDiffuseFraction(0.22), 0.005)
	near(t, "hourly at 0.80", ErbsHourlyDiffuseFraction(0.8000001), ErbsHourlyDiffuseFraction(0.80), 0.005)
	near(t, "daily at 0.715", ErbsDailyDiffuseFraction(0.7149999, 80), ErbsDailyDiffuseFraction(0.715, 80), 0.01)
	// The ωs > 81.4° branch steps from 0.190 to 0.175 at K_T = 0.722 as published.
	near(t, "daily at 0.722", ErbsDailyDiffuseFraction(0.7219999, 90), ErbsDailyDiffuseFraction(0.722, 90), 0.02)
	for _, kt := range []float64{0, 0.1, 0.3, 0.5, 0.7, 0.9, 1} {
		for _, ws := range []float64{60, 81.4, 100} {
			for _, f := range []float64{ErbsMonthlyDiffuseFraction(kt, ws), ErbsDailyDiffuseFraction(kt, ws), ErbsHourlyDiffuseFraction(kt)} {
				if f < 0 || f > 1 || math.IsNaN(f) {
					t.Errorf("diffuse fraction %g at kt %g, ws %g outside [0, 1]", f, kt, ws)
				}
			}
		}
	}
	// Monthly Erbs at K̄T = 0.5, ωs > 81.4°: 1.311 − 3.022·0.5 + 3.427·0.25 −
	// 1.821·0.125 = 0.4291 (computed from eq. 2.12.1).
	near(t, "monthly 0.5", ErbsMonthlyDiffuseFraction(0.5, 90), 0.4291, 1e-4)
}

// beamRatioAnalytic integrates cos θ of Duffie & Beckman (2013) eq. 1.6.2
// analytically over the hours the sun is above both the horizon and the
// plane, divided by the horizontal integral (eq. 1.10.3 without constants):
// Klein's (1977) R̄b for any surface azimuth, by a route independent of the
// package's numerical integration.
func beamRatioAnalytic(latDeg, tiltDeg, azDeg float64, day int) float64 {
	phi, beta := latDeg*deg, tiltDeg*deg
	gamma := (azDeg - 180) * deg // eq. 1.6.2 measures γ from south, west positive
	delta := DeclinationDeg(day) * deg
	ws := sunsetRad(phi, delta)
	if ws == 0 {
		return 0
	}
	sd, cd := math.Sin(delta), math.Cos(delta)
	sp, cp := math.Sin(phi), math.Cos(phi)
	sb, cb := math.Sin(beta), math.Cos(beta)
	A := sd * (sp*cb - cp*sb*math.Cos(gamma))
	B := cd * (cp*cb + sp*sb*math.Cos(gamma))
	C := cd * sb * math.Sin(gamma)
	f := func(w float64) float64 { return A + B*math.Cos(w) + C*math.Sin(w) }
	F := func(w float64) float64 { return A*w + B*math.Sin(w) - C*math.Cos(w) }
	// zeros of A + R cos(ω − ψ)
	cuts := []float64{-ws, ws}
	R := math.Hypot(B, C)
	if R > 0 && math.Abs(A/R) < 1 {
		psi := math.Atan2(C, B)
		for _, z := range []float64{psi + math.Acos(-A/R), psi - math.Acos(-A/R)} {
			for k := -2; k <= 2; k++ {
				zz := z + 2*math.Pi*float64(k)
				if zz > -ws && zz < ws {
					cuts = append(cuts, zz)
				}
			}
		}
	}
	// sort cuts
	for i := 1; i < len(cuts); i++ {
		for j := i; j > 0 && cuts[j] < cuts[j-1]; j-- {
			cuts[j], cuts[j-1] = cuts[j-1], cuts[j]
		}
	}
	var num float64
	for i := 0; i+1 < len(cuts); i++ {
		if f((cuts[i]+cuts[i+1])/2) > 0 {
			num += F(cuts[i+1]) - F(cuts[i])
		}
	}
	den := 2 * (cp*cd*math.Sin(ws) + ws*sp*sd)
	return num / den
}

func TestBeamRatio(t *testing.T) {
	tests := []struct {
		name          string
		lat, tilt, az float64
	}{
		{"43N south 45", 43, 45, 180},
		{"43N south 90", 43, 90, 180},
		{"33.9S north 30", -33.9, 30, 0},
		{"33.9S north 90", -33.9, 90, 0},
		{"equator 10 south", 0, 10, 180},
		{"70N south 60", 70, 60, 180},
		{"75S north 80", -75, 80, 0},
	}
	for _, tt := range tests {
		for m := 1; m <= 12; m++ {
			n := RepresentativeDay(m)
			sky := newMonthSky(tt.lat*deg, n, nil)
			ne, nn, nu := Plane{TiltDeg: tt.tilt, AzimuthDeg: tt.az}.normal()
			num := sky.beamRatio(ne, nn, nu)
			// Klein (1977) closed form, Duffie & Beckman (2013) eq. 2.19.3.
			near(t, tt.name+" vs Klein", num, KleinBeamRatio(tt.lat, tt.tilt, n), 1e-4*math.Max(1, num))
			near(t, tt.name+" vs analytic", num, beamRatioAnalytic(tt.lat, tt.tilt, tt.az, n), 1e-4*math.Max(1, num))
		}
	}
	// Surfaces turned off the equator: numerical R̄b against the analytic
	// integral of eq. 1.6.2 (computed from the published equations).
	for _, tt := range []struct {
		name          string
		lat, tilt, az float64
	}{
		{"43N 20 west of south", 43, 45, 200},
		{"43N 20 east of south", 43, 45, 160},
		{"43N vertical east", 43, 90, 90},
		{"33.9S 20 off north", -33.9, 30, 20},
		{"33.9S vertical west", -33.9, 90, 270},
		{"equator vertical north", 0, 90, 0},
	} {
		for m := 1; m <= 12; m++ {
			n := RepresentativeDay(m)
			sky := newMonthSky(tt.lat*deg, n, nil)
			ne, nn, nu := Plane{TiltDeg: tt.tilt, AzimuthDeg: tt.az}.normal()
			num := sky.beamRatio(ne, nn, nu)
			near(t, tt.name, num, beamRatioAnalytic(tt.lat, tt.tilt, tt.az, n), 2e-4*math.Max(1, num))
		}
	}
}

func TestMonthlyResourceHorizontalReturnsGHI(t *testing.T) {
	// Energy balance of the isotropic transposition (Duffie & Beckman 2013
	// eq. 2.19.1): with β = 0 the plane receives the horizontal irradiation.
	for _, lat := range []float64{43, -33.9, 0, 70, -75, 89} {
		ghi := demoGHINorth
		if lat < 0 {
			ghi = demoGHISouth
		}
		if math.Abs(lat) >= 70 {
			ghi = polarGHI(lat)
		}
		r, err := MonthlyResource(lat, ghi, Plane{TiltDeg: 0, AzimuthDeg: 180, AlbedoFraction: 0.2})
		if err != nil {
			t.Fatalf("lat %g: %v", lat, err)
		}
		for i, m := range r {
			near(t, "horizontal POA", m.POAKWhM2Day, ghi[i], 1e-12)
			finite(t, "month", m.ClearnessIndex, m.DiffuseFraction, m.BeamRatio, m.ExtraterrestrialKWhM2Day)
		}
	}
}

func TestMonthlyResourceAgainstClosedForm(t *testing.T) {
	// Plane-of-array irradiation computed from the published equations by
	// the closed-form route: Erbs (eq. 2.12.1), Klein's R̄b (eq. 2.19.3) and
	// the isotropic sky (eq. 2.19.1); MonthlyResource integrates R̄b
	// numerically. A southern-hemisphere site facing north, and a northern
	// one facing south, including a vertical plane and latitude 0.
	tests := []struct {
		name          string
		lat, tilt, az float64
		ghi           [12]float64
	}{
		{"south 33.9S tilt 30 north", -33.9, 30, 0, demoGHISouth},
		{"north 43N tilt 45 south", 43, 45, 180, demoGHINorth},
		{"north 43N vertical", 43, 90, 180, demoGHINorth},
		{"equator tilt 10 south", 0, 10, 180, demoGHISouth},
	}
	for _, tt := range tests {
		r, err := MonthlyResource(tt.lat, tt.ghi, Plane{TiltDeg: tt.tilt, AzimuthDeg: tt.az, AlbedoFraction: 0.2})
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		for i, m := range r {
			n := RepresentativeDay(i + 1)
			h0 := ExtraterrestrialDailyWhM2(tt.lat, n, SolarConstantWM2) / 1000
			kt := tt.ghi[i] / h0
			ws := SunsetHourAngleDeg(tt.lat, DeclinationDeg(n))
			fd := ErbsMonthlyDiffuseFraction(kt, ws)
			rb := KleinBeamRatio(tt.lat, tt.tilt, n)
			cb := math.Cos(tt.tilt * deg)
			want := tt.ghi[i] * ((1-fd)*rb + fd*(1+cb)/2 + 0.2*(1-cb)/2)
			near(t, tt.name, m.POAKWhM2Day, want, 1e-4*want)
			near(t, tt.name+" kt", m.ClearnessIndex, kt, 1e-12)
		}
		// The southern winter (June) gains on a north-tilted plane.
		if tt.lat < 0 && tt.tilt > 0 && r[5].POAKWhM2Day <= r[5].GHIKWhM2Day {
			t.Errorf("%s: June POA %g not above GHI %g", tt.name, r[5].POAKWhM2Day, r[5].GHIKWhM2Day)
		}
	}
}

func TestMonthlyResourceTurned20(t *testing.T) {
	// A surface turned 20° off the equator (azimuth 200° at 43° N, 20° at
	// 33.9° S): POA computed from the published equations with R̄b from the
	// analytic integral of eq. 1.6.2 (see beamRatioAnalytic), Erbs and the
	// isotropic sky. Turning east or west by the same angle gives the same
	// monthly value (the day is symmetric about solar noon), and turning
	// loses a little against facing the equator in winter.
	tests := []struct {
		name            string
		lat, tilt, az   float64
		mirror, equator float64
		ghi             [12]float64
		winter          int
	}{
		{"43N az 200", 43, 45, 200, 160, 180, demoGHINorth, 12},
		{"33.9S az 20", -33.9, 30, 20, 340, 0, demoGHISouth, 6},
	}
	for _, tt := range tests {
		r, err := MonthlyResource(tt.lat, tt.ghi, Plane{TiltDeg: tt.tilt, AzimuthDeg: tt.az, AlbedoFraction: 0.2})
		if err != nil {
			t.Fatal(err)
		}
		rm, _ := MonthlyResource(tt.lat, tt.ghi, Plane{TiltDeg: tt.tilt, AzimuthDeg: tt.mirror, AlbedoFraction: 0.2})
		re, _ := MonthlyResource(tt.lat, tt.ghi, Plane{TiltDeg: tt.tilt, AzimuthDeg: tt.equator, AlbedoFraction: 0.2})
		for i, m := range r {
			n := RepresentativeDay(i + 1)
			cb := math.Cos(tt.tilt * deg)
			want := tt.ghi[i] * ((1-m.DiffuseFraction)*beamRatioAnalytic(tt.lat, tt.tilt, tt.az, n) + m.DiffuseFraction*(1+cb)/2 + 0.2*(1-cb)/2)
			near(t, tt.name, m.POAKWhM2Day, want, 2e-4*want)
			near(t, tt.name+" mirror", rm[i].POAKWhM2Day, m.POAKWhM2Day, 1e-6*want)
		}
		w := tt.winter - 1
		if !(r[w].POAKWhM2Day < re[w].POAKWhM2Day) {
			t.Errorf("%s: turned plane %g not below equator-facing %g in winter", tt.name, r[w].POAKWhM2Day, re[w].POAKWhM2Day)
		}
	}
}

func TestHorizon(t *testing.T) {
	h := Horizon{{AzimuthDeg: 90, ElevationDeg: 10}, {AzimuthDeg: 180, ElevationDeg: 20}, {AzimuthDeg: 270, ElevationDeg: 0}}
	tests := []struct {
		az, want float64
	}{
		{90, 10}, {135, 15}, {180, 20}, {225, 10}, {270, 0},
		// wrapping from 270° (0°) to 450° (10°): half-way at 0°/360°.
		{0, 5}, {360, 5}, {315, 2.5}, {45, 7.5}, {-45, 2.5}, {720, 5},
	}
	for _, tt := range tests {
		near(t, "horizon", h.ElevationAtDeg(tt.az), tt.want, 1e-9)
	}
	if Horizon(nil).ElevationAtDeg(123) != 0 {
		t.Error("empty horizon not flat")
	}
	if (Horizon{{AzimuthDeg: 10, ElevationDeg: 7}}).ElevationAtDeg(200) != 7 {
		t.Error("one-point horizon not constant")
	}
	bad := []Horizon{
		{{AzimuthDeg: 90, ElevationDeg: 1}, {AzimuthDeg: 90, ElevationDeg: 2}},
		{{AzimuthDeg: 360, ElevationDeg: 1}},
		{{AzimuthDeg: 10, ElevationDeg: -1}},
		{{AzimuthDeg: math.NaN(), ElevationDeg: 1}},
	}
	for i, b := range bad {
		if b.Validate() == nil {
			t.Errorf("bad horizon %d accepted", i)
		}
	}
}

func TestMonthlyResourceHorizonBlocks(t *testing.T) {
	all := Horizon{{AzimuthDeg: 0, ElevationDeg: 90}, {AzimuthDeg: 180, ElevationDeg: 90}}
	ridge := Horizon{{AzimuthDeg: 90, ElevationDeg: 0}, {AzimuthDeg: 120, ElevationDeg: 30}, {AzimuthDeg: 240, ElevationDeg: 30}, {AzimuthDeg: 270, ElevationDeg: 0}}
	open, err := MonthlyResource(43, demoGHINorth, Plane{TiltDeg: 45, AzimuthDeg: 180, AlbedoFraction: 0.2})
	if err != nil {
		t.Fatal(err)
	}
	blocked, err := MonthlyResource(43, demoGHINorth, Plane{TiltDeg: 45, AzimuthDeg: 180, AlbedoFraction: 0.2, Horizon: all})
	if err != nil {
		t.Fatal(err)
	}
	valley, err := MonthlyResource(43, demoGHINorth, Plane{TiltDeg: 45, AzimuthDeg: 180, AlbedoFraction: 0.2, Horizon: ridge})
	if err != nil {
		t.Fatal(err)
	}
	cb := math.Cos(45 * deg)
	for i := range blocked {
		b := blocked[i]
		if b.BeamRatio != 0 {
			t.Errorf("month %d: beam ratio %g behind a full horizon", i+1, b.BeamRatio)
		}
		// Only diffuse and ground-reflected remain (Duffie & Beckman eq. 2.19.1 with R̄b = 0).
		near(t, "blocked POA", b.POAKWhM2Day, b.GHIKWhM2Day*(b.DiffuseFraction*(1+cb)/2+0.2*(1-cb)/2), 1e-12)
		if valley[i].POAKWhM2Day > open[i].POAKWhM2Day+1e-12 {
			t.Errorf("month %d: ridge raised POA", i+1)
		}
	}
	// December at 43° N: noon elevation 90 − 43 − 23 ≈ 24° (eq. 1.6.5) stays
	// under a 30° ridge that spans the whole winter sun path: no beam.
	if valley[11].BeamRatio != 0 {
		t.Errorf("December behind a 30° ridge: beam ratio %g, want 0", valley[11].BeamRatio)
	}
	// June noon at 70° elevation clears it.
	if !(valley[5].BeamRatio > 0) {
		t.Errorf("June over a 30° ridge: beam ratio %g, want > 0", valley[5].BeamRatio)
	}
}

func TestMonthlyResourceEdges(t *testing.T) {
	// Polar night and midnight sun at 75° N, a vertical plane, no NaN.
	ghi := polarGHI(75)
	ghi[10] = 0.02
	r, err := MonthlyResource(75, ghi, Plane{TiltDeg: 90, AzimuthDeg: 180, AlbedoFraction: 0.6})
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range r {
		finite(t, "polar", m.POAKWhM2Day, m.BeamRatio, m.ClearnessIndex, m.DiffuseFraction, m.ExtraterrestrialKWhM2Day)
	}
	if r[11].ExtraterrestrialKWhM2Day != 0 || r[11].POAKWhM2Day != 0 {
		t.Errorf("polar night December: H0 %g, POA %g, want 0", r[11].ExtraterrestrialKWhM2Day, r[11].POAKWhM2Day)
	}
	// November at 75° N: representative day in polar night (H₀ = 0) but a
	// little light in the month; it is taken as diffuse (our rule).
	near(t, "polar twilight", r[10].POAKWhM2Day, 0.02*((1+0)/2.0+0.6*(1-0)/2), 1e-12)
	if r[5].BeamRatio <= 0 {
		t.Errorf("midnight sun June: beam ratio %g", r[5].BeamRatio)
	}
	// Errors: negative GHI, GHI above H₀, bad plane.
	bad := demoGHINorth
	bad[3] = -1
	if _, err := MonthlyResource(43, bad, Plane{}); err == nil {
		t.Error("negative GHI accepted")
	}
	bad = demoGHINorth
	bad[11] = 9
	if _, err := MonthlyResource(43, bad, Plane{}); !errors.Is(err, ErrGHIAboveExtraterrestrial) {
		t.Errorf("GHI above H0: err %v", err)
	}
	if _, err := MonthlyResource(43, demoGHINorth, Plane{AlbedoFraction: 2}); err == nil {
		t.Error("albedo 2 accepted")
	}
	if _, err := MonthlyResource(91, demoGHINorth, Plane{}); err == nil {
		t.Error("latitude 91 accepted")
	}
}

func TestDesignMonth(t *testing.T) {
	flat := [12]float64{1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1}
	tests := []struct {
		name   string
		demand [12]float64
		poa    [12]float64
		want   int
	}{
		{"lowest poa", flat, [12]float64{3, 4, 5, 5, 6, 6, 6, 6, 5, 4, 3, 2}, 12},
		{"demand peak", [12]float64{1, 1, 1, 1, 1, 1, 3, 1, 1, 1, 1, 1}, [12]float64{3, 4, 5, 5, 6, 6, 6, 6, 5, 4, 3, 2}, 7},
		{"zero demand ignored", [12]float64{1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0}, [12]float64{3, 4, 5, 5, 6, 6, 6, 6, 5, 4, 3, 0}, 1},
		{"no sun with demand", flat, [12]float64{3, 4, 5, 5, 6, 0, 6, 6, 5, 4, 3, 2}, 6},
		{"no demand at all", [12]float64{}, [12]float64{3, 4, 5, 5, 6, 6, 6, 6, 5, 4, 1, 2}, 11},
	}
	for _, tt := range tests {
		if got := DesignMonth(tt.demand, tt.poa); got != tt.want {
			t.Errorf("%s: DesignMonth = %d, want %d", tt.name, got, tt.want)
		}
	}
}

func TestOptimiseTilt(t *testing.T) {
	flat := [12]float64{1000, 1000, 1000, 1000, 1000, 1000, 1000, 1000, 1000, 1000, 1000, 1000}
	worstAt := func(lat float64, ghi [12]float64, az, tilt float64) float64 {
		r, err := MonthlyResource(lat, ghi, Plane{TiltDeg: tilt, AzimuthDeg: az, AlbedoFraction: 0.2})
		if err != nil {
			t.Fatal(err)
		}
		w := 0.0
		for i := range r {
			w = math.Max(w, flat[i]/r[i].POAKWhM2Day)
		}
		return w
	}
	tests := []struct {
		name       string
		lat, az    float64
		ghi        [12]float64
		winterLike []int
	}{
		{"43N", 43, 180, demoGHINorth, []int{11, 12, 1}},
		{"33.9S", -33.9, 0, demoGHISouth, []int{5, 6, 7}},
	}
	for _, tt := range tests {
		tilt, dm, err := OptimiseTilt(tt.lat, tt.ghi, flat, tt.az, 0.2, nil)
		if err != nil {
			t.Fatal(err)
		}
		// An off-grid array is tilted for winter: steeper than the latitude
		// (common practice: latitude + 10° to 20°).
		if tilt <= math.Abs(tt.lat) || tilt > 90 {
			t.Errorf("%s: tilt %g, want steeper than the latitude", tt.name, tilt)
		}
		ok := false
		for _, m := range tt.winterLike {
			ok = ok || dm == m
		}
		if !ok {
			t.Errorf("%s: design month %d, want one of %v", tt.name, dm, tt.winterLike)
		}
		best := worstAt(tt.lat, tt.ghi, tt.az, tilt)
		for _, other := range []float64{0, math.Abs(tt.lat), tilt - 1, tilt + 1, 90} {
			if other < 0 || other > 90 {
				continue
			}
			if w := worstAt(tt.lat, tt.ghi, tt.az, other); w < best-1e-9 {
				t.Errorf("%s: tilt %g beats the optimum %g (%g < %g)", tt.name, other, tilt, w, best)
			}
		}
	}
	// No demand: still a sensible tilt; polar night with demand: error.
	if _, _, err := OptimiseTilt(43, demoGHINorth, [12]float64{}, 180, 0.2, nil); err != nil {
		t.Errorf("no demand: %v", err)
	}
	polar := polarGHI(75)
	if _, dm, err := OptimiseTilt(75, polar, flat, 180, 0.2, nil); err == nil || dm != 1 {
		t.Errorf("polar night with demand: design month %d, err %v; want month 1 and an error", dm, err)
	}
}

func FuzzHorizonElevation(f *testing.F) {
	f.Add(90.0, 10.0, 180.0, 20.0, 270.0, 0.0, 45.0)
	f.Add(0.0, 90.0, 359.9, 0.0, 359.95, 5.0, -720.0)
	f.Fuzz(func(t *testing.T, a1, e1, a2, e2, a3, e3, q float64) {
		h := Horizon{{a1, e1}, {a2, e2}, {a3, e3}}
		if h.Validate() != nil || math.IsNaN(q) || math.IsInf(q, 0) {
			return
		}
		lo, hi := math.Min(e1, math.Min(e2, e3)), math.Max(e1, math.Max(e2, e3))
		got := h.ElevationAtDeg(q)
		if math.IsNaN(got) || got < lo-1e-9 || got > hi+1e-9 {
			t.Fatalf("ElevationAtDeg(%g) = %g outside [%g, %g] for %+v", q, got, lo, hi, h)
		}
		for _, p := range h {
			if v := h.ElevationAtDeg(p.AzimuthDeg); math.Abs(v-p.ElevationDeg) > 1e-9 {
				t.Fatalf("at surveyed point %+v: %g", p, v)
			}
		}
	})
}

func BenchmarkOptimiseTilt(b *testing.B) {
	demand := [12]float64{900, 900, 900, 900, 900, 900, 900, 900, 900, 900, 900, 900}
	for b.Loop() {
		if _, _, err := OptimiseTilt(43, demoGHINorth, demand, 190, 0.2, nil); err != nil {
			b.Fatal(err)
		}
	}
}
