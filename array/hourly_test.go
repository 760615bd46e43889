package array

import (
	"math"
	"testing"
)

func sum24(a *[24]float64) float64 {
	s := 0.0
	for _, v := range a {
		s += v
	}
	return s
}

func argmax24(a *[24]float64) int {
	best := 0
	for h := range a {
		if a[h] > a[best] {
			best = h
		}
	}
	return best
}

func TestCollaresPereiraRablAndLiuJordan(t *testing.T) {
	// r_t and r_d are hourly shares of the day (Duffie & Beckman 2013
	// §2.13): summed over the hour centres they come close to 1 (computed;
	// r_d integrates to exactly 1, the midpoint sum within 1 %; r_t within
	// 2 % as the Collares-Pereira & Rabl fit is not normalised).
	for _, ws := range []float64{60, 75, 90, 105, 120} {
		var st, sd float64
		for h := 0; h < 24; h++ {
			w := (float64(h) + 0.5 - 12) * 15
			st += CollaresPereiraRablRt(w, ws)
			sd += LiuJordanRd(w, ws)
		}
		near(t, "sum r_d", sd, 1, 0.01)
		near(t, "sum r_t", st, 1, 0.02)
	}
	if CollaresPereiraRablRt(100, 90) != 0 || LiuJordanRd(-100, 90) != 0 || LiuJordanRd(0, 0) != 0 {
		t.Error("outside the day the shares are not 0")
	}
	// Symmetry about solar noon and the peak at noon.
	near(t, "symmetry", CollaresPereiraRablRt(-30, 100), CollaresPereiraRablRt(30, 100), 1e-15)
	if CollaresPereiraRablRt(0, 100) <= CollaresPereiraRablRt(15, 100) {
		t.Error("r_t does not peak at solar noon")
	}
}

func demoSite(lat, lon, utc, tilt, az float64, model Transposition) HourlySite {
	return HourlySite{LatDeg: lat, LonDeg: lon, UTCOffsetH: utc,
		Plane: Plane{TiltDeg: tilt, AzimuthDeg: az, AlbedoFraction: 0.2}, Model: model}
}

func TestHourlyHorizontalReturnsGHI(t *testing.T) {
	// Energy balance (Duffie & Beckman 2013 eqs. 2.15.1 and 2.16.7 with
	// β = 0): a horizontal plane receives the horizontal irradiation, hour
	// by hour, and the hours add up to the day exactly.
	sites := []HourlySite{
		demoSite(43, -89.4, -6, 0, 180, IsotropicSky),
		demoSite(43, -89.4, -6, 0, 180, HDKR),
		demoSite(-33.9, 18.4, 2, 0, 0, HDKR),
		demoSite(0, 36.8, 3, 0, 180, IsotropicSky),
		demoSite(78.2, 15.6, 1, 0, 180, HDKR), // midnight sun in June
		demoSite(-77.8, 166.7, 12, 0, 0, IsotropicSky),
	}
	for _, s := range sites {
		for _, day := range []int{17, 105, 172, 258, 355} {
			for _, ghi := range []float64{300, 2500, 7500} {
				var g, p [24]float64
				HourlyIrradiation(&s, day, ghi, &g, &p)
				if sum24(&g) == 0 {
					continue // polar night
				}
				near(t, "sum ghi", sum24(&g), ghi, 1e-9*ghi)
				for h := range g {
					near(t, "hour", p[h], g[h], 1e-9*ghi)
				}
				var q [24]float64
				HourlyPOA(s, day, ghi, &q)
				if q != p {
					t.Errorf("HourlyPOA differs from HourlyIrradiation")
				}
				var f [24]float64
				HourlyPOAFromGHI(&s, day, &g, &f)
				for h := range g {
					near(t, "from ghi", f[h], g[h], 1e-9*ghi)
				}
			}
		}
	}
}

func TestHourlyClock(t *testing.T) {
	// Solar noon falls at clock 12:00 − (λ − 15·UTC)/15 h − E/60 (Duffie &
	// Beckman 2013 eq. 1.5.2). On its zone meridian in mid-April (E ≈ 0)
	// the brightest clock hour is 11 or 12; 15° east of it, an hour earlier.
	var out [24]float64
	s := demoSite(43, -90, -6, 0, 180, IsotropicSky)
	HourlyPOA(s, 105, 5000, &out)
	if h := argmax24(&out); h != 11 && h != 12 {
		t.Errorf("on the meridian: brightest hour %d", h)
	}
	near(t, "symmetric about noon", out[11], out[12], 0.05*out[11])
	s.LonDeg = -75
	HourlyPOA(s, 105, 5000, &out)
	if h := argmax24(&out); h != 10 && h != 11 {
		t.Errorf("15° east of the meridian: brightest hour %d", h)
	}
	near(t, "symmetric about 11:00", out[10], out[11], 0.05*out[10])
	// Night hours are dark.
	for _, h := range []int{0, 1, 2, 3, 21, 22, 23} {
		if out[h] != 0 {
			t.Errorf("hour %d: %g Wh/m² at night", h, out[h])
		}
	}
}

