package provenance

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"unicode/utf8"
)

// The canonical JSON form, used for every digest in this package:
//
//   - objects with keys sorted by their UTF-8 bytes, no whitespace at all;
//   - strings with only these escapes: \" \\ \n \r \t, \u00XX for the other
//     control characters, and \u003c \u003e \u0026 for < > & so that the
//     text can sit inside an HTML script element; everything else is UTF-8
//     as is, and invalid UTF-8 is an error;
//   - numbers from strconv.FormatFloat(f, 'g', -1, 64): the shortest text
//     that reads back to the same float64 bits (-0 stays -0); NaN and the
//     infinities are an error;
//   - a nil slice is written as [].
//
// The same values always give the same bytes, on any machine.

// jsonObject is a JSON object under construction; canonical order is imposed
// when it is written.
type jsonObject map[string]any

// writeCanonical appends the canonical JSON of v, which may be a jsonObject,
// a []any, a resultList, a string, a float64 or a bool.
func writeCanonical(buf []byte, v any) ([]byte, error) {
	switch v := v.(type) {
	case jsonObject:
		return writeObject(buf, v)
	case []any:
		return writeArray(buf, v)
	case resultList:
		return writeResults(buf, v)
	case string:
		return writeString(buf, v)
	case float64:
		return writeNumber(buf, v)
	case bool:
		return strconv.AppendBool(buf, v), nil
	}
	return nil, fmt.Errorf("%w: cannot write %T as canonical json", ErrManifest, v)
}

func writeObject(buf []byte, o jsonObject) ([]byte, error) {
	buf, _, _, err := writeObjectMarking(buf, o, "")
	return buf, err
}

// writeObjectMarking writes o as writeObject does and returns the span
// buf[start:end] of the member named mark, with the comma that joins it to
// its neighbours, so that cutting the span out leaves the canonical JSON of
// o without that member. When o has no such member, start == end.
func writeObjectMarking(buf []byte, o jsonObject, mark string) (out []byte, start, end int, err error) {
	keys := make([]string, 0, len(o))
	for k := range o {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	buf = append(buf, '{')
	start, end = -1, -1
	for i, k := range keys {
		if i > 0 {
			buf = append(buf, ',')
		}
		if k == mark {
			start = len(buf) - 1 // the comma before it
			if i == 0 {
				start = len(buf)
			}
		}
		if buf, err = writeString(buf, k); err != nil {
			return nil, 0, 0, err
		}
		buf = append(buf, ':')
		if buf, err = writeCanonical(buf, o[k]); err != nil {
			return nil, 0, 0, fmt.Errorf("%s: %w", k, err)
		}
		if k == mark {
			end = len(buf)
			if i == 0 && len(keys) > 1 {
				end++ // the comma after it, written next
			}
		}
	}
	if start < 0 {
		start, end = len(buf), len(buf)
	}
	return append(buf, '}'), start, end, nil
}

func writeArray(buf []byte, a []any) ([]byte, error) {
	buf = append(buf, '[')
	var err error
	for i, v := range a {
		if i > 0 {
			buf = append(buf, ',')
		}
		if buf, err = writeCanonical(buf, v); err != nil {
			return nil, fmt.Errorf("[%d]: %w", i, err)
		}
	}
	return append(buf, ']'), nil
}

// resultList is the manifest's results, written as the array of objects
// {"name", "si", "unit"} (keys already in canonical order) that writeArray
// would write for them, with the same errors.
type resultList []Result

func writeResults(buf []byte, results resultList) ([]byte, error) {
	buf = append(buf, '[')
	var err error
	for i, r := range results {
		if i > 0 {
			buf = append(buf, ',')
		}
		buf = append(buf, `{"name":`...)
		if buf, err = writeString(buf, r.Name); err != nil {
			return nil, fmt.Errorf("[%d]: name: %w", i, err)
		}
		buf = append(buf, `,"si":`...)
		if buf, err = writeNumber(buf, r.SI); err != nil {
			return nil, fmt.Errorf("[%d]: si: %w", i, err)
		}
		buf = append(buf, `,"unit":`...)
		if buf, err = writeString(buf, r.Unit); err != nil {
			return nil, fmt.Errorf("[%d]: unit: %w", i, err)
		}
		buf = append(buf, '}')
	}
	return append(buf, ']'), nil
}

func writeNumber(buf []byte, f float64) ([]byte, error) {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return nil, fmt.Errorf("%w: number %v is not finite", ErrManifest, f)
	}
	return strconv.AppendFloat(buf, f, 'g', -1, 64), nil
}

func writeString(buf []byte, s string) ([]byte, error) {
	if !utf8.ValidString(s) {
		return nil, fmt.Errorf("%w: string %q is not valid utf-8", ErrManifest, s)
	}
	buf = append(buf, '"')
	for i := 0; i < len(s); i++ {
		buf = appendEscaped(buf, s[i])
	}
	return append(buf, '"'), nil
}

// appendEscaped appends one byte of a string. Bytes of multi-byte UTF-8
// sequences are all >= 0x80 and pass through unchanged.
func appendEscaped(buf []byte, c byte) []byte {
	const hex = "0123456789abcdef"
	switch c {
	case '"', '\\':
		return append(buf, '\\', c)
	case '\n':
		return append(buf, '\\', 'n')
	case '\r':
		return append(buf, '\\', 'r')
	case '\t':
		return append(buf, '\\', 't')
	}
	if c < 0x20 || c == '<' || c == '>' || c == '&' {
		return append(buf, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xf])
	}
	return append(buf, c)
}
