// Command assay runs Markdown notebooks of geometry cells, checks every
// claim exactly, and writes reports stating each claim's residual and verdict.
package main

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"time"

	"assay/cells"
	"assay/cmd/assay/early"
	"assay/kernel"
	"assay/kernel/claim"
	"assay/kernel/proto"
	"assay/kernel/session"
	"assay/kernel/spawn"
)

const usage = `assay checks geometric formulas in Markdown notebooks, exactly.

Usage:
  assay run [flags] NOTEBOOK        run a notebook, write NOTEBOOK.report.md and .html
  assay check [flags] NOTEBOOK...   run notebooks, print one line per claim
  assay run --shard i/n NOTEBOOK    run shard i of n, write a part file to merge
  assay merge [flags] PART...       join the parts of a sharded run into its report
  assay run --until ID NOTEBOOK     run the cells up to the one with id=ID
  assay watch [flags] NOTEBOOK      serve the live report on loopback, re-run on save
  assay repl [flags] [NOTEBOOK]     type cells at a prompt, after NOTEBOOK's if given
  assay kernel                      serve the JSON-lines kernel protocol (fds 3/4, else stdin/stdout)
  assay version                     print the version

Examples:
  assay run notebooks/mesh-orientation.md
  assay check --json notebooks/*.md
  assay run --shard 2/8 notebooks/mesh-quality-bounds.md
  assay merge -o bounds.report.md notebooks/mesh-quality-bounds.part-*-of-8.json
  assay watch notebooks/mesh-orientation.md

Exit status: 0 every claim holds; 1 a claim fails or is undecided;
2 the notebook could not be run (parse error, cell error, limit crossed).
Run 'assay run --help', 'assay check --help', 'assay merge --help',
'assay watch --help' or 'assay repl --help' for the flags.
`

func main() {
	spawn.Mark("main")
	code := mainCode(os.Args[1:], os.Stdout, os.Stderr)
	spawn.Mark("exit")
	os.Exit(code)
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
	case "merge":
		return mergeCommand(args[1:], stdout, stderr)
	case "kernel":
		return kernelCommand(args[1:], stderr)
	case "watch":
		return watchCommand(args[1:], stdout, stderr)
	case "repl":
		return replCommand(args[1:], stdout, stderr)
	case "version", "--version":
		fmt.Fprintf(stdout, "assay %s\n", proto.Version)
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
	limits
	strictOn       bool
	seedValue      int64
	precisionValue int
	maxTerms       int
	maxPrecision   int
	maxDegree      int
}

// limits are the flags of every command that runs kernels.
type limits struct {
	timeout   time.Duration
	maxMemory byteSize
	maxOutput byteSize
	keep      bool
	workers   int
}

func addLimitFlags(fs *flag.FlagSet, l *limits) {
	l.maxMemory = kernel.DefaultMaxMemory
	fs.DurationVar(&l.timeout, "timeout", kernel.DefaultTimeout, "time limit per cell (a cell's timeout= option wins)")
	fs.Var(&l.maxMemory, "max-memory", "memory cap of each kernel process, e.g. 512MiB or 4GiB")
	l.maxOutput = kernel.DefaultMaxOutput
	fs.Var(&l.maxOutput, "max-output", "most output one cell may send back (printed text, tables, figures, claims), e.g. 16MiB")
	fs.IntVar(&l.workers, "workers", runtime.NumCPU(), "kernel processes that share a large sampled claim")
	fs.BoolVar(&l.keep, "keep-going", false, "run the remaining cells after a cell fails")
}

// options checks the limits and makes the kernel options they give.
func (l *limits) options(s session.Settings, stderr io.Writer) (kernel.Options, error) {
	if l.timeout <= 0 {
		return kernel.Options{}, fmt.Errorf("--timeout must be positive, got %s", l.timeout)
	}
	if l.workers < 1 || l.workers > 256 {
		return kernel.Options{}, fmt.Errorf("--workers must be between 1 and 256, got %d", l.workers)
	}
	exe, err := os.Executable()
	if err != nil {
		return kernel.Options{}, fmt.Errorf("cannot find the assay executable to start a kernel: %w", err)
	}
	opt := kernel.Options{Settings: s, Timeout: l.timeout, MaxMemory: int64(l.maxMemory), MaxOutput: int64(l.maxOutput), KeepGoing: l.keep,
		Command: early.Command(exe), Workers: l.workers}
	if isTerminal(stderr) {
		opt.Progress = stderr
	}
	return opt, nil
}

