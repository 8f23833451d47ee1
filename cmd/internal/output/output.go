package output

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"html"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"
)

// Caution is printed with every estimate.
const Caution = "Caution: this is an estimate, not a measurement. Measure head temperature on the running engine " +
	"(a spark-plug-seat thermocouple), and follow the engine maker's limits, local regulations and qualified practice. " +
	"An overheated engine can seize."

// Format is an output format.
type Format string

// The formats.
const (
	Table    Format = "table"
	Markdown Format = "markdown"
	CSV      Format = "csv"
	JSON     Format = "json"
)

// ParseFormat checks a --format value.
func ParseFormat(s string) (Format, error) {
	switch f := Format(strings.ToLower(s)); f {
	case Table, Markdown, CSV, JSON:
		return f, nil
	case "md":
		return Markdown, nil
	}
	return "", fmt.Errorf("format %q: use table, markdown, csv or json", s)
}

// Grid is one table of a document.
type Grid struct {
	Title  string
	Header []string
	Rows   [][]string
	Left   int // number of leading columns aligned left (labels)
}

// Doc is what a command prints.
type Doc struct {
	Title    string
	Grids    []Grid   // the first is the primary grid, the one CSV writes
	Notes    []string // explanations printed after the tables
	Blocks   []Block  // verbatim text after the notes (design keys to paste); CSV leaves them out
	Warnings []string // correlation range warnings; also sent to stderr by the caller
	Alerts   []string // results the user must see (a limit exceeded); sent to stderr, not affected by --strict
	Caution  bool
	JSON     any // the structured payload for --format json
}

// Block is text printed as it is, under a caption: lines a user can copy
// (design-file keys), never wrapped.
type Block struct {
	Caption string
	Text    string
}

// Write renders d to w in format f.
func Write(w io.Writer, d Doc, f Format) error {
	ew := &errWriter{w: w}
	err := write(ew, d, f)
	if err == nil {
		err = ew.err
	}
	return err
}

// WriteAll renders several documents of one kind (one per design) as one
// output: tables and Markdown one after another with the caution once at
// the end; JSON an array of the documents; CSV the first grid of each with
// a leading column naming its document (names[i]), the header once.
func WriteAll(w io.Writer, docs []Doc, names []string, f Format) error {
	if len(docs) == 1 {
		return Write(w, docs[0], f)
	}
	ew := &errWriter{w: w}
	var err error
	switch f {
	case JSON:
		all := make([]any, len(docs))
		for i, d := range docs {
			all[i] = d.JSON
		}
		enc := json.NewEncoder(ew)
		enc.SetIndent("", "  ")
		err = enc.Encode(all)
	case CSV:
		cw := csv.NewWriter(ew)
		for i, d := range docs {
			if len(d.Grids) == 0 {
				continue
			}
			g := csvColumns(d.Grids[0])
			if i == 0 {
				err = cw.Write(append([]string{"design"}, g.Header...))
			}
			for _, r := range g.Rows {
				for _, c := range csvRows(r) {
					if err == nil {
						err = cw.Write(append([]string{names[i]}, c...))
					}
				}
			}
		}
		cw.Flush()
		if err == nil {
			err = cw.Error()
		}
	default:
		caution := false
		for i, d := range docs {
			caution = caution || d.Caution
			d.Caution = caution && i == len(docs)-1
			if i > 0 {
				fmt.Fprintln(ew)
			}
			if err = write(ew, d, f); err != nil {
				break
			}
		}
	}
	if err == nil {
		err = ew.err
	}
	return err
}

// csvColumns splits each column headed "... 5 % to 95 % ..." whose cells
// are ranges "a to b" into a 5 % column and a 95 % column (a single state,
// such as "no equilibrium", goes to both).
func csvColumns(g Grid) Grid {
	const rng = "5 % to 95 %"
	var header []string
	split := map[int]bool{}
	for i, h := range g.Header {
		if strings.Contains(h, rng) {
			split[i] = true
			header = append(header, strings.Replace(h, rng, "5 %", 1), strings.Replace(h, rng, "95 %", 1))
			continue
		}
		header = append(header, h)
	}
	if len(split) == 0 {
		return g
	}
	out := Grid{Title: g.Title, Header: header, Left: g.Left}
	for _, r := range g.Rows {
		var row []string
		for i, c := range r {
			if !split[i] {
				row = append(row, c)
				continue
			}
			a, b, ok := strings.Cut(c, " to ")
			if !ok {
				a, b = c, c
			}
			row = append(row, a, b)
		}
		out.Rows = append(out.Rows, row)
	}
	return out
}

