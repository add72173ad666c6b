// Package kernel is the parent side of a notebook run: it drives kernels —
// child processes started through package proto, or a session in this
// process — cell by cell, enforces each cell's time limit, starts helper
// workers for large sampled claims and merges their tallies, writes and
// merges the parts of a sharded run, and shows a sweep's progress. It turns
// a parsed notebook into a report; the cells themselves run in package
// session.
package kernel
