// Package kernel runs notebook cells. It embeds the Python-syntax interpreter
// gpython, binds exact rationals and matrices as Python objects with
// operators, records claims, sandboxes cells (no files, processes or
// network), and speaks the JSON-lines protocol of the kernel process that
// `assay run` drives as a child, enforcing per-cell timeouts and a memory cap.
package kernel
