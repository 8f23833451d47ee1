package output

import (
	"bufio"
	"encoding/csv"
	"encoding/json"
	"io"
)

// Stream writes rows as they come, in constant memory: CSV (the header,
// then one record a row) or JSON lines (one object a row). Table and
// Markdown are not streamed: they write nothing here.
type Stream struct {
	f   Format
	bw  *bufio.Writer
	cw  *csv.Writer
	err error
}

// NewStream starts a stream of format f on w, writing the CSV header.
func NewStream(w io.Writer, f Format, header []string) *Stream {
	s := &Stream{f: f, bw: bufio.NewWriterSize(w, 1<<16)}
	s.cw = csv.NewWriter(s.bw)
	if f == CSV {
		s.err = s.cw.Write(header)
	}
	return s
}

// Row writes one row: cells for CSV, obj for JSON lines (each built only
// for its format). After the first error it writes nothing more; Close
// reports it.
func (s *Stream) Row(cells func() []string, obj func() map[string]any) {
	if s.err != nil {
		return
	}
	switch s.f {
	case CSV:
		s.err = s.cw.Write(cells())
	case JSON:
		var b []byte
		if b, s.err = json.Marshal(obj()); s.err == nil {
			b = append(b, '\n')
			_, s.err = s.bw.Write(b)
		}
	}
}

// Close flushes the stream and returns its first error.
func (s *Stream) Close() error {
	s.cw.Flush()
	if s.err == nil {
		s.err = s.cw.Error()
	}
	if s.err == nil {
		s.err = s.bw.Flush()
	}
	return s.err
}
