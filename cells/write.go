package cells

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// File is one file of a set that WriteFilesAtomic writes together.
type File struct {
	Path string
	Data []byte
}

// maxLinks bounds the chain of symbolic links Target follows, as the
// operating system bounds it (40 on Linux).
const maxLinks = 40

// Target returns the file that a write to path lands on: path itself, or,
// when path is a symbolic link, the file the link finally names (which need
// not exist yet). Writing to the target instead of over the link keeps the
// link a link.
func Target(path string) (string, error) {
	p := path
	for range maxLinks {
		if t, err := filepath.EvalSymlinks(p); err == nil {
			return t, nil
		}
		fi, err := os.Lstat(p)
		if errors.Is(err, fs.ErrNotExist) {
			return p, nil // a new file
		}
		if err != nil {
			return "", fmt.Errorf("cannot write %s: %v", path, unwrapPath(err))
		}
		if fi.Mode()&os.ModeSymlink == 0 {
			return p, nil
		}
		// A link to a file that does not exist yet: follow it by hand,
		// from the real folder of the link.
		dest, err := os.Readlink(p)
		if err != nil {
			return "", fmt.Errorf("cannot write %s: %v", path, unwrapPath(err))
		}
		if !filepath.IsAbs(dest) {
			dir := filepath.Dir(p)
			if d, err := filepath.EvalSymlinks(dir); err == nil {
				dir = d
			}
			dest = filepath.Join(dir, dest)
		}
		p = dest
	}
	return "", fmt.Errorf("cannot write %s: too many levels of symbolic links", path)
}

// WriteFilesAtomic writes a set of files (a report, its HTML twin and its
// figures) so that the set changes as one: each file is written to a
// temporary file beside its target, then all are renamed into place in the
// order given. When writing or renaming fails, the files already renamed
// are put back as they were and the temporaries removed, so the old set is
// left whole. Only a crash during the renames can leave a mixed set, which
// is why the caller puts a run identifier in each file.
//
// A path that is a symbolic link is written through to the file it names.
// An existing file keeps its permission bits; a new one gets 0644. Two
// paths that land on the same file are refused.
func WriteFilesAtomic(files []File) (err error) {
	type pending struct {
		target, tmp, backup string
		renamed             bool
	}
	ps := make([]pending, len(files))
	seen := map[string]string{}
	for i, f := range files {
		t, err := Target(f.Path)
		if err != nil {
			return err
		}
		key, _ := filepath.Abs(t)
		if prev, dup := seen[key]; dup {
			return fmt.Errorf("%s and %s are the same file; nothing was written", prev, f.Path)
		}
		seen[key] = f.Path
		ps[i].target = t
	}
	defer func() {
		for i := len(ps) - 1; i >= 0; i-- {
			p := ps[i]
			switch {
			case err != nil && p.renamed && p.backup != "":
				os.Rename(p.backup, p.target)
			case err != nil && p.renamed:
				os.Remove(p.target) // it did not exist before
			case p.backup != "":
				os.Remove(p.backup)
			}
			if p.tmp != "" && !p.renamed {
				os.Remove(p.tmp)
			}
		}
	}()
	for i, f := range files {
		if ps[i].tmp, err = writeTemp(ps[i].target, f.Data); err != nil {
			return fmt.Errorf("cannot write %s: %v", f.Path, unwrapPath(err))
		}
	}
	// A second name for each old file lets a failed rename put it back.
	for i, f := range files {
		fi, err := os.Lstat(ps[i].target)
		if err != nil || !fi.Mode().IsRegular() {
			continue // nothing to keep, or a rename over it fails anyway
		}
		backup := ps[i].tmp + ".old"
		if err := os.Link(ps[i].target, backup); err != nil {
			return fmt.Errorf("cannot write %s: keeping the old file aside failed: %v", f.Path, unwrapPath(err))
		}
		ps[i].backup = backup
	}
	for i, f := range files {
		if err := os.Rename(ps[i].tmp, ps[i].target); err != nil {
			why := unwrapPath(err)
			if fi, serr := os.Lstat(ps[i].target); serr == nil && fi.IsDir() {
				why = errors.New("a folder of that name is in the way")
			}
			return fmt.Errorf("cannot write %s: %v; no file of this run was written, the old ones are kept", f.Path, why)
		}
		ps[i].renamed = true
	}
	// The renames reach the disk with their folders.
	synced := map[string]bool{}
	for _, p := range ps {
		if dir := filepath.Dir(p.target); !synced[dir] {
			synced[dir] = true
			syncDir(dir)
		}
	}
	return nil
}

// syncDir flushes a folder's entries; a file system that cannot is not an
// error, the renames are done either way.
func syncDir(dir string) {
	if d, err := os.Open(dir); err == nil {
		d.Sync()
		d.Close()
	}
}

// writeTemp writes data to a new temporary file beside target, with the
// target's permission bits (0644 for a new file), synced to disk, and
// returns its name.
func writeTemp(target string, data []byte) (name string, err error) {
	mode := os.FileMode(0o644)
	if fi, err := os.Stat(target); err == nil {
		mode = fi.Mode().Perm()
	}
	f, err := os.CreateTemp(filepath.Dir(target), "."+filepath.Base(target)+".tmp*")
	if err != nil {
		return "", err
	}
	defer func() {
		if err != nil {
			f.Close()
			os.Remove(f.Name())
		}
	}()
	if _, err = f.Write(data); err != nil {
		return "", err
	}
	if err = f.Chmod(mode); err != nil {
		return "", err
	}
	if err = f.Sync(); err != nil {
		return "", err
	}
	if err = f.Close(); err != nil {
		return "", err
	}
	return f.Name(), nil
}

// unwrapPath drops the paths an *os.PathError or *os.LinkError repeats, so
// a message names the user's path and not a temporary one.
func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}
