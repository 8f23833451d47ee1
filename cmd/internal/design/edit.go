package design

import (
	"strings"
)

// KV is one key of a design file and the TOML text of its value.
type KV struct {
	Key   string // table.key, such as air.pressure_recovery
	Value string // TOML, such as 0.351 or "12 K"
	Note  string // a comment written after the value
}

// SetKeys returns the design text src with each key set to its value: its
// line replaced where the key is written, else added under its table's
// header, else in a new table at the end. The rest of the file, comments
// included, is kept as written; a multi-line string is never edited.
func SetKeys(src []byte, kvs []KV) []byte {
	lines := strings.Split(string(src), "\n")
	for _, kv := range kvs {
		tbl, key, _ := strings.Cut(kv.Key, ".")
		text := key + " = " + kv.Value
		if kv.Note != "" {
			text += "  # " + kv.Note
		}
		at, header := keyLine(lines, tbl, key)
		switch {
		case at >= 0:
			lines[at] = text
		case header >= 0:
			lines = append(lines[:header+1], append([]string{text}, lines[header+1:]...)...)
		default:
			for len(lines) > 0 && strings.TrimSpace(lines[len(lines)-1]) == "" {
				lines = lines[:len(lines)-1]
			}
			lines = append(lines, "", "["+tbl+"]", text, "")
		}
	}
	return []byte(strings.Join(lines, "\n"))
}

// keyLine returns the line of tbl.key and the line of [tbl]'s header, -1
// where there is none.
func keyLine(lines []string, tbl, key string) (int, int) {
	at, header := -1, -1
	scanTOML(lines, func(i int, table, k string, array bool) {
		switch {
		case table != tbl:
		case k == "" && !array && header < 0:
			header = i
		case k == key && at < 0:
			at = i
		}
	})
	return at, header
}
