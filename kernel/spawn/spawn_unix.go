//go:build unix

package spawn

import "os"

// channel is the value of ChannelEnv for the descriptors files gives.
const channel = "3,4"

// files gives the child the null device as standard input and output, so
// nothing it writes there is read, and the protocol channel as file
// descriptors 3 (requests) and 4 (replies).
func files(null, stderr, requests, replies *os.File) []*os.File {
	return []*os.File{null, null, stderr, requests, replies}
}
