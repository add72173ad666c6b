// Package spawn makes kernel child processes: each with its protocol
// channel, its standard error kept for the parent, its standard input and
// output the null device, and (on Linux) the parent-death signal.
//
// It imports nothing heavier than os, so that its initialisation comes
// early in a process's start: cmd/assay starts the kernel of `assay check`
// and `assay run` (Early) while its own ~300 packages are still
// initialising, and the driver takes that child (Take) when it needs a
// kernel. The two start-ups then overlap instead of following each other
// (DEVELOPERS.md, "Start-up").
package spawn

import (
	"os"
	"slices"
	"sync"
)

// ChannelEnv names the protocol channel in the child's environment:
// "3,4" (file descriptors of requests and replies) on Unix, "stdio" where
// a child cannot be given extra files. See proto.ChannelEnv.
const ChannelEnv = "ASSAY_KERNEL_CHANNEL"

// Child is a started kernel process and this process's ends of its pipes.
type Child struct {
	Process  *os.Process
	Argv     []string // the command it runs
	Requests *os.File // write end of its request channel
	Replies  *os.File // read end of its reply channel
	Stderr   *os.File // read end of its standard error
}

// Start starts argv with the environment env (the channel variable is
// added) and returns it with its pipes. On Linux it is started from a
// thread that lives as long as this process, so that the parent-death
// signal fires when the process dies, not when one thread ends.
func Start(argv, env []string) (*Child, error) {
	return onLockedThread(func() (*Child, error) { return start(argv, env) })
}

func start(argv, env []string) (*Child, error) {
	var ends []*os.File // every end made, closed on failure
	pipe := func() (r, w *os.File, err error) {
		if r, w, err = os.Pipe(); err == nil {
			ends = append(ends, r, w)
		}
		return
	}
	fail := func(err error) (*Child, error) {
		for _, f := range ends {
			f.Close()
		}
		return nil, err
	}
	reqR, reqW, err := pipe()
	if err != nil {
		return fail(err)
	}
	repR, repW, err := pipe()
	if err != nil {
		return fail(err)
	}
	errR, errW, err := pipe()
	if err != nil {
		return fail(err)
	}
	null, err := os.OpenFile(os.DevNull, os.O_RDWR, 0)
	if err != nil {
		return fail(err)
	}
	ends = append(ends, null)
	attr := &os.ProcAttr{Env: append(slices.Clip(env), ChannelEnv+"="+channel), Files: files(null, errW, reqR, repW), Sys: sysAttr()}
	p, err := os.StartProcess(argv[0], argv, attr)
	if err != nil {
		return fail(err)
	}
	for _, f := range []*os.File{reqR, repW, errW, null} { // the child's ends
		f.Close()
	}
	return &Child{Process: p, Argv: argv, Requests: reqW, Replies: repR, Stderr: errR}, nil
}

var early struct {
	sync.Mutex
	child *Child
}

// Early starts argv with the environment env, to be taken by the first
// Take of the same command. It is meant for a package initialiser,
// which runs on the main thread (one that lives as long as the process);
// a failure is silent: Take then finds nothing and the caller starts a
// child as usual.
func Early(argv, env []string) {
	Mark("spawn")
	c, err := start(argv, env)
	Mark("spawned")
	if err != nil {
		return
	}
	early.Lock()
	early.child = c
	early.Unlock()
}

// Take returns the child Early started if it runs argv and no one has
// taken it yet, else nil.
func Take(argv []string) *Child {
	early.Lock()
	defer early.Unlock()
	c := early.child
	if c == nil || !slices.Equal(c.Argv, argv) {
		return nil
	}
	early.child = nil
	return c
}
