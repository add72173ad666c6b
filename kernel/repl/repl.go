// Package repl is assay repl's loop: it reads inputs, with line editing
// and history on a terminal (github.com/chzyer/readline) or plainly from
// a pipe, tells a complete input from one that goes on, and runs each in
// the session's kernel (kernel.Prompt), printing what it gave.
package repl

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"strings"

	"github.com/chzyer/readline"

	"assay/cells"
	"assay/kernel"
	"assay/kernel/interp"
)

// The prompts: the first line of an input, and the lines that continue it.
const (
	Prompt       = "assay> "
	Continuation = "     | "
)

// Config says where a session reads and writes.
type Config struct {
	In       io.Reader // a pipe or file: read plainly, with no prompts
	Out      io.Writer
	Terminal bool // read os.Stdin with line editing and prompts instead of In
	// History is the file the terminal's history is kept in between
	// sessions; "" keeps it in memory only.
	History string
}

// errCancel is Ctrl-C at the prompt: the input being typed is dropped.
var errCancel = errors.New("cancelled")

// lines reads one line at a time; io.EOF ends the session.
type lines interface {
	line(prompt string) (string, error)
	close()
}

// Run reads inputs and runs them in p until the input ends (Ctrl-D on a
// terminal). Ctrl-C at the prompt drops the input being typed; while an
// input runs it interrupts it (the kernel is restarted and replays what
// ran before, see kernel.Prompt).
func Run(p *kernel.Prompt, cfg Config) error {
	var in lines
	if cfg.Terminal {
		rl, err := readline.NewEx(&readline.Config{Prompt: Prompt, HistoryFile: cfg.History, HistoryLimit: 1000,
			InterruptPrompt: "^C", Stdout: cfg.Out, Stderr: cfg.Out})
		if err != nil {
			return err
		}
		in = edited{rl}
	} else {
		in = plain{bufio.NewReader(cfg.In)}
	}
	defer in.close()
	// On a terminal, a Ctrl-C while an input runs comes as a signal (the
	// terminal is not in raw mode then), and stops the input; at the
	// prompt readline reads it as a key. From a pipe it ends the command
	// as it ends assay run (the kernels die with it).
	sig := make(chan os.Signal, 1)
	if cfg.Terminal {
		signal.Notify(sig, os.Interrupt)
		defer signal.Stop(sig)
	}
	for n := 1; ; {
		src, err := read(in)
		if errors.Is(err, errCancel) {
			continue
		}
		if strings.TrimSpace(src) != "" {
			select {
			case <-sig: // pressed between inputs: not for this one
			default:
			}
			done := make(chan struct{})
			go func() {
				select {
				case <-sig:
					p.Interrupt()
				case <-done:
				}
			}()
			out := p.Input(src)
			close(done)
			cells.RenderInput(cfg.Out, out, fmt.Sprintf("input %d", n))
			n++
		}
		if err != nil {
			if errors.Is(err, io.EOF) {
				return nil
			}
			return err
		}
	}
}

// read reads one input: a line, and more lines while the input is
// incomplete (an open bracket or string, a block with no body yet, as the
// parser tells) or, after a line ending in ":", until a blank line. A
// blank line always ends an input. With io.EOF comes what was read.
func read(in lines) (string, error) {
	var got []string
	block := false
	for {
		prompt := Prompt
		if len(got) > 0 {
			prompt = Continuation
		}
		l, err := in.line(prompt)
		if err != nil {
			if errors.Is(err, errCancel) {
				return "", err
			}
			return strings.Join(got, "\n"), err
		}
		if strings.TrimSpace(l) == "" {
			if len(got) == 0 {
				continue
			}
			return strings.Join(got, "\n"), nil
		}
		got = append(got, l)
		if len(got) == 1 {
			block = strings.HasSuffix(strings.TrimSpace(l), ":")
		}
		if !block && !interp.Incomplete(strings.Join(got, "\n")) {
			return strings.Join(got, "\n"), nil
		}
	}
}

// plain reads a pipe: no prompts, no editing.
type plain struct{ r *bufio.Reader }

func (p plain) line(string) (string, error) {
	l, err := p.r.ReadString('\n')
	if err != nil && l != "" {
		err = nil // the last line, without its newline; EOF comes next
	}
	return strings.TrimRight(l, "\r\n"), err
}

func (plain) close() {}

// edited reads a terminal with line editing and history.
type edited struct{ rl *readline.Instance }

func (e edited) line(prompt string) (string, error) {
	e.rl.SetPrompt(prompt)
	l, err := e.rl.Readline()
	if errors.Is(err, readline.ErrInterrupt) {
		return "", errCancel
	}
	return l, err
}

func (e edited) close() { e.rl.Close() }
