package app

import (
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"time"

	"finmarch/cmd/internal/design"
)

// The file layer: outputs written so that nothing is replaced that the
// user did not ask to replace, nothing is left half-written, and devices,
// FIFOs and standard output are written as streams; inputs read only from
// regular files and only up to the design-file limit.

// sink is where a command's result goes.
type sink interface {
	io.Writer
	// Commit finishes the output: for a file, puts it in place.
	Commit() error
	// Abort drops an output that was not committed (a no-op after Commit).
	Abort()
}

// stream is an output written as it comes: standard output, a character
// device or a FIFO. Nothing is replaced, so it needs no --force.
type stream struct {
	io.Writer
	path string
	f    *os.File // nil for standard output
}

func (s *stream) Commit() error {
	if s.f == nil {
		return nil
	}
	if err := s.f.Close(); err != nil {
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", s.path, err))
	}
	return nil
}

func (s *stream) Abort() {
	if s.f != nil {
		s.f.Close()
	}
}

// openOutput returns the sink for --output path ("" or "-" is standard
// output). A regular file is written through a temporary file beside it
// and replaced only with force; a link is followed to what it names; a
// character device or a FIFO is written as a stream; a directory, socket,
// block device or a design file this run reads is refused, even with
// force.
func (e *env) openOutput(path string, force bool) (sink, error) {
	// no two outputs of one run are the same file, or the same stream as
	// standard output (which calibrate --write - turns to standard error)
	o := opened{path: path}
	if path == "" || path == "-" {
		o.w = e.stdout
	}
	for _, p := range e.outputs {
		if p.w != nil && p.w == o.w || p.w == nil && o.w == nil && sameOutput(p.path, o.path) {
			return nil, fail(ExitUsage, fmt.Errorf("%s is already an output of this run; give each output its own file", displayPath(path)))
		}
	}
	e.outputs = append(e.outputs, o)
	if path == "" || path == "-" {
		return &stream{Writer: e.stdout, path: "standard output"}, nil
	}
	fi, err := os.Stat(path) // through any link, to what it names
	switch {
	case errors.Is(err, os.ErrNotExist):
		if li, lerr := os.Lstat(path); lerr == nil && li.Mode()&os.ModeSymlink != 0 {
			return nil, fail(ExitIO, fmt.Errorf("%s is a link to nothing", path))
		}
		return createAtomic(path, false, 0)
	case err != nil:
		return nil, fail(ExitIO, fmt.Errorf("cannot write %s: %w", path, err))
	}
	target := path
	if fi.Mode().IsRegular() {
		// replace the file a link names, not the link
		if target, err = filepath.EvalSymlinks(path); err != nil {
			return nil, fail(ExitIO, fmt.Errorf("cannot write %s: %w", path, err))
		}
	}
	m := fi.Mode()
	switch {
	case m.IsRegular():
		for _, in := range e.inputs {
			if ii, err := os.Stat(in); err == nil && os.SameFile(fi, ii) {
				return nil, fail(ExitIO, fmt.Errorf("%s is the input file %s that this run reads; write the results elsewhere", path, in))
			}
		}
		if !force {
			return nil, fail(ExitIO, fmt.Errorf("%s already exists; add --force to replace it", path))
		}
		return createAtomic(target, true, m.Perm())
	case m&os.ModeCharDevice != 0 || m&os.ModeNamedPipe != 0:
		flag := os.O_WRONLY
		if m&os.ModeNamedPipe != 0 {
			flag |= syscall.O_NONBLOCK // no reader: refuse at once rather than hang
		}
		f, err := os.OpenFile(target, flag, 0)
		if err != nil {
			return nil, fail(ExitIO, fmt.Errorf("cannot write %s: %w", path, err))
		}
		return &stream{Writer: f, path: path, f: f}, nil
	}
	return nil, fail(ExitIO, fmt.Errorf("%s is a %s, not a file; results are written only to files, character devices, FIFOs or standard output", path, kindOf(m)))
}

// opened is an output opened by a run: a file's path, or the stream
// standard output stood for.
type opened struct {
	path string
	w    io.Writer // nil for a file
}

// sameOutput reports whether two output paths name one file: both
// standard output ("" or "-"); one file (os.SameFile, through links); or,
// for a file not yet there, the same path once cleaned, made absolute and
// its folder's links followed.
func sameOutput(a, b string) bool {
	stdout := func(p string) bool { return p == "" || p == "-" }
	if stdout(a) || stdout(b) {
		return stdout(a) && stdout(b)
	}
	if fa, err := os.Stat(a); err == nil {
		if fb, err := os.Stat(b); err == nil {
			return os.SameFile(fa, fb)
		}
	}
	return canonicalPath(a) == canonicalPath(b)
}

// canonicalPath is path made absolute and clean, with its folder's links
// followed (the name itself may not exist yet).
func canonicalPath(path string) string {
	abs, err := filepath.Abs(path)
	if err != nil {
		return filepath.Clean(path)
	}
	if dir, err := filepath.EvalSymlinks(filepath.Dir(abs)); err == nil {
		abs = filepath.Join(dir, filepath.Base(abs))
	}
	return abs
}

func kindOf(m os.FileMode) string {
	switch {
	case m.IsDir():
		return "directory"
	case m&os.ModeSocket != 0:
		return "socket"
	case m&os.ModeNamedPipe != 0:
		return "FIFO"
	case m&os.ModeCharDevice != 0:
		return "character device"
	case m&os.ModeDevice != 0:
		return "block device"
	}
	return "special file"
}

