package outfile

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"syscall"
)

// maxLinks bounds the symbolic links followed from one path, as the Linux
// kernel's own limit of 40 (from memory: MAXSYMLINKS in fs/namei.c).
const maxLinks = 40

// place is where a path given by the user leads.
type place struct {
	spelled string      // as the user gave it
	path    string      // absolute, with symbolic links followed; "" if none
	info    fs.FileInfo // of the file at path, nil if there is none yet
}

// same reports whether p and q are the same file: the same resolved path,
// or, for files that exist, the same device and inode (os.SameFile
// compares the Dev and Ino of their syscall.Stat_t).
func (p place) same(q place) bool {
	if p.path != "" && p.path == q.path {
		return true
	}
	return p.info != nil && q.info != nil && os.SameFile(p.info, q.info)
}

// direct reports whether p is an existing file that is written in place,
// not replaced: a character device or a FIFO.
func (p place) direct() bool {
	return p.info != nil && p.info.Mode()&(fs.ModeCharDevice|fs.ModeNamedPipe) != 0
}

// discards reports whether p is the null device (os.DevNull), which any
// number of outputs may share, since it keeps nothing.
func (p place) discards() bool {
	if p.info == nil || p.info.Mode()&fs.ModeCharDevice == 0 {
		return false
	}
	null, err := os.Stat(os.DevNull)
	return err == nil && os.SameFile(p.info, null)
}

// resolve finds where name leads: its folder with every symbolic link
// resolved, then, while the file itself is a symbolic link, the file the
// link names (which need not exist yet). A link to a device or a pipe is
// kept as it is: opening it reaches the device, and /dev/stdout, a link
// to a pipe such as "pipe:[1234]", names no path. The folder of the
// final path must exist.
func resolve(name string) (place, error) {
	p, err := filepath.Abs(name)
	if err != nil {
		return place{}, err
	}
	shown := filepath.Dir(name) // the folder to name in a message
	for range maxLinks {
		dir, err := filepath.EvalSymlinks(filepath.Dir(p))
		if err != nil {
			return place{}, folderMissing{shown}
		}
		p = filepath.Join(dir, filepath.Base(p))
		li, err := os.Lstat(p)
		switch {
		case errors.Is(err, fs.ErrNotExist):
			return place{spelled: name, path: p}, nil
		case errors.Is(err, syscall.ENOTDIR):
			return place{}, folderMissing{shown}
		case err != nil:
			return place{}, err
		case li.Mode()&fs.ModeSymlink == 0:
			return place{spelled: name, path: p, info: li}, nil
		}
		if fi, err := os.Stat(p); err == nil && !fi.Mode().IsRegular() && !fi.IsDir() {
			return place{spelled: name, path: p, info: fi}, nil
		}
		link, err := os.Readlink(p)
		if err != nil {
			return place{}, err
		}
		if !filepath.IsAbs(link) {
			link = filepath.Join(dir, link)
		}
		p, shown = link, filepath.Dir(link)
	}
	return place{}, fmt.Errorf("%s leads through more than %d symbolic links", name, maxLinks)
}

// folderMissing is resolve's error for a folder that cannot be reached.
type folderMissing struct{ dir string }

func (e folderMissing) Error() string { return "the folder " + e.dir + " does not exist" }

// writable reports whether the file at path, described by fi, may be
// written: some write bit is set in its mode (checked here, since root
// may write any file), and the system lets this process write it
// (mayWrite).
func writable(path string, fi fs.FileInfo) bool {
	return fi.Mode().Perm()&0o222 != 0 && mayWrite(path)
}

// checkFolder checks that dir, where a new or replaced file goes, is a
// folder this process may write into. what names the output for the
// message, e.g. "--out results/report.html".
func checkFolder(what, dir string) error {
	fi, err := os.Stat(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return fmt.Errorf("%s: the folder %s does not exist; create it (mkdir -p %s) or choose another path", what, dir, dir)
	case err != nil:
		return fmt.Errorf("%s: %w", what, err)
	case !fi.IsDir():
		return fmt.Errorf("%s: %s is not a folder; choose another path", what, dir)
	case fi.Mode().Perm()&0o222 == 0:
		return fmt.Errorf("%s: the folder %s is read-only (mode %04o); make it writable (chmod u+w %s) or write elsewhere", what, dir, fi.Mode().Perm(), dir)
	case !writable(dir, fi):
		return fmt.Errorf("%s: this user may not write into the folder %s; write elsewhere", what, dir)
	}
	return nil
}

// folderOf is the folder of p.path, as the user spelled it when that
// is where the spelling leads.
func folderOf(p place) string {
	d := filepath.Dir(p.spelled)
	if abs, err := filepath.Abs(d); err == nil {
		if real, err := filepath.EvalSymlinks(abs); err == nil && real == filepath.Dir(p.path) {
			return d
		}
	}
	return filepath.Dir(p.path)
}

// checkFile checks an output file p: it is a regular file that may be
// replaced, a device or FIFO that may be written, or a new file in a
// folder that may be written. what names the output for the message.
func checkFile(what string, p place) error {
	if p.info == nil {
		return checkFolder(what, folderOf(p))
	}
	m := p.info.Mode()
	switch {
	case m.IsDir():
		return fmt.Errorf("%s is a folder, not a file; give the name of a file, e.g. %s", what, filepath.Join(p.spelled, "NAME"))
	case !m.IsRegular() && !p.direct():
		return fmt.Errorf("%s is a %s, not a file; choose another file name", what, kindOf(m))
	case m.Perm()&0o222 == 0:
		return fmt.Errorf("%s is read-only (mode %04o); make it writable (chmod u+w %s) or choose another file name", what, m.Perm(), p.spelled)
	case !writable(p.path, p.info):
		return fmt.Errorf("%s may not be written by this user (mode %04o); choose another file name", what, m.Perm())
	case m.IsRegular():
		return checkFolder(what, folderOf(p))
	}
	return nil
}

// kindOf names a file type that is neither a regular file, a folder, a
// character device nor a FIFO.
func kindOf(m fs.FileMode) string {
	switch {
	case m&fs.ModeDevice != 0:
		return "block device (a disk)"
	case m&fs.ModeSocket != 0:
		return "socket"
	}
	return "special file"
}
