package design

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
)

// KV is one key of a design file and the TOML text of its value.
type KV struct {
	Key   string // table.key, such as air.pressure_recovery; a top-level key has no dot
	Value string // TOML, such as 0.351 or "12 K"
	Note  string // a comment written after the value
}

// SetKeys returns the design text src with each key set to its value (see
// EditKeys); a text the editor cannot read is returned unchanged.
func SetKeys(src []byte, kvs []KV) []byte {
	out, err := EditKeys(src, kvs)
	if err != nil {
		return src
	}
	return out
}

// EditKeys returns the design text src with each key set to its value,
// wherever and however the file writes it: the value replaced where the
// key is written (under its table's header, as a dotted key such as
// air.speed = ... at the top level, or inside an inline table such as
// air = { speed = ... }); else the key added where its table is written
// (inside the inline table, beside the dotted keys, or under the header);
// else a new table at the end. The rest of the file (comments, layout,
// CRLF or LF line ends, multi-line strings and arrays) is kept as written.
// A note is written as a comment after a value on its own line; inside an
// inline table, where a comment cannot follow, it is left out.
func EditKeys(src []byte, kvs []KV) ([]byte, error) {
	text := string(src)
	nl := "\n"
	if i := strings.IndexByte(text, '\n'); i > 0 && text[i-1] == '\r' {
		nl = "\r\n"
	}
	for _, kv := range kvs {
		path := strings.Split(kv.Key, ".")
		for _, p := range path {
			if p == "" {
				return nil, fmt.Errorf("key %q: an empty part", kv.Key)
			}
		}
		d, err := lexTOML(text)
		if err != nil {
			return nil, err
		}
		text = d.set(path, kv, nl)
	}
	return []byte(text), nil
}

// tomlStmt is a key = value statement of a TOML text: at a table's top, or
// a member of an inline table.
type tomlStmt struct {
	path             []string // the full key: its table's path and its own
	scope            int      // the length of the path the key is written relative to
	array            bool     // in an array-of-tables element ([[name]])
	member           bool     // a member of an inline table
	valStart, valEnd int      // the value's text
	comment          int      // where a comment after the value starts; -1 for none
	lineEnd          int      // the end of the statement's last line, before its line end
	inline           *inlineTable
}

// inlineTable is an inline table value: { a = 1, b = 2 }.
type inlineTable struct {
	close   int         // the closing brace
	members []*tomlStmt // its key = value pairs
}

// tomlHeader is a [table] or [[array]] header.
type tomlHeader struct {
	path    []string
	array   bool
	start   int // where the header's line starts
	lineEnd int // the end of the header's line, before its line end
}

type tomlDoc struct {
	src     string
	stmts   []*tomlStmt // every statement, members of inline tables included
	headers []tomlHeader
}

func hasPrefix(p, prefix []string) bool {
	return len(prefix) <= len(p) && slices.Equal(p[:len(prefix)], prefix)
}

// keyText writes a key path relative to a table, quoting any part that is
// not a bare key.
func keyText(path []string) string {
	parts := make([]string, len(path))
	for i, p := range path {
		parts[i] = p
		for _, r := range p {
			if !(r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' || r == '_' || r == '-') {
				parts[i] = strconv.Quote(p)
				break
			}
		}
	}
	return strings.Join(parts, ".")
}

// set returns the text with path set to kv's value.
func (d *tomlDoc) set(path []string, kv KV, nl string) string {
	s := d.src
	line := keyText(path[len(path)-1:]) + " = " + kv.Value
	note := ""
	if kv.Note != "" {
		note = "  # " + strings.NewReplacer("\r", " ", "\n", " ").Replace(kv.Note)
	}
	// the key is written: replace its value
	for _, st := range d.stmts {
		if st.array || !slices.Equal(st.path, path) {
			continue
		}
		switch {
		case st.member || note == "":
			return s[:st.valStart] + kv.Value + s[st.valEnd:]
		case st.comment >= 0:
			return s[:st.valStart] + kv.Value + s[st.valEnd:st.comment] + strings.TrimLeft(note, " ") + s[st.lineEnd:]
		default:
			return s[:st.valStart] + kv.Value + note + s[st.valEnd:]
		}
	}
	// its table is an inline table: add the key inside it (the longest)
	var in *tomlStmt
	for _, st := range d.stmts {
		if st.inline != nil && !st.array && len(st.path) < len(path) && hasPrefix(path, st.path) && (in == nil || len(st.path) > len(in.path)) {
			in = st
		}
	}
	if in != nil {
		member := keyText(path[len(in.path):]) + " = " + kv.Value
		if ms := in.inline.members; len(ms) > 0 {
			at := ms[len(ms)-1].valEnd
			return s[:at] + ", " + member + s[at:]
		}
		return s[:in.valStart] + "{ " + member + " }" + s[in.valEnd:]
	}
	// its table is made by dotted keys (air.speed = ... at the top level):
	// add a dotted key beside them, in the same table
	for _, st := range d.stmts {
		if st.array || st.member || len(st.path)-st.scope < 2 || st.scope >= len(path)-1 || !hasPrefix(path, st.path[:st.scope+1]) {
			continue
		}
		return s[:st.lineEnd] + nl + keyText(path[st.scope:]) + " = " + kv.Value + note + s[st.lineEnd:]
	}
	// a header of its table, or of a table above it: add the key under it
	var h *tomlHeader
	for i := range d.headers {
		x := &d.headers[i]
		if !x.array && len(x.path) < len(path) && hasPrefix(path, x.path) && (h == nil || len(x.path) > len(h.path)) {
			h = x
		}
	}
	if h != nil && len(h.path) == len(path)-1 {
		return s[:h.lineEnd] + nl + line + note + s[h.lineEnd:]
	}
	if len(path) == 1 {
		// a top-level key goes before the first header
		if len(d.headers) > 0 {
			at := d.headers[0].start
			return s[:at] + line + note + nl + s[at:]
		}
		return strings.TrimRight(s, " \t\r\n") + nl + line + note + nl
	}
	// a new table at the end
	return strings.TrimRight(s, " \t\r\n") + nl + nl + "[" + keyText(path[:len(path)-1]) + "]" + nl + line + note + nl
}

