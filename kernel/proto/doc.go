// Package proto is the kernel process and its wire: the JSON-lines
// requests and replies between a driver and a kernel, the child side that
// serves them over a session, and the whole child-process contract — how a
// kernel is started, the environment and limits it gets, and how its death
// is diagnosed.
package proto
