package airflow

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// The physics packages stay free of files, flags, the TOML library and the
// command line (the layout rule of DEVELOPERS.md): no non-test file under fins,
// airflow or materials imports them.
func TestPhysicsImports(t *testing.T) {
	forbidden := []string{"os", "flag", "github.com/BurntSushi/toml", "finmarch/cmd", "github.com/spf13/cobra", "github.com/olekukonko/tablewriter"}
	for _, root := range []string{"../fins", ".", "../materials"} {
		err := filepath.Walk(root, func(path string, info os.FileInfo, err error) error {
			if err != nil || info.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
				return err
			}
			f, err := parser.ParseFile(token.NewFileSet(), path, nil, parser.ImportsOnly)
			if err != nil {
				return err
			}
			for _, im := range f.Imports {
				p, _ := strconv.Unquote(im.Path.Value)
				for _, bad := range forbidden {
					if p == bad || strings.HasPrefix(p, bad+"/") {
						t.Errorf("%s imports %s", path, p)
					}
				}
			}
			return nil
		})
		if err != nil {
			t.Fatal(err)
		}
	}
}
