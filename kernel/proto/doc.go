// Package proto is the kernel process and its wire: the JSON-lines
// requests and replies between a driver and a kernel, on a channel of
// their own that notebook code cannot reach, each reply checked against
// the request it answers; the child side that serves them over a session;
// and the whole child-process contract — how a kernel is started, the
// environment and limits it gets, how it dies with its driver, and how its
// death is diagnosed.
package proto
