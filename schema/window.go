package schema

import (
	"fmt"
	"strings"
)

// MinutesPerDay is the length of a day in minutes.
const MinutesPerDay = 24 * 60

// ParseWindow reads a clock window "HH:MM-HH:MM" (hours may be written with
// one digit, "8:00"; spaces around the dash are allowed) and returns its
// start and end in minutes from midnight.
//
// Rules:
//   - the start is 00:00..23:59; the end is 00:00..24:00 ("24:00" is allowed
//     as an end only and means midnight at the end of the day);
//   - an end before the start runs across midnight: "21:00-06:00" is nine
//     hours, 21:00 to 24:00 and 00:00 to 06:00;
//   - an end equal to the start is a whole day of 24 hours beginning at the
//     start ("00:00-00:00" and "18:00-18:00" are both 24 h), so that a user
//     who writes the same time twice gets an always-on window, not an empty
//     one; "00:00-24:00" is the plain way to write the whole day.
//
// The returned endMin is 0..1440; use WindowMinutes for the length.
func ParseWindow(s string) (startMin, endMin int, err error) {
	t := strings.TrimSpace(s)
	a, b, ok := strings.Cut(t, "-")
	if !ok {
		return 0, 0, fmt.Errorf("must be a clock window like \"18:00-22:30\", got %q", s)
	}
	startMin, err = parseClockTime(strings.TrimSpace(a), false)
	if err != nil {
		return 0, 0, fmt.Errorf("start of window %q: %w", s, err)
	}
	endMin, err = parseClockTime(strings.TrimSpace(b), true)
	if err != nil {
		return 0, 0, fmt.Errorf("end of window %q: %w", s, err)
	}
	return startMin, endMin, nil
}

// parseClockTime reads "H:MM" or "HH:MM"; "24:00" only when allow24.
func parseClockTime(s string, allow24 bool) (int, error) {
	h, m, ok := strings.Cut(s, ":")
	if !ok || len(h) < 1 || len(h) > 2 || len(m) != 2 {
		return 0, fmt.Errorf("must be a time HH:MM, got %q", s)
	}
	hh, ok1 := clockDigits(h)
	mm, ok2 := clockDigits(m)
	if !ok1 || !ok2 {
		return 0, fmt.Errorf("must be a time HH:MM, got %q", s)
	}
	if mm > 59 {
		return 0, fmt.Errorf("minutes must be 00..59, got %q", s)
	}
	if hh == 24 && mm == 0 && allow24 {
		return MinutesPerDay, nil
	}
	if hh > 23 {
		if allow24 {
			return 0, fmt.Errorf("hour must be 00..23 (or 24:00 as an end), got %q", s)
		}
		return 0, fmt.Errorf("hour must be 00..23, got %q", s)
	}
	return hh*60 + mm, nil
}

// clockDigits reads a short string of ASCII digits.
func clockDigits(s string) (int, bool) {
	n := 0
	for _, c := range s {
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int(c-'0')
	}
	return n, len(s) > 0
}

// WindowMinutes is the length in minutes of a window returned by
// ParseWindow: end − start, plus a day when it runs across midnight, and a
// whole day (1440) when start and end name the same clock time.
func WindowMinutes(startMin, endMin int) int {
	d := endMin - startMin
	switch {
	case d > 0:
		return d
	case d < 0:
		return d + MinutesPerDay
	default:
		return MinutesPerDay
	}
}

// FormatWindow writes a window in the form ParseWindow reads, "HH:MM-HH:MM".
func FormatWindow(startMin, endMin int) string {
	return fmt.Sprintf("%02d:%02d-%02d:%02d", startMin/60, startMin%60, endMin/60, endMin%60)
}

// The named spread windows of hours_per_day.
var spreadWindows = [...]struct {
	name       string
	start, end int
}{
	{"daytime", 8 * 60, 17 * 60},
	{"evening", 18 * 60, 23 * 60},
	{"night", 18 * 60, 6 * 60},
	{"allday", 0, MinutesPerDay},
}

// SpreadWindow returns the clock window of a named spread window:
// 'daytime' 08:00-17:00, 'evening' 18:00-23:00, 'night' 18:00-06:00 (across
// midnight) and 'allday' 00:00-24:00. ok is false for any other name.
func SpreadWindow(name string) (startMin, endMin int, ok bool) {
	for _, w := range spreadWindows {
		if w.name == name {
			return w.start, w.end, true
		}
	}
	return 0, 0, false
}

// SpreadWindowNames lists the names SpreadWindow knows, in a fixed order.
func SpreadWindowNames() []string {
	out := make([]string, len(spreadWindows))
	for i, w := range spreadWindows {
		out[i] = w.name
	}
	return out
}

// ParseSpread reads a spread_window value: one of the names of SpreadWindow
// or a clock window for ParseWindow. The empty string is the default,
// 'evening'.
func ParseSpread(s string) (startMin, endMin int, err error) {
	if s == "" {
		s = "evening"
	}
	if a, b, ok := SpreadWindow(s); ok {
		return a, b, nil
	}
	if !strings.Contains(s, "-") {
		return 0, 0, fmt.Errorf("must be one of %s or a clock window like \"17:30-22:00\", got %q",
			strings.Join(SpreadWindowNames(), ", "), s)
	}
	return ParseWindow(s)
}

// WindowSegments splits a window returned by ParseWindow into at most two
// half-open minute ranges [from, to) inside one day [0, 1440): one for a
// window within the day, two for one across midnight.
func WindowSegments(startMin, endMin int) [][2]int {
	if endMin > startMin {
		return [][2]int{{startMin, endMin}}
	}
	var out [][2]int
	if startMin < MinutesPerDay {
		out = append(out, [2]int{startMin, MinutesPerDay})
	}
	if endMin > 0 && endMin != startMin {
		out = append(out, [2]int{0, endMin})
	} else if endMin == startMin && startMin > 0 {
		out = append(out, [2]int{0, startMin})
	}
	return out
}

// windowOverlapMin is the number of minutes two windows share.
func windowOverlapMin(a0, a1, b0, b1 int) int {
	n := 0
	for _, x := range WindowSegments(a0, a1) {
		for _, y := range WindowSegments(b0, b1) {
			lo, hi := max(x[0], y[0]), min(x[1], y[1])
			if hi > lo {
				n += hi - lo
			}
		}
	}
	return n
}