// tomlLexer reads the structure of a TOML text: headers, keys and where
// values start and end, without decoding the values.
type tomlLexer struct {
	s string
	i int
}

func (p *tomlLexer) eof() bool { return p.i >= len(p.s) }

func (p *tomlLexer) errorf(format string, a ...any) error {
	return fmt.Errorf("line %d: %s", strings.Count(p.s[:min(p.i, len(p.s))], "\n")+1, fmt.Sprintf(format, a...))
}

func (p *tomlLexer) spaces() {
	for !p.eof() && (p.s[p.i] == ' ' || p.s[p.i] == '\t') {
		p.i++
	}
}

// comment skips a comment to the end of its line (not the line end).
func (p *tomlLexer) comment() {
	if !p.eof() && p.s[p.i] == '#' {
		for !p.eof() && p.s[p.i] != '\n' {
			p.i++
		}
	}
}

// blank skips spaces, comments and line ends.
func (p *tomlLexer) blank() {
	for {
		p.spaces()
		switch {
		case p.eof():
			return
		case p.s[p.i] == '#':
			p.comment()
		case p.s[p.i] == '\n' || p.s[p.i] == '\r':
			p.i++
		default:
			return
		}
	}
}

// lineEnd returns the end of the present line before its line end ("\n" or
// "\r\n"), where p stands at the line end or at the end of the text.
func (p *tomlLexer) lineEnd() int {
	if p.i > 0 && p.i <= len(p.s) && p.s[p.i-1] == '\r' && (p.eof() || p.s[p.i] == '\n') {
		return p.i - 1
	}
	return p.i
}

// key reads a dotted key: bare, "basic" or 'literal' parts.
// keyEquals reads a key and the '=' after it, leaving the lexer at the
// value.
func (p *tomlLexer) keyEquals() ([]string, error) {
	k, err := p.key()
	if err != nil {
		return nil, err
	}
	if p.eof() || p.s[p.i] != '=' {
		return nil, p.errorf("'=' expected after a key")
	}
	p.i++
	p.spaces()
	return k, nil
}

func (p *tomlLexer) key() ([]string, error) {
	var parts []string
	for {
		p.spaces()
		if p.eof() {
			return nil, p.errorf("a key expected")
		}
		switch c := p.s[p.i]; {
		case c == '"':
			start := p.i
			if err := p.basicString(); err != nil {
				return nil, err
			}
			raw := p.s[start:p.i]
			if u, err := strconv.Unquote(raw); err == nil {
				parts = append(parts, u)
			} else {
				parts = append(parts, raw[1:len(raw)-1])
			}
		case c == '\'':
			end := strings.IndexByte(p.s[p.i+1:], '\'')
			if end < 0 {
				return nil, p.errorf("an unclosed key")
			}
			parts = append(parts, p.s[p.i+1:p.i+1+end])
			p.i += end + 2
		default:
			start := p.i
			for !p.eof() {
				c := p.s[p.i]
				if !(c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '_' || c == '-') {
					break
				}
				p.i++
			}
			if p.i == start {
				return nil, p.errorf("a key expected")
			}
			parts = append(parts, p.s[start:p.i])
		}
		p.spaces()
		if p.eof() || p.s[p.i] != '.' {
			return parts, nil
		}
		p.i++
	}
}

// basicString skips a "..." or """...""" string.
func (p *tomlLexer) basicString() error {
	if strings.HasPrefix(p.s[p.i:], `"""`) {
		p.i += 3
		for !p.eof() {
			switch {
			case p.s[p.i] == '\\':
				p.i += 2
			case strings.HasPrefix(p.s[p.i:], `"""`):
				p.i += 3
				// up to two quotes more belong to the string
				for n := 0; n < 2 && !p.eof() && p.s[p.i] == '"'; n++ {
					p.i++
				}
				return nil
			default:
				p.i++
			}
		}
		return p.errorf("an unclosed multi-line string")
	}
	p.i++
	for !p.eof() {
		switch p.s[p.i] {
		case '\\':
			p.i += 2
		case '"':
			p.i++
			return nil
		case '\n':
			return p.errorf("a string runs past its line")
		default:
			p.i++
		}
	}
	return p.errorf("an unclosed string")
}

