package design

import (
	"encoding/csv"
	"fmt"
	"strconv"
	"strings"

	"finmarch/airflow/transient"
)

// RideT is the [ride] table: the metal of head and barrel besides the
// fins and the head-barrel link, for 'finmarch ride' (airflow/transient).
type RideT struct {
	HeadMetal   Q[Mass]        `toml:"head_metal"`
	BarrelMetal Q[Mass]        `toml:"barrel_metal"`
	Link        Q[Conductance] `toml:"head_barrel_link"`
}

// rideColumns are the columns a ride file may have, with the dimension and
// the allowed range (SI) of each.
var rideColumns = map[string]struct {
	dim    *dimension
	lo, hi float64
	unit   string // for the range in messages
	scale  float64
	offset float64
}{
	"time":        {dimTime, 0, 24 * 3600, "s", 1, 0},
	"speed":       {dimSpeed, 0, 400 / 3.6, "km/h", 1 / 3.6, 0},
	"grade":       {dimPercent, -30, 30, "%", 1, 0},
	"ambient":     {dimTemp, C - 50, C + 60, "C", 1, C},
	"head_heat":   {dimPower, 0, 50e3, "W", 1, 0},
	"barrel_heat": {dimPower, 0, 50e3, "W", 1, 0},
}

// MaxRideRows is the most rows a ride file may hold (a day at one row a
// second).
const MaxRideRows = 86400

// ReadRide reads a ride from a CSV file, for 'finmarch ride --profile': a
// header row naming the columns (time and speed; optionally grade,
// ambient, and head_heat with barrel_heat to give the heat instead of the
// road load), a unit in parentheses after a name applying to the bare
// numbers below it ("speed (km/h)"; grade is in per cent), then one row per
// moment: each row's conditions hold from its time until the next row's,
// and the last row's time ends the ride. The first time is 0 and times
// increase. Lines starting with # are comments. Every problem is reported
// with the file, the line and the column.
func ReadRide(src []byte, name string) ([]transient.Segment, error) {
	r, head, err := openCSV(src, name, "no header row: name the columns, e.g. time (s),speed (km/h),grade (%)")
	if err != nil {
		return nil, err
	}
	cols, units, errs := rideHeader(head, name, r)
	if len(errs) > 0 {
		return nil, errs
	}
	type row struct {
		line int
		v    map[string]float64
	}
	var rows []row
	if errs := readRows(r, name, len(cols), func(rec []string, line int) []string {
		v, bad := rideRow(rec, cols, units)
		switch n := len(rows); {
		case len(bad) > 0 || len(rec) > len(cols):
		case n == 0 && v["time"] != 0:
			bad = append(bad, fmt.Sprintf("time: the ride starts at 0, not %g s", v["time"]))
		case n > 0 && !(v["time"] > rows[n-1].v["time"]):
			bad = append(bad, fmt.Sprintf("time: %g s is not after the row before (%g s, line %d)", v["time"], rows[n-1].v["time"], rows[n-1].line))
		case n >= MaxRideRows:
			bad = append(bad, fmt.Sprintf("more than %d rows", MaxRideRows))
		}
		rows = append(rows, row{line, v})
		return bad
	}); len(errs) > 0 {
		return nil, errs
	}
	if len(rows) < 2 {
		return nil, Errors{{File: name, Msg: "a ride needs at least two rows: the start (time 0) and the end"}}
	}
	segs := make([]transient.Segment, 0, len(rows)-1)
	for i := 0; i+1 < len(rows); i++ {
		v := rows[i].v
		sg := transient.Segment{Duration: rows[i+1].v["time"] - v["time"], Speed: v["speed"], Grade: v["grade"], Ambient: v["ambient"]}
		if _, ok := v["head_heat"]; ok {
			sg.Heat = &[2]float64{v["head_heat"], v["barrel_heat"]}
		}
		segs = append(segs, sg)
	}
	return segs, nil
}

// rideHeader reads the header: each column's name and its unit.
func rideHeader(head []string, name string, r *csv.Reader) ([]string, []string, Errors) {
	var errs Errors
	line, _ := r.FieldPos(0)
	cols, units := make([]string, len(head)), make([]string, len(head))
	seen := map[string]bool{}
	for i, h := range head {
		col, unit := strings.TrimSpace(h), ""
		if j := strings.Index(col, "("); j >= 0 && strings.HasSuffix(col, ")") {
			col, unit = strings.TrimSpace(col[:j]), strings.TrimSpace(col[j+1:len(col)-1])
		}
		col = strings.ReplaceAll(strings.ToLower(col), " ", "_")
		c, ok := rideColumns[col]
		switch {
		case !ok:
			errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: "unknown column; allowed: time, speed, grade, ambient, head_heat, barrel_heat"})
		case seen[col]:
			errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: "column named twice"})
		case unit != "":
			if _, err := parseString("1 "+unit, c.dim); err != nil {
				errs = append(errs, &Error{File: name, Line: line, Key: h, Msg: fmt.Sprintf("unit %q: %v", unit, err)})
			}
		}
		seen[col] = true
		cols[i], units[i] = col, unit
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

// rideRow reads one row's values (SI), each checked against its range.
func rideRow(rec, cols, units []string) (map[string]float64, []string) {
	v := map[string]float64{}
	var bad []string
	for i, cell := range rec {
		cell = strings.TrimSpace(cell)
		if i >= len(cols) {
			continue
		}
		c := rideColumns[cols[i]]
		if cell == "" {
			if cols[i] == "time" || cols[i] == "speed" {
				bad = append(bad, cols[i]+": empty")
			}
			continue
		}
		text := cell
		if _, err := strconv.ParseFloat(cell, 64); err == nil {
			if units[i] == "" && c.dim.needsUnit {
				bad = append(bad, fmt.Sprintf("%s: %q has no unit; write it with its unit or put the unit in the header, \"%s (%s)\"", cols[i], cell, cols[i], c.unit))
				continue
			}
			if units[i] != "" {
				text = cell + " " + units[i]
			}
		}
		x, err := parseString(text, c.dim)
		if err != nil {
			bad = append(bad, fmt.Sprintf("%s: %v", cols[i], err))
			continue
		}
		if !(x >= c.lo && x <= c.hi) {
			bad = append(bad, fmt.Sprintf("%s: %s is outside the allowed %s to %s %s", cols[i], cell,
				strconv.FormatFloat((c.lo-c.offset)/c.scale, 'g', 4, 64), strconv.FormatFloat((c.hi-c.offset)/c.scale, 'g', 4, 64), c.unit))
			continue
		}
		v[cols[i]] = x
	}
	return v, bad
}