// csvRows are a table row as spreadsheet rows: one value per cell, without
// the padding that indents a label. A row labelled "... head / barrel"
// whose cells are pairs "a / b" becomes a head row and a barrel row; a row
// labelled "..., 5 % to 95 %" whose cells are ranges "a to b" becomes a 5 %
// row and a 95 % row (a single state, such as "no equilibrium", goes to
// both).
func csvRows(r []string) [][]string {
	out := make([]string, len(r))
	for i, c := range r {
		out[i] = strings.TrimSpace(c)
	}
	for _, s := range []struct{ label, sep, a, b string }{{"head / barrel", " / ", "head", "barrel"}, {"5 % to 95 %", " to ", "5 %", "95 %"}} {
		if len(out) == 0 || !strings.Contains(out[0], s.label) {
			continue
		}
		ra, rb := append([]string(nil), out...), append([]string(nil), out...)
		ra[0], rb[0] = strings.Replace(out[0], s.label, s.a, 1), strings.Replace(out[0], s.label, s.b, 1)
		for i := 1; i < len(out); i++ {
			if x, y, ok := strings.Cut(out[i], s.sep); ok {
				ra[i], rb[i] = x, y
			}
		}
		return [][]string{ra, rb}
	}
	return [][]string{out}
}

// errWriter keeps the first write error, which the table renderer and
// fmt.Fprintf would drop (a full disk must not pass for a written result).
type errWriter struct {
	w   io.Writer
	err error
}

func (e *errWriter) Write(p []byte) (int, error) {
	if e.err != nil {
		return 0, e.err
	}
	n, err := e.w.Write(p)
	e.err = err
	return n, err
}

func write(w io.Writer, d Doc, f Format) error {
	switch f {
	case JSON:
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(d.JSON)
	case CSV:
		if len(d.Grids) == 0 {
			return nil
		}
		cw := csv.NewWriter(w)
		g := csvColumns(d.Grids[0])
		if err := cw.Write(g.Header); err != nil {
			return err
		}
		for _, r := range g.Rows {
			for _, c := range csvRows(r) {
				if err := cw.Write(c); err != nil {
					return err
				}
			}
		}
		cw.Flush()
		return cw.Error()
	case Markdown:
		if d.Title != "" {
			// a design's name is text: markup in it must not render
			fmt.Fprintf(w, "## %s\n\n", html.EscapeString(d.Title))
		}
		for _, g := range d.Grids {
			if g.Title != "" {
				fmt.Fprintf(w, "**%s**\n\n", g.Title)
			}
			t := tablewriter.NewTable(w, tablewriter.WithRenderer(renderer.NewMarkdown()),
				tablewriter.WithConfig(config(g)), tablewriter.WithHeaderAutoFormat(tw.Off))
			if err := fill(t, g); err != nil {
				return err
			}
			fmt.Fprintln(w)
		}
		for _, n := range d.Notes {
			fmt.Fprintf(w, "- %s\n", n)
		}
		for _, b := range d.Blocks {
			fmt.Fprintf(w, "\n%s\n\n```toml\n%s\n```\n", b.Caption, strings.TrimRight(b.Text, "\n"))
		}
		if len(d.Warnings)+len(d.Alerts) > 0 {
			fmt.Fprintln(w)
			for _, n := range d.Alerts {
				fmt.Fprintf(w, "- **Over the limit:** %s\n", n)
			}
			for _, n := range d.Warnings {
				fmt.Fprintf(w, "- Warning: %s\n", n)
			}
		}
		if d.Caution {
			fmt.Fprintf(w, "\n> %s\n", Caution)
		}
		return nil
	default:
		if d.Title != "" {
			fmt.Fprintf(w, "%s\n\n", d.Title)
		}
		for _, g := range d.Grids {
			if g.Title != "" {
				fmt.Fprintf(w, "%s\n", g.Title)
			}
			t := tablewriter.NewTable(w,
				tablewriter.WithRenderer(renderer.NewBlueprint(tw.Rendition{Symbols: tw.NewSymbols(tw.StyleASCII)})),
				tablewriter.WithConfig(config(g)), tablewriter.WithHeaderAutoFormat(tw.Off))
			g = fitHeaders(g, TableWidth)
			if err := fill(t, g); err != nil {
				return err
			}
			fmt.Fprintln(w)
		}
		for _, n := range d.Notes {
			fmt.Fprintln(w, wrap(n, 100, "  "))
		}
		for _, b := range d.Blocks {
			fmt.Fprintf(w, "\n%s\n\n", wrap(b.Caption, 100, "  "))
			for _, l := range strings.Split(strings.TrimRight(b.Text, "\n"), "\n") {
				fmt.Fprintf(w, "    %s\n", l)
			}
		}
		if d.Caution {
			if len(d.Notes)+len(d.Blocks) > 0 { // a grid already ends with a blank line
				fmt.Fprintln(w)
			}
			fmt.Fprintf(w, "%s\n", wrap(Caution, 100, ""))
		}
		return nil
	}
}

