// Command assay runs Markdown notebooks of geometry cells, checks every
// claim exactly, and writes reports stating each claim's residual and verdict.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime/debug"
	"strconv"
	"strings"
	"time"

	"assay/cells"
	"assay/kernel"
)

const usage = `assay checks geometric formulas in Markdown notebooks, exactly.

Usage:
  assay run [flags] NOTEBOOK        run a notebook, write NOTEBOOK.report.md and .html
  assay check [flags] NOTEBOOK...   run notebooks, print one line per claim
  assay kernel                      serve the JSON-lines kernel protocol on stdin/stdout
  assay version                     print the version

Examples:
  assay run notebooks/mesh-orientation.md
  assay check --json notebooks/*.md

Exit status: 0 every claim holds; 1 a claim fails or is undecided;
2 the notebook could not be run (parse error, cell error, limit crossed).
Run 'assay run --help' or 'assay check --help' for the flags.
`

func main() {
	os.Exit(mainCode(os.Args[1:], os.Stdout, os.Stderr))
}

func mainCode(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, usage)
		return 2
	}
	switch args[0] {
	case "run":
		return runCommand(args[1:], stdout, stderr)
	case "check":
		return checkCommand(args[1:], stdout, stderr)
	case "kernel":
		return kernelCommand(args[1:], stderr)
	case "version", "--version":
		fmt.Fprintf(stdout, "assay %s\n", kernel.Version)
		return 0
	case "help", "-h", "--help", "-help":
		fmt.Fprint(stdout, usage)
		return 0
	}
	fmt.Fprintf(stderr, "assay: unknown command %q\n\n%s", args[0], usage)
	return 2
}

// runFlags are the flags shared by run and check.
type runFlags struct {
	timeout        time.Duration
	maxMemory      byteSize
	keep           bool
	strictOn       bool
	seedValue      int64
	precisionValue int
	maxTerms       int
	maxPrecision   int
}

func addRunFlags(fs *flag.FlagSet) *runFlags {
	f := &runFlags{maxMemory: kernel.DefaultMaxMemory}
	fs.Int64Var(&f.seedValue, "seed", kernel.DefaultSettings.Seed, "random seed for the run (overrides setup(seed=…))")
	fs.IntVar(&f.precisionValue, "precision", kernel.DefaultSettings.Precision, "working precision in bits (overrides setup(precision=…))")
	fs.DurationVar(&f.timeout, "timeout", kernel.DefaultTimeout, "time limit per cell (a cell's timeout= option wins)")
	fs.Var(&f.maxMemory, "max-memory", "memory cap of the kernel process, e.g. 512MiB or 4GiB")
	fs.IntVar(&f.maxTerms, "max-terms", kernel.DefaultMaxTerms, "largest number of terms a polynomial may have")
	fs.IntVar(&f.maxPrecision, "max-precision", kernel.DefaultMaxPrecision, "largest precision in bits a certified real may be refined to")
	fs.BoolVar(&f.keep, "keep-going", false, "run the remaining cells after a cell fails")
	fs.BoolVar(&f.strictOn, "strict", false, "exit 1 unless every claim holds exactly (holds-to-digits counts as not proved)")
	return f
}

func (f *runFlags) options(fs *flag.FlagSet) (kernel.Options, error) {
	s := kernel.DefaultSettings
	fs.Visit(func(fl *flag.Flag) {
		switch fl.Name {
		case "seed":
			s.Seed, s.SeedFixed = f.seedValue, true
		case "precision":
			s.Precision, s.PrecisionFixed = f.precisionValue, true
		}
	})
	if f.maxTerms < 1 {
		return kernel.Options{}, fmt.Errorf("--max-terms must be positive, got %d", f.maxTerms)
	}
	s.MaxTerms = f.maxTerms
	s.MaxPrecision = f.maxPrecision
	if s.Precision < 2 {
		return kernel.Options{}, fmt.Errorf("--precision must be at least 2 bits, got %d", s.Precision)
	}
	if s.Precision > s.MaxPrecision {
		return kernel.Options{}, fmt.Errorf("--precision %d is above --max-precision %d", s.Precision, s.MaxPrecision)
	}
	if f.timeout <= 0 {
		return kernel.Options{}, fmt.Errorf("--timeout must be positive, got %s", f.timeout)
	}
	exe, err := os.Executable()
	if err != nil {
		return kernel.Options{}, fmt.Errorf("cannot find the assay executable to start a kernel: %w", err)
	}
	return kernel.Options{Settings: s, Timeout: f.timeout, MaxMemory: int64(f.maxMemory), KeepGoing: f.keep,
		Command: []string{exe, "kernel"}}, nil
}

