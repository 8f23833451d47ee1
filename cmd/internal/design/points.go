package design

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"finmarch/airflow"
	"finmarch/airflow/calibrate"
)

// pointColumns are the columns a points file may have, with the dimension
// of each (nil: text).
var pointColumns = map[string]*dimension{
	"speed": dimSpeed, "ambient": dimTemp, "altitude": dimLength, "head": dimTemp, "barrel": dimTemp,
	"place": nil, "offset": dimTempDiff, "uncertainty": dimTempDiff, "offset_uncertainty": dimTempDiff,
}

// MaxPointRows is the most readings a points file may hold, and the most
// [[measurement]] tables a design may hold: a calibration needs a handful
// of steady runs, far fewer than this, and the fit's time grows with each
// reading (every step estimates every point; at this cap a fit takes
// seconds, not minutes; our bound).
const MaxPointRows = 200

// ReadPoints reads measured temperatures from a CSV points file, for
// 'finmarch calibrate --points': a header row naming the columns, then one
// row per reading. The columns are those of a [[measurement]] table, with
// the same meaning and ranges: speed and ambient, required in every row;
// head or barrel (a header may name both, and each row then fills exactly
// one of them); and optionally altitude, place, offset and uncertainty. A
// unit in parentheses after a name applies to the bare numbers below it
// ("speed (km/h)"); a cell may instead carry its own unit ("90 km/h"). An
// empty (or missing) optional cell leaves the key out, as in a table:
// altitude the design's, place fin-root, offset 0 K (a plug-seat reading
// must give one), uncertainty 5 K; an empty required cell is an error. A
// UTF-8 byte-order mark before the header is skipped, lines starting with
// # are comments, and a file holds at most MaxPointRows readings. alt is
// the altitude (m) the rows without one were measured at. Every problem is
// reported with the file, the line and the column.
func ReadPoints(src []byte, name string, alt float64) ([]calibrate.Point, error) {
	if !(alt >= -500 && alt <= 6000) {
		return nil, Errors{{File: name, Msg: fmt.Sprintf("the altitude for rows without one, %g m, is outside -500 to 6000 m", alt)}}
	}
	return readPoints(src, name, airflow.ISA(alt, nil).P)
}

// ReadPoints reads a points file (as the package's ReadPoints) for the
// design: a row without an altitude was measured at the design's air
// pressure (its altitude's, or its air.pressure).
func (d *Design) ReadPoints(src []byte, name string) ([]calibrate.Point, error) {
	return readPoints(src, name, d.Case.Pressure)
}

// readPoints is ReadPoints with the pressure (Pa) of a row that gives no
// altitude.
func readPoints(src []byte, name string, pressure float64) ([]calibrate.Point, error) {
	r, head, err := openCSV(src, name, "no header row: name the columns, e.g. speed (km/h),ambient (C),head (C),place,offset (K)")
	if err != nil {
		return nil, err
	}
	cols, units, errs := pointHeader(head, name, r)
	if len(errs) > 0 {
		return nil, errs
	}
	var pts []calibrate.Point
	if errs := readRows(r, name, src, cols, MaxPointRows, "a points file", func(rec []string, line int) Errors {
		m, bad := pointRow(rec, cols, units)
		if len(bad) == 0 {
			p, probs := measuredPoint(m, pressure)
			for _, pb := range probs {
				key := pb.field
				if (key == "head" || key == "barrel") && !slices.Contains(cols, key) {
					key = map[string]string{"head": "barrel", "barrel": "head"}[key]
				}
				bad = append(bad, &Error{Key: key, Msg: pb.msg})
			}
			pts = append(pts, p)
		}
		return place(bad, name, line)
	}); len(errs) > 0 {
		return nil, errs
	}
	if len(pts) == 0 {
		return nil, Errors{{File: name, Msg: "no measured point below the header row"}}
	}
	return pts, nil
}

// place sets the file and the line of row problems.
func place(es Errors, name string, line int) Errors {
	for _, e := range es {
		e.File, e.Line = name, line
	}
	return es
}

// splitHeader splits a header cell into its column name (lower case, spaces
// as underscores when under is set) and the unit in parentheses after it.
func splitHeader(h string, under bool) (string, string) {
	col, unit := strings.TrimSpace(h), ""
	if j := strings.Index(col, "("); j >= 0 && strings.HasSuffix(col, ")") {
		col, unit = strings.TrimSpace(col[:j]), strings.TrimSpace(col[j+1:len(col)-1])
	}
	col = strings.ToLower(col)
	if under {
		col = strings.Join(strings.Fields(col), "_")
	}
	return col, unit
}

