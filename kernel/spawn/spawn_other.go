//go:build !unix

package spawn

import "os"

// channel is the value of ChannelEnv for the descriptors files gives.
const channel = "stdio"

// files passes the protocol channel as the child's standard input and
// output, where a child cannot be given extra files; the kernel points its
// own writes to standard output elsewhere before it runs a cell.
func files(null, stderr, requests, replies *os.File) []*os.File {
	return []*os.File{requests, replies, stderr}
}
