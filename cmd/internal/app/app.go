package app

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
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

// internal reports err as a bug (exit 6) unless it already carries an exit
// code: a user's flag applied to the built-in demo is the user's error.
func internal(err error) error {
	var ee *exitError
	if errors.As(err, &ee) {
		return err
	}
	return fail(ExitInternal, err)
}

type options struct {
	format   string
	units    string
	segments int
	// the operating point, overriding every design read
	speed, ambient, altitude string
	out                      string
	samples                  int // the band's samples; -1: the design's
	force                    bool
	quiet                    bool
	strict                   bool
}

type env struct {
	stdout, stderr io.Writer
	stdin          io.Reader // the design given as "-"
	opt            *options
	inputs         []string          // design files read, which no output may replace
	outputs        []opened          // outputs opened, of which no two may be one file
	sources        map[string][]byte // the text of each design read, by its path
	args           []string          // the command line, for the report
	command        string            // the command running, named in its JSON
}

// Stdin is where a design named "-" is read from.
var Stdin io.Reader = os.Stdin

// Run executes finmarch with args and returns the exit code.
func Run(args []string, stdout, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "finmarch: internal error: %v\nThis is a bug; please report it with the design file.\n", r)
			code = ExitInternal
		}
	}()
	e := &env{stdout: stdout, stderr: stderr, stdin: Stdin, opt: &options{}, sources: map[string][]byte{}, args: args}
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
		Args: func(c *cobra.Command, args []string) error {
			if len(args) > 0 {
				return unknownCommand(c, args[0])
			}
			return nil
		},
		RunE: func(c *cobra.Command, _ []string) error {
			return e.runDemo()
		},
		Version: buildInfo().String(),
	}
	root.SetVersionTemplate("{{.Version}}\n")
	root.PersistentPreRunE = func(c *cobra.Command, _ []string) error {
		e.command = c.Name()
		if c == root {
			e.command = "demo"
		}
		// a flag the command would silently ignore is refused
		for _, name := range strings.Split(c.Annotations[ignoredFlags], ",") {
			if name != "" && c.Flags().Changed(name) {
				return fail(ExitUsage, fmt.Errorf("--%s: '%s' does not use it", name, c.CommandPath()))
			}
		}
		// a count typed by the user is checked here: only the unset flag
		// (-1) stands for the design's own
		if n := e.opt.samples; c.Flags().Changed("samples") && (n < 0 || n > 0 && n < 10 || n > 100000) {
			return fail(ExitUsage, fmt.Errorf("--samples %d: allowed 0 (no band) or 10 to 100000; leave it out for the design's [uncertainty] samples", n))
		}
		if n := e.opt.segments; c.Flags().Changed("segments") && (n < 1 || n > 10000) {
			return fail(ExitUsage, fmt.Errorf("--segments %d: allowed 1 to 10000; leave it out for the design's (40 unless it says)", n))
		}
		return nil
	}
	pf := root.PersistentFlags()
	pf.StringVarP(&e.opt.format, "format", "f", "", "output format: table, markdown, csv or json (default: by the --output extension, .md, .csv or .json, else table)")
	pf.StringVarP(&e.opt.units, "units", "u", "metric", "display units: metric or us")
	e.opt.segments, e.opt.samples = -1, -1 // not given
	pf.Var(optInt{&e.opt.segments}, "segments", "march segments per air path, 1 to 10000 (overrides the design; default: the design's, 40 unless it says)")
	pf.StringVar(&e.opt.speed, "speed", "", "road speed, overriding the design's air.speed, e.g. \"110 km/h\"")
	pf.StringVar(&e.opt.ambient, "ambient", "", "ambient air temperature, overriding air.ambient, e.g. \"40 C\"")
	pf.StringVar(&e.opt.altitude, "altitude", "", "altitude, overriding air.altitude, e.g. \"1500 m\"")
	pf.StringVarP(&e.opt.out, "output", "o", "", "write the result to this file instead of standard output")
	pf.Var(optInt{&e.opt.samples}, "samples", "samples of the uncertainty band, 0 (none) or 10 to 100000 (default: the design's [uncertainty] samples, 1000 unless it says)")
	pf.BoolVar(&e.opt.force, "force", false, "allow --output (and new) to replace an existing file")
	pf.BoolVarP(&e.opt.quiet, "quiet", "q", false, "do not print warnings on standard error")
	pf.BoolVar(&e.opt.strict, "strict", false, "treat a correlation used outside its validity range as an error (exit 4)")
	_ = root.RegisterFlagCompletionFunc("format", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"table", "markdown", "csv", "json"}, cobra.ShellCompDirectiveNoFileComp
	})
	_ = root.RegisterFlagCompletionFunc("units", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"metric", "us"}, cobra.ShellCompDirectiveNoFileComp
	})
	operating := []string{"speed", "ambient", "altitude", "segments", "samples"}
	root.AddCommand(e.demoCmd(), e.estimateCmd(), e.compareCmd(), e.tiltCmd(), e.marchCmd(),
		ignores(e.speedsCmd(), "speed"), ignores(e.rideCmd(), "speed", "samples"), e.sweepCmd(), e.optimiseCmd(),
		ignores(e.calibrateCmd(), "speed", "ambient", "altitude", "samples"),
		ignores(e.plotCmd(), "format"), ignores(e.reportCmd(), "format"),
		ignores(e.finCmd(), operating...), ignores(e.alloysCmd(), append(operating, "strict")...),
		ignores(e.newCmd(), append(operating, "format", "units", "output", "strict")...),
		ignores(e.versionCmd(), append(operating, "units", "strict")...))
	root.SetHelpCommand(helpCmd())
	root.InitDefaultCompletionCmd()
	guardParents(root)
	return root
}