// pointHeader reads the header: each column's name and its unit.
func pointHeader(head []string, name string, r *csv.Reader) ([]string, []string, Errors) {
	var errs Errors
	line, _ := r.FieldPos(0)
	cols, units := make([]string, len(head)), make([]string, len(head))
	seen := map[string]bool{}
	for i, h := range head {
		col, unit := splitHeader(h, false)
		dim, ok := pointColumns[col]
		switch {
		case !ok:
			errs = append(errs, &Error{File: name, Line: line, Key: headerKey(h, i), Msg: "unknown column; allowed: speed, ambient, altitude, head, barrel, place, offset, uncertainty"})
		case seen[col]:
			errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: "column named twice"})
		case unit != "" && dim == nil:
			errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: "this column is text and takes no unit"})
		case unit != "":
			if _, err := parseString("1 "+unit, dim); err != nil {
				errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: fmt.Sprintf("unit %q: %v", unit, err)})
			}
		}
		seen[col] = true
		cols[i], units[i] = col, unit
	}
	for _, need := range []string{"speed", "ambient"} {
		if !seen[need] {
			errs = append(errs, &Error{File: name, Line: line, Msg: "the header lacks a " + need + " column"})
		}
	}
	if !seen["head"] && !seen["barrel"] {
		errs = append(errs, &Error{File: name, Line: line, Msg: "the header needs a head or a barrel column"})
	}
	return cols, units, errs
}

// headerKey names a header cell in an error: as written, or by its place
// when it is empty.
func headerKey(h string, i int) string {
	if strings.TrimSpace(h) == "" {
		return fmt.Sprintf("column %d (empty name)", i+1)
	}
	return h
}

// cell is row's cell in column i, trimmed; "" when the row is shorter.
func cell(rec []string, i int) string {
	if i < len(rec) {
		return strings.TrimSpace(rec[i])
	}
	return ""
}

// pointRow makes a measurement from one row: every cell of a known column
// is read, an empty required one (speed, ambient; head or barrel when the
// header names only that one) is an error.
func pointRow(rec, cols, units []string) (MeasurementT, Errors) {
	var m MeasurementT
	var bad Errors
	both := slices.Contains(cols, "head") && slices.Contains(cols, "barrel")
	for i, col := range cols {
		c := cell(rec, i)
		if c == "" {
			switch {
			case col == "speed":
				bad = append(bad, &Error{Key: col, Msg: "empty; every reading needs its road speed, 0 to 400 km/h"})
			case col == "ambient":
				bad = append(bad, &Error{Key: col, Msg: "empty; every reading needs its ambient, -50 to 60 C"})
			case (col == "head" || col == "barrel") && !both:
				bad = append(bad, &Error{Key: col, Msg: "empty; every reading needs its measured " + col + " temperature, between the ambient and 500 C"})
			}
			continue
		}
		dim := pointColumns[col]
		if dim == nil {
			m.Place = c
			continue
		}
		text := c
		if _, err := strconv.ParseFloat(c, 64); err == nil {
			if units[i] == "" {
				bad = append(bad, &Error{Key: col, Msg: fmt.Sprintf("%q has no unit; write it with its unit (\"90 km/h\", \"28 C\") or put the unit in the header, \"%s (%s)\"", c, col, exampleUnit(col))})
				continue
			}
			text = c + " " + units[i]
		}
		v, err := parseString(text, dim)
		if err != nil {
			bad = append(bad, &Error{Key: col, Msg: err.Error()})
			continue
		}
		q := rawQ{SI: v, Set: true}
		switch col {
		case "speed":
			m.Speed = Q[Speed](q)
		case "ambient":
			m.Ambient = Q[Temperature](q)
		case "altitude":
			m.Altitude = Q[Length](q)
		case "head":
			m.Head = Q[Temperature](q)
		case "barrel":
			m.Barrel = Q[Temperature](q)
		case "offset":
			m.Offset = Q[TempDiff](q)
		case "uncertainty":
			m.Sigma = Q[TempDiff](q)
		case "offset_uncertainty":
			m.OffsetSigma = Q[TempDiff](q)
		}
	}
	if len(rec) > len(cols) {
		bad = append(bad, &Error{Key: fmt.Sprintf("column %d", len(cols)+1), Msg: fmt.Sprintf("%d cells, but the header names %d columns", len(rec), len(cols))})
	}
	return m, bad
}

// exampleUnit is a unit to suggest for a column.
func exampleUnit(col string) string {
	switch col {
	case "speed":
		return "km/h"
	case "altitude":
		return "m"
	case "offset", "uncertainty", "offset_uncertainty":
		return "K"
	}
	return "C"
}

// maxRowErrors is how many problems a CSV reader reports before it stops.
const maxRowErrors = 20

// readRows reads the rows after the header: row reads one (its cells and
// its line) and returns its problems, placed by row. Reading stops at a
// CSV syntax error (named with its line and column), at the row past
// maxRows (what: the kind of file, for the message) or after maxRowErrors
// problems.
func readRows(r *csv.Reader, name string, src []byte, cols []string, maxRows int, what string, row func(rec []string, line int) Errors) Errors {
	var errs Errors
	for n := 0; ; n++ {
		rec, err := r.Read()
		if err == io.EOF {
			return errs
		}
		if err != nil {
			return append(errs, csvError(err, name, "", src, cols))
		}
		line, _ := r.FieldPos(0)
		if n >= maxRows {
			return append(errs, &Error{File: name, Line: line, Msg: fmt.Sprintf("more than %d rows; %s holds at most %d", maxRows, what, maxRows)})
		}
		errs = append(errs, row(rec, line)...)
		if len(errs) >= maxRowErrors {
			return append(errs, &Error{File: name, Msg: "too many errors; stopped"})
		}
	}
}

