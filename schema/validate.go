package schema

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"reflect"
	"slices"
	"sort"
	"strconv"
	"strings"

	sjs "github.com/santhosh-tekuri/jsonschema/v6"
	"github.com/santhosh-tekuri/jsonschema/v6/kind"
	"golang.org/x/text/language"
	"golang.org/x/text/message"
)

// Limits on the size of a project document. A stand-alone system with more
// than a few hundred appliances is a mistake in the input, not a design.
const (
	MaxDocumentBytes = 4 << 20 // 4 MiB
	MaxLoads         = 2000
	MaxWindows       = 24
	MaxHorizonPoints = 720
)

// Problem is one thing wrong with a document, at a JSON path such as
// `loads[2].power_w`.
type Problem struct {
	Path    string
	Message string
}

func (p Problem) String() string {
	if p.Path == "" {
		return p.Message
	}
	return p.Path + ": " + p.Message
}

// Problems is every problem found in one pass; it is an error.
type Problems []Problem

func (ps Problems) Error() string {
	lines := make([]string, len(ps))
	for i, p := range ps {
		lines[i] = p.String()
	}
	return strings.Join(lines, "\n")
}

// DecodeOptions change how a document is checked.
type DecodeOptions struct {
	// WeatherFile stands in for the site's monthly means (the --weather flag).
	WeatherFile string
}

// Decode decodes a project document, checks it against the schema, applies
// the defaults and checks its physical sense. On any problem it returns
// Problems (every problem found, in document order where possible).
func Decode(data []byte) (*Project, error) { return DecodeWith(data, DecodeOptions{}) }

// DecodeWith is Decode with options.
func DecodeWith(data []byte, opt DecodeOptions) (*Project, error) {
	if len(data) > MaxDocumentBytes {
		return nil, Problems{{Message: fmt.Sprintf("document is %.1f MB; the limit is %d MB (a project describes one site; split a fleet into one file per site)", float64(len(data))/(1<<20), MaxDocumentBytes>>20)}}
	}
	// A byte-order mark, as some editors write at the start of a UTF-8
	// file, is not part of the JSON.
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	if ps := syntax(data); ps != nil {
		return nil, ps
	}
	if n := countLoads(data); n > MaxLoads {
		return nil, Problems{{Path: "loads", Message: fmt.Sprintf("has %d entries; the limit is %d", n, MaxLoads)}}
	}
	sps := structural(data)
	locationFromWeather := false
	if opt.WeatherFile != "" || siteHas(data, "weather_file") {
		// The location may come from the weather file instead.
		if !siteHas(data, "latitude_deg") && !siteHas(data, "longitude_deg") {
			sps = dropRequired(sps, "site.latitude_deg", "site.longitude_deg")
			locationFromWeather = true
		}
	}
	var p Project
	dec := json.NewDecoder(bytes.NewReader(data))
	if len(sps) == 0 {
		dec.DisallowUnknownFields()
	}
	if err := dec.Decode(&p); err != nil {
		if len(sps) > 0 {
			return nil, sps
		}
		return nil, Problems{decodeProblem(data, err)}
	}
	if opt.WeatherFile != "" {
		p.Site.WeatherFile = opt.WeatherFile
	}
	p.Site.LocationFromWeather = locationFromWeather
	ApplyDefaults(&p)
	// The physical checks run even when the schema found problems, so that
	// every problem comes out in one pass; a check at or below a path the
	// schema already faulted (a missing or mistyped value) is left out.
	var ps Problems
	ps = append(ps, sps...)
	for _, c := range Check(&p) {
		if !underAny(c.Path, sps) {
			ps = append(ps, c)
		}
	}
	if len(ps) > 0 {
		return nil, ps
	}
	return &p, nil
}

// underAny reports whether path is one of the problem paths or lies below one.
func underAny(path string, ps Problems) bool {
	for _, p := range ps {
		if p.Path == "" {
			continue
		}
		if path == p.Path || strings.HasPrefix(path, p.Path+".") || strings.HasPrefix(path, p.Path+"[") {
			return true
		}
	}
	return false
}

// syntax reports a JSON syntax error with its line and column.
func syntax(data []byte) Problems {
	var v any
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber() // a number beyond float64 is a range problem, found later with its path
	err := dec.Decode(&v)
	if err == nil {
		off := dec.InputOffset()
		if _, err2 := dec.Token(); err2 != io.EOF {
			for off < int64(len(data)) && strings.IndexByte(" \t\r\n", data[off]) >= 0 {
				off++
			}
			line, col := lineCol(data, off)
			return Problems{{Message: fmt.Sprintf("line %d, column %d: unexpected data after the document", line, col)}}
		}
		if _, ok := v.(map[string]any); !ok {
			return Problems{{Message: "the document must be a JSON object"}}
		}
		return nil
	}
	var se *json.SyntaxError
	if errors.As(err, &se) {
		// Offset counts the offending byte itself; the column is that byte's.
		line, col := lineCol(data, max(se.Offset-1, 0))
		return Problems{{Message: fmt.Sprintf("line %d, column %d: JSON syntax: %s", line, col, se.Error())}}
	}
	if errors.Is(err, io.ErrUnexpectedEOF) || errors.Is(err, io.EOF) {
		line, col := lineCol(data, int64(len(data)))
		return Problems{{Message: fmt.Sprintf("line %d, column %d: the document ends early (truncated file?)", line, col)}}
	}
	return Problems{{Message: "JSON: " + err.Error()}}
}