// optInt is an int flag that is -1 until given: its help shows no cobra
// default (the flag's text says what leaving it out means).
type optInt struct{ p *int }

func (o optInt) String() string {
	if o.p == nil || *o.p == -1 {
		return ""
	}
	return strconv.Itoa(*o.p)
}

func (o optInt) Set(s string) error {
	n, err := strconv.Atoi(strings.TrimSpace(s))
	if err != nil {
		return fmt.Errorf("%q is not a whole number", s)
	}
	*o.p = n
	return nil
}

func (o optInt) Type() string { return "int" }

// unknownCommand is the error of a command line naming a command that c
// does not have, with cobra's "did you mean" where one is close.
func unknownCommand(c *cobra.Command, name string) error {
	msg := fmt.Sprintf("unknown command %q for %q", name, c.CommandPath())
	if c.SuggestionsMinimumDistance <= 0 {
		c.SuggestionsMinimumDistance = 2 // cobra's own default, set only where cobra suggests
	}
	if s := c.SuggestionsFor(name); len(s) > 0 {
		msg += fmt.Sprintf("; did you mean %q?", s[0])
	}
	if c.HasParent() {
		msg += " (its commands: " + strings.Join(commandNames(c), ", ") + ")"
	} else {
		msg += " ('finmarch --help' lists the commands)"
	}
	return fail(ExitUsage, errors.New(msg))
}

// commandNames lists the commands of c that a user may give.
func commandNames(c *cobra.Command) []string {
	var names []string
	for _, sc := range c.Commands() {
		if sc.IsAvailableCommand() {
			names = append(names, sc.Name())
		}
	}
	return names
}

// guardParents makes every command below c that only holds commands (plot,
// completion) refuse a command line that names none of them, or one it
// does not have (exit 2, with "did you mean"), instead of printing its
// help and succeeding.
func guardParents(c *cobra.Command) {
	for _, sc := range c.Commands() {
		guardParents(sc)
		if !sc.HasSubCommands() || sc.Runnable() {
			continue
		}
		sc.Args = func(c *cobra.Command, args []string) error {
			if len(args) > 0 {
				return unknownCommand(c, args[0])
			}
			return nil
		}
		sc.RunE = func(c *cobra.Command, _ []string) error {
			return fail(ExitUsage, fmt.Errorf("'%s' needs one of its commands: %s ('%s --help' says what each does)", c.CommandPath(), strings.Join(commandNames(c), ", "), c.CommandPath()))
		}
	}
}

// helpCmd is 'finmarch help [command]': the help of a command, and an
// unknown command refused (exit 2, with "did you mean") rather than
// answered with the root's help and success.
func helpCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "help [command]",
		Short: "Help about any command",
		RunE: func(c *cobra.Command, args []string) error {
			cmd, rest, err := c.Root().Find(args)
			if err != nil || cmd == nil {
				return unknownCommand(c.Root(), strings.Join(args, " "))
			}
			if len(rest) > 0 {
				return unknownCommand(cmd, rest[0])
			}
			cmd.InitDefaultHelpFlag()
			cmd.InitDefaultVersionFlag()
			return cmd.Help()
		},
	}
}

// ignoredFlags is the annotation listing the global flags a command does
// not use (comma-separated): giving one is an error, not a silent no-op.
const ignoredFlags = "ignored-flags"

// ignores marks the global flags c does not use.
func ignores(c *cobra.Command, flags ...string) *cobra.Command {
	if c.Annotations == nil {
		c.Annotations = map[string]string{}
	}
	c.Annotations[ignoredFlags] = strings.Join(flags, ",")
	return c
}

func tomlArgs(_ *cobra.Command, _ []string, _ string) ([]string, cobra.ShellCompDirective) {
	return []string{"toml"}, cobra.ShellCompDirectiveFilterFileExt
}

