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
	table, element := "", ""
	arrays := map[string]int{} // [[name]] headers seen so far
	inString := ""             // the delimiter of an open multi-line string
	for i, raw := range strings.Split(src, "\n") {
		s := strings.TrimSpace(raw)
		if inString != "" {
			// a line inside a multi-line string is not a key or a header,
			// whatever it holds
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
			end := strings.Index(s, "]")
			if end > 0 {
				table = strings.Trim(strings.TrimSpace(s[1:end]), "[] ")
				table = strings.ReplaceAll(table, "\"", "")
				table = strings.ReplaceAll(table, " ", "")
				if _, ok := l[table]; !ok {
					l[table] = i + 1
				}
				// each element of an array of tables is also name[n]
				element = ""
				if strings.HasPrefix(s, "[[") {
					arrays[table]++
					element = fmt.Sprintf("%s[%d]", table, arrays[table])
					l[element] = i + 1
				}
			}
			continue
		}
		if eq := strings.Index(s, "="); eq > 0 {
			key := strings.Trim(strings.TrimSpace(s[:eq]), "\"'")
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
		}
	}
	return l
}
