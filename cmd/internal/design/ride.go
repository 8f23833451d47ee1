package design

import (
	"encoding/csv"
	"fmt"
	"slices"
	"strconv"

	"finmarch/airflow/transient"
)

// RideT is the [ride] table: the metal of head and barrel besides the
// fins and the head-barrel link, for 'finmarch ride' (airflow/transient).
type RideT struct {
	HeadMetal   Q[Mass]        `toml:"head_metal"`
	BarrelMetal Q[Mass]        `toml:"barrel_metal"`
	Link        Q[Conductance] `toml:"head_barrel_link"`
}

// rideColumn is a column a ride file may have: its dimension and the
// allowed range (SI), with the unit, scale and offset the range is shown
// in, and what it is for (in messages).
type rideColumn struct {
	name   string
	dim    *dimension
	lo, hi float64
	unit   string // for the range in messages
	scale  float64
	offset float64
	what   string
}

// rideColumns are the columns a ride file may have, in the order of
// their indices (rideTime, rideSpeed, ...).
var rideColumns = []rideColumn{
	{"time", dimTime, 0, 24 * 3600, "s", 1, 0, "its time"},
	{"speed", dimSpeed, 0, 400 / 3.6, "km/h", 1 / 3.6, 0, "its road speed"},
	{"grade", dimPercent, -30, 30, "%", 1, 0, "its grade"},
	{"ambient", dimTemp, C - 50, C + 60, "C", 1, C, "its ambient"},
	{"head_heat", dimPower, 0, 50e3, "W", 1, 0, "the heat to the head fins"},
	{"barrel_heat", dimPower, 0, 50e3, "W", 1, 0, "the heat to the barrel fins"},
}

// The indices of rideColumns.
const (
	rideTime = iota
	rideSpeed
	rideGrade
	rideAmbient
	rideHeadHeat
	rideBarrelHeat
	nRideColumns
)

// rangeText is the column's allowed range, in its unit.
func (c rideColumn) rangeText() string {
	return fmt.Sprintf("%s to %s %s", strconv.FormatFloat((c.lo-c.offset)/c.scale, 'g', 4, 64),
		strconv.FormatFloat((c.hi-c.offset)/c.scale, 'g', 4, 64), c.unit)
}

// rideColumnIndex is the index of a column named name, or -1.
func rideColumnIndex(name string) int {
	for i, c := range rideColumns {
		if c.name == name {
			return i
		}
	}
	return -1
}

// MaxRideRows is the most rows a ride file may hold (a day at one row a
// second).
const MaxRideRows = 86400

// rideRowValues are one row's values (SI) by column index, and which of
// them the row gives.
type rideRowValues struct {
	v   [nRideColumns]float64
	has [nRideColumns]bool
}

// ReadRide reads a ride from a CSV file, for 'finmarch ride --profile': a
// header row naming the columns (time and speed; optionally grade,
// ambient, and head_heat with barrel_heat to give the heat instead of the
// road load), a unit in parentheses after a name applying to the bare
// numbers below it ("speed (km/h)"; grade is in per cent), then one row per
// moment: each row's conditions hold from its time until the next row's.
// The first time is 0 and times increase; the last row's time ends the
// ride, so its other cells describe nothing that follows: they may be left
// empty, and are checked like any cell when given. Every other row fills
// every column it has, except ambient, whose empty cell means the design's
// ambient for that row. Without a grade column the road is flat (0 %);
// without head_heat and barrel_heat the heat is the design's road load at
// each row's speed and grade. A UTF-8 byte-order mark before the header is
// skipped, lines starting with # are comments, and a file holds at most
// MaxRideRows rows. Every problem is reported with the file, the line and
// the column.
func ReadRide(src []byte, name string) ([]transient.Segment, error) {
	r, head, err := openCSV(src, name, "no header row: name the columns, e.g. time (s),speed (km/h),grade (%)")
	if err != nil {
		return nil, err
	}
	cols, units, errs := rideHeader(head, name, r)
	if len(errs) > 0 {
		return nil, errs
	}
	var rows []rideRowValues
	var pending Errors // the last row's empty cells: errors once a row follows it
	lastTime, lastLine := -1.0, 0
	errs = readRows(r, name, src, rideNames(cols), MaxRideRows, "a ride file", func(rec []string, line int) Errors {
		bad := pending
		row, cellBad, empty := rideRow(rec, cols, units)
		bad = append(bad, place(cellBad, name, line)...)
		pending = place(empty, name, line)
		if row.has[rideTime] {
			t := row.v[rideTime]
			switch {
			case len(rows) == 0 && t != 0:
				bad = append(bad, &Error{File: name, Line: line, Key: "time", Msg: fmt.Sprintf("the ride starts at 0, not %g s", t)})
			case lastLine > 0 && !(t > lastTime):
				bad = append(bad, &Error{File: name, Line: line, Key: "time", Msg: fmt.Sprintf("%g s is not after the row before (%g s, line %d)", t, lastTime, lastLine)})
			}
			lastTime, lastLine = t, line
		}
		rows = append(rows, row)
		return bad
	})
	if len(errs) > 0 {
		return nil, errs
	}
	if len(rows) < 2 {
		return nil, Errors{{File: name, Msg: "a ride needs at least two rows: the start (time 0) and the end"}}
	}
	segs := make([]transient.Segment, 0, len(rows)-1)
	heat := slices.Contains(cols, rideHeadHeat)
	for i := 0; i+1 < len(rows); i++ {
		v := rows[i].v
		sg := transient.Segment{Duration: rows[i+1].v[rideTime] - v[rideTime], Speed: v[rideSpeed], Grade: v[rideGrade], Ambient: v[rideAmbient]}
		if heat {
			sg.Heat = &[2]float64{v[rideHeadHeat], v[rideBarrelHeat]}
		}
		segs = append(segs, sg)
	}
	return segs, nil
}