// write sends data to --output path through openOutput.
func (e *env) write(path string, data []byte) error {
	s, err := e.openOutput(path, e.opt.force)
	if err != nil {
		return err
	}
	defer s.Abort()
	if _, err := s.Write(data); err != nil {
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", displayPath(path), err))
	}
	return s.Commit()
}

func displayPath(path string) string {
	if path == "" || path == "-" {
		return "standard output"
	}
	return path
}

// atomicFile is a temporary file beside its target that becomes the target
// only on Commit, so that a failed run leaves no half-written file.
type atomicFile struct {
	*os.File
	path    string
	replace bool
	done    bool
}

// tempPrefix starts the name of every temporary file: ".finmarch-PID-"
// and a random part, short whatever the target's name.
const tempPrefix = ".finmarch-"

// live holds the temporary files of this process, for the signal handler.
var live sync.Map

// createAtomic makes the temporary file for target: with the mode perm of
// the file it replaces, or (perm 0) 0666 less the umask for a new one.
func createAtomic(target string, replace bool, perm os.FileMode) (*atomicFile, error) {
	dir := filepath.Dir(target)
	cleanStale(dir)
	mode := perm
	if mode == 0 {
		mode = 0o666 // the kernel applies the umask
	}
	var f *os.File
	var err error
	for try := 0; try < 8; try++ {
		var b [6]byte
		_, _ = rand.Read(b[:])
		name := filepath.Join(dir, tempPrefix+strconv.Itoa(os.Getpid())+"-"+hex.EncodeToString(b[:])+".tmp")
		f, err = os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, mode)
		if !errors.Is(err, os.ErrExist) {
			break
		}
	}
	if err != nil {
		return nil, fail(ExitIO, fmt.Errorf("cannot write %s: %w", target, err))
	}
	if perm != 0 {
		_ = f.Chmod(perm) // the replaced file's mode, whatever the umask
	}
	live.Store(f.Name(), struct{}{})
	return &atomicFile{File: f, path: target, replace: replace}, nil
}

// Abort removes the temporary file unless Commit has run.
func (a *atomicFile) Abort() {
	if !a.done {
		a.Close()
		os.Remove(a.Name())
		live.Delete(a.Name())
		a.done = true
	}
}

// Commit syncs and closes the temporary file and puts it in place: by a
// rename when it replaces the target, by a link otherwise (a link fails
// if the target appeared meanwhile, unlike a rename); then syncs the
// directory, so that a power loss leaves the old file or the new one.
func (a *atomicFile) Commit() error {
	name := a.Name()
	a.done = true
	defer live.Delete(name)
	err := a.Sync()
	if cerr := a.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		os.Remove(name)
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", a.path, err))
	}
	if a.replace {
		err = os.Rename(name, a.path)
	} else {
		err = os.Link(name, a.path)
		os.Remove(name)
	}
	switch {
	case os.IsExist(err):
		return fail(ExitIO, fmt.Errorf("%s already exists; add --force to replace it", a.path))
	case err != nil:
		os.Remove(name)
		return fail(ExitIO, fmt.Errorf("cannot write %s: %w", a.path, err))
	}
	if d, err := os.Open(filepath.Dir(a.path)); err == nil {
		_ = d.Sync()
		d.Close()
	}
	return nil
}

// RemoveTemporary removes this process's temporary files: the signal
// handler's work before the process ends on SIGINT or SIGTERM.
func RemoveTemporary() {
	live.Range(func(k, _ any) bool {
		os.Remove(k.(string))
		return true
	})
}

// cleanStale removes temporary files in dir left by finmarch runs that
// have ended (killed by a signal nothing could catch): those whose
// process no longer exists and that are older than a minute.
func cleanStale(dir string) {
	names, _ := filepath.Glob(filepath.Join(dir, tempPrefix+"*.tmp"))
	for _, n := range names {
		parts := strings.SplitN(strings.TrimPrefix(filepath.Base(n), tempPrefix), "-", 2)
		pid, err := strconv.Atoi(parts[0])
		if err != nil || len(parts) != 2 || pid == os.Getpid() {
			continue
		}
		if fi, err := os.Lstat(n); err != nil || !fi.Mode().IsRegular() || time.Since(fi.ModTime()) < time.Minute {
			continue
		}
		if err := syscall.Kill(pid, 0); errors.Is(err, syscall.ESRCH) {
			os.Remove(n)
		}
	}
}

// readDesign reads a design file: a regular file only (a FIFO or a device
// would hang or never end), and at most the design-file limit plus one
// byte, so that a huge file is refused without being read whole.
func readDesign(path string) ([]byte, error) { return readInput(path, "design") }

// readInput reads an input file (what names it in errors) by the rules of
// readDesign.
func readInput(path, what string) ([]byte, error) {
	// non-blocking, so that opening a FIFO does not wait for a writer
	f, err := os.OpenFile(path, os.O_RDONLY|syscall.O_NONBLOCK, 0)
	if err != nil {
		return nil, fail(ExitIO, fmt.Errorf("cannot read the %s: %w", what, err))
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, fail(ExitIO, fmt.Errorf("cannot read the %s: %w", what, err))
	}
	if !fi.Mode().IsRegular() {
		return nil, fail(ExitIO, fmt.Errorf("cannot read the %s %s: a %s, not a regular file", what, path, kindOf(fi.Mode())))
	}
	if fi.Size() > design.MaxFileSize {
		return nil, fail(ExitDesign, design.TooLarge(path, fi.Size()))
	}
	src, err := io.ReadAll(io.LimitReader(f, design.MaxFileSize+1))
	if err != nil {
		return nil, fail(ExitIO, fmt.Errorf("cannot read the %s: %w", what, err))
	}
	return src, nil
}