// value skips a value and returns its inline table, if it is one, with its
// members' paths under path.
func (p *tomlLexer) value(path []string, d *tomlDoc, array bool) (*inlineTable, error) {
	if p.eof() {
		return nil, p.errorf("a value expected")
	}
	switch c := p.s[p.i]; c {
	case '"':
		return nil, p.basicString()
	case '\'':
		if strings.HasPrefix(p.s[p.i:], "'''") {
			end := strings.Index(p.s[p.i+3:], "'''")
			if end < 0 {
				return nil, p.errorf("an unclosed multi-line string")
			}
			p.i += 3 + end + 3
			for n := 0; n < 2 && !p.eof() && p.s[p.i] == '\''; n++ {
				p.i++
			}
			return nil, nil
		}
		end := strings.IndexByte(p.s[p.i+1:], '\'')
		if end < 0 {
			return nil, p.errorf("an unclosed string")
		}
		p.i += end + 2
		return nil, nil
	case '[':
		p.i++
		for {
			p.blank()
			if p.eof() {
				return nil, p.errorf("an unclosed array")
			}
			if p.s[p.i] == ']' {
				p.i++
				return nil, nil
			}
			if _, err := p.value(nil, nil, array); err != nil {
				return nil, err
			}
			p.blank()
			if !p.eof() && p.s[p.i] == ',' {
				p.i++
			}
		}
	case '{':
		t := &inlineTable{}
		p.i++
		for {
			p.blank()
			if p.eof() {
				return nil, p.errorf("an unclosed inline table")
			}
			if p.s[p.i] == '}' {
				t.close = p.i
				p.i++
				return t, nil
			}
			k, err := p.keyEquals()
			if err != nil {
				return nil, err
			}
			full := append(slices.Clone(path), k...)
			st := &tomlStmt{path: full, scope: len(path), array: array, member: true, valStart: p.i, comment: -1}
			if st.inline, err = p.value(full, d, array); err != nil {
				return nil, err
			}
			st.valEnd, st.lineEnd = p.i, p.i
			t.members = append(t.members, st)
			if d != nil && path != nil {
				d.stmts = append(d.stmts, st)
			}
			p.blank()
			if !p.eof() && p.s[p.i] == ',' {
				p.i++
			}
		}
	}
	// a bare value: a number, a boolean, a date and time (which may hold
	// one space between date and time)
	start := p.i
	for !p.eof() && !strings.ContainsRune(" \t\r\n,]}#", rune(p.s[p.i])) {
		p.i++
	}
	if p.i+2 < len(p.s) && p.s[p.i] == ' ' && p.i-start == 10 && p.s[start+4] == '-' && p.s[p.i+1] >= '0' && p.s[p.i+1] <= '9' {
		p.i++
		for !p.eof() && !strings.ContainsRune(" \t\r\n,]}#", rune(p.s[p.i])) {
			p.i++
		}
	}
	if p.i == start {
		return nil, p.errorf("a value expected")
	}
	return nil, nil
}

// lexTOML reads the structure of a TOML text.
func lexTOML(s string) (*tomlDoc, error) {
	d := &tomlDoc{src: s}
	p := &tomlLexer{s: s}
	if strings.HasPrefix(s, "\ufeff") {
		p.i = len("\ufeff")
	}
	var table []string
	array := false
	for {
		p.blank()
		if p.eof() {
			return d, nil
		}
		lineStart := strings.LastIndexByte(s[:p.i], '\n') + 1
		if p.s[p.i] == '[' {
			h := tomlHeader{start: lineStart, array: strings.HasPrefix(s[p.i:], "[[")}
			p.i++
			if h.array {
				p.i++
			}
			k, err := p.key()
			if err != nil {
				return nil, err
			}
			closing := map[bool]string{false: "]", true: "]]"}[h.array]
			if !strings.HasPrefix(s[p.i:], closing) {
				return nil, p.errorf("%q expected", closing)
			}
			p.i += len(closing)
			p.spaces()
			p.comment()
			h.path, h.lineEnd = k, p.lineEnd()
			d.headers = append(d.headers, h)
			table, array = k, h.array
			continue
		}
		k, err := p.keyEquals()
		if err != nil {
			return nil, err
		}
		full := append(slices.Clone(table), k...)
		st := &tomlStmt{path: full, scope: len(table), array: array, valStart: p.i, comment: -1}
		d.stmts = append(d.stmts, st)
		if st.inline, err = p.value(full, d, array); err != nil {
			return nil, err
		}
		st.valEnd = p.i
		p.spaces()
		if !p.eof() && p.s[p.i] == '#' {
			st.comment = p.i
			p.comment()
		}
		st.lineEnd = p.lineEnd()
	}
}