// bom is the UTF-8 byte-order mark some programs write at the start of a
// text file.
var bom = []byte("\uFEFF")

// csvTextProblem returns the line and the byte column (1-based) of the
// first byte of src that is not text a CSV file can hold, with what it is:
// a NUL or another control character, or a byte sequence that is not
// UTF-8 (such as a Latin-1 degree sign); 0, 0 and "" when src is fine.
func csvTextProblem(src []byte) (int, int, string) {
	line, start := 1, 0
	for i := 0; i < len(src); {
		r, n := utf8.DecodeRune(src[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			return line, i - start + 1, fmt.Sprintf("byte 0x%02X: not text in UTF-8 (a UTF-16 file, or a Latin-1 or Windows character such as a degree sign?); save the file as UTF-8 (CSV UTF-8), and write temperatures as \"220 C\"", src[i])
		case r == 0:
			return line, i - start + 1, "a NUL byte: the file is binary, not text"
		case r < 32 && r != '\n' && r != '\r' && r != '\t', r == 0x7f:
			return line, i - start + 1, fmt.Sprintf("the control character U+%04X: not text; a CSV file is plain text", r)
		case r == '\n':
			line, start = line+1, i+1
		}
		i += n
	}
	return 0, 0, ""
}

// columnAt names the column of a CSV text at line and byte column col
// (1-based): the header's name for it when the header lies above, else
// its place.
func columnAt(src []byte, line, col int) string {
	i := fieldAt(src, line, line, col)
	if i < 0 {
		return ""
	}
	// the text above line is sound: its first record is the header
	off := 0
	for l := 1; l < line; l++ {
		off += bytes.IndexByte(src[off:], '\n') + 1
	}
	r := csv.NewReader(bytes.NewReader(src[:off]))
	r.Comment, r.FieldsPerRecord, r.TrimLeadingSpace = '#', -1, true
	if head, err := r.Read(); err == nil && i < len(head) {
		if l, _ := r.FieldPos(0); l < line {
			if col, _ := splitHeader(head[i], false); col != "" {
				return col
			}
		}
	}
	return fmt.Sprintf("column %d", i+1)
}

// openCSV checks a CSV file's size and text and reads its header row
// (a leading byte-order mark is skipped; lines starting with # are
// comments; rows may differ in length); noHeader is the message for a file
// without one.
func openCSV(src []byte, name, noHeader string) (*csv.Reader, []string, error) {
	if len(src) > MaxFileSize {
		return nil, nil, TooLarge(name, int64(len(src)))
	}
	src = bytes.TrimPrefix(src, bom)
	if line, col, msg := csvTextProblem(src); line > 0 {
		return nil, nil, Errors{{File: name, Line: line, Key: columnAt(src, line, col), Msg: msg}}
	}
	r := csv.NewReader(bytes.NewReader(src))
	r.Comment, r.FieldsPerRecord, r.TrimLeadingSpace, r.ReuseRecord = '#', -1, true, true
	head, err := r.Read()
	if err != nil {
		return nil, nil, Errors{csvError(err, name, noHeader, src, nil)}
	}
	return r, append([]string(nil), head...), nil
}

// csvError places a CSV syntax error on its line and names its column:
// the header's name for it when the header is read (cols), else its
// place.
func csvError(err error, name, empty string, src []byte, cols []string) *Error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		e := &Error{File: name, Line: pe.Line, Msg: pe.Err.Error()}
		if i := fieldAt(src, pe.StartLine, pe.Line, pe.Column); i >= 0 && i < len(cols) {
			e.Key = cols[i]
		} else if i >= 0 {
			e.Key = fmt.Sprintf("column %d", i+1)
		}
		return e
	}
	if err == io.EOF && empty != "" {
		return &Error{File: name, Msg: empty}
	}
	return &Error{File: name, Msg: err.Error()}
}

// fieldAt is the index of the field a CSV syntax error at line and
// column (1-based, in bytes) falls in, when the record starts on
// that line; -1 when it cannot tell.
func fieldAt(src []byte, start, line, col int) int {
	if start != line || line < 1 || col < 1 {
		return -1
	}
	for l := 1; l < line; l++ {
		i := bytes.IndexByte(src, '\n')
		if i < 0 {
			return -1
		}
		src = src[i+1:]
	}
	if i := bytes.IndexByte(src, '\n'); i >= 0 {
		src = src[:i]
	}
	field, quoted := 0, false
	for _, c := range src[:min(col-1, len(src))] {
		switch {
		case c == '"':
			quoted = !quoted
		case c == ',' && !quoted:
			field++
		}
	}
	return field
}