// helpOrUsageError is the exit status after a flag parse stopped: 0 when
// help was asked for, 2 for a bad flag (the flag package printed why).
func helpOrUsageError(err error) int {
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	return 2
}

// parseInterspersed lets flags follow the notebook names, as users type them.
func parseInterspersed(fs *flag.FlagSet, args []string) ([]string, error) {
	var names []string
	for {
		if err := fs.Parse(args); err != nil {
			return nil, err
		}
		if fs.NArg() == 0 {
			return names, nil
		}
		names = append(names, fs.Arg(0))
		args = fs.Args()[1:]
	}
}

func runCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("run", flag.ContinueOnError)
	fs.SetOutput(stderr)
	out := fs.String("o", "", "path of the Markdown report (default: NOTEBOOK.report.md beside the notebook)")
	html := fs.Bool("html", true, "also write the HTML report beside the Markdown one")
	noHTML := fs.Bool("no-html", false, "do not write the HTML report")
	inPlace := fs.Bool("in-place", false, "write outputs into the notebook itself as output blocks")
	rf := addRunFlags(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay run [flags] NOTEBOOK

Runs every cell of NOTEBOOK and writes NOTEBOOK.report.md and NOTEBOOK.report.html.

Example:
  assay run -o /tmp/mesh.md --seed 7 notebooks/mesh-orientation.md

Flags:
`)
		fs.PrintDefaults()
	}
	names, err := parseInterspersed(fs, args)
	if err != nil {
		return helpOrUsageError(err)
	}
	if len(names) != 1 {
		fmt.Fprintln(stderr, "assay run: give exactly one notebook")
		fs.Usage()
		return 2
	}
	opt, err := rf.options(fs)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	path := names[0]
	rep, err := load(path, opt)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	if *inPlace {
		if *out != "" {
			fmt.Fprintln(stderr, "assay run: --in-place writes the notebook itself; drop -o")
			return 2
		}
		if len(rep.Problems) > 0 {
			cells.RenderCheck(stdout, rep)
			fmt.Fprintf(stdout, "%s left unchanged: it could not be parsed\n", path)
			return 2
		}
		rep.FigureBase = strings.TrimSuffix(path, filepath.Ext(path))
		if err := writeFigures(rep); err != nil {
			fmt.Fprintln(stderr, "assay run:", err)
			return 2
		}
		if err := cells.WriteFileAtomic(path, cells.RenderMarkdown(rep, false)); err != nil {
			fmt.Fprintln(stderr, "assay run:", err)
			return 2
		}
		cells.RenderCheck(stdout, rep)
		fmt.Fprintf(stdout, "outputs written into %s\n", path)
		return cells.ExitCode(rep, rf.strictOn)
	}
	mdPath := *out
	if mdPath == "" {
		mdPath = strings.TrimSuffix(path, filepath.Ext(path)) + ".report.md"
	}
	if samePath(mdPath, path) {
		fmt.Fprintf(stderr, "assay run: the report path %s is the notebook itself; use --in-place to write outputs into the notebook\n", mdPath)
		return 2
	}
	rep.FigureBase = strings.TrimSuffix(mdPath, filepath.Ext(mdPath))
	if err := writeFigures(rep); err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	if err := cells.WriteFileAtomic(mdPath, cells.RenderMarkdown(rep, true)); err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	written := []string{mdPath}
	if *html && !*noHTML {
		htmlPath := strings.TrimSuffix(mdPath, filepath.Ext(mdPath)) + ".html"
		if samePath(htmlPath, path) {
			fmt.Fprintf(stderr, "assay run: the HTML report path %s is the notebook itself\n", htmlPath)
			return 2
		}
		if err := cells.WriteFileAtomic(htmlPath, cells.RenderHTML(rep)); err != nil {
			fmt.Fprintln(stderr, "assay run:", err)
			return 2
		}
		written = append(written, htmlPath)
	}
	cells.RenderCheck(stdout, rep)
	fmt.Fprintf(stdout, "report: %s\n", strings.Join(written, ", "))
	return cells.ExitCode(rep, rf.strictOn)
}

func checkCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("check", flag.ContinueOnError)
	fs.SetOutput(stderr)
	asJSON := fs.Bool("json", false, "print one JSON document per notebook instead of lines")
	rf := addRunFlags(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay check [flags] NOTEBOOK...

Runs each notebook and prints one line per claim (verdict, name, residual)
and a summary; writes no files. Exit status is the worst over the notebooks.

Example:
  assay check --json notebooks/*.md

Flags:
`)
		fs.PrintDefaults()
	}
	names, err := parseInterspersed(fs, args)
	if err != nil {
		return helpOrUsageError(err)
	}
	if len(names) == 0 {
		fmt.Fprintln(stderr, "assay check: give at least one notebook")
		fs.Usage()
		return 2
	}
	opt, err := rf.options(fs)
	if err != nil {
		fmt.Fprintln(stderr, "assay check:", err)
		return 2
	}
	worst := 0
	for _, path := range names {
		rep, err := load(path, opt)
		code := 2
		if err != nil {
			fmt.Fprintln(stderr, "assay check:", err)
		} else {
			code = cells.ExitCode(rep, rf.strictOn)
			if *asJSON {
				stdout.Write(cells.RenderJSON(rep, code))
			} else {
				cells.RenderCheck(stdout, rep)
			}
		}
		worst = max(worst, code)
	}
	return worst
}

