package kernel

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// rooms are the kernel's packages, each importing only rooms after it.
var rooms = []string{
	"assay/kernel/repl",
	"assay/kernel/watch",
	"assay/kernel",
	"assay/kernel/proto",
	"assay/kernel/session",
	"assay/kernel/claim",
	"assay/kernel/values",
	"assay/kernel/interp/pyext",
	"assay/kernel/interp",
	"assay/kernel/figure",
	"assay/kernel/cputime",
	"assay/kernel/spawn",
}

// projectImports lists the project packages a directory's non-test Go
// files import.
func projectImports(t *testing.T, dir string) []string {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(dir, "*.go"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no Go files in %s (%v)", dir, err)
	}
	var out []string
	for _, f := range files {
		if strings.HasSuffix(f, "_test.go") {
			continue
		}
		parsed, err := parser.ParseFile(token.NewFileSet(), f, nil, parser.ImportsOnly)
		if err != nil {
			t.Fatal(err)
		}
		for _, spec := range parsed.Imports {
			path, _ := strconv.Unquote(spec.Path.Value)
			if path == "assay" || strings.HasPrefix(path, "assay/") {
				out = append(out, path)
			}
		}
	}
	return out
}

// TestImportsRunOneWay keeps the layout DEVELOPERS.md draws: the kernel's
// rooms import one way, and the design's arrows hold (exact and geom know
// nothing of the project outside exact; cells knows neither kernel nor
// exact).
func TestImportsRunOneWay(t *testing.T) {
	for i, room := range rooms {
		dir := "." + strings.TrimPrefix(room, "assay/kernel")
		for _, imp := range projectImports(t, dir) {
			j := slices.Index(rooms, imp)
			if j >= 0 && j <= i {
				t.Errorf("%s imports %s, which comes before it in the layout", room, imp)
			}
		}
	}
	for dir, allowed := range map[string]func(string) bool{
		"../exact":        func(p string) bool { return strings.HasPrefix(p, "assay/exact") },
		"../exact/geom":   func(p string) bool { return p == "assay/exact" },
		"../exact/limits": func(p string) bool { return strings.HasPrefix(p, "assay/exact") },
		"../cells":        func(string) bool { return false },
	} {
		for _, imp := range projectImports(t, dir) {
			if !allowed(imp) {
				t.Errorf("%s imports %s, against the design's arrows", dir, imp)
			}
		}
	}
	// Every kernel package is in the list, so a new one must take its place.
	err := filepath.WalkDir(".", func(path string, d os.DirEntry, err error) error {
		if err != nil || !d.IsDir() || d.Name() == "testdata" {
			return err
		}
		if goFiles, _ := filepath.Glob(filepath.Join(path, "*.go")); len(goFiles) > 0 {
			name := filepath.ToSlash(filepath.Join("assay/kernel", path))
			if !slices.Contains(rooms, name) {
				t.Errorf("package %s is not placed in the layout (rooms in layout_test.go, and DEVELOPERS.md)", name)
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
}
