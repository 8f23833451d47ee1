package design

import (
	"fmt"
	"strings"
)

// locator maps dotted keys to their line in the source.
type locator map[string]int

func (l locator) line(key string) int {
	for k := key; k != ""; {
		if n, ok := l[k]; ok {
			return n
		}
		i := strings.LastIndex(k, ".")
		if i < 0 {
			break
		}
		k = k[:i]
	}
	return 0
}

func locate(src string) locator {
	l := locator{}
	element := ""
	arrays := map[string]int{} // [[name]] headers seen so far
	scanTOML(strings.Split(src, "\n"), func(i int, table, key string, array bool) {
		if key == "" {
			if _, ok := l[table]; !ok {
				l[table] = i + 1
			}
			// each element of an array of tables is also name[n]
			element = ""
			if array {
				arrays[table]++
				element = fmt.Sprintf("%s[%d]", table, arrays[table])
				l[element] = i + 1
			}
			return
		}
		full := key
		if table != "" {
			full = table + "." + key
		}
		if _, ok := l[full]; !ok {
			l[full] = i + 1
		}
		if element != "" {
			l[element+"."+key] = i + 1
		}
	})
	return l
}

// scanTOML calls fn for each table header (key "") and each key line of a
// TOML text, with the table it belongs to (dotted, unquoted, no spaces) and
// whether the header is an array element ([[name]]); the lines inside a
// multi-line string are neither, whatever they hold, and comments are
// skipped.
func scanTOML(lines []string, fn func(i int, table, key string, array bool)) {
	table, inString := "", "" // inString: the delimiter of an open multi-line string
	for i, raw := range lines {
		s := strings.TrimSpace(raw)
		if inString != "" {
			if strings.Count(s, inString)%2 == 1 {
				inString = ""
			}
			continue
		}
		for _, q := range []string{`"""`, "'''"} {
			if strings.Count(s, q)%2 == 1 {
				inString = q
			}
		}
		if s == "" || s[0] == '#' {
			continue
		}
		if strings.HasPrefix(s, "[") {
			if end := strings.Index(s, "]"); end > 0 {
				table = strings.Trim(strings.TrimSpace(s[1:end]), "[] ")
				table = strings.ReplaceAll(strings.ReplaceAll(table, "\"", ""), " ", "")
				fn(i, table, "", strings.HasPrefix(s, "[["))
			}
			continue
		}
		if eq := strings.Index(s, "="); eq > 0 {
			fn(i, table, strings.Trim(strings.TrimSpace(s[:eq]), "\"'"), false)
		}
	}
}
