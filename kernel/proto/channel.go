package proto

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"sync"
)

// openChannel opens the protocol channel ChannelEnv names: ok false when
// it names none, nil files when it names standard input and output. The
// descriptors are closed on exec: nothing the kernel might start inherits
// them (see prepare).
func openChannel() (requests, replies *os.File, ok bool, err error) {
	v, ok := os.LookupEnv(ChannelEnv)
	if !ok || v == stdioChannel {
		return nil, nil, ok, nil
	}
	fds := strings.Split(v, ",")
	if len(fds) != 2 {
		return nil, nil, true, fmt.Errorf("%s=%q: want two file descriptors, IN,OUT", ChannelEnv, v)
	}
	var files [2]*os.File
	for i, s := range fds {
		fd, err := strconv.ParseUint(strings.TrimSpace(s), 10, 64)
		if err != nil {
			return nil, nil, true, fmt.Errorf("%s=%q: %q is not a file descriptor", ChannelEnv, v, s)
		}
		prepare(uintptr(fd))
		files[i] = os.NewFile(uintptr(fd), "assay protocol "+[]string{"requests", "replies"}[i])
		if _, err := files[i].Stat(); err != nil {
			return nil, nil, true, fmt.Errorf("%s=%q: file descriptor %d is not open: %v", ChannelEnv, v, fd, err)
		}
	}
	return files[0], files[1], true, nil
}

// ahead reads a stream as fast as it comes, whether or not anyone is
// reading from ahead yet, so that the stream's end is seen at once —
// also while the kernel is busy with a cell and not reading requests.
type ahead struct {
	mu   sync.Mutex
	more *sync.Cond
	buf  []byte
	err  error
}

// readAhead starts reading r; ended is called, from the reading
// goroutine, when r ends or fails.
func readAhead(r io.Reader, ended func()) *ahead {
	a := &ahead{}
	a.more = sync.NewCond(&a.mu)
	go func() {
		chunk := make([]byte, 64<<10)
		for {
			n, err := r.Read(chunk)
			a.mu.Lock()
			a.buf = append(a.buf, chunk[:n]...)
			if err != nil {
				a.err = err
			}
			a.more.Broadcast()
			a.mu.Unlock()
			if err != nil {
				ended()
				return
			}
		}
	}()
	return a
}

// Read gives what has been read ahead, waiting for it if there is none.
func (a *ahead) Read(p []byte) (int, error) {
	a.mu.Lock()
	defer a.mu.Unlock()
	for len(a.buf) == 0 && a.err == nil {
		a.more.Wait()
	}
	if len(a.buf) > 0 {
		n := copy(p, a.buf)
		a.buf = a.buf[n:]
		if len(a.buf) == 0 {
			a.buf = nil // let a large request's buffer go
		}
		return n, nil
	}
	return 0, a.err
}

// errLongLine is a line longer than readLine was allowed to read.
var errLongLine = errors.New("line too long")

// readLine reads one line of at most max bytes, newline included; a
// longer one is errLongLine, found without buffering more than max.
func readLine(r *bufio.Reader, max int) ([]byte, error) {
	var line []byte
	for {
		chunk, err := r.ReadSlice('\n')
		if len(line)+len(chunk) > max {
			return nil, errLongLine
		}
		line = append(line, chunk...)
		if err != bufio.ErrBufferFull {
			return line, err
		}
	}
}

// stdioChannel is the value of ChannelEnv that names standard input and
// output as the channel.
const stdioChannel = "stdio"
