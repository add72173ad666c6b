package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"assay/cells"
	"assay/kernel"
	"assay/kernel/proto"
	"assay/kernel/repl"
)

func replCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("repl", flag.ContinueOnError)
	fs.SetOutput(stderr)
	rf := addRunFlags(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay repl [flags] [NOTEBOOK]

Runs the cells you type, one input at a time, in a kernel process with the
limits of assay run (--timeout is per input). The value of an input that
ends with an expression is shown as show() shows it; claims print their
verdict lines. With NOTEBOOK, its cells run first and their summary is
printed, and the inputs see its names. On a terminal: line editing,
history (kept in the user's cache folder), Ctrl-C drops the line being
typed or stops the input running, Ctrl-D ends the session. From a pipe:
no prompts, each input run as it is read.

Example:
  echo 'det(matrix([[1, 2], [3, 4]]))' | assay repl

Flags:
`)
		fs.PrintDefaults()
	}
	names, code, ok := parseNames(fs, args, stderr, "assay repl: give at most one notebook", func(n int) bool { return n <= 1 })
	if !ok {
		return code
	}
	opt, err := rf.options(fs, stderr)
	if err != nil {
		fmt.Fprintln(stderr, "assay repl:", err)
		return 2
	}
	var nb *cells.Notebook
	if len(names) == 1 {
		src, err := readNotebook(names[0])
		if err != nil {
			fmt.Fprintln(stderr, "assay repl:", err)
			return 2
		}
		// A notebook that does not parse gives no namespace to start
		// from: the session does not open.
		if nb, err = cells.Parse(names[0], src); err != nil {
			p := parseProblem(err)
			fmt.Fprintf(stderr, "assay repl: %s:%d: %s\n", names[0], p.Line, p.Message)
			return 2
		}
	}
	p, err := kernel.NewPrompt(opt)
	if err != nil {
		fmt.Fprintln(stderr, "assay repl:", err)
		return 2
	}
	defer p.Close()
	terminal := isTerminal(os.Stdin) && stdout == io.Writer(os.Stdout) && isTerminal(os.Stdout)
	if terminal {
		fmt.Fprintf(stdout, "assay %s: type a cell's code; Ctrl-D ends the session\n", proto.Version)
	}
	if nb != nil {
		// A cell that fails is reported with its line; the session opens
		// all the same, with the names of the cells that ran.
		summarize(stdout, stderr, p.Notebook(nb))
	}
	cfg := repl.Config{In: os.Stdin, Out: stdout, Terminal: terminal}
	if dir, err := os.UserCacheDir(); err == nil && terminal {
		if os.MkdirAll(filepath.Join(dir, "assay"), 0o700) == nil {
			cfg.History = filepath.Join(dir, "assay", "repl-history")
		}
	}
	if err := repl.Run(p, cfg); err != nil {
		fmt.Fprintln(stderr, "assay repl:", err)
		return 2
	}
	return 0
}
