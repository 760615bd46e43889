package weather

// daysInMonth is the 365-day calendar (no 29 February). It is never written.
var daysInMonth = [12]int{31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31}

// firstDay is the 0-based day of the year of each month's first day in a
// 365-day year. It is never written.
var firstDay = [12]int{0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334}

// DaysPerYear is the length of every year here: 29 February is dropped.
const DaysPerYear = 365

// HoursPerYear is the number of hours in a 365-day year.
const HoursPerYear = DaysPerYear * 24

// DaysInMonth returns the number of days of month 1..12 in a 365-day year
// (February has 28). It returns 0 for a month outside 1..12.
func DaysInMonth(month int) int {
	if month < 1 || month > 12 {
		return 0
	}
	return daysInMonth[month-1]
}

// FirstDayOfMonth returns the 0-based day of a 365-day year on which month
// 1..12 starts (0 for January, 31 for February, ...), or -1 for a month
// outside 1..12.
func FirstDayOfMonth(month int) int {
	if month < 1 || month > 12 {
		return -1
	}
	return firstDay[month-1]
}

// DayOfYearMonth maps a 0-based day of a 365-day year to its month (1..12)
// and day of the month (1..31). A dayIndex outside 0..364 is taken modulo 365,
// so the index into a series of several synthetic years can be passed as it
// is.
func DayOfYearMonth(dayIndex int) (month, dayOfMonth int) {
	d := dayIndex % DaysPerYear
	if d < 0 {
		d += DaysPerYear
	}
	m := 11
	for m > 0 && firstDay[m] > d {
		m--
	}
	return m + 1, d - firstDay[m] + 1
}

// dayIndex returns the 0-based day of a 365-day year for a month and day, or
// -1 when the pair is not a day of that calendar (29 February included).
func dayIndex(month, day int) int {
	if month < 1 || month > 12 || day < 1 || day > daysInMonth[month-1] {
		return -1
	}
	return firstDay[month-1] + day - 1
}
