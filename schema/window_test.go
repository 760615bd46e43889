package schema

import (
	"strings"
	"testing"
)

// The expected minutes are plain clock arithmetic (HH × 60 + MM).
func TestParseWindow(t *testing.T) {
	tests := []struct {
		in         string
		start, end int
		lengthMin  int
		wantErr    string
	}{
		{in: "18:00-22:30", start: 1080, end: 1350, lengthMin: 270},
		{in: "21:00-06:00", start: 1260, end: 360, lengthMin: 540}, // across midnight: 3 h + 6 h
		{in: "00:00-24:00", start: 0, end: 1440, lengthMin: 1440},
		{in: "00:00-00:00", start: 0, end: 0, lengthMin: 1440},        // equal ends: a whole day
		{in: "18:00-18:00", start: 1080, end: 1080, lengthMin: 1440},  // equal ends: a whole day from 18:00
		{in: " 8:00 - 17:00 ", start: 480, end: 1020, lengthMin: 540}, // one-digit hour, spaces
		{in: "23:59-00:01", start: 1439, end: 1, lengthMin: 2},        // across midnight, 2 min
		{in: "18:30-19:15", start: 1110, end: 1155, lengthMin: 45},    // partial hours
		{in: "22:00-00:00", start: 1320, end: 0, lengthMin: 120},      // end at midnight written 00:00
		{in: "22:00-24:00", start: 1320, end: 1440, lengthMin: 120},   // the same with 24:00
		{in: "24:00-06:00", wantErr: "hour must be 00..23"},           // 24:00 is an end only
		{in: "18:00", wantErr: "clock window"},                        // no dash
		{in: "18:60-19:00", wantErr: "minutes must be 00..59"},        // bad minutes
		{in: "25:00-26:00", wantErr: "hour must be 00..23"},           // bad hour
		{in: "18:0-19:00", wantErr: "HH:MM"},                          // one-digit minutes
		{in: "18:00-24:01", wantErr: "hour must be 00..23 (or 24:00"}, // past 24:00
		{in: "6pm-10pm", wantErr: "HH:MM"},                            // words
		{in: "", wantErr: "clock window"},                             // empty
		{in: "-1:00-02:00", wantErr: "HH:MM"},                         // sign
		{in: "１８:00-19:00", wantErr: "HH:MM"},                         // non-ASCII digits
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			a, b, err := ParseWindow(tt.in)
			if tt.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tt.wantErr) {
					t.Fatalf("ParseWindow(%q) error = %v, want one containing %q", tt.in, err, tt.wantErr)
				}
				return
			}
			if err != nil {
				t.Fatalf("ParseWindow(%q): %v", tt.in, err)
			}
			if a != tt.start || b != tt.end {
				t.Errorf("ParseWindow(%q) = %d, %d; want %d, %d", tt.in, a, b, tt.start, tt.end)
			}
			if n := WindowMinutes(a, b); n != tt.lengthMin {
				t.Errorf("WindowMinutes = %d, want %d", n, tt.lengthMin)
			}
			seg := 0
			for _, s := range WindowSegments(a, b) {
				if s[0] < 0 || s[1] > MinutesPerDay || s[1] <= s[0] {
					t.Errorf("bad segment %v", s)
				}
				seg += s[1] - s[0]
			}
			if seg != tt.lengthMin {
				t.Errorf("segments cover %d min, want %d", seg, tt.lengthMin)
			}
		})
	}
}

// The named windows are those documented for spread_window.
func TestSpreadWindow(t *testing.T) {
	tests := []struct {
		name       string
		start, end int
		ok         bool
	}{
		{"daytime", 480, 1020, true},
		{"evening", 1080, 1380, true},
		{"night", 1080, 360, true},
		{"allday", 0, 1440, true},
		{"Evening", 0, 0, false},
		{"", 0, 0, false},
	}
	for _, tt := range tests {
		a, b, ok := SpreadWindow(tt.name)
		if a != tt.start || b != tt.end || ok != tt.ok {
			t.Errorf("SpreadWindow(%q) = %d, %d, %v; want %d, %d, %v", tt.name, a, b, ok, tt.start, tt.end, tt.ok)
		}
	}
}

func TestParseSpread(t *testing.T) {
	tests := []struct {
		in         string
		start, end int
		wantErr    bool
	}{
		{"", 1080, 1380, false}, // default evening
		{"night", 1080, 360, false},
		{"17:30-22:00", 1050, 1320, false},
		{"dusk", 0, 0, true},
		{"17:30-25:00", 0, 0, true},
	}
	for _, tt := range tests {
		a, b, err := ParseSpread(tt.in)
		if (err != nil) != tt.wantErr || (!tt.wantErr && (a != tt.start || b != tt.end)) {
			t.Errorf("ParseSpread(%q) = %d, %d, %v", tt.in, a, b, err)
		}
	}
}

func TestWindowOverlapMin(t *testing.T) {
	tests := []struct {
		a, b string
		want int
	}{
		{"18:00-22:00", "21:00-23:00", 60},
		{"18:00-22:00", "22:00-23:00", 0},  // touching ends do not overlap
		{"21:00-06:00", "05:00-07:00", 60}, // across midnight
		{"21:00-06:00", "20:00-22:00", 60},
		{"00:00-00:00", "10:00-10:30", 30}, // whole day
		{"08:00-12:00", "13:00-17:00", 0},
	}
	for _, tt := range tests {
		a0, a1, _ := ParseWindow(tt.a)
		b0, b1, _ := ParseWindow(tt.b)
		if got := windowOverlapMin(a0, a1, b0, b1); got != tt.want {
			t.Errorf("overlap(%s, %s) = %d, want %d", tt.a, tt.b, got, tt.want)
		}
	}
}

func FuzzParseWindow(f *testing.F) {
	for _, s := range []string{"18:00-22:30", "21:00-06:00", "00:00-24:00", "00:00-00:00", "8:00-9:00", "24:00-01:00", "x", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		a, b, err := ParseWindow(s)
		if err != nil {
			return
		}
		if a < 0 || a >= MinutesPerDay || b < 0 || b > MinutesPerDay {
			t.Fatalf("ParseWindow(%q) = %d, %d out of range", s, a, b)
		}
		n := WindowMinutes(a, b)
		if n <= 0 || n > MinutesPerDay {
			t.Fatalf("WindowMinutes(%d, %d) = %d", a, b, n)
		}
		// The canonical form reads back to the same window.
		a2, b2, err := ParseWindow(FormatWindow(a, b))
		if err != nil || a2 != a || b2 != b {
			t.Fatalf("round trip of %q via %q: %d, %d, %v", s, FormatWindow(a, b), a2, b2, err)
		}
	})
}

func FuzzParseSpread(f *testing.F) {
	for _, s := range []string{"", "evening", "night", "17:30-22:00", "dusk", "allday-"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		a, b, err := ParseSpread(s)
		if err != nil {
			return
		}
		if n := WindowMinutes(a, b); a < 0 || a >= MinutesPerDay || b < 0 || b > MinutesPerDay || n <= 0 || n > MinutesPerDay {
			t.Fatalf("ParseSpread(%q) = %d, %d", s, a, b)
		}
	})
}