// isTerminal says whether w is a terminal, where progress lines belong.
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

func addRunFlags(fs *flag.FlagSet) *runFlags {
	f := &runFlags{}
	fs.Int64Var(&f.seedValue, "seed", session.DefaultSettings.Seed, "random seed for the run (overrides setup(seed=…))")
	fs.IntVar(&f.precisionValue, "precision", session.DefaultSettings.Precision, "working precision in bits (overrides setup(precision=…))")
	fs.IntVar(&f.maxTerms, "max-terms", kernel.DefaultMaxTerms, "largest number of terms a polynomial may have")
	fs.IntVar(&f.maxPrecision, "max-precision", session.DefaultMaxPrecision, "largest precision in bits a certified real may be refined to")
	fs.IntVar(&f.maxDegree, "max-degree", kernel.DefaultMaxDegree, "largest degree of a polynomial a minimal polynomial is computed through")
	addLimitFlags(fs, &f.limits)
	addStrictFlag(fs, &f.strictOn)
	return f
}

func addStrictFlag(fs *flag.FlagSet, strict *bool) {
	fs.BoolVar(strict, "strict", false, "exit 1 unless every claim holds exactly (holds-to-digits and estimated count as not proved)")
}

// reportFlags say where the reports of run and merge go.
type reportFlags struct {
	out          string
	html, noHTML bool
}

func addReportFlags(fs *flag.FlagSet, outHelp string) *reportFlags {
	r := &reportFlags{}
	fs.StringVar(&r.out, "o", "", outHelp)
	fs.BoolVar(&r.html, "html", true, "also write the HTML report beside the Markdown one")
	fs.BoolVar(&r.noHTML, "no-html", false, "do not write the HTML report")
	return r
}

// writesHTML says whether the HTML report is wanted.
func (r *reportFlags) writesHTML() bool { return r.html && !r.noHTML }

func (f *runFlags) options(fs *flag.FlagSet, stderr io.Writer) (kernel.Options, error) {
	s := session.DefaultSettings
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
	if f.maxDegree < 1 {
		return kernel.Options{}, fmt.Errorf("--max-degree must be positive, got %d", f.maxDegree)
	}
	s.MaxDegree = f.maxDegree
	if s.Precision < 2 {
		return kernel.Options{}, fmt.Errorf("--precision must be at least 2 bits, got %d", s.Precision)
	}
	if s.Precision > s.MaxPrecision {
		return kernel.Options{}, fmt.Errorf("--precision %d is above --max-precision %d", s.Precision, s.MaxPrecision)
	}
	return f.limits.options(s, stderr)
}

// helpOrUsageError is the exit status after a flag parse stopped: 0 when
// help was asked for, 2 for a bad flag (the flag package printed why).
func helpOrUsageError(err error) int {
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	return 2
}