// load reads and parses a notebook and runs it. A parse error still gives
// a report (with the problem and no cells run); only an unreadable file is
// an error.
func load(path string, opt kernel.Options) (*cells.Report, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		var pe *os.PathError
		if errors.As(err, &pe) {
			return nil, fmt.Errorf("cannot read notebook %s: %v", path, pe.Err)
		}
		return nil, err
	}
	nb, err := cells.Parse(path, src)
	if err != nil {
		rep := kernel.Run(&cells.Notebook{Path: nb.Path, Source: nb.Source, Title: nb.Title}, opt)
		rep.Notebook = nb
		line := 0
		var ce *cells.Error
		if errors.As(err, &ce) {
			line = ce.Line
		}
		msg := err.Error()
		if ce != nil {
			msg = ce.Msg
		}
		rep.Problems = append(rep.Problems, cells.Problem{Line: line, Message: msg})
		for i := range rep.Outcomes {
			rep.Outcomes[i].Status = cells.NotRun
		}
		return rep, nil
	}
	return kernel.Run(nb, opt), nil
}

// writeFigures writes each figure of the report as an SVG file beside it.
func writeFigures(rep *cells.Report) error {
	for _, f := range cells.FigureFiles(rep) {
		if err := cells.WriteFileAtomic(f.Path, f.SVG); err != nil {
			return err
		}
	}
	return nil
}

func samePath(a, b string) bool {
	sa, err1 := os.Stat(a)
	sb, err2 := os.Stat(b)
	if err1 == nil && err2 == nil {
		return os.SameFile(sa, sb)
	}
	aa, _ := filepath.Abs(a)
	ab, _ := filepath.Abs(b)
	return aa == ab
}

func kernelCommand(args []string, stderr io.Writer) int {
	fs := flag.NewFlagSet("kernel", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay kernel

Serves the kernel protocol: one JSON request per line on stdin
({"op":"start","settings":{...}} then {"op":"run","cell":{...}}), one JSON
reply per line on stdout. 'assay run' drives it as a child process.
`)
	}
	if err := fs.Parse(args); err != nil {
		return helpOrUsageError(err)
	}
	if v, err := strconv.ParseInt(os.Getenv("ASSAY_MAX_MEMORY"), 10, 64); err == nil && v > 0 {
		debug.SetMemoryLimit(v) // soft: the parent enforces the hard cap
	}
	// A runaway recursion should end the cell in a second, not after
	// growing a gigabyte of stack.
	debug.SetMaxStack(64 << 20)
	if err := kernel.Serve(os.Stdin, os.Stdout); err != nil {
		fmt.Fprintln(stderr, "assay kernel:", err)
		return 2
	}
	return 0
}

// byteSize is a flag value like 2GiB, 512MiB, 100MB or a plain byte count.
type byteSize int64

func (b *byteSize) String() string { return kernel.FormatBytes(int64(*b)) }

func (b *byteSize) Set(s string) error {
	t := strings.TrimSpace(s)
	mult := int64(1)
	for _, u := range []struct {
		suffix string
		mult   int64
	}{{"KiB", 1 << 10}, {"MiB", 1 << 20}, {"GiB", 1 << 30}, {"TiB", 1 << 40}, {"KB", 1e3}, {"MB", 1e6}, {"GB", 1e9}, {"TB", 1e12}, {"K", 1 << 10}, {"M", 1 << 20}, {"G", 1 << 30}, {"B", 1}} {
		if strings.HasSuffix(t, u.suffix) {
			t, mult = strings.TrimSpace(strings.TrimSuffix(t, u.suffix)), u.mult
			break
		}
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || v <= 0 {
		return fmt.Errorf("want a size such as 512MiB or 4GiB, got %q", s)
	}
	*b = byteSize(v * float64(mult))
	return nil
}