func lineCol(data []byte, off int64) (int, int) {
	if off > int64(len(data)) {
		off = int64(len(data))
	}
	line, col := 1, 1
	for _, b := range data[:off] {
		if b == '\n' {
			line++
			col = 1
		} else {
			col++
		}
	}
	return line, col
}

// countLoads counts the entries of the top-level "loads" array without
// decoding them, so a huge inventory is refused quickly.
func countLoads(data []byte) int {
	var top map[string]json.RawMessage
	if json.Unmarshal(data, &top) != nil {
		return 0
	}
	raw, ok := top["loads"]
	if !ok {
		return 0
	}
	dec := json.NewDecoder(bytes.NewReader(raw))
	if t, err := dec.Token(); err != nil || t != json.Delim('[') {
		return 0
	}
	n := 0
	for dec.More() {
		var skip json.RawMessage
		if dec.Decode(&skip) != nil {
			break
		}
		n++
	}
	return n
}

// decodeProblem turns an error of the final decode (which the schema let
// through: a number beyond the range of its Go type) into a Problem at the
// value's path.
func decodeProblem(data []byte, err error) Problem {
	var te *json.UnmarshalTypeError
	if errors.As(err, &te) {
		want := te.Type.String()
		switch te.Type.Kind() {
		case reflect.Int, reflect.Int64:
			want = "a whole number"
		case reflect.Uint64:
			want = "a whole number from 0 to 18446744073709551615"
		case reflect.Float64:
			want = "a number between -1.8e308 and 1.8e308"
		}
		path := te.Field
		if p, ok := pathAt(data, te.Offset); ok {
			path = p
		}
		return Problem{Path: path, Message: fmt.Sprintf("must be %s, got %s", want, te.Value)}
	}
	return Problem{Message: err.Error()}
}

