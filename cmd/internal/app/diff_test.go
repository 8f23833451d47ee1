package app

import (
	"fmt"
	"strings"
	"testing"
)

// lineDiff returns the lines that differ between want and got, marked "-"
// (only in want) and "+" (only in got), with up to two lines of context
// ("  ") around each change, numbered by the line of want (of got for
// "+"), by the longest
// common subsequence of lines. At most limit changed lines are shown.
func lineDiff(want, got string, limit int) string {
	a, b := strings.Split(want, "\n"), strings.Split(got, "\n")
	// lcs[i][j]: the longest common subsequence of a[i:] and b[j:]
	lcs := make([][]int, len(a)+1)
	for i := range lcs {
		lcs[i] = make([]int, len(b)+1)
	}
	for i := len(a) - 1; i >= 0; i-- {
		for j := len(b) - 1; j >= 0; j-- {
			if a[i] == b[j] {
				lcs[i][j] = lcs[i+1][j+1] + 1
			} else {
				lcs[i][j] = max(lcs[i+1][j], lcs[i][j+1])
			}
		}
	}
	type line struct {
		mark string
		n    int
		text string
	}
	var ops []line
	i, j := 0, 0
	for i < len(a) || j < len(b) {
		switch {
		case i < len(a) && j < len(b) && a[i] == b[j]:
			ops = append(ops, line{" ", i + 1, a[i]})
			i, j = i+1, j+1
		case i < len(a) && (j == len(b) || lcs[i+1][j] >= lcs[i][j+1]):
			ops = append(ops, line{"-", i + 1, a[i]})
			i++
		default:
			ops = append(ops, line{"+", j + 1, b[j]})
			j++
		}
	}
	var out strings.Builder
	shown, last := 0, -1
	for k, op := range ops {
		if op.mark == " " {
			continue
		}
		for c := max(k-2, last+1); c < k; c++ {
			fmt.Fprintf(&out, "%4d   %s\n", ops[c].n, ops[c].text)
		}
		fmt.Fprintf(&out, "%4d %s %s\n", op.n, op.mark, op.text)
		last = k
		if shown++; shown >= limit {
			out.WriteString("... (more changes)\n")
			break
		}
		if k+1 < len(ops) && ops[k+1].mark == " " {
			for c := k + 1; c < min(k+3, len(ops)) && ops[c].mark == " "; c++ {
				fmt.Fprintf(&out, "%4d   %s\n", ops[c].n, ops[c].text)
				last = c
			}
		}
	}
	return out.String()
}

// The diff shows a changed line as a removal and an addition with its
// context, and nothing for equal texts.
func TestLineDiff(t *testing.T) {
	if d := lineDiff("a\nb\nc", "a\nb\nc", 10); d != "" {
		t.Errorf("equal texts: %q", d)
	}
	d := lineDiff("a\nb\nc\nd\ne\nf", "a\nb\nc\nX\ne\nf", 10)
	for _, want := range []string{"   4 - d\n", "   4 + X\n", "   3   c\n", "   5   e\n"} {
		if !strings.Contains(d, want) {
			t.Errorf("diff lacks %q:\n%s", want, d)
		}
	}
	if strings.Contains(d, "   1   a") {
		t.Errorf("context too wide:\n%s", d)
	}
}
