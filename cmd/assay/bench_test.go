package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"testing"
)

// BenchmarkCheckOneCell times `assay check` on a one-cell notebook as a user
// runs it: the built binary, which starts its kernel child process.
// Target (DESIGN.md): < 100 ms.
func BenchmarkCheckOneCell(b *testing.B) {
	dir := b.TempDir()
	bin := filepath.Join(dir, "assay")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		b.Fatalf("build: %v\n%s", err, out)
	}
	nb := filepath.Join(dir, "one.md")
	src := "# one cell\n\n```cell\nidentity(\"det of a 3x3\", det(matrix([[2, 0, 1], [1, 3, 2], [1, 1, 1]])), 0)\n```\n"
	if err := os.WriteFile(nb, []byte(src), 0o644); err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if out, err := exec.Command(bin, "check", nb).CombinedOutput(); err != nil {
			b.Fatalf("check: %v\n%s", err, out)
		}
	}
}