// TableWidth is the width a text table should fit in, in columns.
const TableWidth = 120

// fitHeaders folds the header cells of a text table over several lines,
// at spaces, until the table fits width columns or no fold narrows it: the
// values are never cut, so a table whose values are wider stays wider.
// Each step takes the fold that narrows the table most: the header's
// longest line split at the space nearest its middle (never between a
// number and its "%").
func fitHeaders(g Grid, width int) Grid {
	n := len(g.Header)
	lines := make([][]string, n) // each header's lines
	data := make([]int, n)       // the widest value of each column
	for i, h := range g.Header {
		lines[i] = []string{h}
	}
	for _, r := range g.Rows {
		for i, c := range r {
			if i < n {
				data[i] = max(data[i], utf8.RuneCountInString(c))
			}
		}
	}
	colWidth := func(i int) int {
		w := data[i]
		for _, l := range lines[i] {
			w = max(w, utf8.RuneCountInString(l))
		}
		return w
	}
	total := func() int {
		t := 1
		for i := range lines {
			t += colWidth(i) + 3
		}
		return t
	}
	fold := func(i int) []string {
		ls := lines[i]
		k := 0
		for j, l := range ls {
			if utf8.RuneCountInString(l) > utf8.RuneCountInString(ls[k]) {
				k = j
			}
		}
		l, cut := ls[k], -1
		for j, r := range l {
			if r == ' ' && !strings.HasPrefix(l[j+1:], "%") && (cut < 0 || abs(j-len(l)/2) < abs(cut-len(l)/2)) {
				cut = j
			}
		}
		if cut < 0 {
			return nil
		}
		return append(append(append([]string{}, ls[:k]...), l[:cut], l[cut+1:]), ls[k+1:]...)
	}
	for total() > width {
		best, gain, bestLines := -1, 0, []string(nil)
		for i := range lines {
			f := fold(i)
			if f == nil {
				continue
			}
			old, w := lines[i], colWidth(i)
			lines[i] = f
			if g := w - colWidth(i); g > gain {
				best, gain, bestLines = i, g, f
			}
			lines[i] = old
		}
		if best < 0 {
			break // no fold narrows it: the values set the width
		}
		lines[best] = bestLines
	}
	out := g
	out.Header = make([]string, n)
	for i := range lines {
		out.Header[i] = strings.Join(lines[i], "\n")
	}
	return out
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

func config(g Grid) tablewriter.Config {
	al := make([]tw.Align, len(g.Header))
	for i := range al {
		if i < g.Left {
			al[i] = tw.AlignLeft
		} else {
			al[i] = tw.AlignRight
		}
	}
	return tablewriter.Config{Row: tw.CellConfig{Alignment: tw.CellAlignment{PerColumn: al}}}
}

func fill(t *tablewriter.Table, g Grid) error {
	h := make([]any, len(g.Header))
	for i, s := range g.Header {
		h[i] = s
	}
	t.Header(h...)
	for _, r := range g.Rows {
		row := make([]any, len(r))
		for i, s := range r {
			row[i] = s
		}
		if err := t.Append(row...); err != nil {
			return err
		}
	}
	return t.Render()
}

// wrap folds a note at width with an indent on continuation lines.
func wrap(s string, width int, indent string) string {
	words := strings.Fields(s)
	var b strings.Builder
	col := 0
	for i, w := range words {
		if i > 0 && col+1+len(w) > width {
			b.WriteString("\n" + indent)
			col = len(indent)
		} else if i > 0 {
			b.WriteByte(' ')
			col++
		}
		b.WriteString(w)
		col += len(w)
	}
	return b.String()
}

// Num formats a finite value with the given decimals; NaN and Inf become
// "n/a" so that no NaN reaches a table.
func Num(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if s == "-0" || strings.HasPrefix(s, "-0.") && strings.Trim(s[3:], "0") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}
