package app

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"finmarch/cmd/internal/design"
	"finmarch/cmd/internal/output"
)

// Exit codes.
const (
	ExitOK       = 0 // success
	ExitModel    = 1 // the model found no equilibrium or a solver failed
	ExitUsage    = 2 // bad command line
	ExitDesign   = 3 // the design file has errors
	ExitStrict   = 4 // --strict and a correlation was used outside its range
	ExitIO       = 5 // a file could not be read or written, or would be overwritten
	ExitInternal = 6 // a bug: please report it
)

// exitError carries an exit code with the message.
type exitError struct {
	code int
	err  error
}

func (e *exitError) Error() string { return e.err.Error() }
func (e *exitError) Unwrap() error { return e.err }

func fail(code int, err error) error { return &exitError{code: code, err: err} }

type options struct {
	format   string
	units    string
	segments int
	// the operating point, overriding every design read
	speed, ambient, altitude string
	out                      string
	force                    bool
	quiet                    bool
	strict                   bool
}

type env struct {
	stdout, stderr io.Writer
	opt            *options
}

// Run executes finmarch with args and returns the exit code.
func Run(args []string, stdout, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "finmarch: internal error: %v\nThis is a bug; please report it with the design file.\n", r)
			code = ExitInternal
		}
	}()
	e := &env{stdout: stdout, stderr: stderr, opt: &options{}}
	root := e.rootCmd()
	if args == nil {
		args = []string{} // cobra reads os.Args when given nil
	}
	root.SetArgs(args)
	root.SetOut(stdout)
	root.SetErr(stderr)
	err := root.Execute()
	if err == nil {
		return ExitOK
	}
	var ee *exitError
	if errors.As(err, &ee) {
		fmt.Fprintf(stderr, "finmarch: %v\n", ee.err)
		return ee.code
	}
	fmt.Fprintf(stderr, "finmarch: %v\nRun 'finmarch --help' for the commands.\n", err)
	return ExitUsage
}

func (e *env) rootCmd() *cobra.Command {
	root := &cobra.Command{
		Use:   "finmarch",
		Short: "Estimate how well the fins of an air-cooled cylinder cool it",
		Long: `finmarch estimates the head and barrel temperatures of an air-cooled cylinder
from its fins, the cooling air and the heat load, by published fin-efficiency
and convection correlations and a march of the cooling-air temperature along
the fin passages. With no command it runs the built-in demo: one cylinder,
upright with annular fins against laid over with longitudinal fins.`,
		SilenceUsage:  true,
		SilenceErrors: true,
		Args:          cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			return e.runDemo()
		},
	}
	pf := root.PersistentFlags()
	pf.StringVarP(&e.opt.format, "format", "f", "table", "output format: table, markdown, csv or json")
	pf.StringVarP(&e.opt.units, "units", "u", "metric", "display units: metric or us")
	pf.IntVar(&e.opt.segments, "segments", 0, "march segments per air path (overrides the design; default 40)")
	pf.StringVar(&e.opt.speed, "speed", "", "road speed, overriding the design's air.speed, e.g. \"110 km/h\"")
	pf.StringVar(&e.opt.ambient, "ambient", "", "ambient air temperature, overriding air.ambient, e.g. \"40 C\"")
	pf.StringVar(&e.opt.altitude, "altitude", "", "altitude, overriding air.altitude, e.g. \"1500 m\"")
	pf.StringVarP(&e.opt.out, "output", "o", "", "write the result to this file instead of standard output")
	pf.BoolVar(&e.opt.force, "force", false, "allow --output (and new) to replace an existing file")
	pf.BoolVarP(&e.opt.quiet, "quiet", "q", false, "do not print warnings on standard error")
	pf.BoolVar(&e.opt.strict, "strict", false, "treat a correlation used outside its validity range as an error (exit 4)")
	_ = root.RegisterFlagCompletionFunc("format", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"table", "markdown", "csv", "json"}, cobra.ShellCompDirectiveNoFileComp
	})
	_ = root.RegisterFlagCompletionFunc("units", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"metric", "us"}, cobra.ShellCompDirectiveNoFileComp
	})
	root.AddCommand(e.demoCmd(), e.estimateCmd(), e.compareCmd(), e.tiltCmd(), e.marchCmd(), e.speedsCmd(),
		e.sweepCmd(), e.optimiseCmd(), e.plotCmd(), e.reportCmd(), e.finCmd(), e.alloysCmd(), e.newCmd())
	return root
}

func tomlArgs(_ *cobra.Command, _ []string, _ string) ([]string, cobra.ShellCompDirective) {
	return []string{"toml"}, cobra.ShellCompDirectiveFilterFileExt
}

// load reads and checks a design file.
func (e *env) load(path string) (*design.Design, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, fail(ExitIO, fmt.Errorf("cannot read the design: %w", err))
	}
	return e.parse(src, path)
}