// parseNames parses a command's flags and file names. When it cannot go
// on (help, a bad flag, a wrong number of names) ok is false and code is
// the exit status.
func parseNames(fs *flag.FlagSet, args []string, stderr io.Writer, wrongCount string, countOK func(int) bool) (names []string, code int, ok bool) {
	names, err := parseInterspersed(fs, args)
	if err != nil {
		return nil, helpOrUsageError(err), false
	}
	if !countOK(len(names)) {
		fmt.Fprintln(stderr, wrongCount)
		fs.Usage()
		return nil, 2, false
	}
	return names, 0, true
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
	report := addReportFlags(fs, "path of the Markdown report, or of the part file with --shard (default: beside the notebook)")
	inPlace := fs.Bool("in-place", false, "write outputs into the notebook itself as output blocks")
	shard := fs.String("shard", "", "run shard i of n (e.g. 2/8) and write a part file for assay merge")
	until := fs.String("until", "", "run the cells up to and including the one with the option id=`ID`; later cells are not run")
	rf := addRunFlags(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay run [flags] NOTEBOOK

Runs every cell of NOTEBOOK and writes NOTEBOOK.report.md and NOTEBOOK.report.html.
With --shard i/n it computes only shard i of every sampled claim and writes
NOTEBOOK.part-i-of-n.json; assay merge joins the n parts into the report.

Examples:
  assay run -o /tmp/mesh.md --seed 7 notebooks/mesh-orientation.md
  assay run --shard 2/8 notebooks/mesh-quality-bounds.md

Flags:
`)
		fs.PrintDefaults()
	}
	names, code, ok := parseNames(fs, args, stderr, "assay run: give exactly one notebook", func(n int) bool { return n == 1 })
	if !ok {
		return code
	}
	opt, err := rf.options(fs, stderr)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	path := names[0]
	if *until != "" {
		if *shard != "" || *inPlace {
			fmt.Fprintln(stderr, "assay run: --until runs a part of the notebook: it goes with neither --shard nor --in-place")
			return 2
		}
		if opt.Until, err = untilIndex(path, *until); err != nil {
			fmt.Fprintln(stderr, "assay run:", err)
			return 2
		}
	}
	if *shard != "" {
		if *inPlace {
			fmt.Fprintln(stderr, "assay run: --shard writes a part file, not the notebook; drop --in-place")
			return 2
		}
		if opt.Shard, err = parseShard(*shard); err != nil {
			fmt.Fprintln(stderr, "assay run:", err)
			return 2
		}
		return runShard(path, report.out, opt, stdout, stderr)
	}
	if *inPlace {
		if report.out != "" {
			fmt.Fprintln(stderr, "assay run: --in-place writes the notebook itself; drop -o")
			return 2
		}
		return runInPlace(path, opt, rf.strictOn, stdout, stderr)
	}
	rep, err := load(path, opt)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	mdPath := report.out
	if mdPath == "" {
		mdPath = strings.TrimSuffix(path, filepath.Ext(path)) + ".report.md"
	}
	return writeReport("assay run", rep, mdPath, report.writesHTML(), rf.strictOn, []output{{role: "notebook", path: path}}, stdout, stderr)
}

// runInPlace runs a notebook and writes its outputs into it, with its
// figures beside it, as one set. It refuses, before running anything, a
// notebook whose generated regions hold text assay did not write: the
// rewrite would delete it.
func runInPlace(path string, opt kernel.Options, strict bool, stdout, stderr io.Writer) int {
	src, err := readNotebook(path)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	if nb, _ := cells.Parse(path, src); len(nb.Foreign) > 0 {
		spans := make([]string, len(nb.Foreign))
		for i, sp := range nb.Foreign {
			spans[i] = sp.String()
		}
		fmt.Fprintf(stderr, "assay run: %s, %s: a generated region holds text assay did not write, which --in-place would delete; the notebook is left unchanged: move that text out of the region (or delete the region if nothing in it is yours) and run again\n",
			path, strings.Join(spans, ", "))
		return 2
	}
	rep, err := load(path, opt)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	if len(rep.Problems) > 0 {
		summarize(stdout, stderr, rep)
		fmt.Fprintf(stdout, "%s left unchanged: it could not be parsed\n", path)
		return 2
	}
	// The figures go beside the file that holds the notebook's text, which
	// links to them by name, even when path is a symbolic link to it.
	target, err := cells.Target(path)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	rep.FigureBase = strings.TrimSuffix(target, filepath.Ext(target))
	stampRun(rep)
	outs := []output{{"notebook", path, cells.RenderMarkdown(rep, false)}}
	for _, f := range cells.FigureFiles(rep) {
		outs = append(outs, output{"figure file", f.Path, f.SVG})
	}
	if err := checkOutputs(outs, nil, "rename the notebook"); err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	slices.Reverse(outs) // the notebook last, once its figures are in place
	if err := writeOutputs(outs); err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	summarize(stdout, stderr, rep)
	fmt.Fprintf(stdout, "outputs written into %s\n", path)
	return cells.ExitCode(rep, strict)
}

// stampRun gives the report its run identifier, which the Markdown and the
// HTML report both state (cells.RunID reads it back), so that a reader can
// tell a pair written by one run from a stale pair. It is the first 16 hex
// digits of the SHA-256 of what the run found: the Markdown report with its
// times masked, and the figures. A rerun that finds the same gets the same
// identifier, so reports stay reproducible apart from times; a run that
// finds anything else (another verdict, residual, output or notebook) gets
// another one.
func stampRun(rep *cells.Report) {
	r := *rep
	r.Run, r.FigureBase = "", "" // the same findings, wherever they are written
	h := sha256.New()
	io.WriteString(h, cells.MaskTimes(string(cells.RenderMarkdown(&r, true))))
	for _, o := range rep.Outcomes {
		for _, f := range o.Figures {
			fmt.Fprintf(h, "\x00%q\x00%d\x00", f.Name, len(f.SVG))
			io.WriteString(h, f.SVG)
		}
	}
	rep.Run = hex.EncodeToString(h.Sum(nil))[:16]
}

// writeReport writes a report at mdPath: the Markdown, its figures beside
// it and the HTML unless told not to, as one set that carries one run
// identifier, and never over an input of the run (the notebook, part
// files) or one of its own files over another. It prints the claims and
// returns the exit status.
func writeReport(cmd string, rep *cells.Report, mdPath string, html, strict bool, inputs []output, stdout, stderr io.Writer) int {
	rep.FigureBase = strings.TrimSuffix(mdPath, filepath.Ext(mdPath))
	stampRun(rep)
	// Checked in this order so that the plainest clash is the one named.
	outs := []output{{"Markdown report", mdPath, cells.RenderMarkdown(rep, true)}}
	if html {
		htmlPath := strings.TrimSuffix(mdPath, filepath.Ext(mdPath)) + ".html"
		outs = append(outs, output{"HTML report", htmlPath, cells.RenderHTML(rep)})
	}
	for _, f := range cells.FigureFiles(rep) {
		outs = append(outs, output{"figure file", f.Path, f.SVG})
	}
	hint := "choose another -o"
	if ext := strings.ToLower(filepath.Ext(mdPath)); ext == ".html" || ext == ".htm" {
		hint = "-o names the Markdown report: give it a path ending in .md"
	}
	if err := checkOutputs(outs, inputs, hint); err != nil {
		fmt.Fprintf(stderr, "%s: %v\n", cmd, err)
		return 2
	}
	// Figures first and the Markdown last: a report that is in place has
	// its figures and its HTML twin in place too.
	slices.Reverse(outs)
	if err := writeOutputs(outs); err != nil {
		fmt.Fprintf(stderr, "%s: %v\n", cmd, err)
		return 2
	}
	var written []string
	for i := len(outs) - 1; i >= 0; i-- {
		if outs[i].role != "figure file" {
			written = append(written, outs[i].path)
		}
	}
	summarize(stdout, stderr, rep)
	fmt.Fprintf(stdout, "report: %s\n", strings.Join(written, ", "))
	return cells.ExitCode(rep, strict)
}

// output is a file a command writes (with its contents), or an input it
// must not write over (without), and its role, which messages name.
type output struct {
	role, path string
	data       []byte
}

// checkOutputs refuses a set of outputs when one would land on an input of
// the run or on another output: the same path once cleaned and made
// absolute, or the same file through a symbolic link, a hard link or
// another spelling. hint says what the user can change.
func checkOutputs(outs, inputs []output, hint string) error {
	for i, o := range outs {
		for _, in := range inputs {
			if !samePath(o.path, in.path) {
				continue
			}
			if in.role == "notebook" && o.role == "Markdown report" {
				return fmt.Errorf("the report path %s is the notebook itself; use --in-place to write outputs into the notebook", o.path)
			}
			return fmt.Errorf("%s; nothing was written: %s", clash(o, in), hint)
		}
		for _, prev := range outs[:i] {
			if samePath(o.path, prev.path) {
				return fmt.Errorf("%s; nothing was written: %s", clash(o, prev), hint)
			}
		}
	}
	return nil
}

// clash says that o would overwrite other, naming both paths when they
// are spelt differently.
func clash(o, other output) string {
	if filepath.Clean(o.path) == filepath.Clean(other.path) {
		return fmt.Sprintf("the %s %s would overwrite the %s", o.role, o.path, other.role)
	}
	return fmt.Sprintf("the %s %s is the same file as the %s %s", o.role, o.path, other.role, other.path)
}

// writeOutputs writes the outputs as one set (cells.WriteFilesAtomic): all
// of them, or, on a failure, none, the old files left as they were.
func writeOutputs(outs []output) error {
	files := make([]cells.File, len(outs))
	for i, o := range outs {
		files[i] = cells.File{Path: o.path, Data: o.data}
	}
	return cells.WriteFilesAtomic(files)
}

// parseShard reads a shard spec i/n, 1 <= i <= n.
func parseShard(spec string) (claim.Share, error) {
	is, ns, ok := strings.Cut(spec, "/")
	i, err1 := strconv.Atoi(strings.TrimSpace(is))
	n, err2 := strconv.Atoi(strings.TrimSpace(ns))
	switch {
	case !ok || err1 != nil || err2 != nil:
		return claim.Share{}, fmt.Errorf("--shard wants i/n, shard i of n, such as 2/8; got %q", spec)
	case n < 1 || n > 1_000_000:
		return claim.Share{}, fmt.Errorf("--shard %s: n must be between 1 and 1000000", spec)
	case i < 1 || i > n:
		return claim.Share{}, fmt.Errorf("--shard %s: i must be between 1 and n = %d (shards are numbered from 1)", spec, n)
	}
	return claim.Share{Index: int64(i - 1), Count: int64(n)}, nil
}

// runShard runs one shard and writes its part file.
func runShard(path, partPath string, opt kernel.Options, stdout, stderr io.Writer) int {
	src, err := readNotebook(path)
	if err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	nb, err := cells.Parse(path, src)
	if err != nil {
		fmt.Fprintf(stderr, "assay run: %s: %v (no part written: fix the notebook and run the shard again)\n", path, err)
		return 2
	}
	_, part := kernel.RunShard(nb, opt)
	if partPath == "" {
		partPath = fmt.Sprintf("%s.part-%d-of-%d.json", strings.TrimSuffix(path, filepath.Ext(path)), part.Shard, part.Shards)
	}
	if err := checkOutputs([]output{{role: "part file", path: partPath}}, []output{{role: "notebook", path: path}}, "choose another -o"); err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	if err := cells.WriteFileAtomic(partPath, part.Encode()); err != nil {
		fmt.Fprintln(stderr, "assay run:", err)
		return 2
	}
	var samples int64
	for _, c := range part.Claims {
		samples += c.Tally.Computed
	}
	for _, e := range part.Errors {
		fmt.Fprintf(stdout, "error  line %d: %s\n", e.Line, e.Message)
	}
	fmt.Fprintf(stdout, "shard %d/%d: %d sampled claims, %d samples computed; part written to %s\n", part.Shard, part.Shards, len(part.Claims), samples, partPath)
	if len(part.Errors) > 0 {
		return 2
	}
	return 0
}

func mergeCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("merge", flag.ContinueOnError)
	fs.SetOutput(stderr)
	report := addReportFlags(fs, "path of the Markdown report (default: beside the part files, X.report.md for parts X.part-i-of-n.json)")
	var strict bool
	addStrictFlag(fs, &strict)
	var lim limits
	addLimitFlags(fs, &lim)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay merge [flags] PART...

Joins the part files of a sharded run (assay run --shard i/n, for i = 1..n)
into the report a single run gives. The notebook, seed and precision come
from the parts; merge replays the notebook, taking each sampled claim from
the parts instead of sweeping it again. The report goes beside the part
files (X.report.md for X.part-i-of-n.json), or to -o.

Example:
  assay merge -o bounds.report.md notebooks/mesh-quality-bounds.part-*-of-8.json

Flags:
`)
		fs.PrintDefaults()
	}
	names, code, ok := parseNames(fs, args, stderr, "assay merge: give the part files of a sharded run", func(n int) bool { return n > 0 })
	if !ok {
		return code
	}
	var parts []*kernel.Part
	for _, name := range names {
		data, err := os.ReadFile(name)
		if err != nil {
			fmt.Fprintf(stderr, "assay merge: cannot read part %s: %v\n", name, unwrapPath(err))
			return 2
		}
		p, err := kernel.ParsePart(name, data)
		if err != nil {
			fmt.Fprintln(stderr, "assay merge:", err)
			return 2
		}
		parts = append(parts, p)
	}
	opt, err := lim.options(session.Settings{}, stderr)
	if err != nil {
		fmt.Fprintln(stderr, "assay merge:", err)
		return 2
	}
	rep, err := kernel.Merge(parts, names, opt)
	if err != nil {
		fmt.Fprintln(stderr, "assay merge:", err)
		return 2
	}
	mdPath := report.out
	if mdPath == "" {
		if mdPath, err = mergeReportPath(names); err != nil {
			fmt.Fprintln(stderr, "assay merge:", err)
			return 2
		}
	}
	// The notebook a part names is guarded too: a report never replaces it.
	var inputs []output
	if rep.Notebook.Path != "" {
		inputs = append(inputs, output{role: "notebook", path: rep.Notebook.Path})
	}
	for _, name := range names {
		inputs = append(inputs, output{role: "part file", path: name})
	}
	return writeReport("assay merge", rep, mdPath, report.writesHTML(), strict, inputs, stdout, stderr)
}

