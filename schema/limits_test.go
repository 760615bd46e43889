package schema

import (
	"bytes"
	"fmt"
	"strings"
	"testing"
)

// bigName is a valid example whose project name is padded to n bytes.
func bigName(tb testing.TB, n int) []byte {
	tb.Helper()
	const name = `"name": "Larch Hollow weekend cabin"`
	cabin := readExample(tb, "cabin")
	if !bytes.Contains(cabin, []byte(name)) {
		tb.Fatal("cabin.json changed its name")
	}
	return bytes.Replace(cabin, []byte(name), []byte(`"name": "`+strings.Repeat("x", n)+`"`), 1)
}

// emptyLoads is the cabin example with n empty objects as its loads: small
// enough to pass the size limit at 100 000 entries.
func emptyLoads(tb testing.TB, n int) []byte {
	tb.Helper()
	doc := mutate(tb, "cabin", set("loads", "@loads@"))
	return bytes.Replace(doc, []byte(`"@loads@"`), []byte("["+strings.Repeat("{},", n-1)+"{}]"), 1)
}

// manyLoads is the cabin example with its inventory replaced by n minimal
// DC loads, written compactly.
func manyLoads(tb testing.TB, n int) []byte {
	tb.Helper()
	const mark = `"@loads@"`
	doc := mutate(tb, "cabin", del("wiring.dc_branches"), set("loads", "@loads@"))
	var b bytes.Buffer
	b.WriteByte('[')
	for i := range n {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString(`{"name":"a","power_w":1,"hours_per_day":1}`)
	}
	b.WriteByte(']')
	return bytes.Replace(doc, []byte(mark), b.Bytes(), 1)
}

func TestDecodeLimits(t *testing.T) {
	tests := []struct {
		name     string
		data     []byte
		wantPath string
		wantGist string // "" means the document is accepted
	}{
		{"50 MB document", bigName(t, 50<<20), "", "document is 50.0 MB; the limit is 4 MB"},
		{"just above the size limit", bigName(t, MaxDocumentBytes), "", "the limit is 4 MB"},
		{"100 000 loads", manyLoads(t, 100_000), "", "the limit is 4 MB"},
		{"100 000 empty loads under the size limit", emptyLoads(t, 100_000), "loads", fmt.Sprintf("has 100000 entries; the limit is %d", MaxLoads)},
		{"one load above the loads limit", manyLoads(t, MaxLoads+1), "loads", fmt.Sprintf("has %d entries; the limit is %d", MaxLoads+1, MaxLoads)},
		{"at the loads limit", manyLoads(t, MaxLoads), "", ""},
		{"too many windows", mutate(t, "cabin", set("loads[0].windows", manyWindows(MaxWindows+1))), "loads[0].windows", fmt.Sprintf("has %d windows; the limit is %d", MaxWindows+1, MaxWindows)},
		{"too many horizon points", mutate(t, "cabin", set("site.horizon", manyHorizon(MaxHorizonPoints+1))), "site.horizon", fmt.Sprintf("has %d points; the limit is %d", MaxHorizonPoints+1, MaxHorizonPoints)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ps := problemsOf(t, tc.data)
			if tc.wantGist == "" {
				if ps != nil {
					t.Fatalf("refused:\n%v", ps)
				}
				return
			}
			if len(ps) != 1 {
				t.Fatalf("want one problem, got %d:\n%v", len(ps), firstLines(ps, 5))
			}
			if ps[0].Path != tc.wantPath || !strings.Contains(ps[0].Message, tc.wantGist) {
				t.Fatalf("got %q, want %s: …%s…", ps[0], tc.wantPath, tc.wantGist)
			}
		})
	}
}

// manyWindows is n one-minute windows that do not overlap.
func manyWindows(n int) []any {
	w := make([]any, n)
	for i := range w {
		w[i] = fmt.Sprintf("%02d:%02d-%02d:%02d", i/60, i%60, (i+1)/60, (i+1)%60)
	}
	return w
}

func manyHorizon(n int) []any {
	h := make([]any, n)
	for i := range h {
		h[i] = map[string]any{"azimuth_deg": float64(i%360) + 0.5, "elevation_deg": 5.0}
	}
	return h
}

func firstLines(ps Problems, n int) Problems {
	if len(ps) > n {
		return ps[:n]
	}
	return ps
}

// TestDecodeManyWindowsBounded: a single load with a huge windows list
// (under the size limit) is refused with the windows limit rather than
// checked pair by pair.
func TestDecodeManyWindowsBounded(t *testing.T) {
	ps := problemsOf(t, mutate(t, "cabin", set("loads[0].windows", manyWindows(MinutesPerDay-1))))
	if len(ps) != 1 || ps[0].Path != "loads[0].windows" || !strings.Contains(ps[0].Message, "the limit is") {
		t.Fatalf("got %d problems:\n%v", len(ps), firstLines(ps, 5))
	}
}

// BenchmarkDecodeRefuseLarge measures how fast over-limit documents are
// refused.
func BenchmarkDecodeRefuseLarge(b *testing.B) {
	for _, bc := range []struct {
		name string
		data []byte
	}{
		{"50MB", bigName(b, 50<<20)},
		{"2001loads", manyLoads(b, MaxLoads+1)},
		{"100000emptyloads", emptyLoads(b, 100_000)},
	} {
		b.Run(bc.name, func(b *testing.B) {
			b.SetBytes(int64(len(bc.data)))
			for b.Loop() {
				if _, err := Decode(bc.data); err == nil {
					b.Fatal("accepted")
				}
			}
		})
	}
}
