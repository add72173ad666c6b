package spawn

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"slices"
	"strings"
	"testing"
)

// helperEnv makes the test binary act as a child: it echoes one line from
// its request channel to its reply channel, and reports on standard error
// what it was given.
const helperEnv = "ASSAY_SPAWN_TEST_CHILD"

func TestMain(m *testing.M) {
	if os.Getenv(helperEnv) == "1" {
		child()
		os.Exit(0)
	}
	os.Exit(m.Run())
}

func child() {
	in, out := os.Stdin, os.Stdout
	if v := os.Getenv(ChannelEnv); v == "3,4" {
		in, out = os.NewFile(3, "requests"), os.NewFile(4, "replies")
	}
	stdout, _ := os.Stdout.Stat()
	null, _ := os.Stat(os.DevNull)
	fmt.Fprintf(os.Stderr, "channel=%s stdout-null=%v\n", os.Getenv(ChannelEnv), os.SameFile(stdout, null))
	line, _ := bufio.NewReader(in).ReadString('\n')
	fmt.Fprint(out, "echo "+line)
}

// roundTrip sends a line to c, reads its reply and its standard error,
// and waits for it to end.
func roundTrip(t *testing.T, c *Child) (reply, stderr string) {
	t.Helper()
	if _, err := c.Requests.Write([]byte("hello\n")); err != nil {
		t.Fatal(err)
	}
	c.Requests.Close()
	r, err := bufio.NewReader(c.Replies).ReadString('\n')
	if err != nil {
		t.Fatalf("reply: %v", err)
	}
	e, _ := io.ReadAll(c.Stderr)
	if st, err := c.Process.Wait(); err != nil || !st.Success() {
		t.Fatalf("child: %v %v (stderr %q)", st, err, e)
	}
	return r, string(e)
}

// TestStartGivesTheChannel checks the child-process contract the kernel
// relies on (README, "The kernel process"): the channel on descriptors 3
// and 4 named in the environment (Unix), standard output the null device,
// standard error kept for the parent.
func TestStartGivesTheChannel(t *testing.T) {
	c, err := Start([]string{os.Args[0]}, append(os.Environ(), helperEnv+"=1"))
	if err != nil {
		t.Fatal(err)
	}
	reply, stderr := roundTrip(t, c)
	if reply != "echo hello\n" {
		t.Errorf("reply %q, want the request echoed", reply)
	}
	want := "channel=" + channel + " stdout-null=true\n"
	if channel == "stdio" {
		want = "channel=stdio stdout-null=false\n" // the channel is standard output
	}
	if stderr != want {
		t.Errorf("child's standard error %q, want %q", stderr, want)
	}
}

// TestEarlyIsTakenOnce checks that a child started early goes to the first
// Take of its command only.
func TestEarlyIsTakenOnce(t *testing.T) {
	t.Setenv(helperEnv, "1")
	argv := []string{os.Args[0], "-test.run=none"}
	Early(argv, os.Environ())
	if c := Take([]string{os.Args[0], "other"}); c != nil {
		t.Fatal("a child of another command was taken")
	}
	c := Take(slices.Clone(argv))
	if c == nil {
		t.Fatal("the early child was not taken")
	}
	if again := Take(argv); again != nil {
		t.Error("the early child was taken twice")
	}
	if reply, _ := roundTrip(t, c); !strings.HasPrefix(reply, "echo hello") {
		t.Errorf("early child replied %q", reply)
	}
}