func TestHourlyTilted(t *testing.T) {
	// Computed from the published equations: in winter an equator-facing
	// tilted plane receives more than the horizontal, in both hemispheres,
	// and HDKR's circumsolar term adds to the isotropic value on a clear
	// day (Duffie & Beckman 2013 §2.16).
	tests := []struct {
		name string
		site HourlySite
		day  int
		ghi  float64
	}{
		{"north winter", demoSite(43, -89.4, -6, 60, 180, IsotropicSky), 355, 2200},
		{"south winter", demoSite(-33.9, 18.4, 2, 45, 0, IsotropicSky), 172, 3000},
		{"vertical south winter", demoSite(52, 0, 0, 90, 180, IsotropicSky), 17, 1200},
	}
	for _, tt := range tests {
		var p [24]float64
		HourlyPOA(tt.site, tt.day, tt.ghi, &p)
		iso := sum24(&p)
		if iso <= tt.ghi {
			t.Errorf("%s: plane %g Wh/m² not above horizontal %g", tt.name, iso, tt.ghi)
		}
		tt.site.Model = HDKR
		HourlyPOA(tt.site, tt.day, tt.ghi, &p)
		if h := sum24(&p); h <= iso {
			t.Errorf("%s: HDKR %g not above isotropic %g", tt.name, h, iso)
		}
		finite(t, tt.name, p[:]...)
	}
}

func TestHourlyOneHourByHand(t *testing.T) {
	// One hour recomputed from the published equations: Erbs hourly
	// diffuse fraction (eq. 2.10.1) and the isotropic sky (eq. 2.15.1) with
	// R_b = cos θ / cos θz at the hour's centre (eq. 1.8.1). On the zone
	// meridian the centre of clock hour 11 is solar time 11:30 + E. The
	// package averages six sub-steps instead of the centre; they agree to
	// about 0.5 %.
	s := demoSite(43, -90, -6, 45, 180, IsotropicSky)
	var g, p [24]float64
	HourlyIrradiation(&s, 105, 6000, &g, &p)
	h := 11 // 11:00–12:00 clock
	centre := 11.5 + EquationOfTimeMin(105)/60
	sun := SunAtSolarTime(43, 105, centre)
	cz := math.Cos((90 - sun.TrueElevationDeg) * deg)
	i0 := SolarConstantWM2 * eccentricity(105) * cz
	kt := g[h] / i0
	fd := ErbsHourlyDiffuseFraction(kt)
	sun.ZenithDeg = 90 - sun.TrueElevationDeg
	rb := math.Cos(IncidenceDeg(sun, 45, 180)*deg) / cz
	cb := math.Cos(45 * deg)
	want := g[h]*(1-fd)*rb + g[h]*fd*(1+cb)/2 + g[h]*0.2*(1-cb)/2
	near(t, "hour 11", p[h], want, 0.005*want)
}

