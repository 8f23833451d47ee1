package sweep

import (
	"container/heap"
	"sort"
)

// Best keeps the n rows of least key (a max-heap on the key, so the worst
// of the kept rows is on top and is dropped first).
type Best struct {
	rows []Row
	key  func(Row) float64
	n    int
}

// NewBest keeps the n rows of least key.
func NewBest(n int, key func(Row) float64) *Best { return &Best{key: key, n: n} }

func (h *Best) Len() int           { return len(h.rows) }
func (h *Best) Less(i, j int) bool { return h.key(h.rows[i]) > h.key(h.rows[j]) }
func (h *Best) Swap(i, j int)      { h.rows[i], h.rows[j] = h.rows[j], h.rows[i] }

// Push and Pop serve container/heap.
func (h *Best) Push(x any) { h.rows = append(h.rows, x.(Row)) }

// Pop serves container/heap.
func (h *Best) Pop() any {
	r := h.rows[len(h.rows)-1]
	h.rows = h.rows[:len(h.rows)-1]
	return r
}

// Offer keeps r if it is among the n best so far.
func (h *Best) Offer(r Row) {
	if h.Len() < h.n {
		heap.Push(h, r)
		return
	}
	if h.key(r) < h.key(h.rows[0]) {
		h.rows[0] = r
		heap.Fix(h, 0)
	}
}

// Rows returns the kept rows, best first (ties by index).
func (h *Best) Rows() []Row {
	rs := append([]Row(nil), h.rows...)
	sort.Slice(rs, func(i, j int) bool {
		return h.key(rs[i]) < h.key(rs[j]) || h.key(rs[i]) == h.key(rs[j]) && rs[i].Index < rs[j].Index
	})
	return rs
}

// Summary gathers what a sweep's report needs as rows stream past: the
// count of rows by status, the invalid row of lowest index, the coolest
// heads and the lightest fins within both limits. With operating axes
// (NewGroupedSummary) the best lists hold designs, not points: each design
// by its worst operating point (group.go).
type Summary struct {
	Counts       map[string]int
	FirstInvalid *Row
	Coolest      *Best // least head wall, rows with an equilibrium
	Lightest     *Best // least fin mass, rows within both limits
	// the designs still open, by design number, when grouping
	grid      Grid
	operating []bool
	open      map[int]*group
	digits    []int
}

// NewSummary keeps the top best rows of each kind.
func NewSummary(top int) *Summary {
	return &Summary{Counts: map[string]int{},
		Coolest:  NewBest(top, func(r Row) float64 { return r.HeadWall }),
		Lightest: NewBest(top, func(r Row) float64 { return r.FinMass })}
}

// NewGroupedSummary keeps the top designs of each kind, a design judged by
// its worst point over the axes marked operating (one flag per axis of g):
// the coolest by the hottest head over its operating points, where every
// point has an equilibrium; the lightest among those within both limits at
// every point. A design with an invalid or failed point is not ranked.
// Run the grid in Grid.Grouped order to keep few designs open at once.
func NewGroupedSummary(top int, g Grid, operating []bool) *Summary {
	s := NewSummary(top)
	s.grid, s.operating, s.open, s.digits = g, operating, map[int]*group{}, make([]int, len(g))
	return s
}

// Open is the number of designs whose points have not all arrived.
func (s *Summary) Open() int { return len(s.open) }

// Add counts r and keeps it where it is among the best.
func (s *Summary) Add(r Row) {
	s.Counts[r.Status]++
	if r.Status == StatusInvalid && (s.FirstInvalid == nil || r.Index < s.FirstInvalid.Index) {
		c := r
		s.FirstInvalid = &c
	}
	if s.open != nil {
		id, per := s.grid.designOf(s.operating, r.Index, s.digits)
		gr := s.open[id]
		if gr == nil {
			gr = &group{}
			s.open[id] = gr
		}
		gr.fold(r)
		if gr.n < per {
			return
		}
		delete(s.open, id)
		if gr.broken {
			return
		}
		r = gr.worst
	}
	s.rank(r)
}

// rank offers a row (or a design's worst-case row) to the best lists.
func (s *Summary) rank(r Row) {
	if r.Evaluated && r.Equilibrium {
		s.Coolest.Offer(r)
		if r.Within() {
			s.Lightest.Offer(r)
		}
	}
}