// partSuffix ends the name of a part file as assay run --shard makes it
// (compiled when used: every start of the binary would pay for it).
const partSuffix = `\.part-[0-9]+-of-[0-9]+\.json$`

// mergeReportPath is where merge writes without -o: beside the part files,
// named after them (x.part-1-of-8.json gives x.report.md). A path read from
// inside a part, which anyone may have edited, never decides it.
func mergeReportPath(parts []string) (string, error) {
	dir := filepath.Dir(parts[0])
	for _, p := range parts[1:] {
		if d := filepath.Dir(p); !samePath(d, dir) {
			return "", fmt.Errorf("the part files are in different folders (%s and %s); say where the report goes with -o", dir, d)
		}
	}
	base := filepath.Base(parts[0])
	stem := regexp.MustCompile(partSuffix).ReplaceAllString(base, "")
	if stem == base {
		stem = strings.TrimSuffix(base, filepath.Ext(base))
	}
	return filepath.Join(dir, stem+".report.md"), nil
}

// untilIndex is the index of the cell with the option id=id. An id no
// cell has is a mistake on the command line, not in the notebook: it is
// refused before anything runs, and no report is written, so the last one
// stays as it was.
func untilIndex(path, id string) (int, error) {
	src, err := readNotebook(path)
	if err != nil {
		return 0, err
	}
	nb, err := cells.Parse(path, src)
	if err != nil {
		return 0, nil // the run reports the parse error, with its line
	}
	var ids []string
	for _, b := range nb.Cells() {
		if b.Options.ID == id {
			return b.Index, nil
		}
		if b.Options.ID != "" {
			ids = append(ids, fmt.Sprintf("%s (line %d)", b.Options.ID, b.FenceLine))
		}
	}
	const nothing = "; nothing was run and no report was written"
	if len(ids) == 0 {
		return 0, fmt.Errorf("--until %s: no cell of %s has an id; give the cell the option id=%s (e.g. a fence line ```cell id=%s)%s", id, path, id, id, nothing)
	}
	return 0, fmt.Errorf("--until %s: no cell of %s has id=%s; the ids are %s%s", id, path, id, strings.Join(ids, ", "), nothing)
}