// pathAt returns the JSON path (`loads[2].months[0]`) of the first scalar
// value that ends at or after byte offset off of a syntactically valid
// document.
func pathAt(data []byte, off int64) (string, bool) {
	type frame struct {
		array bool
		index int
		key   string
		atKey bool // an object awaiting its next key
	}
	var stack []frame
	path := func() string {
		var b strings.Builder
		for i, f := range stack {
			switch {
			case f.array:
				fmt.Fprintf(&b, "[%d]", f.index)
			default:
				if i > 0 {
					b.WriteByte('.')
				}
				b.WriteString(f.key)
			}
		}
		return b.String()
	}
	// value is called after a whole value; it advances the enclosing frame.
	value := func() {
		if n := len(stack); n > 0 {
			if stack[n-1].array {
				stack[n-1].index++
			} else {
				stack[n-1].atKey = true
			}
		}
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	for {
		tok, err := dec.Token()
		if err != nil {
			return "", false
		}
		n := len(stack)
		if n > 0 && !stack[n-1].array && stack[n-1].atKey {
			if k, ok := tok.(string); ok {
				stack[n-1].key, stack[n-1].atKey = k, false
				continue
			}
		}
		switch tok {
		case json.Delim('{'):
			stack = append(stack, frame{atKey: true})
		case json.Delim('['):
			stack = append(stack, frame{array: true})
		case json.Delim('}'), json.Delim(']'):
			stack = stack[:n-1]
			value()
		default:
			if dec.InputOffset() >= off {
				return path(), true
			}
			value()
		}
	}
}

// structural checks the document against the generated JSON Schema.
func structural(data []byte) Problems {
	c, err := compileOnce()
	if err != nil {
		return Problems{{Message: "internal: schema: " + err.Error()}}
	}
	inst, err := sjs.UnmarshalJSON(bytes.NewReader(data))
	if err != nil {
		return Problems{{Message: "JSON: " + err.Error()}}
	}
	err = c.schema.Validate(inst)
	if err == nil {
		return nil
	}
	var ve *sjs.ValidationError
	if !errors.As(err, &ve) {
		return Problems{{Message: err.Error()}}
	}
	pr := message.NewPrinter(language.English)
	var out Problems
	var walk func(e *sjs.ValidationError)
	walk = func(e *sjs.ValidationError) {
		if len(e.Causes) > 0 {
			if _, isOneOf := e.ErrorKind.(*kind.OneOf); !isOneOf {
				for _, c2 := range e.Causes {
					walk(c2)
				}
				return
			}
		}
		out = append(out, leafProblems(c.tree, e, pr)...)
	}
	walk(ve)
	sort.SliceStable(out, func(i, j int) bool { return pathLess(out[i].Path, out[j].Path) })
	return dedupe(out)
}

// pathLess orders JSON paths with array indices by number, so that
// loads[2] comes before loads[10].
func pathLess(a, b string) bool {
	for a != "" && b != "" {
		da, db := digitRun(a), digitRun(b)
		if da > 0 && db > 0 {
			na, _ := strconv.Atoi(a[:da])
			nb, _ := strconv.Atoi(b[:db])
			if na != nb {
				return na < nb
			}
			a, b = a[da:], b[db:]
			continue
		}
		if a[0] != b[0] {
			return a[0] < b[0]
		}
		a, b = a[1:], b[1:]
	}
	return len(a) < len(b)
}

func digitRun(s string) int {
	n := 0
	for n < len(s) && n < 9 && s[n] >= '0' && s[n] <= '9' {
		n++
	}
	return n
}

func dedupe(ps Problems) Problems {
	seen := map[string]bool{}
	var out Problems
	for _, p := range ps {
		k := p.String()
		if !seen[k] {
			seen[k] = true
			out = append(out, p)
		}
	}
	return out
}

func leafProblems(tree map[string]any, e *sjs.ValidationError, pr *message.Printer) Problems {
	path := JoinPath(e.InstanceLocation)
	switch k := e.ErrorKind.(type) {
	case *kind.AdditionalProperties:
		known := knownKeys(tree, e.InstanceLocation)
		var ps Problems
		for _, prop := range k.Properties {
			msg := "unknown key"
			if s := closest(prop, known); s != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", s)
			}
			// joined by hand: an unknown key may look like an array index ("7")
			at := prop
			if path != "" {
				at = path + "." + prop
			}
			ps = append(ps, Problem{Path: at, Message: msg})
		}
		return ps
	case *kind.Required:
		var ps Problems
		for _, m := range k.Missing {
			ps = append(ps, Problem{Path: JoinPath(append(append([]string{}, e.InstanceLocation...), m)), Message: "is required"})
		}
		return ps
	case *kind.Type:
		return Problems{{Path: path, Message: fmt.Sprintf("must be %s, got %s", strings.Join(k.Want, " or "), k.Got)}}
	case *kind.Enum:
		want := make([]string, len(k.Want))
		for i, w := range k.Want {
			want[i] = fmt.Sprint(w)
		}
		return Problems{{Path: path, Message: fmt.Sprintf("must be one of %s, got %v", strings.Join(want, ", "), k.Got)}}
	case *kind.Minimum:
		w, _ := k.Want.Float64()
		g, _ := k.Got.Float64()
		return Problems{{Path: path, Message: fmt.Sprintf("must be at least %g, got %g", w, g)}}
	case *kind.Maximum:
		w, _ := k.Want.Float64()
		g, _ := k.Got.Float64()
		return Problems{{Path: path, Message: fmt.Sprintf("must be at most %g, got %g", w, g)}}
	case *kind.OneOf:
		return Problems{{Path: path, Message: "must be a number or one of the words auto, optimise"}}
	default:
		return Problems{{Path: path, Message: e.ErrorKind.LocalizedString(pr)}}
	}
}

// JoinPath writes an instance location as `loads[2].power_w`.
func JoinPath(loc []string) string {
	var b strings.Builder
	for _, s := range loc {
		if _, err := strconv.Atoi(s); err == nil {
			b.WriteString("[" + s + "]")
			continue
		}
		if b.Len() > 0 {
			b.WriteByte('.')
		}
		b.WriteString(s)
	}
	return b.String()
}

// closest returns the known key nearest to s by edit distance, when it is
// near enough to be a likely typo.
func closest(s string, known []string) string {
	sort.Strings(known)
	best, bestD := "", math.MaxInt
	for _, k := range known {
		d := levenshtein(s, k)
		if d < bestD {
			best, bestD = k, d
		}
	}
	limit := max(2, len(s)/3)
	if bestD <= limit {
		return best
	}
	// a known key that contains the given one or is contained in it
	for _, k := range known {
		if len(s) >= 3 && (strings.Contains(k, s) || strings.Contains(s, k)) {
			return k
		}
	}
	return ""
}

func levenshtein(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}

// siteHas tells whether the document's site object has a key.
func siteHas(data []byte, key string) bool {
	var top struct {
		Site map[string]json.RawMessage `json:"site"`
	}
	if json.Unmarshal(data, &top) != nil {
		return false
	}
	_, ok := top.Site[key]
	return ok
}

// dropRequired removes the "is required" problems of the given paths.
func dropRequired(ps Problems, paths ...string) Problems {
	out := ps[:0:0]
	for _, p := range ps {
		if p.Message == "is required" && slices.Contains(paths, p.Path) {
			continue
		}
		out = append(out, p)
	}
	return out
}
