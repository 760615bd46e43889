// Package caution holds the one value type every part of solstand uses to
// report a safety or design caution: a stable code, a severity and a message
// a practitioner can act on.
package caution

// Severity grades a caution.
type Severity string

// The three severities of CONTRACT.md.
const (
	Info    Severity = "info"
	Warning Severity = "warning"
	Danger  Severity = "danger"
)

// Caution is one caution the design triggers, or a standing one.
type Caution struct {
	Code     string   `json:"code"`
	Severity Severity `json:"severity"`
	Message  string   `json:"message"`
}

// Rank orders severities for sorting: danger first.
func (s Severity) Rank() int {
	switch s {
	case Danger:
		return 0
	case Warning:
		return 1
	default:
		return 2
	}
}

// CodesNote is the sentence every output carries.
const CodesNote = "solstand is a design aid: local electrical codes and a licensed practitioner decide what is installed."