// readNotebook reads a notebook file, with a message that names it.
func readNotebook(path string) ([]byte, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read notebook %s: %v", path, unwrapPath(err))
	}
	return src, nil
}

// unwrapPath drops the path an *os.PathError repeats.
func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
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
	names, code, ok := parseNames(fs, args, stderr, "assay check: give at least one notebook", func(n int) bool { return n > 0 })
	if !ok {
		return code
	}
	opt, err := rf.options(fs, stderr)
	if err != nil {
		fmt.Fprintln(stderr, "assay check:", err)
		return 2
	}
	worst := 0
	for _, path := range names {
		rep, err := load(path, opt)
		spawn.Mark("run done")
		code := 2
		if err != nil {
			fmt.Fprintln(stderr, "assay check:", err)
		} else {
			code = cells.ExitCode(rep, rf.strictOn)
			if *asJSON {
				cells.RenderWarnings(stderr, rep)
				stdout.Write(cells.RenderJSON(rep, code))
			} else {
				summarize(stdout, stderr, rep)
			}
		}
		worst = max(worst, code)
	}
	return worst
}

// summarize writes a run's warnings to stderr and its claims, errors and
// counts to stdout.
func summarize(stdout, stderr io.Writer, rep *cells.Report) {
	cells.RenderWarnings(stderr, rep)
	cells.RenderCheck(stdout, rep)
}

