package design

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"finmarch/airflow/calibrate"
)

// pointColumns are the columns a points file may have, with the dimension
// of each (nil: text).
var pointColumns = map[string]*dimension{
	"speed": dimSpeed, "ambient": dimTemp, "altitude": dimLength, "head": dimTemp, "barrel": dimTemp,
	"place": nil, "offset": dimTempDiff, "uncertainty": dimTempDiff,
}

// ReadPoints reads measured temperatures from a CSV points file, for
// 'finmarch calibrate --points': a header row naming the columns (speed,
// ambient, head or barrel, and optionally altitude, place, offset,
// uncertainty; the same meaning and rules as a [[measurement]] table), a
// unit in parentheses after a name applying to the bare numbers below it
// ("speed (km/h)"), then one row per reading, each cell a number under a
// header unit or a quantity with its own unit ("90 km/h"); an empty cell
// leaves the key out. Lines starting with # are comments. alt is the
// design's altitude, for rows without one. Every problem is reported with
// the file, the line and the column.
func ReadPoints(src []byte, name string, alt float64) ([]calibrate.Point, error) {
	r, head, err := openCSV(src, name, "no header row: name the columns, e.g. speed (km/h),ambient (C),head (C),place,offset (K)")
	if err != nil {
		return nil, err
	}
	cols, units, errs := pointHeader(head, name, r)
	if len(errs) > 0 {
		return nil, errs
	}
	var pts []calibrate.Point
	if errs := readRows(r, name, len(cols), func(rec []string, _ int) []string {
		m, bad := pointRow(rec, cols, units)
		if len(bad) == 0 && len(rec) <= len(cols) {
			var p calibrate.Point
			p, bad = measuredPoint(m, alt)
			pts = append(pts, p)
		}
		return bad
	}); len(errs) > 0 {
		return nil, errs
	}
	if len(pts) == 0 {
		return nil, Errors{{File: name, Msg: "no measured point below the header row"}}
	}
	return pts, nil
}

// pointHeader reads the header: each column's name and its unit.
func pointHeader(head []string, name string, r *csv.Reader) ([]string, []string, Errors) {
	var errs Errors
	line, _ := r.FieldPos(0)
	cols, units := make([]string, len(head)), make([]string, len(head))
	seen := map[string]bool{}
	for i, h := range head {
		col, unit := strings.TrimSpace(h), ""
		if j := strings.Index(col, "("); j >= 0 && strings.HasSuffix(col, ")") {
			col, unit = strings.TrimSpace(col[:j]), strings.TrimSpace(col[j+1:len(col)-1])
		}
		col = strings.ToLower(col)
		dim, ok := pointColumns[col]
		switch {
		case !ok:
			errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: "unknown column; allowed: speed, ambient, altitude, head, barrel, place, offset, uncertainty"})
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

// pointRow makes a measurement from one row.
func pointRow(rec, cols, units []string) (MeasurementT, []string) {
	var m MeasurementT
	var bad []string
	for i, cell := range rec {
		cell = strings.TrimSpace(cell)
		if i >= len(cols) || cell == "" {
			continue
		}
		dim := pointColumns[cols[i]]
		if dim == nil {
			m.Place = cell
			continue
		}
		text := cell
		if _, err := strconv.ParseFloat(cell, 64); err == nil {
			if units[i] == "" {
				bad = append(bad, fmt.Sprintf("%s: %q has no unit; write it with its unit (\"90 km/h\", \"28 C\") or put the unit in the header, \"%s (%s)\"", cols[i], cell, cols[i], exampleUnit(cols[i])))
				continue
			}
			text = cell + " " + units[i]
		}
		v, err := parseString(text, dim)
		if err != nil {
			bad = append(bad, fmt.Sprintf("%s: %v", cols[i], err))
			continue
		}
		q := rawQ{SI: v, Set: true}
		switch cols[i] {
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
		}
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
	case "offset", "uncertainty":
		return "K"
	}
	return "C"
}

// readRows reads the rows after the header: row reads one (its cells and
// its line) and returns its problems, reported on its line together with
// a row longer than the header; reading stops at a syntax error or after
// 20 problems.
func readRows(r *csv.Reader, name string, ncols int, row func(rec []string, line int) []string) Errors {
	var errs Errors
	for {
		rec, err := r.Read()
		if err == io.EOF {
			return errs
		}
		if err != nil {
			return append(errs, csvError(err, name, ""))
		}
		line, _ := r.FieldPos(0)
		bad := row(rec, line)
		if len(rec) > ncols {
			bad = append(bad, fmt.Sprintf("%d cells, but the header names %d columns", len(rec), ncols))
		}
		for _, b := range bad {
			errs = append(errs, &Error{File: name, Line: line, Msg: b})
		}
		if len(errs) >= 20 {
			return append(errs, &Error{File: name, Msg: "too many errors; stopped"})
		}
	}
}

// openCSV checks a CSV file's size and text and reads its header row
// (lines starting with # are comments; rows may differ in length);
// noHeader is the message for a file without one.
func openCSV(src []byte, name, noHeader string) (*csv.Reader, []string, error) {
	if len(src) > MaxFileSize {
		return nil, nil, TooLarge(name, int64(len(src)))
	}
	if line, msg := textProblem(src); line > 0 {
		return nil, nil, Errors{{File: name, Line: line, Msg: msg}}
	}
	r := csv.NewReader(bytes.NewReader(src))
	r.Comment, r.FieldsPerRecord, r.TrimLeadingSpace = '#', -1, true
	head, err := r.Read()
	if err != nil {
		return nil, nil, Errors{csvError(err, name, noHeader)}
	}
	return r, head, nil
}

// csvError places a CSV syntax error on its line.
func csvError(err error, name, empty string) *Error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &Error{File: name, Line: pe.Line, Msg: pe.Err.Error()}
	}
	if err == io.EOF && empty != "" {
		return &Error{File: name, Msg: empty}
	}
	return &Error{File: name, Msg: err.Error()}
}
