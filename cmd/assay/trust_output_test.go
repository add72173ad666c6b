package main

import (
	"bytes"
	"encoding/json"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"assay/cells"
)

// The tests of this file check where reports and notebooks are written:
// only where the user said, never over the notebook or over each other,
// all files of a run or none, and through symbolic links.

// snapshot reads every file and link under dir: contents for files, the
// destination for links, "dir" for folders.
func snapshot(t *testing.T, dir string) map[string]string {
	t.Helper()
	out := map[string]string{}
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		switch {
		case d.Type()&fs.ModeSymlink != 0:
			dest, err := os.Readlink(p)
			out[rel] = "link to " + dest
			return err
		case d.IsDir():
			out[rel] = "dir"
		default:
			data, err := os.ReadFile(p)
			out[rel] = string(data)
			return err
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// sameFiles fails the test when a file under dir was added, removed or
// changed since before was taken, apart from the names in except.
func sameFiles(t *testing.T, dir string, before map[string]string, except ...string) {
	t.Helper()
	after := snapshot(t, dir)
	skip := map[string]bool{}
	for _, e := range except {
		skip[e] = true
	}
	for name, old := range before {
		if skip[name] {
			continue
		}
		if now, ok := after[name]; !ok {
			t.Errorf("%s was removed", name)
		} else if now != old {
			t.Errorf("%s was changed", name)
		}
	}
	for name := range after {
		if _, ok := before[name]; !ok && !skip[name] {
			t.Errorf("%s was written", name)
		}
	}
}

func writeFile(t *testing.T, path string, data []byte) {
	t.Helper()
	if err := os.WriteFile(path, data, 0o644); err != nil {
		t.Fatal(err)
	}
}

func readFile(t *testing.T, path string) []byte {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return data
}

// Item 3: a part file names its notebook by a path; merge must not take
// that path as the place for the report. The report goes beside the part
// files, or to -o.
func TestMergeWritesBesideThePartsNotWhereAPartSays(t *testing.T) {
	nb := copyNotebook(t, "../../testdata/bad/output-figure.md")
	if code, out, errs := assay(t, "run", "--shard", "1/1", nb); code != 0 {
		t.Fatalf("shard: exit %d\n%s%s", code, out, errs)
	}
	part := readFile(t, strings.TrimSuffix(nb, ".md")+".part-1-of-1.json")

	// Another folder, with reports of its own that nothing may touch.
	victim := t.TempDir()
	for _, name := range []string{"output-figure.md", "output-figure.report.md", "output-figure.report.html", "output-figure.report.fig1.svg"} {
		writeFile(t, filepath.Join(victim, name), []byte("someone else's "+name+"\n"))
	}
	untouched := snapshot(t, victim)

	var fields map[string]any
	if err := json.Unmarshal(part, &fields); err != nil {
		t.Fatal(err)
	}
	fields["notebook"] = filepath.Join(victim, "output-figure.md")
	forged, _ := json.Marshal(fields)
	parts := t.TempDir()
	forgedPath := filepath.Join(parts, "output-figure.part-1-of-1.json")
	writeFile(t, forgedPath, forged)

	code, out, errs := assay(t, "merge", forgedPath)
	want := filepath.Join(parts, "output-figure.report.md")
	if code != 0 || !strings.Contains(out, "report: "+want+", "+filepath.Join(parts, "output-figure.report.html")) {
		t.Errorf("merge: exit %d, want 0 and the report beside the part\n%s%s", code, out, errs)
	}
	sameFiles(t, victim, untouched)
	for _, name := range []string{"output-figure.report.md", "output-figure.report.html", "output-figure.report.fig1.svg"} {
		if _, err := os.Stat(filepath.Join(parts, name)); err != nil {
			t.Errorf("not beside the part: %v", err)
		}
	}

	// Parts in two folders give no single place "beside the parts": merge
	// asks for -o and writes nothing.
	nb2 := copyNotebook(t, "../../testdata/bad/output-figure.md")
	for _, s := range []string{"1/2", "2/2"} {
		if code, out, errs := assay(t, "run", "--shard", s, nb2); code != 0 {
			t.Fatalf("shard %s: exit %d\n%s%s", s, code, out, errs)
		}
	}
	elsewhere := t.TempDir()
	second := filepath.Join(elsewhere, "output-figure.part-2-of-2.json")
	if err := os.Rename(strings.TrimSuffix(nb2, ".md")+".part-2-of-2.json", second); err != nil {
		t.Fatal(err)
	}
	before := snapshot(t, filepath.Dir(nb2))
	code, out, errs = assay(t, "merge", strings.TrimSuffix(nb2, ".md")+".part-1-of-2.json", second)
	if code != 2 || !strings.Contains(errs, "different folders") || !strings.Contains(errs, "-o") {
		t.Errorf("parts in two folders: exit %d, want 2 and a message asking for -o\n%s%s", code, out, errs)
	}
	sameFiles(t, filepath.Dir(nb2), before)
}

// Item 6: --in-place rewrites the generated regions; text in them that
// assay did not write is refused, by its lines, and the notebook is left
// as it was.
func TestInPlaceRefusesTextInGeneratedRegions(t *testing.T) {
	t.Run("region without assay's hash", func(t *testing.T) {
		nb := copyNotebook(t, "../../testdata/bad/output-foreign-text.md")
		before := snapshot(t, filepath.Dir(nb))
		code, out, errs := assay(t, "run", "--in-place", nb)
		if code != 2 || !strings.Contains(errs, nb+", lines 7–11:") || !strings.Contains(errs, "did not write") {
			t.Errorf("exit %d, want 2 and lines 7–11 named\n%s%s", code, out, errs)
		}
		sameFiles(t, filepath.Dir(nb), before)
	})
	t.Run("text added to a region assay wrote", func(t *testing.T) {
		nb := copyNotebook(t, "../../testdata/bad/output-figure.md")
		if code, out, errs := assay(t, "run", "--in-place", nb); code != 0 {
			t.Fatalf("first in-place run: exit %d\n%s%s", code, out, errs)
		}
		lines := strings.SplitAfter(string(readFile(t, nb)), "\n")
		end := -1
		for i, l := range lines {
			if strings.TrimSpace(l) == cells.GeneratedEnd {
				end = i
			}
		}
		if end < 0 {
			t.Fatalf("no generated region written:\n%s", strings.Join(lines, ""))
		}
		note := "My own note on the figure; keep it.\n"
		edited := strings.Join(lines[:end], "") + note + strings.Join(lines[end:], "")
		writeFile(t, nb, []byte(edited))
		before := snapshot(t, filepath.Dir(nb))
		code, out, errs := assay(t, "run", "--in-place", nb)
		if code != 2 || !strings.Contains(errs, nb+", lines ") || !strings.Contains(errs, "left unchanged") {
			t.Errorf("exit %d, want 2 and the lines named\n%s%s", code, out, errs)
		}
		sameFiles(t, filepath.Dir(nb), before)
		if !strings.Contains(string(readFile(t, nb)), note) {
			t.Errorf("the note was deleted")
		}
	})
}

// Item 7: the files of a report are written as one set. A failure while
// they go into place (here a folder in the way of one of them, as a kill
// between two renames would leave things) leaves the old set whole, and a
// reader can tell a Markdown report from an HTML report of another run.
func TestReportFilesChangeTogether(t *testing.T) {
	failing := readFile(t, "../../testdata/bad/output-figures-failing.md")
	t.Run("figure in the way", func(t *testing.T) {
		nb := copyNotebook(t, "../../testdata/bad/output-figure.md")
		dir, base := filepath.Dir(nb), strings.TrimSuffix(nb, ".md")
		if code, out, errs := assay(t, "run", nb); code != 0 {
			t.Fatalf("first run: exit %d\n%s%s", code, out, errs)
		}
		oldMD, oldHTML := readFile(t, base+".report.md"), readFile(t, base+".report.html")
		oldRun := cells.RunID(oldMD)
		if oldRun == "" || cells.RunID(oldHTML) != oldRun {
			t.Fatalf("one run's reports state run %q and %q", oldRun, cells.RunID(oldHTML))
		}
		writeFile(t, nb, failing)
		obstacle := base + ".report.fig2.svg"
		if err := os.MkdirAll(filepath.Join(obstacle, "x"), 0o755); err != nil {
			t.Fatal(err)
		}
		before := snapshot(t, dir)
		code, out, errs := assay(t, "run", nb)
		if code != 2 || !strings.Contains(errs, "cannot write "+obstacle+": a folder of that name is in the way; no file of this run was written") {
			t.Errorf("exit %d, want 2 and %s named\n%s%s", code, obstacle, out, errs)
		}
		sameFiles(t, dir, before) // the old report, HTML and figure 1, and no temporary file left
		if md, html := readFile(t, base+".report.md"), readFile(t, base+".report.html"); cells.RunID(md) != cells.RunID(html) {
			t.Errorf("the pair left is not one run's")
		}

		// With the way clear, the new set replaces the old one whole.
		os.RemoveAll(obstacle)
		if code, out, errs := assay(t, "run", nb); code != 1 {
			t.Fatalf("second run: exit %d, want 1\n%s%s", code, out, errs)
		}
		newMD, newHTML := readFile(t, base+".report.md"), readFile(t, base+".report.html")
		newRun := cells.RunID(newMD)
		if !bytes.Contains(newMD, []byte("✘ fails")) || newRun == "" || cells.RunID(newHTML) != newRun {
			t.Errorf("new pair: run %q and %q\n%s", newRun, cells.RunID(newHTML), newMD)
		}
		// A stale pair, as a kill between the renames of an older assay
		// left it, is told by its run identifiers.
		if newRun == oldRun || cells.RunID(oldHTML) == newRun {
			t.Errorf("a new Markdown report beside an old HTML report is not told apart: both say run %q", newRun)
		}
	})
	t.Run("HTML in the way", func(t *testing.T) {
		nb := copyNotebook(t, "../../testdata/bad/output-figure.md")
		dir, base := filepath.Dir(nb), strings.TrimSuffix(nb, ".md")
		if code, out, errs := assay(t, "run", "--no-html", nb); code != 0 {
			t.Fatalf("first run: exit %d\n%s%s", code, out, errs)
		}
		writeFile(t, nb, failing)
		if err := os.Mkdir(base+".report.html", 0o755); err != nil {
			t.Fatal(err)
		}
		before := snapshot(t, dir)
		code, out, errs := assay(t, "run", nb)
		if code != 2 || !strings.Contains(errs, "cannot write "+base+".report.html") {
			t.Errorf("exit %d, want 2 and the HTML path named\n%s%s", code, out, errs)
		}
		sameFiles(t, dir, before) // the old Markdown report and figure stay
	})
}

// Item 8: no output lands on the notebook or on another output of the
// same run, by the same name, through a linked folder, a symbolic link or
// a hard link. Each is refused before anything is written.
func TestOutputsNeverOverwriteTheNotebookOrEachOther(t *testing.T) {
	notebook := readFile(t, "../../testdata/bad/output-figure.md")
	cases := []struct {
		name  string
		setup func(t *testing.T, dir string) (args []string)
		want  []string
	}{
		{"-o names an HTML file", func(t *testing.T, dir string) []string {
			nb := filepath.Join(dir, "n.md")
			writeFile(t, nb, notebook)
			return []string{"run", "-o", filepath.Join(dir, "r.html"), nb}
		}, []string{"the HTML report DIR/r.html would overwrite the Markdown report", "give it a path ending in .md"}},
		{"a figure file would be the notebook", func(t *testing.T, dir string) []string {
			nb := filepath.Join(dir, "n.fig1.svg")
			writeFile(t, nb, notebook)
			return []string{"run", "-o", filepath.Join(dir, "n.md"), nb}
		}, []string{"the figure file DIR/n.fig1.svg would overwrite the notebook", "choose another -o"}},
		{"the same through a linked folder", func(t *testing.T, dir string) []string {
			os.Mkdir(filepath.Join(dir, "real"), 0o755)
			if err := os.Symlink("real", filepath.Join(dir, "alias")); err != nil {
				t.Fatal(err)
			}
			nb := filepath.Join(dir, "real", "n.fig1.svg")
			writeFile(t, nb, notebook)
			return []string{"run", "-o", filepath.Join(dir, "alias", "n.md"), nb}
		}, []string{"the figure file DIR/alias/n.fig1.svg is the same file as the notebook DIR/real/n.fig1.svg"}},
		{"the HTML report is a hard link of the notebook", func(t *testing.T, dir string) []string {
			nb := filepath.Join(dir, "n.md")
			writeFile(t, nb, notebook)
			if err := os.Link(nb, filepath.Join(dir, "r.html")); err != nil {
				t.Fatal(err)
			}
			return []string{"run", "-o", filepath.Join(dir, "r.md"), nb}
		}, []string{"the HTML report DIR/r.html is the same file as the notebook DIR/n.md"}},
		{"the report is a symbolic link to the notebook", func(t *testing.T, dir string) []string {
			nb := filepath.Join(dir, "n.md")
			writeFile(t, nb, notebook)
			if err := os.Symlink("n.md", filepath.Join(dir, "r.md")); err != nil {
				t.Fatal(err)
			}
			return []string{"run", "-o", filepath.Join(dir, "r.md"), nb}
		}, []string{"the report path DIR/r.md is the notebook itself"}},
		{"the HTML report is a symbolic link to the Markdown one", func(t *testing.T, dir string) []string {
			nb := filepath.Join(dir, "n.md")
			writeFile(t, nb, notebook)
			writeFile(t, filepath.Join(dir, "r.md"), []byte("an older report\n"))
			if err := os.Symlink("r.md", filepath.Join(dir, "r.html")); err != nil {
				t.Fatal(err)
			}
			return []string{"run", "-o", filepath.Join(dir, "r.md"), nb}
		}, []string{"the HTML report DIR/r.html is the same file as the Markdown report DIR/r.md"}},
		{"a part file would be the notebook", func(t *testing.T, dir string) []string {
			nb := filepath.Join(dir, "n.md")
			writeFile(t, nb, notebook)
			return []string{"run", "--shard", "1/1", "-o", filepath.Join(dir, ".", "n.md"), nb}
		}, []string{"the part file DIR/n.md would overwrite the notebook", "choose another -o"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			args := c.setup(t, dir)
			before := snapshot(t, dir)
			code, out, errs := assay(t, args...)
			if code != 2 {
				t.Errorf("exit %d, want 2\n%s%s", code, out, errs)
			}
			for _, w := range c.want {
				if w = strings.ReplaceAll(w, "DIR", dir); !strings.Contains(errs, w) {
					t.Errorf("stderr lacks %q:\n%s", w, errs)
				}
			}
			if strings.Count(strings.TrimSpace(errs), "\n") > 0 {
				t.Errorf("want one line, got:\n%s", errs)
			}
			sameFiles(t, dir, before)
		})
	}
}

// Item 9: --in-place on a symbolic link writes the file it names, keeps
// the link and the file's permissions, and puts the figures beside the
// file.
func TestInPlaceWritesThroughASymbolicLink(t *testing.T) {
	dir := t.TempDir()
	real := filepath.Join(dir, "real", "n.md")
	os.Mkdir(filepath.Dir(real), 0o755)
	if err := os.WriteFile(real, readFile(t, "../../testdata/bad/output-figure.md"), 0o600); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.md")
	if err := os.Symlink(filepath.Join("real", "n.md"), link); err != nil {
		t.Fatal(err)
	}
	if code, out, errs := assay(t, "run", "--in-place", link); code != 0 {
		t.Fatalf("exit %d\n%s%s", code, out, errs)
	}
	fi, err := os.Lstat(link)
	if err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Fatalf("the link was replaced: %v %v", fi.Mode(), err)
	}
	if dest, _ := os.Readlink(link); dest != filepath.Join("real", "n.md") {
		t.Errorf("the link now points to %q", dest)
	}
	if !bytes.Contains(readFile(t, real), []byte("```output")) {
		t.Errorf("the outputs did not reach the notebook the link names:\n%s", readFile(t, real))
	}
	if st, err := os.Stat(real); err != nil || st.Mode().Perm() != 0o600 {
		t.Errorf("the notebook's permissions changed: %v %v", st.Mode(), err)
	}
	if _, err := os.Stat(filepath.Join(dir, "real", "n.fig1.svg")); err != nil {
		t.Errorf("the figure is not beside the notebook: %v", err)
	}
	// Run again through the link: the same notebook, apart from times.
	first := readFile(t, real)
	assay(t, "run", "--in-place", link)
	if normalizeTimes(first) != normalizeTimes(readFile(t, real)) {
		t.Errorf("a second in-place run through the link changed the notebook")
	}
}