// parseProblem is a parse error as a problem with its line (0 when the
// error has none).
func parseProblem(err error) cells.Problem {
	var ce *cells.Error
	if errors.As(err, &ce) {
		return cells.Problem{Line: ce.Line, Message: ce.Msg}
	}
	return cells.Problem{Message: err.Error()}
}

// load reads and parses a notebook and runs it. A parse error still gives
// a report (with the problem and no cells run); only an unreadable file is
// an error.
func load(path string, opt kernel.Options) (*cells.Report, error) {
	src, err := readNotebook(path)
	if err != nil {
		return nil, err
	}
	nb, err := cells.Parse(path, src)
	if err != nil {
		rep := kernel.Run(&cells.Notebook{Path: nb.Path, Source: nb.Source, Title: nb.Title}, opt)
		rep.Notebook = nb
		rep.Problems = append(rep.Problems, parseProblem(err))
		for i := range rep.Outcomes {
			rep.Outcomes[i].Status = cells.NotRun
		}
		return rep, nil
	}
	return kernel.Run(nb, opt), nil
}

// samePath says whether a and b are one file: the same path once cleaned,
// made absolute and its symbolic links followed (as far as they lead to
// something that exists), or, for files that exist, the same file by
// os.SameFile (hard links, case-insensitive file systems).
func samePath(a, b string) bool {
	if resolvedPath(a) == resolvedPath(b) {
		return true
	}
	sa, err1 := os.Stat(a)
	sb, err2 := os.Stat(b)
	return err1 == nil && err2 == nil && os.SameFile(sa, sb)
}