func TestHourlyEdges(t *testing.T) {
	var p, g [24]float64
	// Polar night: all zero, no NaN.
	HourlyIrradiation(&HourlySite{LatDeg: 80, Plane: Plane{TiltDeg: 60, AzimuthDeg: 180}}, 355, 100, &g, &p)
	if sum24(&p) != 0 || sum24(&g) != 0 {
		t.Errorf("polar night: %g Wh/m²", sum24(&p))
	}
	// Midnight sun: light in the midnight hour.
	s := demoSite(80, 0, 0, 0, 180, HDKR)
	HourlyIrradiation(&s, 172, 6000, &g, &p)
	if !(g[0] > 0 && g[23] > 0) {
		t.Errorf("midnight sun: hours 0 and 23 dark (%g, %g)", g[0], g[23])
	}
	// A horizon that blocks everything leaves diffuse and ground only, so
	// a south-facing plane gets less than with an open sky.
	s = demoSite(43, -90, -6, 45, 180, IsotropicSky)
	var open [24]float64
	HourlyPOA(s, 105, 6000, &open)
	s.Plane.Horizon = Horizon{{AzimuthDeg: 0, ElevationDeg: 90}}
	HourlyPOA(s, 105, 6000, &p)
	HourlyIrradiation(&s, 105, 6000, &g, nil)
	cb := math.Cos(45 * deg)
	for h := range p {
		if p[h] > open[h] {
			t.Errorf("hour %d: horizon raised irradiation", h)
		}
		if g[h] > 0 && p[h] >= g[h]*((1+cb)/2+0.2*(1-cb)/2)+1e-9 {
			t.Errorf("hour %d: %g with the beam blocked, more than all-diffuse %g", h, p[h], g[h])
		}
	}
	// Tilt 90 facing north at 43° N in winter: no beam at all.
	s = demoSite(43, -90, -6, 90, 0, HDKR)
	HourlyPOA(s, 355, 2000, &p)
	finite(t, "north wall", p[:]...)
	// Invalid inputs give zeros, not NaN.
	for _, bad := range []HourlySite{
		{LatDeg: math.NaN()}, {LatDeg: 100}, {Plane: Plane{TiltDeg: math.NaN()}}, {Plane: Plane{AlbedoFraction: -1}},
	} {
		HourlyPOA(bad, 100, 5000, &p)
		if sum24(&p) != 0 {
			t.Errorf("invalid site %+v gave %g", bad, sum24(&p))
		}
		if bad.Validate() == nil {
			t.Errorf("invalid site %+v validated", bad)
		}
	}
	HourlyPOA(demoSite(43, 0, 0, 30, 180, HDKR), 100, math.NaN(), &p)
	if sum24(&p) != 0 {
		t.Error("NaN day gave irradiation")
	}
	// Weather-file hours before sunrise are taken as diffuse.
	var in [24]float64
	in[3] = 5
	HourlyPOAFromGHI(&s, 172, &in, &p)
	near(t, "pre-dawn diffuse", p[3], 5*(1+0)/2.0+5*0.2*(1-0)/2, 1e-12)
}

func TestHourlyNoAlloc(t *testing.T) {
	s := demoSite(43, -89.4, -6, 45, 200, HDKR)
	s.Plane.Horizon = Horizon{{AzimuthDeg: 90, ElevationDeg: 5}, {AzimuthDeg: 180, ElevationDeg: 12}, {AzimuthDeg: 270, ElevationDeg: 3}}
	var out [24]float64
	n := testing.AllocsPerRun(50, func() { HourlyPOA(s, 105, 5000, &out) })
	if n != 0 {
		t.Errorf("HourlyPOA allocates %g times per call", n)
	}
}

func BenchmarkHourlyPOA(b *testing.B) {
	s := demoSite(43, -89.4, -6, 45, 200, HDKR)
	s.Plane.Horizon = Horizon{{AzimuthDeg: 90, ElevationDeg: 5}, {AzimuthDeg: 180, ElevationDeg: 12}, {AzimuthDeg: 270, ElevationDeg: 3}}
	var out [24]float64
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		HourlyPOA(s, 1+i%365, 5000, &out)
	}
}

func BenchmarkMonthlyResource(b *testing.B) {
	p := Plane{TiltDeg: 45, AzimuthDeg: 200, AlbedoFraction: 0.2}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := MonthlyResource(43, demoGHINorth, p); err != nil {
			b.Fatal(err)
		}
	}
}

func FuzzHourlyPOA(f *testing.F) {
	f.Add(43.0, -89.4, -6.0, 45.0, 180.0, 0.2, 105, 5000.0, false)
	f.Add(-80.0, 170.0, 12.0, 90.0, 0.0, 0.8, 355, 9000.0, true)
	f.Add(0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 1, 0.0, true)
	f.Fuzz(func(t *testing.T, lat, lon, utc, tilt, az, albedo float64, day int, ghi float64, hdkr bool) {
		s := HourlySite{LatDeg: lat, LonDeg: lon, UTCOffsetH: utc, Plane: Plane{TiltDeg: tilt, AzimuthDeg: az, AlbedoFraction: albedo}}
		if hdkr {
			s.Model = HDKR
		}
		var g, p [24]float64
		HourlyIrradiation(&s, day, ghi, &g, &p)
		for h := range p {
			if math.IsNaN(p[h]) || math.IsInf(p[h], 0) || p[h] < 0 || math.IsNaN(g[h]) || g[h] < 0 {
				t.Fatalf("hour %d: ghi %g poa %g", h, g[h], p[h])
			}
		}
		if tot := sum24(&g); tot != 0 && math.Abs(tot-ghi) > 1e-9*math.Abs(ghi) {
			t.Fatalf("hours sum to %g, day %g", tot, ghi)
		}
	})
}