func (e *env) parse(src []byte, name string) (*design.Design, error) {
	d, err := design.Parse(src, name)
	if err != nil {
		return nil, fail(ExitDesign, err)
	}
	if e.opt.segments != 0 {
		if e.opt.segments < 1 || e.opt.segments > 10000 {
			return nil, fail(ExitUsage, fmt.Errorf("--segments %d: allowed 1 to 10000", e.opt.segments))
		}
		d.OverrideSegments(e.opt.segments)
	}
	// the operating point from the flags, checked by the design's own rules
	vals := map[string]float64{}
	for _, o := range []struct{ flag, key, s string }{
		{"--speed", "air.speed", e.opt.speed}, {"--ambient", "air.ambient", e.opt.ambient}, {"--altitude", "air.altitude", e.opt.altitude},
	} {
		if o.s == "" {
			continue
		}
		v, err := design.ParseFor(o.key, o.s)
		if err != nil {
			return nil, fail(ExitUsage, fmt.Errorf("%s %q: %v", o.flag, o.s, err))
		}
		vals[o.key] = v
	}
	if len(vals) > 0 {
		if d, err = d.With(vals); err != nil {
			return nil, fail(ExitUsage, fmt.Errorf("--speed, --ambient or --altitude: %w", err))
		}
	}
	return d, nil
}

func (e *env) settings() (output.Format, output.Units, error) {
	f, err := output.ParseFormat(e.opt.format)
	if err != nil {
		return "", output.Units{}, fail(ExitUsage, err)
	}
	u, err := output.ParseUnits(e.opt.units)
	if err != nil {
		return "", output.Units{}, fail(ExitUsage, err)
	}
	return f, u, nil
}

// emit writes the document to stdout or the --output file, prints the
// warnings on stderr, and applies --strict.
func (e *env) emit(doc output.Doc) error {
	f, _, err := e.settings()
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := output.Write(&buf, doc, f); err != nil {
		return fail(ExitInternal, fmt.Errorf("rendering the output: %w", err))
	}
	if e.opt.strict && len(doc.Warnings) > 0 {
		for _, w := range doc.Warnings {
			fmt.Fprintf(e.stderr, "warning: %s\n", w)
		}
		return fail(ExitStrict, fmt.Errorf("--strict: %d correlation range warning(s); no output written", len(doc.Warnings)))
	}
	if !e.opt.quiet {
		for _, w := range doc.Warnings {
			fmt.Fprintf(e.stderr, "warning: %s\n", w)
		}
		for _, a := range doc.Alerts {
			fmt.Fprintf(e.stderr, "warning: %s\n", a)
		}
		if doc.Caution && f == output.CSV {
			fmt.Fprintln(e.stderr, output.Caution)
		}
	}
	if e.opt.out == "" {
		_, err := e.stdout.Write(buf.Bytes())
		return err
	}
	return writeFile(e.opt.out, buf.Bytes(), e.opt.force)
}

// atomicFile is a temporary file beside its target that becomes the target
// only on Commit, so that a failed run leaves no half-written file, and
// that replaces an existing target only when force is set.
type atomicFile struct {
	*os.File
	path  string
	force bool
	done  bool
}

func createAtomic(path string, force bool) (*atomicFile, error) {
	if !force {
		if _, err := os.Stat(path); err == nil {
			return nil, fail(ExitIO, fmt.Errorf("%s already exists; add --force to replace it", path))
		}
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return nil, fail(ExitIO, fmt.Errorf("cannot write %s: %w", path, err))
	}
	_ = tmp.Chmod(0o644) // CreateTemp makes 0600; results are ordinary files
	return &atomicFile{File: tmp, path: path, force: force}, nil
}

// Abort removes the temporary file unless Commit has run.
func (a *atomicFile) Abort() {
	if !a.done {
		a.Close()
		os.Remove(a.Name())
		a.done = true
	}
}

// Commit closes the temporary file and puts it in place: by a link when
// the target must not be replaced (a link fails if the target appeared
// meanwhile, unlike a rename), by a rename otherwise.
func (a *atomicFile) Commit() error {
	name := a.Name()
	a.done = true
	if err := a.Close(); err != nil {
		os.Remove(name)
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", a.path, err))
	}
	if a.force {
		if err := os.Rename(name, a.path); err != nil {
			os.Remove(name)
			return fail(ExitIO, fmt.Errorf("cannot write %s: %w", a.path, err))
		}
		return nil
	}
	err := os.Link(name, a.path)
	os.Remove(name)
	if os.IsExist(err) {
		return fail(ExitIO, fmt.Errorf("%s already exists; add --force to replace it", a.path))
	}
	if err != nil {
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", a.path, err))
	}
	return nil
}

// writeFile writes data to path through an atomicFile.
func writeFile(path string, data []byte, force bool) error {
	f, err := createAtomic(path, force)
	if err != nil {
		return err
	}
	defer f.Abort()
	if _, err := f.Write(data); err != nil {
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", path, err))
	}
	return f.Commit()
}

func warningsOf(ws ...[]string) []string {
	seen := map[string]bool{}
	var out []string
	for _, l := range ws {
		for _, w := range l {
			if !seen[w] {
				seen[w] = true
				out = append(out, w)
			}
		}
	}
	return out
}

func title(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
