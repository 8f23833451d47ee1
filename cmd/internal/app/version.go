package app

import (
	"fmt"
	"reflect"
	"runtime"
	"runtime/debug"
	"sync"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/output"
)

// BuildInfo is what the binary knows of its own build: the module version
// ("(devel)" from a checkout), the commit and whether the tree had
// uncommitted changes, and the Go version, read from the build information
// the Go toolchain stamps into every binary.
type BuildInfo struct {
	Version  string `json:"version"`
	Commit   string `json:"commit"`
	Modified bool   `json:"modified"`
	Go       string `json:"go_version"`
}

// commit may be set by the build where the toolchain records no VCS
// information (GOFLAGS=-buildvcs=false):
// go build -ldflags "-X finmarch/cmd/internal/app.commit=$(git rev-parse --short=12 HEAD)" ./cmd/finmarch
var commit = ""

// buildInfo reads the binary's build information.
func buildInfo() BuildInfo {
	b := BuildInfo{Version: "(unknown)", Commit: "not recorded", Go: runtime.Version()}
	if commit != "" {
		b.Commit = commit
	}
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return b
	}
	b.Go = bi.GoVersion
	if bi.Main.Version != "" {
		b.Version = bi.Main.Version
	}
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			b.Commit = s.Value
			if len(b.Commit) > 12 {
				b.Commit = b.Commit[:12]
			}
		case "vcs.modified":
			b.Modified = s.Value == "true"
		}
	}
	return b
}

// String is the one-line version.
func (b BuildInfo) String() string {
	s := fmt.Sprintf("finmarch %s, commit %s", b.Version, b.Commit)
	if b.Modified {
		s += " (with uncommitted changes)"
	}
	return s + ", " + b.Go
}

func (e *env) versionCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "version",
		Short: "Print the version, the commit and the Go version this binary was built from",
		Args:  cobra.NoArgs,
		RunE: func(*cobra.Command, []string) error {
			b := buildInfo()
			return e.emit(output.Doc{Title: b.String(), JSON: map[string]any{"version": b.Version, "commit": b.Commit, "modified": b.Modified, "go_version": b.Go}})
		},
	}
}

// SchemaVersion is the version of the JSON documents' layout: raised when a
// key is renamed or removed or changes its meaning or unit (adding a key
// leaves it). 2: every key snake_case with its SI unit, lists never null,
// the design echoed under "inputs", each document naming its command.
const SchemaVersion = 2

// versionString is buildInfo's line, read once (a sweep stamps every row).
var versionString = sync.OnceValue(func() string { return buildInfo().String() })

// stampJSON adds the command, the schema version and the tool's version to
// a JSON document that is an object, and writes every nil list in it as an
// empty one ([] rather than null: a script can always iterate a list).
func stampJSON(doc any, command string) {
	if m, ok := doc.(map[string]any); ok {
		emptyLists(m)
		m["command"] = command
		m["schema_version"] = SchemaVersion
		m["finmarch_version"] = versionString()
	}
}

// emptyLists replaces each nil slice among the values of m, and of the
// maps and slices of maps below it, by an empty slice of its type.
func emptyLists(m map[string]any) {
	for k, v := range m {
		switch x := v.(type) {
		case map[string]any:
			emptyLists(x)
		case []map[string]any:
			for _, y := range x {
				emptyLists(y)
			}
		}
		if r := reflect.ValueOf(v); r.Kind() == reflect.Slice && r.IsNil() {
			m[k] = reflect.MakeSlice(r.Type(), 0, 0).Interface()
		}
	}
}
