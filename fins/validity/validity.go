package validity

import (
	"fmt"
	"sort"
	"strings"
)

// Warning is one cause: a correlation evaluated with a quantity outside its
// stated validity range. Seen and SeenMax hold the extreme values met.
type Warning struct {
	Correlation string  `json:"correlation"`
	Quantity    string  `json:"quantity"`
	Min         float64 `json:"min"`
	Max         float64 `json:"max"`
	SeenMin     float64 `json:"seen_min"`
	SeenMax     float64 `json:"seen_max"`
	Count       int     `json:"count"`
}

// String renders the warning in plain words.
func (w Warning) String() string {
	seen := trim(w.SeenMin)
	if w.SeenMax != w.SeenMin {
		seen = trim(w.SeenMin) + " to " + trim(w.SeenMax)
	}
	return fmt.Sprintf("%s used outside its range: %s = %s, valid %s to %s",
		w.Correlation, w.Quantity, seen, trim(w.Min), trim(w.Max))
}

func trim(v float64) string { return strings.TrimSuffix(fmt.Sprintf("%.4g", v), ".") }

type key struct{ corr, qty string }

// Log collects warnings. A nil *Log is valid and records nothing, so hot
// paths can pass nil when nobody listens. A Log is not safe for concurrent
// use; give each goroutine its own and Merge them.
type Log struct {
	m     map[key]*Warning
	order []key
}

// Check records a warning when v lies outside [lo, hi]. It returns true
// when v is inside the range. NaN counts as outside.
func (l *Log) Check(correlation, quantity string, v, lo, hi float64) bool {
	if v >= lo && v <= hi {
		return true
	}
	if l == nil {
		return false
	}
	if l.m == nil {
		l.m = make(map[key]*Warning)
	}
	k := key{correlation, quantity}
	w, ok := l.m[k]
	if !ok {
		w = &Warning{Correlation: correlation, Quantity: quantity, Min: lo, Max: hi, SeenMin: v, SeenMax: v}
		l.m[k] = w
		l.order = append(l.order, k)
	}
	if v < w.SeenMin {
		w.SeenMin = v
	}
	if v > w.SeenMax {
		w.SeenMax = v
	}
	w.Count++
	return false
}

// Merge adds the warnings of o into l.
func (l *Log) Merge(o *Log) {
	if l == nil || o == nil {
		return
	}
	for _, k := range o.order {
		w := o.m[k]
		l.Check(w.Correlation, w.Quantity, w.SeenMin, w.Min, w.Max)
		l.Check(w.Correlation, w.Quantity, w.SeenMax, w.Min, w.Max)
		l.m[k].Count += w.Count - 2
	}
}

// Warnings returns the recorded warnings sorted by correlation and quantity.
func (l *Log) Warnings() []Warning {
	if l == nil {
		return nil
	}
	out := make([]Warning, 0, len(l.order))
	for _, k := range l.order {
		out = append(out, *l.m[k])
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Correlation != out[j].Correlation {
			return out[i].Correlation < out[j].Correlation
		}
		return out[i].Quantity < out[j].Quantity
	})
	return out
}

// Len is the number of distinct causes recorded.
func (l *Log) Len() int {
	if l == nil {
		return 0
	}
	return len(l.order)
}

// Reset forgets every warning and keeps the storage, so that a Log can be
// reused for each trial of a search.
func (l *Log) Reset() {
	if l == nil {
		return
	}
	clear(l.m)
	l.order = l.order[:0]
}