// resolvedPath is the absolute path a write to p lands on, with the
// symbolic links of its folders and of the file itself followed.
func resolvedPath(p string) string {
	if t, err := cells.Target(p); err == nil {
		p = t
	}
	abs, err := filepath.Abs(p)
	if err != nil {
		return filepath.Clean(p)
	}
	if r, err := filepath.EvalSymlinks(abs); err == nil {
		return r
	}
	if d, err := filepath.EvalSymlinks(filepath.Dir(abs)); err == nil {
		return filepath.Join(d, filepath.Base(abs))
	}
	return abs
}

func kernelCommand(args []string, stderr io.Writer) int {
	fs := flag.NewFlagSet("kernel", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay kernel

Serves the kernel protocol: one JSON request per line
({"op":"start","nonce":"...","settings":{...}} then
{"op":"run","cell":{...}}), one JSON reply per line, each echoing the
nonce and the cell's index. 'assay run' drives it as a child process and
passes the protocol on file descriptors 3 (requests) and 4 (replies),
with ASSAY_KERNEL_CHANNEL=3,4 in its environment; the kernel then ends
when fd 3 does. Without that variable it serves on stdin and stdout.
Either way, what the interpreter itself writes to standard output is
dropped: it never reaches the replies.
`)
	}
	if err := fs.Parse(args); err != nil {
		return helpOrUsageError(err)
	}
	if err := proto.ServeChild(os.Stdin, os.Stdout); err != nil {
		fmt.Fprintln(stderr, "assay kernel:", err)
		return 2
	}
	return 0
}

// byteSize is a flag value like 2GiB, 512MiB, 100MB or a plain byte count.
type byteSize int64

func (b *byteSize) String() string { return proto.FormatBytes(int64(*b)) }

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