// rideNames are the names of the header's columns.
func rideNames(cols []int) []string {
	s := make([]string, len(cols))
	for i, c := range cols {
		s[i] = rideColumns[c].name
	}
	return s
}

// rideHeader reads the header: each column's index in rideColumns and its
// unit.
func rideHeader(head []string, name string, r *csv.Reader) ([]int, []string, Errors) {
	var errs Errors
	line, _ := r.FieldPos(0)
	cols, units := make([]int, len(head)), make([]string, len(head))
	seen := map[string]bool{}
	for i, h := range head {
		col, unit := splitHeader(h, true)
		c := rideColumnIndex(col)
		switch {
		case c < 0:
			errs = append(errs, &Error{File: name, Line: line, Key: headerKey(h, i), Msg: "unknown column; allowed: time, speed, grade, ambient, head_heat, barrel_heat"})
		case seen[col]:
			errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: "column named twice"})
		case unit != "":
			if _, err := parseString("1 "+unit, rideColumns[c].dim); err != nil {
				errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: fmt.Sprintf("unit %q: %v", unit, err)})
			}
		}
		seen[col] = true
		cols[i], units[i] = c, unit
	}
	for _, need := range []string{"time", "speed"} {
		if !seen[need] {
			errs = append(errs, &Error{File: name, Line: line, Msg: "the header lacks a " + need + " column"})
		}
	}
	if seen["head_heat"] != seen["barrel_heat"] {
		errs = append(errs, &Error{File: name, Line: line, Msg: "give head_heat and barrel_heat together (or neither: the road load)"})
	}
	return cols, units, errs
}

// rideRow reads one row's values (SI), each checked against its range:
// the problems of its cells, and apart the errors of its empty cells that
// only a row that is not the last must fill (all but time, which every row
// needs, and ambient, which may be empty). A cell missing from a short row
// is empty.
func rideRow(rec []string, cols []int, units []string) (rideRowValues, Errors, Errors) {
	var row rideRowValues
	var bad, empty Errors
	for i, ci := range cols {
		c := rideColumns[ci]
		cl := cell(rec, i)
		if cl == "" {
			switch ci {
			case rideTime:
				bad = append(bad, &Error{Key: c.name, Msg: "empty; every row needs its time, " + c.rangeText()})
			case rideAmbient:
			default:
				empty = append(empty, &Error{Key: c.name, Msg: fmt.Sprintf("empty; every row but the last needs %s, %s", c.what, c.rangeText())})
			}
			continue
		}
		text := cl
		if _, err := strconv.ParseFloat(cl, 64); err == nil {
			if units[i] == "" && c.dim.needsUnit {
				bad = append(bad, &Error{Key: c.name, Msg: fmt.Sprintf("%q has no unit; write it with its unit or put the unit in the header, \"%s (%s)\"", cl, c.name, c.unit)})
				continue
			}
			if units[i] != "" {
				text = cl + " " + units[i]
			}
		}
		x, err := parseString(text, c.dim)
		if err != nil {
			bad = append(bad, &Error{Key: c.name, Msg: err.Error()})
			continue
		}
		if !(x >= c.lo && x <= c.hi) {
			bad = append(bad, &Error{Key: c.name, Msg: fmt.Sprintf("%s is outside the allowed %s", cl, c.rangeText())})
			continue
		}
		row.v[ci], row.has[ci] = x, true
	}
	if len(rec) > len(cols) {
		bad = append(bad, &Error{Key: fmt.Sprintf("column %d", len(cols)+1), Msg: fmt.Sprintf("%d cells, but the header names %d columns", len(rec), len(cols))})
	}
	return row, bad, empty
}
