package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"

	"assay/kernel/watch"
)

func watchCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("watch", flag.ContinueOnError)
	fs.SetOutput(stderr)
	addr := fs.String("addr", "127.0.0.1:0", "loopback `address:port` to serve the page on (port 0: a free one)")
	rf := addRunFlags(fs)
	fs.Usage = func() {
		fmt.Fprint(stderr, `Usage: assay watch [flags] NOTEBOOK

Serves the report of NOTEBOOK on loopback and prints its address first,
e.g. http://127.0.0.1:PORT/. Each time the file is saved, the notebook is
run again from its first changed cell, and the open page updates itself.
An error keeps the last good report on the page, marked stale. No report
files are written. Stop it with Ctrl-C.

Example:
  assay watch --addr 127.0.0.1:8080 notebooks/mesh-orientation.md

Flags:
`)
		fs.PrintDefaults()
	}
	names, code, ok := parseNames(fs, args, stderr, "assay watch: give exactly one notebook", func(n int) bool { return n == 1 })
	if !ok {
		return code
	}
	opt, err := rf.options(fs, stderr)
	if err != nil {
		fmt.Fprintln(stderr, "assay watch:", err)
		return 2
	}
	if _, err := readNotebook(names[0]); err != nil {
		fmt.Fprintln(stderr, "assay watch:", err)
		return 2
	}
	ln, err := watch.Listen(*addr)
	if err != nil {
		fmt.Fprintln(stderr, "assay watch:", err)
		return 2
	}
	fmt.Fprintln(stdout, watch.URL(ln))
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	if err := watch.New(names[0], opt, stderr).Serve(ctx, ln); err != nil {
		fmt.Fprintln(stderr, "assay watch:", err)
		return 2
	}
	return 0
}