// load reads and checks a design file, and remembers it as an input that
// no output may replace.
func (e *env) load(path string) (*design.Design, error) {
	if path == "-" {
		if _, read := e.sources["<stdin>"]; read {
			return nil, fail(ExitUsage, fmt.Errorf("standard input holds one design: give - once"))
		}
		src, err := io.ReadAll(io.LimitReader(e.stdin, design.MaxFileSize+1))
		if err != nil {
			return nil, fail(ExitIO, fmt.Errorf("cannot read the design from standard input: %w", err))
		}
		e.sources["<stdin>"] = src
		return e.parse(src, "<stdin>")
	}
	src, err := readDesign(path)
	if err != nil {
		return nil, err
	}
	e.inputs = append(e.inputs, path)
	e.sources[path] = src
	return e.parse(src, path)
}

func (e *env) parse(src []byte, name string) (*design.Design, error) {
	d, err := design.Parse(src, name)
	if err != nil {
		return nil, fail(ExitDesign, err)
	}
	if e.opt.segments != -1 {
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
		if err == nil {
			_, err = d.With(map[string]float64{o.key: v}) // the design's own rule for the key, naming this flag
		}
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
	name := e.opt.format
	if name == "" {
		// the --output extension picks the format unless -f says otherwise
		name = map[string]string{".md": "markdown", ".markdown": "markdown", ".csv": "csv", ".json": "json", ".jsonl": "json"}[strings.ToLower(filepath.Ext(e.opt.out))]
		if name == "" {
			name = "table"
		}
	}
	f, err := output.ParseFormat(name)
	if err != nil {
		return "", output.Units{}, fail(ExitUsage, err)
	}
	u, err := output.ParseUnits(e.opt.units)
	if err != nil {
		return "", output.Units{}, fail(ExitUsage, err)
	}
	u.Full = f == output.CSV
	return f, u, nil
}

// emit writes the document to stdout or the --output file, prints the
// warnings on stderr, and applies --strict.
func (e *env) emit(doc output.Doc) error { return e.emitAll([]output.Doc{doc}, nil) }

// emitAll is emit for several documents of one kind, one per design
// (names label them in CSV; output.WriteAll).
func (e *env) emitAll(docs []output.Doc, names []string) error {
	f, _, err := e.settings()
	if err != nil {
		return err
	}
	if f == output.JSON {
		for _, d := range docs {
			stampJSON(d.JSON, e.command)
		}
	}
	var buf bytes.Buffer
	if err := output.WriteAll(&buf, docs, names, f); err != nil {
		return fail(ExitInternal, fmt.Errorf("rendering the output: %w", err))
	}
	var warns, alerts []string
	caution := false
	for _, d := range docs {
		warns, alerts, caution = append(warns, d.Warnings...), append(alerts, d.Alerts...), caution || d.Caution
	}
	if e.opt.strict && len(warns) > 0 {
		for _, w := range warns {
			fmt.Fprintf(e.stderr, "warning: %s\n", w)
		}
		return fail(ExitStrict, fmt.Errorf("--strict: %d warning(s) (correlation ranges, casting limits); no output written", len(warns)))
	}
	if !e.opt.quiet {
		for _, w := range append(warns, alerts...) {
			fmt.Fprintf(e.stderr, "warning: %s\n", w)
		}
		if caution && f == output.CSV {
			fmt.Fprintln(e.stderr, output.Caution)
		}
	}
	return e.write(e.opt.out, buf.Bytes())
}

// rangeWarning is a range warning's text (validity.Warning.String, after
// a design's name): the correlation and quantity, the value or values
// seen, and the valid range.
var rangeWarning = regexp.MustCompile(`^(.* used outside its range: .* = )(\S+?)(?: to (\S+?))?(, valid .*)$`)

// warningsOf joins warnings, each once; range warnings of one cause (the
// same design, correlation, quantity and range) seen at several values,
// as over a tilt table's rows, become one warning with the span of the
// values seen.
func warningsOf(ws ...[]string) []string {
	type span struct {
		i      int
		lo, hi float64
		a, b   string
	}
	spans := map[string]*span{}
	seen := map[string]bool{}
	var out []string
	for _, l := range ws {
		for _, w := range l {
			if seen[w] {
				continue
			}
			seen[w] = true
			if m := rangeWarning.FindStringSubmatch(w); m != nil {
				a, b := m[2], m[3]
				if b == "" {
					b = a
				}
				lo, e1 := strconv.ParseFloat(a, 64)
				hi, e2 := strconv.ParseFloat(b, 64)
				if e1 == nil && e2 == nil {
					key := m[1] + "\x00" + m[4]
					if sp, ok := spans[key]; ok {
						if lo < sp.lo {
							sp.lo, sp.a = lo, a
						}
						if hi > sp.hi {
							sp.hi, sp.b = hi, b
						}
						vals := sp.a
						if sp.b != sp.a {
							vals += " to " + sp.b
						}
						out[sp.i] = m[1] + vals + m[4]
						continue
					}
					spans[key] = &span{i: len(out), lo: lo, hi: hi, a: a, b: b}
				}
			}
			out = append(out, w)
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
