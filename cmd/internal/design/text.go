package design

import (
	"bytes"
	"fmt"
	"unicode"
	"unicode/utf8"
)

// Limits on the shape of a design file, checked before the TOML parser
// sees it: the parser's time and memory grow with the square of the
// nesting depth and of the parts of a dotted key, and a design needs
// neither beyond a few (common practice for config formats; our choice).
const (
	maxNesting  = 16   // arrays and inline tables inside each other
	maxLineCode = 1024 // characters of a line outside strings and comments
)

var tripleDouble, tripleSingle = []byte(`"""`), []byte("'''")

// textProblem returns the first place where src is not a UTF-8 text a
// design file can be, with its line: a NUL or another control byte, a
// byte sequence that is not UTF-8 (such as a Latin-1 degree sign), arrays
// or inline tables nested deeper than maxNesting, or a line longer than
// maxLineCode outside its strings (a dotted key of thousands of parts).
// It returns 0 and "" when src is fine.
func textProblem(src []byte) (int, string) {
	line, depth, code := 1, 0, 0
	var quote string // the open string's delimiter: ", ', """ or '''
	comment := false
	for i := 0; i < len(src); {
		r, n := utf8.DecodeRune(src[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			return line, fmt.Sprintf("byte 0x%02X: not text in UTF-8 (a UTF-16 file, or a Latin-1 or Windows character such as a degree sign?); save the file as UTF-8, and write temperatures as \"220 C\"", src[i])
		case r == 0:
			return line, "a NUL byte: the file is binary, not text"
		case r < 32 && r != '\n' && r != '\r' && r != '\t', r == 0x7f:
			return line, fmt.Sprintf("the control character U+%04X: not text; a design file is plain text", r)
		}
		rest := src[i:]
		switch {
		case r == '\n':
			line++
			code, comment = 0, false
			if quote == `"` || quote == `'` {
				quote = "" // a one-line string ends at the line; the parser reports it
			}
		case comment:
		case quote != "":
			switch {
			case quote == `"` && r == '\\', quote == `"""` && r == '\\':
				n++ // skip the escaped character
			case bytes.HasPrefix(rest, []byte(quote)):
				n = len(quote)
				quote = ""
			}
		case r == '#':
			comment = true
		case bytes.HasPrefix(rest, tripleDouble), bytes.HasPrefix(rest, tripleSingle):
			quote, n = string(rest[:3]), 3
		case r == '"', r == '\'':
			quote = string(r)
		default:
			if code++; code > maxLineCode {
				return line, fmt.Sprintf("a line of over %d characters outside strings; design files need short lines", maxLineCode)
			}
			switch r {
			case '[', '{':
				if depth++; depth > maxNesting {
					return line, fmt.Sprintf("arrays or inline tables nested over %d deep", maxNesting)
				}
			case ']', '}':
				depth = max(depth-1, 0)
			}
		}
		i += n
	}
	return 0, ""
}

// controlChar returns the first control or format character of s (such as
// an ESC of a terminal escape sequence written as \u001b), or -1.
func controlChar(s string) rune {
	for _, r := range s {
		if unicode.IsControl(r) && r != '\t' || unicode.Is(unicode.Cf, r) {
			return r
		}
	}
	return -1
}
